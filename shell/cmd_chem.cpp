// `tidewright chem`: one carbonate state from options, or a CSV batch (--batch FILE|-).
#include <algorithm>
#include <cmath>
#include <thread>
#include <cstdio>
#include <iterator>
#include <memory>
#include <optional>

#include <fmt/format.h>
#include <nlohmann/json.hpp>

#include "chem_uncertainty.hpp"
#include "commands.hpp"
#include "path_options.hpp"
#include "option_rules.hpp"
#include "salt_mix_options.hpp"
#include "tidewright/common/ranges.hpp"
#include "batch_stream.hpp"
#include "file_io.hpp"
#include "tidewright/carbonate/carbonate.hpp"
#include "tidewright/carbonate/carbonate_batch.hpp"
#include "tidewright/seawater/seawater.hpp"
#include "tidewright/common/units.hpp"

namespace tw::shell {
namespace {

struct ChemOptions {
  std::optional<double> alkalinity, dic, ph, pco2, fco2, carbonate, air_co2_ppm;
  std::string alkalinity_unit = "dKH";
  std::string ph_scale;
  std::optional<double> salinity, specific_gravity;
  std::optional<double> temperature_c, temperature_f;
  std::optional<double> calcium;
  std::string calcium_unit = "mg/L";
  SaltMixOptions salt_mix;  // measured boron and magnesium, the Mg/Ca correction (issue 18)
  double phosphate = 0, silicate = 0;
  std::string k1k2 = "lueker2000", boron = "uppstrom1974";
  std::string fluoride = "perezfraga1987", conventions = "co2sys";
  bool json = false;
  std::string batch, out;
  int threads = 1;
  ChemPrecisionOptions precision;
};

ConstantChoices parse_choices(const ChemOptions& o) { return constant_choices({o.k1k2, o.boron, o.fluoride, o.conventions}); }

TemperatureGiven temperature_given(const ChemOptions& o) {
  return temperature_from_options(o.temperature_c, o.temperature_f, "--temperature", "--temperature-f", 25.0);
}

// The core's field names -> chem's options (errors name what the user typed).
FieldOptions chem_fields(const ChemOptions& o) {
  FieldOptions fields{{"salinity", o.specific_gravity ? "--specific-gravity" : "--salinity"},
                      {"specific_gravity", "--specific-gravity"},
                      {"temperature_c", o.temperature_f ? "--temperature-f" : "--temperature"},
                      {"calcium_umol_kg", "--calcium"},
                      {"phosphate_umol_kg", "--phosphate"},
                      {"silicate_umol_kg", "--silicate"},
                      {"air_co2_ppm", "--air-co2"}};
  add_salt_mix_fields(fields);
  return fields;
}

double salinity(const ChemOptions& o) {
  if (o.salinity && o.specific_gravity) throw CommandError("give --salinity or --specific-gravity, not both");
  if (o.specific_gravity) {
    // specific gravity is read at its own reference temperatures (25/25 C)
    return or_fail(seawater::salinity_from_specific_gravity(*o.specific_gravity), chem_fields(o));
  }
  return o.salinity.value_or(35.0);
}

// The Mg/Ca correction as applied (null when not asked for): the factors and the note.
nlohmann::json mg_ca_json(const carbonate::Conditions& c) {
  if (!c.mg_ca_correction) return nullptr;
  const auto k = carbonate::compute_constants(c);  // already computed once without error
  if (!k || !k->mg_ca_correction) return nullptr;
  const carbonate::MgCaCorrection& m = *k->mg_ca_correction;
  return {{"magnesium_mol_kg_at_salinity_35", m.magnesium_mol_kg_s35},
          {"calcium_mol_kg_at_salinity_35", m.calcium_mol_kg_s35},
          {"factors", {{"k0", m.factors.k0}, {"k1", m.factors.k1}, {"k2", m.factors.k2}, {"kb", m.factors.kb},
                       {"kw", m.factors.kw}, {"ks", m.factors.ks}, {"ksp", m.factors.ksp}}},
          {"note", m.note}};
}

nlohmann::json state_json(const carbonate::CarbonateState& s, const carbonate::Conditions& c) {
  return {{"salinity", c.salinity},
          {"temperature_c", c.temperature_c},
          {"ph_total", s.ph_total},
          {"ph_sws", s.ph_sws},
          {"ph_free", s.ph_free},
          {"ph_nbs", s.ph_nbs},
          {"alkalinity_umol_kg", s.alkalinity_umol_kg},
          {"dic_umol_kg", s.dic_umol_kg},
          {"pco2_uatm", s.pco2_uatm},
          {"fco2_uatm", s.fco2_uatm},
          {"co2_umol_kg", s.co2_umol_kg},
          {"hco3_umol_kg", s.hco3_umol_kg},
          {"co3_umol_kg", s.co3_umol_kg},
          {"borate_umol_kg", s.borate_umol_kg},
          {"hydroxide_umol_kg", s.hydroxide_umol_kg},
          {"omega_aragonite", s.omega_aragonite},
          {"omega_calcite", s.omega_calcite},
          {"revelle_factor", s.revelle_factor},
          {"buffer_capacity_umol_kg_per_ph", s.buffer_capacity_umol_kg},
          {"iterations", s.iterations},
          {"calcium_source", carbonate::calcium_source(c).note},
          {"total_boron_umol_kg", carbonate::boron_source(c).boron_umol_kg},
          {"boron_source", carbonate::boron_source(c).note},
          {"mg_ca_correction", mg_ca_json(c)},
          {"warnings", s.warnings}};
}

std::string state_text(const carbonate::CarbonateState& s, const carbonate::Conditions& c, double density_kg_l) {
  std::string out;
  const auto put = std::back_inserter(out);
  const double dkh = units::alkalinity_from_umol_kg(s.alkalinity_umol_kg, units::AlkalinityUnit::DKH, density_kg_l);
  fmt::format_to(put, "Water   salinity {:.2f}, {:.2f} C (density {:.5f} kg/L)\n", c.salinity,
             c.temperature_c, density_kg_l);
  fmt::format_to(put, "pH      {:.4f} total | {:.4f} seawater | {:.4f} free | {:.4f} NBS\n", s.ph_total,
             s.ph_sws, s.ph_free, s.ph_nbs);
  fmt::format_to(put, "Alk     {:.1f} umol/kg ({:.2f} dKH)\n", s.alkalinity_umol_kg, dkh);
  fmt::format_to(put, "DIC     {:.1f} umol/kg\n", s.dic_umol_kg);
  fmt::format_to(put, "CO2     pCO2 {:.1f} uatm, fCO2 {:.1f} uatm, CO2* {:.2f} umol/kg\n", s.pco2_uatm,
             s.fco2_uatm, s.co2_umol_kg);
  fmt::format_to(put, "Species HCO3- {:.1f}, CO3-- {:.1f}, B(OH)4- {:.1f}, OH- {:.2f} umol/kg\n",
             s.hco3_umol_kg, s.co3_umol_kg, s.borate_umol_kg, s.hydroxide_umol_kg);
  fmt::format_to(put, "Omega   aragonite {:.3f}, calcite {:.3f}\n", s.omega_aragonite, s.omega_calcite);
  // Where calcium came from; at low salinity the same sentence is among the warnings.
  const carbonate::CalciumSource ca = carbonate::calcium_source(c);
  if (!ca.low_salinity) fmt::format_to(put, "Note    {}\n", ca.note);
  // Measured boron is said where it was used; without it the output is as before.
  if (const carbonate::BoronSource b = carbonate::boron_source(c); b.measured) fmt::format_to(put, "Note    {}\n", b.note);
  fmt::format_to(put, "Buffer  Revelle factor {:.2f}, buffer capacity {:.1f} umol/kg per pH unit\n",
             s.revelle_factor, s.buffer_capacity_umol_kg);
  for (const auto& w : s.warnings) {
    fmt::format_to(put, "Warning {}\n", w);
    if (w == ca.note) fmt::format_to(put, "        (give it with --calcium, in --calcium-unit)\n");
  }
  return out;
}



ChemUnits chem_units(const ChemOptions& o, double density) {
  ChemUnits units_used;
  units_used.alkalinity = or_fail(units::alkalinity_unit_from_string(o.alkalinity_unit));
  units_used.calcium = or_fail(units::concentration_unit_from_string(o.calcium_unit));
  units_used.magnesium = or_fail(units::concentration_unit_from_string(o.salt_mix.magnesium_unit));
  units_used.total_boron = or_fail(units::concentration_unit_from_string(o.salt_mix.total_boron_unit));
  units_used.fahrenheit = temperature_given(o).in_fahrenheit;
  units_used.density_kg_l = density;
  return units_used;
}

void write_uncertain(const ChemOptions& o, const carbonate::Conditions& conditions, double density,
                     const carbonate::UncertainState& s, const ChemUnits& units_used) {
  if (o.json) {
    nlohmann::json j = state_json(s.state, conditions);
    j["uncertainty"] = uncertainty_json(s);
    write_output(o.out, j.dump(2) + "\n");
  } else {
    write_output(o.out, state_text(s.state, conditions, density) + uncertainty_text(s, units_used));
  }
}

void run_batch(const ChemOptions& o) {
  const ConstantChoices choices = parse_choices(o);
  carbonate::BatchOptions options;
  options.k1k2 = choices.k1k2;
  options.boron = choices.boron;
  options.fluoride = choices.fluoride;
  options.convention = choices.convention;
  if (o.precision.any_given())
    throw CommandError("with --batch, give precisions per row in u_ columns (u_alkalinity_umol_kg, "
                       "u_ph, u_salinity, ...; empty: the kit default), with --uncertainty");
  options.with_uncertainty = o.precision.wanted();
  options.constants_uncertainty = o.precision.constants;
  options.mg_ca_correction = o.salt_mix.mg_ca_correction;
  if (o.salt_mix.total_boron || o.salt_mix.magnesium)
    throw CommandError("with --batch, give measured boron and magnesium per row in the total_boron_umol_kg and "
                       "magnesium_umol_kg columns");
  if (o.threads < 0 || o.threads > 64) throw CommandError(fmt::format("--threads {} is outside the accepted range 0 to 64", o.threads));
  const int threads = o.threads == 0 ? static_cast<int>(std::max(1u, std::thread::hardware_concurrency())) : o.threads;
  const BatchCounts counts = run_chem_batch(o.batch, o.out, options, threads);
  // Every row is written; a row that failed still makes the exit status non-zero, as in
  // `tidewright salinity --batch`, so scripts notice.
  if (counts.failed > 0) {
    throw CommandError(fmt::format("{} of {} rows could not be computed (see the warnings column)",
                                   counts.failed, counts.rows));
  }
}

// A measured ion in the user's unit to umol/kg, refused in that unit (so the message speaks it)
// outside the range table's span (kept per kg there; per litre it converts with the density).
void run_single(const ChemOptions& o) {
  carbonate::Conditions conditions;
  const FieldOptions fields = chem_fields(o);
  const TemperatureGiven temperature = temperature_given(o);
  conditions.temperature_c = temperature.celsius;
  conditions.salinity = salinity(o);
  // The water's range first (common/ranges.hpp): the density below needs it (EOS-80).
  check_temperature(temperature);
  if (auto r = ranges::check("salinity", conditions.salinity, ranges::kSalinityForCarbonateChemistry); !r) fail(r.error(), fields);
  const ConstantChoices choices = parse_choices(o);
  conditions.k1k2 = choices.k1k2;
  conditions.boron = choices.boron;
  conditions.fluoride = choices.fluoride;
  conditions.convention = choices.convention;
  conditions.phosphate_umol_kg = o.phosphate;
  conditions.silicate_umol_kg = o.silicate;
  const double density = seawater::density_kg_per_l(conditions.salinity, conditions.temperature_c);
  if (o.calcium) {
    auto unit = or_fail(units::concentration_unit_from_string(o.calcium_unit));
    conditions.calcium_umol_kg = units::ion_to_umol_kg(*o.calcium, unit, units::Ion::Calcium, density);
  }
  apply_salt_mix(o.salt_mix, density, conditions);
  auto constants = or_fail(carbonate::compute_constants(conditions), fields);

  std::vector<carbonate::Measurement> given;
  if (o.alkalinity) {
    auto unit = or_fail(units::alkalinity_unit_from_string(o.alkalinity_unit));
    // Refuse in the user's own unit, so the message speaks it (dKH, meq/L ...).
    const double max_in_unit = units::alkalinity_from_umol_kg(carbonate::kAlkalinityMaxUmolKg, unit, density);
    auto in_range = check_range("--alkalinity", *o.alkalinity, 0.0, std::floor(max_in_unit), units::to_string(unit));
    if (!in_range) throw CommandError(in_range.error().message);
    given.push_back({carbonate::Quantity::Alkalinity, units::alkalinity_to_umol_kg(*o.alkalinity, unit, density)});
  }
  if (o.dic) given.push_back({carbonate::Quantity::DIC, *o.dic});
  if (o.ph) given.push_back({carbonate::Quantity::PH, *o.ph});
  if (o.pco2) given.push_back({carbonate::Quantity::PCO2, *o.pco2});
  if (o.fco2) given.push_back({carbonate::Quantity::FCO2, *o.fco2});
  if (o.carbonate) given.push_back({carbonate::Quantity::Carbonate, *o.carbonate});

  carbonate::CarbonateState state;
  if (o.air_co2_ppm) {
    if (given.size() != 1 || given[0].quantity != carbonate::Quantity::Alkalinity) {
      throw CommandError("--air-co2 needs --alkalinity and no other carbonate input");
    }
    if (o.precision.wanted()) {
      // The pair alkalinity + the air's pCO2 (exact): the precisions of alkalinity, S, T apply.
      const carbonate::InputPair as_pair{given[0], {carbonate::Quantity::PCO2, carbonate::air_pco2_uatm(constants, *o.air_co2_ppm)}};
      ChemUnits units_used = chem_units(o, density);
      const auto u = input_uncertainties(o.precision, conditions, as_pair, units_used);
      auto s = carbonate::equilibrate_with_air_with_uncertainty(conditions, given[0].value, *o.air_co2_ppm, u);
      if (!s) throw CommandError(s.error().message);
      write_uncertain(o, conditions, density, *s, units_used);
      return;
    }
    state = or_fail(carbonate::equilibrate_with_air(constants, given[0].value, *o.air_co2_ppm), fields);
  } else {
    if (given.size() != 2) {
      throw CommandError(fmt::format(
          "{} carbonate inputs given; exactly two of --alkalinity, --dic, --ph, --pco2, --fco2, "
          "--carbonate are needed (or --alkalinity with --air-co2)", given.size()));
    }
    carbonate::InputPair pair{given[0], given[1], carbonate::PhScale::Total};
    if (o.ph) {
      if (o.ph_scale.empty()) throw CommandError("--ph-scale is required with --ph (total, sws, free or nbs)");
      pair.ph_scale = or_fail(carbonate::ph_scale_from_string(o.ph_scale));
    }
    if (o.precision.wanted()) {
      const ChemUnits units_used = chem_units(o, density);
      const auto u = input_uncertainties(o.precision, conditions, pair, units_used);
      write_uncertain(o, conditions, density, solve_uncertain(conditions, pair, u), units_used);
      return;
    }
    state = or_fail(carbonate::solve(constants, pair));
  }
  write_output(o.out, o.json ? state_json(state, conditions).dump(2) + "\n" : state_text(state, conditions, density));
}

}  // namespace

void register_chem(CLI::App& app) {
  auto o = std::make_shared<ChemOptions>();
  CLI::App* cmd = app.add_subcommand("chem", "Carbonate chemistry of one water sample, or a CSV batch");
  cmd->footer(
      "Give exactly two of the carbonate inputs (or --alkalinity with --air-co2).\n"
      "Examples:\n"
      "  tidewright chem --alkalinity 8.2 --ph 8.15 --ph-scale nbs --salinity 35 --temperature 25.5\n"
      "  tidewright chem --alkalinity 2300 --alkalinity-unit umol/kg --dic 2000 --json\n"
      "  tidewright chem --alkalinity 7.5 --air-co2 1200 --temperature 26\n"
      "  tidewright chem --batch samples.csv --out states.csv --threads 2\n"
      "  tidewright chem --alkalinity 8.2 --ph 8.15 --ph-scale nbs --uncertainty --ph-precision 0.1\n"
      "Batch CSV columns: id, salinity, temperature_c, two of alkalinity_umol_kg, dic_umol_kg,\n"
      "ph (with ph_scale), pco2_uatm, fco2_uatm; optional calcium_umol_kg, phosphate_umol_kg,\n"
      "silicate_umol_kg, total_boron_umol_kg, magnesium_umol_kg, and per-row k1k2, boron, fluoride,\n"
      "conventions (empty: the options').\n"
      "With --uncertainty: per-row precisions u_alkalinity_umol_kg, u_dic_umol_kg, u_ph, u_pco2_uatm,\n"
      "u_fco2_uatm, u_salinity, u_temperature_c, u_calcium_umol_kg, u_ph_scale_conversion (empty:\n"
      "the kit default) and u_<column> for every output number.");
  cmd->add_option("--alkalinity", o->alkalinity, "Total alkalinity, in --alkalinity-unit");
  cmd->add_option("--alkalinity-unit", o->alkalinity_unit, "dKH, meq/L, mg/L CaCO3 or umol/kg")->default_str("dKH");
  cmd->add_option("--dic", o->dic, "Dissolved inorganic carbon [umol/kg]");
  cmd->add_option("--ph", o->ph, "pH on the scale given by --ph-scale");
  cmd->add_option("--ph-scale", o->ph_scale, "Scale of --ph: total, sws, free or nbs (hobby meters with NBS buffers: nbs)");
  cmd->add_option("--pco2", o->pco2, "CO2 partial pressure [uatm]");
  cmd->add_option("--fco2", o->fco2, "CO2 fugacity [uatm]");
  cmd->add_option("--carbonate", o->carbonate, "Carbonate ion CO3-- [umol/kg]");
  cmd->add_option("--air-co2", o->air_co2_ppm, "Room air CO2 [ppm]: water in equilibrium with it (needs --alkalinity)");
  cmd->add_option("--salinity", o->salinity, "Practical salinity (default 35)");
  cmd->add_option("--specific-gravity", o->specific_gravity, "Specific gravity at 25/25 C instead of --salinity");
  cmd->add_option("--temperature", o->temperature_c, "Temperature [C] (default 25)");
  cmd->add_option("--temperature-f", o->temperature_f, "Temperature [F]");
  cmd->add_option("--calcium", o->calcium, "Measured calcium, in --calcium-unit (default: from salinity)");
  cmd->add_option("--calcium-unit", o->calcium_unit, "mg/L, mmol/kg or umol/kg")->default_str("mg/L");
  add_salt_mix_options(*cmd, o->salt_mix);
  cmd->add_option("--phosphate", o->phosphate, "Total phosphate [umol/kg]")->default_str("0");
  cmd->add_option("--silicate", o->silicate, "Total silicate [umol/kg]")->default_str("0");
  cmd->add_option("--k1k2", o->k1k2, "Carbonic acid constants: lueker2000 or millero2010")->default_str("lueker2000");
  cmd->add_option("--boron", o->boron, "Total boron: uppstrom1974 or lee2010")->default_str("uppstrom1974");
  cmd->add_option("--fluoride", o->fluoride, "HF constant: perezfraga1987 or dicksonriley1979")->default_str("perezfraga1987");
  cmd->add_option("--conventions", o->conventions,
                  "How constants are put on the total scale: co2sys (as CO2SYS-MATLAB v3 and PyCO2SYS) "
                  "or guide2007 (as printed in Dickson et al. 2007)")->default_str("co2sys");
  cmd->add_option("--threads", o->threads, "With --batch: threads to solve rows on (0 = every core)")->default_str("1");
  add_precision_options(*cmd, o->precision);
  cmd->add_flag("--json", o->json, "Print JSON instead of text");
  cmd->add_option("--batch", o->batch, "CSV file of samples (- for stdin); see the README for its columns");
  cmd->add_option("--out", o->out, "Write the result (text, JSON or the --batch CSV) here instead of stdout")->check(non_empty_path());
  cmd->callback([o] {
    if (!o->batch.empty()) {
      run_batch(*o);
    } else {
      run_single(*o);
    }
  });
}

}  // namespace tw::shell
