// Tests of the consumption estimator on its plain input (estimate.hpp sections 2-5).
#include <algorithm>
#include <cmath>
#include <cstdint>
#include <random>
#include <string>
#include <vector>

#include <doctest/doctest.h>

#include "tidewright/estimate/estimate.hpp"

using namespace tw::estimate;

namespace {

// Truth simulator that follows the filter's own model exactly (estimate.hpp header comment):
// the demand is a random walk with the filter's q_d, the level has the filter's q_l, tests
// carry Gaussian kit noise with the sigma given to the filter, inputs are known exactly.
// With the truth drawn from the model, a correct filter's 95 % band holds the truth in 95 %
// of runs (apart from the weak prior, which the data swamp long before the end).
struct Sim {
  std::mt19937_64 rng;
  std::normal_distribution<double> n01{0.0, 1.0};
  explicit Sim(std::uint64_t seed) : rng(seed) {}
  double u(double a, double b) { return std::uniform_real_distribution<double>(a, b)(rng); }
  double n() { return n01(rng); }
};

struct Truth {
  double level, demand;
};

// Exact discrete noise of the integrated random walk over dt (Cholesky of Q).
void advance(Truth& x, double dt, const FilterOptions& o, Sim& sim) {
  if (dt <= 0) return;
  const double qd = o.demand_noise_sd_per_sqrt_day * o.demand_noise_sd_per_sqrt_day;
  const double ql = o.level_noise_sd_per_sqrt_day * o.level_noise_sd_per_sqrt_day;
  const double q11 = qd * dt * dt * dt / 3.0 + ql * dt, q12 = -qd * dt * dt / 2.0, q22 = qd * dt;
  const double l11 = std::sqrt(q11), l21 = q12 / l11, l22 = std::sqrt(std::max(0.0, q22 - l21 * l21));
  const double a = sim.n(), b = sim.n();
  x.level += -x.demand * dt + l11 * a;
  x.demand += l21 * a + l22 * b;
}

struct Scenario {
  Parameter p;
  double level0, demand0, kit_sd, daily_dose, new_water;
};

// ~120 days: a dose every day at a random hour, a water change every 5-10 days (5-20 %),
// tests at irregular gaps of 0.5-4 days; the series ends with a test.
// The dose follows the keeper's idea of the demand plus a pull back to the starting level, so
// the level stays in range; the filter's error does not depend on the inputs (they are known
// and cancel in the error dynamics), so this does not bias the check.
Series simulate(const Scenario& sc, const FilterOptions& o, Sim& sim, double& true_demand_end,
                bool noise_free, double end = 120.0) {
  Series s;
  s.parameter = sc.p;
  Truth x{sc.level0, sc.demand0 * (noise_free ? 1.0 : sim.u(0.7, 1.3))};
  double t = 0.0, next_test = 0.0, next_dose = sim.u(0.1, 0.9), next_wc = sim.u(5, 10);
  while (true) {
    const double te = std::min({next_test, next_dose, next_wc});
    if (te > end) break;
    if (noise_free) {
      x.level -= x.demand * (te - t);
    } else {
      advance(x, te - t, o, sim);
    }
    t = te;
    if (te == next_test) {
      const double reading = x.level + (noise_free ? 0.0 : sc.kit_sd * sim.n());
      s.events.push_back(Measurement{t, reading, sc.kit_sd});
      next_test = t + sim.u(0.5, 4.0);
    } else if (te == next_dose) {
      const double dose =
          noise_free ? sc.daily_dose
                     : std::max(0.0, x.demand * sim.u(0.8, 1.2) + 0.3 * (sc.level0 - x.level));
      x.level += dose;
      s.events.push_back(Addition{t, dose, 0.0});
      next_dose = std::floor(t) + 1.0 + sim.u(0.1, 0.9);
    } else {
      const double f = sim.u(0.05, 0.2);
      x.level = (1 - f) * x.level + f * sc.new_water;
      s.events.push_back(Dilution{t, f, sc.new_water});
      next_wc = t + sim.u(5, 10);
    }
  }
  // End with a test so "now" is a test time.
  const double tl = t + 0.5;
  if (noise_free) x.level -= x.demand * 0.5; else advance(x, 0.5, o, sim);
  s.events.push_back(Measurement{tl, x.level + (noise_free ? 0.0 : sc.kit_sd * sim.n()), sc.kit_sd});
  true_demand_end = x.demand;
  return s;
}

const Scenario kScenarios[] = {
    {Parameter::Alkalinity, 8.0, 1.1, 0.2, 1.0, 8.0},      // alk sd 0.2 dKH
    {Parameter::Calcium, 420.0, 7.5, 10.0, 7.0, 430.0},    // Ca sd 10 mg/L
    {Parameter::Magnesium, 1300.0, 1.5, 25.0, 1.0, 1320.0}, // Mg sd 25 mg/L
};

}  // namespace

