// One water sample in every salinity form people measure: practical salinity, specific gravity
// (refractometer or hydrometer, at stated sample and reference temperatures), conductivity
// (mS/cm or ratio, PSS-78) and density (EOS-80). Used by `tidewright salinity` and the app, so
// both give the same digits. Science lives in seawater.hpp; this file only chains it.
//
// CSV batch (header-driven, case-insensitive, other columns ignored, empty cell = absent):
//   input columns, exactly one non-empty per row:
//     salinity, specific_gravity, conductivity_ms_cm, conductivity_ratio, density_kg_m3
//   conditions (each optional; absent = the defaults passed in):
//     sample_temperature_c or sample_temperature_f, reference_temperature_c or
//     reference_temperature_f, pressure_dbar; temperature_c / temperature_f are accepted as
//     names for the sample temperature
//   output columns: kSalinityBatchColumns. A bad row gets its reason in `error` and empty
//   numbers; the other rows still run.
#pragma once

#include <array>
#include <optional>
#include <string>
#include <vector>

#include "tidewright/common/result.hpp"

namespace tw::seawater {

enum class SalinityInput { Salinity, SpecificGravity, ConductivityMsCm, ConductivityRatio, DensityKgM3 };
// The field name used in errors and CSV: "salinity", "specific_gravity", "conductivity_ms_cm",
// "conductivity_ratio", "density_kg_m3".
const char* to_string(SalinityInput input);

struct SalinitySample {
  SalinityInput input = SalinityInput::Salinity;
  double value = 35.0;                    // in the unit of `input`
  double sample_temperature_c = 25.0;     // temperature of the water when measured (ITS-90)
  double reference_temperature_c = 25.0;  // specific gravity only: the pure-water reference
  double pressure_dbar = 0.0;             // conductivity and density are in situ; SG is at 0
};

struct SalinityReport {
  SalinitySample sample;
  double salinity = 0;                     // practical salinity
  double specific_gravity = 0;             // at sample / reference temperature, surface
  double density_kg_m3 = 0;                // EOS-80 at sample temperature and pressure
  std::optional<double> conductivity_ms_cm;  // PSS-78, absent outside its range (see notes)
  std::optional<double> conductivity_ratio;  // C / C(35, 15, 0)
  std::vector<std::string> notes;          // why an output is absent, or cautions
};

// Salinity from the input, then every other form. Fails (the error names the input's field or
// the temperature/pressure field, and the accepted range) when the input cannot be converted;
// an output that only falls outside its own formula's range is left absent with a note.
Result<SalinityReport> describe_salinity(const SalinitySample& sample);

// ---------------------------------------------------------------- CSV batch
// "notes" says why an output is empty on a good row; "error" why a row failed.
inline constexpr std::array<const char*, 12> kSalinityBatchColumns = {
    "line",           "input",          "salinity",           "specific_gravity",
    "conductivity_ms_cm", "density_kg_m3", "sample_temperature_c", "reference_temperature_c",
    "pressure_dbar",  "conductivity_ratio", "notes",           "error"};

struct SalinityBatchRow {
  int line = 0;                       // line of the input text where the row starts
  Result<SalinityReport> report = Error{"", ""};
};

struct SalinityBatch {
  std::vector<SalinityBatchRow> rows;
  int failed = 0;
};

// Where each column is in the input (-1: absent), read from the header.
struct SalinityBatchColumns {
  int input[5] = {-1, -1, -1, -1, -1};  // in SalinityInput order
  int sample_c = -1, sample_f = -1, reference_c = -1, reference_f = -1, pressure = -1;
};

// The batch one row at a time (the command line streams files of any size through it).
class SalinityBatchReader {
 public:
  // Reads the columns from the header cells; fails when they name no salinity input.
  static Result<SalinityBatchReader> from_header(const std::vector<std::string>& header,
                                                 const SalinitySample& defaults = {});
  // One data row (cells and the line where it starts).
  SalinityBatchRow describe(const std::vector<std::string>& cells, int line) const;

 private:
  SalinityBatchColumns columns_;
  SalinitySample defaults_;
};

// Fails only when the text is not CSV or its header names none of the input columns.
// `defaults` supplies the conditions for rows without them (its input and value are unused).
Result<SalinityBatch> describe_salinity_csv(const std::string& csv_text,
                                            const SalinitySample& defaults = {});

// The batch as CSV text (header kSalinityBatchColumns, CRLF line ends, numbers with up to 10
// significant digits, spreadsheet formulas defused).
std::string format_salinity_batch_csv(const SalinityBatch& batch);
// The same CSV in pieces: the header record, and one row's record (each CRLF-ended).
std::string format_salinity_batch_header();
std::string format_salinity_batch_row(const SalinityBatchRow& row);

}  // namespace tw::seawater
