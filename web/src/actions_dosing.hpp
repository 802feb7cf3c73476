// The dosing screens' computations and actions. Each refresh_* asks the core for the screen's
// results when (and only when) its inputs differ from the cached key; cheap to call every
// frame. The exports hand text to the platform's download.
#pragma once

#include <string>
#include <vector>

#include "app_state.hpp"

namespace twapp {

// Demand: the current system's journal -> per-parameter estimate, forecast, marks.
void refresh_demand(AppState& app);
// The same estimate for any system at now_s (the farm overview): fills out's results (error,
// now_days, volume, notes, per_parameter, ratio); its key and counter are the caller's.
// smooth = false leaves out the smoothed history (the charts' consumption curve), which the
// state at now does not depend on.
void estimate_system(const tw::journal::Journal& journal, const tw::journal::System& sys, std::int64_t now_s,
                     int forecast_days, DemandCache& out, bool smooth = true);
// Hatchery: the form -> flow-through or batch plan (+ pump-side table when shown).
void refresh_hatchery(AppState& app);
// Mixes: the form -> stock strength or the recipe for an effect, with the solubility check.
void refresh_mixes(AppState& app);

// Plan: the form + the Demand estimate (levels, consumption) -> schedule, checked again by the
// core's independent checker. Calls refresh_demand first.
void refresh_plan(AppState& app);
// Adopts the current plan: its doses become the system's standing schedules from day 1 (the
// pumps' earlier schedules stop there), by the core's plan::adopt_plan as `plan --adopt`.
// Refused when the plan cannot hold or its check fails.
bool adopt_current_plan(AppState& app);
// Names a stock pump of the Plan (slot 0 alkalinity, 1 calcium, 2 magnesium) as typed: trimmed,
// 1 to 60 characters by the core's rule (journal/device_name.hpp), not another pump's name. A
// refused name leaves the one kept as it was.
bool set_plan_pump_name(AppState& app, int slot, const std::string& typed);
// The temperature the Plan's stocks are made up and kept at (their recipes, their solubility).
inline constexpr double kPlanStockTemperatureC = 25.0;
// The strongest stock of a compound the Plan accepts, in whole g/L: the core's
// max_stock_g_per_l at that temperature (the range table's top when the core gives none). The
// strength fields and the saved settings' read-back take the same bound.
double plan_stock_max_g_per_l(tw::additives::CompoundId id);
// The alkalinity stock's compound (Na2CO3, or NaHCO3 when chosen).
tw::additives::CompoundId alkalinity_compound(PlanAlkalinity a);
// The Plan's magnesium choices as the core's compounds (plan::magnesium_stocks order) and back.
tw::additives::CompoundId magnesium_compound(PlanMagnesium m);
PlanMagnesium magnesium_choice(tw::additives::CompoundId id);
// The Plan's day table, by pump: a column's heading, one line each for the pump, its chemical
// and the unit ("pump 1", "Na₂CO₃", "mL"; "mL set" when the pump's calibration is not 1
// and the column shows what to set), the same joined by commas, and the legend above the table
// (each pump's additive, calibration and doses a day).
std::vector<std::string> pump_column_lines(const tw::plan::Delivery& d);
std::string pump_column_title(const tw::plan::Delivery& d);
std::string pump_legend(const std::vector<tw::plan::Delivery>& deliveries);
std::string pumps_in_words(const std::vector<tw::plan::Delivery>& deliveries);
// Downloads the current schedule: format 0 CSV, 1 iCalendar, 2 plain text.
bool export_plan(AppState& app, int format);

// Dissolvable solids offered on the Mixes screen (catalog order, gases left out).
const std::vector<tw::additives::CompoundId>& mix_compounds();

// Downloads the pump-side table as CSV / fixed-width text (platform::export_file).
bool export_pump_table(AppState& app, bool csv);

// A dosed parameter in the user's units: shown = core value (dKH, mg/L) x factor.
struct ShownUnit {
  double factor = 1;
  std::string unit;
  int decimals = 1;
};
ShownUnit shown_unit(const tw::journal::UnitPreferences& units, tw::Parameter p);

// Calcium / magnesium: mg/L <-> the user's unit (tw::units, seawater density nominal).
double ion_shown(double mg_l, tw::units::ConcentrationUnit unit, tw::units::Ion ion);
double ion_from_shown(double value, tw::units::ConcentrationUnit unit, tw::units::Ion ion);
int ion_decimals(tw::units::ConcentrationUnit unit);

}  // namespace twapp
