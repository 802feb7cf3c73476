// One sample in every salinity form, and the CSV batch of it (salinity_convert.hpp).
// Map: 1. helpers  2. describe_salinity  3. CSV batch in  4. CSV batch out
#include "tidewright/seawater/salinity_convert.hpp"

#include <cstdlib>
#include <utility>

#include <fmt/format.h>

#include "seawater_internal.hpp"
#include "tidewright/common/csv.hpp"
#include "tidewright/seawater/seawater.hpp"
#include "tidewright/common/units.hpp"

namespace tw::seawater {
namespace {

// ---------------------------------------------------------------- 1. helpers
// The PSS-78 calls name the temperature "temperature_c"; in a sample it is the sample's.
Error rename_field(Error e, const std::string& from, const std::string& to) {
  if (e.field != from) return e;
  e.field = to;
  if (e.message.compare(0, from.size(), from) == 0) e.message = to + e.message.substr(from.size());
  return e;
}

Status check_conditions(const SalinitySample& s) {
  const ValidityRange& v = kEos80Validity;
  if (auto r = detail::check_range_of("sample_temperature_c", s.sample_temperature_c,
                                      v.temperature_min_c, v.temperature_max_c, "C", v.source);
      !r)
    return r;
  if (auto r = detail::check_range_of("reference_temperature_c", s.reference_temperature_c,
                                      kReferenceTemperatureMinC, kReferenceTemperatureMaxC, "C",
                                      "pure water density (Bigg 1967)");
      !r)
    return r;
  return detail::check_range_of("pressure_dbar", s.pressure_dbar, v.pressure_min_dbar,
                                v.pressure_max_dbar, "dbar", v.source);
}

Result<double> salinity_of(const SalinitySample& s) {
  const double t = s.sample_temperature_c;
  const double p = s.pressure_dbar;
  switch (s.input) {
    case SalinityInput::Salinity:
      if (auto r = detail::check_range_of("salinity", s.value, 0.0, 42.0, "",
                                          kEos80Validity.source);
          !r)
        return r.error();
      return s.value;
    case SalinityInput::SpecificGravity:
      return salinity_from_specific_gravity(s.value, {t, s.reference_temperature_c});
    case SalinityInput::ConductivityMsCm: {
      auto r = salinity_from_conductivity_ms_cm(s.value, t, p);
      if (!r) return rename_field(r.error(), "temperature_c", "sample_temperature_c");
      return r;
    }
    case SalinityInput::ConductivityRatio: {
      auto r = salinity_from_conductivity_ratio(s.value, t, p);
      if (!r) return rename_field(r.error(), "temperature_c", "sample_temperature_c");
      return r;
    }
    case SalinityInput::DensityKgM3: {
      auto r = salinity_from_density(s.value, t, p);
      if (!r) return rename_field(r.error(), "temperature_c", "sample_temperature_c");
      return r;
    }
  }
  return Error{"input", "unknown salinity input"};
}

}  // namespace

const char* to_string(SalinityInput input) {
  switch (input) {
    case SalinityInput::Salinity: return "salinity";
    case SalinityInput::SpecificGravity: return "specific_gravity";
    case SalinityInput::ConductivityMsCm: return "conductivity_ms_cm";
    case SalinityInput::ConductivityRatio: return "conductivity_ratio";
    case SalinityInput::DensityKgM3: return "density_kg_m3";
  }
  return "?";
}

// ---------------------------------------------------------------- 2. describe_salinity
Result<SalinityReport> describe_salinity(const SalinitySample& sample) {
  if (auto r = check_conditions(sample); !r) return r.error();
  auto salinity = salinity_of(sample);
  if (!salinity) return salinity.error();
  SalinityReport out;
  out.sample = sample;
  out.salinity = *salinity;
  const double t = sample.sample_temperature_c;
  out.specific_gravity = specific_gravity_from_salinity(out.salinity, {t, sample.reference_temperature_c});
  out.density_kg_m3 = density_eos80_kg_m3(out.salinity, t, sample.pressure_dbar);
  auto ratio = conductivity_ratio_from_salinity(out.salinity, t, sample.pressure_dbar);
  if (ratio) {
    out.conductivity_ratio = *ratio;
    out.conductivity_ms_cm = *ratio * kConductivityAtS35T15mS_cm;
  } else {
    out.notes.push_back("conductivity not given: " +
                        rename_field(ratio.error(), "temperature_c", "sample_temperature_c").message);
  }
  return out;
}

// ---------------------------------------------------------------- 3. CSV batch in
namespace {

constexpr SalinityInput kInputs[] = {SalinityInput::Salinity, SalinityInput::SpecificGravity,
                                     SalinityInput::ConductivityMsCm,
                                     SalinityInput::ConductivityRatio, SalinityInput::DensityKgM3};

using Columns = SalinityBatchColumns;

Columns map_columns(const std::vector<std::string>& header) {
  auto f = [&](const char* name) { return csv::find_column(header, name); };
  Columns c{};
  for (int i = 0; i < 5; ++i) c.input[i] = f(to_string(kInputs[i]));
  c.sample_c = f("sample_temperature_c") >= 0 ? f("sample_temperature_c") : f("temperature_c");
  c.sample_f = f("sample_temperature_f") >= 0 ? f("sample_temperature_f") : f("temperature_f");
  c.reference_c = f("reference_temperature_c");
  c.reference_f = f("reference_temperature_f");
  c.pressure = f("pressure_dbar");
  return c;
}

std::string cell_at(const csv::Row& row, int column) {
  if (column < 0 || column >= static_cast<int>(row.cells.size())) return {};
  return csv::trim(row.cells[static_cast<std::size_t>(column)]);
}

// An optional number from a cell; an unreadable cell is an error naming its column.
Result<std::optional<double>> number_at(const csv::Row& row, int column, const std::string& name) {
  const std::string text = cell_at(row, column);
  if (text.empty()) return std::optional<double>{};
  char* end = nullptr;
  const double v = std::strtod(text.c_str(), &end);
  if (end != text.c_str() + text.size()) {
    return Error{name, fmt::format("{} '{}' is not a number", name, text)};
  }
  return std::optional<double>{v};
}

// A temperature from a C or an F column (not both), else the default.
Result<double> temperature_at(const csv::Row& row, int col_c, int col_f, const std::string& name,
                              double fallback_c) {
  auto c = number_at(row, col_c, name + "_c");
  if (!c) return c.error();
  auto f = number_at(row, col_f, name + "_f");
  if (!f) return f.error();
  if (c->has_value() && f->has_value()) {
    return Error{name, fmt::format("give {0}_c or {0}_f, not both", name)};
  }
  if (f->has_value()) return units::fahrenheit_to_celsius(**f);
  return c->value_or(fallback_c);
}

Result<SalinityReport> describe_row(const csv::Row& row, const Columns& c,
                                    const SalinitySample& defaults) {
  SalinitySample s = defaults;
  int found = 0;
  for (int i = 0; i < 5; ++i) {
    auto v = number_at(row, c.input[i], to_string(kInputs[i]));
    if (!v) return v.error();
    if (v->has_value()) {
      ++found;
      s.input = kInputs[i];
      s.value = **v;
    }
  }
  if (found != 1) {
    return Error{"input", fmt::format("{} salinity inputs on this row; give exactly one of "
                                      "salinity, specific_gravity, conductivity_ms_cm, "
                                      "conductivity_ratio, density_kg_m3",
                                      found)};
  }
  auto ts = temperature_at(row, c.sample_c, c.sample_f, "sample_temperature",
                           defaults.sample_temperature_c);
  if (!ts) return ts.error();
  auto tr = temperature_at(row, c.reference_c, c.reference_f, "reference_temperature",
                           defaults.reference_temperature_c);
  if (!tr) return tr.error();
  auto p = number_at(row, c.pressure, "pressure_dbar");
  if (!p) return p.error();
  s.sample_temperature_c = *ts;
  s.reference_temperature_c = *tr;
  s.pressure_dbar = p->value_or(defaults.pressure_dbar);
  return describe_salinity(s);
}

}  // namespace

Result<SalinityBatchReader> SalinityBatchReader::from_header(
    const std::vector<std::string>& header, const SalinitySample& defaults) {
  const Columns c = map_columns(header);
  bool any_input = false;
  for (int col : c.input) any_input = any_input || col >= 0;
  if (!any_input) {
    return Error{"csv", "the CSV header names no salinity input; it needs one of the columns "
                        "salinity, specific_gravity, conductivity_ms_cm, conductivity_ratio, "
                        "density_kg_m3"};
  }
  SalinityBatchReader reader;
  reader.columns_ = c;
  reader.defaults_ = defaults;
  return reader;
}

SalinityBatchRow SalinityBatchReader::describe(const std::vector<std::string>& cells,
                                               int line) const {
  SalinityBatchRow out;
  out.line = line;
  csv::Row row;
  row.line = line;
  row.cells = cells;
  out.report = describe_row(row, columns_, defaults_);
  return out;
}

Result<SalinityBatch> describe_salinity_csv(const std::string& csv_text,
                                            const SalinitySample& defaults) {
  auto parsed = csv::parse(csv_text);
  if (!parsed) return parsed.error();
  const std::vector<csv::Row>& rows = *parsed;
  if (rows.empty()) return Error{"csv", "the CSV text is empty; it needs a header row"};
  auto reader = SalinityBatchReader::from_header(rows[0].cells, defaults);
  if (!reader) return reader.error();
  SalinityBatch batch;
  for (std::size_t i = 1; i < rows.size(); ++i) {
    SalinityBatchRow out = reader->describe(rows[i].cells, rows[i].line);
    if (!out.report) ++batch.failed;
    batch.rows.push_back(std::move(out));
  }
  return batch;
}

// ---------------------------------------------------------------- 4. CSV batch out
std::string format_salinity_batch_header() {
  return csv::format_row({kSalinityBatchColumns.begin(), kSalinityBatchColumns.end()});
}

std::string format_salinity_batch_row(const SalinityBatchRow& row) {
  auto num = [](double v) { return fmt::format("{:.10g}", v); };
  std::vector<std::string> cells(kSalinityBatchColumns.size());
  cells[0] = std::to_string(row.line);
  if (row.report) {
    const SalinityReport& r = *row.report;
    cells[1] = to_string(r.sample.input);
    cells[2] = num(r.salinity);
    cells[3] = num(r.specific_gravity);
    if (r.conductivity_ms_cm) cells[4] = num(*r.conductivity_ms_cm);
    cells[5] = num(r.density_kg_m3);
    cells[6] = num(r.sample.sample_temperature_c);
    cells[7] = num(r.sample.reference_temperature_c);
    cells[8] = num(r.sample.pressure_dbar);
    if (r.conductivity_ratio) cells[9] = num(*r.conductivity_ratio);
    std::string notes;
    for (const auto& n : r.notes) notes += (notes.empty() ? "" : "; ") + n;
    cells[10] = notes;
  } else {
    cells[11] = row.report.error().message;
  }
  return csv::format_row(cells, /*defuse_formulas=*/true);
}

std::string format_salinity_batch_csv(const SalinityBatch& batch) {
  std::string out = format_salinity_batch_header();
  for (const SalinityBatchRow& row : batch.rows) out += format_salinity_batch_row(row);
  return out;
}

}  // namespace tw::seawater
