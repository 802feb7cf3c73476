// The Plan screen's results: the form and the Demand estimate -> schedule, checked again by the
// core's checker; its downloads and adopting it as the pumps' schedules.
#include "actions_dosing.hpp"

#include <algorithm>
#include <cmath>
#include <cstdio>

#include "actions.hpp"
#include "format.hpp"
#include "local_time.hpp"
#include "platform.hpp"
#include "tidewright/common/datetime.hpp"
#include "tidewright/common/ranges.hpp"
#include "tidewright/journal/device_name.hpp"
#include "tidewright/plan/plan.hpp"
#include "tidewright/plan/plan_adopt.hpp"
#include "tidewright/plan/plan_from_journal.hpp"
#include "tidewright/plan/plan_stocks.hpp"

namespace twapp {

namespace add = tw::additives;
namespace pl = tw::plan;

double plan_stock_max_g_per_l(add::CompoundId id) {
  const auto max = add::max_stock_g_per_l(id, kPlanStockTemperatureC);
  return max ? std::floor(*max) : tw::ranges::kStockGPerL.hi;
}
add::CompoundId alkalinity_compound(PlanAlkalinity a) {
  return a == PlanAlkalinity::SodiumBicarbonate ? add::CompoundId::SodiumBicarbonate : add::CompoundId::SodiumCarbonate;
}
add::CompoundId magnesium_compound(PlanMagnesium m) {
  return pl::magnesium_stocks()[m == PlanMagnesium::MagnesiumSulfate ? 1 : 0].compound;
}
PlanMagnesium magnesium_choice(add::CompoundId id) {
  return id == pl::magnesium_stocks()[1].compound ? PlanMagnesium::MagnesiumSulfate : PlanMagnesium::MagnesiumChloride;
}

namespace {
std::string fmtx_g_per_l(double g) { return std::to_string(static_cast<long long>(std::llround(g))) + " g/L"; }
std::string fmtx_calibration(double k) {
  char b[16];
  std::snprintf(b, sizeof b, "%.3g", k);  // as the journal's schedule summary writes it
  return b;
}
}  // namespace

bool export_plan(AppState& app, int format) {
  const PlanCache& c = app.ui.dosing.plan_cache;
  if (!c.plan || !c.input) {
    notify(app, "No schedule to export: " + (c.error.empty() ? std::string("make one first") : c.error), true);
    return false;
  }
  std::string text, name, mime;
  if (format == 0) {
    text = pl::plan_to_csv(*c.input, *c.plan);
    name = "tidewright-schedule.csv";
    mime = "text/csv";
  } else if (format == 1) {
    const std::string iso = tw::datetime::format_iso8601_utc(platform::now_unix_seconds());  // 2026-12-01T20:00:00Z
    std::string stamp;
    for (char ch : iso) if (ch != '-' && ch != ':') stamp += ch;
    // Every dose, as this export has always written (the screen offers no hand-only choice yet).
    auto ics = pl::plan_to_icalendar(*c.input, *c.plan, stamp, pl::IcsDoses::All);
    if (!ics) {
      notify(app, "Calendar not made: " + ics.error().message, true);
      return false;
    }
    text = std::move(ics).value();
    name = "tidewright-schedule.ics";
    mime = "text/calendar";
  } else if (format == 3) {
    text = pl::plan_to_json(*c.input, *c.plan);
    name = "tidewright-schedule.json";
    mime = "application/json";
  } else {
    text = pl::plan_to_text(*c.input, *c.plan);
    name = "tidewright-schedule.txt";
    mime = "text/plain";
  }
  std::string where;
  if (!platform::export_file(name, mime, text, &where)) {
    notify(app, "Export failed: " + where, true);
    return false;
  }
  notify(app, "Schedule saved to " + where);
  return true;
}

// ---------------------------------------------------------------- Plan
namespace {

// A stock of one compound as an additive dosed by the mL (the core checks the solubility).
tw::Result<add::Additive> stock_additive(add::CompoundId id, double g_per_l, const std::string& name) {
  add::StockRecipe r;
  r.name = name + " " + fmtx_g_per_l(g_per_l);  // the recipe's name is the additive's (and its file's)
  r.ingredients.push_back({id, g_per_l});
  r.temperature_c = kPlanStockTemperatureC;
  return add::additive_from_stock(r);
}

tw::Result<add::Additive> alkalinity_stock(const PlanForm& f, double g_per_l, double temperature_c) {
  if (f.alkalinity == PlanAlkalinity::Limewater) return add::limewater_additive(temperature_c);
  const bool carb = f.alkalinity == PlanAlkalinity::SodiumCarbonate;
  return stock_additive(alkalinity_compound(f.alkalinity), g_per_l, carb ? "Sodium carbonate" : "Sodium bicarbonate");
}
tw::Result<add::Additive> calcium_stock(double g_per_l) {
  return stock_additive(add::CompoundId::CalciumChlorideDihydrate, g_per_l, "Calcium chloride dihydrate");
}

// A stock's strength as planned: the keeper's, else that of the compound's stock the log shows
// dosed (a schedule, else a dose in the last weeks), else the starting strength.
double strength_of(const AppState& app, tw::journal::SystemId system, add::CompoundId id, const std::optional<double>& typed,
                   double starter, bool* from_log) {
  *from_log = false;
  if (typed) return *typed;
  const add::CompoundId ids[] = {id};
  const auto dosed = pl::dosed_stock_for(app.journal, system, ids, platform::now_unix_seconds());
  if (dosed && dosed->stock_g_per_l) {
    *from_log = true;
    return *dosed->stock_g_per_l;
  }
  return starter;
}

void resolve_strengths(const AppState& app, const PlanForm& f, tw::journal::SystemId system, PlanCache& out) {
  out.alkalinity_g_per_l = strength_of(app, system, alkalinity_compound(f.alkalinity), f.alkalinity_g_per_l,
                                       pl::kStarterSodaAshGPerL, &out.alkalinity_strength_from_log);
  out.calcium_g_per_l = strength_of(app, system, add::CompoundId::CalciumChlorideDihydrate, f.calcium_g_per_l,
                                    pl::kStarterCalciumChlorideGPerL, &out.calcium_strength_from_log);
}
tw::Result<add::Additive> magnesium_stock(PlanMagnesium m, double g_per_l) {
  const add::CompoundId id = magnesium_compound(m);
  return stock_additive(id, g_per_l, add::compound(id).name);
}

// The magnesium stock as planned: the keeper's choice and strength, else what the log shows
// dosed (a schedule, else a dose in the last weeks: the core's dosed_stock_for), else none.
void resolve_magnesium(const AppState& app, const PlanForm& f, tw::journal::SystemId system, PlanCache& out) {
  std::vector<add::CompoundId> ids;
  for (const pl::PlanStock& s : pl::magnesium_stocks()) ids.push_back(s.compound);
  const auto dosed = pl::dosed_stock_for(app.journal, system, ids, platform::now_unix_seconds());
  out.magnesium = PlanMagnesium::None;
  if (f.magnesium) {
    out.magnesium = *f.magnesium;
  } else if (dosed) {
    out.magnesium = magnesium_choice(dosed->compound);
    out.magnesium_from_log = true;
  }
  if (out.magnesium == PlanMagnesium::None) return;
  const add::CompoundId id = magnesium_compound(out.magnesium);
  if (f.magnesium_g_per_l) {
    out.magnesium_g_per_l = *f.magnesium_g_per_l;
  } else if (dosed && dosed->compound == id && dosed->stock_g_per_l) {
    out.magnesium_g_per_l = *dosed->stock_g_per_l;
  } else {
    for (const pl::PlanStock& s : pl::magnesium_stocks()) {
      if (s.compound == id) out.magnesium_g_per_l = s.starter_g_per_l;
    }
  }
}

// Each stock pump's name, calibration, doses a day and largest dose: the keeper's, else those
// of the system's schedule that gives the same compound (running now, or adopted for later),
// else the fallback and the core's defaults. A fallback name another pump already has moves on
// to the next free "pump N", so the three stay apart.
std::array<PlanPump, kPlanPumps> resolve_pumps(const AppState& app, const PlanForm& f, const PlanCache& c,
                                               const tw::journal::System& sys) {
  std::array<PlanPump, kPlanPumps> out;
  const std::int64_t now = platform::now_unix_seconds();
  std::array<bool, kPlanPumps> fallback{};
  auto one = [&](int slot, tw::Result<add::Additive> additive) {
    const PlanPumpSetting& set = f.pumps[static_cast<std::size_t>(slot)];
    std::optional<pl::ScheduledPump> sched;
    if (additive) sched = pl::scheduled_pump_for(app.journal, sys.id, *additive, now);
    const pl::PumpProgram program = pl::pump_program_from(sched);
    PlanPump& p = out[static_cast<std::size_t>(slot)];
    p.name = set.name ? *set.name : sched ? sched->device : kPlanPumpFallback[slot];
    fallback[static_cast<std::size_t>(slot)] = !set.name && !sched;
    p.calibration = set.calibration ? *set.calibration : sched ? sched->calibration : 1.0;
    p.from_schedule = sched && (!set.name || !set.calibration);
    p.doses_per_day = set.doses_per_day.value_or(program.doses_per_day);
    p.max_dose_ml = set.max_dose_ml.value_or(program.max_dose);
    p.program_from_schedule = sched && (!set.doses_per_day || !set.max_dose_ml);
  };
  one(0, alkalinity_stock(f, c.alkalinity_g_per_l, sys.default_temperature_c));
  one(1, calcium_stock(c.calcium_g_per_l));
  one(2, c.magnesium == PlanMagnesium::None ? tw::Result<add::Additive>(tw::Error{"magnesium", "none"})
                                            : magnesium_stock(c.magnesium, c.magnesium_g_per_l));
  if (f.alkalinity == PlanAlkalinity::Limewater) {  // rides on the top-off
    out[0].name = "top-off";
    out[0].calibration = 1.0;
  }
  for (std::size_t k = 0; k < out.size(); ++k) {
    if (!fallback[k]) continue;
    const auto taken = [&](const std::string& n) {
      for (std::size_t o = 0; o < out.size(); ++o) if (o != k && out[o].name == n) return true;
      return false;
    };
    for (int n = 1; taken(out[k].name) && n < 100; ++n) out[k].name = "pump " + std::to_string(n);
  }
  return out;
}

}  // namespace

void refresh_plan(AppState& app) {
  refresh_demand(app);
  const PlanForm& f = app.ui.dosing.plan;
  const DemandCache& dc = app.ui.dosing.demand_cache;
  PlanCache& c = app.ui.dosing.plan_cache;
  // Only what the plan is made from: the export format and "show every day" are not (a new
  // plan at a later "now" would move the estimate's figures between the screen and its download).
  const auto inputs_of = [](PlanForm form) {
    form.export_index = 0;
    form.show_all_days = false;
    return form;
  };
  if (c.valid && inputs_of(c.key) == inputs_of(f) && c.system == app.current_system && c.demand_computed == dc.computed_count &&
      c.room_co2_ppm == app.settings.room_co2_ppm && c.safety_limits == app.settings.safety_limits) {
    return;
  }
  PlanCache out;
  out.valid = true;
  out.key = f;
  out.system = app.current_system;
  out.demand_computed = dc.computed_count;
  out.room_co2_ppm = app.settings.room_co2_ppm;
  out.safety_limits = app.settings.safety_limits;
  out.computed_count = c.computed_count + 1;
  const tw::journal::System* sys = current_system(app);
  if (!sys) {
    out.error = "No system yet: add one on the Systems screen.";
    c = std::move(out);
    return;
  }
  resolve_magnesium(app, f, sys->id, out);
  resolve_strengths(app, f, sys->id, out);
  out.pumps = resolve_pumps(app, f, out, *sys);
  pl::PlanInput in;
  in.system.name = sys->name;
  in.system.volume_l = sys->volume_l;
  in.system.air_co2_ppm = app.settings.room_co2_ppm;
  // Targets: the system's own, with the parameter table's band (common/parameter.hpp).
  const pl::Targets defaults;
  const double alk_t = sys->targets.alkalinity_dkh.value_or(defaults.alkalinity_dkh.target);
  const double ca_t = sys->targets.calcium_mg_l.value_or(defaults.calcium_mg_l.target);
  const double mg_t = sys->targets.magnesium_mg_l.value_or(defaults.magnesium_mg_l.target);
  in.targets.alkalinity_dkh = tw::target_band(tw::Parameter::Alkalinity, alk_t);
  in.targets.calcium_mg_l = tw::target_band(tw::Parameter::Calcium, ca_t);
  in.targets.magnesium_mg_l = tw::target_band(tw::Parameter::Magnesium, mg_t);
  if (!sys->targets.alkalinity_dkh || !sys->targets.calcium_mg_l || !sys->targets.magnesium_mg_l) {
    out.assumptions.push_back("Targets the system does not set are taken as the planner's defaults.");
  }
  // Start levels and demand: the core's one rule, as `tidewright plan --journal` (levels carried
  // to now with the schedules and logged doses; a stale level refused unless accepted; the
  // newest test wins a disagreement, flagged). A parameter without a test starts at its target.
  in.system.alkalinity_dkh = alk_t;
  in.system.calcium_mg_l = ca_t;
  in.system.magnesium_mg_l = mg_t;
  in.demand = pl::demand_from_per_litre(f.alkalinity_demand_dkh_per_day, f.calcium_demand_mg_l_per_day,
                                        f.magnesium_demand_mg_l_per_day, sys->volume_l);
  // The limits first: the basis keeps room in them for the estimates' uncertainty.
  auto limits = pl::make_limits(safety_limit_settings(app.settings));
  if (!limits) {  // cannot happen for stored values (checked when set and when loaded)
    out.error = "Safety limits: " + limits.error().message;
    c = std::move(out);
    return;
  }
  in.limits = std::move(limits).value();
  pl::BasisOptions bo;
  bo.series.until_s = platform::now_unix_seconds();
  bo.accept_stale = f.accept_stale;
  auto basis = pl::plan_basis_from_journal(app.journal, sys->id, bo);
  if (!basis) {
    out.stale = basis.error().field == "stale";
    out.error = basis.error().message;
    c = std::move(out);
    return;
  }
  out.flags = basis->flags;
  const pl::DailyDemand typed = in.demand;
  for (const std::string& line : pl::apply_journal_basis(*basis, in)) {
    if (line.rfind("FLAG ", 0) == 0) continue;  // shown apart, in the warning colour
    out.assumptions.push_back(line);
  }
  if (!f.use_estimate) {
    in.demand = typed;
    out.assumptions.push_back("Consumption: typed here, not the log's estimate.");
  }
  // Deliveries: each pump with its own doses a day and largest dose (PlanCache::pumps).
  auto pump = [&](add::Additive a, int slot) {
    const PlanPump& p = out.pumps[static_cast<std::size_t>(slot)];
    pl::Delivery d;
    d.additive = std::move(a);
    d.device = p.name;
    d.calibration = p.calibration;  // max_dose below is the largest amount SET on the pump (plan.hpp Delivery)
    d.doses_per_day = std::clamp(p.doses_per_day, static_cast<int>(tw::ranges::kDosesPerDay.lo),
                                 static_cast<int>(tw::ranges::kDosesPerDay.hi));
    d.max_dose = p.max_dose_ml;
    return d;
  };
  const auto refuse = [&](const std::string& what, const tw::Error& e) {
    out.error = what + ": " + e.message;
    c = std::move(out);
  };
  if (f.alkalinity != PlanAlkalinity::None) {
    auto a = alkalinity_stock(f, out.alkalinity_g_per_l, sys->default_temperature_c);
    if (!a) return refuse(f.alkalinity == PlanAlkalinity::Limewater ? "Limewater" : "Alkalinity stock", a.error());
    pl::Delivery d = pump(std::move(a).value(), 0);
    if (f.alkalinity == PlanAlkalinity::Limewater) {
      d.max_dose = tw::ranges::kPlannedDoseMax.hi;  // bounded by the evaporation it replaces
      in.evaporation_l_per_day = f.evaporation_l_per_day;
    }
    in.deliveries.push_back(std::move(d));
  }
  if (f.calcium == PlanCalcium::CalciumChloride) {
    auto a = calcium_stock(out.calcium_g_per_l);
    if (!a) return refuse("Calcium stock", a.error());
    in.deliveries.push_back(pump(std::move(a).value(), 1));
  }
  if (out.magnesium != PlanMagnesium::None) {
    auto a = magnesium_stock(out.magnesium, out.magnesium_g_per_l);
    if (!a) return refuse("Magnesium stock", a.error());
    in.deliveries.push_back(pump(std::move(a).value(), 2));
  }
  in.horizon_days = std::clamp(f.horizon_days, static_cast<int>(tw::ranges::kPlanHorizonDays.lo),
                               static_cast<int>(tw::ranges::kPlanHorizonDays.hi));
  const std::int64_t local_s = platform::now_unix_seconds() + 60LL * platform::utc_offset_minutes();
  const std::int64_t tomorrow = (local_s / 86400 + 1) * 86400;
  in.start_date = tw::datetime::format_date_utc(tomorrow);
  // Tomorrow's local midnight in the offset of that night (a daylight-saving change may fall in between).
  out.start_day = static_cast<double>(local_time::to_utc(tomorrow)) / 86400.0;
  auto plan = pl::make_plan(in);
  if (!plan) {
    out.error = plan.error().message;
    out.input = std::move(in);
    c = std::move(out);
    return;
  }
  out.check = pl::check_plan(in, *plan);
  out.plan = std::move(plan).value();
  out.input = std::move(in);
  c = std::move(out);
}

// ---------------------------------------------------------------- The day table's words
std::vector<std::string> pump_column_lines(const pl::Delivery& d) {
  // The chemical by its formula without the water of hydration (CaCl2, not CaCl2.2H2O): short
  // enough for a phone's column; the legend above names the stock in full.
  std::string chemical = d.additive.name;
  if (!d.additive.compounds.empty()) {
    chemical.clear();
    for (const add::CompoundId id : d.additive.compounds) {
      const std::string& formula = add::compound(id).formula;
      chemical += (chemical.empty() ? "" : " + ") + fmtx::formula_text(formula.substr(0, formula.find('.')));
    }
  }
  return {d.device, chemical, std::string(add::to_string(d.additive.unit)) + (d.calibration != 1.0 ? " set" : "")};
}

std::string pump_column_title(const pl::Delivery& d) {
  std::string title;
  for (const std::string& line : pump_column_lines(d)) title += (title.empty() ? "" : ", ") + line;
  return title;
}

std::string pump_legend(const std::vector<pl::Delivery>& deliveries) {
  std::string legend;
  for (const auto& d : deliveries) {
    legend += (legend.empty() ? "" : "; ") + d.device + ": " + d.additive.name;
    if (d.calibration != 1.0) legend += ", calibration " + fmtx_calibration(d.calibration) + ": amounts to set";
    // Each pump has its own program: say how often it doses (the columns are day totals).
    legend += ", " + std::to_string(d.doses_per_day) + (d.doses_per_day == 1 ? " dose" : " doses") + " a day";
  }
  return legend;
}

// "pump 1 (calibration 0.9) and pump 2": the adopt question and its notice name the pumps alike.
std::string pumps_in_words(const std::vector<pl::Delivery>& deliveries) {
  std::string out;
  for (std::size_t k = 0; k < deliveries.size(); ++k) {
    const pl::Delivery& d = deliveries[k];
    out += (k == 0 ? "" : k + 1 == deliveries.size() ? " and " : ", ") + d.device;
    if (d.calibration != 1.0) out += " (calibration " + fmtx_calibration(d.calibration) + ")";
  }
  return out;
}

// ---------------------------------------------------------------- Name a pump
bool set_plan_pump_name(AppState& app, int slot, const std::string& typed) {
  PlanForm& f = app.ui.dosing.plan;
  const char* const labels[kPlanPumps] = {"Alkalinity pump name", "Calcium pump name", "Magnesium pump name"};
  const char* which = labels[slot];
  auto name = tw::journal::device_name_from_text(typed, which);
  if (!name) {
    notify(app, name.error().message + "; the name stays as it was", true);
    return false;
  }
  const PlanCache& c = app.ui.dosing.plan_cache;
  for (int other = 0; other < kPlanPumps; ++other) {
    if (other != slot && *name == c.pumps[static_cast<std::size_t>(other)].name) {
      notify(app, std::string(which) + ": \"" + *name + "\" already names another pump; each pump needs its own name", true);
      return false;
    }
  }
  f.pumps[static_cast<std::size_t>(slot)].name = *name;
  return true;
}

// ---------------------------------------------------------------- Adopt the plan
bool adopt_current_plan(AppState& app) {
  const PlanCache& c = app.ui.dosing.plan_cache;
  const tw::journal::System* sys = current_system(app);
  if (!sys || !c.plan || !c.input) {
    notify(app, "No plan to adopt: " + (c.error.empty() ? std::string("make one first") : c.error), true);
    return false;
  }
  if (!c.plan->verdict.holds) {
    notify(app, "This plan cannot hold the water within its floors (see the verdict); not adopted", true);
    return false;
  }
  if (c.check && !c.check->ok() && !c.check->only_floors_and_falls()) {
    notify(app, "The independent check found limit breaks in this plan; not adopted", true);
    return false;
  }
  // The same core call as `tidewright plan --adopt`: the pumps' earlier schedules stop where
  // the plan starts and the plan's doses become the new ones. Day 1 is tomorrow, local time.
  tw::journal::Journal next = app.journal;
  const std::int64_t day1_s = static_cast<std::int64_t>(std::llround(c.start_day * 86400.0));
  auto ids = pl::adopt_plan(next, sys->id, *c.input, *c.plan, day1_s);
  if (!ids) {
    notify(app, "Not adopted: " + ids.error().message, true);
    return false;
  }
  app.journal = std::move(next);
  ++app.revision;
  // The schedules hold the amounts to set on each pump (its calibration when it is not 1).
  notify(app, "Adopted: " + std::to_string(ids->size()) + " schedule" + (ids->size() == 1 ? "" : "s") + " for " +
                  pumps_in_words(c.input->deliveries) + " from tomorrow, shown on the Log screen");
  save(app);
  return true;
}

}  // namespace twapp
