// `chem` with uncertainty (chem_uncertainty.hpp): precision options -> input uncertainties ->
// carbonate::solve_with_uncertainty -> the u and 95 % range lines of the text and JSON output.
#include "chem_uncertainty.hpp"
#include "option_rules.hpp"

#include <algorithm>
#include <cmath>
#include <iterator>
#include <vector>

#include <fmt/format.h>

#include "commands.hpp"
#include "tidewright/carbonate/measurement_precision.hpp"

namespace tw::shell {
namespace {

namespace tc = carbonate;
using P = journal::Parameter;

// The precision options that set the core's uncertainty fields ("u(ph)" -> "--ph-precision").
const FieldOptions kPrecisionOptions = {
    {"u(alkalinity)", "--alkalinity-precision"}, {"u(dic)", "--dic-precision"},
    {"u(ph)", "--ph-precision"},                 {"u(pco2)", "--pco2-precision"},
    {"u(fco2)", "--fco2-precision"},             {"u(co3)", "--carbonate-precision"},
    {"u(ph_scale_conversion)", "--ph-conversion-precision"},
    {"u(salinity)", "--salinity-precision"},     {"u(temperature_c)", "--temperature-precision"},
    {"u(calcium_umol_kg)", "--calcium-precision"},
    {"u(magnesium_umol_kg)", "--magnesium-precision"}, {"u(total_boron_umol_kg)", "--total-boron-precision"}};

// Checks a precision given in the user's unit against the table's range (canonical unit),
// wording a refusal in the user's unit. to_canonical: factor from the user's unit.
void check_in_unit(P parameter, double value, double to_canonical, const std::string& unit,
                   const std::string& option) {
  if (tc::check_precision(parameter, value * to_canonical, option)) return;
  const auto d = tc::default_precision(parameter);
  throw CommandError(fmt::format(
      "{} {:g}{}{} is outside the accepted range 0 to {:.4g}{}{} (one standard deviation; "
      "typical of a {}: {:.3g}{}{})",
      option, value, unit.empty() ? "" : " ", unit, d->maximum / to_canonical, unit.empty() ? "" : " ",
      unit, d->instrument, d->typical / to_canonical, unit.empty() ? "" : " ", unit));
}

std::string fixed(double v, int decimals) { return fmt::format("{:.{}f}", v, decimals); }

}  // namespace

bool ChemPrecisionOptions::any_given() const {
  return alkalinity || ph || ph_conversion || calcium || salinity || temperature || dic || pco2 ||
         fco2 || carbonate || magnesium || total_boron;
}

void add_precision_options(CLI::App& cmd, ChemPrecisionOptions& o) {
  cmd.add_flag("--uncertainty", o.uncertainty,
               "Show each output's standard uncertainty and 95 % range (kit defaults for the "
               "precisions not given); with --batch, add u_<column> columns");
  cmd.add_flag("--constants-uncertainty", o.constants,
               "Count the constants' uncertainties too (Orr et al. 2018: pK1 0.0075, pK2 0.015, ...)");
  cmd.add_option("--alkalinity-precision", o.alkalinity,
                 "Alkalinity test's standard uncertainty, in --alkalinity-unit (kit: 0.2-0.5 dKH)");
  cmd.add_option("--ph-precision", o.ph, "pH reading's standard uncertainty (hobby meter: 0.05-0.1)");
  cmd.add_option("--ph-conversion-precision", o.ph_conversion,
                 "Uncertainty of converting --ph to the total scale (nbs default 0.03)");
  cmd.add_option("--calcium-precision", o.calcium, "Calcium test's standard uncertainty, in --calcium-unit (kit: 10-20 mg/L)");
  cmd.add_option("--magnesium-precision", o.magnesium,
                 "Magnesium test's standard uncertainty, in --magnesium-unit (kit: 25-50 mg/L); counts "
                 "with --mg-ca-correction");
  cmd.add_option("--total-boron-precision", o.total_boron,
                 "Measured total boron's standard uncertainty, in --total-boron-unit (default 5 % of it)");
  cmd.add_option("--salinity-precision", o.salinity, "Salinity's standard uncertainty (default 0.5)");
  cmd.add_option("--temperature-precision", o.temperature,
                 "Temperature's standard uncertainty, in the unit of the temperature given (default 0.2 C)");
  cmd.add_option("--dic-precision", o.dic, "DIC's standard uncertainty [umol/kg] (default 0)");
  cmd.add_option("--pco2-precision", o.pco2, "pCO2's standard uncertainty [uatm] (default 0)");
  cmd.add_option("--fco2-precision", o.fco2, "fCO2's standard uncertainty [uatm] (default 0)");
  cmd.add_option("--carbonate-precision", o.carbonate, "CO3's standard uncertainty [umol/kg] (default 0)");
}

tc::InputUncertainties input_uncertainties(const ChemPrecisionOptions& o, const tc::Conditions& conditions,
                                           const tc::InputPair& pair, const ChemUnits& un) {
  tc::InputUncertainties u = tc::default_input_uncertainties(conditions, pair);
  const auto given = [&](tc::Quantity q) { return pair.first.quantity == q || pair.second.quantity == q; };
  const auto set = [&](tc::Quantity q, double value) {
    (pair.first.quantity == q ? u.first : u.second) = value;
  };
  const auto needs = [&](const std::optional<double>& option, tc::Quantity q, const char* name,
                         const char* input) {
    if (option && !given(q)) throw CommandError(fmt::format("{} needs {}", name, input));
  };
  needs(o.alkalinity, tc::Quantity::Alkalinity, "--alkalinity-precision", "--alkalinity");
  needs(o.ph, tc::Quantity::PH, "--ph-precision", "--ph");
  needs(o.ph_conversion, tc::Quantity::PH, "--ph-conversion-precision", "--ph");
  needs(o.dic, tc::Quantity::DIC, "--dic-precision", "--dic");
  needs(o.pco2, tc::Quantity::PCO2, "--pco2-precision", "--pco2");
  needs(o.fco2, tc::Quantity::FCO2, "--fco2-precision", "--fco2");
  needs(o.carbonate, tc::Quantity::Carbonate, "--carbonate-precision", "--carbonate");
  if (o.calcium && !conditions.calcium_umol_kg) throw CommandError("--calcium-precision needs --calcium");
  if (o.magnesium && !(conditions.magnesium_umol_kg && conditions.mg_ca_correction))
    throw CommandError("--magnesium-precision needs --magnesium and --mg-ca-correction (magnesium is read by nothing else)");
  if (o.total_boron && !conditions.total_boron_umol_kg)
    throw CommandError("--total-boron-precision needs --total-boron");

  if (o.alkalinity) {
    const double umol_per_unit = units::alkalinity_to_umol_kg(1.0, un.alkalinity, un.density_kg_l);
    const double dkh_per_unit =
        units::alkalinity_from_umol_kg(umol_per_unit, units::AlkalinityUnit::DKH, un.density_kg_l);
    check_in_unit(P::Alkalinity, *o.alkalinity, dkh_per_unit, units::to_string(un.alkalinity),
                  "--alkalinity-precision");
    set(tc::Quantity::Alkalinity, *o.alkalinity * umol_per_unit);
  }
  if (o.ph) {
    check_in_unit(P::PH, *o.ph, 1.0, "", "--ph-precision");
    set(tc::Quantity::PH, *o.ph);
  }
  if (o.ph_conversion) {
    if (auto s = check_range("--ph-conversion-precision", *o.ph_conversion, 0.0, tc::kMaxUncertaintyPh, ""); !s)
      throw CommandError(s.error().message);
    u.ph_scale_conversion = *o.ph_conversion;
  }
  // A kit's precision in the unit its value was given in, checked against the table's range in
  // mg/L, in umol/kg for the solver.
  const auto ion_precision = [&](P parameter, units::Ion ion, units::ConcentrationUnit unit, double value,
                                 const char* option) {
    const double umol_per_unit = units::ion_to_umol_kg(1.0, unit, ion, un.density_kg_l);
    const double mg_l_per_unit =
        units::ion_from_umol_kg(umol_per_unit, units::ConcentrationUnit::MgPerL, ion, un.density_kg_l);
    check_in_unit(parameter, value, mg_l_per_unit, units::to_string(unit), option);
    return value * umol_per_unit;
  };
  if (o.calcium)
    u.calcium_umol_kg = ion_precision(P::Calcium, units::Ion::Calcium, un.calcium, *o.calcium, "--calcium-precision");
  if (o.magnesium)
    u.magnesium_umol_kg =
        ion_precision(P::Magnesium, units::Ion::Magnesium, un.magnesium, *o.magnesium, "--magnesium-precision");
  // Boron is no kit test: its accepted range is the core's, a share of the measured value,
  // worded here in the unit the boron was given in.
  if (o.total_boron) {
    const double umol_per_unit = units::ion_to_umol_kg(1.0, un.total_boron, units::Ion::Boron, un.density_kg_l);
    const double max = tc::kMaxUncertaintyRelative * *conditions.total_boron_umol_kg / umol_per_unit;
    const std::string unit = units::to_string(un.total_boron);
    if (!(*o.total_boron >= 0.0 && *o.total_boron <= max))
      throw CommandError(fmt::format("--total-boron-precision {:g} {} is outside the accepted range 0 to {:.4g} {} "
                                     "(one standard deviation, up to half the measured total boron)",
                                     *o.total_boron, unit, max, unit));
    u.total_boron_umol_kg = *o.total_boron * umol_per_unit;
  }
  if (o.salinity) {
    check_in_unit(P::Salinity, *o.salinity, 1.0, "", "--salinity-precision");
    u.salinity = *o.salinity;
  }
  if (o.temperature) {
    const auto unit = un.fahrenheit ? units::TemperatureUnit::Fahrenheit : units::TemperatureUnit::Celsius;
    const double c_per_unit = units::temperature_difference_to_celsius(1.0, unit);  // a precision: no offset
    check_in_unit(P::Temperature, *o.temperature, c_per_unit, un.fahrenheit ? "F" : "C",
                  "--temperature-precision");
    u.temperature_c = *o.temperature * c_per_unit;
  }
  if (o.dic) set(tc::Quantity::DIC, *o.dic);
  if (o.pco2) set(tc::Quantity::PCO2, *o.pco2);
  if (o.fco2) set(tc::Quantity::FCO2, *o.fco2);
  if (o.carbonate) set(tc::Quantity::Carbonate, *o.carbonate);
  if (o.constants) u.constants = tc::ConstantUncertainties{};
  return u;
}

tc::UncertainState solve_uncertain(const tc::Conditions& conditions, const tc::InputPair& pair,
                                   const tc::InputUncertainties& u) {
  return or_fail(tc::solve_with_uncertainty(conditions, pair, u), kPrecisionOptions);
}

std::string uncertainty_text(const tc::UncertainState& s, const ChemUnits& un) {
  std::string out;
  const auto put = std::back_inserter(out);
  fmt::format_to(put, "Uncertainty: value +/- u (one standard deviation), and the 95 % range "
                      "(+/- 1.96 u, a linear approximation; Orr et al. 2018)\n");
  struct Line { const char* label; double tc::CarbonateOutputs::*field; const char* unit; double scale; };
  const double alk_scale = units::alkalinity_from_umol_kg(1.0, un.alkalinity, un.density_kg_l);
  const std::string alk_unit = units::to_string(un.alkalinity);
  const Line lines[] = {{"pH total", &tc::CarbonateOutputs::ph_total, "", 1.0},
                        {"pH NBS", &tc::CarbonateOutputs::ph_nbs, "", 1.0},
                        {"Alk", &tc::CarbonateOutputs::alkalinity_umol_kg, alk_unit.c_str(), alk_scale},
                        {"DIC", &tc::CarbonateOutputs::dic_umol_kg, "umol/kg", 1.0},
                        {"pCO2", &tc::CarbonateOutputs::pco2_uatm, "uatm", 1.0},
                        {"CO3--", &tc::CarbonateOutputs::co3_umol_kg, "umol/kg", 1.0},
                        {"Omega aragonite", &tc::CarbonateOutputs::omega_aragonite, "", 1.0},
                        {"Omega calcite", &tc::CarbonateOutputs::omega_calcite, "", 1.0},
                        {"Revelle factor", &tc::CarbonateOutputs::revelle_factor, "", 1.0}};
  const tc::CarbonateOutputs v = tc::outputs_of(s.state);
  for (const Line& l : lines) {
    const double value = v.*l.field * l.scale, u = s.u.*l.field * l.scale;
    const bool is_ph = std::string(l.label).rfind("pH", 0) == 0;
    const tc::Range r = tc::range95(value, u, is_ph ? -1e300 : 0.0);
    const int d = tc::decimals_for_uncertainty(u);
    const std::string unit = *l.unit ? std::string(" ") + l.unit : "";
    if (tc::taken_as_exact(value, u)) {
      fmt::format_to(put, "  {:<16}{:.5g}{}   (fixed by an input taken as exact)\n", l.label, value, unit);
      continue;
    }
    fmt::format_to(put, "  {:<16}{} +/- {}{}   95 %: between {} and {}{}\n", l.label, fixed(value, d),
                   fixed(u, d), unit, fixed(r.low, d), fixed(r.high, d), unit);
  }
  // Where the uncertainty of pH and Omega comes from: share of the variance by source.
  const auto shares = [&](double tc::CarbonateOutputs::*field, const char* label) {
    const double total = s.u.*field * s.u.*field;
    if (!(total > 0.0)) return;
    std::vector<std::pair<double, std::string>> parts;
    for (const auto& src : s.sources) {
      const double c = src.contribution.*field;
      parts.emplace_back(c * c / total, src.name);
    }
    std::sort(parts.rbegin(), parts.rend());
    fmt::format_to(put, "  {} comes from:", label);
    for (std::size_t i = 0; i < std::min<std::size_t>(3, parts.size()); ++i)
      fmt::format_to(put, "{} {} {:.0f} %", i ? "," : "", parts[i].second, parts[i].first * 100.0);
    fmt::format_to(put, " (share of the variance)\n");
  };
  shares(&tc::CarbonateOutputs::ph_total, "u(pH total)");
  shares(&tc::CarbonateOutputs::omega_aragonite, "u(Omega aragonite)");
  fmt::format_to(put, "Precisions used (one standard deviation; kit defaults are common practice):");
  bool first = true, constants = false;
  for (const auto& src : s.sources) {
    std::string shown = fmt::format("{} {:g}", src.name, src.u);
    if (src.name == "alkalinity") {
      shown = fmt::format("alkalinity {:.3g} {}", src.u * alk_scale, alk_unit);
    } else if (src.name == "ph") {
      shown = fmt::format("pH {:g}", src.u);
    } else if (src.name == "ph_scale_conversion") {
      shown = fmt::format("pH scale to total {:g}", src.u);
    } else if (src.name == "temperature_c") {
      shown = un.fahrenheit ? fmt::format("temperature {:.3g} F", src.u / units::temperature_difference_to_celsius(1.0, units::TemperatureUnit::Fahrenheit))
                            : fmt::format("temperature {:g} C", src.u);
    } else if (src.name == "calcium_umol_kg") {
      shown = fmt::format("calcium {:.3g} {}", units::ion_from_umol_kg(src.u, un.calcium, units::Ion::Calcium,
                                                                       un.density_kg_l),
                          units::to_string(un.calcium));
    } else if (src.name == "magnesium_umol_kg" || src.name == "total_boron_umol_kg") {
      const bool mg = src.name == "magnesium_umol_kg";
      const units::ConcentrationUnit unit = mg ? un.magnesium : un.total_boron;
      shown = fmt::format("{} {:.3g} {}", mg ? "magnesium" : "total boron",
                          units::ion_from_umol_kg(src.u, unit, mg ? units::Ion::Magnesium : units::Ion::Boron,
                                                  un.density_kg_l),
                          units::to_string(unit));
    } else if (src.name.rfind("u", 0) != 0 && src.name.find("_umol_kg") != std::string::npos) {
      shown = fmt::format("{} {:g} umol/kg", src.name.substr(0, src.name.find("_umol_kg")), src.u);
    } else if (src.name == "dic" || src.name == "co3") {
      shown = fmt::format("{} {:g} umol/kg", src.name == "dic" ? "DIC" : "CO3", src.u);
    } else if (src.name == "pco2" || src.name == "fco2") {
      shown = fmt::format("{} {:g} uatm", src.name == "pco2" ? "pCO2" : "fCO2", src.u);
    }
    constants = constants || src.name == "pk1";
    fmt::format_to(put, "{} {}", first ? "" : ",", shown);
    first = false;
  }
  if (s.sources.empty()) fmt::format_to(put, " none (every input taken as exact)");
  fmt::format_to(put, "\n  Constants: {}\n",
                 constants ? "their uncertainties counted (Orr et al. 2018)"
                           : "taken as exact (--constants-uncertainty counts them)");
  return out;
}

nlohmann::json uncertainty_json(const tc::UncertainState& s) {
  nlohmann::json outputs = nlohmann::json::object();
  const tc::CarbonateOutputs v = tc::outputs_of(s.state);
  for (const auto& f : tc::kOutputFields) {
    const tc::Range r = tc::range95(v.*f.output, s.u.*f.output, tc::output_floor(f));
    outputs[f.name] = {{"u", s.u.*f.output}, {"low_95", r.low}, {"high_95", r.high}};
  }
  nlohmann::json sources = nlohmann::json::array();
  for (const auto& src : s.sources) {
    nlohmann::json contribution = nlohmann::json::object();
    for (const auto& f : tc::kOutputFields) contribution[f.name] = src.contribution.*f.output;
    sources.push_back({{"name", src.name}, {"u", src.u}, {"contribution", contribution}});
  }
  return {{"method", "linear propagation (Orr et al. 2018), derivatives by central differences of the solver"},
          {"coverage_factor_95", tc::kCoverageFactor95},
          {"outputs", outputs},
          {"sources", sources}};
}

}  // namespace tw::shell
