// Uncertainty of a carbonate state: the standard uncertainty of every output from the
// standard uncertainties of the inputs (and, as an option, of the constants), by the method
// of Orr et al. (2018, Mar. Chem. 207:84, "Routine uncertainty propagation for the marine
// carbon dioxide system"): first-order (linear) propagation, u(y)^2 = sum_i (dy/dx_i)^2 u(x_i)^2,
// the inputs taken as independent.
//
// The derivatives dy/dx_i are central finite differences of the core's own solver (solve()
// of carbonate.hpp), one pair of solves per source: the same equations as every other answer,
// no second copy of the chemistry. A source at the edge of its accepted range (e.g. phosphate 0)
// uses a one-sided difference.
//
// Map of this header
//   1. The outputs as a set of numbers (one table names them for front ends)
//   2. Constants' uncertainties (Orr et al. 2018, as PyCO2SYS carries them)
//   3. Inputs' uncertainties and their accepted ranges
//   4. The answer: state, standard uncertainties, the budget by source, 95 % ranges
#pragma once

#include <array>
#include <optional>
#include <string>
#include <vector>

#include "tidewright/carbonate/carbonate.hpp"

namespace tw::carbonate {

// ---------------------------------------------------------------- 1. Outputs
// One number per numeric output of CarbonateState, in the same units.
struct CarbonateOutputs {
  double ph_total = 0, ph_sws = 0, ph_free = 0, ph_nbs = 0;
  double alkalinity_umol_kg = 0, dic_umol_kg = 0;
  double pco2_uatm = 0, fco2_uatm = 0;
  double co2_umol_kg = 0, hco3_umol_kg = 0, co3_umol_kg = 0;
  double borate_umol_kg = 0, hydroxide_umol_kg = 0;
  double omega_aragonite = 0, omega_calcite = 0;
  double revelle_factor = 0, buffer_capacity_umol_kg = 0;
};

// The one table of outputs: its name (as in `chem --json` and the batch CSV), and where it
// sits in CarbonateState and in CarbonateOutputs.
struct OutputField {
  const char* name;
  double CarbonateState::*state;
  double CarbonateOutputs::*output;
};
extern const std::array<OutputField, 17> kOutputFields;

CarbonateOutputs outputs_of(const CarbonateState& state);

// ---------------------------------------------------------------- 2. Constants
// Standard uncertainties of the constants, in pK units (pK = -log10 K) except boron, which is
// relative. Defaults: Orr et al. (2018) section 2.3 / Table 1, as PyCO2SYS carries them
// (PyCO2SYS/uncertainty.py, pKs_OEDG18 and all_OEDG18 with "total_borate__f": 0.02, read
// 2026-12-04 via the search tool): pK0 0.002, pK1 0.0075, pK2 0.015, pKB 0.01, pKW 0.01,
// pKsp aragonite 0.02, pKsp calcite 0.02, total boron 2 %.
struct ConstantUncertainties {
  double pk0 = 0.002;
  double pk1 = 0.0075;
  double pk2 = 0.015;
  double pkb = 0.01;
  double pkw = 0.01;
  double pksp_aragonite = 0.02;
  double pksp_calcite = 0.02;
  double boron_relative = 0.02;  // u(total boron)/total boron, of the boron-to-salinity ratio:
                                 // not used for a measured boron (InputUncertainties::total_boron_umol_kg)
};

// ---------------------------------------------------------------- 3. Inputs
// Standard uncertainties (one standard deviation) of what was measured, in the units of
// InputPair / Conditions (umol/kg, uatm, pH units, C, practical salinity). 0 = exact.
struct InputUncertainties {
  double first = 0;   // of InputPair::first, in its unit
  double second = 0;  // of InputPair::second, in its unit
  // Of the conversion of a pH input from its scale to the total scale (pH units). For an NBS
  // meter reading in seawater this is a few hundredths (facts.md: the fH route is uncertain;
  // see measurement_precision.hpp for the default); 0 for a total-scale pH.
  double ph_scale_conversion = 0;
  double salinity = 0;
  double temperature_c = 0;
  double calcium_umol_kg = 0;  // counts only when Conditions::calcium_umol_kg is given
  // Of a salt mix's measured composition (issue 18). Total boron counts only when
  // Conditions::total_boron_umol_kg is given, and then stands in for the constants'
  // boron_relative (the seawater boron-to-salinity ratio is not used). Magnesium counts only
  // when Conditions::mg_ca_correction is on, its one reader.
  double total_boron_umol_kg = 0;
  double magnesium_umol_kg = 0;
  double phosphate_umol_kg = 0;
  double silicate_umol_kg = 0;
  std::optional<ConstantUncertainties> constants;  // unset: the constants taken as exact
};

// Accepted ranges of the standard uncertainties (0 up to these). Past them a first-order
// band means little: the state moves far outside the linear range of the equations.
inline constexpr double kMaxUncertaintyPh = 0.5;               // pH units, also the conversion
inline constexpr double kMaxUncertaintyRelative = 0.5;         // concentrations and CO2, of their value
inline constexpr double kMaxUncertaintySalinity = 5.0;
inline constexpr double kMaxUncertaintyTemperatureC = 5.0;
inline constexpr double kMaxUncertaintyNutrientUmolKg = 100.0;  // phosphate, silicate
inline constexpr double kMaxUncertaintyConstantPk = 0.5;
inline constexpr double kMaxUncertaintyBoronRelative = 0.5;

// The largest accepted standard uncertainty of a measurement of quantity q with value v.
double max_uncertainty(Quantity q, double value);

// ---------------------------------------------------------------- 4. The answer
// Coverage factor of a 95 % range: +/- 1.96 u, the normal distribution's, so the range is a
// linear approximation (exact only if the outputs were linear in the inputs and the inputs
// normal; Orr et al. 2018 use the same first-order approach).
inline constexpr double kCoverageFactor95 = 1.96;

struct Range {
  double low = 0, high = 0;
};
// value -/+ 1.96 u, the low end kept at or above `floor` (concentrations, pCO2 and Omega
// cannot go below 0, which the linear band would otherwise claim).
Range range95(double value, double u, double floor = 0.0);
// The floor that fits an output (a pH can be any number: -inf; everything else 0).
double output_floor(const OutputField& field);

// How many decimals to show a value with standard uncertainty u: u to two significant digits
// when it starts with 1 or 2, else one, and the value to the same place (a pH known to 0.06
// shows 8.04, not 8.0412; 0.20 dKH shows 7.30 +/- 0.20). 0 to 6.
int decimals_for_uncertainty(double u);

// True when u is nothing but the rounding of the differences (below a billionth of the value):
// the output is fixed by an input taken as exact (e.g. pCO2 of water settled with air).
bool taken_as_exact(double value, double u);

// One source of uncertainty: its name ("alkalinity_umol_kg", "temperature_c", "pk1", ...),
// its standard uncertainty, the derivative of every output by it, and what it adds to each
// output's u (|derivative| x u).
struct UncertaintySource {
  std::string name;
  double u = 0;
  CarbonateOutputs derivative;
  CarbonateOutputs contribution;
};

struct UncertainState {
  CarbonateState state;
  CarbonateOutputs u;                     // combined standard uncertainty of each output
  std::vector<UncertaintySource> sources; // every source with u > 0, in the order above
};

// Solves the pair at the conditions and propagates the uncertainties. Errors: the solve's own
// (as solve()), or an uncertainty outside its accepted range (field "u(<input>)", e.g.
// "u(alkalinity)", message with the accepted range; front ends rename the field to
// their option or label).
Result<UncertainState> solve_with_uncertainty(const Conditions& conditions, const InputPair& inputs,
                                              const InputUncertainties& uncertainties);

// Water of the given alkalinity settled with air of air_co2_ppm (as equilibrate_with_air), with
// the uncertainty from u.first (alkalinity, umol/kg), salinity, temperature and the constants;
// the air's CO2 is taken as exact (u.second is ignored). Propagated as the pair alkalinity + the
// air's pCO2, so salinity and temperature move the state at that pCO2 rather than at that CO2
// mole fraction (their small effect on the water vapour pressure is left out).
Result<UncertainState> equilibrate_with_air_with_uncertainty(const Conditions& conditions,
                                                             double alkalinity_umol_kg,
                                                             double air_co2_ppm,
                                                             InputUncertainties uncertainties);

}  // namespace tw::carbonate
