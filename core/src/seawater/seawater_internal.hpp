// Private to the seawater files: a range check that names the formula's validity, and a
// bracketed root finder for the inverses (PSS-78 inverse,
// specific gravity and density to salinity). Illinois-modified regula falsi, which keeps the
// root bracketed at every step and converges superlinearly on the smooth, monotonic curves
// used here (a handful of iterations to 1e-12).
#pragma once

#include <cmath>
#include <string>

#include "tidewright/common/result.hpp"

namespace tw::seawater::detail {

// check_range with the name of the range appended, e.g.
// "salinity 50 is outside the accepted range 0 to 42 (EOS-80 (UNESCO 1983) validity)".
inline Status check_range_of(const std::string& field, double value, double lo, double hi,
                             const std::string& unit, const char* range_name) {
  Status s = check_range(field, value, lo, hi, unit);
  if (s) return s;
  Error e = s.error();
  e.message += std::string(" (") + range_name + " validity)";
  return e;
}

struct RootOptions {
  double x_tolerance = 1e-12;  // stop when the bracket is narrower than this
  int max_iterations = 200;    // bisection alone would need about 45 for these brackets
};

struct RootResult {
  double x = 0.0;
  int iterations = 0;
  bool converged = false;
};

// Finds x in [lo, hi] with f(x) == target, for f continuous with f(lo) - target and
// f(hi) - target of opposite sign (the caller checks that and reports the range).
template <class F>
RootResult solve_bracketed(F&& f, double target, double lo, double hi, RootOptions opt = {}) {
  double a = lo, b = hi;
  double fa = f(a) - target, fb = f(b) - target;
  RootResult r;
  if (fa == 0.0) return {a, 0, true};
  if (fb == 0.0) return {b, 0, true};
  if ((fa > 0.0) == (fb > 0.0)) return {a, 0, false};
  int side = 0;  // which end stayed put last time (Illinois halving)
  for (r.iterations = 1; r.iterations <= opt.max_iterations; ++r.iterations) {
    double x = (a * fb - b * fa) / (fb - fa);
    if (!(x > a && x < b)) x = 0.5 * (a + b);  // guard against round-off at the ends
    const double fx = f(x) - target;
    if (fx == 0.0) return {x, r.iterations, true};
    if ((fx > 0.0) == (fb > 0.0)) {
      b = x;
      fb = fx;
      if (side == -1) fa *= 0.5;
      side = -1;
    } else {
      a = x;
      fa = fx;
      if (side == 1) fb *= 0.5;
      side = 1;
    }
    if (b - a < opt.x_tolerance || std::fabs(fx) < 1e-15 * (std::fabs(target) + 1.0)) {
      r.x = std::fabs(fa) < std::fabs(fb) ? a : b;
      r.converged = true;
      return r;
    }
  }
  r.x = std::fabs(fa) < std::fabs(fb) ? a : b;
  return r;
}

}  // namespace tw::seawater::detail
