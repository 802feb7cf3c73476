// The --batch runs of `chem` and `salinity`, streamed: input read in chunks, rows solved as
// they come (in blocks shared among threads for chem), output written as it is made, in the
// input's order. Memory stays constant whatever the size of the input.
#pragma once

#include <string>

#include "tidewright/carbonate/carbonate_batch.hpp"
#include <nlohmann/json.hpp>

#include "tidewright/seawater/salinity_convert.hpp"

namespace tw::shell {

struct BatchCounts {
  long long rows = 0;    // data rows read
  long long failed = 0;  // rows that got an error instead of numbers
};

// `tidewright chem --batch INPUT [--out OUT]`: threads >= 1 (rows are independent; output
// keeps the input order). Throws CommandError when the input is unreadable or not CSV; rows
// that fail are counted and carry their reason in the warnings column.
BatchCounts run_chem_batch(const std::string& input, const std::string& out,
                           const carbonate::BatchOptions& options, int threads);

// One salinity report as JSON, the same object for `salinity --json` and each batch row.
nlohmann::json salinity_report_json(const seawater::SalinityReport& report);

// `tidewright salinity --batch INPUT [--out OUT] [--json]`.
BatchCounts run_salinity_batch(const std::string& input, const std::string& out,
                               const seawater::SalinitySample& defaults, bool json);

}  // namespace tw::shell
