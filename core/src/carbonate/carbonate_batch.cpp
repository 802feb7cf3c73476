#include "tidewright/carbonate/carbonate_batch.hpp"

#include <cstdlib>
#include <optional>
#include <vector>

#include <fmt/format.h>

#include "tidewright/common/csv.hpp"

namespace tw::carbonate {
namespace {

struct ColumnMap {
  int id, salinity, temperature, alkalinity, dic, ph, ph_scale, pco2, fco2, calcium, phosphate,
      silicate;
};

ColumnMap map_columns(const std::vector<std::string>& header) {
  auto f = [&](const char* name) { return csv::find_column(header, name); };
  return {f("id"),          f("salinity"), f("temperature_c"),   f("alkalinity_umol_kg"),
          f("dic_umol_kg"), f("ph"),       f("ph_scale"),        f("pco2_uatm"),
          f("fco2_uatm"),   f("calcium_umol_kg"), f("phosphate_umol_kg"), f("silicate_umol_kg")};
}

std::string cell_at(const csv::Row& row, int column) {
  if (column < 0 || column >= static_cast<int>(row.cells.size())) return {};
  return csv::trim(row.cells[column]);
}

// Reads an optional number; an unreadable cell is an error naming the column.
Result<std::optional<double>> number_at(const csv::Row& row, int column, const char* name) {
  const std::string text = cell_at(row, column);
  if (text.empty()) return std::optional<double>{};
  char* end = nullptr;
  const double v = std::strtod(text.c_str(), &end);
  if (end != text.c_str() + text.size()) {
    return Error{name, fmt::format("{} '{}' is not a number", name, text)};
  }
  return std::optional<double>{v};
}

std::string number_cell(double v) { return fmt::format("{}", v); }

std::string join_warnings(const std::vector<std::string>& warnings) {
  std::string out;
  for (const auto& w : warnings) {
    if (!out.empty()) out += "; ";
    out += w;
  }
  return out;
}

// Turns one row into a state, or an error naming the problem.
Result<CarbonateState> solve_row(const csv::Row& row, const ColumnMap& c,
                                 const BatchOptions& options) {
  Conditions conditions;
  conditions.k1k2 = options.k1k2;
  conditions.boron = options.boron;

  struct Numeric {
    int column;
    const char* name;
    std::optional<double> value;
  };
  std::vector<Numeric> numbers = {
      {c.salinity, "salinity", {}},         {c.temperature, "temperature_c", {}},
      {c.alkalinity, "alkalinity_umol_kg", {}}, {c.dic, "dic_umol_kg", {}},
      {c.ph, "ph", {}},                     {c.pco2, "pco2_uatm", {}},
      {c.fco2, "fco2_uatm", {}},            {c.calcium, "calcium_umol_kg", {}},
      {c.phosphate, "phosphate_umol_kg", {}}, {c.silicate, "silicate_umol_kg", {}}};
  for (auto& n : numbers) {
    auto parsed = number_at(row, n.column, n.name);
    if (!parsed) return parsed.error();
    n.value = *parsed;
  }
  conditions.salinity = numbers[0].value.value_or(options.default_salinity);
  conditions.temperature_c = numbers[1].value.value_or(options.default_temperature_c);
  conditions.calcium_umol_kg = numbers[7].value;
  conditions.phosphate_umol_kg = numbers[8].value.value_or(0.0);
  conditions.silicate_umol_kg = numbers[9].value.value_or(0.0);

  const std::pair<int, Quantity> carbonate_inputs[] = {{2, Quantity::Alkalinity},
                                                       {3, Quantity::DIC},
                                                       {4, Quantity::PH},
                                                       {5, Quantity::PCO2},
                                                       {6, Quantity::FCO2}};
  std::vector<Measurement> given;
  for (const auto& [index, quantity] : carbonate_inputs) {
    if (numbers[index].value) given.push_back({quantity, *numbers[index].value});
  }
  if (given.size() != 2) {
    return Error{"carbonate inputs",
                 fmt::format("row has {} carbonate inputs; exactly two of alkalinity_umol_kg, "
                             "dic_umol_kg, ph, pco2_uatm, fco2_uatm are needed",
                             given.size())};
  }
  InputPair pair{given[0], given[1], PhScale::Total};
  const std::string scale_text = cell_at(row, c.ph_scale);
  if (!scale_text.empty()) {
    auto scale = ph_scale_from_string(scale_text);
    if (!scale) return scale.error();
    pair.ph_scale = *scale;
  }
  auto constants = compute_constants(conditions);
  if (!constants) return constants.error();
  return solve(*constants, pair);
}

}  // namespace

Result<BatchSummary> solve_csv_batch(const std::string& csv_text, const BatchOptions& options) {
  auto parsed = csv::parse(csv_text);
  if (!parsed) return parsed.error();
  const auto& rows = *parsed;
  if (rows.empty()) return Error{"csv", "the batch has no header row"};
  const ColumnMap columns = map_columns(rows[0].cells);

  BatchSummary summary;
  summary.csv = csv::format_row({kBatchOutputColumns.begin(), kBatchOutputColumns.end()});
  for (size_t r = 1; r < rows.size(); ++r) {
    const csv::Row& row = rows[r];
    ++summary.rows;
    std::vector<std::string> out(kBatchOutputColumns.size());
    out[0] = cell_at(row, columns.id);
    auto state = solve_row(row, columns, options);
    if (!state) {
      ++summary.failed;
      out.back() = fmt::format("line {}: {}", row.line, state.error().message);
    } else {
      const CarbonateState& s = *state;
      const double values[] = {s.ph_total,      s.ph_sws,          s.ph_free,       s.ph_nbs,
                               s.pco2_uatm,     s.fco2_uatm,       s.alkalinity_umol_kg,
                               s.dic_umol_kg,   s.hco3_umol_kg,    s.co3_umol_kg,
                               s.co2_umol_kg,   s.omega_calcite,   s.omega_aragonite,
                               s.revelle_factor};
      for (size_t k = 0; k < std::size(values); ++k) out[k + 1] = number_cell(values[k]);
      out.back() = join_warnings(s.warnings);
    }
    summary.csv += csv::format_row(out, /*defuse_formulas=*/true);
  }
  return summary;
}

}  // namespace tw::carbonate
