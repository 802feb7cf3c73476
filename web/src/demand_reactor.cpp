// Demand screen, last card: does a calcium reactor (or any flow-through source) cover the
// consumption? Its flow and the effluent's alkalinity and calcium (measured by the user) go
// to tw::additives::daily_addition; the net daily rise is set beside the estimated
// consumption, with the flow that would match it (the addition is proportional to the flow).
#include <string>

#include "tidewright/common/ranges.hpp"
#include "actions.hpp"
#include "actions_dosing.hpp"
#include "format.hpp"
#include "screens.hpp"
#include "theme.hpp"
#include "tidewright/additives/additives.hpp"
#include "ui.hpp"

namespace twapp {

namespace {

namespace add = tw::additives;
namespace au = tw::units;

// The tank level of parameter i (0 alkalinity dKH, 1 calcium mg/L, 2 magnesium mg/L) from the
// estimate, or nothing when there is none.
std::optional<double> estimated_level(const DemandCache& c, int i) {
  const ParameterEstimate& pe = c.per_parameter[i];
  if (!pe.ok || pe.estimate.tests_used == 0) return std::nullopt;
  return pe.estimate.level;
}

std::optional<double> estimated_demand(const DemandCache& c, int i) {
  const ParameterEstimate& pe = c.per_parameter[i];
  if (!pe.ok || !pe.estimate.demand_known || pe.estimate.demand_per_day <= 0) return std::nullopt;
  return pe.estimate.demand_per_day;
}

// One line per parameter: what the source adds a day, the share of the consumption it covers
// and the flow that would match the consumption.
void coverage_line(AppState& app, const char* name, double added, std::optional<double> demand, double flow,
                   const std::string& unit, double factor, int decimals, const std::string& widget) {
  std::string text = std::string(name) + ": adds " + fmtx::fixed(added * factor, decimals + 1) + " " + unit + " a day";
  ImU32 color = 0;
  std::optional<add::Coverage> cov;
  if (demand) {
    if (auto r = add::coverage(added, *demand, flow)) cov = *r;
  }
  if (cov) {
    text += ", " + fmtx::fixed(100 * cov->share, 0) + "% of the estimated consumption of " +
            fmtx::fixed(*demand * factor, decimals + 1) + " " + unit + " a day";
    if (cov->matching_flow_ml_per_min) text += "; " + fmtx::fixed(*cov->matching_flow_ml_per_min, 0) + " mL/min would match it";
    color = cov->matches ? theme::kAccent : theme::kWarning;
  } else {
    text += " (no consumption estimate to compare with yet)";
  }
  ui::colored_wrapped(color ? color : theme::kText, (text + ".").c_str());
  ui::record(app, widget);
}

}  // namespace

void draw_reactor_check(AppState& app) {
  DemandView& v = app.ui.dosing.demand;
  const DemandCache& c = app.ui.dosing.demand_cache;
  const auto* sys = current_system(app);
  if (!sys) return;
  ui::heading(app, "Calcium reactor or other flow-through source");
  if (!v.reactor_open) {
    if (ui::button(app, "demand.reactor.open", "Check what a reactor adds", 0, ui::Tone::Quiet)) v.reactor_open = true;
    return;
  }
  ui::dim_text("Measure the effluent where it drips into the tank, and its flow with a measuring cup and a clock.");
  namespace rg = tw::ranges;
  const au::AlkalinityUnit alk_unit = sys->units.alkalinity;
  const fmtx::UnitShown alk = fmtx::alkalinity_shown(alk_unit);
  const au::ConcentrationUnit ion_unit = sys->units.calcium_magnesium;
  const std::string ion_text = au::to_string(ion_unit);
  const int ion_dec = ion_decimals(ion_unit);
  ui::number_field(app, "demand.reactor.flow", {"Effluent flow", "mL/min", 0, 5, rg::kReactorFlowMlPerMin.lo, rg::kReactorFlowMlPerMin.hi}, &v.reactor_flow_ml_per_min);
  double a = fmtx::alkalinity_from_dkh(v.reactor_alkalinity_dkh, alk_unit);
  if (ui::number_field(app, "demand.reactor.alkalinity", {"Effluent alkalinity", alk.unit, alk.decimals, alk.step,
                                                          fmtx::alkalinity_from_dkh(rg::kReactorAlkalinityDkh.lo, alk_unit),
                                                          fmtx::alkalinity_from_dkh(rg::kReactorAlkalinityDkh.hi, alk_unit)}, &a)) {
    v.reactor_alkalinity_dkh = fmtx::alkalinity_to_dkh(a, alk_unit);
  }
  double ca = ion_shown(v.reactor_calcium_mg_l, ion_unit, au::Ion::Calcium);
  if (ui::number_field(app, "demand.reactor.calcium", {"Effluent calcium", ion_text.c_str(), ion_dec, ion_dec ? 0.5 : 10,
                                                       ion_shown(rg::kReactorCalciumMgL.lo, ion_unit, au::Ion::Calcium),
                                                       ion_shown(rg::kReactorCalciumMgL.hi, ion_unit, au::Ion::Calcium)}, &ca)) {
    v.reactor_calcium_mg_l = ion_from_shown(ca, ion_unit, au::Ion::Calcium);
  }
  std::optional<double> mg;
  if (v.reactor_magnesium_mg_l) mg = ion_shown(*v.reactor_magnesium_mg_l, ion_unit, au::Ion::Magnesium);
  if (ui::optional_number_field(app, "demand.reactor.magnesium", {"Effluent magnesium (if measured)", ion_text.c_str(), ion_dec,
                                                                  ion_dec ? 0.5 : 10,
                                                                  ion_shown(rg::kReactorMagnesiumMgL.lo, ion_unit, au::Ion::Magnesium),
                                                                  ion_shown(rg::kReactorMagnesiumMgL.hi, ion_unit, au::Ion::Magnesium)},
                                &mg) && mg) {
    v.reactor_magnesium_mg_l = ion_from_shown(*mg, ion_unit, au::Ion::Magnesium);
  }

  // The tank side: the estimated levels, or the targets when there is no estimate yet.
  add::TankLevels tank;
  const double defaults[3] = {tank.alkalinity_dkh, tank.calcium_mg_l, tank.magnesium_mg_l};
  double level[3];
  bool assumed = false;
  for (int i = 0; i < 3; ++i) {
    const auto l = estimated_level(c, i);
    level[i] = l.value_or(defaults[i]);
    assumed = assumed || !l;
  }
  tank = {level[0], level[1], level[2]};
  add::ContinuousSource src;
  src.flow_ml_per_min = v.reactor_flow_ml_per_min;
  src.effluent_alkalinity_dkh = v.reactor_alkalinity_dkh;
  src.effluent_calcium_mg_l = v.reactor_calcium_mg_l;
  src.effluent_magnesium_mg_l = v.reactor_magnesium_mg_l.value_or(-1);
  auto r = add::daily_addition(src, tank, sys->volume_l);
  ui::card_begin(app);
  if (!r) {
    ui::colored_wrapped(theme::kError, r.error().message.c_str());
    ui::record(app, "demand.reactor.error");
    ui::card_end(app);
    return;
  }
  const double alk_factor = fmtx::alkalinity_from_dkh(1.0, alk_unit);
  coverage_line(app, "Alkalinity", r->alkalinity_dkh_per_day, estimated_demand(c, 0), src.flow_ml_per_min, alk.unit,
                alk_factor, alk.decimals, "demand.reactor.alkalinity_result");
  coverage_line(app, "Calcium", r->calcium_mg_l_per_day, estimated_demand(c, 1), src.flow_ml_per_min, ion_text,
                ion_shown(1.0, ion_unit, au::Ion::Calcium), ion_dec, "demand.reactor.calcium_result");
  if (v.reactor_magnesium_mg_l) {
    coverage_line(app, "Magnesium", r->magnesium_mg_l_per_day, estimated_demand(c, 2), src.flow_ml_per_min, ion_text,
                  ion_shown(1.0, ion_unit, au::Ion::Magnesium), ion_dec, "demand.reactor.magnesium_result");
  }
  ui::dim_text(("Net " + fmtx::fixed(r->alkalinity_meq_per_day, 0) + " meq alkalinity and " +
                fmtx::fixed(r->calcium_mg_per_day, 0) + " mg calcium a day into " + fmtx::volume_text(sys->volume_l, sys->units.volume) +
                (assumed ? "; tank levels without an estimate are taken as typical reef values" : "") + ".")
                   .c_str());
  for (const std::string& n : r->notes) ui::colored_wrapped(theme::kWarning, ("\u2022 " + n).c_str());
  ui::card_end(app);
  ui::dim_text("Change a reactor's flow in small steps and retest alkalinity after a day or two; a low effluent pH "
               "from too much CO\u2082 can also lower the tank's pH (common practice).");
}

}  // namespace twapp
