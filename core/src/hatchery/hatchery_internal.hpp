// Private to the hatchery files: the treatment chain and the dose searches that the
// flow-through, batch and table modes share (hatchery_dose.cpp).
#pragma once

#include <functional>
#include <string>

#include "tidewright/carbonate/carbonate.hpp"
#include "tidewright/hatchery/hatchery.hpp"
#include "tidewright/common/result.hpp"

namespace tw::hatchery::detail {

// Upper bound of the dose search, umol/kg of added alkalinity (about 10 meq/kg, four times
// natural seawater alkalinity): beyond it a target is reported as out of reach.
inline constexpr double kMaxAddedAlkalinityUmolKg = 8000.0;

std::string lower(std::string s);
std::string target_field(TargetKind kind);  // option-style field name of the target
std::string describe_target(const Target& target);
double ph_on_scale(const carbonate::CarbonateState& state, carbonate::PhScale scale);
Status validate_settings(const Settings& settings);

// Intake constants and state.
struct Line {
  carbonate::Constants constants;
  carbonate::CarbonateState intake;
};
Result<Line> solve_intake(const Water& water);

struct Chain {
  carbonate::CarbonateState after_mixing;
  carbonate::CarbonateState at_tanks;
};
Result<Chain> run_chain(const Line& line, const DoseMix& dose, double phi, double air_co2_ppm);
double metric(const Chain& chain, const Settings& settings, double intake_alkalinity_umol_kg);
double highest_ph(const Chain& chain, carbonate::PhScale scale);

// Shares of the added alkalinity equivalents (sum 1).
struct Recipe {
  double carbonate_share = 1, bicarbonate_share = 0, hydroxide_share = 0;
};
DoseMix dose_from_recipe(const Recipe& recipe, double added_alkalinity_umol_kg);

struct DoseSearch {
  DoseMix dose;
  Chain chain;
  bool reachable = false;
  bool dose_needed = true;
};
Result<DoseSearch> dose_for_recipe(const Line& line, const Recipe& recipe,
                                   const Settings& settings, double phi);

struct BlendSearch {
  double carbonate_share = 1;
  DoseSearch search;
};
Result<BlendSearch> blend_for_target(const Line& line, const Settings& settings, double phi);

// Settings::confidence set: the dose for the raised target under the lowered ceiling
// (hatchery_confidence.cpp); plan_treatment calls it.
Result<Treatment> treatment_to_confidence(const Water& water, const Settings& settings);

// The pump-side table with each row's plan made by row_plan from the water with that row's
// reading (plan_flow for the intake; plan_line_flow for the water through the line).
using RowPlan = std::function<Result<FlowPlan>(const Water& water_with_reading)>;
Result<PumpTable> build_table_with(const Water& intake, double flow_l_per_min, const TableRange& range,
                                   const Settings& settings, const RowPlan& row_plan);

}  // namespace tw::hatchery::detail
