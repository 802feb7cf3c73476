// Dosing screens: core results recomputed when their inputs change (keys in dosing_state.hpp),
// and the pump-table export. No chemistry here: every number comes from the core.
#include "actions_dosing.hpp"

#include <algorithm>
#include <cmath>

#include "actions.hpp"
#include "platform.hpp"
#include "tidewright/common/ranges.hpp"
#include "tidewright/common/datetime.hpp"
#include "tidewright/plan/plan.hpp"
#include "tidewright/plan/plan_adopt.hpp"
#include "tidewright/plan/plan_from_journal.hpp"
#include "tidewright/seawater/seawater.hpp"
#include "tidewright/common/units.hpp"

namespace twapp {

namespace est = tw::estimate;
namespace hat = tw::hatchery;
namespace add = tw::additives;
namespace cb = tw::carbonate;
namespace pl = tw::plan;

namespace {
std::string fmtx_g_per_l(double g) { return std::to_string(static_cast<long long>(std::llround(g))) + " g/L"; }
}  // namespace

// ---------------------------------------------------------------- Demand
void refresh_demand(AppState& app) {
  DemandView& view = app.ui.dosing.demand;
  DemandCache& c = app.ui.dosing.demand_cache;
  const std::int64_t now_s = platform::now_unix_seconds();
  const std::int64_t hour = now_s / 3600;
  if (c.valid && c.system == app.current_system && c.now_hour == hour && c.forecast_days == view.forecast_days &&
      c.revision == app.revision) {
    return;
  }
  DemandCache out;
  out.valid = true;
  out.revision = app.revision;
  out.system = app.current_system;
  out.now_hour = hour;
  out.forecast_days = view.forecast_days;
  out.computed_count = c.computed_count + 1;
  out.now_days = static_cast<double>(now_s) / 86400.0;
  const tw::journal::System* sys = current_system(app);
  if (!sys) {
    out.error = "No system yet: add one on the Systems screen, then log tests.";
    c = std::move(out);
    return;
  }
  out.volume_l = sys->volume_l;
  // As `tidewright demand`: standing schedules give their doses up to now and the state is
  // read at now; the forecast's dosing is the running schedules, else the last 7 days' doses.
  est::JournalSeriesOptions so;
  so.until_s = now_s;
  auto series = est::series_from_journal(app.journal, sys->id, so);
  if (!series) {
    out.error = series.error().message;
    c = std::move(out);
    return;
  }
  out.notes = series->notes;
  for (size_t i = 0; i < 3; ++i) {
    const est::Parameter p = est::kAllParameters[i];
    const est::Series& s = series->of(p);
    ParameterEstimate& pe = out.per_parameter[i];
    for (const est::SeriesEvent& ev : s.events) {
      if (const auto* a = std::get_if<est::Addition>(&ev)) {
        pe.addition_days.push_back(a->time_days);
        pe.addition_deltas.push_back(a->delta);
      } else if (const auto* d = std::get_if<est::Dilution>(&ev)) {
        pe.dilution_days.push_back(d->time_days);
        pe.dilution_fractions.push_back(d->fraction_replaced);
      }
    }
    const est::FilterOptions opts = est::default_filter_options(p);
    auto r = est::estimate_series(s, opts, out.now_days);
    if (!r) {
      pe.error = r.error().message;
      continue;
    }
    pe.ok = true;
    pe.estimate = std::move(r).value();
    pe.stale = est::is_stale(pe.estimate, out.now_days);
    pe.scheduled = series->scheduled[i];
    if (!pe.estimate.demand_known || pe.stale) continue;
    pe.daily_dose_effect = series->scheduled[i] ? series->scheduled_per_day[i]
                                                : est::recent_daily_addition(s, 7.0, out.now_days);
    auto f = est::forecast_levels(pe.estimate, pe.daily_dose_effect, view.forecast_days, opts);
    if (f) {
      pe.forecast = std::move(f).value();
    } else {
      pe.forecast_error = f.error().message;
    }
  }
  if (out.per_parameter[0].ok && out.per_parameter[1].ok) {
    out.ratio = est::read_calcium_alkalinity(out.per_parameter[0].estimate, out.per_parameter[1].estimate);
  }
  c = std::move(out);
}

// ---------------------------------------------------------------- Hatchery
void refresh_hatchery(AppState& app) {
  const HatcheryForm& f = app.ui.dosing.hatchery;
  HatcheryCache& c = app.ui.dosing.hatchery_cache;
  if (c.valid && c.key == f) return;
  HatcheryCache out;
  out.valid = true;
  out.key = f;
  out.computed_count = c.computed_count + 1;
  const double density = tw::seawater::density_kg_per_l(f.salinity, f.temperature_c);
  hat::Water water;
  water.salinity = f.salinity;
  water.temperature_c = f.temperature_c;
  water.k1k2 = f.k1k2;
  {
    cb::Conditions here;
    here.salinity = f.salinity;
    here.temperature_c = f.temperature_c;
    here.k1k2 = f.k1k2;
    out.k1k2_suggestion = cb::suggest_k1k2(here);
  }
  if (f.calcium_mg_l) {
    water.calcium_umol_kg =
        tw::units::ion_to_umol_kg(*f.calcium_mg_l, tw::units::ConcentrationUnit::MgPerL, tw::units::Ion::Calcium, density);
  }
  water.measurements = {{cb::Quantity::Alkalinity,
                         tw::units::alkalinity_to_umol_kg(f.alkalinity_dkh, tw::units::AlkalinityUnit::DKH, density)},
                        {cb::Quantity::PH, f.ph},
                        f.ph_scale};
  hat::Settings s;
  s.target.kind = f.target_kind;
  s.target.ph_scale = f.ph_scale;
  switch (f.target_kind) {
    case hat::TargetKind::OmegaAragonite: s.target.value = f.target_omega; break;
    case hat::TargetKind::PH: s.target.value = f.target_ph; break;
    case hat::TargetKind::AlkalinityRise:
      s.target.value = tw::units::alkalinity_to_umol_kg(f.target_rise_dkh, tw::units::AlkalinityUnit::DKH, density);
      break;
  }
  s.target_point = f.target_point;
  s.buffer = f.buffer;
  s.limits.ph_ceiling = f.ph_ceiling;
  s.limits.ph_ceiling_scale = f.ph_scale;
  s.gas.residence_time_min = f.residence_time_min;
  s.stock.temperature_c = f.stock_temperature_c;
  if (f.confidence_index > 0) {
    hat::Confidence conf;
    conf.probability = kConfidenceChoices[f.confidence_index];
    conf.intake.first = tw::units::alkalinity_to_umol_kg(f.alkalinity_precision_dkh, tw::units::AlkalinityUnit::DKH, density);
    conf.intake.second = f.ph_precision;
    if (f.ph_scale != cb::PhScale::Total) conf.intake.ph_scale_conversion = cb::kPhNbsToTotalUncertainty;
    s.confidence = conf;
  }
  if (f.mode == HatcheryMode::FlowThrough) {
    auto plan = hat::plan_flow(water, f.flow_l_per_min, s);
    if (plan) {
      out.flow = std::move(plan).value();
    } else {
      out.error = plan.error().message;
    }
    if (f.show_table) {
      hat::Water varied = water;
      varied.measurements = {{cb::Quantity::PH, f.ph}, water.measurements.first, f.ph_scale};
      const hat::TableRange range{cb::Quantity::PH, f.table_from_ph, f.table_to_ph, f.table_step_ph};
      auto table = hat::build_pump_table(varied, f.flow_l_per_min, range, s);
      if (table) {
        out.table = std::move(table).value();
      } else {
        out.table_error = table.error().message;
      }
    }
  } else {
    auto plan = hat::plan_batch(water, f.volume_l, s);
    if (plan) {
      out.batch = std::move(plan).value();
    } else {
      out.error = plan.error().message;
    }
  }
  c = std::move(out);
}

bool export_pump_table(AppState& app, bool csv) {
  const HatcheryCache& c = app.ui.dosing.hatchery_cache;
  if (!c.table) {
    notify(app, "No pump-side table to export: " + (c.table_error.empty() ? std::string("show it first") : c.table_error),
           true);
    return false;
  }
  std::string where;
  const std::string text = csv ? hat::pump_table_csv(*c.table) : hat::pump_table_text(*c.table);
  if (!platform::export_file(csv ? "tidewright-pump-table.csv" : "tidewright-pump-table.txt",
                             csv ? "text/csv" : "text/plain", text, &where)) {
    notify(app, "Export failed: " + where, true);
    return false;
  }
  notify(app, "Pump-side table saved to " + where);
  return true;
}

// Plan export: format 0 CSV (RFC 4180), 1 iCalendar (RFC 5545), 2 plain text, 3 JSON (the
// command line's `plan --json`, the same core writer).
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


// ---------------------------------------------------------------- Mixes
const std::vector<add::CompoundId>& mix_compounds() {
  static const std::vector<add::CompoundId> list = [] {  // constant table built once, not app state
    std::vector<add::CompoundId> v;
    for (const add::Compound& k : add::catalog()) {
      if (k.phase == add::Phase::Solid) v.push_back(k.id);
    }
    return v;
  }();
  return list;
}

void refresh_mixes(AppState& app) {
  const MixesForm& f = app.ui.dosing.mixes;
  MixesCache& c = app.ui.dosing.mixes_cache;
  if (c.valid && c.key == f) return;
  MixesCache out;
  out.valid = true;
  out.key = f;
  out.computed_count = c.computed_count + 1;
  const auto& list = mix_compounds();
  const add::CompoundId id = list[static_cast<size_t>(std::clamp(f.compound, 0, static_cast<int>(list.size()) - 1))];
  const add::Compound& k = add::compound(id);
  if (f.direction == MixDirection::RecipeToStrength) {
    add::StockRecipe recipe;
    recipe.name = k.name;
    recipe.ingredients.push_back({id, f.grams_per_l});
    recipe.temperature_c = f.temperature_c;
    auto s = add::stock_strength(recipe);
    if (s) {
      out.strength = std::move(s).value();
    } else {
      out.error = s.error().message;
    }
  } else {
    add::TargetEffect t;
    t.parameter = static_cast<add::Parameter>(std::clamp(f.parameter, 0, 2));
    t.rise = f.rise;
    t.dose_ml = f.dose_ml;
    t.tank_volume_l = f.tank_volume_l;
    auto r = add::recipe_for_effect(id, t, f.temperature_c);
    if (r) {
      out.recipe = std::move(r).value();
      out.strength = out.recipe->strength;
    } else {
      out.error = r.error().message;
    }
  }
  auto sol = add::solubility_at(k, f.temperature_c);
  if (sol) {
    out.solubility = std::move(sol).value();
  } else {
    out.solubility_error = sol.error().message;
  }
  out.cautions = add::cautions_for(add::additive_from_compound(id));
  c = std::move(out);
}

// ---------------------------------------------------------------- Plan
namespace {

namespace pl = tw::plan;

// A stock of one compound as an additive dosed by the mL (the core checks the solubility).
tw::Result<add::Additive> stock_additive(add::CompoundId id, double g_per_l, const std::string& name) {
  add::StockRecipe r;
  r.name = name + " " + fmtx_g_per_l(g_per_l);  // the recipe's name is the additive's (and its file's)
  r.ingredients.push_back({id, g_per_l});
  r.temperature_c = 25;
  return add::additive_from_stock(r);
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
  in.demand = pl::demand_from_per_litre(f.alkalinity_demand_dkh_per_day, f.calcium_demand_mg_l_per_day, 0,
                                        sys->volume_l);
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
  // Deliveries.
  auto pump = [&](add::Additive a, const std::string& device) {
    pl::Delivery d;
    d.additive = std::move(a);
    d.device = device;
    d.doses_per_day = std::clamp(f.doses_per_day, static_cast<int>(tw::ranges::kDosesPerDay.lo),
                                 static_cast<int>(tw::ranges::kDosesPerDay.hi));
    d.max_dose = f.max_dose_ml;
    return d;
  };
  switch (f.alkalinity) {
    case PlanAlkalinity::SodiumCarbonate:
    case PlanAlkalinity::SodiumBicarbonate: {
      const bool carb = f.alkalinity == PlanAlkalinity::SodiumCarbonate;
      auto a = stock_additive(carb ? add::CompoundId::SodiumCarbonate : add::CompoundId::SodiumBicarbonate,
                              f.alkalinity_g_per_l, carb ? "Sodium carbonate" : "Sodium bicarbonate");
      if (!a) {
        out.error = "Alkalinity stock: " + a.error().message;
        c = std::move(out);
        return;
      }
      in.deliveries.push_back(pump(std::move(a).value(), "pump 1"));
      break;
    }
    case PlanAlkalinity::Limewater: {
      auto a = add::limewater_additive(sys->default_temperature_c);
      if (!a) {
        out.error = "Limewater: " + a.error().message;
        c = std::move(out);
        return;
      }
      pl::Delivery d = pump(std::move(a).value(), "top-off");
      d.max_dose = tw::ranges::kPlannedDoseMax.hi;  // bounded by the evaporation it replaces
      in.deliveries.push_back(std::move(d));
      in.evaporation_l_per_day = f.evaporation_l_per_day;
      break;
    }
    case PlanAlkalinity::None: break;
  }
  if (f.calcium == PlanCalcium::CalciumChloride) {
    auto a = stock_additive(add::CompoundId::CalciumChlorideDihydrate, f.calcium_g_per_l, "Calcium chloride dihydrate");
    if (!a) {
      out.error = "Calcium stock: " + a.error().message;
      c = std::move(out);
      return;
    }
    in.deliveries.push_back(pump(std::move(a).value(), "pump 2"));
  }
  in.horizon_days = std::clamp(f.horizon_days, static_cast<int>(tw::ranges::kPlanHorizonDays.lo),
                               static_cast<int>(tw::ranges::kPlanHorizonDays.hi));
  const std::int64_t local_s = platform::now_unix_seconds() + 60LL * platform::utc_offset_minutes();
  const std::int64_t tomorrow = (local_s / 86400 + 1) * 86400;
  in.start_date = tw::datetime::format_date_utc(tomorrow);
  out.start_day = static_cast<double>(tomorrow - 60LL * platform::utc_offset_minutes()) / 86400.0;
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
  notify(app, "Adopted: " + std::to_string(ids->size()) + " schedule" + (ids->size() == 1 ? "" : "s") +
                  " from tomorrow, shown on the Log screen");
  save(app);
  return true;
}

// ---------------------------------------------------------------- ion units
double ion_shown(double mg_l, tw::units::ConcentrationUnit unit, tw::units::Ion ion) {
  if (unit == tw::units::ConcentrationUnit::MgPerL) return mg_l;
  const double d = tw::journal::kNominalDensityKgPerL;
  const double umol = tw::units::ion_to_umol_kg(mg_l, tw::units::ConcentrationUnit::MgPerL, ion, d);
  return tw::units::ion_from_umol_kg(umol, unit, ion, d);
}

double ion_from_shown(double value, tw::units::ConcentrationUnit unit, tw::units::Ion ion) {
  if (unit == tw::units::ConcentrationUnit::MgPerL) return value;
  const double d = tw::journal::kNominalDensityKgPerL;
  const double umol = tw::units::ion_to_umol_kg(value, unit, ion, d);
  return tw::units::ion_from_umol_kg(umol, tw::units::ConcentrationUnit::MgPerL, ion, d);
}

int ion_decimals(tw::units::ConcentrationUnit unit) {
  return unit == tw::units::ConcentrationUnit::MmolPerKg ? 2 : 0;
}

}  // namespace twapp
