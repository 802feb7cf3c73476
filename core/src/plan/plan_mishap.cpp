// What a missed dose or a pump running twice does to the water: for one dose (what_if) and for
// EVERY dose of the plan (mishap_summary, the worst of each kind). The checker's replay engine
// is run once through the plan; just before each dose a copy of it follows the mishap to the end
// of the next day with every limit checked. After that the plan goes on unchanged, so the levels
// stay shifted by the dose: the rest of the plan's levels are checked with that shift against
// the floors and ceilings.
#include <algorithm>
#include <cmath>
#include <cstdint>

#include <fmt/format.h>

#include "plan_replay_internal.hpp"
#include "tidewright/common/units.hpp"

namespace tw::plan {

namespace {

constexpr double kDay = 1440.0;

struct Followed {
  WhatIf w;
  bool crossed = false;
};

// Lowest and highest level of each parameter on the plan's time line after each moment. When
// the plan carries bands (PlanInput::spread) these are the band's edges, up to the moment to
// test again (a test then starts a new plan), checked against the limits as the keeper set
// them: the mishap is judged by the band's bad edge, not its centre.
struct Suffix {
  std::vector<double> t;
  std::vector<std::array<double, 3>> lo, hi;
  const Limits* limits = nullptr;  // what the edges are checked against
  bool edges = false;
};
Suffix suffix_extremes(const PlanInput& in, const Plan& plan) {
  Suffix s;
  const std::size_t n = plan.timeline.size();
  s.t.resize(n);
  s.lo.resize(n);
  s.hi.resize(n);
  s.limits = &in.limits;
  double until = 1e300;
  if (plan.uncertainty && plan.uncertainty->retest) {
    s.edges = true;
    s.limits = in.limits_as_set ? &*in.limits_as_set : &in.limits;
    until = (plan.uncertainty->retest->day - 1) * kDay + plan.uncertainty->retest->minute;
  }
  const double z = estimate::z95();
  std::array<double, 3> lo{1e300, 1e300, 1e300}, hi{-1e300, -1e300, -1e300};
  for (std::size_t i = n; i-- > 0;) {
    const Moment& m = plan.timeline[i];
    const WaterState& w = m.water;
    const double v[3] = {w.alkalinity_dkh, w.calcium_mg_l, w.magnesium_mg_l};
    for (int p = 0; p < 3; ++p) {
      if (s.edges && m.minute > until) continue;
      const double half = s.edges && in.spread[p] ? z * in.spread[p]->sd_after(m.minute / kDay) : 0.0;
      lo[p] = std::min(lo[p], v[p] - half);
      hi[p] = std::max(hi[p], v[p] + half);
    }
    s.t[i] = plan.timeline[i].minute;
    s.lo[i] = lo;
    s.hi[i] = hi;
  }
  return s;
}

std::string clock_text(int minute) { return fmt::format("{:02d}:{:02d}", minute / 60, minute % 60); }

// Follows a mishap of `dose` from a copy of the engine taken just before it.
Followed follow(const replay::Engine& at, const PlanInput& in, const Plan& plan, const std::vector<PlannedDose>& list,
                std::size_t pos, std::size_t dose, Mishap mishap, const Suffix& suffix, const CheckReport& nominal) {
  replay::Engine e = at;
  e.reset_findings();
  e.report.after.assign(1, WaterState{});
  const PlannedDose& d = list[pos];
  if (mishap == Mishap::RanTwice) e.dose(0, {d.day, d.minute, d.delivery, 2.0 * d.amount});
  const int last_day = std::min(d.day + 1, in.horizon_days);
  for (std::size_t j = pos + 1; j < list.size() && list[j].day <= last_day; ++j) {
    e.dose(SIZE_MAX, list[j]);
  }
  e.run_to_end_of_day(last_day);
  Followed out;
  WhatIf& w = out.w;
  w.dose = dose;
  w.mishap = mishap;
  w.day = d.day;
  w.minute = d.minute;
  if (!e.report.day_end.empty() && plan.days.size() >= static_cast<std::size_t>(d.day)) {
    const WaterState& planned = plan.days[static_cast<std::size_t>(d.day - 1)].end;
    const WaterState& got = e.report.day_end.front();
    w.alkalinity_dkh_change = got.alkalinity_dkh - planned.alkalinity_dkh;
    w.calcium_mg_l_change = got.calcium_mg_l - planned.calcium_mg_l;
    w.magnesium_mg_l_change = got.magnesium_mg_l - planned.magnesium_mg_l;
  }
  const DoseRecord& rec = plan.doses[dose];
  w.ph_total_after = mishap == Mishap::RanTwice ? e.report.after[0].ph_total : rec.before.ph_total;
  w.omega_aragonite_after = mishap == Mishap::RanTwice ? e.report.after[0].omega_aragonite : rec.before.omega_aragonite;
  w.closest_limit = e.closest;
  w.closest_margin = e.closest_margin;
  w.closest_value = e.closest_value;
  w.closest_allowed = e.closest_allowed;
  // A limit the plan itself already crosses is the verdict's business, not this mishap's.
  auto plan_crosses = [&](LimitId id) { return nominal.crossings[static_cast<std::size_t>(id)] > 0; };
  std::string crossing;
  for (const auto& v : e.report.violations) {
    if (!plan_crosses(v.limit)) {
      crossing = v.message;
      break;
    }
  }
  if (w.closest_limit && plan_crosses(*w.closest_limit)) {
    w.closest_limit.reset();
    w.closest_margin = 1e9;
  }
  // After the followed days the levels stay shifted by the dose (missed: down; twice: up).
  const auto& u = in.deliveries[d.delivery].additive.per_unit;
  const double v = in.system.volume_l, sign = mishap == Mishap::Missed ? -1.0 : 1.0;
  const double shift[3] = {sign * d.amount * u.alkalinity_eq * 1000.0 / v / units::kMeqPerLPerDKH,
                           sign * d.amount * u.calcium_mol * 40.078e3 / v, sign * d.amount * u.magnesium_mol * 24.305e3 / v};
  const double t_end = last_day * kDay;
  const auto it = std::upper_bound(suffix.t.begin(), suffix.t.end(), t_end);
  if (it != suffix.t.end()) {
    const std::size_t k = static_cast<std::size_t>(it - suffix.t.begin());
    const char* const kParameterName[3] = {"alkalinity", "calcium", "magnesium"};
    const LimitId floor[3] = {LimitId::AlkalinityFloor, LimitId::CalciumFloor, LimitId::MagnesiumFloor};
    const LimitId ceiling[3] = {LimitId::AlkalinityCeiling, LimitId::CalciumCeiling, LimitId::MagnesiumCeiling};
    for (int p = 0; p < 3; ++p) {
      if (shift[p] == 0) continue;
      const bool down = shift[p] < 0;
      const LimitId id = down ? floor[p] : ceiling[p];
      const double allowed = suffix.limits->get(id);
      const double planned = down ? suffix.lo[k][p] : suffix.hi[k][p];
      if (std::fabs(planned) > 1e299) continue;  // no moment left before the next test
      const double value = planned + shift[p];
      const bool plan_ok = (down ? planned >= allowed : planned <= allowed) && !plan_crosses(id);
      if (!plan_ok) continue;
      const double m = (down ? value - allowed : allowed - value) / std::max(1e-9, std::abs(allowed));
      if (m < w.closest_margin) {
        w.closest_margin = m;
        w.closest_limit = id;
        w.closest_value = value;
        w.closest_allowed = allowed;
      }
      if (m < -1e-9 && crossing.empty()) {
        const LimitSpec& spec = limit_spec(id);
        crossing = fmt::format("for the rest of the plan{} {} is {:.3g}{} {} and {} reaches {:.6g}, past the {} ({} {:g})",
                               suffix.edges ? " until the next test" : "", kParameterName[p], std::abs(shift[p]),
                               spec.unit_suffix(), down ? "lower" : "higher",
                               suffix.edges ? "the 95 % band's edge" : "it", value, spec.description,
                               down ? "floor" : "limit", allowed);
      }
    }
  }
  out.crossed = !crossing.empty();
  w.within_limits = !out.crossed;
  const Delivery& dv = in.deliveries[d.delivery];
  std::string closest;
  if (w.closest_limit) {
    closest = fmt::format("; closest to the {} ({:.4g} against {:g})", limit_spec(*w.closest_limit).description, w.closest_value,
                          w.closest_allowed);
  }
  w.summary = fmt::format(
      "{} {:g} {} of {} on day {} at {}: end of that day alkalinity {:+.2f} dKH, calcium {:+.1f} mg/L, "
      "magnesium {:+.1f} mg/L{}; {}{}",
      mishap == Mishap::Missed ? "missed:" : "ran twice:", d.amount, additives::to_string(dv.additive.unit),
      dv.additive.name, d.day, clock_text(d.minute), w.alkalinity_dkh_change, w.calcium_mg_l_change,
      w.magnesium_mg_l_change,
      mishap == Mishap::RanTwice ? fmt::format(", pH {:.3f} (total scale) and Omega aragonite {:.2f} right after",
                                               w.ph_total_after, w.omega_aragonite_after)
                                 : std::string(),
      out.crossed ? "CROSSES A LIMIT: " + crossing
                  : nominal.ok() ? std::string("stays inside every limit")
                                 : std::string("crosses no limit the plan itself keeps (see the verdict)"),
      out.crossed ? "" : closest);
  return out;
}

// Runs the plan once; calls `visit(engine just before dose, position, dose index)` for each dose.
template <class Visit>
Status walk(const PlanInput& in, const Plan& plan, std::vector<PlannedDose>& list, std::vector<std::size_t>& index,
            Visit visit) {
  std::vector<std::string> other;
  auto setup = replay::make_setup(in, other);
  if (!setup) return Error{"plan", other.empty() ? "the replay failed" : other.front()};
  list.clear();
  index.clear();
  for (std::size_t i = 0; i < plan.doses.size(); ++i) index.push_back(i);
  std::stable_sort(index.begin(), index.end(), [&](std::size_t a, std::size_t b) {
    const auto& x = plan.doses[a];
    const auto& y = plan.doses[b];
    return x.day != y.day ? x.day < y.day : x.minute < y.minute;
  });
  for (std::size_t i : index) {
    const auto& d = plan.doses[i];
    list.push_back({d.day, d.minute, d.delivery, d.amount});
  }
  replay::Engine e(*setup);
  for (std::size_t pos = 0; pos < list.size(); ++pos) {
    e.run_to((list[pos].day - 1) * kDay + list[pos].minute);
    if (!visit(e, pos, index[pos])) break;
    e.dose(SIZE_MAX, list[pos]);
  }
  return Ok{};
}

}  // namespace

Result<WhatIf> what_if(const PlanInput& in, const Plan& plan, std::size_t dose, Mishap mishap) {
  if (dose >= plan.doses.size()) {
    return Error{"dose", fmt::format("dose {} does not exist (accepted: 0 to {})", dose,
                                     plan.doses.empty() ? 0 : plan.doses.size() - 1)};
  }
  const Suffix suffix = suffix_extremes(in, plan);
  const CheckReport nominal = check_plan(in, plan);
  std::vector<PlannedDose> list;
  std::vector<std::size_t> index;
  std::optional<WhatIf> out;
  auto s = walk(in, plan, list, index, [&](const replay::Engine& e, std::size_t pos, std::size_t i) {
    if (i != dose) return true;
    out = follow(e, in, plan, list, pos, dose, mishap, suffix, nominal).w;
    return false;
  });
  if (!s) return s.error();
  if (!out) return Error{"dose", "the replay of this dose failed"};
  return *out;
}

std::vector<WorstMishap> mishap_summary(const PlanInput& in, const Plan& plan) {
  std::vector<WorstMishap> out;
  if (plan.doses.empty()) return out;
  const Suffix suffix = suffix_extremes(in, plan);
  const CheckReport nominal = check_plan(in, plan);
  WorstMishap missed{Mishap::Missed, 0, 0, {}, {}}, twice{Mishap::RanTwice, 0, 0, {}, {}};
  std::vector<PlannedDose> list;
  std::vector<std::size_t> index;
  auto s = walk(in, plan, list, index, [&](const replay::Engine& e, std::size_t pos, std::size_t i) {
    for (WorstMishap* m : {&missed, &twice}) {
      Followed f = follow(e, in, plan, list, pos, i, m->mishap, suffix, nominal);
      m->doses_crossing += f.crossed ? 1 : 0;
      if (m->doses_tried++ == 0 || f.w.closest_margin < m->worst.closest_margin) m->worst = f.w;
    }
    return true;
  });
  if (!s) return out;
  for (WorstMishap* m : {&missed, &twice}) {
    m->summary = fmt::format("worst of {} doses {}: {}{}", m->doses_tried,
                             m->mishap == Mishap::Missed ? "missed" : "given twice", m->worst.summary,
                             m->doses_crossing > 0
                                 ? fmt::format(" ({} of the {} would cross a limit)", m->doses_crossing, m->doses_tried)
                                 : std::string(" (none of them crosses a limit the plan keeps)"));
    out.push_back(*m);
  }
  return out;
}

}  // namespace tw::plan
