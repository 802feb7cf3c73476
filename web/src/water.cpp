#include "water.hpp"

#include "actions.hpp"
#include "format.hpp"
#include "local_time.hpp"
#include "platform.hpp"
#include "tidewright/plan/plan_from_journal.hpp"
#include "tidewright/seawater/seawater.hpp"

namespace twapp {

namespace cb = tw::carbonate;
namespace jn = tw::journal;

LatestReadings latest_readings(const AppState& app) {
  LatestReadings r;
  const jn::System* sys = current_system(app);
  if (!sys) return r;
  auto last = [&](jn::Parameter p) -> const jn::Event* {
    jn::EventFilter f;
    f.system_id = sys->id;
    f.parameter = p;
    const auto events = jn::select_events(app.journal, f);
    return events.empty() ? nullptr : events.back();
  };
  if (const jn::Event* e = last(jn::Parameter::Alkalinity)) {
    if (auto v = jn::canonical_value(std::get<jn::TestResult>(e->data)); v) {
      r.alkalinity_dkh = *v;
      r.alkalinity_time_s = e->time_s;
    }
  }
  if (const jn::Event* e = last(jn::Parameter::PH)) {
    const auto& t = std::get<jn::TestResult>(e->data);
    r.ph = t.value;
    r.ph_scale = t.ph_scale.value_or(cb::PhScale::NBS);
    r.ph_time_s = e->time_s;
  }
  // Salinity (specific gravity counts) and temperature by the core's one rule, shared with the
  // Plan screen and `tidewright plan --journal`.
  const auto cond = tw::plan::current_conditions(app.journal, *sys, platform::now_unix_seconds());
  if (cond.salinity.time_s) r.salinity = cond.salinity.value;
  if (cond.temperature_c.time_s) r.temperature_c = cond.temperature_c.value;
  if (const jn::Event* e = last(jn::Parameter::Calcium)) {
    if (auto v = jn::canonical_value(std::get<jn::TestResult>(e->data)); v) {
      r.calcium_mg_l = *v;
      r.calcium_time_s = e->time_s;
    }
  }
  if (const jn::Event* e = last(jn::Parameter::Magnesium)) {
    if (auto v = jn::canonical_value(std::get<jn::TestResult>(e->data)); v) {
      r.magnesium_mg_l = *v;
      r.magnesium_time_s = e->time_s;
    }
  }
  return r;
}

namespace {

void fill_from_journal(AppState& app) {
  WaterInputs& w = app.water;
  const jn::System* sys = current_system(app);
  if (!sys) {
    w.what_if = true;
    w.source = "No system yet: these are example numbers.";
    return;
  }
  const LatestReadings r = latest_readings(app);
  w.pair = r.ph ? WaterPair::AlkalinityPH : WaterPair::AlkalinityAir;
  w.salinity = r.salinity.value_or(sys->default_salinity);
  w.temperature_c = r.temperature_c.value_or(sys->default_temperature_c);
  w.calcium_mg_l = r.calcium_mg_l;
  w.magnesium_mg_l = r.magnesium_mg_l;  // used only if the Mg/Ca correction is chosen
  std::string src = "Latest readings of " + sys->name + ": ";
  if (r.alkalinity_dkh) {
    w.alkalinity_dkh = *r.alkalinity_dkh;
    src += "alkalinity " + local_time::text(r.alkalinity_time_s);
  } else {
    w.alkalinity_dkh = sys->targets.alkalinity_dkh.value_or(8.0);
    src += "no alkalinity logged (using " + std::string(sys->targets.alkalinity_dkh ? "the target" : "8 dKH") + ")";
  }
  if (r.ph) {
    w.ph = *r.ph;
    w.ph_scale = *r.ph_scale;
    src += ", pH " + local_time::text(r.ph_time_s);
  } else {
    src += "; no pH logged, so pH is taken at equilibrium with the room's air";
  }
  src += r.calcium_mg_l ? ", calcium " + local_time::text(r.calcium_time_s)
                        : std::string("; no calcium logged, so calcium is scaled from salinity");
  src += r.salinity ? "" : "; salinity from the system's default";
  src += r.temperature_c ? "" : "; temperature from the system's default";
  w.source = src + ".";
}

std::optional<cb::CarbonateState> solve_at(const cb::Constants& k, const cb::InputPair& pair) {
  auto s = cb::solve(k, pair);
  if (!s) return std::nullopt;
  return std::move(s).value();
}

// The uncertainty of the state from the readings' precision (core: solve_with_uncertainty, or
// equilibrate_with_air_with_uncertainty for water settled with the room's air).
void add_uncertainty(const AppState& app, const cb::Conditions& cond, double alk_umol_kg,
                     WaterResult& out) {
  const WaterInputs& w = app.water;
  const WaterPrecision& p = app.water_precision;
  const cb::Measurement a{cb::Quantity::Alkalinity, alk_umol_kg};
  cb::InputPair pair{a, {cb::Quantity::PH, w.ph}, w.ph_scale};
  cb::InputUncertainties u;
  u.first = tw::units::alkalinity_to_umol_kg(p.alkalinity_dkh, tw::units::AlkalinityUnit::DKH,
                                             out.density_kg_per_l);
  switch (w.pair) {
    case WaterPair::AlkalinityPH:
      u.second = p.ph;
      if (w.ph_scale == cb::PhScale::NBS) u.ph_scale_conversion = p.ph_conversion;
      break;
    case WaterPair::AlkalinityPCO2:
      pair.second = {cb::Quantity::PCO2, w.pco2_uatm};
      u.second = p.pco2_uatm;
      break;
    case WaterPair::AlkalinityDIC:
      pair.second = {cb::Quantity::DIC, w.dic_umol_kg};
      u.second = p.dic_umol_kg;
      break;
    case WaterPair::AlkalinityAir: break;
  }
  u.salinity = p.salinity;
  u.temperature_c = p.temperature_c;
  const auto ion_u = [&](double mg_l, tw::units::Ion ion) {
    return tw::units::ion_to_umol_kg(mg_l, tw::units::ConcentrationUnit::MgPerL, ion, out.density_kg_per_l);
  };
  if (cond.calcium_umol_kg) u.calcium_umol_kg = ion_u(p.calcium_mg_l, tw::units::Ion::Calcium);
  if (cond.mg_ca_correction && cond.magnesium_umol_kg)
    u.magnesium_umol_kg = ion_u(p.magnesium_mg_l, tw::units::Ion::Magnesium);
  if (cond.total_boron_umol_kg) u.total_boron_umol_kg = p.total_boron_relative * *cond.total_boron_umol_kg;
  auto r = w.pair == WaterPair::AlkalinityAir
               ? cb::equilibrate_with_air_with_uncertainty(cond, alk_umol_kg, app.settings.room_co2_ppm, u)
               : cb::solve_with_uncertainty(cond, pair, u);
  if (!r) {
    out.u_error = "No uncertainty: " + r.error().message;
    return;
  }
  out.u = r->u;
  double largest = 0;
  for (const auto& src : r->sources) {
    if (src.contribution.omega_aragonite > largest) {
      largest = src.contribution.omega_aragonite;
      out.omega_main_source = src.name;
    }
  }
}

}  // namespace

void refresh_water(AppState& app) {
  if (app.water_result.revision == app.revision) return;
  if (!app.water.what_if) fill_from_journal(app);
  const WaterInputs& w = app.water;
  WaterResult out;
  out.revision = app.revision;
  out.computed_count = app.water_result.computed_count + 1;
  cb::Conditions cond;
  cond.salinity = w.salinity;
  cond.temperature_c = w.temperature_c;
  cond.convention = app.settings.constants_convention;
  out.density_kg_per_l = tw::seawater::density_kg_per_l(w.salinity, w.temperature_c);
  if (w.calcium_mg_l) {
    cond.calcium_umol_kg = tw::units::ion_to_umol_kg(*w.calcium_mg_l, tw::units::ConcentrationUnit::MgPerL,
                                                     tw::units::Ion::Calcium, out.density_kg_per_l);
  }
  using tw::units::ConcentrationUnit, tw::units::Ion;
  if (w.magnesium_mg_l) {
    cond.magnesium_umol_kg = tw::units::ion_to_umol_kg(*w.magnesium_mg_l, ConcentrationUnit::MgPerL, Ion::Magnesium,
                                                       out.density_kg_per_l);
  }
  if (w.total_boron_mg_l) {
    cond.total_boron_umol_kg = tw::units::ion_to_umol_kg(*w.total_boron_mg_l, ConcentrationUnit::MgPerL, Ion::Boron,
                                                         out.density_kg_per_l);
  }
  cond.mg_ca_correction = w.mg_ca_correction;
  auto constants = cb::compute_constants(cond);
  if (!constants) {
    out.error = constants.error().message;
    app.water_result = std::move(out);
    return;
  }
  const cb::Constants& k = *constants;
  out.calcium = k.calcium;
  out.boron = k.boron;
  const double alk = tw::units::alkalinity_to_umol_kg(w.alkalinity_dkh, tw::units::AlkalinityUnit::DKH,
                                                      out.density_kg_per_l);
  tw::Result<cb::CarbonateState> state = tw::Error{"", ""};
  const cb::Measurement a{cb::Quantity::Alkalinity, alk};
  switch (w.pair) {
    case WaterPair::AlkalinityPH: state = cb::solve(k, {a, {cb::Quantity::PH, w.ph}, w.ph_scale}); break;
    case WaterPair::AlkalinityPCO2: state = cb::solve(k, {a, {cb::Quantity::PCO2, w.pco2_uatm}, w.ph_scale}); break;
    case WaterPair::AlkalinityDIC: state = cb::solve(k, {a, {cb::Quantity::DIC, w.dic_umol_kg}, w.ph_scale}); break;
    case WaterPair::AlkalinityAir: state = cb::equilibrate_with_air(k, alk, app.settings.room_co2_ppm); break;
  }
  if (!state) {
    out.error = state.error().message;
    app.water_result = std::move(out);
    return;
  }
  out.ok = true;
  out.state = std::move(state).value();
  auto air = cb::equilibrate_with_air(k, alk, app.settings.room_co2_ppm);
  if (air) {
    out.air = std::move(air).value();
  } else {
    out.air_error = air.error().message;
  }
  add_uncertainty(app, cond, alk, out);
  // Species across pH 6..10 on the shown scale, at this water's DIC (the core solves each point).
  const double dic = out.state.dic_umol_kg;
  for (int i = 0; i <= 80; ++i) {
    const double ph = 6.0 + 0.05 * i;
    auto p = solve_at(k, {{cb::Quantity::PH, ph}, {cb::Quantity::DIC, dic}, w.ph_scale});
    if (!p || p->dic_umol_kg <= 0) continue;
    out.curve.ph.push_back(static_cast<float>(ph));
    out.curve.co2.push_back(static_cast<float>(p->co2_umol_kg / p->dic_umol_kg));
    out.curve.hco3.push_back(static_cast<float>(p->hco3_umol_kg / p->dic_umol_kg));
    out.curve.co3.push_back(static_cast<float>(p->co3_umol_kg / p->dic_umol_kg));
  }
  app.water_result = std::move(out);
}

}  // namespace twapp
