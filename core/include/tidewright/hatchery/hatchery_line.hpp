// The hatchery line (issue 18): intake -> conditioned (heated or cooled, and/or mixed with fresh
// or other water) -> dosed, with the carbonate state (pH, saturation) at each point. The dose is
// planned on the conditioned water, at the temperature and salinity the tanks see.
//
// Mixing is two end-members by volume fraction (hatchery_line.cpp): the fraction is turned into
// a mass fraction with each water's density (EOS-80 at its own salinity and temperature), and
// salinity, alkalinity, DIC and calcium (per kg) mix conservatively by mass. Without a heater
// setting the mixed temperature is the mass-weighted mean (equal heat capacities assumed).
#pragma once

#include <optional>
#include <string>
#include <vector>

#include "tidewright/hatchery/hatchery.hpp"

namespace tw::hatchery {

// The other end-member: fresh water (salinity 0) or another supply.
struct OtherWater {
  double volume_fraction = 0;     // of the mixed water, 0..1 (option "mix_fraction")
  double salinity = 0;            // practical salinity (ranges::kSalinity: EOS-80's 0..42)
  double temperature_c = 20;      // C (ranges::kTemperatureC: EOS-80's -2..40)
  double alkalinity_umol_kg = 0;  // 0..10000
  double dic_umol_kg = 0;         // 0..10000
  double calcium_umol_kg = 0;     // 0..50000 (fresh water: its hardness; 0 = none)
};

struct Conditioning {
  std::optional<OtherWater> mix;
  std::optional<double> tank_temperature_c;  // after heating or cooling (ranges::kTemperatureC); absent = as mixed
};

// One point of the line: where it is, and the water's state there.
struct LinePoint {
  std::string name;  // "intake", "conditioned", "dosed (after mixing)", "at the tanks"
  double salinity = 0, temperature_c = 0, calcium_umol_kg = 0;
  carbonate::CarbonateState state;
};

struct MixResult {
  double mass_fraction_other = 0;
  double salinity = 0, temperature_c = 0, alkalinity_umol_kg = 0, dic_umol_kg = 0, calcium_umol_kg = 0;
};
// Two end-members by volume fraction (see the header's comment). Errors name the field.
Result<MixResult> mix_waters(double salinity, double temperature_c, double alkalinity_umol_kg, double dic_umol_kg,
                             double calcium_umol_kg, const OtherWater& other);

struct HatcheryLine {
  std::vector<LinePoint> points;  // intake, conditioned, dosed (after mixing), at the tanks
  Treatment treatment;            // the dose, planned on the conditioned water
  Water conditioned;              // the conditioned water as the dose saw it (alkalinity + DIC)
  std::vector<std::string> notes;
};
Result<HatcheryLine> plan_line(const Water& intake, const Conditioning& conditioning, const Settings& settings);

// Pump rates for the line (flow-through): the dose plan_line finds on the conditioned water,
// metered into the flow at the dose point. intake_flow_l_per_min is the intake's own flow; mixing
// adds the other water's share, so the dosed flow is intake / (1 - volume fraction). The small
// change of volume on mixing is neglected (our choice: it is far inside a flow meter's error).
// Errors: the line's, plan_flow's, and field "mix_fraction" when the other water is the whole
// flow (fraction 1: the intake's flow then says nothing of the dosed flow).
struct LineFlowPlan {
  HatcheryLine line;
  FlowPlan flow;                    // on line.conditioned at dosed_flow_l_per_min
  double dosed_flow_l_per_min = 0;
};
Result<LineFlowPlan> plan_line_flow(const Water& intake, const Conditioning& conditioning,
                                    double intake_flow_l_per_min, const Settings& settings);

// The pump-side table (build_pump_table) through the line: each row's intake reading is
// conditioned first, then dosed as plan_line_flow doses it. The table's flow is the dosed flow;
// line_note says what the conditioning was.
Result<PumpTable> build_line_pump_table(const Water& intake, const Conditioning& conditioning,
                                        double intake_flow_l_per_min, const TableRange& range,
                                        const Settings& settings);

}  // namespace tw::hatchery
