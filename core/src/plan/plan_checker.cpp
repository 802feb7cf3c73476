// Independent plan checker: replays a list of doses from the input's starting state with its
// own, deliberately plain code (no scheduler function is called), solving each state with the
// carbonate engine directly, and checks EVERY state (each slot of each delivery, right after
// each dose, each day end) against every limit: ceilings and pH/Omega right after a dose, the
// change from one dose, floors at any time (from the moment the water is at or above them), and
// rises and falls over every 24-hour window (levels change linearly between states, so a
// window's edge is interpolated). Omega aragonite is computed here from its definition,
// [Ca][CO3]/K*sp (facts.md 1), with the current calcium.
//
// Sections: 1. setup  2. the engine (time, doses, days)  3. checks of one state  4. check_doses
#include <algorithm>
#include <cmath>
#include <cstdint>

#include <fmt/format.h>

#include "plan_internal.hpp"
#include "plan_replay_internal.hpp"
#include "tidewright/seawater/seawater.hpp"
#include "tidewright/common/units.hpp"

namespace tw::plan {

namespace cb = tw::carbonate;

bool is_floor_or_fall(LimitId id) {
  switch (id) {
    case LimitId::AlkalinityFallPerDay:
    case LimitId::CalciumFallPerDay:
    case LimitId::MagnesiumFallPerDay:
    case LimitId::AlkalinityFloor:
    case LimitId::CalciumFloor:
    case LimitId::MagnesiumFloor:
    case LimitId::PhFloor:
    case LimitId::OmegaAragoniteFloor:
      return true;
    default:
      return false;
  }
}

bool CheckReport::only_floors_and_falls() const {
  if (!other.empty()) return false;
  for (const auto& v : violations) {
    if (!is_floor_or_fall(v.limit)) return false;
  }
  return true;
}

namespace replay {

// Numerical slack: the planner and this checker follow the same model in different code, so
// their states agree to rounding; anything past this is a real crossing.
constexpr double kTol = 1e-7;
constexpr double kDay = 1440.0;

// ================================================================ 1. Setup
std::optional<Setup> make_setup(const PlanInput& in, std::vector<std::string>& other) {
  if (auto s = detail::validate_input(in); !s) {
    other.push_back("input: " + s.error().message);
    return std::nullopt;
  }
  Setup s;
  s.in = &in;
  s.density = seawater::density_kg_per_l(in.system.salinity, in.system.temperature_c);
  s.kg = in.system.volume_l * s.density;
  s.umol_per_dkh = units::kMeqPerLPerDKH * 1000.0 / s.density;  // 1 dKH = 0.35665 meq/L (facts.md 5)
  cb::Conditions cond;
  cond.salinity = in.system.salinity;
  cond.temperature_c = in.system.temperature_c;
  auto k = cb::compute_constants(cond);
  if (!k) {
    other.push_back("constants: " + k.error().message);
    return std::nullopt;
  }
  s.k = *k;
  s.start = {in.system.alkalinity_dkh * s.umol_per_dkh, 0, in.system.calcium_mg_l, in.system.magnesium_mg_l};
  auto st = in.system.ph_total
                ? cb::solve(s.k, {{cb::Quantity::Alkalinity, s.start.alk_umol_kg},
                                  {cb::Quantity::PH, *in.system.ph_total},
                                  cb::PhScale::Total})
                : cb::equilibrate_with_air(s.k, s.start.alk_umol_kg, in.system.air_co2_ppm);
  if (!st) {
    other.push_back(st.error().message);
    return std::nullopt;
  }
  s.start.dic_umol_kg = st->dic_umol_kg;
  // The model steps at every slot of every delivery, dosed or not, and at each day's end.
  for (int day = 1; day <= in.horizon_days; ++day) {
    for (const Delivery& dv : in.deliveries) {
      const double window = (dv.last_hour - dv.first_hour + 1) * 60.0;
      for (int j = 0; j < dv.doses_per_day; ++j) {
        s.steps.push_back((day - 1) * kDay + std::floor(dv.first_hour * 60.0 + (j + 0.5) * window / dv.doses_per_day));
      }
    }
    s.steps.push_back(day * kDay);
  }
  std::sort(s.steps.begin(), s.steps.end());
  s.steps.erase(std::unique(s.steps.begin(), s.steps.end()), s.steps.end());
  return s;
}

// ================================================================ 2. The engine
Engine::Engine(const Setup& s) : tank(s.start), s_(&s) {
  report.closest.fill(1e9);
  given_today_.assign(s.in->deliveries.size(), 0.0);
  given_total_.assign(s.in->deliveries.size(), 0.0);
  WaterState w;
  if (!state_of(tank, w)) {
    report.other.push_back("carbonate solve failed at the start");
    return;
  }
  const Sample first = sample_now(w);
  check_sample(first, SIZE_MAX);
  window_.push_back(first);
}

bool Engine::state_of(const Tank& x, WaterState& out) const {
  auto st = cb::solve_alkalinity_dic(s_->k, x.alk_umol_kg, x.dic_umol_kg);
  if (!st) return false;
  out.alkalinity_dkh = x.alk_umol_kg / s_->umol_per_dkh;
  out.calcium_mg_l = x.ca_mg_l;
  out.magnesium_mg_l = x.mg_mg_l;
  out.ph_total = st->ph_total;
  const double ca_mol_kg = x.ca_mg_l / 40.078 / 1000.0 / s_->density;
  out.omega_aragonite = ca_mol_kg * st->co3_umol_kg * 1e-6 / s_->k.ksp_aragonite;
  out.dic_umol_kg = x.dic_umol_kg;
  return true;
}

// Demand for `minutes`, then gas exchange (the model documented in plan.hpp).
bool Engine::pass_time(double minutes) {
  if (minutes <= 0) return true;
  const PlanInput& in = *s_->in;
  const double h = minutes / 60.0;
  const double take = in.demand.alkalinity_meq_per_day * 1e3 * (h / 24.0) / s_->kg;  // umol/kg
  tank.alk_umol_kg = std::max(50.0, tank.alk_umol_kg - take);
  tank.dic_umol_kg = std::max(10.0, tank.dic_umol_kg - take / 2.0);
  tank.ca_mg_l = std::max(0.0, tank.ca_mg_l - in.demand.calcium_mg_per_day * (h / 24.0) / in.system.volume_l);
  tank.mg_mg_l = std::max(0.0, tank.mg_mg_l - in.demand.magnesium_mg_per_day * (h / 24.0) / in.system.volume_l);
  auto eq = cb::equilibrate_with_air(s_->k, tank.alk_umol_kg, in.system.air_co2_ppm);
  if (!eq) return false;
  const double f = in.gas_exchange_hours > 0 ? std::exp(-h / in.gas_exchange_hours) : 0.0;
  tank.dic_umol_kg = eq->dic_umol_kg * (1.0 - f) + tank.dic_umol_kg * f;
  return true;
}

Sample Engine::sample_now(const WaterState& w) const {
  Sample s;
  s.t = clock;
  s.level[0] = w.alkalinity_dkh;
  s.level[1] = w.calcium_mg_l;
  s.level[2] = w.magnesium_mg_l;
  s.ph = w.ph_total;
  s.omega = w.omega_aragonite;
  return s;
}

void Engine::run_to(double t) {
  const auto& steps = s_->steps;
  while (step_ < steps.size() && steps[step_] <= t + 1e-9) {
    const double at = steps[step_++];
    if (!pass_time(at - clock)) report.other.push_back("carbonate solve failed");
    clock = at;
    WaterState w;
    if (!state_of(tank, w)) {
      report.other.push_back("carbonate solve failed");
      continue;
    }
    const Sample s = sample_now(w);
    check_sample(s, SIZE_MAX);
    window_.push_back(s);
    while (window_.size() > 2 && window_[1].t < clock - kDay) window_.pop_front();
    if (std::fmod(at, kDay) == 0.0 && at > 0) {
      report.day_end.push_back(w);
      end_of_day();
    }
  }
}

void Engine::end_of_day() {
  const PlanInput& in = *s_->in;
  for (std::size_t i = 0; i < in.deliveries.size(); ++i) {
    const Delivery& dv = in.deliveries[i];
    // The pump's settings are amounts set; what it gave (what reached the tank) is set x calibration.
    if (dv.set_amount(given_today_[i]) > dv.max_per_day * (1 + 1e-12)) {
      report.other.push_back(fmt::format("day {}: {} was set to {:g} in all, over its {:g} per day", day,
                                         dv.additive.name, dv.set_amount(given_today_[i]), dv.max_per_day));
    }
    if (dv.reservoir > 0 && given_total_[i] > dv.reservoir * (1 + 1e-12)) {
      report.other.push_back(fmt::format("day {}: {} used {:g}, more than its reservoir {:g}", day, dv.additive.name,
                                         given_total_[i], dv.reservoir));
    }
  }
  if (limewater_today_ > in.evaporation_l_per_day * 1000.0 * (1 + 1e-12) + 1e-9) {
    report.other.push_back(fmt::format("day {}: {:g} mL limewater exceeds the {:g} L evaporation", day,
                                       limewater_today_, in.evaporation_l_per_day));
  }
  std::fill(given_today_.begin(), given_today_.end(), 0.0);
  limewater_today_ = 0;
  ++day;
}

void Engine::dose(std::size_t idx, const PlannedDose& d) {
  const PlanInput& in = *s_->in;
  if (d.delivery >= in.deliveries.size() || d.minute < 0 || d.minute >= 1440 || !(d.amount > 0) || d.day < day ||
      d.day > in.horizon_days) {
    report.other.push_back(fmt::format("dose {} is malformed or out of order", idx));
    return;
  }
  const double t = (d.day - 1) * kDay + d.minute;
  run_to(t);
  const Delivery& dv = in.deliveries[d.delivery];
  if (std::abs(clock - t) > 1e-9) {
    report.other.push_back(fmt::format("dose {} at minute {} is not at a slot of any delivery", idx, d.minute));
  }
  if (d.minute < dv.first_hour * 60 || d.minute >= (dv.last_hour + 1) * 60) {
    report.other.push_back(fmt::format("dose {} at minute {} is outside the allowed hours", idx, d.minute));
  }
  if (dv.set_amount(d.amount) > dv.max_dose * (1 + 1e-12) || dv.set_amount(d.amount) < dv.min_dose * (1 - 1e-12)) {
    report.other.push_back(fmt::format("dose {} set to {:g} is outside the pump's {:g}..{:g}", idx,
                                       dv.set_amount(d.amount), dv.min_dose, dv.max_dose));
  }
  given_today_[d.delivery] += d.amount;
  given_total_[d.delivery] += d.amount;
  if (dv.additive.limewater) limewater_today_ += d.amount;
  const Sample before = window_.back();
  // The dose itself: straight from the additive's chemistry per unit.
  const auto& u = dv.additive.per_unit;
  tank.alk_umol_kg += u.alkalinity_eq * d.amount * 1e6 / s_->kg;
  tank.dic_umol_kg += u.dic_mol * d.amount * 1e6 / s_->kg;
  tank.ca_mg_l += u.calcium_mol * d.amount * 40.078e3 / in.system.volume_l;
  tank.mg_mg_l += u.magnesium_mol * d.amount * 24.305e3 / in.system.volume_l;
  WaterState w;
  if (!state_of(tank, w)) {
    report.other.push_back("carbonate solve failed");
    return;
  }
  if (idx < report.after.size()) report.after[idx] = w;
  report.max_ph_total = std::max(report.max_ph_total, w.ph_total);
  report.max_omega_aragonite = std::max(report.max_omega_aragonite, w.omega_aragonite);
  const Limits& lim = in.limits;
  auto upper = [&](LimitId id, double value) {
    margin(id, value, lim.get(id), true);
    if (value > lim.get(id) + kTol) violate(idx, t, id, value, lim.get(id));
  };
  upper(LimitId::PhAfterDose, w.ph_total);
  upper(LimitId::OmegaAragoniteAfterDose, w.omega_aragonite);
  const Sample s = sample_now(w);
  const LimitId ceiling[3] = {LimitId::AlkalinityCeiling, LimitId::CalciumCeiling, LimitId::MagnesiumCeiling};
  const LimitId step[3] = {LimitId::AlkalinityStepPerDose, LimitId::CalciumStepPerDose, LimitId::MagnesiumStepPerDose};
  const bool raised[3] = {u.alkalinity_eq > 0, u.calcium_mol > 0, u.magnesium_mol > 0};
  for (int p = 0; p < 3; ++p) {
    if (!raised[p]) continue;  // a dose is judged on what it raises; a level already high is the start's doing
    upper(ceiling[p], s.level[p]);
    upper(step[p], s.level[p] - before.level[p]);
  }
  check_sample(s, idx);
  window_.push_back(s);
}

void Engine::finish() {
  run_to(s_->in->horizon_days * kDay);
  const PlanInput& in = *s_->in;
  const LimitId floor[5] = {LimitId::AlkalinityFloor, LimitId::CalciumFloor, LimitId::MagnesiumFloor,
                            LimitId::PhFloor, LimitId::OmegaAragoniteFloor};
  if (window_.empty()) return;
  const Sample& last = window_.back();
  const double now[5] = {last.level[0], last.level[1], last.level[2], last.ph, last.omega};
  for (int f = 0; f < 5; ++f) {
    if (!armed_[f]) violate(SIZE_MAX, clock, floor[f], now[f], in.limits.get(floor[f]));  // never reached it
  }
}

void Engine::reset_findings() {
  report.violations.clear();
  report.crossings.fill(0);
  report.closest.fill(1e9);
  report.other.clear();
  report.day_end.clear();
  report.max_ph_total = report.max_omega_aragonite = 0;
  report.min_ph_total = report.min_omega_aragonite = 1e9;
  closest.reset();
  closest_margin = 1e9;
}

// ================================================================ 3. Checks of one state
void Engine::violate(std::size_t dose, double t, LimitId id, double value, double allowed) {
  auto& count = report.crossings[static_cast<std::size_t>(id)];
  if (count++ > 0) return;  // the first crossing of each limit is reported
  const int d = static_cast<int>(std::floor(t / kDay)) + 1;
  const int minute = static_cast<int>(std::lround(t - (d - 1) * kDay));
  const bool floor = limit_spec(id).side == LimitSide::Floor;
  report.violations.push_back(
      {dose, d, id, value, allowed,
       fmt::format("day {} {:02d}:{:02d}: the {} reached {:.6g}{}, {} {:g}", d, minute / 60, minute % 60,
                   limit_spec(id).description, value, limit_spec(id).unit_suffix(), floor ? "floor" : "limit", allowed),
       minute});
}

void Engine::margin(LimitId id, double value, double allowed, bool upper) {
  const double scale = std::max(1e-9, std::abs(allowed));
  const double absolute = upper ? allowed - value : value - allowed;
  auto& c = report.closest[static_cast<std::size_t>(id)];
  c = std::min(c, absolute);
  const double m = absolute / scale;
  if (m < closest_margin) {
    closest_margin = m;
    closest = id;
    closest_value = value;
    closest_allowed = allowed;
  }
}

void Engine::check_sample(const Sample& s, std::size_t dose_idx) {
  const Limits& lim = s_->in->limits;
  const LimitId floor[5] = {LimitId::AlkalinityFloor, LimitId::CalciumFloor, LimitId::MagnesiumFloor,
                            LimitId::PhFloor, LimitId::OmegaAragoniteFloor};
  const double value[5] = {s.level[0], s.level[1], s.level[2], s.ph, s.omega};
  report.min_ph_total = std::min(report.min_ph_total, s.ph);
  report.min_omega_aragonite = std::min(report.min_omega_aragonite, s.omega);
  for (int f = 0; f < 5; ++f) {
    const double allowed = lim.get(floor[f]);
    if (!armed_[f]) {
      armed_[f] = value[f] >= allowed;  // a floor applies once the water is at or above it
      if (!armed_[f]) continue;
    }
    margin(floor[f], value[f], allowed, false);
    if (value[f] < allowed - kTol) violate(dose_idx, s.t, floor[f], value[f], allowed);
  }
  check_window(s, dose_idx);
}

// Rise and fall over the 24 hours that end at this state: levels move linearly between the
// samples (demand only), so the level at the window's start is interpolated.
void Engine::check_window(const Sample& s, std::size_t dose_idx) {
  const Limits& lim = s_->in->limits;
  const double from = s.t - kDay;
  double lo[3] = {s.level[0], s.level[1], s.level[2]};
  double hi[3] = {s.level[0], s.level[1], s.level[2]};
  for (std::size_t i = window_.size(); i-- > 0;) {
    const Sample& w = window_[i];
    if (w.t >= from) {
      for (int p = 0; p < 3; ++p) {
        lo[p] = std::min(lo[p], w.level[p]);
        hi[p] = std::max(hi[p], w.level[p]);
      }
      continue;
    }
    const Sample& next = i + 1 < window_.size() ? window_[i + 1] : s;
    if (next.t > w.t) {
      const double f = (from - w.t) / (next.t - w.t);
      for (int p = 0; p < 3; ++p) {
        const double edge = w.level[p] + f * (next.level[p] - w.level[p]);
        lo[p] = std::min(lo[p], edge);
        hi[p] = std::max(hi[p], edge);
      }
    }
    break;
  }
  const LimitId rise[3] = {LimitId::AlkalinityRisePerDay, LimitId::CalciumRisePerDay, LimitId::MagnesiumRisePerDay};
  const LimitId fall[3] = {LimitId::AlkalinityFallPerDay, LimitId::CalciumFallPerDay, LimitId::MagnesiumFallPerDay};
  for (int p = 0; p < 3; ++p) {
    const double up = s.level[p] - lo[p], down = hi[p] - s.level[p];
    margin(rise[p], up, lim.get(rise[p]), true);
    margin(fall[p], down, lim.get(fall[p]), true);
    if (up > lim.get(rise[p]) + kTol) violate(dose_idx, s.t, rise[p], up, lim.get(rise[p]));
    if (down > lim.get(fall[p]) + kTol) violate(dose_idx, s.t, fall[p], down, lim.get(fall[p]));
  }
}

}  // namespace replay

// ================================================================ 4. check_doses
CheckReport check_doses(const PlanInput& in, const std::vector<PlannedDose>& doses) {
  CheckReport rep;
  auto setup = replay::make_setup(in, rep.other);
  if (!setup) return rep;
  replay::Engine e(*setup);
  e.report.after.assign(doses.size(), WaterState{});
  std::vector<std::size_t> order(doses.size());
  for (std::size_t i = 0; i < order.size(); ++i) order[i] = i;
  std::stable_sort(order.begin(), order.end(), [&](std::size_t a, std::size_t b) {
    return doses[a].day != doses[b].day ? doses[a].day < doses[b].day : doses[a].minute < doses[b].minute;
  });
  for (std::size_t i : order) e.dose(i, doses[i]);
  e.finish();
  return e.report;
}

CheckReport check_plan(const PlanInput& in, const Plan& plan) {
  std::vector<PlannedDose> list;
  list.reserve(plan.doses.size());
  for (const auto& d : plan.doses) list.push_back({d.day, d.minute, d.delivery, d.amount});
  return check_doses(in, list);
}

}  // namespace tw::plan
