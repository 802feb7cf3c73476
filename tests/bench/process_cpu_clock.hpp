// Seconds of CPU time this process has used, for benchmarks on a shared machine, where wall
// time also measures the neighbours.
//
// Natively this is std::clock (process CPU time on Linux). Under Emscripten std::clock and
// clock_gettime(CLOCK_PROCESS_CPUTIME_ID) both return wall time, so in Node.js we read
// process.cpuUsage() instead (user + system microseconds of the whole Node process). That
// counts V8's helper threads (compiler, GC) too, so it can only make WebAssembly look slower,
// never faster. Outside Node (a browser) there is no process CPU clock: returns a negative
// value and the caller falls back to wall time.
#pragma once

#include <ctime>

#ifdef __EMSCRIPTEN__
#include <emscripten.h>

// clang-format off
EM_JS(double, tw_bench_node_cpu_seconds, (), {
  if (typeof process !== 'undefined' && process.cpuUsage) {
    const used = process.cpuUsage();
    return (used.user + used.system) / 1e6;
  }
  return -1.0;
});
// clang-format on

inline double process_cpu_seconds() { return tw_bench_node_cpu_seconds(); }
#else
inline double process_cpu_seconds() {
  return static_cast<double>(std::clock()) / CLOCKS_PER_SEC;
}
#endif
