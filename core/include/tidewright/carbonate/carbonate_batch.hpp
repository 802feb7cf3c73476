// Batch carbonate solving over CSV text: one state per input row, rows in order.
// Input columns (header-driven, case-insensitive, other columns ignored, empty cell = absent):
//   id, salinity, temperature_c, alkalinity_umol_kg, dic_umol_kg, ph, ph_scale
//   (total|sws|free|nbs, default total), pco2_uatm, fco2_uatm, calcium_umol_kg,
//   phosphate_umol_kg, silicate_umol_kg, total_boron_umol_kg (measured; empty: from salinity),
//   magnesium_umol_kg (read by BatchOptions::mg_ca_correction), and per-row choices of constants that override the
//   BatchOptions: k1k2 (lueker2000|millero2010), boron (uppstrom1974|lee2010), fluoride
//   (perezfraga1987|dicksonriley1979), conventions (co2sys|guide2007)
// Each row must hold exactly two carbonate inputs (alkalinity, DIC, pH, pCO2, fCO2).
// With BatchOptions::with_uncertainty, the standard uncertainty of each output number follows
// the numbers as u_<column> (before warnings), propagated by solve_with_uncertainty
// (uncertainty.hpp) from per-row input uncertainties in the columns u_alkalinity_umol_kg,
// u_dic_umol_kg, u_ph, u_pco2_uatm, u_fco2_uatm, u_salinity, u_temperature_c,
// u_calcium_umol_kg, u_ph_scale_conversion; an empty or missing cell takes the kit default
// (default_input_uncertainties, measurement_precision.hpp).
// Output columns: see kBatchOutputColumns. A bad row gets its error ("line N: ...") in
// `warnings` and empty numbers; the other rows still run.
//
// Two ways in: CarbonateBatch takes one record at a time (with csv::RecordStream the caller
// streams any size in constant memory, and may run one CarbonateBatch per thread over
// separate blocks of rows); solve_csv_batch does a whole text at once.
#pragma once

#include <array>
#include <string>
#include <string_view>
#include <vector>

#include "tidewright/carbonate/carbonate.hpp"
#include "tidewright/carbonate/uncertainty.hpp"

namespace tw::carbonate {

inline constexpr std::array<const char*, 16> kBatchOutputColumns = {
    "id",          "ph_total",           "ph_sws",      "ph_free",     "ph_nbs",
    "pco2_uatm",   "fco2_uatm",          "alkalinity_umol_kg", "dic_umol_kg", "hco3_umol_kg",
    "co3_umol_kg", "co2_umol_kg",        "omega_calcite", "omega_aragonite", "revelle_factor",
    "warnings"};

// The u_ columns written with BatchOptions::with_uncertainty: one per number of
// kBatchOutputColumns (id and warnings have none).
inline constexpr std::array<const char*, 14> kBatchUncertaintyColumns = {
    "u_ph_total",  "u_ph_sws",  "u_ph_free",  "u_ph_nbs",  "u_pco2_uatm",  "u_fco2_uatm",
    "u_alkalinity_umol_kg", "u_dic_umol_kg", "u_hco3_umol_kg", "u_co3_umol_kg", "u_co2_umol_kg",
    "u_omega_calcite", "u_omega_aragonite", "u_revelle_factor"};

struct BatchOptions {
  K1K2Option k1k2 = K1K2Option::Lueker2000;
  BoronOption boron = BoronOption::Uppstrom1974;
  FluorideOption fluoride = FluorideOption::PerezFraga1987;
  ConstantsConvention convention = ConstantsConvention::ReferencePackages;
  double default_salinity = 35.0;      // used when a row has no salinity cell
  double default_temperature_c = 25.0; // used when a row has no temperature_c cell
  bool with_uncertainty = false;       // write the u_ columns
  bool constants_uncertainty = false;  // ... counting the constants' (Orr et al. 2018)
  // Conditions::mg_ca_correction for every row (each row then needs magnesium_umol_kg and
  // calcium_umol_kg); the correction's note goes to the row's warnings.
  bool mg_ca_correction = false;
};

// A batch solved record by record. Keeps the column map and the constants of the last row
// (rows often share their conditions), so it is not thread-safe: use one per thread.
class CarbonateBatch {
 public:
  explicit CarbonateBatch(const BatchOptions& options = {});
  // Reads the columns from the header record and appends the output header (CRLF) to out.
  void start(std::string_view header_record, std::string& out);
  // Solves one data record (its text without the line end; `line` is where it starts) and
  // appends its output row, CRLF-ended, to out. False when the row failed.
  bool solve_record(std::string_view record, int line, std::string& out);

  struct Columns {
    int id = -1, salinity = -1, temperature = -1, alkalinity = -1, dic = -1, ph = -1,
        ph_scale = -1, pco2 = -1, fco2 = -1, calcium = -1, phosphate = -1, silicate = -1,
        k1k2 = -1, boron = -1, fluoride = -1, convention = -1, total_boron = -1, magnesium = -1;
    // input uncertainties (with_uncertainty only)
    int u_alkalinity = -1, u_dic = -1, u_ph = -1, u_pco2 = -1, u_fco2 = -1, u_salinity = -1,
        u_temperature = -1, u_calcium = -1, u_ph_conversion = -1;
  };

 private:
  // The row's conditions and pair, read from the cells.
  struct Problem {
    Conditions conditions;
    InputPair pair;
  };
  Result<Problem> read_cells();
  Result<CarbonateState> solve_cells();
  Result<CarbonateOutputs> uncertainty_of(const Problem& problem);
  Result<const Constants*> constants_for(const Conditions& conditions);

  BatchOptions options_;
  Columns columns_;
  std::vector<std::string_view> cells_;  // reused for every record
  std::string scratch_;                  // unescaped quoted cells
  bool have_constants_ = false;
  Constants constants_;                  // of the last row's conditions
};

struct BatchSummary {
  std::string csv;   // the output table, CRLF line ends, header first
  int rows = 0;      // data rows read
  int failed = 0;    // rows whose state could not be computed
};

// Fails only when the text is not CSV at all or lacks a header; row problems go to `warnings`.
Result<BatchSummary> solve_csv_batch(const std::string& csv_text, const BatchOptions& options = {});

}  // namespace tw::carbonate
