// Internal pieces of the carbonate solver, shared by carbonate_solver.cpp (root finding),
// carbonate_pairs.cpp (input pairs), carbonate_derived.cpp (the full state) and air.cpp.
// Everything here works in mol/kg-soln with h = [H+] on the TOTAL scale.
#pragma once

#include "tidewright/carbonate/carbonate.hpp"

namespace tw::carbonate::detail {

// A value and its derivative with respect to h.
struct ValueSlope {
  double value;
  double d_dh;
};

// Carbonate alkalinity per unit DIC: ([HCO3-] + 2[CO3--])/DIC = (K1 h + 2 K1 K2)/(h^2 + K1 h + K1 K2).
inline ValueSlope carbonate_alkalinity_per_dic(const Constants& k, double h) {
  const double k1k2 = k.k1 * k.k2;
  const double num = k.k1 * h + 2.0 * k1k2;
  const double den = h * h + k.k1 * h + k1k2;
  const double inv = 1.0 / den;
  return {num * inv, (k.k1 * den - num * (2.0 * h + k.k1)) * inv * inv};
}

// Alkalinity from everything but carbonate (Dickson 1981 definition, facts.md 1):
// [B(OH)4-] + [OH-] + [HPO4--] + 2[PO4---] + [SiO(OH)3-] - [H+]F - [HSO4-] - [HF] - [H3PO4].
inline ValueSlope noncarbonate_alkalinity(const Constants& k, double h) {
  const Totals& t = k.totals;
  const double inv_ftot = 1.0 / k.free_to_total;
  const double hf = h * inv_ftot;
  const double kb_h = 1.0 / (k.kb + h);
  const double borate = t.boron * k.kb * kb_h;
  const double inv_h = 1.0 / h;
  const double oh = k.kw * inv_h;
  const double hso4_den = 1.0 / (hf + k.ks_free);
  const double hso4 = t.sulfate * hf * hso4_den;
  const double hf_den = 1.0 / (h + k.kf);
  const double hfl = t.fluoride * h * hf_den;
  double value = borate + oh - hf - hso4 - hfl;
  double slope = -borate * kb_h - oh * inv_h - inv_ftot -
                 t.sulfate * k.ks_free * hso4_den * hso4_den * inv_ftot -
                 t.fluoride * k.kf * hf_den * hf_den;
  if (t.phosphate > 0.0) {
    const double a = k.k1p, ab = k.k1p * k.k2p, abc = ab * k.k3p;
    const double den = h * h * h + a * h * h + ab * h + abc;
    const double num = ab * h + 2.0 * abc - h * h * h;
    const double inv = 1.0 / den;
    value += t.phosphate * num * inv;
    slope += t.phosphate * ((ab - 3.0 * h * h) * den - num * (3.0 * h * h + 2.0 * a * h + ab)) *
             inv * inv;
  }
  if (t.silicate > 0.0) {
    const double ksi_h = 1.0 / (k.ksi + h);
    const double sil = t.silicate * k.ksi * ksi_h;
    value += sil;
    slope -= sil * ksi_h;
  }
  return {value, slope};
}

// ---------------------------------------------------------------- root finding
enum class RootStatus {
  Ok,
  NoRootAboveRange,  // the residual keeps its sign up to pH kPhMax: input asks for a higher pH
  NoRootBelowRange,  // ... down to pH kPhMin: input asks for a lower pH
  NotConverged,
};
struct Root {
  double h = 0;
  int iterations = 0;
  RootStatus status = RootStatus::Ok;
};

// Solvers for h, each: initial guess, residual, safeguarded Newton (carbonate_solver.cpp).
Root solve_h_alkalinity_dic(const Constants& k, double alk, double dic, const SolverOptions& o);
Root solve_h_alkalinity_co2(const Constants& k, double alk, double co2, const SolverOptions& o);
// Alkalinity + carbonate ion can have two roots (a carbonate branch and, at high pH, a
// hydroxide branch); this returns the lower-pH (carbonate) one and, if a second exists in the
// search range, its h in *other_h (else 0).
Root solve_h_alkalinity_co3(const Constants& k, double alk, double co3, const SolverOptions& o,
                            double* other_h);

// h of the search range ends (total scale).
inline constexpr double kHAtPhMax = 1e-12;  // pH 12
inline constexpr double kHAtPhMin = 1e-2;   // pH 2

// ---------------------------------------------------------------- state
// The full state from h (total scale, with its pH_T = -log10 h) and DIC (mol/kg); warnings
// are not touched.
void fill_state(const Constants& k, double h, double ph_total, double dic, CarbonateState& out);

}  // namespace tw::carbonate::detail
