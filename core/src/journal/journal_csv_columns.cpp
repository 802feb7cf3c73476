// Header cells of an imported spreadsheet -> our columns (journal_csv_columns.hpp).
// Sections: 1. text helpers  2. units written in a header  3. one cell  4. the header.
#include "tidewright/journal/journal_csv_columns.hpp"

#include <algorithm>
#include <cctype>

#include "tidewright/common/parameter.hpp"
#include "tidewright/journal/journal_csv.hpp"

namespace tw::journal {

namespace {

// ------------------------------------------------------------ 1. text helpers
std::string lower_trim(std::string s) {
  if (s.rfind("\xEF\xBB\xBF", 0) == 0) s.erase(0, 3);
  const auto b = s.find_first_not_of(" \t\r\n");
  if (b == std::string::npos) return "";
  s = s.substr(b, s.find_last_not_of(" \t\r\n") - b + 1);
  for (char& c : s) c = static_cast<char>(std::tolower(static_cast<unsigned char>(c)));
  return s;
}

// Words of a name: split at spaces, underscores, hyphens and dots.
std::vector<std::string> words(const std::string& s) {
  std::vector<std::string> out;
  std::string w;
  for (char c : s) {
    if (c == ' ' || c == '_' || c == '-' || c == '.' || c == '\t') {
      if (!w.empty()) out.push_back(w);
      w.clear();
    } else {
      w += c;
    }
  }
  if (!w.empty()) out.push_back(w);
  return out;
}

std::string join(const std::vector<std::string>& w, size_t from, size_t to, const char* sep) {
  std::string s;
  for (size_t i = from; i < to; ++i) s += (i > from ? sep : "") + w[i];
  return s;
}

// ------------------------------------------------------------ 2. units written in a header
// The unit's letters only ("mg/L" -> "mgl", "µmol/kg" -> "umolkg", "°C" -> "c") mapped to the
// spelling the core's unit readers take; anything else is passed on for them to refuse.
std::string unit_spelling(const std::string& unit) {
  std::string k;
  for (size_t i = 0; i < unit.size(); ++i) {
    const unsigned char c = static_cast<unsigned char>(unit[i]);
    if (c == 0xC2 && i + 1 < unit.size() && static_cast<unsigned char>(unit[i + 1]) == 0xB5) {
      k += 'u';  // micro sign
      ++i;
    } else if (std::isalnum(c)) {
      k += static_cast<char>(std::tolower(c));
    }
  }
  struct Spelling {
    const char* letters;
    const char* unit;
  };
  static const Spelling kSpellings[] = {
      {"dkh", "dKH"},       {"kh", "dKH"},         {"meql", "meq/L"},        {"mmoll", "meq/L"},
      {"mglcaco3", "mg/L CaCO3"}, {"ppmcaco3", "mg/L CaCO3"}, {"caco3", "mg/L CaCO3"},
      {"mgl", "mg/L"},      {"ppm", "mg/L"},       {"umolkg", "umol/kg"},    {"mmolkg", "mmol/kg"},
      {"c", "C"},           {"degc", "C"},         {"celsius", "C"},         {"f", "F"},
      {"degf", "F"},        {"fahrenheit", "F"},   {"psu", "psu"},           {"ppt", "psu"},
      {"sg", "sg"},         {"ph", "pH"},
  };
  for (const auto& s : kSpellings)
    if (k == s.letters) return s.unit;
  return unit;
}

// ------------------------------------------------------------ 3. one cell
const char* long_alias(const std::string& name) {
  struct Alias {
    const char* text;
    const char* column;
  };
  static const Alias kAliases[] = {
      {"date", "time"},     {"datetime", "time"}, {"date_time", "time"}, {"date/time", "time"},
      {"timestamp", "time"}, {"when", "time"},    {"tank", "system"},    {"notes", "note"},
      {"comment", "note"},  {"comments", "note"}, {"remark", "note"},    {"remarks", "note"},
  };
  for (const auto& a : kAliases)
    if (name == a.text) return a.column;
  return nullptr;
}

std::optional<Parameter> parameter_named(const std::string& name) {
  auto p = tw::parameter_from_name(name);
  if (!p || *p == Parameter::Other) return std::nullopt;
  return *p;
}

CsvColumn unused(const std::string& why) {
  CsvColumn c;
  c.reason = why;
  return c;
}

// A parameter and the unit written after it.
CsvColumn reading(Parameter p, const std::string& unit_text, const std::string& cell) {
  CsvColumn c;
  c.kind = CsvColumn::Kind::Reading;
  c.parameter = p;
  if (unit_text.empty()) return c;
  const std::string unit = unit_spelling(unit_text);
  if (p == Parameter::PH) {
    if (unit == "pH") return c;
    auto scale = ph_scale_from_name(unit_text);
    if (!scale) return unused("column '" + cell + "': the pH scale '" + unit_text +
                              "' is not known; accepted: nbs, total, sws, free");
    c.ph_scale = *scale;
    return c;
  }
  auto norm = normalize_unit(p, unit);
  if (!norm) return unused("column '" + cell + "': " + norm.error().message);
  c.unit = *norm;
  return c;
}

}  // namespace

CsvColumn match_csv_column(const std::string& header_cell) {
  const std::string t = lower_trim(header_cell);
  if (t.empty()) return unused("the column has no name");
  // Our long-form names, with spaces for underscores ("other name"), and common aliases.
  std::string underscored = join(words(t), 0, words(t).size(), "_");
  for (const std::string& name : csv_long_columns()) {
    if (t == name || underscored == name) {
      CsvColumn c;
      c.kind = CsvColumn::Kind::Long;
      c.long_name = name;
      return c;
    }
  }
  if (const char* alias = long_alias(t)) {
    CsvColumn c;
    c.kind = CsvColumn::Kind::Long;
    c.long_name = alias;
    return c;
  }
  // A parameter with its unit: in brackets ("Calcium (mg/L)", "Alkalinity [dKH]") or after it.
  const size_t open = t.find_first_of("([");
  if (open != std::string::npos) {
    const size_t close = t.find_first_of(")]", open);
    const std::string name = join(words(t.substr(0, open)), 0, words(t.substr(0, open)).size(), "_");
    const std::string unit = lower_trim(t.substr(open + 1, close == std::string::npos ? std::string::npos : close - open - 1));
    if (auto p = parameter_named(name)) return reading(*p, unit, header_cell);
  } else {
    // Split at spaces and underscores only: the unit keeps its slash ("alk meq/L", "Ca_mg_l").
    const std::vector<std::string> w = words(t);
    for (size_t k = w.size(); k >= 1; --k) {
      if (auto p = parameter_named(join(w, 0, k, "_"))) return reading(*p, join(w, k, w.size(), " "), header_cell);
    }
  }
  // Worded for every front end: each says in its own way how to read the column otherwise.
  return unused("column '" + header_cell +
                "' is not one we know; known are a parameter and its unit (e.g. 'Calcium (mg/L)') and "
                "time, system, type, parameter, value, unit, note ...");
}

const std::vector<CsvColumnMeaning>& csv_column_meanings() {
  static const std::vector<CsvColumnMeaning> meanings = [] {
    std::vector<CsvColumnMeaning> out = {
        {"time", "Date and time"}, {"system", "System name"}, {"note", "Note"}};
    // The units each parameter is logged in, as normalize_unit accepts them (journal.hpp).
    struct Units {
      Parameter p;
      std::vector<const char*> units;
    };
    const Units table[] = {
        {Parameter::Alkalinity, {"dKH", "meq/L", "mg/L CaCO3", "umol/kg"}},
        {Parameter::Calcium, {"mg/L", "mmol/kg", "umol/kg"}},
        {Parameter::Magnesium, {"mg/L", "mmol/kg", "umol/kg"}},
        {Parameter::PH, {"", "nbs", "total", "sws", "free"}},
        {Parameter::Salinity, {"psu"}},
        {Parameter::SpecificGravity, {""}},
        {Parameter::Temperature, {"C", "F"}},
        {Parameter::Nitrate, {"mg/L"}},
        {Parameter::Phosphate, {"mg/L"}},
    };
    for (const Units& u : table) {
      std::string name = parameter_name(u.p);
      std::replace(name.begin(), name.end(), '_', ' ');
      for (const char* unit : u.units) {
        const std::string written = unit;
        std::string label = parameter_label(u.p);
        if (u.p == Parameter::PH) {
          static const char* const kScales[][2] = {{"nbs", "the NBS"}, {"total", "the total"}, {"sws", "the seawater"}, {"free", "the free"}};
          std::string scale = "the system's";
          for (const auto& s : kScales)
            if (written == s[0]) scale = s[1];
          label += " on " + scale + " scale";
        } else if (!written.empty()) {
          label += " in " + written;
        }
        out.push_back({written.empty() ? name : name + " " + written, label});
      }
    }
    return out;
  }();
  return meanings;
}

Result<CsvColumnMapping> parse_column_mapping(const std::string& text) {
  const size_t eq = text.rfind('=');
  if (eq == std::string::npos || eq == 0 || eq + 1 == text.size()) {
    return Error{"column mapping", "column mapping '" + text +
                                       "' is not HEADER=MEANING, e.g. 'Reading 1=alkalinity dKH' or 'Tank notes=note'"};
  }
  return CsvColumnMapping{text.substr(0, eq), text.substr(eq + 1)};
}

Result<std::vector<CsvColumn>> match_csv_header(const std::vector<std::string>& header,
                                                const std::vector<CsvColumnMapping>& mappings) {
  std::vector<CsvColumn> columns(header.size());
  std::vector<bool> mapped(header.size(), false);
  for (const CsvColumnMapping& m : mappings) {
    const std::string want = lower_trim(m.header);
    auto it = std::find_if(header.begin(), header.end(), [&](const std::string& h) { return lower_trim(h) == want; });
    if (it == header.end()) {
      std::string names;
      for (const auto& h : header) names += (names.empty() ? "'" : ", '") + lower_trim(h) + "'";
      return Error{"column mapping", "column mapping names '" + m.header +
                                         "' but the file has no such column; its columns are " + names};
    }
    const size_t i = static_cast<size_t>(it - header.begin());
    if (lower_trim(m.meaning) == "skip") {
      columns[i] = unused("column '" + *it + "' is skipped, as asked");
    } else {
      columns[i] = match_csv_column(m.meaning);
      if (columns[i].kind == CsvColumn::Kind::Unused) {
        return Error{"column mapping", "column '" + *it + "' read as '" + m.meaning + "': '" + m.meaning +
                                           "' is not a meaning we can read; accepted: a parameter and its unit "
                                           "(e.g. 'calcium mg/L', 'alkalinity dKH', 'pH total'), or time, system, "
                                           "note, ..., or skip"};
      }
    }
    mapped[i] = true;
  }
  for (size_t i = 0; i < header.size(); ++i) {
    if (!mapped[i]) columns[i] = match_csv_column(header[i]);
  }
  for (size_t i = 0; i < columns.size(); ++i) {
    if (columns[i].kind != CsvColumn::Kind::Long) continue;
    for (size_t j = 0; j < i; ++j) {
      if (columns[j].kind == CsvColumn::Kind::Long && columns[j].long_name == columns[i].long_name) {
        columns[i] = unused("column '" + header[i] + "' is read as " + columns[j].long_name +
                            " but column '" + header[j] + "' already is");
        break;
      }
    }
  }
  return columns;
}

}  // namespace tw::journal
