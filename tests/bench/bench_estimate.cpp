// Benchmark (prints figures, not a test): the consumption estimate for 20 systems with 10 years
// of daily tests each, for alkalinity, calcium and magnesium (with a daily dose and a weekly
// water change in each series), filter + RTS smoother. Target: under 50 ms in total natively.
#include <chrono>
#include <cstdio>
#include <random>
#include <vector>

#include "tidewright/estimate/estimate.hpp"

using namespace tw::estimate;

int main() {
  const int systems = 20, days = 3650;
  const Parameter params[3] = {Parameter::Alkalinity, Parameter::Calcium, Parameter::Magnesium};
  const double level0[3] = {8.0, 420.0, 1300.0}, demand[3] = {1.1, 7.5, 1.5},
               kit[3] = {0.2, 10.0, 25.0};
  std::mt19937_64 rng(2026);
  std::normal_distribution<double> n01(0.0, 1.0);
  std::vector<Series> all;
  std::size_t tests = 0;
  for (int s = 0; s < systems; ++s) {
    for (int p = 0; p < 3; ++p) {
      Series series{params[p], {}};
      series.events.reserve(static_cast<std::size_t>(days) * 2 + days / 7 + 1);
      const double level = level0[p];  // the daily dose equals the demand: the level holds
      for (int d = 0; d < days; ++d) {
        series.events.push_back(Measurement{d + 0.4, level + kit[p] * n01(rng), kit[p]});
        series.events.push_back(Addition{d + 0.6, demand[p], 0.0});
        if (d % 7 == 6) series.events.push_back(Dilution{d + 0.8, 0.1, level0[p]});
        ++tests;
      }
      all.push_back(std::move(series));
    }
  }
  double best_ms = 1e30, checksum = 0.0;
  for (int rep = 0; rep < 5; ++rep) {
    const auto t0 = std::chrono::steady_clock::now();
    for (const Series& series : all) {
      auto e = estimate_series(series, default_filter_options(series.parameter));
      if (!e.ok()) {
        std::printf("estimate failed: %s\n", e.error().message.c_str());
        return 1;
      }
      checksum += e->demand_per_day + e->history[e->history.size() / 2].smoothed_demand_per_day;
    }
    const auto t1 = std::chrono::steady_clock::now();
    const double ms = std::chrono::duration<double, std::milli>(t1 - t0).count();
    if (ms < best_ms) best_ms = ms;
  }
  std::printf("bench_estimate: %d systems x 3 parameters x %d days = %zu tests (%zu series)\n",
              systems, days, tests, all.size());
  std::printf("bench_estimate: best of 5: %.2f ms total, %.1f ns per test (target < 50 ms)\n",
              best_ms, best_ms * 1e6 / static_cast<double>(tests));
  std::printf("bench_estimate: checksum %.6f\n", checksum);
  return 0;
}