TEST_CASE("estimate: 95 % band covers the true demand in about 95 % of 1,000 seeded runs") {
  const int runs = 1000;
  for (const Scenario& sc : kScenarios) {
    const FilterOptions o = default_filter_options(sc.p);
    int covered = 0, flagged_runs = 0;
    double sum_sd = 0.0;
    for (int r = 0; r < runs; ++r) {
      Sim sim(0x5eed0000u + static_cast<std::uint64_t>(r) * 7919u + static_cast<std::uint64_t>(sc.p));
      double truth = 0.0;
      const Series s = simulate(sc, o, sim, truth, false);
      auto e = estimate_series(s, o);
      REQUIRE(e.ok());
      REQUIRE(e->demand_known);
      if (truth >= e->demand_low95 && truth <= e->demand_high95) ++covered;
      if (!e->outliers.empty()) ++flagged_runs;
      sum_sd += e->demand_sd;
    }
    const double coverage = static_cast<double>(covered) / runs;
    MESSAGE(std::string(tw::parameter_name(sc.p)) << ": coverage of the 95 % band " << coverage << " over " << runs
                            << " runs; mean demand sd " << sum_sd / runs << " " << std::string(tw::parameter_unit(sc.p))
                            << "/day; runs with a (false) outlier flag: " << flagged_runs);
    // Binomial sd at 1,000 runs is 0.007, so 0.92-0.98 is about +/-4 sd around 0.95.
    CHECK(coverage >= 0.92);
    CHECK(coverage <= 0.98);
  }
}

TEST_CASE("estimate: noise-free data give the true demand to 1e-6") {
  for (const Scenario& sc : kScenarios) {
    const FilterOptions o = default_filter_options(sc.p);
    Sim sim(42);
    double truth = 0.0;
    Series s = simulate(sc, o, sim, truth, true, 365.0);
    auto e = estimate_series(s, o);
    REQUIRE(e.ok());
    INFO(std::string(tw::parameter_name(sc.p)) << " demand " << e->demand_per_day << " true " << truth);
    CHECK(std::fabs(e->demand_per_day - truth) < 1e-6);
    CHECK(e->outliers.empty());
    // The smoothed history also sits on the truth (constant demand) after the first few tests.
    const auto& h = e->history;
    CHECK(std::fabs(h[h.size() / 2].smoothed_demand_per_day - truth) < 1e-6);
  }
}

TEST_CASE("estimate: water change and dose mass balance in the level (hand-worked)") {
  // 380 L at 7.0 dKH, 10 % replaced by 8.0 dKH water: 0.9 x 7.0 + 0.1 x 8.0 = 7.1 dKH.
  // The mix is per litre, so the 380 L drops out; the demand prior is 0 at the first test.
  Series s{Parameter::Alkalinity, {Measurement{0.0, 7.0, 0.2}, Dilution{0.0, 0.10, 8.0}}};
  auto e = estimate_series(s, default_filter_options(Parameter::Alkalinity));
  REQUIRE(e.ok());
  CHECK(e->level == doctest::Approx(7.1).epsilon(1e-12));
  // Level sd scales with what is kept: 0.9 x 0.2 = 0.18 dKH.
  CHECK(e->level_sd == doctest::Approx(0.18).epsilon(1e-12));
  // A dose of +1.7567 dKH (20 g NaHCO3 in 380 L, see test_estimate_series.cpp) adds to the level.
  s.events.push_back(Addition{0.0, 1.7567, 0.0});
  e = estimate_series(s, default_filter_options(Parameter::Alkalinity));
  REQUIRE(e.ok());
  CHECK(e->level == doctest::Approx(8.8567).epsilon(1e-12));
}

