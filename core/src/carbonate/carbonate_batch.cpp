// Batch carbonate solving over CSV records (carbonate_batch.hpp).
//
// Map of this file
//   1. Numbers and options from cells (from_chars; no allocation on the good path)
//   2. CarbonateBatch: header, constants cache, one record -> one output row
//   3. solve_csv_batch: a whole text through the same record path
#include "tidewright/carbonate/carbonate_batch.hpp"

#include <charconv>
#include <cstdlib>
#include <iterator>
#include <optional>

#include <fmt/format.h>

#include "tidewright/common/csv.hpp"
#include "tidewright/carbonate/measurement_precision.hpp"
#include "tidewright/common/csv_stream.hpp"

namespace tw::carbonate {
namespace {

// ---------------------------------------------------------------- 1. Cells
// Parses a whole cell as a double (a leading '+' allowed, as strtod did). std::from_chars for
// double where the standard library has it (libstdc++ 11+); strtod on a copy elsewhere (the
// libc++ of Emscripten 3.1.6 lacks it).
bool parse_double(std::string_view text, double& value) {
  if (!text.empty() && text.front() == '+') text.remove_prefix(1);
  if (text.empty()) return false;
#if defined(__cpp_lib_to_chars) && __cpp_lib_to_chars >= 201611L
  const auto [end, ec] = std::from_chars(text.data(), text.data() + text.size(), value);
  return ec == std::errc{} && end == text.data() + text.size();
#else
  char buffer[64];
  if (text.size() >= sizeof buffer) return false;
  text.copy(buffer, text.size());
  buffer[text.size()] = '\0';
  char* end = nullptr;
  value = std::strtod(buffer, &end);
  return end == buffer + text.size();
#endif
}

std::string_view cell_at(const std::vector<std::string_view>& cells, int column) {
  if (column < 0 || column >= static_cast<int>(cells.size())) return {};
  return csv::trim_view(cells[static_cast<std::size_t>(column)]);
}

// An optional number; an unreadable cell is an error naming the column.
Result<std::optional<double>> number_at(const std::vector<std::string_view>& cells, int column,
                                        const char* name) {
  const std::string_view text = cell_at(cells, column);
  if (text.empty()) return std::optional<double>{};
  double v = 0;
  if (!parse_double(text, v)) return Error{name, fmt::format("{} '{}' is not a number", name, text)};
  return std::optional<double>{v};
}

// A per-row option cell (empty: keep `value`).
template <class Option, class Parse>
Status option_at(const std::vector<std::string_view>& cells, int column, const char* name,
                 Parse parse, Option& value) {
  const std::string_view text = cell_at(cells, column);
  if (text.empty()) return Ok{};
  auto parsed = parse(std::string(text), name);
  if (!parsed) return parsed.error();
  value = *parsed;
  return Ok{};
}

bool same_conditions(const Conditions& a, const Conditions& b) {
  return a.salinity == b.salinity && a.temperature_c == b.temperature_c && a.k1k2 == b.k1k2 &&
         a.boron == b.boron && a.calcium_umol_kg == b.calcium_umol_kg &&
         a.phosphate_umol_kg == b.phosphate_umol_kg && a.silicate_umol_kg == b.silicate_umol_kg &&
         a.fluoride == b.fluoride && a.convention == b.convention &&
         a.total_boron_umol_kg == b.total_boron_umol_kg && a.magnesium_umol_kg == b.magnesium_umol_kg &&
         a.mg_ca_correction == b.mg_ca_correction;
}

void append_warnings(std::string& out, const std::vector<std::string>& warnings) {
  if (warnings.empty()) return;
  std::string joined;
  for (const auto& w : warnings) {
    if (!joined.empty()) joined += "; ";
    joined += w;
  }
  csv::append_cell_for_spreadsheet(out, joined);
}

}  // namespace

// ---------------------------------------------------------------- 2. CarbonateBatch
CarbonateBatch::CarbonateBatch(const BatchOptions& options) : options_(options) {}

void CarbonateBatch::start(std::string_view header_record, std::string& out) {
  csv::split_record(header_record, cells_, scratch_);
  const std::vector<std::string> header(cells_.begin(), cells_.end());
  auto f = [&](const char* name) { return csv::find_column(header, name); };
  columns_ = {f("id"),          f("salinity"),          f("temperature_c"),
              f("alkalinity_umol_kg"), f("dic_umol_kg"), f("ph"),
              f("ph_scale"),    f("pco2_uatm"),         f("fco2_uatm"),
              f("calcium_umol_kg"), f("phosphate_umol_kg"), f("silicate_umol_kg"),
              f("k1k2"),        f("boron"),             f("fluoride"),
              f("conventions")};
  columns_.total_boron = f("total_boron_umol_kg");
  columns_.magnesium = f("magnesium_umol_kg");
  std::vector<const char*> names(kBatchOutputColumns.begin(), kBatchOutputColumns.end());
  if (options_.with_uncertainty) {
    columns_.u_alkalinity = f("u_alkalinity_umol_kg");
    columns_.u_dic = f("u_dic_umol_kg");
    columns_.u_ph = f("u_ph");
    columns_.u_pco2 = f("u_pco2_uatm");
    columns_.u_fco2 = f("u_fco2_uatm");
    columns_.u_salinity = f("u_salinity");
    columns_.u_temperature = f("u_temperature_c");
    columns_.u_calcium = f("u_calcium_umol_kg");
    columns_.u_ph_conversion = f("u_ph_scale_conversion");
    names.insert(names.end() - 1, kBatchUncertaintyColumns.begin(), kBatchUncertaintyColumns.end());
  }
  out += csv::format_row({names.begin(), names.end()});
}

Result<const Constants*> CarbonateBatch::constants_for(const Conditions& conditions) {
  if (!have_constants_ || !same_conditions(conditions, constants_.conditions)) {
    auto k = compute_constants(conditions);
    if (!k) return k.error();
    constants_ = std::move(k).value();
    have_constants_ = true;
  }
  return &constants_;
}

Result<CarbonateBatch::Problem> CarbonateBatch::read_cells() {
  const Columns& c = columns_;
  struct Numeric {
    int column;
    const char* name;
    std::optional<double> value;
  };
  Numeric numbers[] = {
      {c.salinity, "salinity", {}},           {c.temperature, "temperature_c", {}},
      {c.alkalinity, "alkalinity_umol_kg", {}}, {c.dic, "dic_umol_kg", {}},
      {c.ph, "ph", {}},                       {c.pco2, "pco2_uatm", {}},
      {c.fco2, "fco2_uatm", {}},              {c.calcium, "calcium_umol_kg", {}},
      {c.phosphate, "phosphate_umol_kg", {}}, {c.silicate, "silicate_umol_kg", {}},
      {c.total_boron, "total_boron_umol_kg", {}}, {c.magnesium, "magnesium_umol_kg", {}}};
  for (auto& n : numbers) {
    if (n.column < 0) continue;
    auto parsed = number_at(cells_, n.column, n.name);
    if (!parsed) return parsed.error();
    n.value = *parsed;
  }
  Conditions conditions;
  conditions.k1k2 = options_.k1k2;
  conditions.boron = options_.boron;
  conditions.fluoride = options_.fluoride;
  conditions.convention = options_.convention;
  if (auto s = option_at(cells_, c.k1k2, "k1k2", k1k2_from_string, conditions.k1k2); !s)
    return s.error();
  if (auto s = option_at(cells_, c.boron, "boron", boron_from_string, conditions.boron); !s)
    return s.error();
  if (auto s = option_at(cells_, c.fluoride, "fluoride", fluoride_from_string, conditions.fluoride);
      !s)
    return s.error();
  if (auto s = option_at(cells_, c.convention, "conventions", convention_from_string,
                         conditions.convention);
      !s)
    return s.error();
  conditions.salinity = numbers[0].value.value_or(options_.default_salinity);
  conditions.temperature_c = numbers[1].value.value_or(options_.default_temperature_c);
  conditions.calcium_umol_kg = numbers[7].value;
  conditions.phosphate_umol_kg = numbers[8].value.value_or(0.0);
  conditions.silicate_umol_kg = numbers[9].value.value_or(0.0);
  conditions.total_boron_umol_kg = numbers[10].value;
  conditions.magnesium_umol_kg = numbers[11].value;
  conditions.mg_ca_correction = options_.mg_ca_correction;

  static constexpr std::pair<int, Quantity> kCarbonateInputs[] = {{2, Quantity::Alkalinity},
                                                                  {3, Quantity::DIC},
                                                                  {4, Quantity::PH},
                                                                  {5, Quantity::PCO2},
                                                                  {6, Quantity::FCO2}};
  Measurement given[2]{};
  int count = 0;
  for (const auto& [index, quantity] : kCarbonateInputs) {
    if (!numbers[index].value) continue;
    if (count < 2) given[count] = {quantity, *numbers[index].value};
    ++count;
  }
  if (count != 2) {
    return Error{"carbonate inputs",
                 fmt::format("row has {} carbonate inputs; exactly two of alkalinity_umol_kg, "
                             "dic_umol_kg, ph, pco2_uatm, fco2_uatm are needed",
                             count)};
  }
  InputPair pair{given[0], given[1], PhScale::Total};
  const std::string_view scale_text = cell_at(cells_, c.ph_scale);
  if (!scale_text.empty()) {
    auto scale = ph_scale_from_string(std::string(scale_text));
    if (!scale) return scale.error();
    pair.ph_scale = *scale;
  }
  return Problem{conditions, pair};
}

Result<CarbonateState> CarbonateBatch::solve_cells() {
  auto problem = read_cells();
  if (!problem) return problem.error();
  auto constants = constants_for(problem->conditions);
  if (!constants) return constants.error();
  return solve(**constants, problem->pair);
}

Result<CarbonateOutputs> CarbonateBatch::uncertainty_of(const Problem& p) {
  InputUncertainties u = default_input_uncertainties(p.conditions, p.pair);
  const Columns& c = columns_;
  const auto column_of = [&](Quantity q) {
    switch (q) {
      case Quantity::Alkalinity: return std::pair{c.u_alkalinity, "u_alkalinity_umol_kg"};
      case Quantity::DIC: return std::pair{c.u_dic, "u_dic_umol_kg"};
      case Quantity::PH: return std::pair{c.u_ph, "u_ph"};
      case Quantity::PCO2: return std::pair{c.u_pco2, "u_pco2_uatm"};
      case Quantity::FCO2: return std::pair{c.u_fco2, "u_fco2_uatm"};
      case Quantity::Carbonate: break;
    }
    return std::pair{-1, "u_co3_umol_kg"};
  };
  const auto fa = column_of(p.pair.first.quantity), fb = column_of(p.pair.second.quantity);
  struct Cell { int column; const char* name; double* target; };
  const Cell cells[] = {{fa.first, fa.second, &u.first},
                        {fb.first, fb.second, &u.second},
                        {c.u_salinity, "u_salinity", &u.salinity},
                        {c.u_temperature, "u_temperature_c", &u.temperature_c},
                        {c.u_calcium, "u_calcium_umol_kg", &u.calcium_umol_kg},
                        {c.u_ph_conversion, "u_ph_scale_conversion", &u.ph_scale_conversion}};
  for (const Cell& cell : cells) {
    auto v = number_at(cells_, cell.column, cell.name);
    if (!v) return v.error();
    if (*v) *cell.target = **v;
  }
  if (options_.constants_uncertainty) u.constants = ConstantUncertainties{};
  auto r = solve_with_uncertainty(p.conditions, p.pair, u);
  if (!r) return r.error();
  return r->u;
}

bool CarbonateBatch::solve_record(std::string_view record, int line, std::string& out) {
  csv::split_record(record, cells_, scratch_);
  csv::append_cell_for_spreadsheet(out, cell_at(cells_, columns_.id));
  const auto state = solve_cells();
  Result<CarbonateOutputs> u = CarbonateOutputs{};
  if (state && options_.with_uncertainty) u = uncertainty_of(*read_cells());
  const std::size_t numbers =
      kBatchOutputColumns.size() - 2 + (options_.with_uncertainty ? kBatchUncertaintyColumns.size() : 0);
  if (!state || !u) {
    const Error& e = !state ? state.error() : u.error();
    out.append(numbers, ',');  // the numbers stay empty
    out += ',';
    csv::append_cell_for_spreadsheet(out, fmt::format("line {}: {}", line, e.message));
    out += "\r\n";
    return false;
  }
  const CarbonateState& s = *state;
  const double values[] = {s.ph_total,     s.ph_sws,        s.ph_free,         s.ph_nbs,
                           s.pco2_uatm,    s.fco2_uatm,     s.alkalinity_umol_kg,
                           s.dic_umol_kg,  s.hco3_umol_kg,  s.co3_umol_kg,
                           s.co2_umol_kg,  s.omega_calcite, s.omega_aragonite,
                           s.revelle_factor};
  auto it = std::back_inserter(out);
  for (double v : values) fmt::format_to(it, ",{}", v);  // shortest text that reads back exactly
  if (options_.with_uncertainty) {
    for (const char* column : kBatchUncertaintyColumns) {
      const std::string_view name = std::string_view(column).substr(2);  // past "u_"
      for (const auto& f : kOutputFields)
        if (name == f.name) fmt::format_to(it, ",{:.6g}", (*u).*f.output);
    }
  }
  out += ',';
  append_warnings(out, s.warnings);
  out += "\r\n";
  return true;
}

// ---------------------------------------------------------------- 3. Whole text
Result<BatchSummary> solve_csv_batch(const std::string& csv_text, const BatchOptions& options) {
  csv::RecordStream stream;
  stream.append(csv_text);
  stream.finish();
  CarbonateBatch batch(options);
  BatchSummary summary;
  csv::RecordStream::Record record;
  bool have_header = false;
  while (stream.next(record)) {
    if (!have_header) {
      batch.start(record.text, summary.csv);
      have_header = true;
      continue;
    }
    ++summary.rows;
    if (!batch.solve_record(record.text, record.line, summary.csv)) ++summary.failed;
  }
  if (!stream.error()) return stream.error().error();
  if (!have_header) return Error{"csv", "the batch has no header row"};
  return summary;
}

}  // namespace tw::carbonate
