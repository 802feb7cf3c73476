// `chem` with uncertainty: the precision options, the input uncertainties they make (kit
// defaults from core's measurement_precision.hpp where none is given), and the u / 95 % range
// parts of the text and JSON output. The numbers all come from carbonate::solve_with_uncertainty.
#pragma once

#include <optional>
#include <string>

#include <CLI/CLI.hpp>
#include <nlohmann/json.hpp>

#include "tidewright/carbonate/uncertainty.hpp"
#include "tidewright/common/units.hpp"

namespace tw::shell {

struct ChemPrecisionOptions {
  bool uncertainty = false;            // --uncertainty
  bool constants = false;              // --constants-uncertainty
  std::optional<double> alkalinity, ph, ph_conversion, calcium, salinity, temperature;
  std::optional<double> dic, pco2, fco2, carbonate;
  std::optional<double> magnesium, total_boron;  // a salt mix's measured composition
  bool any_given() const;              // a precision option was given (implies --uncertainty)
  bool wanted() const { return uncertainty || constants || any_given(); }
};

void add_precision_options(CLI::App& cmd, ChemPrecisionOptions& o);

// What the user measured in, for converting and wording precisions.
struct ChemUnits {
  units::AlkalinityUnit alkalinity = units::AlkalinityUnit::DKH;
  units::ConcentrationUnit calcium = units::ConcentrationUnit::MgPerL;
  units::ConcentrationUnit magnesium = units::ConcentrationUnit::MgPerL;
  units::ConcentrationUnit total_boron = units::ConcentrationUnit::UmolPerKg;
  bool fahrenheit = false;
  double density_kg_l = 1.0;
};

// The input uncertainties in the solver's units: defaults of the kit table, replaced by each
// precision option given (checked against the table's accepted range, in the user's unit).
// Throws CommandError naming the option.
carbonate::InputUncertainties input_uncertainties(const ChemPrecisionOptions& o,
                                                  const carbonate::Conditions& conditions,
                                                  const carbonate::InputPair& pair,
                                                  const ChemUnits& units);

// Solves with uncertainty; an error on an uncertainty names the precision option.
carbonate::UncertainState solve_uncertain(const carbonate::Conditions& conditions,
                                          const carbonate::InputPair& pair,
                                          const carbonate::InputUncertainties& u);

std::string uncertainty_text(const carbonate::UncertainState& s, const ChemUnits& units);
nlohmann::json uncertainty_json(const carbonate::UncertainState& s);

}  // namespace tw::shell
