// One function per published formula (see carbonate_formulas.hpp for citations, units,
// validity ranges and check values). Coefficients keep the order of the sources.
#include <cmath>

#include "tidewright/carbonate/carbonate_formulas.hpp"

namespace tw::carbonate {

// ---------------------------------------------------------------- totals
double total_boron_uppstrom1974(double salinity) {
  return (0.000232 / 10.811) * (salinity / 1.80655);
}
double total_boron_lee2010(double salinity) { return 0.0004326 * salinity / 35.0; }
double total_sulfate_morris_riley1966(double salinity) {
  return (0.1400 / 96.062) * (salinity / 1.80655);
}
double total_fluoride_riley1965(double salinity) {
  return (0.000067 / 18.998) * (salinity / 1.80655);
}
double calcium_riley_tongudai1967(double salinity) {
  return (0.02128 / 40.078) * (salinity / 1.80655);
}
double ionic_strength(double salinity) { return 19.924 * salinity / (1000.0 - 1.005 * salinity); }

// ---------------------------------------------------------------- constants
double ln_k0_weiss1974(double salinity, double temperature_k) {
  const double t100 = temperature_k / 100.0;
  return -60.2409 + 93.4517 / t100 + 23.3585 * std::log(t100) +
         salinity * (0.023517 - 0.023656 * t100 + 0.0047036 * t100 * t100);
}

double pk1_total_lueker2000(double salinity, double temperature_k) {
  return 3633.86 / temperature_k - 61.2172 + 9.67770 * std::log(temperature_k) -
         0.011555 * salinity + 0.0001152 * salinity * salinity;
}
double pk2_total_lueker2000(double salinity, double temperature_k) {
  return 471.78 / temperature_k + 25.9290 - 3.16967 * std::log(temperature_k) -
         0.01781 * salinity + 0.0001122 * salinity * salinity;
}

PkPair k1_k2_sws_millero2010(double salinity, double temperature_k) {
  const double s = std::sqrt(salinity), ln_t = std::log(temperature_k), S = salinity;
  const double t = temperature_k;
  const double pk1_0 = -126.34048 + 6320.813 / t + 19.568224 * ln_t;
  const double a1 = 13.4038 * s + 0.03206 * S - 5.242e-5 * S * S;
  const double b1 = -530.659 * s - 5.8210 * S;
  const double c1 = -2.0664 * s;
  const double pk2_0 = -90.18333 + 5143.692 / t + 14.613358 * ln_t;
  const double a2 = 21.3728 * s + 0.1218 * S - 3.688e-4 * S * S;
  const double b2 = -788.289 * s - 19.189 * S;
  const double c2 = -3.374 * s;
  return {pk1_0 + a1 + b1 / t + c1 * ln_t, pk2_0 + a2 + b2 / t + c2 * ln_t};
}

double ln_kb_total_dickson1990(double salinity, double temperature_k) {
  const double S = salinity, s = std::sqrt(S), t = temperature_k;
  return (-8966.90 - 2890.53 * s - 77.942 * S + 1.728 * S * s - 0.0996 * S * S) / t +
         148.0248 + 137.1942 * s + 1.62142 * S - (24.4344 + 25.085 * s + 0.2474 * S) * std::log(t) +
         0.053105 * s * t;
}

double ln_kw_total_millero1995(double salinity, double temperature_k) {
  const double t = temperature_k, ln_t = std::log(t);
  return 148.9652 - 13847.26 / t - 23.6521 * ln_t +
         (118.67 / t - 5.977 + 1.0495 * ln_t) * std::sqrt(salinity) - 0.01615 * salinity;
}

double ln_ks_free_dickson1990(double salinity, double temperature_k) {
  const double t = temperature_k, ln_t = std::log(t), i = ionic_strength(salinity);
  const double si = std::sqrt(i);
  return -4276.1 / t + 141.328 - 23.093 * ln_t + (-13856.0 / t + 324.57 - 47.986 * ln_t) * si +
         (35474.0 / t - 771.54 + 114.723 * ln_t) * i - 2698.0 / t * i * si +
         1776.0 / t * i * i + std::log(1.0 - 0.001005 * salinity);
}

double ln_kf_total_perez_fraga1987(double salinity, double temperature_k) {
  return 874.0 / temperature_k - 9.68 + 0.111 * std::sqrt(salinity);
}

double ln_kf_free_perez_fraga1987(double salinity, double temperature_k) {
  return 874.0 / temperature_k - 9.68 + 0.111 * std::sqrt(salinity);
}

double ln_kf_free_dickson_riley1979(double salinity, double temperature_k) {
  return 1590.2 / temperature_k - 12.641 + 1.525 * std::sqrt(ionic_strength(salinity)) +
         std::log(1.0 - 0.001005 * salinity);
}

double ln_kw_sws_millero1995(double salinity, double temperature_k) {
  const double t = temperature_k, ln_t = std::log(t);
  return 148.9802 - 13847.26 / t - 23.6521 * ln_t +
         (-5.977 + 118.67 / t + 1.0495 * ln_t) * std::sqrt(salinity) - 0.01615 * salinity;
}

double ln_k1p_sws_yao_millero1995(double salinity, double temperature_k) {
  const double t = temperature_k;
  return -4576.752 / t + 115.54 - 18.453 * std::log(t) +
         (-106.736 / t + 0.69171) * std::sqrt(salinity) + (-0.65643 / t - 0.01844) * salinity;
}
double ln_k2p_sws_yao_millero1995(double salinity, double temperature_k) {
  const double t = temperature_k;
  return -8814.715 / t + 172.1033 - 27.927 * std::log(t) +
         (-160.34 / t + 1.3566) * std::sqrt(salinity) + (0.37335 / t - 0.05778) * salinity;
}
double ln_k3p_sws_yao_millero1995(double salinity, double temperature_k) {
  const double t = temperature_k;
  return -3070.75 / t - 18.126 + (17.27039 / t + 2.81197) * std::sqrt(salinity) +
         (-44.99486 / t - 0.09984) * salinity;
}
double ln_ksi_sws_yao_millero1995(double salinity, double temperature_k) {
  const double t = temperature_k, i = ionic_strength(salinity);
  return -8904.2 / t + 117.4 - 19.334 * std::log(t) + (-458.79 / t + 3.5913) * std::sqrt(i) +
         (188.74 / t - 1.5998) * i + (-12.1652 / t + 0.07871) * i * i +
         std::log(1.0 - 0.001005 * salinity);
}

double ln_k1p_total_millero1995(double salinity, double temperature_k) {
  const double t = temperature_k;
  return -4576.752 / t + 115.525 - 18.453 * std::log(t) +
         (-106.736 / t + 0.69171) * std::sqrt(salinity) + (-0.65643 / t - 0.01844) * salinity;
}
double ln_k2p_total_millero1995(double salinity, double temperature_k) {
  const double t = temperature_k;
  return -8814.715 / t + 172.0883 - 27.927 * std::log(t) +
         (-160.340 / t + 1.3566) * std::sqrt(salinity) + (0.37335 / t - 0.05778) * salinity;
}
double ln_k3p_total_millero1995(double salinity, double temperature_k) {
  const double t = temperature_k;
  return -3070.75 / t - 18.141 + (17.27039 / t + 2.81197) * std::sqrt(salinity) +
         (-44.99486 / t - 0.09984) * salinity;
}
double ln_ksi_total_millero1995(double salinity, double temperature_k) {
  const double t = temperature_k, i = ionic_strength(salinity);
  return -8904.2 / t + 117.385 - 19.334 * std::log(t) + (-458.79 / t + 3.5913) * std::sqrt(i) +
         (188.74 / t - 1.5998) * i + (-12.1652 / t + 0.07871) * i * i +
         std::log(1.0 - 0.001005 * salinity);
}

double log10_ksp_calcite_mucci1983(double salinity, double temperature_k) {
  const double t = temperature_k, s = std::sqrt(salinity);
  return -171.9065 - 0.077993 * t + 2839.319 / t + 71.595 * std::log10(t) +
         (-0.77712 + 0.0028426 * t + 178.34 / t) * s - 0.07711 * salinity +
         0.0041249 * salinity * s;
}
double log10_ksp_aragonite_mucci1983(double salinity, double temperature_k) {
  const double t = temperature_k, s = std::sqrt(salinity);
  return -171.945 - 0.077993 * t + 2903.293 / t + 71.595 * std::log10(t) +
         (-0.068393 + 0.0017276 * t + 88.135 / t) * s - 0.10018 * salinity +
         0.0059415 * salinity * s;
}

// ---------------------------------------------------------------- gas phase
double co2_virial_b_weiss1974_cm3_mol(double temperature_k) {
  const double t = temperature_k;
  return -1636.75 + 12.0408 * t - 0.0327957 * t * t + 3.16528e-5 * t * t * t;
}
double co2_air_virial_delta_weiss1974_cm3_mol(double temperature_k) {
  return 57.7 - 0.118 * temperature_k;
}
double fugacity_coefficient_co2_weiss1974(double temperature_k, double pressure_atm) {
  constexpr double kGasConstant = 82.05736;  // cm3 atm K-1 mol-1 (CODATA R)
  const double b = co2_virial_b_weiss1974_cm3_mol(temperature_k);
  const double delta = co2_air_virial_delta_weiss1974_cm3_mol(temperature_k);
  return std::exp((b + 2.0 * delta) * pressure_atm / (kGasConstant * temperature_k));
}

double water_vapour_pressure_weiss_price1980_atm(double salinity, double temperature_k) {
  const double t100 = temperature_k / 100.0;
  return std::exp(24.4543 - 67.4509 / t100 - 4.8489 * std::log(t100) - 0.000544 * salinity);
}

// ---------------------------------------------------------------- pH scales
double nbs_activity_coefficient_takahashi1982(double salinity, double temperature_k) {
  return 1.2948 - 0.002036 * temperature_k +
         (0.0004607 - 1.475e-6 * temperature_k) * salinity * salinity;
}

}  // namespace tw::carbonate
