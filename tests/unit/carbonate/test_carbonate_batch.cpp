// CSV batch over the carbonate solver: row order kept, bad rows reported in `warnings`,
// good rows identical to single solves. Check value: worked example W3 of
// ../shared/reference/facts.md (computed there with the Guide's constants; TA 2300, DIC 2000,
// S 35, 25 C -> pH_T 8.0457, Omega aragonite 3.386), which the carbonate tests pin separately.
#include <doctest/doctest.h>

#include <cstdlib>

#include "tidewright/carbonate/carbonate_batch.hpp"
#include "tidewright/common/csv.hpp"

using namespace tw::carbonate;

TEST_CASE("carbonate batch: good, bad and empty rows keep their order") {
  const std::string input =
      "id,salinity,temperature_c,alkalinity_umol_kg,dic_umol_kg,ph,ph_scale,extra\n"
      "w3,35,25,2300,2000,,,ignored\n"
      "three-inputs,35,25,2300,2000,8.0,total,\n"
      "bad-number,35,25,abc,2000,,,\n"
      "nbs,35,25,2300,,8.2,nbs,\n"
      "bad-scale,35,25,2300,,8.2,weird,\n"
      "=cmd,35,25,2300,2000,,,\n";
  auto result = solve_csv_batch(input);
  REQUIRE(result.ok());
  CHECK(result->rows == 6);
  CHECK(result->failed == 3);
  auto rows = tw::csv::parse(result->csv);
  REQUIRE(rows.ok());
  REQUIRE(rows->size() == 7);
  const auto& header = (*rows)[0].cells;
  REQUIRE(header.size() == kBatchOutputColumns.size());
  const int ph_col = tw::csv::find_column(header, "ph_total");
  const int omega_col = tw::csv::find_column(header, "omega_aragonite");
  const int warn_col = tw::csv::find_column(header, "warnings");

  const auto& w3 = (*rows)[1].cells;
  CHECK(w3[0] == "w3");
  CHECK(std::strtod(w3[ph_col].c_str(), nullptr) == doctest::Approx(8.0457).epsilon(1e-4));
  CHECK(std::strtod(w3[omega_col].c_str(), nullptr) == doctest::Approx(3.386).epsilon(1e-3));

  CHECK((*rows)[2].cells[ph_col].empty());
  CHECK((*rows)[2].cells[warn_col].find("exactly two") != std::string::npos);
  CHECK((*rows)[3].cells[warn_col].find("alkalinity_umol_kg") != std::string::npos);
  CHECK((*rows)[3].cells[warn_col].find("line 4") != std::string::npos);
  CHECK_FALSE((*rows)[4].cells[ph_col].empty());
  CHECK((*rows)[5].cells[ph_col].empty());
  CHECK((*rows)[6].cells[0] == "'=cmd");  // a spreadsheet would run "=cmd" as a formula
}

TEST_CASE("carbonate batch: a row matches the single solve to the last digit") {
  auto batch = solve_csv_batch("alkalinity_umol_kg,pco2_uatm,salinity,temperature_c\n2150,800,32,20\n");
  REQUIRE(batch.ok());
  auto rows = tw::csv::parse(batch->csv);
  REQUIRE(rows.ok());
  Conditions c;
  c.salinity = 32;
  c.temperature_c = 20;
  auto k = compute_constants(c);
  REQUIRE(k.ok());
  auto s = solve(*k, {{Quantity::Alkalinity, 2150}, {Quantity::PCO2, 800}});
  REQUIRE(s.ok());
  const int ph_col = tw::csv::find_column((*rows)[0].cells, "ph_total");
  CHECK(std::strtod((*rows)[1].cells[ph_col].c_str(), nullptr) == s->ph_total);
}

TEST_CASE("carbonate batch: text without a header is refused") {
  CHECK_FALSE(solve_csv_batch("").ok());
  CHECK_FALSE(solve_csv_batch("\"unclosed\n").ok());
}
