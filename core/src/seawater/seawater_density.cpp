// EOS-80: the international equation of state of seawater (Millero & Poisson 1981 for one
// atmosphere; Millero, Chen, Bradshaw & Schleicher 1980 for the secant bulk modulus), in the form
// and with the coefficient names of UNESCO (1983), Fofonoff & Millard, "Algorithms for
// computation of fundamental properties of seawater", Unesco Tech. Pap. Mar. Sci. 44, pp. 15-24.
//
// Map: 1. pure water (SMOW)  2. one atmosphere  3. secant bulk modulus  4. in situ density
//      5. everyday API (ITS-90 in, range checks)
// Check values quoted below are the UNESCO 1983 p. 22 table (facts.md 4); they are tested in
// tests/unit/test_seawater.cpp.
#include <cassert>
#include <cmath>

#include "seawater_internal.hpp"
#include "tidewright/common/ranges.hpp"
#include "tidewright/seawater/seawater.hpp"

// Every water the product accepts (common/ranges.hpp) has a density from EOS-80.
static_assert(tw::ranges::kTemperatureC.lo >= tw::seawater::kEos80Validity.temperature_min_c &&
              tw::ranges::kTemperatureC.hi <= tw::seawater::kEos80Validity.temperature_max_c);
static_assert(tw::ranges::kSalinity.lo >= tw::seawater::kEos80Validity.salinity_min &&
              tw::ranges::kSalinity.hi <= tw::seawater::kEos80Validity.salinity_max);

