// A salt mix's own composition on the command line: see salt_mix_options.hpp.
#include "salt_mix_options.hpp"

#include <cmath>

#include "commands.hpp"
#include "option_rules.hpp"
#include "tidewright/common/ranges.hpp"
#include "tidewright/common/units.hpp"

namespace tw::shell {
namespace {

// A measured ion in the unit typed, refused there with the range in that unit.
double measured_ion(const char* option, double value, const std::string& unit_text, units::Ion ion,
                    const ranges::Range& range_umol_kg, double density) {
  const auto unit = or_fail(units::concentration_unit_from_string(unit_text));
  const double hi = units::ion_from_umol_kg(range_umol_kg.hi, unit, ion, density);
  const double shown_hi = unit == units::ConcentrationUnit::UmolPerKg ? hi : std::floor(hi * 10.0) / 10.0;
  if (auto r = check_range(option, value, units::ion_from_umol_kg(range_umol_kg.lo, unit, ion, density), shown_hi,
                           units::to_string(unit));
      !r)
    throw CommandError(r.error().message);
  return units::ion_to_umol_kg(value, unit, ion, density);
}

}  // namespace

void add_salt_mix_options(CLI::App& command, SaltMixOptions& o) {
  command.add_option("--total-boron", o.total_boron,
                     "Measured total boron, in --total-boron-unit, in place of the salinity-scaled value (salt mixes)");
  command.add_option("--total-boron-unit", o.total_boron_unit, "umol/kg, mmol/kg or mg/L (of boron, B)")
      ->default_str("umol/kg");
  command.add_option("--magnesium", o.magnesium, "Measured magnesium, in --magnesium-unit (read by --mg-ca-correction)");
  command.add_option("--magnesium-unit", o.magnesium_unit, "mg/L, mmol/kg or umol/kg")->default_str("mg/L");
  command.add_flag("--mg-ca-correction", o.mg_ca_correction,
                   "Correct the constants for the water's Mg and Ca (Hain et al. 2015, MyAMI polynomial; needs "
                   "--magnesium and --calcium, salinity 30-40, 0-40 C). Off by default");
}

SaltMixValues salt_mix_values(const SaltMixOptions& o, double density) {
  SaltMixValues v;
  if (o.total_boron)
    v.total_boron_umol_kg = measured_ion("--total-boron", *o.total_boron, o.total_boron_unit, units::Ion::Boron,
                                         ranges::kTotalBoronUmolKg, density);
  if (o.magnesium)
    v.magnesium_umol_kg = measured_ion("--magnesium", *o.magnesium, o.magnesium_unit, units::Ion::Magnesium,
                                       ranges::kMagnesiumUmolKg, density);
  v.mg_ca_correction = o.mg_ca_correction;
  return v;
}

void add_salt_mix_fields(FieldOptions& fields) {
  fields.push_back({"total_boron_umol_kg", "--total-boron"});
  fields.push_back({"magnesium_umol_kg", "--magnesium"});
  fields.push_back({"mg_ca_correction", "--mg-ca-correction"});
}

void apply_salt_mix(const SaltMixOptions& o, double density, carbonate::Conditions& conditions) {
  const SaltMixValues v = salt_mix_values(o, density);
  conditions.total_boron_umol_kg = v.total_boron_umol_kg;
  conditions.magnesium_umol_kg = v.magnesium_umol_kg;
  conditions.mg_ca_correction = v.mg_ca_correction;
}

}  // namespace tw::shell
