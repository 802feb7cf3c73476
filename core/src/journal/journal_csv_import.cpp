// Journal CSV import: long and wide form, header-driven, every rejected row reported.
#include <algorithm>
#include <cctype>
#include <cmath>
#include <cstdlib>
#include <map>

#include <fmt/format.h>

#include "tidewright/common/csv.hpp"
#include "tidewright/common/number_text.hpp"
#include "tidewright/journal/journal_csv.hpp"

namespace tw::journal {

namespace {

// A cell that our export defused ("'=..." etc.) gets its apostrophe back off.
std::string undefuse(const std::string& s) {
  if (s.size() >= 2 && s[0] == '\'' &&
      (s[1] == '=' || s[1] == '+' || s[1] == '-' || s[1] == '@' || s[1] == '\t' || s[1] == '\r')) {
    return s.substr(1);
  }
  return s;
}

// The shared rule for numbers people type (number_text.hpp); a decimal comma is fine.
std::optional<double> parse_number(const std::string& s) {
  return number_text::read_decimal(s, number_text::DecimalMark::PointOrComma);
}

class RowReader {
 public:
  RowReader(const std::map<std::string, size_t>& columns, const csv::Row& row)
      : columns_(columns), row_(row) {}
  std::string get(const char* name) const {
    auto it = columns_.find(name);
    if (it == columns_.end()) return "";
    const size_t i = it->second;
    if (i >= row_.cells.size()) return "";
    return undefuse(csv::trim(row_.cells[static_cast<size_t>(i)]));
  }
  // Free text keeps its spaces (a note exported as " =1+2" comes back as " =1+2"); a cell of
  // spaces only is empty.
  std::string text(const char* name) const {
    auto it = columns_.find(name);
    if (it == columns_.end() || it->second >= row_.cells.size()) return "";
    const std::string& cell = row_.cells[it->second];
    return csv::trim(cell).empty() ? std::string() : undefuse(cell);
  }
  Result<std::optional<double>> number(const char* name) const {
    const std::string s = get(name);
    if (s.empty()) return std::optional<double>{};
    auto v = parse_number(s);
    if (!v) return number_text::read_decimal_or_error(name, s, number_text::DecimalMark::PointOrComma).error();
    return std::optional<double>{*v};
  }
  Result<double> required_number(const char* name) const {
    auto v = number(name);
    if (!v) return v.error();
    if (!*v) return Error{name, fmt::format("{} is empty; a number is needed", name)};
    return **v;
  }

