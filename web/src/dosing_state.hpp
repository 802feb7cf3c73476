// State of the dosing screens (Demand, Hatchery, Mixes, Plan): their forms and the core
// results cached for them. One member of UiState (`dosing`) holds all of it. Each cache keeps a
// copy of the inputs it was computed from and is recomputed only when those differ (compared
// once per drawn frame; frames are drawn only on input).
//
//   DosingState
//     demand    which parameter, forecast days, touched time  -> DemandCache (estimate, forecast)
//     hatchery  HatcheryForm (water, target, buffer, flow or volume) -> HatcheryCache
//     mixes     MixesForm (recipe -> strength, effect -> recipe)     -> MixesCache
//     plan      PlanForm (additives, pumps, horizon; demand from the Demand estimate) -> PlanCache
//   The Plan and Hatchery forms are saved per system (SystemDosing; actions_dosing_saved.cpp).
#pragma once

#include <array>
#include <cstdint>
#include <optional>
#include <string>
#include <vector>

#include "tidewright/additives/additives.hpp"
#include "tidewright/estimate/estimate.hpp"
#include "tidewright/carbonate/measurement_precision.hpp"
#include "tidewright/hatchery/hatchery.hpp"
#include "tidewright/hatchery/hatchery_line.hpp"
#include "tidewright/journal/journal.hpp"
#include "tidewright/plan/plan.hpp"
#include "tidewright/plan/plan_starter.hpp"
#include "tidewright/plan/plan_stocks.hpp"

