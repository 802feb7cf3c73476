// A salt mix's own composition on the command line (issue 18), offered the same way by `chem`
// and `buffer`: measured total boron in place of the salinity-scaled value, measured magnesium,
// and the Mg/Ca correction of the constants (Hain et al. 2015), off by default.
#pragma once

#include <optional>
#include <string>

#include <CLI/CLI.hpp>

#include "option_rules.hpp"
#include "tidewright/carbonate/carbonate.hpp"

namespace tw::shell {

struct SaltMixOptions {
  std::optional<double> total_boron, magnesium;
  std::string total_boron_unit = "umol/kg", magnesium_unit = "mg/L";
  bool mg_ca_correction = false;
  bool given() const { return total_boron || magnesium || mg_ca_correction; }
};

// --total-boron, --total-boron-unit, --magnesium, --magnesium-unit, --mg-ca-correction.
void add_salt_mix_options(CLI::App& command, SaltMixOptions& options);

// The options into the conditions, each value refused in the unit the user typed (with the
// range in that unit). density_kg_l converts mg/L.
void apply_salt_mix(const SaltMixOptions& options, double density_kg_l, carbonate::Conditions& conditions);

// The same into the values a hatchery Water takes (umol/kg; nullopt when not given).
struct SaltMixValues {
  std::optional<double> total_boron_umol_kg, magnesium_umol_kg;
  bool mg_ca_correction = false;
};
SaltMixValues salt_mix_values(const SaltMixOptions& options, double density_kg_l);

// The core's field names -> these options, for errors in the user's words (option_rules.hpp).
void add_salt_mix_fields(FieldOptions& fields);

}  // namespace tw::shell