 private:
  const std::map<std::string, size_t>& columns_;
  const csv::Row& row_;
};

#define TW_ROW_TRY(var, expr)           \
  auto var##_r = (expr);                \
  if (!var##_r) return var##_r.error(); \
  auto var = std::move(var##_r).value()

std::string default_unit(const System& sys, Parameter p) {
  switch (p) {
    case Parameter::Alkalinity: return units::to_string(sys.units.alkalinity);
    case Parameter::Calcium:
    case Parameter::Magnesium: return units::to_string(sys.units.calcium_magnesium);
    case Parameter::Temperature: return to_string(sys.units.temperature);
    case Parameter::Other: return "";
    default: return parameter_unit(p);
  }
}

Result<EventData> long_test(const RowReader& r, const System& sys) {
  TestResult t;
  TW_ROW_TRY(p, parameter_from_name(r.get("parameter")));
  t.parameter = p;
  if (p == Parameter::Other) t.other_name = r.get("other_name");
  TW_ROW_TRY(value, r.required_number("value"));
  t.value = value;
  std::string unit = r.get("unit");
  if (unit.empty()) unit = default_unit(sys, p);
  TW_ROW_TRY(norm, normalize_unit(p, unit));
  t.unit = norm;
  TW_ROW_TRY(prec, r.number("precision"));
  t.precision = prec;
  if (p == Parameter::PH) {
    const std::string scale = r.get("ph_scale");
    if (scale.empty()) {
      t.ph_scale = sys.units.ph_scale;
    } else {
      TW_ROW_TRY(s, ph_scale_from_name(scale));
      t.ph_scale = s;
    }
  }
  t.kit = r.get("kit");
  return EventData{t};
}

Result<EventData> long_dose(const RowReader& r) {
  Dose d;
  d.additive_id = r.get("additive");
  TW_ROW_TRY(amount, r.required_number("amount"));
  d.amount = amount;
  const std::string unit = r.get("amount_unit");
  if (unit.empty()) return Error{"amount_unit", "amount_unit is empty; accepted: g, mL"};
  TW_ROW_TRY(u, dose_unit_from_string(unit));
  d.unit = u;
  TW_ROW_TRY(stock, r.number("stock_g_per_l"));
  d.stock_g_per_l = stock;
  return EventData{d};
}

Result<double> volume_litres(const RowReader& r, const System& sys) {
  TW_ROW_TRY(v, r.required_number("volume"));
  const std::string unit = r.get("volume_unit");
  units::VolumeUnit u = sys.units.volume;
  if (!unit.empty()) {
    auto parsed = units::volume_unit_from_string(unit);
    if (!parsed) return Error{"volume_unit", parsed.error().message};
    u = *parsed;
  }
  return units::volume_to_litres(v, u);
}

Result<EventData> long_water_change(const RowReader& r, const System& sys) {
  WaterChange w;
  TW_ROW_TRY(v, volume_litres(r, sys));
  w.volume_l = v;
  TW_ROW_TRY(a, r.number("new_alkalinity_dkh"));
  TW_ROW_TRY(c, r.number("new_calcium_mg_l"));
  TW_ROW_TRY(m, r.number("new_magnesium_mg_l"));
  TW_ROW_TRY(s, r.number("new_salinity"));
  w.alkalinity_dkh = a;
  w.calcium_mg_l = c;
  w.magnesium_mg_l = m;
  w.salinity = s;
  return EventData{w};
}

Result<EventData> long_top_off(const RowReader& r, const System& sys) {
  TopOff o;
  TW_ROW_TRY(v, volume_litres(r, sys));
  o.volume_l = v;
  const std::string kind = r.get("top_off_kind");
  if (!kind.empty()) {
    TW_ROW_TRY(k, top_off_kind_from_string(kind));
    o.kind = k;
  }
  TW_ROW_TRY(lw, r.number("limewater_g_per_l"));
  o.limewater_g_per_l = lw;
  return EventData{o};
}

}  // namespace

Result<CsvImportReport> import_csv(Journal& journal, const std::string& text,
                                   const CsvImportOptions& options) {
  const char delimiter = options.delimiter ? options.delimiter : csv::detect_delimiter(text);
  auto parsed = csv::parse(text, delimiter);
  if (!parsed) return parsed.error();
  const auto& rows = *parsed;
  if (rows.empty()) return Error{"csv", "the CSV text is empty; a header row is needed"};
  const std::vector<std::string>& header = rows[0].cells;
  auto matched = match_csv_header(header, options.mappings);
  if (!matched) return matched.error();
  CsvImportReport report;
  report.delimiter = delimiter;
  std::map<std::string, size_t> long_columns;  // long-form name -> cell index
  std::vector<std::pair<size_t, const CsvColumn*>> readings;
  for (size_t i = 0; i < matched->size(); ++i) {
    const CsvColumn& c = (*matched)[i];
    if (c.kind == CsvColumn::Kind::Long) long_columns[c.long_name] = i;
    else if (c.kind == CsvColumn::Kind::Reading) readings.emplace_back(i, &c);
    else report.unused_columns.push_back(UnusedColumn{header[i], c.reason});
  }
  if (!long_columns.count("time")) {
    const char* sep = delimiter == ';' ? "semicolon" : delimiter == '\t' ? "tab" : "comma";
    return Error{"time", fmt::format("the header has no time column (read with the {} as separator; a column "
                                     "named time, date or timestamp, or one mapped to time, is needed)", sep)};
  }
  const bool has_system_col = long_columns.count("system") > 0;
  const System* fixed_system = nullptr;
  if (!has_system_col) {
    if (options.default_system) {
      fixed_system = find_system(journal, *options.default_system);
      if (!fixed_system) return Error{"system", "the chosen default system is not in the journal"};
    } else if (journal.systems.size() == 1) {
      fixed_system = &journal.systems[0];
    } else {
      return Error{"system", "the header has no 'system' column and no default system was "
                             "chosen; the journal has " +
                                 std::to_string(journal.systems.size()) + " systems"};
    }
  }
  // Dates like 03/04/2026: the order given, or the one the file's own dates show.
  datetime::ParseOptions time_options = options.time;
  if (time_options.order == datetime::DateOrder::Unspecified) {
    std::vector<std::string> times;
    for (size_t ri = 1; ri < rows.size(); ++ri) times.push_back(RowReader(long_columns, rows[ri]).get("time"));
    time_options.order = datetime::infer_date_order(times);
  }
  report.date_order = time_options.order;

  for (size_t ri = 1; ri < rows.size(); ++ri) {
    const csv::Row& row = rows[ri];
    const RowReader r(long_columns, row);
    if (std::all_of(row.cells.begin(), row.cells.end(), [](const std::string& c) { return csv::trim(c).empty(); })) {
      ++report.blank_rows_skipped;
      continue;
    }
    auto reject = [&](const std::string& field, const std::string& why) {
      report.rejected.push_back(RejectedRow{row.line, field, why});
    };
    bool extra = false;
    for (size_t c = header.size(); c < row.cells.size(); ++c) {
      if (!csv::trim(row.cells[c]).empty()) extra = true;
    }
    if (extra) {
      reject("csv", fmt::format("the row has {} cells but the header has {}", row.cells.size(),
                                header.size()));
      continue;
    }
    // System
    const System* sys = fixed_system;
    std::string sys_text = r.get("system");
    if (has_system_col && sys_text.empty() && options.default_system) {
      sys = find_system(journal, *options.default_system);
    } else if (has_system_col) {
      sys = find_system_by_name(journal, sys_text);
      if (!sys) {
        char* end = nullptr;
        const long long id = std::strtoll(sys_text.c_str(), &end, 10);
        if (!sys_text.empty() && end == sys_text.c_str() + sys_text.size()) sys = find_system(journal, id);
      }
    }
    if (!sys) {
      reject("system", sys_text.empty() ? "system is empty; give a system name or id"
                                        : "system '" + sys_text + "' is not in the journal");
      continue;
    }
    // Time
    const std::string time_text = r.get("time");
    auto time = datetime::parse_datetime(time_text, time_options);
    if (!time) {
      reject("time", time.error().message);
      continue;
    }
    if (options.now_s) {
      Status st = check_not_in_future(*time, *options.now_s);
      if (!st) {
        reject("time", st.error().message);
        continue;
      }
    }
    // Events of the row
    std::vector<EventData> data;
    std::string type = r.get("type");
    for (auto& ch : type) ch = static_cast<char>(std::tolower(static_cast<unsigned char>(ch)));
    const std::string note = r.text("note");
    if (type.empty()) {
      if (!r.get("parameter").empty()) type = "test";
      else if (!r.get("additive").empty()) type = "dose";
      else if (readings.empty() && !note.empty()) type = "note";
    }
    Result<EventData> main = Error{"", ""};
    bool has_main = true;
    if (type == "test") main = long_test(r, *sys);
    else if (type == "dose") main = long_dose(r);
    else if (type == "water_change") main = long_water_change(r, *sys);
    else if (type == "top_off") main = long_top_off(r, *sys);
    else if (type == "note") main = EventData{Note{note}};
    else if (type.empty()) has_main = false;
    else {
      reject("type", "type '" + type + "' is not known; accepted: test, dose, water_change, "
                                       "top_off, note");
      continue;
    }
    if (has_main && !main) {
      reject(main.error().field, main.error().message);
      continue;
    }
    if (has_main) data.push_back(std::move(main).value());
    bool bad = false;
    for (const auto& [index, column] : readings) {
      const std::string cell = index < row.cells.size() ? undefuse(csv::trim(row.cells[index])) : "";
      if (cell.empty()) continue;
      auto v = number_text::read_decimal_or_error(header[index], cell, number_text::DecimalMark::PointOrComma);
      if (!v) {
        reject(header[index], v.error().message);
        bad = true;
        break;
      }
      TestResult t;
      t.parameter = column->parameter;
      t.value = *v;
      t.unit = column->unit.empty() ? default_unit(*sys, column->parameter) : column->unit;
      if (column->parameter == Parameter::PH) t.ph_scale = column->ph_scale ? column->ph_scale : sys->units.ph_scale;
      data.push_back(t);
    }
    if (bad) continue;
    if (type != "note" && !note.empty()) data.push_back(Note{note});
    if (data.empty()) {
      reject("csv", "the row has no test, dose, water change, top-off or note");
      continue;
    }
    // Validate every event of the row before adding any (a row goes in whole or not at all).
    std::vector<Event> events;
    for (auto& d : data) events.push_back(Event{0, sys->id, *time, time_text, std::move(d)});
    bool row_ok = true;
    for (const auto& e : events) {
      Status st = validate_event(journal, e);
      if (!st) {
        reject(st.error().field, st.error().message);
        row_ok = false;
        break;
      }
    }
    if (!row_ok) continue;
    for (auto& e : events) {
      if (find_equal_event(journal, e)) {
        ++report.duplicates_skipped;
        continue;
      }
      auto id = add_event(journal, std::move(e));
      if (id) report.added.push_back(*id);
    }
  }
  return report;
}

}  // namespace tw::journal