namespace tw::seawater {
namespace eos80 {

// ---------------------------------------------------------------- 1. pure water
// Density of Standard Mean Ocean Water at one standard atmosphere (Bigg 1967), the first
// term of the EOS-80 one-atmosphere equation. UNESCO 1983 p. 17, coefficients a0..a5.
//   t68 [deg C, IPTS-68]  ->  rho_w [kg/m3].   Valid 0..40 C.
//   Check: rho_w(0) = 999.842594; rho_w(30) = 995.65113 (the S = 0 rows of the p. 22 table).
double pure_water_density_smow_kg_m3(double t68) {
  constexpr double a0 = 999.842594, a1 = 6.793952e-2, a2 = -9.095290e-3, a3 = 1.001685e-4,
                   a4 = -1.120083e-6, a5 = 6.536332e-9;
  const double t = t68;
  return a0 + t * (a1 + t * (a2 + t * (a3 + t * (a4 + t * a5))));
}

// ---------------------------------------------------------------- 2. one atmosphere
// One-atmosphere density of seawater, Millero & Poisson (1981), UNESCO 1983 p. 17:
//   rho(S,t,0) = rho_w + (b0 + b1 t + b2 t^2 + b3 t^3 + b4 t^4) S
//                      + (c0 + c1 t + c2 t^2) S^1.5 + d0 S^2
//   salinity [practical], t68 [deg C, IPTS-68]  ->  [kg/m3].  Valid S 0..42, t -2..40 C.
//   Check: rho(35, 0, 0) = 1028.10633; rho(35, 30, 0) = 1021.72864 (UNESCO 1983 p. 22).
double density_one_atm_kg_m3(double salinity, double t68) {
  assert(salinity >= 0.0 && "EOS-80 needs salinity >= 0");
  constexpr double b0 = 8.24493e-1, b1 = -4.0899e-3, b2 = 7.6438e-5, b3 = -8.2467e-7,
                   b4 = 5.3875e-9;
  constexpr double c0 = -5.72466e-3, c1 = 1.0227e-4, c2 = -1.6546e-6;
  constexpr double d0 = 4.8314e-4;
  const double t = t68;
  const double s = salinity;
  const double s15 = s * std::sqrt(s > 0.0 ? s : 0.0);
  return pure_water_density_smow_kg_m3(t) + (b0 + t * (b1 + t * (b2 + t * (b3 + t * b4)))) * s +
         (c0 + t * (c1 + t * c2)) * s15 + d0 * s * s;
}

// ---------------------------------------------------------------- 3. secant bulk modulus
// Secant bulk modulus of pure water, K_w(t,p) = K_w(t,0) + A_w P + B_w P^2 with P in bar,
// UNESCO 1983 p. 18 (coefficients e0..e4, h0..h3, k0..k2).
//   t68 [deg C, IPTS-68], pressure_dbar [dbar]  ->  [bar].  Valid 0..40 C, 0..10000 dbar.
//   Check: K_w(0, 0) = e0 = 19652.21 bar (the leading coefficient).
double secant_bulk_modulus_pure_water_bar(double t68, double pressure_dbar) {
  constexpr double e0 = 19652.21, e1 = 148.4206, e2 = -2.327105, e3 = 1.360477e-2,
                   e4 = -5.155288e-5;
  constexpr double h0 = 3.239908, h1 = 1.43713e-3, h2 = 1.16092e-4, h3 = -5.77905e-7;
  constexpr double k0 = 8.50935e-5, k1 = -6.12293e-6, k2 = 5.2787e-8;
  const double t = t68;
  const double p = pressure_dbar / 10.0;  // bar
  const double kw0 = e0 + t * (e1 + t * (e2 + t * (e3 + t * e4)));
  const double aw = h0 + t * (h1 + t * (h2 + t * h3));
  const double bw = k0 + t * (k1 + t * k2);
  return kw0 + aw * p + bw * p * p;
}

// Secant bulk modulus of seawater, Millero et al. (1980) as given in UNESCO 1983 p. 18:
//   K(S,t,0) = K_w(t,0) + (f0 + f1 t + f2 t^2 + f3 t^3) S + (g0 + g1 t + g2 t^2) S^1.5
//   A = A_w + (i0 + i1 t + i2 t^2) S + j0 S^1.5,   B = B_w + (m0 + m1 t + m2 t^2) S
//   K(S,t,p) = K(S,t,0) + A P + B P^2,  P in bar.
//   salinity, t68 [deg C, IPTS-68], pressure_dbar [dbar]  ->  [bar].
//   Valid S 0..42, t -2..40 C, 0..10000 dbar.
//   Check: the p. 22 densities imply K = P / (1 - rho(S,t,0)/rho(S,t,p)); for S 35, t 0,
//   10000 dbar that is 1000 / (1 - 1028.10633/1070.95838) = 24992.00 bar (computed here from
//   the published densities; tested in test_seawater.cpp).
double secant_bulk_modulus_bar(double salinity, double t68, double pressure_dbar) {
  assert(salinity >= 0.0 && "EOS-80 needs salinity >= 0");
  constexpr double f0 = 54.6746, f1 = -0.603459, f2 = 1.09987e-2, f3 = -6.1670e-5;
  constexpr double g0 = 7.944e-2, g1 = 1.6483e-2, g2 = -5.3009e-4;
  constexpr double i0 = 2.2838e-3, i1 = -1.0981e-5, i2 = -1.6078e-6, j0 = 1.91075e-4;
  constexpr double m0 = -9.9348e-7, m1 = 2.0816e-8, m2 = 9.1697e-10;
  constexpr double h0 = 3.239908, h1 = 1.43713e-3, h2 = 1.16092e-4, h3 = -5.77905e-7;
  constexpr double k0 = 8.50935e-5, k1 = -6.12293e-6, k2 = 5.2787e-8;
  const double t = t68;
  const double s = salinity;
  const double s15 = s * std::sqrt(s > 0.0 ? s : 0.0);
  const double p = pressure_dbar / 10.0;  // bar
  const double k_s0 = secant_bulk_modulus_pure_water_bar(t, 0.0) +
                      (f0 + t * (f1 + t * (f2 + t * f3))) * s + (g0 + t * (g1 + t * g2)) * s15;
  const double a = (h0 + t * (h1 + t * (h2 + t * h3))) + (i0 + t * (i1 + t * i2)) * s + j0 * s15;
  const double b = (k0 + t * (k1 + t * k2)) + (m0 + t * (m1 + t * m2)) * s;
  return k_s0 + a * p + b * p * p;
}

// ---------------------------------------------------------------- 4. in situ density
// In situ density, EOS-80: rho(S,t,p) = rho(S,t,0) / (1 - P / K(S,t,p)), P in bar
// (UNESCO 1983 p. 17).
//   salinity, t68 [deg C, IPTS-68], pressure_dbar [dbar]  ->  [kg/m3].
//   Valid S 0..42, t -2..40 C, 0..10000 dbar.
//   Check (UNESCO 1983 p. 22): rho(35, 0, 10000) = 1070.95838; rho(35, 30, 10000) = 1060.55059;
//   rho(40, 40, 10000) = 1059.82037.
double density_kg_m3(double salinity, double t68, double pressure_dbar) {
  const double rho0 = density_one_atm_kg_m3(salinity, t68);
  if (pressure_dbar == 0.0) return rho0;
  const double p = pressure_dbar / 10.0;  // bar
  return rho0 / (1.0 - p / secant_bulk_modulus_bar(salinity, t68, pressure_dbar));
}

}  // namespace eos80

// ---------------------------------------------------------------- 5. everyday API
double density_eos80_kg_m3(double salinity, double temperature_c, double pressure_dbar) {
  return eos80::density_kg_m3(salinity, t68_from_t90(temperature_c), pressure_dbar);
}

double density_kg_per_l(double salinity, double temperature_c) {
  return density_eos80_kg_m3(salinity, temperature_c, 0.0) / 1000.0;
}

double pure_water_density_kg_m3(double temperature_c) {
  return eos80::pure_water_density_smow_kg_m3(t68_from_t90(temperature_c));
}

Status check_eos80_inputs(double salinity, double temperature_c, double pressure_dbar) {
  const ValidityRange& v = kEos80Validity;
  if (auto s = detail::check_range_of("salinity", salinity, v.salinity_min, v.salinity_max, "",
                                      v.source);
      !s)
    return s;
  if (auto s = detail::check_range_of("temperature_c", temperature_c, v.temperature_min_c,
                                      v.temperature_max_c, "C", v.source);
      !s)
    return s;
  return detail::check_range_of("pressure_dbar", pressure_dbar, v.pressure_min_dbar,
                                v.pressure_max_dbar, "dbar", v.source);
}

Result<double> density_eos80_checked_kg_m3(double salinity, double temperature_c,
                                           double pressure_dbar) {
  if (auto s = check_eos80_inputs(salinity, temperature_c, pressure_dbar); !s) return s.error();
  return density_eos80_kg_m3(salinity, temperature_c, pressure_dbar);
}

}  // namespace tw::seawater
