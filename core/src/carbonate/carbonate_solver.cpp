// Root finding for [H+] (total scale) in the pairs that need iteration.
//
// Map of this file
//   1. Driver: safeguarded Newton with a bracket and bisection fallback (any residual)
//   2. Alkalinity + DIC: initial guess (Munhoven 2013), residual
//   3. Alkalinity + CO2* (from pCO2 or fCO2): guess, residual
//   4. Alkalinity + carbonate ion: the minimum of the residual, guess, residual
//
// The residuals are alkalinity(h) - alkalinity_input with the Dickson (1981) definition
// (carbonate_internal.hpp). Each is monotone on the bracket used, so a sign change there
// means exactly one root, and no sign change means no state in pH kPhMin..kPhMax exists.
#include <algorithm>
#include <cmath>

#include "carbonate_internal.hpp"

namespace tw::carbonate::detail {

namespace {

constexpr double kLn10 = 2.302585092994046;

// ---------------------------------------------------------------- 1. Driver
// Finds the root of g, a function DECREASING in h on [lo, hi] (g(lo) >= 0 >= g(hi)).
// lo_known/hi_known say whether the sign at that end was already checked; an unchecked end
// is evaluated only when an iterate tries to step past it. Newton steps are taken in h while
// small (|dln h| < 0.5, no exp needed) and in ln h otherwise, capped at max_step_ph; an iterate
// leaving the bracket is replaced by the bracket's geometric midpoint (bisection in pH).
template <class Residual>
Root newton_bracketed(const Residual& g, double h0, double lo, double hi, bool lo_known,
                      bool hi_known, const SolverOptions& o) {
  Root r;
  const double max_step = o.max_step_ph * kLn10;
  double h = (h0 > lo && h0 < hi) ? h0 : std::sqrt(lo * hi);
  while (r.iterations < o.max_iterations) {
    ++r.iterations;
    const ValueSlope f = g(h);
    if (f.value == 0.0) {
      r.h = h;
      return r;
    }
    if (f.value > 0.0) {
      lo = h;
      lo_known = true;
    } else {
      hi = h;
      hi_known = true;
    }
    double step = -f.value / (h * f.d_dh);  // Newton step in ln h
    double h_new = 0.0;
    double dph = 0.0;
    bool ok = std::isfinite(step);
    if (ok) {
      step = std::clamp(step, -max_step, max_step);
      h_new = std::fabs(step) < 0.5 ? h * (1.0 + step) : h * std::exp(step);
      dph = std::fabs(step) * (1.0 / kLn10);
      ok = h_new > lo && h_new < hi;
    }
    if (!ok) {
      // Leaving the bracket: first make sure a root lies beyond the unchecked end.
      if (!lo_known && !(h_new > lo)) {
        ++r.iterations;
        const double e = g(lo).value;
        if (e < 0.0) {
          r.status = RootStatus::NoRootAboveRange;
          return r;
        }
        lo_known = true;
      }
      if (!hi_known && !(h_new < hi)) {
        ++r.iterations;
        const double e = g(hi).value;
        if (e > 0.0) {
          r.status = RootStatus::NoRootBelowRange;
          return r;
        }
        hi_known = true;
      }
      h_new = std::sqrt(lo * hi);
      dph = std::fabs(std::log10(h_new / h));
    }
    h = h_new;
    if (dph < o.ph_tolerance) {
      r.h = h;
      return r;
    }
  }
  r.status = RootStatus::NotConverged;
  r.h = h;
  return r;
}

// ---------------------------------------------------------------- 2. Alkalinity + DIC
// Initial guess of Munhoven (2013, Geosci. Model Dev. 6:1367, SolveSAPHE "ahini_for_at"):
// alkalinity from carbonate and borate only is a cubic in h,
//   h^3 + a2 h^2 + a1 h + a0 = 0, a2 = KB(1-b) + K1(1-c),
//   a1 = K1 KB (1-b-c) + K1 K2 (1-2c), a0 = K1 K2 KB (1-b-2c), c = DIC/TA, b = BT/TA,
// whose positive root is approximated from a second-order expansion about the cubic's
// local minimum. Coefficients derived here from the alkalinity definition.
double guess_h_alkalinity_dic(const Constants& k, double alk, double dic) {
  const double bt = k.totals.boron;
  if (alk <= 0.0) return 1e-3;
  if (alk >= 2.0 * dic + bt) return 1e-10;
  const double c = dic / alk, b = bt / alk;
  const double a2 = k.kb * (1.0 - b) + k.k1 * (1.0 - c);
  const double a1 = k.k1 * k.kb * (1.0 - b - c) + k.k1 * k.k2 * (1.0 - 2.0 * c);
  const double a0 = k.k1 * k.k2 * k.kb * (1.0 - b - 2.0 * c);
  const double d = a2 * a2 - 3.0 * a1;
  if (d <= 0.0) return 1e-7;
  const double sd = std::sqrt(d);
  const double hmin = a2 < 0.0 ? (-a2 + sd) / 3.0 : -a1 / (a2 + sd);
  const double p = a0 + hmin * (a1 + hmin * (a2 + hmin));
  const double h = hmin + std::sqrt(std::max(0.0, -p / sd));
  return h > 0.0 ? h : 1e-7;
}

}  // namespace

Root solve_h_alkalinity_dic(const Constants& k, double alk, double dic, const SolverOptions& o) {
  const auto residual = [&](double h) {
    const ValueSlope c = carbonate_alkalinity_per_dic(k, h);
    const ValueSlope n = noncarbonate_alkalinity(k, h);
    return ValueSlope{dic * c.value + n.value - alk, dic * c.d_dh + n.d_dh};
  };
  return newton_bracketed(residual, guess_h_alkalinity_dic(k, alk, dic), kHAtPhMax, kHAtPhMin,
                          false, false, o);
}

// ---------------------------------------------------------------- 3. Alkalinity + CO2*
// Residual: CO2* (K1/h + 2 K1 K2/h^2) + noncarbonate(h) - TA, decreasing in h.
// Guess: the quadratic TA' h^2 - CO2* K1 h - 2 CO2* K1 K2 = 0 with TA' = TA - noncarbonate,
// the noncarbonate part taken at the carbonate-only root (derived here).
Root solve_h_alkalinity_co2(const Constants& k, double alk, double co2, const SolverOptions& o) {
  const double k1k2 = k.k1 * k.k2;
  const auto quadratic_root = [&](double ta) {
    if (ta <= 0.0) return 1e-4;
    const double b = co2 * k.k1;
    return (b + std::sqrt(b * b + 8.0 * ta * co2 * k1k2)) / (2.0 * ta);
  };
  double h0 = quadratic_root(alk);
  h0 = quadratic_root(alk - noncarbonate_alkalinity(k, h0).value);
  const auto residual = [&](double h) {
    const double inv_h = 1.0 / h;
    const ValueSlope n = noncarbonate_alkalinity(k, h);
    const double carb = co2 * (k.k1 + 2.0 * k1k2 * inv_h) * inv_h;
    const double d_carb = -co2 * (k.k1 + 4.0 * k1k2 * inv_h) * inv_h * inv_h;
    return ValueSlope{carb + n.value - alk, d_carb + n.d_dh};
  };
  return newton_bracketed(residual, h0, kHAtPhMax, kHAtPhMin, false, false, o);
}

// ---------------------------------------------------------------- 4. Alkalinity + CO3--
// With CO3 fixed, TA(h) = CO3 (h/K2 + 2) + noncarbonate(h) is convex in h: it falls with h
// where hydroxide dominates (high pH) and rises where bicarbonate does. Its minimum (slope
// zero, found by bisection on the slope, which rises with h) splits the range into two
// monotone branches; the carbonate branch (larger h) is the one of natural waters.
Root solve_h_alkalinity_co3(const Constants& k, double alk, double co3, const SolverOptions& o,
                            double* other_h) {
  const auto ta = [&](double h) {
    const ValueSlope n = noncarbonate_alkalinity(k, h);
    return ValueSlope{co3 * (h / k.k2 + 2.0) + n.value - alk, co3 / k.k2 + n.d_dh};
  };
  double h_min = kHAtPhMax;
  if (ta(kHAtPhMax).d_dh < 0.0) {
    double a = std::log(kHAtPhMax), b = std::log(kHAtPhMin);
    for (int i = 0; i < 60; ++i) {
      const double m = 0.5 * (a + b);
      (ta(std::exp(m)).d_dh < 0.0 ? a : b) = m;
    }
    h_min = std::exp(0.5 * (a + b));
  }
  *other_h = 0.0;
  const double f_min = ta(h_min).value;
  if (f_min > 0.0) {  // even the least alkalinity this carbonate ion allows is too much
    Root r;
    r.iterations = 62;
    r.status = RootStatus::NoRootAboveRange;
    return r;
  }
  const auto carbonate_branch = [&](double h) {
    const ValueSlope v = ta(h);
    return ValueSlope{-v.value, -v.d_dh};  // decreasing form for the driver
  };
  const double guess =
      k.k2 * (alk - noncarbonate_alkalinity(k, 1e-8).value - 2.0 * co3) / co3;
  Root r = newton_bracketed(carbonate_branch, guess, h_min, kHAtPhMin, true, false, o);
  if (r.status == RootStatus::Ok && h_min > kHAtPhMax && ta(kHAtPhMax).value > 0.0) {
    const Root other = newton_bracketed(ta, std::sqrt(kHAtPhMax * h_min), kHAtPhMax, h_min, true,
                                        true, o);
    if (other.status == RootStatus::Ok) *other_h = other.h;
  }
  r.iterations += 62;
  return r;
}

}  // namespace tw::carbonate::detail
