// `tidewright buffer`: hatchery buffering of intake seawater (flow), of a static culture tank
// (batch), and a pump-side table for staff (table). A thin layer over tw::hatchery.
#include <cstdio>
#include <iostream>
#include <memory>
#include <optional>
#include <string>
#include <vector>

#include <fmt/format.h>
#include <nlohmann/json.hpp>

#include "chem_uncertainty.hpp"
#include "commands.hpp"
#include "option_rules.hpp"
#include "salt_mix_options.hpp"
#include "tidewright/common/ranges.hpp"
#include "tidewright/hatchery/hatchery.hpp"
#include "tidewright/hatchery/hatchery_line.hpp"
#include "tidewright/seawater/seawater.hpp"
#include "tidewright/common/units.hpp"

namespace tw::shell {
namespace {

namespace hy = tw::hatchery;
namespace cb = tw::carbonate;
using nlohmann::json;

struct BufferOptions {
  // water
  double salinity = 35.0, temperature_c = 20.0;
  std::string k1k2 = "lueker2000";
  std::optional<double> calcium;  // measured; absent = from salinity
  std::string calcium_unit = "mg/L";
  SaltMixOptions salt_mix;  // made-up water: measured boron and magnesium, the Mg/Ca correction
  std::optional<double> alkalinity, dic, ph, pco2;
  std::string alkalinity_unit = "umol/kg", ph_scale;
  // target and limits
  std::optional<double> target_omega, target_ph, target_rise;
  std::string target_ph_scale = "total", target_at = "mixing", additive = "carbonate";
  double ph_ceiling = 8.3, omega_ceiling = 5.0;
  std::string ph_ceiling_scale = "total";
  // gas exchange and stock
  std::optional<double> degas_fraction, residence_min;
  double exchange_tau_min = 30.0, air_co2_ppm = 424.6;
  double stock_temperature_c = 20.0, stock_fraction = 0.8;
  std::optional<double> stock_g_per_l;
  // mode-specific
  std::optional<double> flow, volume;
  std::string flow_unit = "L/min", volume_unit = "L", vary = "ph";
  std::optional<double> from, to;
  double step = 0.05;
  bool json = false, csv = false;
  // dosing to a confidence: the intake readings' precision (the chem options) and the probability
  ChemPrecisionOptions precision;
  std::optional<double> confidence_percent;
  // buffer line: conditioning between the intake and the tanks
  std::optional<double> mix_fraction, tank_temperature;
  double mix_salinity = 0, mix_temperature = 20, mix_alkalinity = 0, mix_dic = 0, mix_calcium = 0;
};

// Core field names -> command-line options, so that every one-line reason names the option.
const FieldOptions kFieldOptions = [] {
  FieldOptions fields = {
    {"target_alkalinity_rise", "--target-alkalinity-rise"}, {"target_omega", "--target-omega"},
    {"target_ph", "--target-ph"}, {"ph_ceiling", "--ph-ceiling"},
    {"mixing_omega_ceiling", "--omega-ceiling"}, {"degas_fraction", "--degas-fraction"},
    {"residence_time_min", "--residence-time"}, {"exchange_time_constant_min", "--exchange-time-constant"},
    {"air_co2_ppm", "--air-co2"}, {"stock_temperature_c", "--stock-temperature"},
    {"stock_g_per_l", "--stock-g-per-l"}, {"stock_fraction_of_saturation", "--stock-saturation-fraction"},
    {"volume_l", "--volume"}, {"temperature_c", "--temperature"}, {"salinity", "--salinity"},
    {"alkalinity_umol_kg", "--alkalinity"}, {"flow", "--flow"}, {"step", "--step"}, {"to", "--to"},
    {"ph", "--ph"}, {"calcium_umol_kg", "--calcium"}, {"confidence", "--confidence"},
    {"mix_fraction", "--mix-fraction"}, {"mix_salinity", "--mix-salinity"},
    {"mix_temperature_c", "--mix-temperature"}, {"mix_alkalinity", "--mix-alkalinity"}, {"mix_dic", "--mix-dic"},
    {"mix_calcium", "--mix-calcium"}, {"tank_temperature_c", "--tank-temperature"}};
  add_salt_mix_fields(fields);
  return fields;
}();

[[noreturn]] void fail(const Error& e) { shell::fail(e, kFieldOptions); }

template <class T>
T or_fail(Result<T> r) {
  return shell::or_fail(std::move(r), kFieldOptions);
}

cb::PhScale scale_of(const std::string& text, const char* option) {
  auto r = cb::ph_scale_from_string(text);
  if (!r) throw CommandError(fmt::format("{} '{}' is not known; accepted: total, sws, free, nbs", option, text));
  return *r;
}

// The carbonate readings given, in engine units; `skip` leaves out the varied one (table).
std::vector<cb::Measurement> readings(const BufferOptions& o, double density) {
  std::vector<cb::Measurement> m;
  if (o.alkalinity) {
    auto unit = units::alkalinity_unit_from_string(o.alkalinity_unit);
    if (!unit) throw CommandError("--alkalinity-unit '" + o.alkalinity_unit + "' is not known; accepted: umol/kg, meq/L, dKH, mg/L CaCO3");
    m.push_back({cb::Quantity::Alkalinity, units::alkalinity_to_umol_kg(*o.alkalinity, *unit, density)});
  }
  if (o.dic) m.push_back({cb::Quantity::DIC, *o.dic});
  if (o.ph) m.push_back({cb::Quantity::PH, *o.ph});
  if (o.pco2) m.push_back({cb::Quantity::PCO2, *o.pco2});
  return m;
}

hy::Water water_of(const BufferOptions& o, bool table) {
  hy::Water w;
  w.salinity = o.salinity;
  w.temperature_c = o.temperature_c;
  auto k1k2 = cb::k1k2_from_string(o.k1k2, "--k1k2");
  if (!k1k2) throw CommandError(k1k2.error().message);
  w.k1k2 = *k1k2;
  if (auto r = ranges::check("salinity", o.salinity, ranges::kSalinityForCarbonateChemistry); !r) fail(r.error());
  if (auto r = ranges::check("temperature_c", o.temperature_c, ranges::kTemperatureC); !r) fail(r.error());
  const double density = seawater::density_kg_per_l(o.salinity, o.temperature_c);
  if (o.calcium) {
    auto unit = units::concentration_unit_from_string(o.calcium_unit);
    if (!unit) throw CommandError("--calcium-unit: " + unit.error().message);
    w.calcium_umol_kg = units::ion_to_umol_kg(*o.calcium, *unit, units::Ion::Calcium, density);
  }
  const SaltMixValues mix = salt_mix_values(o.salt_mix, density);
  w.total_boron_umol_kg = mix.total_boron_umol_kg;
  w.magnesium_umol_kg = mix.magnesium_umol_kg;
  w.mg_ca_correction = mix.mg_ca_correction;
  auto m = readings(o, density);
  const bool ph_used = o.ph.has_value() || (table && o.vary == "ph");
  if (ph_used && o.ph_scale.empty()) throw CommandError("--ph-scale is required with a pH reading (total, sws, free or nbs)");
  w.measurements.ph_scale = ph_used ? scale_of(o.ph_scale, "--ph-scale") : cb::PhScale::Total;
  if (table) {
    if (m.size() != 1) {
      throw CommandError(fmt::format("{} fixed carbonate readings given; the table needs exactly one of "
                                     "--alkalinity, --dic, --ph, --pco2 besides --vary", m.size()));
    }
    cb::Quantity q = cb::Quantity::PH;
    if (o.vary == "ph") q = cb::Quantity::PH;
    else if (o.vary == "pco2") q = cb::Quantity::PCO2;
    else if (o.vary == "dic") q = cb::Quantity::DIC;
    else if (o.vary == "alkalinity") q = cb::Quantity::Alkalinity;
    else throw CommandError("--vary '" + o.vary + "' is not known; accepted: ph, pco2, dic, alkalinity (umol/kg)");
    if (q == m[0].quantity) throw CommandError("--vary " + o.vary + " is also given as the fixed reading");
    w.measurements.first = {q, 0.0};
    w.measurements.second = m[0];
    return w;
  }
  if (m.size() != 2) {
    throw CommandError(fmt::format("{} carbonate readings given; exactly two of --alkalinity, --dic, --ph, "
                                   "--pco2 are needed", m.size()));
  }
  w.measurements.first = m[0];
  w.measurements.second = m[1];
  return w;
}

hy::Settings settings_of(const BufferOptions& o) {
  hy::Settings s;
  const int targets = o.target_omega.has_value() + o.target_ph.has_value() + o.target_rise.has_value();
  if (targets != 1) {
    throw CommandError(fmt::format("{} targets given; exactly one of --target-omega, --target-ph, "
                                   "--target-alkalinity-rise is needed", targets));
  }
  if (o.target_omega) s.target = {hy::TargetKind::OmegaAragonite, *o.target_omega, cb::PhScale::Total};
  if (o.target_ph) s.target = {hy::TargetKind::PH, *o.target_ph, scale_of(o.target_ph_scale, "--target-ph-scale")};
  if (o.target_rise) s.target = {hy::TargetKind::AlkalinityRise, *o.target_rise, cb::PhScale::Total};
  if (o.target_at == "mixing") s.target_point = hy::TargetPoint::AfterMixing;
  else if (o.target_at == "tanks") s.target_point = hy::TargetPoint::AtTanks;
  else throw CommandError("--target-at '" + o.target_at + "' is not known; accepted: mixing, tanks");
  auto b = hy::buffer_from_string(o.additive);
  if (!b) throw CommandError("--" + b.error().message);
  s.buffer = *b;
  s.limits.ph_ceiling = o.ph_ceiling;
  s.limits.ph_ceiling_scale = scale_of(o.ph_ceiling_scale, "--ph-ceiling-scale");
  s.limits.mixing_omega_ceiling = o.omega_ceiling;
  s.gas.fraction = o.degas_fraction;
  s.gas.residence_time_min = o.residence_min;
  s.gas.exchange_time_constant_min = o.exchange_tau_min;
  s.gas.air_co2_ppm = o.air_co2_ppm;
  s.stock.temperature_c = o.stock_temperature_c;
  s.stock.strength_g_per_l = o.stock_g_per_l;
  s.stock.fraction_of_saturation = o.stock_fraction;
  return s;
}

// Dosing to a confidence when --confidence, --uncertainty or a precision option is given: the
// intake readings' uncertainties (kit defaults from the core's table, replaced by each option)
// and the probability (default 95 %).
void add_confidence(const BufferOptions& o, const hy::Water& w, hy::Settings& s) {
  if (!o.confidence_percent && !o.precision.wanted()) return;
  const double percent = o.confidence_percent.value_or(95.0);
  if (auto r = ranges::check("--confidence", percent, ranges::kDoseConfidencePercent); !r) throw CommandError(r.error().message);
  const cb::Conditions c = hy::conditions_of(w);
  ChemUnits un;
  un.density_kg_l = seawater::density_kg_per_l(w.salinity, w.temperature_c);
  if (auto a = units::alkalinity_unit_from_string(o.alkalinity_unit)) un.alkalinity = *a;
  if (auto ca = units::concentration_unit_from_string(o.calcium_unit)) un.calcium = *ca;
  if (auto mg = units::concentration_unit_from_string(o.salt_mix.magnesium_unit)) un.magnesium = *mg;
  if (auto b = units::concentration_unit_from_string(o.salt_mix.total_boron_unit)) un.total_boron = *b;
  hy::Confidence conf;
  conf.probability = percent / 100.0;
  conf.intake = input_uncertainties(o.precision, c, w.measurements, un);
  s.confidence = conf;
}

json confidence_json(const hy::Treatment& t) {
  if (!t.confidence) return nullptr;
  const hy::ConfidenceReport& r = *t.confidence;
  return {{"probability", r.probability}, {"z_one_sided", r.z},
          {"added_alkalinity_umol_kg", r.added_alkalinity_umol_kg},
          {"centre_added_alkalinity_umol_kg", r.centre_added_alkalinity_umol_kg},
          {"target_value", r.target_value}, {"target_u", r.target_u}, {"target_bound", r.target_bound},
          {"ph_max", r.ph_max}, {"ph_u", r.ph_u}, {"ph_bound", r.ph_bound}, {"summary", r.summary}};
}

double flow_l_per_min(const BufferOptions& o) {
  if (!o.flow) throw CommandError("--flow is required (intake flow, in --flow-unit)");
  auto unit = hy::flow_unit_from_string(o.flow_unit);
  if (!unit) throw CommandError("--flow-unit '" + o.flow_unit + "' is not known; accepted: L/min, m3/h");
  const double lo = hy::flow_from_l_per_min(0.01, *unit), hi = hy::flow_from_l_per_min(100000.0, *unit);
  if (auto r = check_range("flow", *o.flow, lo, hi, hy::to_string(*unit)); !r) fail(r.error());
  return hy::flow_to_l_per_min(*o.flow, *unit);
}

json state_json(const cb::CarbonateState& s) {
  return {{"ph_total", s.ph_total}, {"ph_sws", s.ph_sws}, {"ph_free", s.ph_free}, {"ph_nbs", s.ph_nbs},
          {"alkalinity_umol_kg", s.alkalinity_umol_kg}, {"dic_umol_kg", s.dic_umol_kg},
          {"pco2_uatm", s.pco2_uatm}, {"fco2_uatm", s.fco2_uatm}, {"co2_umol_kg", s.co2_umol_kg},
          {"hco3_umol_kg", s.hco3_umol_kg}, {"co3_umol_kg", s.co3_umol_kg},
          {"omega_aragonite", s.omega_aragonite}, {"omega_calcite", s.omega_calcite},
          {"revelle_factor", s.revelle_factor}};
}

json treatment_json(const hy::Treatment& t) {
  return {{"intake", state_json(t.intake)},
          {"after_mixing", state_json(t.after_mixing)},
          {"at_tanks", state_json(t.at_tanks)},
          {"degassing_fraction", t.degassing_fraction},
          {"dose_needed", t.dose_needed},
          {"carbonate_share_of_added_alkalinity", t.carbonate_share},
          {"added_alkalinity_umol_kg", t.dose.alkalinity_umol_kg()},
          {"added_dic_umol_kg", t.dose.dic_umol_kg()},
          {"calcium_source", t.calcium_source}};
}

// Where boron came from and the Mg/Ca correction, in the JSON of every buffer command.
json salt_mix_json(const hy::Water& w) {
  const cb::BoronSource boron = cb::boron_source(hy::conditions_of(w));
  return {{"total_boron_umol_kg", boron.boron_umol_kg}, {"boron_source", boron.note},
          {"magnesium_umol_kg", w.magnesium_umol_kg ? json(*w.magnesium_umol_kg) : json(nullptr)},
          {"mg_ca_correction", w.mg_ca_correction}};
}

std::string header_text(const hy::Water& w, const hy::Settings& s) {
  // A salt mix's own boron is said where it is used; without it the header is as before.
  const cb::BoronSource boron = cb::boron_source(hy::conditions_of(w));
  return fmt::format("  water: salinity {:g}, {:g} C; K1 K2 {}{}\n  target: {} {}; additive {}; pH ceiling {:.2f} ({} scale)\n",
                     w.salinity, w.temperature_c, cb::to_string(w.k1k2), boron.measured ? "; " + boron.note : "",
                     s.target.kind == hy::TargetKind::OmegaAragonite ? fmt::format("Omega ar {:.2f}", s.target.value)
                     : s.target.kind == hy::TargetKind::PH
                         ? fmt::format("pH {:.2f} ({} scale)", s.target.value, cb::to_string(s.target.ph_scale))
                         : fmt::format("alkalinity +{:.0f} umol/kg", s.target.value),
                     s.target_point == hy::TargetPoint::AtTanks ? "at the tanks" : "after mixing",
                     hy::to_string(s.buffer), s.limits.ph_ceiling, cb::to_string(s.limits.ph_ceiling_scale));
}

std::string chemistry_text(const hy::Treatment& t) {
  const cb::CarbonateState* st[3] = {&t.intake, &t.after_mixing, &t.at_tanks};
  std::string out = fmt::format("\nChemistry              {:>10} {:>13} {:>10}\n", "intake", "after mixing",
                                fmt::format("tanks{}", t.degassing_fraction > 0 ? "" : "*"));
  auto row = [&](const char* name, double (*get)(const cb::CarbonateState&), int dp) {
    out += fmt::format("  {:<20} {:>10.{}f} {:>13.{}f} {:>10.{}f}\n", name, get(*st[0]), dp, get(*st[1]), dp,
                       get(*st[2]), dp);
  };
  row("pH total", [](const cb::CarbonateState& s) { return s.ph_total; }, 3);
  row("pH NBS", [](const cb::CarbonateState& s) { return s.ph_nbs; }, 3);
  row("alkalinity umol/kg", [](const cb::CarbonateState& s) { return s.alkalinity_umol_kg; }, 0);
  row("DIC umol/kg", [](const cb::CarbonateState& s) { return s.dic_umol_kg; }, 0);
  row("pCO2 uatm", [](const cb::CarbonateState& s) { return s.pco2_uatm; }, 0);
  row("CO3-- umol/kg", [](const cb::CarbonateState& s) { return s.co3_umol_kg; }, 1);
  row("Omega aragonite", [](const cb::CarbonateState& s) { return s.omega_aragonite; }, 2);
  row("Omega calcite", [](const cb::CarbonateState& s) { return s.omega_calcite; }, 2);
  row("Revelle factor", [](const cb::CarbonateState& s) { return s.revelle_factor; }, 1);
  out += fmt::format("  after mixing: closed system, before gas exchange; tanks: {:.0f} % of the way to air "
                     "equilibrium{}\n", 100.0 * t.degassing_fraction, t.degassing_fraction > 0 ? "" : " (*no gas exchange set)");
  return out;
}

std::string notes_text(const std::vector<std::string>& warnings, const std::vector<std::string>& cautions,
                       const std::string& calcium_source) {
  // Where calcium came from, always said; at low salinity the same sentence is also a warning.
  std::string out = "\n  " + calcium_source + (calcium_source.find("measure calcium") != std::string::npos
                                                   ? " (--calcium, in --calcium-unit)\n" : "\n");
  if (!warnings.empty()) out += "\nWarnings\n";
  for (const auto& w : warnings) {
    if (w == calcium_source) continue;
    out += "  - " + w + "\n";
    // The core's suggestion of a K1 K2 set names no option: say which one chooses it here.
    if (w.find("is the set suggested for this water") != std::string::npos) out += "    (choose it with --k1k2 millero2010)\n";
  }
  out += "\nCautions\n";
  for (const auto& c : cautions) out += "  - " + c + "\n";
  return out;
}

// One metering pump per compound, as `buffer flow --json` and `buffer line --flow --json` print it.
json stock_lines_json(const hy::FlowPlan& p, const hy::Settings& s) {
  json lines = json::array();
  for (const auto& l : p.lines) {
    lines.push_back({{"compound", hy::to_string(l.compound)}, {"formula", hy::formula_of(l.compound)},
                     {"umol_per_kg", l.umol_per_kg}, {"grams_per_hour", l.grams_per_hour},
                     {"grams_per_day", l.grams_per_day}, {"stock_g_per_l", l.stock_g_per_l},
                     {"stock_saturation_g_per_l", l.saturation_g_per_l},
                     {"stock_temperature_c", s.stock.temperature_c}, {"pump_ml_per_min", l.pump_ml_per_min},
                     {"stock_litres_per_day", l.stock_litres_per_day},
                     {"injection_dilution_needed", l.injection_dilution_needed},
                     {"full_mixing_dilution", l.full_mixing_dilution}});
  }
  return lines;
}

std::string stock_lines_text(const hy::FlowPlan& p, const hy::Settings& s) {
  std::string out;
  if (p.lines.empty()) out += "  none needed\n";
  for (const auto& l : p.lines) {
    out += fmt::format("  {:<7} {:8.1f} umol/kg  {:9.2f} g/h  ({:.0f} g/day)\n", hy::formula_of(l.compound),
                       l.umol_per_kg, l.grams_per_hour, l.grams_per_day);
    out += fmt::format("          stock {:.1f} g/L made up to volume (saturation about {:.0f} g/L at {:g} C)\n",
                       l.stock_g_per_l, l.saturation_g_per_l, s.stock.temperature_c);
    out += fmt::format("          metering pump {:.2f} mL/min ({:.1f} L of stock per day)\n", l.pump_ml_per_min,
                       l.stock_litres_per_day);
  }
  return out;
}

void run_flow(const BufferOptions& o) {
  const hy::Water w = water_of(o, false);
  hy::Settings s = settings_of(o);
  add_confidence(o, w, s);
  const double flow = flow_l_per_min(o);
  const hy::FlowPlan p = or_fail(hy::plan_flow(w, flow, s));
  if (o.json) {
    json out = {{"mode", "flow"}, {"flow_l_per_min", flow}, {"additive", hy::to_string(s.buffer)},
                {"treatment", treatment_json(p.treatment)}, {"lines", stock_lines_json(p, s)},
                {"salt_mix", salt_mix_json(w)}, {"confidence", confidence_json(p.treatment)},
                {"warnings", p.warnings}, {"cautions", p.cautions}};
    std::cout << out.dump(2) << "\n";
    return;
  }
  std::string out = "Intake buffering, flow-through\n";
  out += fmt::format("  flow: {:.2f} L/min ({:.3f} m3/h)\n", flow, hy::flow_from_l_per_min(flow, hy::FlowUnit::CubicMetrePerHour));
  out += header_text(w, s);
  out += "\nDose\n" + stock_lines_text(p, s);
  if (p.treatment.confidence) out += "\nConfidence\n  " + p.treatment.confidence->summary + "\n";
  out += chemistry_text(p.treatment) + notes_text(p.warnings, p.cautions, p.treatment.calcium_source);
  std::fwrite(out.data(), 1, out.size(), stdout);
}

void run_batch(const BufferOptions& o) {
  const hy::Water w = water_of(o, false);
  hy::Settings s = settings_of(o);
  add_confidence(o, w, s);
  if (!o.volume) throw CommandError("--volume is required (tank volume, in --volume-unit)");
  auto unit = units::volume_unit_from_string(o.volume_unit);
  if (!unit) throw CommandError("--volume-unit '" + o.volume_unit + "' is not known; accepted: L, gal");
  const double litres = units::volume_to_litres(*o.volume, *unit);
  const hy::BatchPlan p = or_fail(hy::plan_batch(w, litres, s));
  if (o.json) {
    json adds = json::array();
    for (const auto& a : p.additions) {
      adds.push_back({{"compound", hy::to_string(a.compound)}, {"formula", hy::formula_of(a.compound)},
                      {"umol_per_kg", a.umol_per_kg}, {"grams", a.grams}});
    }
    json out = {{"mode", "batch"}, {"volume_l", p.volume_l}, {"water_mass_kg", p.water_mass_kg},
                {"additive", hy::to_string(s.buffer)}, {"treatment", treatment_json(p.treatment)},
                {"additions", adds}, {"salt_mix", salt_mix_json(w)}, {"confidence", confidence_json(p.treatment)},
                {"warnings", p.warnings}, {"cautions", p.cautions}};
    std::cout << out.dump(2) << "\n";
    return;
  }
  std::string out = "Culture tank buffering, batch\n";
  out += fmt::format("  tank: {:.1f} L ({:.1f} kg of water)\n", p.volume_l, p.water_mass_kg);
  out += header_text(w, s) + "\nAdd\n";
  if (p.additions.empty()) out += "  nothing needed\n";
  for (const auto& a : p.additions) {
    out += fmt::format("  {:<7} {:10.2f} g  ({:.1f} umol/kg, {:.2f} mg/kg)\n", hy::formula_of(a.compound), a.grams,
                       a.umol_per_kg, a.grams * 1000.0 / p.water_mass_kg);
  }
  if (p.treatment.confidence) out += "\nConfidence\n  " + p.treatment.confidence->summary + "\n";
  out += chemistry_text(p.treatment) + notes_text(p.warnings, p.cautions, p.treatment.calcium_source);
  std::fwrite(out.data(), 1, out.size(), stdout);
}

void run_table(const BufferOptions& o) {
  const hy::Water w = water_of(o, true);
  hy::Settings s = settings_of(o);
  const double flow = flow_l_per_min(o);
  if (!o.from || !o.to) throw CommandError("--from and --to are required (range of the --vary reading)");
  {
    hy::Water first = w;  // the precisions are checked against the first row's reading
    first.measurements.first.value = *o.from;
    add_confidence(o, first, s);
  }
  hy::TableRange r{w.measurements.first.quantity, *o.from, *o.to, o.step};
  const hy::PumpTable t = or_fail(hy::build_pump_table(w, flow, r, s));
  std::string out;
  if (o.json) {
    json rows = json::array();
    for (const auto& row : t.rows) {
      json pumps = json::object(), grams = json::object();
      for (size_t k = 0; k < t.columns.size(); ++k) {
        pumps[hy::formula_of(t.columns[k])] = row.pump_ml_per_min[k];
        grams[hy::formula_of(t.columns[k])] = row.grams_per_hour[k];
      }
      rows.push_back({{"reading", row.reading}, {"ok", row.ok}, {"note", row.note},
                      {"intake_omega_aragonite", row.intake_omega_aragonite}, {"pump_ml_per_min", pumps},
                      {"grams_per_hour", grams}, {"ph_total_after_mixing", row.ph_total_after_mixing},
                      {"omega_aragonite_after_mixing", row.omega_aragonite_after_mixing},
                      {"ph_total_at_tanks", row.ph_total_at_tanks},
                      {"omega_aragonite_at_tanks", row.omega_aragonite_at_tanks},
                      {"confidence", row.confidence ? json{{"target_bound", row.confidence->target_bound},
                                                           {"ph_bound", row.confidence->ph_bound},
                                                           {"probability", row.confidence->probability}}
                                                     : json(nullptr)}});
    }
    json stocks = json::object();
    for (size_t k = 0; k < t.columns.size(); ++k) stocks[hy::formula_of(t.columns[k])] = t.stock_g_per_l[k];
    out = json{{"mode", "table"}, {"flow_l_per_min", flow}, {"vary", o.vary}, {"stock_g_per_l", stocks},
               {"salt_mix", salt_mix_json(w)},
               {"rows", rows}, {"calcium_source", t.calcium_source}, {"cautions", t.cautions}}.dump(2) + "\n";
  } else {
    out = o.csv ? hy::pump_table_csv(t) : hy::pump_table_text(t);
    // CSV has no place for it: where calcium came from goes to stderr.
    if (o.csv) std::fprintf(stderr, "note: %s\n", t.calcium_source.c_str());
  }
  std::fwrite(out.data(), 1, out.size(), stdout);
}

// The line: intake -> conditioned (mixed and/or heated) -> dosed, pH and Omega at each point.
void run_line(const BufferOptions& o) {
  const hy::Water w = water_of(o, false);
  hy::Settings s = settings_of(o);
  hy::Conditioning c;
  c.tank_temperature_c = o.tank_temperature;
  if (o.mix_fraction) {
    hy::OtherWater other;
    other.volume_fraction = *o.mix_fraction;
    other.salinity = o.mix_salinity;
    other.temperature_c = o.mix_temperature;
    other.alkalinity_umol_kg = o.mix_alkalinity;
    other.dic_umol_kg = o.mix_dic;
    other.calcium_umol_kg = o.mix_calcium;
    c.mix = other;
  }
  // With --flow: the pump rates too, for the conditioned water at the flow through the dose
  // point (the app's Hatchery screen with the line shown gives the same).
  std::optional<hy::LineFlowPlan> lf;
  if (o.flow) lf = or_fail(hy::plan_line_flow(w, c, flow_l_per_min(o), s));
  const hy::HatcheryLine line = lf ? lf->line : or_fail(hy::plan_line(w, c, s));
  if (o.json) {
    json points = json::array();
    for (const auto& p : line.points) {
      points.push_back({{"point", p.name}, {"salinity", p.salinity}, {"temperature_c", p.temperature_c},
                        {"calcium_umol_kg", p.calcium_umol_kg}, {"state", state_json(p.state)}});
    }
    json out = {{"mode", "line"}, {"points", points}, {"treatment", treatment_json(line.treatment)},
                {"salt_mix", salt_mix_json(line.conditioned)},
                {"notes", line.notes}, {"warnings", line.treatment.warnings}};
    if (lf) {
      out["flow_l_per_min"] = flow_l_per_min(o);
      out["dosed_flow_l_per_min"] = lf->dosed_flow_l_per_min;
      out["lines"] = stock_lines_json(lf->flow, s);
    }
    std::cout << out.dump(2) << "\n";
    return;
  }
  std::string out = "Hatchery line: intake, conditioned, dosed\n" + header_text(line.conditioned, s);
  for (const auto& n : line.notes) out += "  " + n + "\n";
  out += fmt::format("\n  {:<22} {:>8} {:>6} {:>8} {:>8} {:>8} {:>8} {:>6}\n", "point", "salinity", "C", "TA", "DIC",
                     "Ca", "pH(T)", "Omega");
  for (const auto& p : line.points) {
    out += fmt::format("  {:<22} {:>8.2f} {:>6.1f} {:>8.0f} {:>8.0f} {:>8.0f} {:>8.3f} {:>6.2f}\n", p.name, p.salinity,
                       p.temperature_c, p.state.alkalinity_umol_kg, p.state.dic_umol_kg, p.calcium_umol_kg,
                       p.state.ph_total, p.state.omega_aragonite);
  }
  out += "  (TA, DIC and Ca in umol/kg; Omega aragonite)\n";
  out += fmt::format("\nDose on the conditioned water: +{:.1f} umol/kg alkalinity ({})\n",
                     line.treatment.dose.alkalinity_umol_kg(), hy::to_string(s.buffer));
  if (lf) {
    out += fmt::format("  at the dose point {:.2f} L/min (intake {:.2f} L/min and the water mixed in)\n",
                       lf->dosed_flow_l_per_min, flow_l_per_min(o));
    out += stock_lines_text(lf->flow, s);
  }
  out += notes_text(line.treatment.warnings,
                    hy::cautions_for(s.buffer == hy::Buffer::SodiumHydroxide ? std::vector{hy::Compound::SodiumHydroxide}
                                     : s.buffer == hy::Buffer::SodiumBicarbonate ? std::vector{hy::Compound::SodiumBicarbonate}
                                     : s.buffer == hy::Buffer::Blend
                                         ? std::vector{hy::Compound::SodiumCarbonate, hy::Compound::SodiumBicarbonate}
                                         : std::vector{hy::Compound::SodiumCarbonate}),
                    line.treatment.calcium_source);
  std::fwrite(out.data(), 1, out.size(), stdout);
}

void add_common(CLI::App* c, BufferOptions& o) {
  c->add_option("--salinity", o.salinity, "Practical salinity of the water")->default_str("35");
  c->add_option("--temperature", o.temperature_c, "Water temperature [C]")->default_str("20");
  c->add_option("--k1k2", o.k1k2, "Carbonic acid constants: lueker2000, or millero2010 for brackish water (suggested below S 19)")->default_str("lueker2000");
  c->add_option("--calcium", o.calcium, "Measured calcium, in --calcium-unit (default: from salinity by the seawater ratio, which under-reads estuarine intakes)");
  c->add_option("--calcium-unit", o.calcium_unit, "mg/L, mmol/kg or umol/kg")->default_str("mg/L");
  add_salt_mix_options(*c, o.salt_mix);
  c->add_option("--alkalinity", o.alkalinity, "Total alkalinity, in --alkalinity-unit");
  c->add_option("--alkalinity-unit", o.alkalinity_unit, "umol/kg, meq/L, dKH or mg/L CaCO3")->default_str("umol/kg");
  c->add_option("--ph", o.ph, "pH on the scale given by --ph-scale");
  c->add_option("--ph-scale", o.ph_scale, "Scale of the pH reading: total, sws, free or nbs");
  c->add_option("--pco2", o.pco2, "CO2 partial pressure [uatm]");
  c->add_option("--dic", o.dic, "Dissolved inorganic carbon [umol/kg]");
  c->add_option("--target-omega", o.target_omega, "Target aragonite saturation (0.5 to 8)");
  c->add_option("--target-ph", o.target_ph, "Target pH (6.5 to 9.3) on --target-ph-scale");
  c->add_option("--target-ph-scale", o.target_ph_scale, "Scale of --target-ph")->default_str("total");
  c->add_option("--target-alkalinity-rise", o.target_rise, "Alkalinity to add [umol/kg] (0 to 8000)");
  c->add_option("--target-at", o.target_at, "Where the target must hold: mixing (closed system) or tanks")->default_str("mixing");
  c->add_option("--additive", o.additive, "carbonate, bicarbonate, hydroxide or blend (carbonate + bicarbonate under the pH ceiling)")->default_str("carbonate");
  c->add_option("--ph-ceiling", o.ph_ceiling, "Highest pH allowed after mixing and at the tanks (7.0 to 9.3)")->default_str("8.3");
  c->add_option("--ph-ceiling-scale", o.ph_ceiling_scale, "Scale of --ph-ceiling")->default_str("total");
  c->add_option("--omega-ceiling", o.omega_ceiling, "Omega ar above which precipitation is flagged (Moras et al. 2022: 5)")->default_str("5");
  c->add_option("--degas-fraction", o.degas_fraction, "Fraction 0..1 of the way to air equilibrium before the tanks");
  c->add_option("--residence-time", o.residence_min, "Minutes from injection to tanks (with --exchange-time-constant)");
  c->add_option("--exchange-time-constant", o.exchange_tau_min, "Gas exchange time constant [min] of the line")->default_str("30");
  c->add_option("--air-co2", o.air_co2_ppm, "CO2 of the air the water meets [ppm]")->default_str("424.6");
  c->add_option("--stock-temperature", o.stock_temperature_c, "Temperature the stock is made and kept at [C]")->default_str("20");
  c->add_option("--stock-g-per-l", o.stock_g_per_l, "Stock strength, g of anhydrous salt per L of solution (default: from saturation)");
  c->add_option("--stock-saturation-fraction", o.stock_fraction, "Default stock strength as a fraction of saturation")->default_str("0.8");
  c->add_flag("--json", o.json, "Print JSON instead of text");
  c->add_option("--confidence", o.confidence_percent,
                "Dose so the target is reached, and the pH ceiling holds, with this probability [%] (50 to 99.9) "
                "given the intake readings' precision (default 95 with --uncertainty or a precision option)");
  add_precision_options(*c, o.precision);
}

}  // namespace

void register_buffer(CLI::App& app) {
  CLI::App* cmd = app.add_subcommand("buffer", "Hatchery buffering of intake seawater and culture tanks");
  cmd->require_subcommand(1);
  cmd->footer(
      "Examples:\n"
      "  tidewright buffer flow --flow 100 --salinity 32 --temperature 20 --alkalinity 2150 --pco2 800 --target-omega 3\n"
      "  tidewright buffer batch --volume 2000 --salinity 32 --alkalinity 2150 --ph 7.77 --ph-scale total --target-omega 2.5\n"
      "  tidewright buffer table --flow 6 --flow-unit m3/h --alkalinity 2150 --vary ph --ph-scale total --from 7.5 --to 8.0 --target-omega 3 --csv\n"
      "Food-production hatcheries: follow local regulations and licensed practice.");
  auto flow = std::make_shared<BufferOptions>();
  CLI::App* f = cmd->add_subcommand("flow", "Dose for a flow-through intake: g/h, stock, pump mL/min, chemistry");
  add_common(f, *flow);
  f->add_option("--flow", flow->flow, "Intake flow, in --flow-unit");
  f->add_option("--flow-unit", flow->flow_unit, "L/min or m3/h")->default_str("L/min");
  f->callback([flow] { run_flow(*flow); });

  auto batch = std::make_shared<BufferOptions>();
  CLI::App* b = cmd->add_subcommand("batch", "Grams to add to a static culture tank, and the chemistry after");
  add_common(b, *batch);
  b->add_option("--volume", batch->volume, "Tank volume, in --volume-unit");
  b->add_option("--volume-unit", batch->volume_unit, "L or gal")->default_str("L");
  b->callback([batch] { run_batch(*batch); });

  auto table = std::make_shared<BufferOptions>();
  CLI::App* t = cmd->add_subcommand("table", "Pump settings across a range of intake readings, for staff");
  add_common(t, *table);
  t->add_option("--flow", table->flow, "Intake flow, in --flow-unit");
  t->add_option("--flow-unit", table->flow_unit, "L/min or m3/h")->default_str("L/min");
  t->add_option("--vary", table->vary, "Reading that varies: ph, pco2, dic or alkalinity (umol/kg)")->default_str("ph");
  t->add_option("--from", table->from, "First value of the varied reading");
  t->add_option("--to", table->to, "Last value of the varied reading");
  t->add_option("--step", table->step, "Step of the varied reading")->default_str("0.05");
  t->add_flag("--csv", table->csv, "Print CSV instead of text");
  t->callback([table] { run_table(*table); });

  auto line = std::make_shared<BufferOptions>();
  CLI::App* l = cmd->add_subcommand("line", "The water through the line: intake, after mixing or heating, after the dose");
  add_common(l, *line);
  l->add_option("--mix-fraction", line->mix_fraction, "Volume fraction 0..1 of other (fresh) water mixed into the intake");
  l->add_option("--mix-salinity", line->mix_salinity,
                fmt::format("Salinity of that water ({:g}..{:g})", ranges::kSalinity.lo, ranges::kSalinity.hi))
      ->default_str("0");
  l->add_option("--mix-temperature", line->mix_temperature,
                fmt::format("Its temperature [C] ({:g}..{:g})", ranges::kTemperatureC.lo, ranges::kTemperatureC.hi))
      ->default_str("20");
  l->add_option("--mix-alkalinity", line->mix_alkalinity,
                fmt::format("Its alkalinity [umol/kg] ({:g}..{:g})", ranges::kMixWaterCarbonUmolKg.lo, ranges::kMixWaterCarbonUmolKg.hi))->default_str("0");
  l->add_option("--mix-dic", line->mix_dic,
                fmt::format("Its DIC [umol/kg] ({:g}..{:g})", ranges::kMixWaterCarbonUmolKg.lo, ranges::kMixWaterCarbonUmolKg.hi))->default_str("0");
  l->add_option("--mix-calcium", line->mix_calcium, "Its calcium [umol/kg] (0..50000)")->default_str("0");
  l->add_option("--flow", line->flow, "Intake flow, in --flow-unit: adds the pump rates for the conditioned water");
  l->add_option("--flow-unit", line->flow_unit, "L/min or m3/h")->default_str("L/min");
  l->add_option("--tank-temperature", line->tank_temperature, fmt::format("Temperature at the tanks after heating or cooling [C] ({:g}..{:g})",
                            ranges::kTemperatureC.lo, ranges::kTemperatureC.hi));
  l->callback([line] { run_line(*line); });
}

}  // namespace tw::shell
