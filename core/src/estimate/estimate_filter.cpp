// Kalman filter and Rauch-Tung-Striebel smoother for level and daily demand (estimate.hpp 4).
// The filter is the standard linear-Gaussian one (Kalman 1960); the smoother is the fixed-
// interval smoother of Rauch, Tung & Striebel (1965, AIAA J. 3:1445). State [level, demand],
// covariance kept as its three distinct entries.
#include <algorithm>
#include <cmath>
#include <limits>

#include <fmt/format.h>

#include "tidewright/estimate/estimate.hpp"

namespace tw::estimate {
namespace {

constexpr double kZ95 = 1.959963984540054;  // two-sided 95 % point of the normal distribution

struct State {
  double l = 0.0, d = 0.0;             // level, demand
  double pll = 0.0, pld = 0.0, pdd = 0.0;  // covariance
};

// Composite transition matrix since the last test (row-major [[a,b],[c,e]]); demand row stays
// [0,1] for every event in this model, so only the level row is tracked.
struct LevelRow {
  double a = 1.0, b = 0.0;
};

// Carries the state dt days forward: level -= demand*dt; integrated random walk noise.
void predict(State& s, double dt, double qd, double ql, LevelRow& row) {
  if (dt <= 0.0) return;
  s.l -= s.d * dt;
  const double pll = s.pll - 2.0 * dt * s.pld + dt * dt * s.pdd;
  const double pld = s.pld - dt * s.pdd;
  s.pll = pll + qd * dt * dt * dt / 3.0 + ql * dt;
  s.pld = pld - qd * dt * dt / 2.0;
  s.pdd += qd * dt;
  row.b -= dt;  // level row of [[1,-dt],[0,1]] * [[a,b],[0,1]] is [a, b - dt]
}

void add(State& s, const Addition& a) {
  s.l += a.delta;
  s.pll += a.delta_sd * a.delta_sd;
}

void dilute(State& s, const Dilution& w, LevelRow& row) {
  const double keep = 1.0 - w.fraction_replaced;
  s.l = keep * s.l + w.fraction_replaced * w.new_water_value;
  s.pll = s.pll * keep * keep + w.fraction_replaced * w.fraction_replaced * w.new_water_sd * w.new_water_sd;
  s.pld *= keep;
  row.a *= keep;
  row.b *= keep;
}

void update(State& s, double z, double sigma) {
  const double r = sigma * sigma;
  const double S = s.pll + r;
  const double v = z - s.l;
  const double kl = s.pll / S, kd = s.pld / S;
  s.l += kl * v;
  s.d += kd * v;
  const double pdd = s.pdd - s.pld * s.pld / S;
  s.pll = s.pll * r / S;
  s.pld = s.pld * r / S;
  s.pdd = pdd > 0.0 ? pdd : 0.0;
}

double sd(double var) { return var > 0.0 ? std::sqrt(var) : 0.0; }

// Per-test record kept for the smoother.
struct Step {
  State pred, filt;
  LevelRow row;  // transition from the previous test's filtered state to pred
};

Status bad(std::size_t i, const char* field, const std::string& what) {
  return Error{fmt::format("events[{}].{}", i, field), fmt::format("events[{}].{} {}", i, field, what)};
}

Status check_event(std::size_t i, const SeriesEvent& e, double previous_time) {
  const double t = time_of(e);
  if (!std::isfinite(t) || t < -1e7 || t > 1e7)
    return bad(i, "time_days", "must be a finite day number within +/-1e7 days");
  if (t < previous_time)
    return bad(i, "time_days",
               fmt::format("{:g} is before the previous event at {:g}; events must be in time order",
                           t, previous_time));
  if (const auto* m = std::get_if<Measurement>(&e)) {
    if (!std::isfinite(m->value) || m->value < 0.0 || m->value > 1e5)
      return bad(i, "value", fmt::format("{:g} is outside the accepted range 0 to 1e5", m->value));
    if (!std::isfinite(m->sigma) || m->sigma <= 0.0 || m->sigma > 1e4)
      return bad(i, "sigma", fmt::format("{:g} must be above 0 and at most 1e4", m->sigma));
  } else if (const auto* a = std::get_if<Addition>(&e)) {
    if (!std::isfinite(a->delta) || std::fabs(a->delta) > 1e5)
      return bad(i, "delta", fmt::format("{:g} is outside the accepted range -1e5 to 1e5", a->delta));
    if (!std::isfinite(a->delta_sd) || a->delta_sd < 0.0 || a->delta_sd > 1e5)
      return bad(i, "delta_sd", fmt::format("{:g} is outside the accepted range 0 to 1e5", a->delta_sd));
  } else if (const auto* w = std::get_if<Dilution>(&e)) {
    if (!std::isfinite(w->fraction_replaced) || w->fraction_replaced < 0.0 ||
        w->fraction_replaced > 1.0)
      return bad(i, "fraction_replaced",
                 fmt::format("{:g} is outside the accepted range 0 to 1", w->fraction_replaced));
    if (!std::isfinite(w->new_water_value) || w->new_water_value < 0.0 || w->new_water_value > 1e5)
      return bad(i, "new_water_value",
                 fmt::format("{:g} is outside the accepted range 0 to 1e5", w->new_water_value));
    if (!std::isfinite(w->new_water_sd) || w->new_water_sd < 0.0 || w->new_water_sd > 1e5)
      return bad(i, "new_water_sd",
                 fmt::format("{:g} is outside the accepted range 0 to 1e5", w->new_water_sd));
  }
  return Ok{};
}

// Sum over the series' unknown-dosing spans of rate_sd x (days of the span within [t0, t1]):
// the sd, in the parameter's unit, of what unlogged dosing may have added over that time.
double unknown_growth(const Series& series, double t0, double t1) {
  double sum = 0.0;
  for (const UnknownDosing& u : series.unknown_dosing) {
    const double overlap = std::min(t1, u.to_days) - std::max(t0, u.from_days);
    if (overlap > 0.0) sum += u.rate_sd_per_day * overlap;
  }
  return sum;
}
double unknown_days(const Series& series, double t0, double t1) {
  double sum = 0.0;
  for (const UnknownDosing& u : series.unknown_dosing) {
    const double overlap = std::min(t1, u.to_days) - std::max(t0, u.from_days);
    if (overlap > 0.0) sum += overlap;
  }
  return sum;
}

Disagreement describe_disagreement(Parameter p, double t, double reading, double expected,
                                   double expected_sd, double silent_days, bool beyond) {
  Disagreement d;
  d.time_days = t;
  d.reading = reading;
  d.expected = expected;
  d.expected_sd = expected_sd;
  d.difference = reading - expected;
  d.z = expected_sd > 0.0 ? d.difference / expected_sd : 0.0;
  d.days_without_logged_dosing = silent_days;
  d.beyond_unlogged_allowance = beyond;
  const char* unit = parameter_unit(p);
  const bool high = d.difference > 0.0;
  std::string reasons = fmt::format(
      "The newest {} test reads {:.4g} {}, {:.3g} {} {} than the {:.4g} +/- {:.2g} the log alone "
      "predicts ({:.1f} sd). Likely reasons: ",
      parameter_name(p), reading, unit, std::fabs(d.difference), unit, high ? "higher" : "lower", expected,
      expected_sd, std::fabs(d.z));
  if (silent_days > 0.0) {
    reasons += fmt::format(
        "no dose is logged for the {:.1f} days before it and no schedule covers them, so pumps "
        "dosing on their own or doses not logged {}; ",
        silent_days, high ? "would explain a higher reading" : "cannot explain a lower reading, but stopped dosing would");
  }
  reasons += high ? "doses not in the log, a pump set higher or a stronger stock than logged; "
                  : "dosing stopped or changed (a pump reset, a reservoir run dry, a weaker stock than logged), "
                    "consumption grown, or precipitation on heaters and pumps; ";
  reasons += "or a kit error (old reagent, a misread colour change, a mislabelled unit).";
  d.reasons = std::move(reasons);
  d.question =
      "Which to trust? The estimate now follows the test (the newest test is never discarded). "
      "If pumps dose on their own, add their schedule so the log counts them; if the test may "
      "be wrong, retest with fresh reagent: a retest that agrees settles it.";
  return d;
}

std::string flag_reason(Parameter p, double z_reading, double expected, double expected_sd,
                        double z, double limit) {
  return fmt::format(
      "reads {:.4g} {} but {:.4g} +/- {:.2g} was expected from the earlier tests and logged "
      "inputs: {:.1f} sd {}, beyond the {:.1f} sd limit; kept in the log, left out of the "
      "estimate (a misreading, a kit error or an unlogged event?)",
      z_reading, parameter_unit(p), expected, expected_sd, std::fabs(z), z > 0 ? "high" : "low", limit);
}

}  // namespace

double time_of(const SeriesEvent& e) {
  return std::visit([](const auto& x) { return x.time_days; }, e);
}

const char* to_string(TestStatus s) {
  switch (s) {
    case TestStatus::First: return "first";
    case TestStatus::Used: return "used";
    case TestStatus::Flagged: return "flagged";
    case TestStatus::LevelRestart: return "level restart";
  }
  return "?";
}

Result<SeriesEstimate> estimate_series(const Series& series, const FilterOptions& options,
                                       std::optional<double> now_days) {
  if (auto st = check_options(options); !st) return st.error();
  const double qd = options.demand_noise_sd_per_sqrt_day * options.demand_noise_sd_per_sqrt_day;
  const double ql = options.level_noise_sd_per_sqrt_day * options.level_noise_sd_per_sqrt_day;

  SeriesEstimate out;
  out.parameter = series.parameter;
  std::vector<Step> steps;
  steps.reserve(series.events.size());
  out.history.reserve(series.events.size());

  State s;
  LevelRow row;
  bool started = false;
  double t = -std::numeric_limits<double>::infinity();
  double first_used_time = 0.0;
  int last_flag_side = 0;  // +1/-1 if the previous test was flagged high/low, else 0
  std::size_t newest = series.events.size();  // index of the newest test
  for (std::size_t i = series.events.size(); i-- > 0;) {
    if (std::holds_alternative<Measurement>(series.events[i])) {
      newest = i;
      break;
    }
  }
  for (std::size_t i = 0; i < series.unknown_dosing.size(); ++i) {
    const UnknownDosing& u = series.unknown_dosing[i];
    if (!std::isfinite(u.from_days) || !std::isfinite(u.to_days) || u.to_days < u.from_days ||
        !std::isfinite(u.rate_sd_per_day) || u.rate_sd_per_day < 0.0 || u.rate_sd_per_day > 1e5)
      return Error{fmt::format("unknown_dosing[{}]", i),
                   fmt::format("unknown_dosing[{}] needs from_days <= to_days and a rate sd of 0 to 1e5", i)};
  }
  // Unlogged dosing since the last test: its sd (summed over spans) enters the level variance
  // as (growth)^2, so one unknown rate over a long gap widens the band linearly in time.
  double unknown_sd = 0.0;
  double last_test_time = 0.0;
  auto carry = [&](double to) {
    if (!started || !(to > t)) return;
    predict(s, to - t, qd, ql, row);
    const double grown = unknown_sd + unknown_growth(series, t, to);
    s.pll += grown * grown - unknown_sd * unknown_sd;
    unknown_sd = grown;
  };

  for (std::size_t i = 0; i < series.events.size(); ++i) {
    const SeriesEvent& e = series.events[i];
    if (auto st = check_event(i, e, t); !st) return st.error();
    const double te = time_of(e);
    carry(te);
    t = te;

    if (const auto* m = std::get_if<Measurement>(&e)) {
      ++out.tests;
      HistoryPoint h;
      h.time_days = te;
      h.reading = m->value;
      Step st;
      if (!started) {
        s = State{m->value, options.prior_demand, m->sigma * m->sigma, 0.0,
                  options.prior_demand_sd * options.prior_demand_sd};
        started = true;
        first_used_time = te;
        h.status = TestStatus::First;
        st.pred = s;
        ++out.tests_used;
      } else {
        st.pred = s;
        const double var = s.pll + m->sigma * m->sigma;
        const double z = (m->value - s.l) / std::sqrt(var);
        const int side = z > 0 ? 1 : -1;
        const bool is_newest = i == newest;
        // The same test judged by the log alone (no allowance for unlogged dosing).
        const double var_log = std::max(var - unknown_sd * unknown_sd, m->sigma * m->sigma);
        const double z_log = (m->value - s.l) / std::sqrt(var_log);
        if (is_newest && std::fabs(z_log) > options.outlier_z) {
          out.disagreement = describe_disagreement(series.parameter, te, m->value, s.l, std::sqrt(var_log),
                                                   unknown_days(series, last_test_time, te),
                                                   std::fabs(z) > options.outlier_z);
        }
        if (std::fabs(z) > options.outlier_z) {
          if ((options.restart_on_two_outliers && last_flag_side == side) ||
              (is_newest && options.keep_newest_test)) {
            // Read as a real level change: widen the level to cover the jump, then update.
            const double jump = m->value - s.l;
            s.pll += jump * jump;
            st.pred = s;
            update(s, m->value, m->sigma);
            h.status = TestStatus::LevelRestart;
            last_flag_side = 0;
            ++out.tests_used;
          } else {
            out.outliers.push_back(OutlierFlag{
                te, m->value, s.l, std::sqrt(var), z,
                flag_reason(series.parameter, m->value, s.l, std::sqrt(var), z, options.outlier_z)});
            h.status = TestStatus::Flagged;
            last_flag_side = side;
          }
        } else {
          update(s, m->value, m->sigma);
          h.status = TestStatus::Used;
          last_flag_side = 0;
          ++out.tests_used;
          if (te > first_used_time) out.demand_known = true;
        }
        if (h.status == TestStatus::LevelRestart && te > first_used_time) out.demand_known = true;
      }
      st.filt = s;
      st.row = row;
      row = LevelRow{};
      steps.push_back(st);
      unknown_sd = 0.0;
      last_test_time = te;
      out.last_test_days = te;
      h.level = std::max(0.0, s.l);
      h.level_sd = sd(s.pll);
      h.demand_per_day = s.d;
      h.demand_sd = sd(s.pdd);
      h.smoothed_demand_per_day = h.demand_per_day;
      h.smoothed_demand_sd = h.demand_sd;
      out.history.push_back(h);
    } else if (!started) {
      continue;  // inputs before the first test: the level is not known yet
    } else if (const auto* a = std::get_if<Addition>(&e)) {
      add(s, *a);
    } else if (const auto* w = std::get_if<Dilution>(&e)) {
      dilute(s, *w, row);
    }
  }

  if (options.smooth && steps.size() >= 2) {
    // RTS backwards pass over the tests: x_s(k) = x_f(k) + C (x_s(k+1) - x_p(k+1)),
    // C = P_f(k) F^T P_p(k+1)^-1, with F the composite transition [[a,b],[0,1]].
    State sm = steps.back().filt;
    for (std::size_t k = steps.size() - 1; k-- > 0;) {
      const State& f = steps[k].filt;
      const State& p = steps[k + 1].pred;
      const LevelRow& r = steps[k + 1].row;
      // M = P_f F^T  (2x2): F^T = [[a,0],[b,1]]
      const double m11 = f.pll * r.a + f.pld * r.b, m12 = f.pld;
      const double m21 = f.pld * r.a + f.pdd * r.b, m22 = f.pdd;
      const double det = p.pll * p.pdd - p.pld * p.pld;
      if (!(det > 0.0)) {
        sm = f;
        continue;
      }
      const double i11 = p.pdd / det, i12 = -p.pld / det, i22 = p.pll / det;
      const double c11 = m11 * i11 + m12 * i12, c12 = m11 * i12 + m12 * i22;
      const double c21 = m21 * i11 + m22 * i12, c22 = m21 * i12 + m22 * i22;
      const double dl = sm.l - p.l, dd = sm.d - p.d;
      const double ell = sm.pll - p.pll, eld = sm.pld - p.pld, edd = sm.pdd - p.pdd;
      State n;
      n.l = f.l + c11 * dl + c12 * dd;
      n.d = f.d + c21 * dl + c22 * dd;
      // P_s = P_f + C E C^T
      const double ce11 = c11 * ell + c12 * eld, ce12 = c11 * eld + c12 * edd;
      const double ce21 = c21 * ell + c22 * eld, ce22 = c21 * eld + c22 * edd;
      n.pll = f.pll + ce11 * c11 + ce12 * c12;
      n.pld = f.pld + ce11 * c21 + ce12 * c22;
      n.pdd = f.pdd + ce21 * c21 + ce22 * c22;
      sm = n;
      out.history[k].smoothed_demand_per_day = sm.d;
      out.history[k].smoothed_demand_sd = sd(sm.pdd);
    }
  }

  if (started && now_days && *now_days > t) {
    carry(*now_days);
    t = *now_days;
  }
  out.time_days = started ? t : (now_days ? *now_days : 0.0);
  out.unknown_dosing_level_sd = started ? unknown_sd : 0.0;
  for (const UnknownDosing& u : series.unknown_dosing) {
    if (u.from_days <= out.time_days && u.to_days >= out.time_days) out.unknown_dosing_rate_sd = u.rate_sd_per_day;
  }
  // A concentration is never negative: the linear model can run below zero far from its
  // tests, the water cannot.
  out.level = std::max(0.0, s.l);
  out.level_sd = sd(s.pll);
  out.level_demand_cov = s.pld;
  out.demand_per_day = s.d;
  out.demand_sd = sd(s.pdd);
  out.demand_low95 = s.d - kZ95 * out.demand_sd;
  out.demand_high95 = s.d + kZ95 * out.demand_sd;
  return out;
}

}  // namespace tw::estimate

