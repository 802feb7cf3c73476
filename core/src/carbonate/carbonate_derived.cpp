// The full carbonate state from [H+] (total scale) and DIC: species, the four pH scales,
// pCO2/fCO2, saturation states, Revelle factor and buffer capacity.
#include <cmath>

#include "carbonate_internal.hpp"

namespace tw::carbonate::detail {

// Revelle factor R = (d ln pCO2 / d ln DIC) at constant alkalinity (Revelle & Suess 1957;
// as in Zeebe & Wolf-Gladrow 2001, sec. 1.6). With CO2* = DIC h^2/D, D = h^2 + K1 h + K1K2,
//   d ln CO2*/d DIC = 1/DIC + (2/h - (2h + K1)/D) dh/dDIC,
//   dh/dDIC = -(dTA/dDIC)/(dTA/dh) at constant TA, dTA/dDIC = (HCO3 + 2 CO3)/DIC.
// (Analytic form derived here; the fugacity coefficient does not depend on DIC.)
// Buffer capacity beta = dTA/dpH at constant DIC = -ln(10) h dTA/dh (positive).
void fill_state(const Constants& k, double h, double ph_total, double dic, CarbonateState& out) {
  constexpr double kLn10 = 2.302585092994046;
  const double k1k2 = k.k1 * k.k2;
  const double den = h * h + k.k1 * h + k1k2;
  const double inv_den = 1.0 / den;
  const double co2 = dic * h * h * inv_den;
  const double hco3 = dic * k.k1 * h * inv_den;
  const double co3 = dic * k1k2 * inv_den;
  const ValueSlope c = carbonate_alkalinity_per_dic(k, h);
  const ValueSlope n = noncarbonate_alkalinity(k, h);
  const double alk = hco3 + 2.0 * co3 + n.value;
  const double dta_dh = dic * c.d_dh + n.d_dh;

  out.ph_total = ph_total;  // = -log10(h), passed in: the caller has it already
  out.ph_sws = out.ph_total + k.ph_sws_minus_total;
  out.ph_free = out.ph_total + k.ph_free_minus_total;
  out.ph_nbs = out.ph_total + k.ph_nbs_minus_total;
  out.alkalinity_umol_kg = alk * 1e6;
  out.dic_umol_kg = dic * 1e6;
  out.co2_umol_kg = co2 * 1e6;
  out.hco3_umol_kg = hco3 * 1e6;
  out.co3_umol_kg = co3 * 1e6;
  out.fco2_uatm = co2 / k.k0 * 1e6;
  out.pco2_uatm = out.fco2_uatm / k.fco2_per_pco2;
  out.borate_umol_kg = k.totals.boron * k.kb / (k.kb + h) * 1e6;
  out.hydroxide_umol_kg = k.kw / h * 1e6;
  out.omega_aragonite = k.totals.calcium * co3 / k.ksp_aragonite;
  out.omega_calcite = k.totals.calcium * co3 / k.ksp_calcite;
  const double dh_ddic = -c.value / dta_dh;
  out.revelle_factor = 1.0 + dic * (2.0 / h - (2.0 * h + k.k1) * inv_den) * dh_ddic;
  out.buffer_capacity_umol_kg = -kLn10 * h * dta_dh * 1e6;
}

}  // namespace tw::carbonate::detail