TEST_CASE("estimate: an injected misreading is flagged with its reason and left out") {
  const FilterOptions o = default_filter_options(Parameter::Alkalinity);
  Sim sim(7);
  Series s;
  s.parameter = Parameter::Alkalinity;
  double level = 8.0;
  for (int d = 0; d < 60; ++d) {
    const double reading = (d == 40) ? level + 2.5 : level + 0.2 * sim.n();  // day 40 misread
    s.events.push_back(Measurement{d + 0.5, reading, 0.2});
    s.events.push_back(Addition{d + 0.75, 1.0, 0.0});
    level += 1.0 - 1.1;  // dose 1.0, demand 1.1 dKH/day
  }
  auto e = estimate_series(s, o);
  REQUIRE(e.ok());
  REQUIRE(e->outliers.size() == 1);
  const OutlierFlag& f = e->outliers[0];
  CHECK(f.time_days == 40.5);
  CHECK(f.z > 3.5);
  CHECK(f.reason.find("high") != std::string::npos);
  CHECK(f.reason.find("left out of the estimate") != std::string::npos);
  MESSAGE("flag: z = " << f.z << ": " << f.reason);
  CHECK(e->history[40].status == TestStatus::Flagged);
  CHECK(e->tests == 60);
  CHECK(e->tests_used == 59);
  CHECK(e->demand_per_day == doctest::Approx(1.1).epsilon(0.1));
}

TEST_CASE("estimate: two same-side outliers in a row are read as an unlogged level change") {
  const FilterOptions o = default_filter_options(Parameter::Alkalinity);
  Series s;
  s.parameter = Parameter::Alkalinity;
  for (int d = 0; d < 40; ++d) {
    // dose 0.75, demand 1.0 dKH/day; an unlogged +3 dKH on day 25
    const double level = 15.0 - 0.25 * d + (d >= 25 ? 3.0 : 0.0);
    s.events.push_back(Measurement{static_cast<double>(d), level, 0.2});
    s.events.push_back(Addition{d + 0.5, 0.75, 0.0});
  }
  auto e = estimate_series(s, o);
  REQUIRE(e.ok());
  CHECK(e->outliers.size() == 1);
  CHECK(e->history[25].status == TestStatus::Flagged);
  CHECK(e->history[26].status == TestStatus::LevelRestart);
  CHECK(e->demand_per_day == doctest::Approx(1.0).epsilon(0.05));
}

TEST_CASE("estimate: few tests, missing parameters and bad input") {
  const FilterOptions o = default_filter_options(Parameter::Calcium);
  auto empty = estimate_series(Series{Parameter::Calcium, {}}, o);
  REQUIRE(empty.ok());
  CHECK_FALSE(empty->demand_known);
  auto one = estimate_series(Series{Parameter::Calcium, {Measurement{1, 420, 10}}}, o);
  REQUIRE(one.ok());
  CHECK_FALSE(one->demand_known);
  CHECK(one->level == 420);

  auto order = estimate_series(
      Series{Parameter::Calcium, {Measurement{2, 420, 10}, Measurement{1, 420, 10}}}, o);
  REQUIRE_FALSE(order.ok());
  CHECK(order.error().field == "events[1].time_days");
  auto sig = estimate_series(Series{Parameter::Calcium, {Measurement{1, 420, 0}}}, o);
  REQUIRE_FALSE(sig.ok());
  CHECK(sig.error().field == "events[0].sigma");
  auto frac = estimate_series(Series{Parameter::Calcium, {Dilution{1, 1.5, 420}}}, o);
  REQUIRE_FALSE(frac.ok());
  CHECK(frac.error().message.find("0 to 1") != std::string::npos);
  auto nan = estimate_series(Series{Parameter::Calcium, {Measurement{1, NAN, 10}}}, o);
  REQUIRE_FALSE(nan.ok());
  CHECK(nan.error().field == "events[0].value");
}

