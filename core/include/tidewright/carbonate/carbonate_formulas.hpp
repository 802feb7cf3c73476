// Published formulas behind the carbonate engine, one function per formula.
//
// Map of this header
//   1. Validity ranges (data a caller can use to warn "outside the calibration range of ...")
//   2. Totals from salinity (boron, sulfate, fluoride, calcium), mol/kg-soln
//   3. Equilibrium constants, each named quantity_scale_source
//   4. Gas phase: CO2 fugacity coefficient, water vapour pressure
//   5. pH scales: NBS activity coefficient
//   6. Seawater composition: the Mg/Ca correction factors of the MyAMI model (Hain et al. 2015)
//
// Conventions: temperature_k is the absolute temperature [K] (t/C + 273.15); salinity is
// practical salinity (PSS-78); results in mol/kg-soln unless named otherwise. "ln" is the
// natural logarithm. Check values are at S = 35, t = 25 C (T = 298.15 K) unless stated and
// come from Dickson, Sabine & Christian (2007), Guide to Best Practices for Ocean CO2
// Measurements, ch. 5 (via facts.md 1), unless stated. compute_constants() in carbonate.hpp
// chooses among these (one table per option) and applies the ranges.
#pragma once

namespace tw::carbonate {

// ---------------------------------------------------------------- 1. Validity ranges
// Calibration range of a fit: salinity and temperature (C). from_memory marks ranges that
// could not be confirmed in accessible text (project rule: say when a value is from memory).
struct ValidityRange {
  const char* source;  // e.g. "Lueker et al. (2000)"
  const char* quantity;  // e.g. "K1 and K2"
  double salinity_min, salinity_max;
  double temperature_min_c, temperature_max_c;
  bool from_memory;
};

// Outside the range? (inclusive bounds)
inline bool outside(const ValidityRange& r, double salinity, double temperature_c) {
  return salinity < r.salinity_min || salinity > r.salinity_max ||
         temperature_c < r.temperature_min_c || temperature_c > r.temperature_max_c;
}

// The ranges, one per formula below. Ranges marked from_memory = true were not confirmed.
inline constexpr ValidityRange kRangeWeiss1974{"Weiss (1974)", "K0 and the CO2 virial coefficients", 0, 40, -1, 40, true};
inline constexpr ValidityRange kRangeLueker2000{"Lueker et al. (2000)", "K1 and K2", 19, 43, 2, 35, true};
inline constexpr ValidityRange kRangeMillero2010{"Millero (2010)", "K1 and K2", 1, 50, 0, 50, false};
inline constexpr ValidityRange kRangeDickson1990B{"Dickson (1990)", "KB", 5, 45, 0, 45, true};
inline constexpr ValidityRange kRangeMillero1995W{"Millero (1995)", "KW", 0, 45, 0, 45, true};
inline constexpr ValidityRange kRangeDickson1990S{"Dickson (1990)", "KS (bisulfate)", 5, 45, 0, 45, true};
inline constexpr ValidityRange kRangePerezFraga1987{"Perez & Fraga (1987)", "KF", 10, 40, 9, 33, true};
inline constexpr ValidityRange kRangeDicksonRiley1979{"Dickson & Riley (1979)", "KF", 0, 45, 0, 45, true};
inline constexpr ValidityRange kRangeMillero1995PSi{"Millero (1995)", "phosphate and silicate constants", 0, 45, 0, 45, true};
inline constexpr ValidityRange kRangeMucci1983{"Mucci (1983)", "calcite and aragonite solubility", 5, 44, 5, 40, true};
inline constexpr ValidityRange kRangeTakahashi1982{"Takahashi et al. (1982)", "NBS pH conversion (fH)", 20, 40, 0, 40, false};
inline constexpr ValidityRange kRangeWeissPrice1980{"Weiss & Price (1980)", "water vapour pressure", 0, 40, 0, 40, true};

// ---------------------------------------------------------------- 2. Totals from salinity
// All mol/kg-soln, scaled from the reference ratio to chlorinity (S/1.80655) or salinity.

// Total boron, Uppstrom (1974), in the ratio form used by CO2SYS and PyCO2SYS
// (total_borate_U74): (0.000232/10.811)(S/1.80655). Check: 415.7 umol/kg at S = 35
// (the rounded form 0.000416 S/35 gives 416.0). [mol/kg]
double total_boron_uppstrom1974(double salinity);
// Total boron, Lee et al. (2010) GCA 74:1801: 0.0004326 S/35. Check: 432.6 umol/kg at S = 35.
double total_boron_lee2010(double salinity);
// Total sulfate, Morris & Riley (1966): (0.1400/96.062)(S/1.80655). Check 0.028235 at S = 35.
double total_sulfate_morris_riley1966(double salinity);
// Total fluoride, Riley (1965): (0.000067/18.998)(S/1.80655). Check 68.3 umol/kg at S = 35.
double total_fluoride_riley1965(double salinity);
// Calcium, Riley & Tongudai (1967): (0.02128/40.078)(S/1.80655), with the IUPAC atomic weight
// of Ca (CO2SYS writes 40.087, a 0.02 % difference). Check 0.010287 at S = 35.
double calcium_riley_tongudai1967(double salinity);

// Ionic strength of seawater, I = 19.924 S/(1000 - 1.005 S) [mol/kg-H2O] (as in the Guide).
double ionic_strength(double salinity);

// ---------------------------------------------------------------- 3. Constants
// CO2 solubility K0 [mol kg-1 atm-1], Weiss (1974) Mar. Chem. 2:203, eq. 12 with the
// mol/kg coefficients. ln K0 = -60.2409 + 93.4517(100/T) + 23.3585 ln(T/100)
//   + S[0.023517 - 0.023656(T/100) + 0.0047036(T/100)^2]. Check ln K0 = -3.5617.
double ln_k0_weiss1974(double salinity, double temperature_k);

// -log10 K1 and K2 of carbonic acid, total scale, Lueker, Dickson & Keeling (2000) Mar. Chem.
// 70:105, eqs. 11-12 (refit of Mehrbach et al. 1973). Check pK1 = 5.8472, pK2 = 8.9660.
double pk1_total_lueker2000(double salinity, double temperature_k);
double pk2_total_lueker2000(double salinity, double temperature_k);

// -log10 K1 and K2, SEAWATER scale, Millero (2010) Mar. Freshwater Res. 61:139, pK = pK0 +
// A + B/T + C ln T with pK0 the pure-water fit (p. 141) and A, B, C from tables 2 and 3
// (p. 140). Coefficients as copied in CO2SYS (several independent copies agree);
// the paper itself was not read. Check (computed here from these coefficients): pK1 = 5.8413,
// pK2 = 8.9609 (SWS) at S = 35, 25 C, close to Millero et al. (2006)'s published 5.8401 and
// 8.9636; S = 0 gives the freshwater pK1 6.3515, pK2 10.3297.
struct PkPair {
  double pk1, pk2;
};
PkPair k1_k2_sws_millero2010(double salinity, double temperature_k);

// ln KB of boric acid, total scale, Dickson (1990) Deep-Sea Res. 37:755, eq. 23.
// Check ln KB = -19.7964 (pKB 8.5975).
double ln_kb_total_dickson1990(double salinity, double temperature_k);

// ln KW of water, total scale: Millero (1995) GCA 59:661 as given in the Guide (148.9652
// set; the seawater-scale original has 148.9802). Check ln KW = -30.434.
// (ConstantsConvention::Guide2007 only.)
double ln_kw_total_millero1995(double salinity, double temperature_k);

// ln KS of bisulfate, FREE scale, mol/kg-soln, Dickson (1990) J. Chem. Thermodyn. 22:113,
// with the factor (1 - 0.001005 S) from mol/kg-H2O. Check ln KS = -2.30 (-2.2996).
double ln_ks_free_dickson1990(double salinity, double temperature_k);

// ln KF of hydrogen fluoride, TOTAL scale, Perez & Fraga (1987) Mar. Chem. 21:161, as in the
// Guide: ln KF = 874/T - 9.68 + 0.111 sqrt(S). Check ln KF = -6.09 (-6.0919).
// (ConstantsConvention::Guide2007 only.)
double ln_kf_total_perez_fraga1987(double salinity, double temperature_k);

// ln KF, FREE scale, mol/kg-soln: the same Perez & Fraga (1987) fit as the reference packages
// read it -- CO2SYS-MATLAB v3.1.1 (CO2SYS.m, sub Constants, "CalculateKF", KFCONSTANT 2:
// "this is on the free pH scale in mol/kg-SW") and PyCO2SYS (equilibria/p1atm.py,
// k_HF_free_PF87). Read so, pKF = 2.646 at S 35, 25 C, next to Dickson & Riley's free-scale
// 2.626; read as total it would imply a free pKF of 2.753 (facts.md 1). Same check value as
// above (ln KF = -6.0919). Fit range S 10-40, 9-33 C (CO2SYS.m comment).
double ln_kf_free_perez_fraga1987(double salinity, double temperature_k);

// ln KF, FREE scale, mol/kg-soln, Dickson & Riley (1979) Mar. Chem. 7:89 (the CO2SYS and
// PyCO2SYS default): ln KF = 1590.2/T - 12.641 + 1.525 sqrt(I) + ln(1 - 0.001005 S).
// Check (computed here): -6.0468 at S = 35, 25 C.
double ln_kf_free_dickson_riley1979(double salinity, double temperature_k);

// ln KW of water, SEAWATER scale, (mol/kg-soln)^2, Millero (1995) GCA 59:661 as coded in
// CO2SYS-MATLAB v3.1.1 (CO2SYS.m, sub Constants, "CalculateKW": 148.9802 - 13847.26/T -
// 23.6521 ln T + (-5.977 + 118.67/T + 1.0495 ln T) sqrt(S) - 0.01615 S) and PyCO2SYS
// (equilibria/p1atm.py, k_H2O_sws_M95). Equals ln_kw_total_millero1995 + 0.015 (the Guide's
// flat offset). Check (computed here): ln KW_SWS = -30.4188 at S 35, 25 C; times the actual
// seawater-to-total factor it is within 0.01 of the Guide's -30.434.
double ln_kw_sws_millero1995(double salinity, double temperature_k);

// ln K1P, K2P, K3P of phosphoric acid and ln KSi of silicic acid, SEAWATER scale,
// mol/kg-soln, Yao & Millero (1995) Aquat. Geochem. 1:53 (compiled in Millero 1995), as coded
// in CO2SYS-MATLAB v3.1.1 (CO2SYS.m, sub Constants, "CalculateKP1KP2KP3KSi": constants
// 115.54, 172.1033, -18.126, 117.4; KSi times (1 - 0.001005 S) from mol/kg-H2O) and
// PyCO2SYS (equilibria/p1atm.py, k_H3PO4_sws_YM95, k_H2PO4_sws_YM95, k_HPO4_sws_YM95,
// k_Si_sws_YM95). Each equals its Guide total-scale form below + 0.015. Checks (computed
// here, S 35, 25 C): -3.6964, -13.7125, -20.2232, -21.592.
double ln_k1p_sws_yao_millero1995(double salinity, double temperature_k);
double ln_k2p_sws_yao_millero1995(double salinity, double temperature_k);
double ln_k3p_sws_yao_millero1995(double salinity, double temperature_k);
double ln_ksi_sws_yao_millero1995(double salinity, double temperature_k);

// ln K1P, K2P, K3P of phosphoric acid and ln KSi of silicic acid, total scale, Millero (1995)
// as given in the Guide (ConstantsConvention::Guide2007). Checks: ln K1P = -3.71,
// ln K2P = -13.727, ln K3P = -20.24, ln KSi = -21.61.
double ln_k1p_total_millero1995(double salinity, double temperature_k);
double ln_k2p_total_millero1995(double salinity, double temperature_k);
double ln_k3p_total_millero1995(double salinity, double temperature_k);
double ln_ksi_total_millero1995(double salinity, double temperature_k);

// log10 of the stoichiometric solubility products K*sp [(mol/kg)^2] of calcite and aragonite,
// Mucci (1983) Am. J. Sci. 283:780 (as in Zeebe & Wolf-Gladrow 2001, App. A).
// Checks: calcite -6.3693, aragonite -6.1883 (facts.md 2).
double log10_ksp_calcite_mucci1983(double salinity, double temperature_k);
double log10_ksp_aragonite_mucci1983(double salinity, double temperature_k);

// ---------------------------------------------------------------- 4. Gas phase
// Second virial coefficient of CO2, B(T) = -1636.75 + 12.0408 T - 0.0327957 T^2 +
// 3.16528e-5 T^3 [cm3/mol], and the CO2-air cross term delta = 57.7 - 0.118 T [cm3/mol],
// Weiss (1974). From memory, unverified; they reproduce the Guide's B = -123.2 and
// delta = 22.5 cm3/mol at 25 C.
double co2_virial_b_weiss1974_cm3_mol(double temperature_k);
double co2_air_virial_delta_weiss1974_cm3_mol(double temperature_k);
// fCO2/pCO2 = exp[(B + 2 delta) P/(R T)] at total pressure pressure_atm (dilute CO2 in air).
// Check (computed here): 0.99681 at 25 C, 1 atm.
double fugacity_coefficient_co2_weiss1974(double temperature_k, double pressure_atm = 1.0);

// Water vapour pressure over seawater [atm], Weiss & Price (1980) Mar. Chem. 8:347:
// ln pH2O = 24.4543 - 67.4509(100/T) - 4.8489 ln(T/100) - 0.000544 S. Formula from memory,
// unverified; it gives 0.03124 atm for pure water at 25 C (as the tables do) and 0.03066 atm
// at S = 35, 25 C (computed here).
double water_vapour_pressure_weiss_price1980_atm(double salinity, double temperature_k);

// ---------------------------------------------------------------- 5. pH scales
// Activity coefficient fH linking NBS-buffer pH to the seawater scale, Takahashi et al.
// (1982), GEOSECS vol. 3, p. 80: fH = 1.2948 - 0.002036 T + (0.0004607 - 1.475e-6 T) S^2,
// pH_SWS = pH_NBS + log10(fH). Fit for S 20-40. Check: pH_NBS 8.000 -> pH_SWS 7.853336 at
// S = 35, 25 C (seacarb pHnbs2sws documentation).
double nbs_activity_coefficient_takahashi1982(double salinity, double temperature_k);

// ---------------------------------------------------------------- 6. Mg/Ca correction
// Hain, Sigman, Higgins & Haug (2015), Global Biogeochem. Cycles 29:517, doi:10.1002/2014GB004986,
// "The effects of secular calcium and magnesium concentration changes on the thermodynamics of
// seawater acid/base chemistry": the MyAMI specific-ion-interaction model (after Millero &
// Pierrot 1998) gives, for water whose Mg and Ca depart from modern seawater, a factor F per
// constant with K_corrected = K_empirical x F (F = 1 for modern seawater).
//
// This is the model's published polynomial approximation, as released with its Python port:
// repository PalaeoCarb/MyAMI (package pymyami), file
// pymyami/parameters/seawater_correction_approximated.json (commit 0432d78; 56 coefficients
// per constant, copied unchanged into myami_polynomial.cpp), evaluated as that package's
// approximate.py documents: the design matrix of [T, ln T, S, Mg, Ca] (T in K) expanded to a
// full third-order polynomial with cross terms (scikit-learn PolynomialFeatures(degree=3):
// 1, the five terms, then every product of two and of three of them in lexicographic order).
// The same approximation serves the Kgen package (PalaeoCarb/Kgen, "MyAMI_Polynomial").
//  - Mg and Ca are in mol/kg, normalised to salinity 35 (pymyami: "Assumes that the provided
//    ionic concentrations are at Sal=35"; params.py calc_seawater_ions scales them by S/35).
//    Modern seawater: Mg 0.0528171, Ca 0.0102821 mol/kg (Millero et al. 2008).
//  - Validity (approximate.py check_limits): 0 to 40 C, salinity 30 to 40, Mg and Ca each 0 to
//    0.06 mol/kg. Accuracy: "only accurate to within ~0.25%" of the full model (pymyami README
//    and the warning approximate.py raises); its test allows 0.2 % over random draws.
//  - Which constant each factor belongs to: K0, K1, K2, KB, KW (total scale), KS (bisulfate;
//    Kgen applies it to the Dickson 1990 KS) and the calcite and aragonite Ksp (one factor for
//    both: the file holds the same numbers under "KspC" and "KspA"). No factor for KF, the
//    phosphate or the silicate constants.
// Check values (computed here with this evaluation from the file's coefficients, and
// independently in Python from the JSON; tests pin the copy to 1e-9), at 35 C,
// S 36.2, Mg 0.03, Ca 0.012 mol/kg:
//   K0 1.0056580, K1 1.0005380, K2 0.7921878, KB 0.9365078, KW 0.7521933, KS 0.9538632,
//   Ksp 0.7850957. The pymyami README prints an example at the same point (K0 1.00565919,
//   K1 1.00238861, K2 0.78858314, KB 0.93815884, KW 0.74594823, KS 0.95738293, Ksp 0.78442705)
//   that the current coefficient file reproduces to 1e-6 for K0 but only within 0.9 % for the
//   others: the README example predates the file (the model was revised for typo corrections,
//   README "Consistency with Hain et al. (2015)"). Tests check both.
inline constexpr double kMyamiModernMagnesiumMolKg = 0.0528171;
inline constexpr double kMyamiModernCalciumMolKg = 0.0102821;
inline constexpr double kMyamiTemperatureMinC = 0.0, kMyamiTemperatureMaxC = 40.0;
inline constexpr double kMyamiSalinityMin = 30.0, kMyamiSalinityMax = 40.0;
inline constexpr double kMyamiIonMaxMolKg = 0.06;  // Mg and Ca each, 0 to this
struct MyamiFactors {
  double k0 = 1, k1 = 1, k2 = 1, kb = 1, kw = 1, ks = 1, ksp = 1;
};
// No range checks (the caller refuses values outside the range above).
MyamiFactors myami_factors_polynomial_hain2015(double temperature_c, double salinity,
                                               double magnesium_mol_kg_s35,
                                               double calcium_mol_kg_s35);

}  // namespace tw::carbonate
