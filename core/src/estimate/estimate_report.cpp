// Reading an estimate (estimate.hpp 5): the calcium : alkalinity ratio of what the water lost,
// against calcification's 1 mmol Ca per 2 meq alkalinity, and a forecast under steady dosing.
#include <algorithm>
#include <cmath>

#include <fmt/format.h>

#include "tidewright/estimate/estimate.hpp"
#include "tidewright/common/units.hpp"

namespace tw::estimate {
namespace {
constexpr double kZ95 = 1.959963984540054;  // two-sided 95 % point of the normal distribution
}

// Calcium removed per unit of alkalinity removed when CaCO3 is deposited.
// Source: Gazeau et al. (2015), MEPS 527 -- CaCO3 deposition removes 1 mol Ca2+ per 2 eq TA
// (the alkalinity-anomaly technique). Result [mg/L Ca per dKH] = (M_Ca / 2) [mg per meq] x
// 0.35665 [meq/L per dKH] (1 dKH = 10 mg CaO/L; IUPAC atomic weights).
// Check value: 20.04 mg/L per meq/L x 0.35665 = 7.147 mg/L per dKH (facts.md 5).
// Valid for calcite and aragonite; Mg-calcite and nitrogen turnover need corrections (same source).
double calcium_mg_l_per_dkh_calcification_gazeau2015() {
  return tw::units::kMolarMassCa / 2.0 * tw::units::kMeqPerLPerDKH;
}

const char* to_string(RatioVerdict v) {
  switch (v) {
    case RatioVerdict::NotEnoughData: return "not enough data";
    case RatioVerdict::Inconclusive: return "inconclusive";
    case RatioVerdict::Consistent: return "consistent with calcification";
    case RatioVerdict::CalciumFasterThanAlkalinity: return "calcium falling faster";
    case RatioVerdict::AlkalinityFasterThanCalcium: return "alkalinity falling faster";
  }
  return "?";
}

CalciumAlkalinityReading read_calcium_alkalinity(const SeriesEstimate& alk,
                                                 const SeriesEstimate& ca) {
  CalciumAlkalinityReading r;
  const double k = calcium_mg_l_per_dkh_calcification_gazeau2015();
  r.expected_mg_l_per_dkh = k;
  if (!alk.demand_known || !ca.demand_known) {
    r.verdict = RatioVerdict::NotEnoughData;
    r.reading = "Not enough tests of both alkalinity and calcium to compare their consumption "
                "(each needs at least two usable tests on different days).";
    return r;
  }
  const double da = alk.demand_per_day, sa = alk.demand_sd;
  const double dc = ca.demand_per_day, sc = ca.demand_sd;
  // The two filters are fed by different kits, so their errors are taken as independent.
  r.excess_calcium_mg_l_per_day = dc - k * da;
  r.excess_sd = std::sqrt(sc * sc + k * k * sa * sa);
  if (da - kZ95 * sa > 0.0) {
    r.ratio_valid = true;
    r.ratio_mg_l_per_dkh = dc / da;
    r.ratio_sd = std::fabs(r.ratio_mg_l_per_dkh) * std::sqrt((sc / dc) * (sc / dc) + (sa / da) * (sa / da));
    if (!std::isfinite(r.ratio_sd)) r.ratio_sd = std::fabs(sc / da);  // dc == 0
  }
  const std::string ratio_text =
      r.ratio_valid
          ? fmt::format("measured {:.2f} +/- {:.2f} mg/L Ca per dKH", r.ratio_mg_l_per_dkh, r.ratio_sd)
          : std::string("no ratio, as the alkalinity demand is not clearly above zero");
  const std::string excess_text =
      fmt::format("the calcium demand is {:+.2f} +/- {:.2f} mg/L/day off the {:.3f} mg/L per dKH "
                  "of calcification (1 Ca : 2 alkalinity, Gazeau et al. 2015)",
                  r.excess_calcium_mg_l_per_day, r.excess_sd, k);
  // The ratio says nothing when there is none, or when its 95 % interval reaches zero or is
  // wider than the ratio itself (it would then span every reading, calcification's included).
  const bool no_ratio = !r.ratio_valid;
  const bool covers_zero = r.ratio_valid && r.ratio_mg_l_per_dkh - kZ95 * r.ratio_sd <= 0.0;
  const bool spans_ratio = r.ratio_valid && kZ95 * r.ratio_sd >= std::fabs(r.ratio_mg_l_per_dkh);
  if (no_ratio || covers_zero || spans_ratio) {
    r.verdict = RatioVerdict::Inconclusive;
    r.reading = fmt::format(
        "Inconclusive: {}{}; {}. More tests of both, a few days apart, will narrow it.", ratio_text,
        r.ratio_valid ? fmt::format(" (95 % interval {:.2f} to {:.2f}, which {})",
                                    r.ratio_mg_l_per_dkh - kZ95 * r.ratio_sd,
                                    r.ratio_mg_l_per_dkh + kZ95 * r.ratio_sd,
                                    covers_zero ? "reaches zero" : "is wider than the ratio itself")
                      : std::string(),
        excess_text);
  } else if (std::fabs(r.excess_calcium_mg_l_per_day) <= kZ95 * r.excess_sd) {
    r.verdict = RatioVerdict::Consistent;
    r.reading = fmt::format(
        "Calcium and alkalinity fall together as calcification predicts: {}; {}, within the "
        "95 % uncertainty.",
        ratio_text, excess_text);
  } else if (r.excess_calcium_mg_l_per_day > 0.0) {
    r.verdict = RatioVerdict::CalciumFasterThanAlkalinity;
    r.reading = fmt::format(
        "Calcium is falling faster than calcification's 1 Ca : 2 alkalinity explains: {}; {}, "
        "beyond the 95 % uncertainty. "
        "Possible reasons: a calcium kit reading low or drifting, or an alkalinity kit reading "
        "high; a calcium supplement weaker, or an alkalinity supplement stronger, than logged; "
        "alkalinity added by something the log does not know (denitrification, sulfate reduction "
        "in deep sand, alkaline food or salt). Calcium carbonate precipitating on heaters or "
        "pumps removes both in the same 1 : 2 ratio, so it does not explain this by itself. "
        "Retest both with fresh reagents before changing the dosing.",
        ratio_text, excess_text);
  } else {
    r.verdict = RatioVerdict::AlkalinityFasterThanCalcium;
    r.reading = fmt::format(
        "Alkalinity is falling faster than the calcium consumption explains: {}; {}, beyond "
        "the 95 % uncertainty. Possible reasons: nitrification (ammonia to nitrate) consumes "
        "alkalinity without calcium; acids from breakdown of food and waste; magnesium "
        "carbonate laid down by coralline algae (Mg-calcite; compare the magnesium demand); an "
        "alkalinity kit reading low or a calcium "
        "kit reading high; supplement strengths different from those logged. Retest both with "
        "fresh reagents before changing the dosing.",
        ratio_text, excess_text);
  }
  return r;
}

CalciumAlkalinityReading read_calcium_alkalinity(const SeriesEstimate& alk, const SeriesEstimate& ca,
                                                 double now_days) {
  for (const SeriesEstimate* e : {&alk, &ca}) {
    if (!is_stale(*e, now_days)) continue;
    CalciumAlkalinityReading r;
    r.expected_mg_l_per_dkh = calcium_mg_l_per_dkh_calcification_gazeau2015();
    r.verdict = RatioVerdict::NotEnoughData;
    r.reading = fmt::format("Not compared: the last {} test is {:.0f} days old; the comparison needs recent tests "
                            "of both alkalinity and calcium.",
                            e == &alk ? "alkalinity" : "calcium", now_days - *e->last_test_days);
    return r;
  }
  return read_calcium_alkalinity(alk, ca);
}

double z95() { return kZ95; }

LevelSpread spread_of(const SeriesEstimate& e, const FilterOptions& options) {
  LevelSpread s;
  s.level_sd = e.level_sd;
  s.level_demand_cov = e.level_demand_cov;
  s.demand_sd = e.demand_sd;
  s.demand_noise_q = options.demand_noise_sd_per_sqrt_day * options.demand_noise_sd_per_sqrt_day;
  s.level_noise_q = options.level_noise_sd_per_sqrt_day * options.level_noise_sd_per_sqrt_day;
  s.unknown_rate_sd = e.unknown_dosing_rate_sd;
  s.unknown_level_sd = e.unknown_dosing_level_sd;
  return s;
}

double LevelSpread::sd_after(double dt) const {
  dt = std::max(0.0, dt);
  // The filter's transition dt days ahead in one step (exact for the model): level and demand
  // with their covariance, the demand's random walk (q_d dt^3 / 3), the level's wander (q_l dt).
  // Unknown dosing goes on at its rate sd: the level's share of it grows linearly in time.
  const double u0 = unknown_level_sd, u1 = u0 + unknown_rate_sd * dt;
  const double var = level_sd * level_sd - 2.0 * dt * level_demand_cov + dt * dt * demand_sd * demand_sd +
                     demand_noise_q * dt * dt * dt / 3.0 + level_noise_q * dt + (u1 * u1 - u0 * u0);
  return var > 0.0 ? std::sqrt(var) : 0.0;
}

Result<std::vector<ForecastPoint>> forecast_levels(const SeriesEstimate& e,
                                                   double daily_dose_effect_per_day, int days,
                                                   const FilterOptions& options) {
  if (auto s = check_options(options); !s) return s.error();
  if (auto s = check_range("days", days, 1, 3650, "days"); !s) return s.error();
  if (auto s = check_range("daily_dose_effect", daily_dose_effect_per_day, -1e4, 1e4,
                           std::string(parameter_unit(e.parameter)) + "/day");
      !s)
    return s.error();
  const LevelSpread spread = spread_of(e, options);
  std::vector<ForecastPoint> out;
  out.reserve(static_cast<std::size_t>(days));
  for (int k = 1; k <= days; ++k) {
    const double dt = k;
    // The same transition as the filter, dt days ahead in one step (exact for the model).
    const double level = e.level + (daily_dose_effect_per_day - e.demand_per_day) * dt;
    ForecastPoint p;
    p.day = k;
    p.time_days = e.time_days + dt;
    p.level_sd = spread.sd_after(dt);
    // Truncated at the physical bound: no water holds a negative concentration.
    p.level = std::max(0.0, level);
    p.low95 = std::max(0.0, level - kZ95 * p.level_sd);
    p.high95 = std::max(0.0, level + kZ95 * p.level_sd);
    out.push_back(p);
  }
  return out;
}

}  // namespace tw::estimate
