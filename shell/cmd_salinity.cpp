// `tidewright salinity`: one sample given as salinity, specific gravity, conductivity or density,
// shown in every form; or a CSV batch (--batch FILE|-). A thin layer over
// core/include/tidewright/salinity_convert.hpp.
#include <cstdio>
#include <fstream>
#include <iostream>
#include <iterator>
#include <memory>
#include <optional>
#include <string>
#include <utility>
#include <vector>

#include <fmt/format.h>
#include <nlohmann/json.hpp>

#include "commands.hpp"
#include "path_options.hpp"
#include "option_rules.hpp"
#include "batch_stream.hpp"
#include "file_io.hpp"
#include "tidewright/seawater/salinity_convert.hpp"
#include "tidewright/seawater/seawater.hpp"
#include "tidewright/common/units.hpp"

namespace tw::shell {
namespace {

namespace sw = tw::seawater;

struct SalinityOptions {
  std::optional<double> salinity, specific_gravity, conductivity, conductivity_ratio, density;
  std::optional<double> sample_c, sample_f, reference_c, reference_f;
  double pressure_dbar = 0.0;
  bool json = false;
  std::string batch, out;
};

// Core error fields -> the option the user typed, so the one-line reason names it.
FieldOptions salinity_fields(const SalinityOptions& o) {
  return {{"salinity", "--salinity"},
          {"specific_gravity", "--specific-gravity"},
          {"conductivity_ms_cm", "--conductivity"},
          {"conductivity_ratio", "--conductivity-ratio"},
          {"density_kg_m3", "--density"},
          {"pressure_dbar", "--pressure"},
          {"sample_temperature_c", o.sample_f ? "--sample-temp-f" : "--sample-temp"},
          {"reference_temperature_c", o.reference_f ? "--reference-temp-f" : "--reference-temp"}};
}

[[noreturn]] void fail(const Error& e, const SalinityOptions& o) { shell::fail(e, salinity_fields(o)); }

double temperature_c(const std::optional<double>& c, const std::optional<double>& f, const char* name) {
  return temperature_from_options(c, f, fmt::format("--{}", name), fmt::format("--{}-f", name), 25.0).celsius;
}

sw::SalinitySample conditions(const SalinityOptions& o) {
  sw::SalinitySample s;
  s.sample_temperature_c = temperature_c(o.sample_c, o.sample_f, "sample-temp");
  s.reference_temperature_c = temperature_c(o.reference_c, o.reference_f, "reference-temp");
  s.pressure_dbar = o.pressure_dbar;
  return s;
}

sw::SalinitySample single_sample(const SalinityOptions& o) {
  sw::SalinitySample s = conditions(o);
  const std::pair<const std::optional<double>*, sw::SalinityInput> inputs[] = {
      {&o.salinity, sw::SalinityInput::Salinity},
      {&o.specific_gravity, sw::SalinityInput::SpecificGravity},
      {&o.conductivity, sw::SalinityInput::ConductivityMsCm},
      {&o.conductivity_ratio, sw::SalinityInput::ConductivityRatio},
      {&o.density, sw::SalinityInput::DensityKgM3}};
  int found = 0;
  for (const auto& [value, input] : inputs) {
    if (!value->has_value()) continue;
    ++found;
    s.input = input;
    s.value = **value;
  }
  if (found != 1) {
    throw CommandError(fmt::format(
        "{} salinity inputs given; give exactly one of --salinity, --specific-gravity, "
        "--conductivity, --conductivity-ratio, --density (or --batch)",
        found));
  }
  return s;
}


std::string temp_text(double c, bool show_f) {
  if (show_f) return fmt::format("{:.2f} C ({:.1f} F)", c, units::celsius_to_fahrenheit(c));
  return fmt::format("{:g} C", c);
}

const char* input_words(sw::SalinityInput input) {
  switch (input) {
    case sw::SalinityInput::Salinity: return "salinity";
    case sw::SalinityInput::SpecificGravity: return "specific gravity";
    case sw::SalinityInput::ConductivityMsCm: return "conductivity (mS/cm)";
    case sw::SalinityInput::ConductivityRatio: return "conductivity ratio";
    case sw::SalinityInput::DensityKgM3: return "density (kg/m3)";
  }
  return "?";
}

void print_report(const sw::SalinityReport& r, const SalinityOptions& o) {
  const std::string ts = temp_text(r.sample.sample_temperature_c, o.sample_f.has_value());
  const std::string tr = temp_text(r.sample.reference_temperature_c, o.reference_f.has_value());
  if (r.sample.input == sw::SalinityInput::Salinity) {
    fmt::print("Salinity          {:.2f} (practical salinity, PSS-78)\n", r.salinity);
  } else {
    fmt::print("Salinity          {:.2f} (practical salinity, PSS-78; from {} {:g})\n",
               r.salinity, input_words(r.sample.input), r.sample.value);
  }
  fmt::print("Specific gravity  {:.4f} (sample at {}, pure water at {})\n", r.specific_gravity,
             ts, tr);
  if (r.conductivity_ms_cm) {
    fmt::print("Conductivity      {:.2f} mS/cm at {} and {:g} dbar (ratio {:.5f}; not "
               "compensated to 25 C)\n",
               *r.conductivity_ms_cm, ts, r.sample.pressure_dbar, *r.conductivity_ratio);
  }
  fmt::print("Density           {:.3f} kg/m3 at {} and {:g} dbar (EOS-80)\n", r.density_kg_m3, ts,
             r.sample.pressure_dbar);
  for (const auto& n : r.notes) fmt::print("Note              {}\n", n);
}



void run_batch(const SalinityOptions& o) {
  if (o.salinity || o.specific_gravity || o.conductivity || o.conductivity_ratio || o.density) {
    throw CommandError("--batch reads its samples from the CSV; drop --salinity, "
                       "--specific-gravity, --conductivity, --conductivity-ratio and --density");
  }
  const BatchCounts counts = run_salinity_batch(o.batch, o.out, conditions(o), o.json);
  if (counts.failed > 0) {
    throw CommandError(fmt::format("{} of {} rows could not be converted (see their error)",
                                   counts.failed, counts.rows));
  }
}

void run_single(const SalinityOptions& o) {
  const sw::SalinitySample sample = single_sample(o);
  auto report = sw::describe_salinity(sample);
  if (!report) fail(report.error(), o);
  if (o.json) {
    std::cout << salinity_report_json(*report).dump(2) << "\n";
  } else {
    print_report(*report, o);
  }
}

}  // namespace

nlohmann::json salinity_report_json(const seawater::SalinityReport& r) {
  namespace sw = seawater;
  auto opt = [](const std::optional<double>& v) { return v ? nlohmann::json(*v) : nlohmann::json(); };
  return {{"input", sw::to_string(r.sample.input)},
          {"input_value", r.sample.value},
          {"salinity", r.salinity},
          {"specific_gravity", r.specific_gravity},
          {"conductivity_ms_cm", opt(r.conductivity_ms_cm)},
          {"conductivity_ratio", opt(r.conductivity_ratio)},
          {"density_kg_m3", r.density_kg_m3},
          {"sample_temperature_c", r.sample.sample_temperature_c},
          {"reference_temperature_c", r.sample.reference_temperature_c},
          {"pressure_dbar", r.sample.pressure_dbar},
          {"notes", r.notes}};
}

void register_salinity(CLI::App& app) {
  auto o = std::make_shared<SalinityOptions>();
  CLI::App* cmd = app.add_subcommand(
      "salinity", "Salinity from specific gravity, conductivity or density, and back");
  cmd->footer(
      "Give exactly one of --salinity, --specific-gravity, --conductivity, --conductivity-ratio,\n"
      "--density; every other form is printed. Temperatures are of the sample when measured;\n"
      "specific gravity also needs the pure-water reference temperature of the instrument\n"
      "(25/25 C unless its label says otherwise, e.g. 60/60 F for many old hydrometers).\n"
      "Conductivity is at the sample temperature: if the meter compensates to 25 C, give\n"
      "--sample-temp 25. Accepted ranges: practical salinity 2 to 42 for conductivity (PSS-78),\n"
      "0 to 42 otherwise (EOS-80); sample -2 to 40 C (35 C for conductivity).\n"
      "Examples:\n"
      "  tidewright salinity --specific-gravity 1.0264\n"
      "  tidewright salinity --specific-gravity 1.025 --sample-temp-f 78 --reference-temp-f 60\n"
      "  tidewright salinity --conductivity 53.1 --sample-temp 25 --json\n"
      "  tidewright salinity --salinity 35 --sample-temp 26\n"
      "  printf 'specific_gravity,sample_temperature_c\\n1.026,25\\n' | tidewright salinity --batch -\n"
      "Batch columns: one of salinity, specific_gravity, conductivity_ms_cm, conductivity_ratio,\n"
      "density_kg_m3 per row; optional sample_temperature_c|_f, reference_temperature_c|_f,\n"
      "pressure_dbar (absent: the options' values).");
  cmd->add_option("--salinity", o->salinity, "Practical salinity (PSS-78)");
  cmd->add_option("--specific-gravity,--sg", o->specific_gravity,
                  "Specific gravity (refractometer or hydrometer) at --sample-temp / --reference-temp");
  cmd->add_option("--conductivity", o->conductivity,
                  "Conductivity [mS/cm] at --sample-temp (not temperature-compensated)");
  cmd->add_option("--conductivity-ratio", o->conductivity_ratio,
                  "Conductivity ratio C/C(35, 15 C, 0) = C/42.914 mS/cm");
  cmd->add_option("--density", o->density, "In situ density [kg/m3] at --sample-temp and --pressure");
  cmd->add_option("--sample-temp,--temperature", o->sample_c,
                  "Sample temperature [C] (default 25)");
  cmd->add_option("--sample-temp-f,--temperature-f", o->sample_f, "Sample temperature [F]");
  cmd->add_option("--reference-temp", o->reference_c,
                  "Specific gravity: pure-water reference temperature [C] (default 25)");
  cmd->add_option("--reference-temp-f", o->reference_f,
                  "Specific gravity: pure-water reference temperature [F]");
  cmd->add_option("--pressure", o->pressure_dbar,
                  "Pressure [dbar] for conductivity and density (0 = surface, 0 to 10000)")
      ->default_str("0");
  cmd->add_flag("--json", o->json, "Print JSON instead of text");
  cmd->add_option("--batch", o->batch, "CSV file of samples (- for stdin); columns below");
  cmd->add_option("--out", o->out, "With --batch: write the output here instead of stdout")->check(non_empty_path());
  cmd->callback([o] {
    if (!o->batch.empty()) {
      run_batch(*o);
    } else {
      run_single(*o);
    }
  });
}

}  // namespace tw::shell
