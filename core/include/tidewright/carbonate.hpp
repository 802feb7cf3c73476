// Seawater carbonate system: the public API that the rest of Tidewright builds on.
//
// Map of this header
//   1. Options (enum class; one table in constants.cpp maps each option to its formula)
//   2. Conditions and totals (salinity, temperature, boron, sulfate, fluoride, calcium, nutrients)
//   3. Constants at given conditions (all in mol/kg-soln, pH scale named per constant)
//   4. Inputs: any two of alkalinity, DIC, pH (with scale), pCO2, fCO2, carbonate ion
//   5. Output state (every pH names its scale) and the solver call
//   6. Air equilibrium
//
// Units at this boundary: concentrations in umol/kg of seawater, pCO2/fCO2 in uatm,
// temperature in degrees C, practical salinity (PSS-78). Pressure is 0 dbar (surface).
#pragma once

#include <optional>
#include <string>
#include <vector>

#include "tidewright/result.hpp"

namespace tw::carbonate {

// ---------------------------------------------------------------- 1. Options
enum class PhScale { Total, Seawater, Free, NBS };
enum class K1K2Option { Lueker2000, Millero2010 };
enum class BoronOption { Uppstrom1974, Lee2010 };

const char* to_string(PhScale scale);          // "total", "sws", "free", "nbs"
Result<PhScale> ph_scale_from_string(const std::string& text);

// ---------------------------------------------------------------- 2. Conditions
struct Conditions {
  double salinity = 35.0;        // practical salinity, accepted 0..50 (constants warn outside)
  double temperature_c = 25.0;   // accepted -2..50 C (constants warn outside their fit ranges)
  K1K2Option k1k2 = K1K2Option::Lueker2000;
  BoronOption boron = BoronOption::Uppstrom1974;
  std::optional<double> calcium_umol_kg;  // measured calcium overrides Riley & Tongudai 1967
  double phosphate_umol_kg = 0.0;
  double silicate_umol_kg = 0.0;
};

// Total concentrations used by the equilibria, mol/kg-soln.
struct Totals {
  double boron = 0, sulfate = 0, fluoride = 0, calcium = 0, phosphate = 0, silicate = 0;
};

// ---------------------------------------------------------------- 3. Constants
// Equilibrium constants at the given conditions, mol/kg-soln. Acid-base constants are on the
// TOTAL scale except ks_free (HSO4-, free scale) as in Dickson et al. (2007).
struct Constants {
  Conditions conditions;
  Totals totals;
  double k0 = 0;                    // CO2 solubility, mol kg-1 atm-1 (Weiss 1974)
  double k1 = 0, k2 = 0;            // carbonic acid, total scale
  double kb = 0, kw = 0;            // boric acid, water, total scale
  double ks_free = 0;               // bisulfate, free scale
  double kf = 0;                    // hydrogen fluoride, total scale
  double k1p = 0, k2p = 0, k3p = 0; // phosphoric acid, total scale
  double ksi = 0;                   // silicic acid, total scale
  double ksp_calcite = 0, ksp_aragonite = 0;  // (mol/kg)^2, Mucci 1983
  double fco2_per_pco2 = 1;         // fugacity coefficient (Weiss 1974 virial), 1 atm
  // Ratios between pH scales: [H+]_total = free_to_total * [H+]_free, etc.
  double free_to_total = 1, sws_to_total = 1;
  double nbs_activity_coefficient = 1;  // fH of Takahashi et al. (1982): a_H(NBS) = fH [H+]_sws
  std::vector<std::string> warnings;    // e.g. "temperature 38 C is outside the calibration range of Lueker et al. (2000), 2 to 35 C"
};

// Computes every constant at the conditions; refuses salinity/temperature outside the
// accepted ranges above with a typed error, warns (in Constants::warnings) outside fit ranges.
Result<Constants> compute_constants(const Conditions& conditions);

// ---------------------------------------------------------------- 4. Inputs
enum class Quantity { Alkalinity, DIC, PH, PCO2, FCO2, Carbonate };
const char* to_string(Quantity q);

struct Measurement {
  Quantity quantity;
  double value;  // umol/kg for Alkalinity/DIC/Carbonate, pH units for PH, uatm for PCO2/FCO2
};

struct InputPair {
  Measurement first;
  Measurement second;
  PhScale ph_scale = PhScale::Total;  // the scale of a PH measurement, if one is given
};

struct SolverOptions {
  double ph_tolerance = 1e-12;  // stop when the pH step is below this
  int max_iterations = 100;
};

// ---------------------------------------------------------------- 5. State
struct CarbonateState {
  double ph_total = 0, ph_sws = 0, ph_free = 0, ph_nbs = 0;
  double alkalinity_umol_kg = 0, dic_umol_kg = 0;
  double pco2_uatm = 0, fco2_uatm = 0;
  double co2_umol_kg = 0, hco3_umol_kg = 0, co3_umol_kg = 0;  // CO2* = CO2(aq) + H2CO3
  double borate_umol_kg = 0, hydroxide_umol_kg = 0;
  double omega_aragonite = 0, omega_calcite = 0;
  double revelle_factor = 0;          // (dpCO2/pCO2)/(dDIC/DIC) at constant alkalinity
  double buffer_capacity_umol_kg = 0; // beta = dAlk/dpH at constant DIC, umol/kg per pH unit (positive)
  int iterations = 0;                 // solver iterations used
  std::vector<std::string> warnings;  // constant-range warnings carried forward
};

Result<CarbonateState> solve(const Constants& constants, const InputPair& inputs,
                             const SolverOptions& options = {});

// Convenience for the most common pair (used by planners and estimators in inner loops).
Result<CarbonateState> solve_alkalinity_dic(const Constants& constants, double alkalinity_umol_kg,
                                            double dic_umol_kg);

// ---------------------------------------------------------------- 6. Air
// State of water of the given alkalinity in equilibrium with air of the given CO2 mole
// fraction (dry air, ppm) at 1 atm total pressure, with water vapour pressure after
// Weiss & Price (1980).
Result<CarbonateState> equilibrate_with_air(const Constants& constants, double alkalinity_umol_kg,
                                            double air_co2_ppm);

}  // namespace tw::carbonate
