// PSS-78: the Practical Salinity Scale 1978 (Lewis 1980; Perkin & Lewis 1980), in the form and
// with the coefficient names of UNESCO (1983), Fofonoff & Millard, Unesco Tech. Pap. Mar. Sci.
// 44, pp. 6-12: practical salinity from the conductivity ratio R = C(S,t,p)/C(35,15,0) with its
// temperature (r_t) and pressure (R_p) terms, and the inverse by a bracketed solve.
//
// Map: 1. published formulas (t68)  2. inverse  3. everyday API (ITS-90 in, range checks)
#include <cmath>
#include <string>

#include <fmt/format.h>

#include "seawater_internal.hpp"
#include "tidewright/seawater/seawater.hpp"

namespace tw::seawater {
namespace pss78 {

// ---------------------------------------------------------------- 1. published formulas
// r_t: conductivity ratio of standard seawater (S = 35) at temperature t to that at 15 C,
// UNESCO 1983 p. 7, coefficients c0..c4.
//   t68 [deg C, IPTS-68]  ->  r_t [1].  Valid -2..35 C.
//   Check: r_t(15) = 1.0000 (to 1e-4: the fit passes through 1 at 15 C by construction).
double rt_conductivity_ratio_temperature(double t68) {
  constexpr double c0 = 0.6766097, c1 = 2.00564e-2, c2 = 1.104259e-4, c3 = -6.9698e-7,
                   c4 = 1.0031e-9;
  const double t = t68;
  return c0 + t * (c1 + t * (c2 + t * (c3 + t * c4)));
}

// R_p: ratio of in situ conductivity to that at the same S and t at zero pressure,
// UNESCO 1983 p. 7: R_p = 1 + p (e1 + e2 p + e3 p^2) / (1 + d1 t + d2 t^2 + (d3 + d4 t) R).
//   ratio R [1], t68 [deg C, IPTS-68], pressure_dbar [dbar]  ->  R_p [1].
//   Valid 0..10000 dbar, -2..35 C.  Check: R_p(R, t, 0) = 1 exactly.
double rp_conductivity_ratio_pressure(double ratio, double t68, double pressure_dbar) {
  constexpr double e1 = 2.070e-5, e2 = -6.370e-10, e3 = 3.989e-15;
  constexpr double d1 = 3.426e-2, d2 = 4.464e-4, d3 = 4.215e-1, d4 = -3.107e-3;
  const double p = pressure_dbar;
  const double t = t68;
  return 1.0 + p * (e1 + p * (e2 + p * e3)) / (1.0 + t * (d1 + t * d2) + (d3 + d4 * t) * ratio);
}

// Practical salinity from R_t = C(S,t,0)/C(35,t,0), UNESCO 1983 p. 7:
//   S = sum_{i=0..5} a_i R_t^(i/2) + (t-15)/(1 + k (t-15)) * sum_{i=0..5} b_i R_t^(i/2).
//   rt_ratio R_t [1, > 0], t68 [deg C, IPTS-68]  ->  practical salinity.
//   Valid 2 <= S <= 42, -2..35 C.  Check: S(R_t = 1, t = 15) = 35.000000 (sum a_i = 35,
//   UNESCO 1983 p. 9).
double salinity_from_rt(double rt_ratio, double t68) {
  constexpr double a0 = 0.0080, a1 = -0.1692, a2 = 25.3851, a3 = 14.0941, a4 = -7.0261,
                   a5 = 2.7081;
  constexpr double b0 = 0.0005, b1 = -0.0056, b2 = -0.0066, b3 = -0.0375, b4 = 0.0636,
                   b5 = -0.0144;
  constexpr double k = 0.0162;
  const double x = std::sqrt(rt_ratio > 0.0 ? rt_ratio : 0.0);  // R_t^(1/2)
  const double dt = t68 - 15.0;
  const double sum_a = a0 + x * (a1 + x * (a2 + x * (a3 + x * (a4 + x * a5))));
  const double sum_b = b0 + x * (b1 + x * (b2 + x * (b3 + x * (b4 + x * b5))));
  return sum_a + dt / (1.0 + k * dt) * sum_b;
}

// Practical salinity from the in situ conductivity ratio R, UNESCO 1983 p. 7:
// R_t = R / (R_p r_t), then salinity_from_rt.
//   ratio R [1, > 0], t68 [deg C, IPTS-68], pressure_dbar [dbar]  ->  practical salinity.
//   Check (UNESCO 1983 p. 9): (1, 15, 0) -> 35.000000; (1.2, 20, 2000) -> 37.245628;
//   (0.65, 5, 1500) -> 27.995347; (1.888091, 40, 10000) -> 40.0000 (p. 11).
double salinity_from_ratio(double ratio, double t68, double pressure_dbar) {
  const double rt = rt_conductivity_ratio_temperature(t68);
  const double rp = rp_conductivity_ratio_pressure(ratio, t68, pressure_dbar);
  return salinity_from_rt(ratio / (rp * rt), t68);
}

}  // namespace pss78

// ---------------------------------------------------------------- 2. inverse
namespace {

// Bracket for R: S(0.005, t, p) is below 0.2 and S(4, t, p) far above 42 over -2..40 C and
// 0..10000 dbar, and S(R) increases monotonically in between (computed here).
constexpr double kRatioLo = 0.005;
constexpr double kRatioHi = 4.0;

// Unchecked inverse: R with S(R, t68, p) = salinity, for 2 <= salinity <= 42.
detail::RootResult ratio_for_salinity(double salinity, double t68, double pressure_dbar) {
  return detail::solve_bracketed(
      [&](double r) { return pss78::salinity_from_ratio(r, t68, pressure_dbar); }, salinity,
      kRatioLo, kRatioHi);
}

Status check_pss78_conditions(double temperature_c, double pressure_dbar) {
  const ValidityRange& v = kPss78Validity;
  if (auto s = detail::check_range_of("temperature_c", temperature_c, v.temperature_min_c,
                                      v.temperature_max_c, "C", v.source);
      !s)
    return s;
  return detail::check_range_of("pressure_dbar", pressure_dbar, v.pressure_min_dbar,
                                v.pressure_max_dbar, "dbar", v.source);
}

// Salinity from a conductivity expressed as `value` = R * scale (scale 1 for the ratio,
// 42.914 for mS/cm), with the error naming `field` and the accepted range in its own unit.
Result<double> salinity_from_scaled(const char* field, const char* unit, double value,
                                    double scale, double temperature_c, double pressure_dbar) {
  if (auto s = check_pss78_conditions(temperature_c, pressure_dbar); !s) return s.error();
  const double t68 = t68_from_t90(temperature_c);
  const ValidityRange& v = kPss78Validity;
  double salinity = 0.0;
  const bool usable = std::isfinite(value) && value > 0.0 && value / scale <= kRatioHi;
  if (usable) salinity = pss78::salinity_from_ratio(value / scale, t68, pressure_dbar);
  // The 1e-9 slack lets the inverse of a salinity at a bound (solved to 1e-12 in R) come back.
  constexpr double slack = 1e-9;
  if (usable && salinity >= v.salinity_min - slack && salinity <= v.salinity_max + slack) {
    return std::fmin(std::fmax(salinity, v.salinity_min), v.salinity_max);
  }
  // Out of range: report the accepted range of the input at this temperature and pressure.
  const double lo = ratio_for_salinity(v.salinity_min, t68, pressure_dbar).x * scale;
  const double hi = ratio_for_salinity(v.salinity_max, t68, pressure_dbar).x * scale;
  const std::string u = unit[0] != '\0' ? std::string(" ") + unit : std::string();
  std::string message =
      std::isfinite(value)
          ? fmt::format("{} {:g}{} is outside the accepted range {:.4g} to {:.4g}{}", field,
                        value, u, lo, hi, u)
          : fmt::format("{} is not a number; accepted range is {:.4g} to {:.4g}{}", field, lo,
                        hi, u);
  message += fmt::format(" at {:g} C and {:g} dbar (practical salinity 2 to 42, {})",
                         temperature_c, pressure_dbar, v.source);
  return Error{field, message};
}

}  // namespace

// ---------------------------------------------------------------- 3. everyday API
Result<double> salinity_from_conductivity_ratio(double ratio, double temperature_c,
                                                double pressure_dbar) {
  return salinity_from_scaled("conductivity_ratio", "", ratio, 1.0, temperature_c,
                              pressure_dbar);
}

Result<double> conductivity_ratio_from_salinity(double salinity, double temperature_c,
                                                double pressure_dbar) {
  const ValidityRange& v = kPss78Validity;
  if (auto s = detail::check_range_of("salinity", salinity, v.salinity_min, v.salinity_max, "",
                                      v.source);
      !s)
    return s.error();
  if (auto s = check_pss78_conditions(temperature_c, pressure_dbar); !s) return s.error();
  const detail::RootResult r =
      ratio_for_salinity(salinity, t68_from_t90(temperature_c), pressure_dbar);
  if (!r.converged) {
    return Error{"salinity", fmt::format("salinity {:g}: the PSS-78 inverse did not converge in "
                                         "{} iterations (please report this input)",
                                         salinity, r.iterations)};
  }
  return r.x;
}

Result<double> salinity_from_conductivity_ms_cm(double conductivity_ms_cm, double temperature_c,
                                                double pressure_dbar) {
  return salinity_from_scaled("conductivity_ms_cm", "mS/cm", conductivity_ms_cm,
                              kConductivityAtS35T15mS_cm, temperature_c, pressure_dbar);
}

Result<double> conductivity_ms_cm_from_salinity(double salinity, double temperature_c,
                                                double pressure_dbar) {
  Result<double> r = conductivity_ratio_from_salinity(salinity, temperature_c, pressure_dbar);
  if (!r) return r.error();
  return *r * kConductivityAtS35T15mS_cm;
}

}  // namespace tw::seawater
