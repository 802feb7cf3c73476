// The dose scheduler: each day it decides how much of each additive the day needs (demand plus
// a ramp toward target no faster than the rise limit, and no faster down than the fall limit),
// spreads it over each delivery's allowed hours, and gives dose by dose through a running water
// model, making any dose that would cross a limit smaller (or skipping it) and saying which limit
// or pump setting held it back. Every state goes on the plan's time line; the verdict
// (plan_verdict.cpp) reads it for floors and falls.
//
// Sections: 1. water model  2. daily allocation  3. one dose with its safety cap
//           4. the day loop  5. findings, salinity drift, cautions
#include <algorithm>
#include <cmath>
#include <map>

#include <fmt/format.h>

#include "plan_internal.hpp"
#include "tidewright/carbonate/carbonate.hpp"
#include "tidewright/seawater/seawater.hpp"
#include "tidewright/common/units.hpp"

namespace tw::plan {

namespace {

namespace cb = tw::carbonate;
using additives::ChemicalChange;

constexpr double kCaMgMol = 40.078, kMgMgMol = 24.305;  // g/mol (IUPAC)
constexpr std::size_t kAlk = 0, kCa = 1, kMg = 2;

// ================================================================ 1. Water model
struct Model {
  const PlanInput& in;
  cb::Constants k;
  double rho = 1.0;     // kg/L
  double mass_kg = 0;   // of the water
  double ca_ref = 0;    // mol/kg calcium inside k (Omega is rescaled to the current calcium)
};

struct Water {
  double alk = 0, dic = 0;  // umol/kg
  double ca = 0, mg = 0;    // mg/L
};

double alk_dkh(const Model& m, double alk_umol_kg) {
  return alk_umol_kg * m.rho / 1000.0 / units::kMeqPerLPerDKH;
}
double alk_umol(const Model& m, double dkh) { return dkh * units::kMeqPerLPerDKH * 1000.0 / m.rho; }

std::array<double, 3> levels(const Model& m, const Water& w) { return {alk_dkh(m, w.alk), w.ca, w.mg}; }

Result<WaterState> describe(const Model& m, const Water& w) {
  auto st = cb::solve_alkalinity_dic(m.k, w.alk, w.dic);
  if (!st) return st.error();
  WaterState out;
  out.alkalinity_dkh = alk_dkh(m, w.alk);
  out.calcium_mg_l = w.ca;
  out.magnesium_mg_l = w.mg;
  out.ph_total = st->ph_total;
  out.omega_aragonite = st->omega_aragonite * (w.ca / kCaMgMol / 1000.0 / m.rho) / m.ca_ref;
  out.dic_umol_kg = w.dic;
  return out;
}

void add(const Model& m, Water& w, const ChemicalChange& c) {
  w.alk += c.alkalinity_eq * 1e6 / m.mass_kg;
  w.dic += c.dic_mol * 1e6 / m.mass_kg;
  w.ca += c.calcium_mol * kCaMgMol * 1000.0 / m.in.system.volume_l;
  w.mg += c.magnesium_mol * kMgMgMol * 1000.0 / m.in.system.volume_l;
}

// Demand over `hours`, then gas exchange toward room air.
Status advance(const Model& m, Water& w, double hours) {
  if (hours <= 0) return Ok{};
  const double f = hours / 24.0;
  const double d_alk = m.in.demand.alkalinity_meq_per_day / 1000.0 * f * 1e6 / m.mass_kg;
  w.alk = std::max(50.0, w.alk - d_alk);
  w.dic = std::max(10.0, w.dic - 0.5 * d_alk);
  w.ca = std::max(0.0, w.ca - m.in.demand.calcium_mg_per_day * f / m.in.system.volume_l);
  w.mg = std::max(0.0, w.mg - m.in.demand.magnesium_mg_per_day * f / m.in.system.volume_l);
  auto eq = cb::equilibrate_with_air(m.k, w.alk, m.in.system.air_co2_ppm);
  if (!eq) return eq.error();
  const double tau = m.in.gas_exchange_hours;
  const double keep = tau <= 0 ? 0.0 : std::exp(-hours / tau);
  w.dic = eq->dic_umol_kg + (w.dic - eq->dic_umol_kg) * keep;
  return Ok{};
}

double per_litre_rise(const Model& m, const ChemicalChange& per_unit, std::size_t p) {
  const double v = m.in.system.volume_l;
  if (p == kAlk) return per_unit.alkalinity_eq * 1000.0 / v / units::kMeqPerLPerDKH;
  if (p == kCa) return per_unit.calcium_mol * kCaMgMol * 1000.0 / v;
  return per_unit.magnesium_mol * kMgMgMol * 1000.0 / v;
}

// ================================================================ 2. Daily allocation
std::size_t primary(const additives::Additive& a) {
  if (a.per_unit.alkalinity_eq > 0) return kAlk;
  if (a.per_unit.calcium_mol > 0) return kCa;
  return kMg;
}

// Daily amount per delivery: need (per litre units) = demand + ramp toward target.
struct Allocation {
  std::vector<double> amount;
  std::vector<std::string> bound;  // per delivery: the pump setting that kept the day's amount down, or empty
};
Allocation allocate(const Model& m, const std::array<double, 3>& level, const std::vector<double>& cap,
                    const std::vector<std::string>& cap_name, double evaporation_ml) {
  const PlanInput& in = m.in;
  const double v = in.system.volume_l;
  const std::array<double, 3> demand = {in.demand.alkalinity_meq_per_day / v / units::kMeqPerLPerDKH,
                                        in.demand.calcium_mg_per_day / v, in.demand.magnesium_mg_per_day / v};
  const std::array<const Band*, 3> band = {&in.targets.alkalinity_dkh, &in.targets.calcium_mg_l,
                                           &in.targets.magnesium_mg_l};
  const std::array<LimitId, 3> rise_id = {LimitId::AlkalinityRisePerDay, LimitId::CalciumRisePerDay,
                                          LimitId::MagnesiumRisePerDay};
  const std::array<LimitId, 3> fall_id = {LimitId::AlkalinityFallPerDay, LimitId::CalciumFallPerDay,
                                          LimitId::MagnesiumFallPerDay};
  std::array<double, 3> need{};
  for (std::size_t p = 0; p < 3; ++p) {
    // Toward target, no faster than 90 % of the rise limit up or of the fall limit down.
    const double ramp = std::clamp(band[p]->target - level[p], -0.9 * in.limits.get(fall_id[p]),
                                   0.9 * in.limits.get(rise_id[p]));
    need[p] = std::max(0.0, demand[p] + ramp);
  }
  const std::size_t n = in.deliveries.size();
  std::vector<double> amount(n, 0.0);
  std::vector<std::string> bound(n);
  auto take = [&](std::size_t i, double a) {
    amount[i] += a;
    for (std::size_t p = 0; p < 3; ++p) {
      need[p] = std::max(0.0, need[p] - a * per_litre_rise(m, in.deliveries[i].additive.per_unit, p));
    }
  };
  // Limewater first, bounded by the evaporation it replaces.
  double evap_left = evaporation_ml;
  for (std::size_t i = 0; i < n; ++i) {
    const auto& a = in.deliveries[i].additive;
    if (!a.limewater) continue;
    double want = 1e300;
    for (std::size_t p = 0; p < 3; ++p) {
      const double r = per_litre_rise(m, a.per_unit, p);
      if (r > 0) want = std::min(want, need[p] / r);
    }
    const double got = std::min({want, cap[i], evap_left});
    if (want > got * (1 + 1e-9)) bound[i] = evap_left < cap[i] ? "evaporation_l_per_day" : cap_name[i];
    evap_left -= got;
    take(i, got);
  }
  // Then each parameter shared among the deliveries whose main job it is, in two passes so a
  // capped delivery's share goes to the others.
  for (std::size_t p = 0; p < 3; ++p) {
    for (int pass = 0; pass < 2; ++pass) {
      std::vector<std::size_t> open;
      for (std::size_t i = 0; i < n; ++i) {
        const auto& a = in.deliveries[i].additive;
        if (!a.limewater && primary(a) == p && amount[i] < cap[i] * (1 - 1e-12)) open.push_back(i);
      }
      if (open.empty() || need[p] <= 0) break;
      const double share = need[p] / static_cast<double>(open.size());
      for (std::size_t i : open) {
        const double r = per_litre_rise(m, in.deliveries[i].additive.per_unit, p);
        if (share / r > cap[i] - amount[i]) bound[i] = cap_name[i];
        take(i, std::min(share / r, cap[i] - amount[i]));
      }
    }
  }
  return {amount, bound};
}

// ================================================================ 3. One dose, capped
struct DoseOutcome {
  double amount = 0;
  std::string cap;
};

bool passes(const Model& m, const Water& w, const additives::Additive& a, double amount, std::string* why) {
  Water t = w;
  add(m, t, a.per_unit.scaled(amount));
  auto st = describe(m, t);
  if (!st) {
    *why = "carbonate solve failed";
    return false;
  }
  if (st->ph_total > m.in.limits.get(LimitId::PhAfterDose)) {
    *why = limit_spec(LimitId::PhAfterDose).key;
    return false;
  }
  if (st->omega_aragonite > m.in.limits.get(LimitId::OmegaAragoniteAfterDose)) {
    *why = limit_spec(LimitId::OmegaAragoniteAfterDose).key;
    return false;
  }
  return true;
}

// Lowest level of each parameter over the 24 hours that end now, from the time line (levels
// move linearly between its moments, so the window's edge is interpolated).
std::array<double, 3> lowest_in_day(const std::vector<Moment>& line, double now_min, const std::array<double, 3>& now) {
  std::array<double, 3> lo = now;
  const double from = now_min - 1440.0;
  for (std::size_t i = line.size(); i-- > 0;) {
    const WaterState& w = line[i].water;
    const std::array<double, 3> v = {w.alkalinity_dkh, w.calcium_mg_l, w.magnesium_mg_l};
    if (line[i].minute >= from) {
      for (std::size_t p = 0; p < 3; ++p) lo[p] = std::min(lo[p], v[p]);
      continue;
    }
    if (i + 1 < line.size() && line[i + 1].minute > line[i].minute) {
      const WaterState& x = line[i + 1].water;
      const std::array<double, 3> nv = {x.alkalinity_dkh, x.calcium_mg_l, x.magnesium_mg_l};
      const double f = (from - line[i].minute) / (line[i + 1].minute - line[i].minute);
      for (std::size_t p = 0; p < 3; ++p) lo[p] = std::min(lo[p], v[p] + f * (nv[p] - v[p]));
    }
    break;
  }
  return lo;
}

DoseOutcome cap_dose(const Model& m, const Water& w, const std::array<double, 3>& day_low,
                     const additives::Additive& a, double want) {
  const Limits& l = m.in.limits;
  const std::array<LimitId, 3> ceiling = {LimitId::AlkalinityCeiling, LimitId::CalciumCeiling, LimitId::MagnesiumCeiling};
  const std::array<LimitId, 3> rise = {LimitId::AlkalinityRisePerDay, LimitId::CalciumRisePerDay,
                                       LimitId::MagnesiumRisePerDay};
  const std::array<LimitId, 3> step = {LimitId::AlkalinityStepPerDose, LimitId::CalciumStepPerDose,
                                       LimitId::MagnesiumStepPerDose};
  const auto now = levels(m, w);
  DoseOutcome out{want, ""};
  for (std::size_t p = 0; p < 3; ++p) {
    const double r = per_litre_rise(m, a.per_unit, p);
    if (r <= 0) continue;
    const double by_ceiling = (l.get(ceiling[p]) - now[p]) / r;
    const double by_rise = (day_low[p] + l.get(rise[p]) - now[p]) / r;
    const double by_step = l.get(step[p]) / r;
    if (by_ceiling < out.amount) out = {std::max(0.0, by_ceiling), limit_spec(ceiling[p]).key};
    if (by_rise < out.amount) out = {std::max(0.0, by_rise), limit_spec(rise[p]).key};
    if (by_step < out.amount) out = {std::max(0.0, by_step), limit_spec(step[p]).key};
  }
  out.amount = std::floor(out.amount * 0.999999 * 1000.0) / 1000.0;  // emit to 0.001 mL or g, rounded down
  if (out.amount <= 0) return {0.0, out.cap};
  std::string why;
  if (passes(m, w, a, out.amount, &why)) return out;
  // pH or Omega would be crossed: the largest amount that passes, by bisection.
  double lo = 0.0, hi = out.amount;
  for (int i = 0; i < 40 && hi - lo > 1e-4; ++i) {
    const double mid = 0.5 * (lo + hi);
    std::string w2;
    (passes(m, w, a, mid, &w2) ? lo : hi) = mid;
  }
  lo = std::floor(lo * 1000.0) / 1000.0;
  if (lo > 0 && !passes(m, w, a, lo, &out.cap)) lo = 0;  // guard: never emit a failing dose
  return {lo, why};
}

}  // namespace

// ================================================================ 4. The day loop
Result<Plan> make_plan(const PlanInput& in) {
  if (auto s = detail::validate_input(in); !s) return s.error();
  const SystemState& sys = in.system;
  cb::Conditions cond;
  cond.salinity = sys.salinity;
  cond.temperature_c = sys.temperature_c;
  const double rho = seawater::density_kg_per_l(sys.salinity, sys.temperature_c);
  cond.calcium_umol_kg = sys.calcium_mg_l / kCaMgMol * 1000.0 / rho;
  auto k = cb::compute_constants(cond);
  if (!k) return k.error();
  Model m{in, *k, rho, sys.volume_l * rho, k->totals.calcium};

  Water w;
  w.alk = alk_umol(m, sys.alkalinity_dkh);
  w.ca = sys.calcium_mg_l;
  w.mg = sys.magnesium_mg_l;
  if (sys.ph_total) {
    auto st = cb::solve(m.k, {{cb::Quantity::Alkalinity, w.alk}, {cb::Quantity::PH, *sys.ph_total}, cb::PhScale::Total});
    if (!st) return st.error();
    w.dic = st->dic_umol_kg;
  } else {
    auto st = cb::equilibrate_with_air(m.k, w.alk, sys.air_co2_ppm);
    if (!st) return st.error();
    w.dic = st->dic_umol_kg;
  }

  Plan plan;
  plan.limits = in.limits;
  auto start = describe(m, w);
  if (!start) return start.error();
  plan.start = *start;
  plan.timeline.push_back({0.0, *start, false});

  const std::size_t n = in.deliveries.size();
  std::vector<double> reservoir_left(n);
  for (std::size_t i = 0; i < n; ++i) reservoir_left[i] = in.deliveries[i].reservoir > 0 ? in.deliveries[i].reservoir : 1e300;
  std::vector<bool> dry_reported(n, false);
  std::map<std::string, int> cap_count;  // "<limit key>|<additive>" -> doses held back
  ChemicalChange added_total;
  std::vector<ChemicalChange> added_per_day;  // for the salinity drift: ramp days against holding days
  double now_min = 0;  // minutes since the start of day 1
  std::optional<std::size_t> last_dose;

  for (int day = 1; day <= in.horizon_days; ++day) {
    DaySummary ds;
    ds.day = day;
    added_per_day.emplace_back();
    auto st0 = describe(m, w);
    if (!st0) return st0.error();
    ds.start = *st0;
    const auto day_start = levels(m, w);
    std::vector<double> cap(n);
    std::vector<std::string> cap_name(n);
    for (std::size_t i = 0; i < n; ++i) {
      const Delivery& d = in.deliveries[i];
      // The pump's settings bound what it delivers: setting x calibration (Delivery).
      cap[i] = std::min({d.delivered_max_dose() * d.doses_per_day, d.delivered_max_per_day(), reservoir_left[i]});
      cap_name[i] = cap[i] == reservoir_left[i] && d.reservoir > 0 ? "reservoir"
                    : cap[i] == d.delivered_max_per_day()           ? "max_per_day"
                                                                    : "max_dose x doses_per_day";
    }
    const Allocation alloc = allocate(m, day_start, cap, cap_name, in.evaporation_l_per_day * 1000.0);
    const std::vector<double>& daily = alloc.amount;
    ds.amount_per_delivery.assign(n, 0.0);
    double evap_left_ml = in.evaporation_l_per_day * 1000.0;

    // Dose events of the day: (minute, delivery, wanted amount).
    struct Event {
      int minute;
      std::size_t delivery;
      double want;
      bool by_max_dose;  // the pump's largest dose made it smaller than the day's share
    };
    std::vector<Event> events;
    // Every slot of every delivery is a step of the water model, dosed or not, so the model's
    // time steps depend on the input only (the checker steps at the same instants).
    for (std::size_t i = 0; i < n; ++i) {
      const Delivery& d = in.deliveries[i];
      double per = daily[i] / d.doses_per_day;
      int count = daily[i] > 0 ? d.doses_per_day : 0;
      if (daily[i] > 0 && per < d.delivered_min_dose()) {  // fewer, larger doses of the smallest size the pump gives
        count = static_cast<int>(std::floor(daily[i] / d.delivered_min_dose()));
        per = d.delivered_min_dose();
      }
      for (int j = 0; j < d.doses_per_day; ++j) {
        const bool give = (static_cast<long long>(j + 1) * count) / d.doses_per_day >
                          (static_cast<long long>(j) * count) / d.doses_per_day;
        events.push_back({detail::slot_minute(d, j), i, give ? std::min(per, d.delivered_max_dose()) : 0.0,
                          per > d.delivered_max_dose()});
      }
    }
    std::stable_sort(events.begin(), events.end(), [](const Event& a, const Event& b) { return a.minute < b.minute; });

    for (const Event& e : events) {
      const double t = (day - 1) * 1440.0 + e.minute;
      if (auto s = advance(m, w, (t - now_min) / 60.0); !s) return s.error();
      now_min = t;
      auto before = describe(m, w);
      if (!before) return before.error();
      if (plan.timeline.back().minute != t || plan.timeline.back().after_dose) plan.timeline.push_back({t, *before, false});
      const Delivery& d = in.deliveries[e.delivery];
      double want = std::min({e.want, reservoir_left[e.delivery], d.delivered_max_per_day() - ds.amount_per_delivery[e.delivery]});
      if (d.additive.limewater) want = std::min(want, evap_left_ml);
      if (want <= 0) continue;
      if (last_dose) plan.doses[*last_dose].before_next = *before;
      const auto day_low = lowest_in_day(plan.timeline, t, levels(m, w));
      DoseOutcome o = cap_dose(m, w, day_low, d.additive, want);
      if (o.cap.empty() && e.by_max_dose) o.cap = "max_dose";
      if (o.cap.empty() && !alloc.bound[e.delivery].empty()) o.cap = alloc.bound[e.delivery];
      if (!o.cap.empty()) cap_count[o.cap + "|" + d.additive.name]++;
      if (o.amount < std::max(d.delivered_min_dose(), 1e-3)) continue;
      add(m, w, d.additive.per_unit.scaled(o.amount));
      added_total += d.additive.per_unit.scaled(o.amount);
      added_per_day.back() += d.additive.per_unit.scaled(o.amount);
      reservoir_left[e.delivery] -= o.amount;
      if (d.reservoir > 0 && reservoir_left[e.delivery] < e.want && !dry_reported[e.delivery]) {
        dry_reported[e.delivery] = true;  // the next dose of this size cannot be given
        plan.reservoirs_empty.push_back({e.delivery, day, e.minute});
      }
      ds.amount_per_delivery[e.delivery] += o.amount;
      if (d.additive.limewater) evap_left_ml -= o.amount;
      DoseRecord r;
      r.day = day;
      r.minute = e.minute;
      r.delivery = e.delivery;
      r.amount = o.amount;
      r.cap = o.cap;
      auto after = describe(m, w);
      if (!after) return after.error();
      r.before = *before;
      r.after = *after;
      r.before_next = *after;
      plan.timeline.push_back({t, *after, true});
      plan.doses.push_back(r);
      last_dose = plan.doses.size() - 1;
    }
    const double end_t = day * 1440.0;
    if (auto s = advance(m, w, (end_t - now_min) / 60.0); !s) return s.error();
    now_min = end_t;
    auto st1 = describe(m, w);
    if (!st1) return st1.error();
    ds.end = *st1;
    plan.timeline.push_back({end_t, *st1, false});
    const std::array<double, 3> end_level = {ds.end.alkalinity_dkh, ds.end.calcium_mg_l, ds.end.magnesium_mg_l};
    const std::array<const Band*, 3> band = {&in.targets.alkalinity_dkh, &in.targets.calcium_mg_l,
                                             &in.targets.magnesium_mg_l};
    for (std::size_t p = 0; p < 3; ++p) {
      if (!plan.target_day[p] && end_level[p] >= band[p]->low && end_level[p] <= band[p]->high) {
        plan.target_day[p] = day;
      }
    }
    plan.days.push_back(std::move(ds));
  }
  if (last_dose) {
    auto bn = describe(m, w);
    if (bn) plan.doses[*last_dose].before_next = *bn;
  }

  // ================================================================ 5. Findings and drift
  const DaySummary& last = plan.days.back();
  const std::array<const char*, 3> pname = {"alkalinity", "calcium", "magnesium"};
  const std::array<const char*, 3> punit = {"dKH", "mg/L", "mg/L"};
  const std::array<const Band*, 3> band = {&in.targets.alkalinity_dkh, &in.targets.calcium_mg_l,
                                           &in.targets.magnesium_mg_l};
  const std::array<LimitId, 3> rise_id = {LimitId::AlkalinityRisePerDay, LimitId::CalciumRisePerDay,
                                          LimitId::MagnesiumRisePerDay};
  const std::array<double, 3> end_level = {last.end.alkalinity_dkh, last.end.calcium_mg_l, last.end.magnesium_mg_l};
  const std::array<double, 3> start_level = {sys.alkalinity_dkh, sys.calcium_mg_l, sys.magnesium_mg_l};
  for (std::size_t p = 0; p < 3; ++p) {
    bool can_raise = false;
    for (const auto& d : in.deliveries) can_raise = can_raise || per_litre_rise(m, d.additive.per_unit, p) > 0;
    if (end_level[p] < band[p]->low) {
      std::string why;
      if (!can_raise) {
        why = "no chosen additive raises it";
      } else {
        const double days_needed = (band[p]->target - start_level[p]) / in.limits.get(rise_id[p]);
        why = fmt::format("at the daily-rise limit of {:g} {}/day it needs at least {:.0f} days of ramp on top of the "
                          "demand",
                          in.limits.get(rise_id[p]), punit[p], std::ceil(days_needed));
        for (const auto& [key, count] : cap_count) {
          why += fmt::format("; {} doses of {} held back by {}", count, key.substr(key.find('|') + 1),
                             cap_in_words(key.substr(0, key.find('|'))));
        }
        why += "; daily amounts are also bounded by each pump's largest dose, volume per day, reservoir and "
               "(limewater) evaporation";
      }
      plan.findings.push_back(fmt::format("{} ends at {:.2f} {} after {} days, below the band {:g}-{:g}: the safe plan "
                                          "gets this close ({})",
                                          pname[p], end_level[p], punit[p], in.horizon_days, band[p]->low,
                                          band[p]->high, why));
    } else if (end_level[p] > band[p]->high) {
      plan.findings.push_back(fmt::format(
          "{} ends at {:.2f} {}, above the band {:g}-{:g}: the plan doses no more of it than needed; only demand "
          "or a water change brings it down",
          pname[p], end_level[p], punit[p], band[p]->low, band[p]->high));
    }
  }
  for (const auto& [key, count] : cap_count) {
    const std::string what = fmt::format("{} doses of {} were made smaller by {}", count,
                                         key.substr(key.find('|') + 1), cap_in_words(key.substr(0, key.find('|'))));
    plan.findings.push_back(what);
    plan.limits.record.push_back("capped: " + what);
  }
  for (const auto& e : plan.reservoirs_empty) {
    plan.findings.push_back(fmt::format("the reservoir of {} runs dry on day {} at {:02d}:{:02d}",
                                        in.deliveries[e.delivery].additive.name, e.day, e.minute / 60, e.minute % 60));
  }
  bool uses_limewater = false;
  for (const auto& d : in.deliveries) uses_limewater = uses_limewater || d.additive.limewater;
  if (uses_limewater && in.evaporation_l_per_day <= 0) {
    plan.findings.push_back("limewater is not dosed: evaporation_l_per_day is 0, and limewater may only replace "
                            "evaporated water");
  }
  // Salinity drift from the ions dosing leaves behind: the holding days set the weekly water
  // change; the ramp's extra is stated once (salinity_drift below).
  std::vector<double> salinity_per_day;
  for (const ChemicalChange& c : added_per_day) salinity_per_day.push_back(salinity_added(c, m.mass_kg));
  // Ramp days: up to the last day on which a level ends higher than it started (by more than a
  // thousandth of its target, well under any kit's precision); holding doses only the demand.
  int ramp_days = 0;
  for (const DaySummary& ds : plan.days) {
    const std::array<double, 3> rise = {ds.end.alkalinity_dkh - ds.start.alkalinity_dkh,
                                        ds.end.calcium_mg_l - ds.start.calcium_mg_l,
                                        ds.end.magnesium_mg_l - ds.start.magnesium_mg_l};
    for (std::size_t p = 0; p < 3; ++p) {
      if (rise[p] > 1e-3 * band[p]->target) ramp_days = ds.day;
    }
  }
  plan.salinity = salinity_drift(salinity_per_day, ramp_days, in.salinity_tolerance);
  plan.findings.push_back(salinity_drift_text(plan.salinity, in.horizon_days, in.salinity_tolerance));
  detail::judge(in, plan);
  // Targets the room air puts out of bounds: flagged with the verdict, never silently held back.
  auto conflicts = check_targets_at_air(in);
  if (!conflicts) return conflicts.error();
  plan.verdict.target_conflicts = std::move(*conflicts);
  // Bands, the moment to test again and the cost of the room kept for them (plan_bands.cpp).
  if (in.spread[0] || in.spread[1] || in.spread[2]) {
    if (auto s = detail::add_bands(in, plan); !s) return s.error();
  }
  for (const auto& d : in.deliveries) {
    for (const auto& c : additives::cautions_for(d.additive)) {
      if (std::find(plan.cautions.begin(), plan.cautions.end(), c) == plan.cautions.end()) plan.cautions.push_back(c);
    }
  }
  return plan;
}

}  // namespace tw::plan
