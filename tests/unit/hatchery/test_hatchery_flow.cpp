// Hatchery buffering: flow-through plan (mass balance, stock within solubility, pump rate,
// point of injection, cautions), batch plan and the pump-side table.
#include <cmath>

#include <doctest/doctest.h>

#include "tidewright/common/csv.hpp"
#include "tidewright/hatchery/hatchery.hpp"
#include "tidewright/seawater/seawater.hpp"

namespace hy = tw::hatchery;
namespace cb = tw::carbonate;

namespace {

// facts.md 8 worked intake (computed here): S 32, 20 C, TA 2150 umol/kg, pCO2 800 uatm.
hy::Water worked_intake() {
  hy::Water w;
  w.salinity = 32.0;
  w.temperature_c = 20.0;
  w.measurements = {{cb::Quantity::Alkalinity, 2150.0}, {cb::Quantity::PCO2, 800.0}, cb::PhScale::Total};
  return w;
}

hy::Settings omega3(hy::Buffer buffer, double ceiling = 8.3) {
  hy::Settings s;
  s.target = {hy::TargetKind::OmegaAragonite, 3.0, cb::PhScale::Total};
  s.buffer = buffer;
  s.limits.ph_ceiling = ceiling;
  return s;
}

bool any_contains(const std::vector<std::string>& lines, const std::string& word) {
  for (const auto& l : lines)
    if (l.find(word) != std::string::npos) return true;
  return false;
}

// Molar masses from IUPAC weights, facts.md 5.
double molar_mass(hy::Compound c) {
  switch (c) {
    case hy::Compound::SodiumCarbonate: return 105.988;
    case hy::Compound::SodiumBicarbonate: return 84.006;
    case hy::Compound::SodiumHydroxide: return 39.997;
  }
  return 0;
}

}  // namespace

TEST_CASE("hatchery: flow units") {
  CHECK(hy::flow_to_l_per_min(6.0, hy::FlowUnit::CubicMetrePerHour) == doctest::Approx(100.0));
  CHECK(hy::flow_from_l_per_min(100.0, hy::FlowUnit::CubicMetrePerHour) == doctest::Approx(6.0));
  CHECK(hy::flow_unit_from_string("m3/h").value() == hy::FlowUnit::CubicMetrePerHour);
  CHECK(hy::flow_unit_from_string("L/min").value() == hy::FlowUnit::LitrePerMinute);
  CHECK(hy::flow_unit_from_string("gpm").error().field == "flow_unit");
}

TEST_CASE("hatchery: flow plan mass balance fed back through the engine reaches the target") {
  for (hy::Buffer b : {hy::Buffer::SodiumCarbonate, hy::Buffer::SodiumHydroxide, hy::Buffer::Blend}) {
    CAPTURE(hy::to_string(b));
    const double flow = 200.0;  // L/min
    hy::Settings s = omega3(b, b == hy::Buffer::Blend ? 8.0 : 8.3);
    auto plan = hy::plan_flow(worked_intake(), flow, s);
    REQUIRE(plan.ok());
    REQUIRE_FALSE(plan->lines.empty());
    const double kg_per_min = flow * tw::seawater::density_kg_per_l(32.0, 20.0);
    hy::DoseMix back;
    for (const hy::StockLine& l : plan->lines) {
      // pump mL/min x g/L = g/min; 60 x = g/h.
      CHECK(l.pump_ml_per_min * l.stock_g_per_l * 60.0 / 1000.0 == doctest::Approx(l.grams_per_hour));
      CHECK(l.grams_per_day == doctest::Approx(24.0 * l.grams_per_hour));
      CHECK(l.stock_g_per_l <= l.saturation_g_per_l);
      CHECK(l.full_mixing_dilution == doctest::Approx(flow * 1000.0 / l.pump_ml_per_min));
      const double umol = l.grams_per_hour / 60.0 / molar_mass(l.compound) / kg_per_min * 1e6;
      if (l.compound == hy::Compound::SodiumCarbonate) back.carbonate_umol_kg = umol;
      if (l.compound == hy::Compound::SodiumBicarbonate) back.bicarbonate_umol_kg = umol;
      if (l.compound == hy::Compound::SodiumHydroxide) back.hydroxide_umol_kg = umol;
    }
    auto check = hy::apply_dose(worked_intake(), back, s);
    REQUIRE(check.ok());
    CHECK(std::fabs(check->after_mixing.omega_aragonite - 3.0) < 2e-3);
    CHECK(check->after_mixing.ph_total <= s.limits.ph_ceiling + 1e-3);
    CHECK_FALSE(plan->cautions.empty());
  }
}

