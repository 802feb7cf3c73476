// What each header cell of an imported spreadsheet means. People name their columns their own
// way ("Calcium (mg/L)", "Ca_mg_l", "Alkalinity [dKH]", "alk meq/L", "Date", "Notes"); this
// reads such names into our columns (journal_csv.hpp) and says, for every column it cannot
// use, why. Units in a header are checked by the journal's normalize_unit (units.hpp does the
// converting later); nothing here converts a value.
#pragma once

#include <optional>
#include <string>
#include <vector>

#include "tidewright/carbonate/carbonate.hpp"
#include "tidewright/common/result.hpp"
#include "tidewright/journal/journal.hpp"

namespace tw::journal {

struct CsvColumn {
  enum class Kind {
    Long,     // one of csv_long_columns(): time, system, type, parameter, value, note ...
    Reading,  // a column of one parameter's results, one test per non-empty cell
    Unused,   // nothing we can read; `reason` says why
  };
  Kind kind = Kind::Unused;
  std::string long_name;                        // Long
  Parameter parameter = Parameter::Alkalinity;  // Reading
  std::string unit;                             // Reading: normalised; "" = the system's preference
  std::optional<carbonate::PhScale> ph_scale;   // Reading of pH: the scale named; none = the system's
  std::string reason;                           // Unused
};

// One header cell read on its own. Case, spaces, underscores, a BOM and a unit in brackets
// or after the name do not matter: "Calcium (mg/L)", "calcium_mg_l", "Ca mg/L" are the same.
CsvColumn match_csv_column(const std::string& header_cell);

// The user's own reading of a column: header -> meaning, where the meaning is any text
// match_csv_column understands ("time", "calcium mg/L", "alkalinity dKH", "note") or "skip".
struct CsvColumnMapping {
  std::string header;
  std::string meaning;
};
// The meanings a column can be read as, each as match_csv_column reads it and in plain words,
// for a front end to offer as a choice (the app's "Read as…"): time, system and note, then
// every parameter in every unit it is logged in (pH on the system's scale or a named one).
// "skip" is not listed. Any other text match_csv_column understands is accepted as well.
struct CsvColumnMeaning {
  std::string meaning;  // "alkalinity dKH": what a CsvColumnMapping's meaning takes
  std::string label;    // "Alkalinity in dKH"
};
const std::vector<CsvColumnMeaning>& csv_column_meanings();

// "Reading 1=alkalinity dKH" -> {"Reading 1", "alkalinity dKH"}; field "column mapping".
Result<CsvColumnMapping> parse_column_mapping(const std::string& text);

// Every header cell read, with the user's mappings first. A second column read as the same
// long-form column is Unused ("column 'x' is already read as time"). Errors (field "column
// mapping"): a mapping names a header the file does not have, or a meaning we cannot read.
Result<std::vector<CsvColumn>> match_csv_header(const std::vector<std::string>& header,
                                                const std::vector<CsvColumnMapping>& mappings = {});

}  // namespace tw::journal
