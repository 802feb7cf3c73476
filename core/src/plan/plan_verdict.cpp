// The plan's verdict: does the water stay inside every floor and largest fall? Read from the
// scheduler's time line (every predicted state), with the rules of plan.hpp: a floor applies
// once the water is at or above it (water that starts below must reach it within the horizon);
// rises and falls over every 24-hour window, the window's edge interpolated (levels move
// linearly between states). When it cannot hold: what is short (what the additives deliver at
// most against what the system consumes), from when, and which setting would hold it.
//
// Sections: 1. scan of the time line  2. shortfalls  3. fixes  4. judge
#include <algorithm>
#include <cmath>
#include <map>

#include <fmt/format.h>

#include "plan_internal.hpp"
#include "tidewright/common/units.hpp"

namespace tw::plan::detail {

namespace {

constexpr double kDay = 1440.0;
constexpr double kTol = 1e-9;  // the scheduler's own states; stricter than the checker's slack
const char* const kName[3] = {"alkalinity", "calcium", "magnesium"};
const char* const kLevelUnit[3] = {"dKH", "mg/L", "mg/L"};

std::string when(double t) {
  const int day = static_cast<int>(std::floor(t / kDay)) + 1;
  const int minute = static_cast<int>(std::lround(t - (day - 1) * kDay));
  return fmt::format("day {} at {:02d}:{:02d}", day, minute / 60, minute % 60);
}

// "2.2119 against 2.2125": the value and the limit at the fewest significant digits (3 to 6)
// that tell them apart, with the unit once (none for the unitless Omega).
std::string value_against(double value, double allowed, const std::string& unit) {
  int digits = 3;
  while (digits < 6 && fmt::format("{:.{}g}", value, digits) == fmt::format("{:.{}g}", allowed, digits)) ++digits;
  const std::string u = unit.empty() ? "" : " " + unit;
  return fmt::format("{:.{}g}{} against {:.{}g}{}", value, digits, u, allowed, digits, u);
}

// When the plan keeps room inside a limit for the forecast's band, the limit as the keeper set it
// and why the planned one differs; empty when they are the same.
std::string room_note(const PlanInput& in, LimitId id, const std::string& unit) {
  if (!in.limits_as_set) return {};
  const double set = in.limits_as_set->get(id);
  if (std::abs(set - in.limits.get(id)) <= 1e-12 * std::max(1.0, std::abs(set))) return {};
  return fmt::format("; set at {:g}{}, planned with room for {} of the estimates", set, unit.empty() ? "" : " " + unit,
                     room_band(id));
}

struct Crossing {
  LimitId limit;
  double t = 0, value = 0, allowed = 0;
  bool never_reached = false;
};

// ================================================================ 1. Scan of the time line
std::optional<Crossing> scan(const PlanInput& in, Plan& plan) {
  const auto& line = plan.timeline;
  const Limits& lim = in.limits;
  const LimitId floor[5] = {LimitId::AlkalinityFloor, LimitId::CalciumFloor, LimitId::MagnesiumFloor,
                            LimitId::PhFloor, LimitId::OmegaAragoniteFloor};
  const LimitId fall[3] = {LimitId::AlkalinityFallPerDay, LimitId::CalciumFallPerDay, LimitId::MagnesiumFallPerDay};
  bool armed[5] = {false, false, false, false, false};
  std::optional<Crossing> first;
  auto levels = [](const WaterState& w) { return std::array<double, 3>{w.alkalinity_dkh, w.calcium_mg_l, w.magnesium_mg_l}; };
  std::size_t lo_i = 0;  // first moment inside the current window
  for (std::size_t i = 0; i < line.size(); ++i) {
    const WaterState& w = line[i].water;
    const double t = line[i].minute;
    const double v[5] = {w.alkalinity_dkh, w.calcium_mg_l, w.magnesium_mg_l, w.ph_total, w.omega_aragonite};
    for (int f = 0; f < 5; ++f) {
      const double allowed = lim.get(floor[f]);
      if (!armed[f]) armed[f] = v[f] >= allowed;
      if (armed[f] && v[f] < allowed - kTol && !first) first = Crossing{floor[f], t, v[f], allowed};
    }
    while (lo_i < i && line[lo_i].minute < t - kDay) ++lo_i;
    const auto now = levels(w);
    auto lo = now, hi = now;
    for (std::size_t j = lo_i; j < i; ++j) {
      const auto x = levels(line[j].water);
      for (int p = 0; p < 3; ++p) {
        lo[p] = std::min(lo[p], x[p]);
        hi[p] = std::max(hi[p], x[p]);
      }
    }
    if (lo_i > 0 && line[lo_i].minute > t - kDay && line[lo_i].minute > line[lo_i - 1].minute) {
      const auto a = levels(line[lo_i - 1].water), b = levels(line[lo_i].water);
      const double f = (t - kDay - line[lo_i - 1].minute) / (line[lo_i].minute - line[lo_i - 1].minute);
      for (int p = 0; p < 3; ++p) {
        lo[p] = std::min(lo[p], a[p] + f * (b[p] - a[p]));
        hi[p] = std::max(hi[p], a[p] + f * (b[p] - a[p]));
      }
    }
    const int day = std::clamp(static_cast<int>(std::ceil(t / kDay)), 1, static_cast<int>(plan.days.size()));
    DaySummary& ds = plan.days[static_cast<std::size_t>(day - 1)];
    double* rise[3] = {&ds.rise_alkalinity_dkh, &ds.rise_calcium_mg_l, &ds.rise_magnesium_mg_l};
    double* drop[3] = {&ds.fall_alkalinity_dkh, &ds.fall_calcium_mg_l, &ds.fall_magnesium_mg_l};
    for (int p = 0; p < 3; ++p) {
      *rise[p] = std::max(*rise[p], now[p] - lo[p]);
      *drop[p] = std::max(*drop[p], hi[p] - now[p]);
      if (hi[p] - now[p] > lim.get(fall[p]) + kTol && !first) first = Crossing{fall[p], t, hi[p] - now[p], lim.get(fall[p])};
    }
  }
  if (!first && !line.empty()) {
    const WaterState& w = line.back().water;
    const double v[5] = {w.alkalinity_dkh, w.calcium_mg_l, w.magnesium_mg_l, w.ph_total, w.omega_aragonite};
    for (int f = 0; f < 5 && !first; ++f) {
      if (!armed[f]) first = Crossing{floor[f], line.back().minute, v[f], lim.get(floor[f]), true};
    }
  }
  return first;
}

// ================================================================ 2. Shortfalls
// What one unit (mL or g) of an additive adds of a parameter: meq, mg Ca, mg Mg.
double per_unit_amount(const additives::Additive& a, int p) {
  if (p == 0) return a.per_unit.alkalinity_eq * 1000.0;
  if (p == 1) return a.per_unit.calcium_mol * 40.078e3;
  return a.per_unit.magnesium_mol * 24.305e3;
}
double demand_of(const DailyDemand& d, int p) {
  return p == 0 ? d.alkalinity_meq_per_day : p == 1 ? d.calcium_mg_per_day : d.magnesium_mg_per_day;
}
// How much one unit (mL or g) of an additive moves a level in this system (dKH or mg/L).
double level_per_unit(const PlanInput& in, const additives::Additive& a, int p) {
  const double r = per_unit_amount(a, p);
  return p == 0 ? r / units::kMeqPerLPerDKH / in.system.volume_l : r / in.system.volume_l;
}
const LimitId kStepLimit[3] = {LimitId::AlkalinityStepPerDose, LimitId::CalciumStepPerDose,
                               LimitId::MagnesiumStepPerDose};
// The most a delivery can give per day (mL or g reaching the tank): every slot at its largest
// setting, its largest setting per day (each times the pump's calibration), and for limewater the
// evaporation it replaces.
double most_per_day(const PlanInput& in, const Delivery& d) {
  double most = std::min(d.delivered_max_dose() * d.doses_per_day, d.delivered_max_per_day());
  if (d.additive.limewater) most = std::min(most, in.evaporation_l_per_day * 1000.0);
  return most;
}

Shortfall shortfall_of(const PlanInput& in, int p) {
  Shortfall s;
  s.parameter = kName[p];
  s.unit = p == 0 ? "meq/day" : "mg/day";
  for (const Delivery& d : in.deliveries) s.deliverable_per_day += most_per_day(in, d) * per_unit_amount(d.additive, p);
  s.consumed_per_day = demand_of(in.demand, p);
  return s;
}

// ================================================================ 3. Fixes
// The setting of one delivery that would cover the demand on its own share: mL (or g) per day,
// then the doses per day that gives within its largest dose and the single-dose limit, or a
// stronger stock.
std::string fix_for(const PlanInput& in, const Shortfall& s, int p) {
  std::optional<std::size_t> best;
  for (std::size_t i = 0; i < in.deliveries.size(); ++i) {
    const auto& a = in.deliveries[i].additive;
    if (per_unit_amount(a, p) <= 0 || a.limewater) continue;
    if (!best || per_unit_amount(a, p) > per_unit_amount(in.deliveries[*best].additive, p)) best = i;
  }
  if (!best) {
    return fmt::format("add a {} additive on a pump (limewater is bounded by the {:g} L/day of evaporation it replaces)",
                       kName[p], in.evaporation_l_per_day);
  }
  const Delivery& d = in.deliveries[*best];
  const double r = per_unit_amount(d.additive, p);
  const double now = most_per_day(in, d);
  const double need = now + (s.consumed_per_day - s.deliverable_per_day) / r;
  const char* unit = additives::to_string(d.additive.unit);
  // Each dose may move the level at most by the single-dose limit: that bounds the dose size.
  const double dose_cap = std::min(d.delivered_max_dose(), in.limits.get(kStepLimit[p]) / level_per_unit(in, d.additive, p));
  const int doses = static_cast<int>(std::ceil(need / dose_cap * 1.0000001));
  std::string out = fmt::format("{} ({}): at least {:.4g} {}/day instead of at most {:.4g} {}/day", d.additive.name,
                                d.device, need, unit, now, unit);
  if (d.calibration != 1.0) {
    out += fmt::format(" reaching the tank ({:.4g} {}/day set on the pump at calibration {:g})", d.set_amount(need), unit,
                       d.calibration);
  }
  if (need > d.delivered_max_per_day()) out += fmt::format(" (raise max_per_day from {:g})", d.max_per_day);
  if (doses > d.doses_per_day) {
    out += doses <= 288 ? fmt::format(", in at least {} doses/day (now {}) of at most {:.4g} {}", doses,
                                      d.doses_per_day, dose_cap, unit)
                        : fmt::format(", which needs more than 288 doses/day");
  }
  if (!d.additive.compounds.empty() && d.additive.unit == additives::DoseUnit::Millilitre) {
    out += fmt::format("; or a stock {:.3g} times as strong at the same pump setting (if its solubility allows)",
                       need / now);
  }
  return out;
}

// The plan's doses with a dose by hand at the start, replayed by the independent checker over
// the first `days` days.
CheckReport replay_with(const PlanInput& in, const Plan& plan, const StartDose& s, int days) {
  PlanInput cut = in;
  cut.horizon_days = days;
  return check_doses(cut, doses_with_start_dose(plan, s, days));
}
// The first floor crossing of a replay, if any: a copy, so that it may outlive a report made in
// the same expression.
std::optional<Violation> first_floor(const CheckReport& r) {
  for (const Violation& v : r.violations) {
    if (limit_spec(v.limit).side == LimitSide::Floor) return v;
  }
  return std::nullopt;
}
// The smallest amount in [lo, hi] for which `ok` holds, `ok` false below it and true above;
// none when it fails even at hi.
template <typename Ok>
std::optional<double> smallest_amount(double lo, double hi, const Ok& ok) {
  if (lo > hi) return std::nullopt;
  if (ok(lo)) return lo;
  if (lo >= hi || !ok(hi)) return std::nullopt;
  for (int i = 0; i < 16; ++i) {
    const double mid = 0.5 * (lo + hi);
    (ok(mid) ? hi : lo) = mid;
  }
  return hi;
}

// The water starts so close to a floor that it crosses it on day 1 before the first dose that
// could lift it (a pump's first slot hours after midnight): no pump setting helps, a dose by hand
// at the start does. Sized with the independent checker, at least what the system consumes of
// the parameter until that first dose and at most one single-dose limit (pH and Omega, which
// also settle with the room air, are lifted through alkalinity). In this order:
//   1. moved: the pump's first doses give as much less, the plan's total unchanged; the smallest
//      amount that keeps the floors until the first dose. Taken if the plan then keeps every limit.
//   2. on top of the plan's doses: the smallest amount that keeps every floor of the plan. Taken
//      if the plan then keeps every limit (its rises and ceilings too).
//   3. else the moved dose, saying when the plan's own water still falls below a floor.
// None when a dose came before the crossing, none lifts it, or a single-dose limit would not do.
struct StartDip {
  std::string reason, fix;
  StartDose dose;
};
std::optional<StartDip> start_dip(const PlanInput& in, const Plan& plan, const Crossing& c) {
  if (c.never_reached || c.t >= kDay) return std::nullopt;
  const int p = c.limit == LimitId::CalciumFloor ? 1 : c.limit == LimitId::MagnesiumFloor ? 2 : 0;
  if (p == 0 && c.limit != LimitId::AlkalinityFloor && c.limit != LimitId::PhFloor &&
      c.limit != LimitId::OmegaAragoniteFloor) {
    return std::nullopt;
  }
  const DoseRecord* first = nullptr;
  for (const DoseRecord& d : plan.doses) {
    if (per_unit_amount(in.deliveries[d.delivery].additive, p) <= 0) continue;
    first = &d;
    break;
  }
  if (!first || in.deliveries[first->delivery].additive.limewater) return std::nullopt;
  const double first_t = (first->day - 1) * kDay + first->minute;
  // The time line's state just before a dose is the trough: a crossing there, at the first dose's
  // own minute, is still one no earlier dose could have prevented.
  if (first_t < c.t - kTol) return std::nullopt;
  const Delivery& d = in.deliveries[first->delivery];
  const double r = per_unit_amount(d.additive, p);
  const double lift_per_unit = level_per_unit(in, d.additive, p);
  const double consumed = demand_of(in.demand, p) * first_t / kDay / r;  // until the first dose
  const double step_amount = in.limits.get(kStepLimit[p]) / lift_per_unit;  // one dose's limit
  auto dose = [&](double amount, bool on_top) { return StartDose{first->delivery, amount, first->minute, on_top, false}; };

  std::optional<StartDose> chosen;
  const auto moved_amount = smallest_amount(consumed, step_amount, [&](double a) {
    const auto v = first_floor(replay_with(in, plan, dose(a, false), 1));
    return !v || v->day > 1 || v->minute > first->minute;
  });
  std::optional<CheckReport> moved_report;
  if (moved_amount) {
    moved_report = replay_with(in, plan, dose(*moved_amount, false), in.horizon_days);
    if (moved_report->violations.empty()) chosen = dose(*moved_amount, false);
  }
  if (!chosen) {
    const auto on_top_amount = smallest_amount(consumed, step_amount, [&](double a) {
      return !first_floor(replay_with(in, plan, dose(a, true), in.horizon_days));
    });
    if (on_top_amount && replay_with(in, plan, dose(*on_top_amount, true), in.horizon_days).violations.empty()) {
      chosen = dose(*on_top_amount, true);
    }
  }
  if (chosen) chosen->keeps_limits = true;
  else if (moved_amount) chosen = dose(*moved_amount, false);
  else return std::nullopt;

  const double amount = chosen->amount;
  const char* unit = additives::to_string(d.additive.unit);
  const int hh = first->minute / 60, mm = first->minute % 60;
  StartDip out;
  out.dose = *chosen;
  out.reason = fmt::format("the water starts close to the floor and the first {} dose is at {:02d}:{:02d} on day 1", kName[p],
                           hh, mm);
  std::string how;
  if (chosen->on_top) {
    how = ", on top of the plan's doses";
  } else {
    how = amount < first->amount
              ? fmt::format(", and set the {} dose at {:02d}:{:02d} {:.3g} {} smaller", d.device, hh, mm, amount, unit)
              : fmt::format(", and give {:.3g} {} less from {}'s doses from {:02d}:{:02d} on (that one, planned {:.3g} {}, "
                            "skipped)",
                            amount, unit, d.device, hh, mm, first->amount, unit);
  }
  std::string after = "; with it the plan keeps every limit";
  if (!chosen->keeps_limits) {
    const auto v = moved_report ? first_floor(*moved_report) : std::nullopt;
    after = v ? fmt::format("; the water still falls below a floor on day {} at {:02d}:{:02d}: see the other fixes",
                            v->day, v->minute / 60, v->minute % 60)
              : "; the plan still crosses a limit: see the other fixes";
  }
  out.fix = fmt::format("at the plan's start (day 1, 00:00) give {:.3g} {} of {} by hand (it lifts {} by {:.2g} {}, "
                        "enough to stay above the floors until {:02d}:{:02d}){}{}",
                        amount, unit, d.additive.name, kName[p], amount * lift_per_unit, kLevelUnit[p], hh, mm, how,
                        after);
  return out;
}

}  // namespace

// ================================================================ 4. Judge
void judge(const PlanInput& in, Plan& plan) {
  Verdict& v = plan.verdict;
  v = Verdict{};
  const auto crossing = scan(in, plan);
  std::vector<int> short_params;
  for (int p = 0; p < 3; ++p) {
    Shortfall s = shortfall_of(in, p);
    if (s.consumed_per_day > s.deliverable_per_day * (1 + 1e-9) + 1e-12) {
      v.shortfalls.push_back(s);
      short_params.push_back(p);
    }
  }
  if (!crossing) {
    v.holds = true;
    v.headline = "Holds: every predicted state stays inside the floors and the largest falls.";
    return;
  }
  v.holds = false;
  const LimitSpec& spec = limit_spec(crossing->limit);
  v.first_limit = crossing->limit;
  const int day = static_cast<int>(std::floor(crossing->t / kDay)) + 1;
  v.first_day = std::min(day, in.horizon_days);
  v.first_minute = day > in.horizon_days ? 1439 : static_cast<int>(std::lround(crossing->t - (day - 1) * kDay));
  v.first_value = crossing->value;
  v.first_allowed = crossing->allowed;
  std::string what;
  if (crossing->never_reached) {
    what = fmt::format("{} stays below its floor ({:g} {}) for the whole plan of {} days, ending at {:.3g}",
                       spec.description, crossing->allowed, spec.unit, in.horizon_days, crossing->value);
  } else if (spec.side == LimitSide::Floor) {
    // In plain words, as a ceiling's crossing below: the app shows this text as it is, and the
    // limit's key (omega_aragonite_min) is a name only the plan input file uses; the command
    // line's plan lists every limit by key and description.
    what = fmt::format("the water falls below its floor on {}: {} {}{}", when(crossing->t),
                       spec.description, value_against(crossing->value, crossing->allowed, spec.unit),
                       room_note(in, crossing->limit, spec.unit));
  } else {
    what = fmt::format("{} is crossed on {}: {}{}", spec.description, when(crossing->t),
                       value_against(crossing->value, crossing->allowed, spec.unit),
                       room_note(in, crossing->limit, spec.unit));
  }
  for (std::size_t k = 0; k < v.shortfalls.size(); ++k) {
    const Shortfall& s = v.shortfalls[k];
    v.reasons.push_back(fmt::format("{}: the additives deliver at most {:.4g} {}; the system consumes {:.4g} {}",
                                    s.parameter, s.deliverable_per_day, s.unit, s.consumed_per_day, s.unit));
    v.fixes.push_back(fix_for(in, s, short_params[k]));
  }
  for (const auto& e : plan.reservoirs_empty) {
    const Delivery& d = in.deliveries[e.delivery];
    v.reasons.push_back(fmt::format("the reservoir of {} ({:g} {}) runs dry on day {}", d.additive.name, d.reservoir,
                                    additives::to_string(d.additive.unit), e.day));
    v.fixes.push_back(fmt::format("refill {} before day {} (or start with a larger reservoir)", d.additive.name, e.day));
  }
  const auto dip = start_dip(in, plan, *crossing);
  if (dip) {
    // First: it is the cause of this crossing, and the fix the keeper can do tonight.
    v.reasons.insert(v.reasons.begin(), dip->reason);
    v.fixes.insert(v.fixes.begin(), dip->fix);
    v.start_dose = dip->dose;
  }
  if (v.shortfalls.empty() && plan.reservoirs_empty.empty()) {
    // Enough capacity: the limits or the pump's timing held doses back.
    std::map<std::string, int> caps;
    for (const auto& d : plan.doses) {
      if (!d.cap.empty()) caps[d.cap]++;
    }
    std::string held;
    for (const auto& [key, n] : caps) {
      held += fmt::format("{}{} doses by {}", held.empty() ? "" : ", ", n, cap_in_words(key));
    }
    v.reasons.push_back(held.empty() ? "the additives could deliver the demand, but not at the times it is needed"
                                     : "the additives could deliver the demand, but doses were held back: " + held);
    if (crossing->never_reached) {
      const int p = crossing->limit == LimitId::AlkalinityFloor ? 0 : crossing->limit == LimitId::CalciumFloor ? 1 : 2;
      if (crossing->limit == LimitId::PhFloor || crossing->limit == LimitId::OmegaAragoniteFloor) {
        v.fixes.push_back(fmt::format("at {:g} ppm room CO2 the water settles too low: more fresh air (less CO2 in "
                                      "the room) or a higher alkalinity target",
                                      in.system.air_co2_ppm));
      } else {
        const LimitId rise[3] = {LimitId::AlkalinityRisePerDay, LimitId::CalciumRisePerDay, LimitId::MagnesiumRisePerDay};
        v.fixes.push_back(fmt::format("a longer plan: at the rise limit of {:g} {} a day {} needs at least {:.0f} "
                                      "days to reach its floor",
                                      in.limits.get(rise[p]), kLevelUnit[p], kName[p],
                                      std::ceil((crossing->allowed - crossing->value) / in.limits.get(rise[p])) +
                                          in.horizon_days));
      }
    } else if (crossing->limit == LimitId::PhFloor || crossing->limit == LimitId::OmegaAragoniteFloor) {
      v.fixes.push_back(fmt::format("at {:g} ppm room CO2 pH and saturation settle low between doses: more fresh air, "
                                    "or a higher alkalinity target",
                                    in.system.air_co2_ppm));
    } else if (!dip || !dip->dose.keeps_limits) {  // a dip the dose by hand ends needs no other fix
      int most = 1;
      for (const auto& d : in.deliveries) most = std::max(most, d.doses_per_day);
      v.fixes.push_back(fmt::format("more, smaller doses per day (now at most {}; try {}): each moves the water less, "
                                    "so the limits hold fewer of them back",
                                    most, std::min(288, most * 2)));
    }
  }
  v.headline = "CANNOT HOLD: " + what + (v.reasons.empty() ? "" : "; " + v.reasons.front()) + ".";
}

}  // namespace tw::plan::detail

namespace tw::plan {

std::vector<PlannedDose> doses_with_start_dose(const Plan& plan, const StartDose& start, int last_day) {
  std::vector<PlannedDose> doses{{1, 0, start.delivery, start.amount}};
  double left = start.on_top ? 0.0 : start.amount;
  for (const DoseRecord& d : plan.doses) {
    if (d.day > last_day) break;
    double amount = d.amount;
    if (d.delivery == start.delivery && left > 0) {
      const double less = std::min(left, amount);
      amount -= less;
      left -= less;
    }
    if (amount > 0) doses.push_back({d.day, d.minute, d.delivery, amount});
  }
  return doses;
}

}  // namespace tw::plan