TEST_CASE("hatchery: sodium carbonate flow figures (facts.md 8 dose, computed here)") {
  // 287 umol/kg of alkalinity = 143.5 umol/kg Na2CO3 = 15.2 mg/kg (facts.md 8);
  // at 100 L/min of S 32, 20 C water (density about 1.0227 kg/L) that is about 93 g/h.
  auto plan = hy::plan_flow(worked_intake(), 100.0, omega3(hy::Buffer::SodiumCarbonate));
  REQUIRE(plan.ok());
  REQUIRE(plan->lines.size() == 1);
  const hy::StockLine& l = plan->lines[0];
  CHECK(l.compound == hy::Compound::SodiumCarbonate);
  const double expected = 15.2e-3 * 100.0 * 1.0227 * 60.0;  // g/h
  CHECK(std::fabs(l.grams_per_hour - expected) / expected < 0.01);
  // Default stock is 80 % of saturation at 20 C; the catalog's saturation at 20 C from 21.8 g per
  // 100 g water (facts.md 6) must lie between the density-1 bound (179 g/L) and 218 g/L.
  CHECK(l.saturation_g_per_l > 179.0);
  CHECK(l.saturation_g_per_l < 218.0);
  // Default strength: at most 80 % of saturation, and under 95 % of saturation at 15 C so a
  // cooler night does not crystallise it (so no "crystallise" warning at the defaults).
  CHECK(l.stock_g_per_l <= 0.8 * l.saturation_g_per_l + 1e-9);
  CHECK(l.stock_g_per_l <= 0.95 * hy::stock_saturation_g_per_l(hy::Compound::SodiumCarbonate, 15.0).value() + 1e-9);
  CHECK_FALSE(any_contains(plan->warnings, "crystallise"));
  // Point of injection: the stock must be diluted a long way before Omega ar drops below 5
  // (Moras et al. 2022 threshold), but less than full mixing, which is at Omega ar 3.
  CHECK(l.injection_dilution_needed > 10.0);
  CHECK(l.injection_dilution_needed < l.full_mixing_dilution);
  CHECK(any_contains(plan->warnings, "point of injection"));
  // Cautions: sodium carbonate is Eye Irrit. 2 (H319, ILO ICSC 1135, facts.md 11) and the
  // food-production deferral is always there.
  CHECK(any_contains(plan->cautions, "H319"));
  CHECK(any_contains(plan->cautions, "local regulations"));
  CHECK(any_contains(plan->cautions, "licensed practice"));
}

TEST_CASE("hatchery: hydroxide stock and cautions") {
  auto plan = hy::plan_flow(worked_intake(), 100.0, omega3(hy::Buffer::SodiumHydroxide));
  REQUIRE(plan.ok());
  REQUIRE(plan->lines.size() == 1);
  CHECK(plan->lines[0].stock_g_per_l == doctest::Approx(40.0));  // 1 mol/L default (our choice)
  // NaOH: Skin Corr. 1A, H314 (EU CLP Annex VI, facts.md 11).
  CHECK(any_contains(plan->cautions, "H314"));
  hy::Settings s = omega3(hy::Buffer::SodiumHydroxide);
  s.stock.strength_g_per_l = 100.0;
  auto strong = hy::plan_flow(worked_intake(), 100.0, s);
  REQUIRE(strong.ok());
  CHECK(any_contains(strong->warnings, "Skin Corr. 1A"));
}

TEST_CASE("hatchery: stock strength within solubility at the stock temperature") {
  // facts.md 6: Na2CO3 7.0 g/100 g water at 0 C, 21.8 at 20 C; NaHCO3 9.6 at 20 C.
  auto cold = hy::stock_saturation_g_per_l(hy::Compound::SodiumCarbonate, 0.0);
  auto warm = hy::stock_saturation_g_per_l(hy::Compound::SodiumCarbonate, 20.0);
  REQUIRE(cold.ok());
  REQUIRE(warm.ok());
  CHECK(*cold < 70.0);
  CHECK(*cold > 60.0);
  CHECK(*warm > 2.5 * *cold);
  hy::StockOptions o;
  o.temperature_c = 20.0;
  o.strength_g_per_l = 300.0;  // above saturation at 20 C
  auto over = hy::stock_strength_g_per_l(hy::Compound::SodiumCarbonate, o);
  REQUIRE_FALSE(over.ok());
  CHECK(over.error().field == "stock_g_per_l");
  o.strength_g_per_l = 50.0;
  CHECK(hy::stock_strength_g_per_l(hy::Compound::SodiumBicarbonate, o).value() == doctest::Approx(50.0));
  // A stock near saturation warns that it would crystallise in a colder room.
  hy::Settings s = omega3(hy::Buffer::SodiumCarbonate);
  s.stock.temperature_c = 20.0;
  s.stock.strength_g_per_l = 0.95 * *warm;
  auto plan = hy::plan_flow(worked_intake(), 100.0, s);
  REQUIRE(plan.ok());
  CHECK(any_contains(plan->warnings, "crystallise"));
}

