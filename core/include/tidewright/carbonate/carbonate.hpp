// Seawater carbonate system: the public API that the rest of Tidewright builds on.
//
// Map of this header
//   1. Options (enum class; one table in constants.cpp maps each option to its formula)
//   2. Conditions and totals (salinity, temperature, boron, sulfate, fluoride, calcium, nutrients;
//      measured boron, magnesium and the Mg/Ca correction of the constants for salt mixes)
//   3. Constants at given conditions (all in mol/kg-soln, pH scale named per constant)
//   4. Inputs: any two of alkalinity, DIC, pH (with scale), pCO2, fCO2, carbonate ion
//   5. Output state (every pH names its scale) and the solver call
//   6. Air equilibrium
//   7. pH scale conversions
// The formulas themselves (one function each, with citations and check values) are in
// tidewright/carbonate_formulas.hpp.
//
// Units at this boundary: concentrations in umol/kg of seawater, pCO2/fCO2 in uatm,
// temperature in degrees C, practical salinity (PSS-78). Pressure is 0 dbar (surface).
#pragma once

#include <optional>
#include <string>
#include <vector>

#include "tidewright/carbonate/carbonate_formulas.hpp"
#include "tidewright/common/result.hpp"
#include "tidewright/common/ranges.hpp"

namespace tw::carbonate {

// ---------------------------------------------------------------- 1. Options
enum class PhScale { Total, Seawater, Free, NBS };
enum class K1K2Option { Lueker2000, Millero2010 };
enum class BoronOption { Uppstrom1974, Lee2010 };
// KF of hydrogen fluoride: Perez & Fraga (1987, the Guide's choice and CO2SYS-MATLAB v3's
// preferred one) or Dickson & Riley (1979, PyCO2SYS's default). How Perez & Fraga is read
// (free or total scale) is part of the ConstantsConvention below.
enum class FluorideOption { PerezFraga1987, DicksonRiley1979 };
// How constants fitted on one pH scale are put on the total scale (README, "Science and
// sources"; constants.cpp holds the one table):
//  ReferencePackages -- as CO2SYS-MATLAB v3.1 (CO2SYS.m, sub Constants) and PyCO2SYS
//    (equilibria/p1atm.py) do: KF of Perez & Fraga (1987) read on the FREE scale; KW, the
//    phosphate and the silicate constants from the seawater-scale fits of Millero (1995) /
//    Yao & Millero (1995), multiplied by the actual seawater-to-total factor at the sample's
//    conditions. The default: it agrees with the packages oceanographers check against.
//  Guide2007 -- as printed in Dickson, Sabine & Christian (2007) ch. 5: KF of Perez & Fraga
//    read on the TOTAL scale, and the total-scale forms of KW, KP1-3 and KSi (a flat -0.015
//    in ln K from the seawater-scale originals). For work that must reproduce the Guide.
enum class ConstantsConvention { ReferencePackages, Guide2007 };

const char* to_string(K1K2Option option);      // "lueker2000", "millero2010"
const char* to_string(BoronOption option);     // "uppstrom1974", "lee2010"
const char* to_string(FluorideOption option);  // "perezfraga1987", "dicksonriley1979"
const char* to_string(ConstantsConvention option);  // "co2sys", "guide2007"
// The names above back to options (case-insensitive, spaces trimmed). The Error's field is
// `field` and its message lists the accepted names.
Result<K1K2Option> k1k2_from_string(const std::string& text, const std::string& field = "k1k2");
Result<BoronOption> boron_from_string(const std::string& text, const std::string& field = "boron");
Result<FluorideOption> fluoride_from_string(const std::string& text,
                                            const std::string& field = "fluoride");
Result<ConstantsConvention> convention_from_string(const std::string& text,
                                                   const std::string& field = "conventions");

const char* to_string(PhScale scale);          // "total", "sws", "free", "nbs"
Result<PhScale> ph_scale_from_string(const std::string& text);

// ---------------------------------------------------------------- 2. Conditions
// Accepted ranges (compute_constants refuses values outside them with a typed Error).
// Salinity and temperature: the product's one table (common/ranges.hpp); salinity starts at 1.
inline constexpr double kSalinityMin = ranges::kSalinityForCarbonateChemistry.lo;
inline constexpr double kSalinityMax = ranges::kSalinityForCarbonateChemistry.hi;
inline constexpr double kTemperatureMinC = ranges::kTemperatureC.lo;
inline constexpr double kTemperatureMaxC = ranges::kTemperatureC.hi;
inline constexpr double kCalciumMaxUmolKg = 50000.0;    // 2000 mg/kg; reef tanks hold ~10000
inline constexpr double kNutrientMaxUmolKg = 1000.0;    // phosphate and silicate each

struct Conditions {
  double salinity = 35.0;        // practical salinity, accepted 1..42 (constants warn outside fits)
  double temperature_c = 25.0;   // accepted -2..40 C (constants warn outside their fit ranges)
  K1K2Option k1k2 = K1K2Option::Lueker2000;
  BoronOption boron = BoronOption::Uppstrom1974;
  std::optional<double> calcium_umol_kg;  // measured calcium overrides Riley & Tongudai 1967, 0..50000
  // Measured total boron (issue 18: artificial salt mixes) replaces the salinity-scaled value
  // of the `boron` option; ranges::kTotalBoronUmolKg (0..2000). Absent: scaled, as before.
  std::optional<double> total_boron_umol_kg;
  // Measured magnesium, ranges::kMagnesiumUmolKg (0..100000); read only by mg_ca_correction.
  std::optional<double> magnesium_umol_kg;
  // Correct K0, K1, K2, KB, KW, KS and both Ksp for the water's magnesium and calcium (Hain et
  // al. 2015, the MyAMI model, through its published polynomial; carbonate_formulas.hpp 6).
  // Off by default; when on it needs measured magnesium and calcium, salinity 30..40 and
  // 0..40 C (the polynomial's range) and refuses otherwise (field "mg_ca_correction").
  bool mg_ca_correction = false;
  double phosphate_umol_kg = 0.0;         // 0..1000
  double silicate_umol_kg = 0.0;          // 0..1000
  FluorideOption fluoride = FluorideOption::PerezFraga1987;
  ConstantsConvention convention = ConstantsConvention::ReferencePackages;
};

// A K1 K2 set that fits the water better than the chosen one: offered when the chosen set
// is used outside its calibration range and another set's range covers the water (today:
// Millero 2010, S 1 to 50 and 0 to 50 C, for brackish and estuarine water below the S 19 of
// Lueker et al. 2000). `reason` is a sentence for the user (no option names: front ends add
// how to choose it).
struct K1K2Suggestion {
  K1K2Option option;
  std::string reason;
};
std::optional<K1K2Suggestion> suggest_k1k2(const Conditions& conditions);

// Where the calcium of the saturation states comes from (calcium_source.cpp): measured, or
// scaled from salinity by the seawater ratio (Riley & Tongudai 1967). `note` is a sentence for
// the user; below salinity 30 it says how far the scaled value can be off in water mixed with
// river water (and `low_salinity` is set, the note then also being a warning).
struct CalciumSource {
  bool measured = false;
  bool low_salinity = false;
  double calcium_umol_kg = 0;
  std::string note;
};
CalciumSource calcium_source(const Conditions& conditions);
// Share (relative to the salinity-scaled value) of calcium that salinity scaling misses in
// water of salinity S mixed from seawater (S 35) and fresh water holding fresh_calcium_mg_kg.
double calcium_scaling_missed_share(double salinity, double fresh_calcium_mg_kg);

// Where total boron comes from (boron_source.cpp): measured (Conditions::total_boron_umol_kg),
// or scaled from salinity by the `boron` option's ratio. `note` is a sentence for the user.
struct BoronSource {
  bool measured = false;
  double boron_umol_kg = 0;         // the value the equilibria use
  double scaled_umol_kg = 0;        // what the option's salinity ratio gives at this salinity
  std::string note;
};
BoronSource boron_source(const Conditions& conditions);

// The Mg/Ca correction as applied (Conditions::mg_ca_correction): the water's magnesium and
// calcium normalised to salinity 35 (as the MyAMI model takes them), the factor each constant
// was multiplied by, and a sentence for the user that says it was applied and its range.
struct MgCaCorrection {
  double magnesium_mol_kg_s35 = 0, calcium_mol_kg_s35 = 0;
  MyamiFactors factors;
  std::string note;
};

// Total concentrations used by the equilibria, mol/kg-soln.
struct Totals {
  double boron = 0, sulfate = 0, fluoride = 0, calcium = 0, phosphate = 0, silicate = 0;
};
// Totals at the conditions: boron measured or by the chosen option, sulfate (Morris & Riley 1966),
// fluoride (Riley 1965), calcium (Riley & Tongudai 1967, or the measured value), nutrients as
// given. No range checks (compute_constants does them).
Totals compute_totals(const Conditions& conditions);

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
  double kf_free = 0;               // hydrogen fluoride, free scale (used for the SWS scale)
  // kw, k1p..k3p and ksi come from seawater-scale fits converted with sws_to_total
  // (ReferencePackages) or from the Guide's total-scale forms (Guide2007).
  double k1p = 0, k2p = 0, k3p = 0; // phosphoric acid, total scale
  double ksi = 0;                   // silicic acid, total scale
  double ksp_calcite = 0, ksp_aragonite = 0;  // (mol/kg)^2, Mucci 1983
  double fco2_per_pco2 = 1;         // fugacity coefficient (Weiss 1974 virial), 1 atm
  // Ratios between pH scales: [H+]_total = free_to_total * [H+]_free, etc.
  double free_to_total = 1, sws_to_total = 1;
  double nbs_activity_coefficient = 1;  // fH of Takahashi et al. (1982): a_H(NBS) = fH [H+]_sws
  // The same ratios as pH offsets, pH_other = pH_total + offset (kept to avoid logs per solve):
  double ph_free_minus_total = 0;   // log10(free_to_total), about +0.108 at S 35, 25 C
  double ph_sws_minus_total = 0;    // log10(sws_to_total), about -0.01 at S 35, 25 C
  double ph_nbs_minus_total = 0;    // ph_sws_minus_total - log10(fH)
  std::optional<K1K2Suggestion> k1k2_suggestion;  // suggest_k1k2(conditions); its reason is also a warning
  CalciumSource calcium;            // calcium_source(conditions); its note is a warning at low salinity
  BoronSource boron;                // boron_source(conditions)
  // Set when conditions.mg_ca_correction: the factors already applied to k0, k1, k2, kb, kw,
  // ks_free, ksp_calcite and ksp_aragonite; its note is also among the warnings (the
  // polynomial is an approximation, as its authors warn).
  std::optional<MgCaCorrection> mg_ca_correction;
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

// Accepted input ranges of solve(); values outside give a typed Error naming the field.
// Concentrations and pressures must be above zero (pH inputs: 2..12 on their own scale).
inline constexpr double kAlkalinityMaxUmolKg = 30000.0;  // alkalinity may be 0, not negative
inline constexpr double kDicMaxUmolKg = 30000.0;
inline constexpr double kCarbonateMaxUmolKg = 10000.0;
inline constexpr double kCo2MaxUatm = 1.0e6;             // 1 atm (calcium reactor water can hold 0.3)
inline constexpr double kPhMin = 2.0, kPhMax = 12.0;     // also the solver's search range (total)

struct SolverOptions {
  double ph_tolerance = 1e-12;  // stop when the pH step is below this
  int max_iterations = 100;     // give up (typed Error) after this many iterations
  double max_step_ph = 1.0;     // largest pH change in one Newton step
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

// Any two different quantities except pCO2 + fCO2 (not independent). Pairs that need
// iteration (alkalinity with DIC, pCO2, fCO2 or CO3) use a bracketed Newton over pH_T 2..12;
// the others are closed forms. Alkalinity + CO3 can fit two states (the second one hydroxide-
// dominated, at high pH): the lower-pH one is returned and a warning names the other.
// Errors: an input outside its range (field = that input), a pair no state in pH_T 2..12
// fits (field = the input to check, message says why), or "solver" if the iteration cap hits.
Result<CarbonateState> solve(const Constants& constants, const InputPair& inputs,
                             const SolverOptions& options = {});

// Convenience for the most common pair (used by planners and estimators in inner loops).
Result<CarbonateState> solve_alkalinity_dic(const Constants& constants, double alkalinity_umol_kg,
                                            double dic_umol_kg);

// ---------------------------------------------------------------- 6. Air
// State of water of the given alkalinity in equilibrium with air of the given CO2 mole
// fraction (dry air, ppm) at 1 atm total pressure, with water vapour pressure after
// Weiss & Price (1980). air_co2_ppm accepted 1..1e6.
Result<CarbonateState> equilibrate_with_air(const Constants& constants, double alkalinity_umol_kg,
                                            double air_co2_ppm);
// pCO2 [uatm] of moist air at 1 atm: xCO2 (1 atm - pH2O), pH2O of Weiss & Price (1980).
double air_pco2_uatm(const Constants& constants, double air_co2_ppm);

// ---------------------------------------------------------------- 7. pH scales
// Converts a pH value between any two scales at the constants' conditions:
// [H+]_T = [H+]_F (1 + ST/KS);  [H+]_SWS = [H+]_F (1 + ST/KS + FT/KF);  pH_NBS = pH_SWS - log10(fH).
double convert_ph(const Constants& constants, double ph, PhScale from, PhScale to);
// pH_scale - pH_total at the constants' conditions.
double ph_offset_from_total(const Constants& constants, PhScale scale);

}  // namespace tw::carbonate
