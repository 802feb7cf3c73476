// Solver speed: solves per second for the alkalinity+DIC and alkalinity+pH pairs, with the
// constants computed once (cached) and computed for every solve. Prints figures only; not
// part of the pass/fail suite. Portable, so it runs under Emscripten (Node.js) too. Each
// figure is given per second of wall time and per second of this process's CPU time
// (process_cpu_clock.hpp): on a shared, loaded machine only the second one measures the code
// rather than the neighbours, and scripts/bench.sh takes the WebAssembly/native ratio of both.
//
//   bench_solver [seconds_per_case]   (default 0.5)
#include <chrono>
#include <cstdio>
#include <cstdlib>
#include <vector>

#include "bench/process_cpu_clock.hpp"
#include "tidewright/carbonate/carbonate.hpp"

namespace tc = tw::carbonate;

namespace {

struct Input {
  double salinity, temperature_c, alkalinity, second;
};

// A fixed spread of realistic inputs (reef tanks to hatchery intake), so no branch or cache
// effect flatters one point. Deterministic (a tiny LCG), no <random> needed.
std::vector<Input> make_inputs(bool second_is_ph) {
  std::vector<Input> v;
  unsigned state = 12345u;
  const auto next = [&state] {
    state = state * 1664525u + 1013904223u;
    return static_cast<double>(state >> 8) / 16777216.0;
  };
  for (int i = 0; i < 4096; ++i) {
    const double alk = 1800.0 + 2200.0 * next();
    const double second = second_is_ph ? 7.6 + 0.8 * next() : alk * (0.80 + 0.12 * next());
    v.push_back({30.0 + 6.0 * next(), 18.0 + 10.0 * next(), alk, second});
  }
  return v;
}

struct Rate {
  double wall, cpu;  // solves per second of wall time and of CPU time
};

template <class Body>
Rate rate_per_second(double seconds, const Body& body) {
  using clock = std::chrono::steady_clock;
  const auto start = clock::now();
  const double cpu_start = process_cpu_seconds();
  long n = 0;
  double elapsed = 0.0;
  do {
    for (int i = 0; i < 4096; ++i) body(i);
    n += 4096;
    elapsed = std::chrono::duration<double>(clock::now() - start).count();
  } while (elapsed < seconds);
  const double cpu = cpu_start < 0 ? 0.0 : process_cpu_seconds() - cpu_start;
  return {static_cast<double>(n) / elapsed, static_cast<double>(n) / (cpu > 0 ? cpu : elapsed)};
}

void print(const char* name, Rate r) {
  std::printf("%s: %.2f M solves/s (%.0f ns per solve; per CPU second: %.2f M solves/s, %.0f ns)\n",
              name, r.wall / 1e6, 1e9 / r.wall, r.cpu / 1e6, 1e9 / r.cpu);
}

}  // namespace

int main(int argc, char** argv) {
  const double seconds = argc > 1 ? std::atof(argv[1]) : 0.5;
  const std::vector<Input> dic_inputs = make_inputs(false), ph_inputs = make_inputs(true);
  tc::Conditions conditions;
  conditions.salinity = 35.0;
  conditions.temperature_c = 25.0;
  const tc::Constants cached = *tc::compute_constants(conditions);
  double checksum = 0.0;
  long failures = 0;
  const auto use = [&](const tw::Result<tc::CarbonateState>& r) {
    if (r.ok()) checksum += r->ph_total + r->omega_aragonite;
    else ++failures;
  };

  const Rate dic_cached = rate_per_second(seconds, [&](int i) {
    const Input& in = dic_inputs[static_cast<size_t>(i)];
    use(tc::solve_alkalinity_dic(cached, in.alkalinity, in.second));
  });
  const Rate ph_cached = rate_per_second(seconds, [&](int i) {
    const Input& in = ph_inputs[static_cast<size_t>(i)];
    use(tc::solve(cached, {{tc::Quantity::Alkalinity, in.alkalinity}, {tc::Quantity::PH, in.second}}));
  });
  const Rate dic_fresh = rate_per_second(seconds, [&](int i) {
    const Input& in = dic_inputs[static_cast<size_t>(i)];
    tc::Conditions c;
    c.salinity = in.salinity;
    c.temperature_c = in.temperature_c;
    const auto k = tc::compute_constants(c);
    if (k.ok()) use(tc::solve_alkalinity_dic(*k, in.alkalinity, in.second));
  });
  const Rate ph_fresh = rate_per_second(seconds, [&](int i) {
    const Input& in = ph_inputs[static_cast<size_t>(i)];
    tc::Conditions c;
    c.salinity = in.salinity;
    c.temperature_c = in.temperature_c;
    const auto k = tc::compute_constants(c);
    if (k.ok())
      use(tc::solve(*k, {{tc::Quantity::Alkalinity, in.alkalinity}, {tc::Quantity::PH, in.second}}));
  });

  print("alk-dic cached", dic_cached);
  print("alk-ph cached", ph_cached);
  print("alk-dic with constants every time", dic_fresh);
  print("alk-ph with constants every time", ph_fresh);
  std::printf("(checksum %.6g, failures %ld)\n", checksum, failures);
  return failures == 0 ? 0 : 1;
}