TEST_CASE("hatchery: flow refuses bad input naming the option") {
  auto f = hy::plan_flow(worked_intake(), 0.0, omega3(hy::Buffer::SodiumCarbonate));
  REQUIRE_FALSE(f.ok());
  CHECK(f.error().field == "flow");
  CHECK(f.error().message.find("0.01") != std::string::npos);
  auto c = hy::plan_flow(worked_intake(), 100.0, omega3(hy::Buffer::SodiumCarbonate, 8.0));
  REQUIRE_FALSE(c.ok());
  CHECK(c.error().field == "ph_ceiling");
  // Precipitation warning when the mixed water is above the Omega ceiling (Moras et al. 2022: 5).
  hy::Settings s = omega3(hy::Buffer::SodiumCarbonate, 9.0);
  s.target.value = 6.0;
  auto hi = hy::plan_flow(worked_intake(), 100.0, s);
  REQUIRE(hi.ok());
  CHECK(any_contains(hi->warnings, "precipitation risk"));
}

TEST_CASE("hatchery: batch tank grams and chemistry after") {
  const double volume = 1000.0;
  auto plan = hy::plan_batch(worked_intake(), volume, omega3(hy::Buffer::SodiumCarbonate));
  REQUIRE(plan.ok());
  REQUIRE(plan->additions.size() == 1);
  // 15.2 mg/kg Na2CO3 (facts.md 8, computed here) x 1000 L x 1.0227 kg/L = about 15.5 g.
  CHECK(std::fabs(plan->additions[0].grams - 15.2e-3 * 1000.0 * 1.0227) < 0.1);
  CHECK(plan->water_mass_kg == doctest::Approx(volume * tw::seawater::density_kg_per_l(32.0, 20.0)));
  CHECK(std::fabs(plan->treatment.after_mixing.omega_aragonite - 3.0) < 1e-4);
  CHECK(any_contains(plan->cautions, "licensed practice"));
  auto bad = hy::plan_batch(worked_intake(), -5.0, omega3(hy::Buffer::SodiumCarbonate));
  REQUIRE_FALSE(bad.ok());
  CHECK(bad.error().field == "volume_l");
}

TEST_CASE("hatchery: pump table over intake pH at fixed alkalinity") {
  hy::Water w;
  w.salinity = 32.0;
  w.temperature_c = 20.0;
  w.measurements = {{cb::Quantity::PH, 0.0}, {cb::Quantity::Alkalinity, 2150.0}, cb::PhScale::Total};
  hy::TableRange r;
  r.varied = cb::Quantity::PH;
  r.from = 7.50;
  r.to = 8.10;
  r.step = 0.05;
  auto t = hy::build_pump_table(w, 100.0, r, omega3(hy::Buffer::SodiumCarbonate));
  REQUIRE(t.ok());
  REQUIRE(t->rows.size() == 13);
  CHECK(t->rows.front().reading == doctest::Approx(7.50));
  CHECK(t->rows.back().reading == doctest::Approx(8.10));
  // Lower intake pH (more acidified water) needs more carbonate: the pump rate falls with pH.
  for (size_t i = 1; i < t->rows.size(); ++i) {
    if (!t->rows[i].ok || !t->rows[i - 1].ok) continue;
    CHECK(t->rows[i].pump_ml_per_min[0] <= t->rows[i - 1].pump_ml_per_min[0]);
  }
  // Each row that doses reaches the target after mixing.
  for (const auto& row : t->rows) {
    if (row.ok && row.note.empty()) CHECK(std::fabs(row.omega_aragonite_after_mixing - 3.0) < 1e-3);
  }
  const std::string csv_text = hy::pump_table_csv(*t);
  auto parsed = tw::csv::parse(csv_text);
  REQUIRE(parsed.ok());
  REQUIRE(parsed->size() == 14);
  CHECK((*parsed)[0].cells[0] == "reading_ph_total");
  CHECK(tw::csv::find_column((*parsed)[0].cells, "Na2CO3_pump_ml_per_min") >= 0);
  const std::string text = hy::pump_table_text(*t);
  CHECK(text.find("Na2CO3 mL/min") != std::string::npos);
  CHECK(text.find("licensed practice") != std::string::npos);

  // A low ceiling refuses some rows, not the whole table. At fixed alkalinity the more acid
  // intake carries more DIC, so it reaches Omega ar 3 at a LOWER pH: the refused rows are the
  // high-pH ones (8.05 at pH 7.70: 8.051, computed here).
  auto low = hy::build_pump_table(w, 100.0, r, omega3(hy::Buffer::SodiumCarbonate, 8.05));
  REQUIRE(low.ok());
  CHECK(low->rows.front().ok);
  CHECK_FALSE(low->rows.back().ok);
  CHECK(low->rows.back().note.find("ceiling") != std::string::npos);
  r.step = 0.0;
  CHECK(hy::build_pump_table(w, 100.0, r, omega3(hy::Buffer::SodiumCarbonate)).error().field == "step");
}