namespace twapp {

// ---------------------------------------------------------------- Demand
struct DemandView {
  int parameter = 0;        // index into tw::estimate::kAllParameters
  int forecast_days = 14;   // 3 .. 60
  std::optional<double> probe_day;         // time (days since epoch) touched on the level chart
  std::optional<double> probe_demand_day;  // same on the consumption chart
  // "Does my reactor cover it?" card: a flow-through source described by its measured output.
  bool reactor_open = false;
  double reactor_flow_ml_per_min = 30;
  // Effluent, kept in dKH and mg/L and shown in the user's units. Starting values are our choice:
  // what dissolving CaCO3 gives (7.15 mg/L Ca per dKH) above a tank at 8 dKH and 420 mg/L.
  double reactor_alkalinity_dkh = 30;
  double reactor_calcium_mg_l = 575;
  std::optional<double> reactor_magnesium_mg_l;
};

struct ParameterEstimate {
  bool ok = false;
  std::string error;  // core's message when the estimate failed
  tw::estimate::SeriesEstimate estimate;
  std::vector<tw::estimate::ForecastPoint> forecast;
  std::string forecast_error;
  bool stale = false;      // the last test is past the estimate's useful horizon (no forecast)
  bool scheduled = false;  // standing schedules give this parameter's dosing
  double daily_dose_effect = 0;  // unit/day added by the schedules, else the last 7 days' doses
  std::vector<double> addition_days, addition_deltas;  // dose / limewater marks
  std::vector<double> dilution_days, dilution_fractions;  // water changes
};

struct DemandCache {
  bool valid = false;
  // key
  std::uint64_t revision = 0;  // AppState::revision
  tw::journal::SystemId system = 0;
  std::int64_t now_hour = 0;
  int forecast_days = 0;
  // result
  std::string error;  // e.g. no system
  double now_days = 0;
  double volume_l = 0;
  std::vector<std::string> notes;       // events the series could not use, in words
  ParameterEstimate per_parameter[3];   // in kAllParameters order
  tw::estimate::CalciumAlkalinityReading ratio;
  int computed_count = 0;
};

// ---------------------------------------------------------------- Hatchery
enum class HatcheryMode { FlowThrough, Batch };

struct HatcheryForm {
  HatcheryMode mode = HatcheryMode::FlowThrough;
  double salinity = 33.0;
  double temperature_c = 18.0;
  double alkalinity_dkh = 6.2;      // intake alkalinity (shown in the user's unit)
  double ph = 7.75;                 // intake pH on ph_scale
  tw::carbonate::PhScale ph_scale = tw::carbonate::PhScale::Total;
  std::optional<double> calcium_mg_l;  // measured; absent = from salinity (core says how far off)
  tw::carbonate::K1K2Option k1k2 = tw::carbonate::K1K2Option::Lueker2000;
  // A salt mix's own composition (issue 18), as on the Water screen: measured total boron (mg/L
  // of B; absent = scaled from salinity), measured magnesium, and the Mg/Ca correction of the
  // constants (off unless chosen; the core refuses it without measured Ca and Mg).
  std::optional<double> total_boron_mg_l;
  std::optional<double> magnesium_mg_l;
  bool mg_ca_correction = false;
  // The line (flow-through, issue 18): intake -> conditioned -> dosed -> tanks; off by default.
  // Conditioning: the temperature at the tanks after heating or cooling (absent = as mixed) and
  // optional mixing with other water (absent fraction = none), as hatchery::Conditioning takes it.
  bool line_shown = false;
  std::optional<double> line_tank_temperature_c;
  std::optional<double> mix_fraction;  // by volume, 0..1
  double mix_salinity = 0.0;           // fresh water unless changed
  double mix_temperature_c = 20.0;
  double mix_alkalinity_dkh = 0.0;     // shown in the user's unit
  double mix_dic_umol_kg = 0.0;
  double mix_calcium_mg_l = 0.0;
  tw::hatchery::TargetKind target_kind = tw::hatchery::TargetKind::OmegaAragonite;
  double target_omega = 2.0;
  double target_ph = 8.0;           // on ph_scale
  double target_rise_dkh = 1.0;
  tw::hatchery::TargetPoint target_point = tw::hatchery::TargetPoint::AfterMixing;
  tw::hatchery::Buffer buffer = tw::hatchery::Buffer::SodiumCarbonate;
  double ph_ceiling = 8.3;          // on ph_scale
  double flow_l_per_min = 100.0;
  double volume_l = 1000.0;
  std::optional<double> residence_time_min;
  double stock_temperature_c = 20.0;
  std::optional<double> stock_g_per_l;  // strength of the stock made up; absent = the core's default
  // Dosing to a confidence (hatchery::Confidence): 0 = for the readings as they stand, else the
  // probability kConfidenceChoices[i] with the intake readings' precision (kit table defaults).
  int confidence_index = 0;
  double alkalinity_precision_dkh = tw::carbonate::default_precision(tw::Parameter::Alkalinity)->typical;
  double ph_precision = tw::carbonate::default_precision(tw::Parameter::PH)->typical;
  // pump-side table over the intake pH
  double table_from_ph = 7.50, table_to_ph = 8.00, table_step_ph = 0.05;
  bool show_table = false;           // not saved (what the screen shows)
  bool operator==(const HatcheryForm&) const = default;
};

inline constexpr double kConfidenceChoices[] = {0.0, 0.90, 0.95, 0.99};

struct HatcheryCache {
  bool valid = false;
  HatcheryForm key;
  std::string error;
  std::optional<tw::hatchery::FlowPlan> flow;
  std::optional<tw::hatchery::BatchPlan> batch;
  std::optional<tw::hatchery::PumpTable> table;
  std::string table_error;
  // The line, when shown (flow-through): its four points, or the core's refusal.
  std::optional<tw::hatchery::HatcheryLine> line;
  std::string line_error;
  double dosed_flow_l_per_min = 0;  // with the line: the flow at the dose point (intake + mixed-in water)
  // Where total boron came from for the dose (carbonate::boron_source of the intake water).
  tw::carbonate::BoronSource boron;
  // The core's suggestion of another K1 K2 set for this water (carbonate::suggest_k1k2).
  std::optional<tw::carbonate::K1K2Suggestion> k1k2_suggestion;
  int computed_count = 0;
};

// ---------------------------------------------------------------- Mixes
enum class MixDirection { RecipeToStrength, EffectToRecipe };

struct MixesForm {
  MixDirection direction = MixDirection::RecipeToStrength;
  int compound = 0;           // index into mix_compounds() (dissolvable solids)
  double grams_per_l = 80.0;  // recipe -> strength
  double temperature_c = 25.0;
  // effect -> recipe: "dose_ml raises tank_volume_l by rise"
  int parameter = 0;          // tw::additives::Parameter index
  double rise = 0.1;          // dKH or mg/L (shown in the user's unit)
  double dose_ml = 1.0;
  double tank_volume_l = 100.0;
  bool operator==(const MixesForm&) const = default;
};

struct MixesCache {
  bool valid = false;
  MixesForm key;
  std::string error;
  std::optional<tw::additives::StockStrength> strength;
  std::optional<tw::additives::RecipeForEffect> recipe;
  std::optional<tw::additives::Solubility> solubility;  // of the compound at the temperature
  std::string solubility_error;
  std::vector<std::string> cautions;
  int computed_count = 0;
};

// ---------------------------------------------------------------- Plan
enum class PlanAlkalinity { SodiumCarbonate, SodiumBicarbonate, Limewater, None };
enum class PlanCalcium { CalciumChloride, None };
// In the order of the core's plan::magnesium_stocks(), then None.
enum class PlanMagnesium { MagnesiumChloride, MagnesiumSulfate, None };

// The Plan's three stock pumps, by slot: 0 the alkalinity stock's, 1 the calcium stock's, 2 the
// magnesium stock's.
inline constexpr int kPlanPumps = 3;
inline constexpr const char* kPlanPumpFallback[kPlanPumps] = {"pump 1", "pump 2", "pump 3"};

// One stock pump as the keeper set it. Unset = taken from the system's schedule that gives the
// same additive (plan::scheduled_pump_for; doses a day and largest dose by
// plan::pump_program_from), else kPlanPumpFallback and the core's defaults. Limewater keeps its
// top-off (name "top-off", calibration 1, no largest dose) and its doses a day.
struct PlanPumpSetting {
  std::optional<std::string> name;
  std::optional<double> calibration;
  std::optional<int> doses_per_day;      // 1..288 (ranges::kDosesPerDay)
  std::optional<double> max_dose_ml;     // largest single amount set on the pump (ranges::kPlannedDoseMax)
  bool operator==(const PlanPumpSetting&) const = default;
};

struct PlanForm {
  PlanAlkalinity alkalinity = PlanAlkalinity::SodiumCarbonate;
  // Stock strengths (the compound as sold, per L of solution). Unset = the strength of that
  // compound's stock the log shows dosed (plan::dosed_stock_for: the pump's schedule, else a
  // dose in the last weeks), else the core's starting strength: a plan never assumes a weaker
  // or stronger stock than the one in the pump without the keeper saying so.
  std::optional<double> alkalinity_g_per_l;
  PlanCalcium calcium = PlanCalcium::CalciumChloride;
  std::optional<double> calcium_g_per_l;  // CaCl2.2H2O
  // Unset = the magnesium stock the log shows dosed (plan::dosed_stock_for: a schedule, else a
  // dose in the last weeks), else None; its strength unset = that schedule's or dose's stock,
  // else the core's starting strength of the compound.
  std::optional<PlanMagnesium> magnesium;
  std::optional<double> magnesium_g_per_l;
  std::array<PlanPumpSetting, kPlanPumps> pumps{};
  double evaporation_l_per_day = 2.0; // bounds limewater
  int horizon_days = 14;              // 1..60
  bool use_estimate = true;           // consumption from the log's estimate (else typed below)
  bool accept_stale = false;          // plan from a level the log cannot vouch for today (flagged; not saved)
  double alkalinity_demand_dkh_per_day = 1.0;  // when not from the estimate
  double calcium_demand_mg_l_per_day = 7.0;
  // Magnesium is taken up far slower than calcium (common practice: about 1 mg/L a day in a
  // stony-coral tank).
  double magnesium_demand_mg_l_per_day = 1.0;
  bool show_all_days = false;         // not saved, nor export_index (what the screen shows)
  int export_index = 0;               // 0 CSV, 1 iCalendar, 2 text, 3 JSON
  bool operator==(const PlanForm&) const = default;
};

// A pump as the plan uses it: the keeper's setting, else the running schedule's, else the fallback.
struct PlanPump {
  std::string name;
  double calibration = 1.0;
  int doses_per_day = tw::plan::kDefaultDosesPerDay;
  double max_dose_ml = tw::plan::kDefaultMaxDoseMl;
  bool from_schedule = false;          // name or calibration taken from a schedule in the log
  bool program_from_schedule = false;  // doses a day or largest dose taken from a schedule
};

struct PlanCache {
  bool valid = false;
  PlanForm key;
  tw::journal::SystemId system = 0;
  int demand_computed = -1;  // DemandCache::computed_count it was made from
  double room_co2_ppm = 0;
  std::array<double, tw::plan::kLimitCount> safety_limits{};
  std::string error;
  std::vector<std::string> assumptions;  // where the start levels and demand came from
  std::vector<std::string> flags;        // the core's flags: log and test disagree, stale level accepted
  bool stale = false;                    // refused: a level the log cannot vouch for (error says what to test)
  std::optional<tw::plan::PlanInput> input;
  std::optional<tw::plan::Plan> plan;
  std::optional<tw::plan::CheckReport> check;  // the independent checker's replay
  std::array<PlanPump, kPlanPumps> pumps;      // by slot (0 alkalinity, 1 calcium, 2 magnesium), shown in the form
  // The magnesium stock as planned: the keeper's choice, else the log's (magnesium_from_log).
  PlanMagnesium magnesium = PlanMagnesium::None;
  double magnesium_g_per_l = tw::plan::kStarterMagnesiumChlorideGPerL;
  bool magnesium_from_log = false;
  // The alkalinity and calcium stocks' strengths as planned: the keeper's, else the log's.
  double alkalinity_g_per_l = tw::plan::kStarterSodaAshGPerL;
  double calcium_g_per_l = tw::plan::kStarterCalciumChlorideGPerL;
  bool alkalinity_strength_from_log = false, calcium_strength_from_log = false;
  double start_day = 0;                        // days since epoch of day 1, 00:00 local
  int computed_count = 0;
};

// ---------------------------------------------------------------- saved per system
// What the Plan and Hatchery screens' forms keep for each system in the saved store (the app
// part, store.hpp; dosing_saved.hpp reads and checks it): their forms without the members that
// only say what the screen shows and without the stale-level consent (asked again each visit).
struct SystemDosing {
  PlanForm plan;
  HatcheryForm hatchery;
  bool operator==(const SystemDosing&) const = default;
};

struct DosingState {
  // The system the forms below were filled for (AppState::dosing_by_system); unset: fill them
  // again from the saved settings before they are drawn (start, import, another tab's store).
  std::optional<tw::journal::SystemId> forms_for;
  DemandView demand;
  DemandCache demand_cache;
  HatcheryForm hatchery;
  HatcheryCache hatchery_cache;
  MixesForm mixes;
  MixesCache mixes_cache;
  PlanForm plan;
  PlanCache plan_cache;
  int plan_chart = 0;                    // parameter shown on the Plan chart (not a plan input)
  std::optional<double> plan_probe_day;  // time touched on the Plan chart
};

}  // namespace twapp
