// Batch carbonate solving over CSV text: one state per input row, rows in order.
// Input columns (header-driven, case-insensitive, other columns ignored, empty cell = absent):
//   id, salinity, temperature_c, alkalinity_umol_kg, dic_umol_kg, ph, ph_scale
//   (total|sws|free|nbs, default total), pco2_uatm, fco2_uatm, calcium_umol_kg,
//   phosphate_umol_kg, silicate_umol_kg
// Each row must hold exactly two carbonate inputs (alkalinity, DIC, pH, pCO2, fCO2).
// Output columns: see kBatchOutputColumns. A bad row gets its error in `warnings` and
// empty numbers; the other rows still run.
#pragma once

#include <array>
#include <string>

#include "tidewright/carbonate/carbonate.hpp"

namespace tw::carbonate {

inline constexpr std::array<const char*, 16> kBatchOutputColumns = {
    "id",          "ph_total",           "ph_sws",      "ph_free",     "ph_nbs",
    "pco2_uatm",   "fco2_uatm",          "alkalinity_umol_kg", "dic_umol_kg", "hco3_umol_kg",
    "co3_umol_kg", "co2_umol_kg",        "omega_calcite", "omega_aragonite", "revelle_factor",
    "warnings"};

struct BatchOptions {
  K1K2Option k1k2 = K1K2Option::Lueker2000;
  BoronOption boron = BoronOption::Uppstrom1974;
  double default_salinity = 35.0;      // used when a row has no salinity cell
  double default_temperature_c = 25.0; // used when a row has no temperature_c cell
};

struct BatchSummary {
  std::string csv;   // the output table, CRLF line ends, header first
  int rows = 0;      // data rows read
  int failed = 0;    // rows whose state could not be computed
};

// Fails only when the text is not CSV at all or lacks a header; row problems go to `warnings`.
Result<BatchSummary> solve_csv_batch(const std::string& csv_text, const BatchOptions& options = {});

}  // namespace tw::carbonate
