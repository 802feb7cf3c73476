// Batch with uncertainty (carbonate_batch.hpp, with_uncertainty): the u_ columns are the
// single-sample propagation's numbers (one code path), empty input-u cells take the kit
// defaults, and a bad u cell fails only its row, naming the column.
#include <cmath>
#include <string>

#include <doctest/doctest.h>

#include "tidewright/carbonate/carbonate_batch.hpp"
#include "tidewright/carbonate/measurement_precision.hpp"
#include "tidewright/common/csv.hpp"

namespace tc = tw::carbonate;
using Q = tc::Quantity;

namespace {
double cell(const std::vector<tw::csv::Row>& rows, std::size_t row, const std::string& name) {
  const auto& header = rows[0].cells;
  for (std::size_t i = 0; i < header.size(); ++i)
    if (header[i] == name) return std::stod(rows[row].cells[i]);
  FAIL("no column ", name);
  return 0;
}
}  // namespace

TEST_CASE("uncertainty batch: u_ columns agree with solve_with_uncertainty; defaults fill gaps") {
  tc::BatchOptions options;
  options.with_uncertainty = true;
  const std::string csv =
      "id,salinity,temperature_c,alkalinity_umol_kg,dic_umol_kg,ph,ph_scale,u_alkalinity_umol_kg,u_dic_umol_kg,u_salinity\r\n"
      "a,35,18,2300,2000,,,2,2,0\r\n"
      "b,35,25,2900,,8.15,nbs,,,\r\n"
      "c,35,25,2900,,8.15,nbs,lots,,\r\n";
  auto r = tc::solve_csv_batch(csv, options);
  REQUIRE(r.ok());
  CHECK(r->rows == 3);
  CHECK(r->failed == 1);
  auto table = tw::csv::parse(r->csv);
  REQUIRE(table.ok());
  const auto& rows = *table;
  REQUIRE(rows.size() == 4);
  CHECK(rows[0].cells.back() == "warnings");
  CHECK(rows[0].cells[rows[0].cells.size() - 2] == "u_revelle_factor");

  tc::Conditions ca;
  ca.temperature_c = 18;
  tc::InputUncertainties ua = tc::default_input_uncertainties(ca, {{Q::Alkalinity, 2300}, {Q::DIC, 2000}});
  ua.first = ua.second = 2;
  ua.salinity = 0;
  auto a = tc::solve_with_uncertainty(ca, {{Q::Alkalinity, 2300}, {Q::DIC, 2000}}, ua);
  REQUIRE(a.ok());
  CHECK(cell(rows, 1, "u_pco2_uatm") == doctest::Approx(a->u.pco2_uatm).epsilon(1e-5));
  CHECK(cell(rows, 1, "u_omega_aragonite") == doctest::Approx(a->u.omega_aragonite).epsilon(1e-5));
  CHECK(cell(rows, 1, "u_alkalinity_umol_kg") == doctest::Approx(2.0).epsilon(1e-5));

  tc::Conditions cb;
  const tc::InputPair pb{{Q::Alkalinity, 2900}, {Q::PH, 8.15}, tc::PhScale::NBS};
  auto b = tc::solve_with_uncertainty(cb, pb, tc::default_input_uncertainties(cb, pb));
  REQUIRE(b.ok());
  CHECK(b->u.alkalinity_umol_kg > 60);  // 0.2 dKH is about 70 umol/kg
  CHECK(cell(rows, 2, "u_ph_total") == doctest::Approx(b->u.ph_total).epsilon(1e-5));
  CHECK(cell(rows, 2, "u_alkalinity_umol_kg") == doctest::Approx(b->u.alkalinity_umol_kg).epsilon(1e-5));

  CHECK(rows[3].cells[1].empty());
  CHECK(rows[3].cells.back().find("u_alkalinity_umol_kg 'lots' is not a number") != std::string::npos);
}

TEST_CASE("uncertainty batch: without the option the output columns are unchanged") {
  auto r = tc::solve_csv_batch("id,alkalinity_umol_kg,dic_umol_kg\r\nx,2300,2000\r\n");
  REQUIRE(r.ok());
  CHECK(r->csv.find("u_") == std::string::npos);
  CHECK(r->csv.rfind("id,ph_total", 0) == 0);
}