// ------------------------------------------------------------ names, defaults, option checks
namespace tw::estimate {

double useful_horizon_days(Parameter p) {
  switch (p) {
    case Parameter::Alkalinity: return 14.0;
    case Parameter::Calcium: return 30.0;
    case Parameter::Magnesium: return 60.0;
    default: break;  // not a dosed parameter: the estimate tracks only the three above
  }
  return 14.0;
}

bool is_stale(const SeriesEstimate& e, double now_days) {
  return e.last_test_days && now_days - *e.last_test_days > useful_horizon_days(e.parameter);
}

FilterOptions default_filter_options(Parameter p) {
  FilterOptions o;  // reasons for each figure: estimate.hpp, section 3 (common practice judgement)
  switch (p) {
    case Parameter::Alkalinity:
      o.demand_noise_sd_per_sqrt_day = 0.03;
      o.level_noise_sd_per_sqrt_day = 0.03;
      o.prior_demand_sd = 10.0;
      break;
    case Parameter::Calcium:
      o.demand_noise_sd_per_sqrt_day = 0.2;
      o.level_noise_sd_per_sqrt_day = 0.2;
      o.prior_demand_sd = 100.0;
      break;
    case Parameter::Magnesium:
      o.demand_noise_sd_per_sqrt_day = 0.1;
      o.level_noise_sd_per_sqrt_day = 0.5;
      o.prior_demand_sd = 100.0;
      break;
    default: break;  // not a dosed parameter: the estimate tracks only the three above
  }
  return o;
}

Status check_options(const FilterOptions& o) {
  if (auto s = check_range("demand_noise_sd_per_sqrt_day", o.demand_noise_sd_per_sqrt_day, 0.0,
                           1e3, "unit/day/sqrt(day)");
      !s)
    return s;
  if (auto s = check_range("level_noise_sd_per_sqrt_day", o.level_noise_sd_per_sqrt_day, 0.0,
                           1e3, "unit/sqrt(day)");
      !s)
    return s;
  if (auto s = check_range("prior_demand", o.prior_demand, -1e4, 1e4, "unit/day"); !s) return s;
  if (auto s = check_range("prior_demand_sd", o.prior_demand_sd, 1e-9, 1e6, "unit/day"); !s)
    return s;
  if (auto s = check_range("outlier_z", o.outlier_z, 1.0, 1e3, "sd"); !s) return s;
  return Ok{};
}

}  // namespace tw::estimate
