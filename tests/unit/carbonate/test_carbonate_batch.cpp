// CSV batch over the carbonate solver: row order kept, bad rows reported in `warnings`,
// good rows identical to single solves. Check value: worked example W3 of
// ../shared/reference/facts.md (computed there with the Guide's constants; TA 2300, DIC 2000,
// S 35, 25 C -> pH_T 8.0457, Omega aragonite 3.386), which the carbonate tests pin separately.
#include <doctest/doctest.h>

#include <cstdlib>

#include "tidewright/carbonate/carbonate_batch.hpp"
#include "tidewright/common/csv.hpp"
#include "tidewright/common/csv_stream.hpp"

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

TEST_CASE("carbonate batch: streamed record by record in small pieces, the output is the same") {
  // CRLF, LF and CR line ends, a BOM, blank lines, a quoted id holding a comma and a line
  // break, a bad number and a bad scale: every row keeps its place and its line number.
  const std::string input =
      "\xEF\xBB\xBFid,salinity,temperature_c,alkalinity_umol_kg,dic_umol_kg,ph,ph_scale\r\n"
      "a,35,25,2300,2000,,\r\n"
      "\r\n"
      "\"b, two\nlines\",30,20,2100,1900,,\n"
      "c,35,25,x,2000,,\r"
      "d,35,25,2300,,8.2,nbs\n"
      "e,35,25,2300,,8.2,weird\n"
      "f,33,28,2400,2050,,";
  auto whole = solve_csv_batch(input);
  REQUIRE(whole.ok());
  CHECK(whole->rows == 6);
  CHECK(whole->failed == 2);
  CHECK(whole->csv.find("line 6: x") == std::string::npos);
  CHECK(whole->csv.find("line 6: alkalinity_umol_kg 'x' is not a number") != std::string::npos);
  CHECK(whole->csv.find("\"b, two\nlines\"") != std::string::npos);
  for (std::size_t piece : {std::size_t{1}, std::size_t{2}, std::size_t{7}, std::size_t{64}}) {
    tw::csv::RecordStream stream;
    CarbonateBatch batch;
    std::string out;
    bool header = false;
    int rows = 0, failed = 0;
    const auto drain = [&] {
      tw::csv::RecordStream::Record r;
      while (stream.next(r)) {
        if (!header) {
          batch.start(r.text, out);
          header = true;
          continue;
        }
        ++rows;
        failed += batch.solve_record(r.text, r.line, out) ? 0 : 1;
      }
      stream.compact();
    };
    for (std::size_t at = 0; at < input.size(); at += piece) {
      stream.append(std::string_view(input).substr(at, piece));
      drain();
    }
    stream.finish();
    drain();
    INFO("pieces of ", piece, " bytes");
    CHECK(stream.error().ok());
    CHECK(rows == whole->rows);
    CHECK(failed == whole->failed);
    CHECK(out == whole->csv);
  }
}

TEST_CASE("carbonate batch: per-row choices of constants, and a bad choice keeps its row") {
  const std::string input =
      "id,alkalinity_umol_kg,dic_umol_kg,temperature_c,conventions,fluoride,k1k2,boron\n"
      "ref,2300,2000,30,,,,\n"
      "guide,2300,2000,30,guide2007,,,\n"
      "mixed,2300,2000,30,co2sys,dicksonriley1979,millero2010,lee2010\n"
      "bad,2300,2000,30,handbook,,,\n";
  auto batch = solve_csv_batch(input);
  REQUIRE(batch.ok());
  CHECK(batch->failed == 1);
  auto rows = tw::csv::parse(batch->csv);
  REQUIRE(rows.ok());
  const int ph_sws = tw::csv::find_column((*rows)[0].cells, "ph_sws");
  const int warn = tw::csv::find_column((*rows)[0].cells, "warnings");
  const auto single = [](ConstantsConvention conv, FluorideOption f, K1K2Option k1k2, BoronOption b) {
    Conditions c;
    c.temperature_c = 30;
    c.convention = conv;
    c.fluoride = f;
    c.k1k2 = k1k2;
    c.boron = b;
    auto k = compute_constants(c);
    REQUIRE(k.ok());
    auto s = solve(*k, {{Quantity::Alkalinity, 2300}, {Quantity::DIC, 2000}});
    REQUIRE(s.ok());
    return s->ph_sws;
  };
  const double ref = single(ConstantsConvention::ReferencePackages, FluorideOption::PerezFraga1987,
                            K1K2Option::Lueker2000, BoronOption::Uppstrom1974);
  const double guide = single(ConstantsConvention::Guide2007, FluorideOption::PerezFraga1987,
                              K1K2Option::Lueker2000, BoronOption::Uppstrom1974);
  const double mixed = single(ConstantsConvention::ReferencePackages, FluorideOption::DicksonRiley1979,
                              K1K2Option::Millero2010, BoronOption::Lee2010);
  CHECK(std::strtod((*rows)[1].cells[ph_sws].c_str(), nullptr) == ref);
  CHECK(std::strtod((*rows)[2].cells[ph_sws].c_str(), nullptr) == guide);
  CHECK(std::strtod((*rows)[3].cells[ph_sws].c_str(), nullptr) == mixed);
  CHECK(ref != guide);
  CHECK((*rows)[4].cells[0] == "bad");
  CHECK((*rows)[4].cells[ph_sws].empty());
  CHECK((*rows)[4].cells[warn].find("line 5: conventions 'handbook' is not known") != std::string::npos);
  // The batch options set every row's default; a row's own cell wins.
  BatchOptions guide_default;
  guide_default.convention = ConstantsConvention::Guide2007;
  auto g = solve_csv_batch("alkalinity_umol_kg,dic_umol_kg,temperature_c\n2300,2000,30\n", guide_default);
  REQUIRE(g.ok());
  auto grows = tw::csv::parse(g->csv);
  REQUIRE(grows.ok());
  CHECK(std::strtod((*grows)[1].cells[ph_sws].c_str(), nullptr) == guide);
}