TEST_CASE("estimate: Ca:alkalinity ratio against 7.147 mg/L per dKH (Gazeau et al. 2015)") {
  // facts.md 5: 20.04 mg/L Ca per meq/L TA; 7.147 mg/L Ca per dKH [computed there from IUPAC].
  CHECK(calcium_mg_l_per_dkh_calcification_gazeau2015() == doctest::Approx(7.147).epsilon(1e-4));
  SeriesEstimate alk, ca;
  alk.parameter = Parameter::Alkalinity;
  ca.parameter = Parameter::Calcium;
  alk.demand_known = ca.demand_known = true;
  alk.demand_per_day = 1.0;
  alk.demand_sd = 0.05;
  ca.demand_per_day = 7.3;
  ca.demand_sd = 0.6;
  auto r = read_calcium_alkalinity(alk, ca);
  CHECK(r.verdict == RatioVerdict::Consistent);
  CHECK(r.ratio_valid);
  CHECK(r.ratio_mg_l_per_dkh == doctest::Approx(7.3));
  // excess sd = sqrt(0.6^2 + (7.147 x 0.05)^2) = sqrt(0.36 + 0.12770) = 0.69836
  CHECK(r.excess_sd == doctest::Approx(0.69836).epsilon(1e-4));
  ca.demand_per_day = 12.0;  // excess 4.85 > 1.96 x 0.698
  r = read_calcium_alkalinity(alk, ca);
  CHECK(r.verdict == RatioVerdict::CalciumFasterThanAlkalinity);
  CHECK(r.reading.find("Possible reasons") != std::string::npos);
  ca.demand_per_day = 3.0;
  r = read_calcium_alkalinity(alk, ca);
  CHECK(r.verdict == RatioVerdict::AlkalinityFasterThanCalcium);
  CHECK(r.reading.find("nitrification") != std::string::npos);
  ca.demand_known = false;
  CHECK(read_calcium_alkalinity(alk, ca).verdict == RatioVerdict::NotEnoughData);
}

TEST_CASE("estimate: the Ca:alkalinity reading is inconclusive when the data cannot tell, never 'fall together'") {
  SeriesEstimate alk, ca;
  alk.parameter = Parameter::Alkalinity;
  ca.parameter = Parameter::Calcium;
  alk.demand_known = ca.demand_known = true;
  auto inconclusive = [&](const char* why) {
    auto r = read_calcium_alkalinity(alk, ca);
    CHECK_MESSAGE(r.verdict == RatioVerdict::Inconclusive, why);
    CHECK(r.reading.rfind("Inconclusive", 0) == 0);
    CHECK(r.reading.find("fall together") == std::string::npos);
    return r;
  };
  // The case the keeper saw: a ratio of -0.54 +/- 7.31 mg/L per dKH (its interval covers zero).
  alk.demand_per_day = 1.0;
  alk.demand_sd = 0.05;
  ca.demand_per_day = -0.54;
  ca.demand_sd = 7.3;
  auto r = inconclusive("interval covers zero");
  CHECK(r.ratio_valid);
  CHECK(r.reading.find("reaches zero") != std::string::npos);
  // A positive ratio whose 95 % interval is wider than the ratio itself.
  ca.demand_per_day = 7.0;
  ca.demand_sd = 4.0;  // ratio 7.0 +/- 4.0: 1.96 x 4.0 = 7.84 > 7.0
  inconclusive("interval wider than the ratio");
  // No ratio: the alkalinity demand is not clearly above zero.
  alk.demand_per_day = 0.05;
  alk.demand_sd = 0.1;
  ca.demand_per_day = 7.0;
  ca.demand_sd = 0.5;
  r = inconclusive("no ratio");
  CHECK_FALSE(r.ratio_valid);
  CHECK(r.reading.find("no ratio") != std::string::npos);
}

TEST_CASE("estimate: forecast under steady dosing, with a band that widens") {
  SeriesEstimate e;
  e.parameter = Parameter::Alkalinity;
  e.time_days = 100;
  e.level = 8.0;
  e.level_sd = 0.1;
  e.demand_per_day = 1.1;
  e.demand_sd = 0.05;
  const FilterOptions o = default_filter_options(Parameter::Alkalinity);
  auto f = forecast_levels(e, 1.0, 7, o);
  REQUIRE(f.ok());
  REQUIRE(f->size() == 7);
  // Day 7: 8.0 + (1.0 - 1.1) x 7 = 7.3 dKH.
  CHECK((*f)[6].level == doctest::Approx(7.3));
  // Day 1 variance: 0.1^2 + 0.05^2 + 0.03^2/3 + 0.03^2 = 0.01 + 0.0025 + 0.0003 + 0.0009 = 0.0137
  CHECK((*f)[0].level_sd == doctest::Approx(std::sqrt(0.0137)).epsilon(1e-9));
  CHECK((*f)[6].level_sd > (*f)[0].level_sd);
  CHECK((*f)[6].time_days == 107);
  CHECK_FALSE(forecast_levels(e, 1.0, 0, o).ok());
  CHECK(forecast_levels(e, 1.0, 4000, o).error().field == "days");
}
