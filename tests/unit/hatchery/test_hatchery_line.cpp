// The hatchery line (issue 18): intake -> conditioned (mixed, heated) -> dosed, with pH and
// saturation at each point. Check values worked by hand.
#include <doctest/doctest.h>

#include <cmath>

#include "tidewright/hatchery/hatchery_line.hpp"
#include "tidewright/seawater/seawater.hpp"

using namespace tw::hatchery;
namespace cb = tw::carbonate;

namespace {
Water intake_s30() {
  Water w;
  w.salinity = 30;
  w.temperature_c = 15;
  w.measurements = {{cb::Quantity::Alkalinity, 2100}, {cb::Quantity::DIC, 1950}, cb::PhScale::Total};
  return w;
}

// 1 part fresh water (S 0, TA 800, DIC 850, Ca 1000 umol/kg, 15 C) to 3 parts intake.
Conditioning quarter_fresh_water() {
  OtherWater fresh;
  fresh.volume_fraction = 0.25;
  fresh.salinity = 0;
  fresh.temperature_c = 15;
  fresh.alkalinity_umol_kg = 800;
  fresh.dic_umol_kg = 850;
  fresh.calcium_umol_kg = 1000;
  Conditioning c;
  c.mix = fresh;
  return c;
}
}  // namespace

TEST_CASE("hatchery: the line mixes two end-members by mass from a volume fraction (hand-worked)") {
  // 1 part fresh water (S 0, TA 800, DIC 850, Ca 1000 umol/kg, 15 C) to 3 parts intake (S 30,
  // TA 2100, DIC 1950, 15 C, calcium scaled from salinity). Densities (EOS-80, UNESCO 1983, at
  // 0 dbar): 0.999101 and 1.022121 kg/L. Worked by hand:
  //   mass fraction of fresh water x = 0.999101 / (0.999101 + 3 x 1.022121) = 0.245753
  //   salinity 30 (1 - x) = 22.6274; TA 2100 (1 - x) + 800 x = 1780.52; DIC 1679.67
  //   calcium: Riley & Tongudai 1967 at S 30, 0.02128 / 40.078 x 30 / 1.80655 mol/kg = 8817.3
  //   umol/kg, mixed 8817.3 (1 - x) + 1000 x = 6896.2 umol/kg.
  const Conditioning c = quarter_fresh_water();
  Settings s;
  s.target = {TargetKind::OmegaAragonite, 1.5, cb::PhScale::Total};
  Water in = intake_s30();
  in.k1k2 = cb::K1K2Option::Millero2010;  // the mixed water (S 22.6) and intake both inside its range
  auto line = plan_line(in, c, s);
  REQUIRE(line.ok());
  REQUIRE(line->points.size() == 4);
  const LinePoint& mixed = line->points[1];
  CHECK(mixed.salinity == doctest::Approx(22.6274).epsilon(1e-5));
  CHECK(mixed.temperature_c == doctest::Approx(15.0));
  CHECK(mixed.state.alkalinity_umol_kg == doctest::Approx(1780.52).epsilon(1e-5));
  CHECK(mixed.state.dic_umol_kg == doctest::Approx(1679.67).epsilon(1e-5));
  CHECK(mixed.calcium_umol_kg == doctest::Approx(6896.2).epsilon(1e-5));
  CHECK(line->points[0].calcium_umol_kg == doctest::Approx(8817.3).epsilon(1e-5));
  // The dose is planned on the conditioned water: the dosed point meets the target there.
  CHECK(line->points[2].state.omega_aragonite == doctest::Approx(1.5).epsilon(1e-3));
  CHECK(line->points[2].salinity == doctest::Approx(22.6274).epsilon(1e-5));
  MESSAGE("pH total / Omega ar: intake " << line->points[0].state.ph_total << " / " << line->points[0].state.omega_aragonite
          << ", mixed " << mixed.state.ph_total << " / " << mixed.state.omega_aragonite << ", dosed "
          << line->points[2].state.ph_total << " / " << line->points[2].state.omega_aragonite);
  // Diluting with low-alkalinity fresh water lowers saturation before the dose.
  CHECK(mixed.state.omega_aragonite < line->points[0].state.omega_aragonite);
}

TEST_CASE("hatchery: heating keeps alkalinity and DIC and moves pH and saturation") {
  Conditioning heat;
  heat.tank_temperature_c = 25;
  Settings s;
  s.target = {TargetKind::OmegaAragonite, 2.0, cb::PhScale::Total};
  auto line = plan_line(intake_s30(), heat, s);
  REQUIRE(line.ok());
  const auto& a = line->points[0].state;
  const auto& b = line->points[1].state;
  CHECK(b.alkalinity_umol_kg == doctest::Approx(a.alkalinity_umol_kg));
  CHECK(b.dic_umol_kg == doctest::Approx(a.dic_umol_kg));
  CHECK(line->points[1].salinity == 30);
  CHECK(line->points[1].temperature_c == 25);
  // Warming a closed sample lowers pH (about 0.015 per degree in seawater, Dickson, Sabine &
  // Christian 2007, common practice) and raises Omega aragonite (Ksp falls, CO3 rises).
  MESSAGE("pH total 15 C " << a.ph_total << " -> 25 C " << b.ph_total << "; Omega ar " << a.omega_aragonite << " -> "
                           << b.omega_aragonite);
  CHECK((a.ph_total - b.ph_total) / 10.0 == doctest::Approx(0.015).epsilon(0.25));
  CHECK(b.omega_aragonite > a.omega_aragonite);
}

TEST_CASE("hatchery: the line refuses bad mixing input naming the field and the range") {
  Settings s;
  OtherWater o;
  o.volume_fraction = 1.2;
  auto bad = plan_line(intake_s30(), Conditioning{o, std::nullopt}, s);
  REQUIRE_FALSE(bad.ok());
  CHECK(bad.error().field == "mix_fraction");
  CHECK(bad.error().message.find("0 to 1") != std::string::npos);
  o.volume_fraction = 0.99;  // S 0.3: below where the constants end
  auto too_fresh = plan_line(intake_s30(), Conditioning{o, std::nullopt}, s);
  REQUIRE_FALSE(too_fresh.ok());
  CHECK(too_fresh.error().field == "mix_fraction");
  auto hot = plan_line(intake_s30(), Conditioning{std::nullopt, 60.0}, s);
  REQUIRE_FALSE(hot.ok());
  CHECK(hot.error().field == "tank_temperature_c");
}

TEST_CASE("hatchery: a salt mix's measured boron and magnesium mix by mass along the line") {
  // The same 1 : 3 mix of fresh water into the S 30 intake as above (mass fraction of fresh
  // water x = 0.245753, hand-worked there).
  OtherWater fresh;
  fresh.volume_fraction = 0.25;
  fresh.salinity = 0;
  fresh.temperature_c = 15;
  fresh.alkalinity_umol_kg = 800;
  fresh.dic_umol_kg = 850;
  Conditioning c;
  c.mix = fresh;
  Settings s;
  s.target = {TargetKind::OmegaAragonite, 1.5, cb::PhScale::Total};
  Water in = intake_s30();
  in.k1k2 = cb::K1K2Option::Millero2010;

  SUBCASE("boron at seawater's ratio, entered as measured: the same line as boron scaled from salinity") {
    // Uppstrom (1974) at S 30: 0.000232 / 10.811 x 30 / 1.80655 mol/kg = 356.37 umol/kg; mixed
    // with boron-free water it stays at seawater's ratio (356.37 (1 - x) = Uppstrom at 22.6274).
    auto scaled = plan_line(in, c, s);
    REQUIRE(scaled.ok());
    Water measured = in;
    measured.total_boron_umol_kg = 0.000232 / 10.811 * 30 / 1.80655 * 1e6;
    auto line = plan_line(measured, c, s);
    REQUIRE(line.ok());
    REQUIRE(line->conditioned.total_boron_umol_kg.has_value());
    CHECK(*line->conditioned.total_boron_umol_kg == doctest::Approx(356.37 * (1 - 0.245753)).epsilon(1e-4));
    for (std::size_t i = 0; i < line->points.size(); ++i) {
      CHECK(line->points[i].state.ph_total == doctest::Approx(scaled->points[i].state.ph_total).epsilon(1e-9));
      CHECK(line->points[i].state.omega_aragonite == doctest::Approx(scaled->points[i].state.omega_aragonite).epsilon(1e-9));
    }
    CHECK(line->treatment.dose.alkalinity_umol_kg() == doctest::Approx(scaled->treatment.dose.alkalinity_umol_kg()).epsilon(1e-9));
  }
  SUBCASE("twice seawater's boron: more borate, a different dose, and the note says how it was mixed") {
    Water measured = in;
    measured.total_boron_umol_kg = 2 * 356.37;
    auto line = plan_line(measured, c, s);
    auto scaled = plan_line(in, c, s);
    REQUIRE(line.ok());
    REQUIRE(scaled.ok());
    CHECK(*line->conditioned.total_boron_umol_kg == doctest::Approx(2 * 356.37 * (1 - 0.245753)).epsilon(1e-4));
    CHECK(line->treatment.dose.alkalinity_umol_kg() != doctest::Approx(scaled->treatment.dose.alkalinity_umol_kg()));
    bool said = false;
    for (const std::string& n : line->notes) said |= n.find("measured boron mixed by mass") != std::string::npos;
    CHECK(said);
  }
  SUBCASE("magnesium mixed with sea water of another salinity takes seawater's ratio there") {
    // 25 % by volume of S 35 water at 15 C: Mg 52817.1 x 35 / 35 umol/kg (Millero et al. 2008).
    OtherWater sea = fresh;
    sea.salinity = 35;
    sea.alkalinity_umol_kg = 2300;
    sea.dic_umol_kg = 2050;
    Conditioning cs;
    cs.mix = sea;
    Water measured = in;
    measured.magnesium_umol_kg = 40000;
    auto line = plan_line(measured, cs, s);
    REQUIRE(line.ok());
    // Mass fraction of the S 35 water: 1.025973 / (1.025973 + 3 x 1.022122) (EOS-80 densities
    // at 15 C, 0 dbar, UNESCO 1983) = 0.250706.
    const double x = 0.250706;
    CHECK(*line->conditioned.magnesium_umol_kg == doctest::Approx((1 - x) * 40000 + x * 52817.1).epsilon(1e-6));
  }
}

TEST_CASE("hatchery: pump rates through the line are for the conditioned water at the dosed flow") {
  Settings s;
  s.target = {TargetKind::OmegaAragonite, 1.5, cb::PhScale::Total};
  Water in = intake_s30();
  in.k1k2 = cb::K1K2Option::Millero2010;
  const double intake_flow = 100;  // L/min

  SUBCASE("without conditioning the line's rates are plan_flow's on the intake") {
    auto lf = plan_line_flow(in, Conditioning{}, intake_flow, s);
    auto direct = plan_flow(in, intake_flow, s);
    REQUIRE(lf.ok());
    REQUIRE(direct.ok());
    CHECK(lf->dosed_flow_l_per_min == doctest::Approx(intake_flow));
    REQUIRE(lf->flow.lines.size() == direct->lines.size());
    for (size_t i = 0; i < direct->lines.size(); ++i) {
      CHECK(lf->flow.lines[i].pump_ml_per_min == doctest::Approx(direct->lines[i].pump_ml_per_min).epsilon(1e-9));
    }
  }

  SUBCASE("a quarter fresh water: a third more flow, the line's dose, g/h worked from it") {
    const Conditioning c = quarter_fresh_water();
    auto lf = plan_line_flow(in, c, intake_flow, s);
    REQUIRE(lf.ok());
    // 100 L/min of intake is 3/4 of the dosed flow: 133.33 L/min at the dose point.
    CHECK(lf->dosed_flow_l_per_min == doctest::Approx(133.3333).epsilon(1e-6));
    REQUIRE(lf->flow.lines.size() == 1);
    const StockLine& soda = lf->flow.lines[0];
    // The dose is the line's own (planned on the conditioned water), not the intake's.
    CHECK(soda.umol_per_kg == doctest::Approx(lf->line.treatment.dose.alkalinity_umol_kg() / 2).epsilon(1e-9));
    // g/h = umol/kg x 1e-6 x 105.988 g/mol (Na2CO3, IUPAC atomic weights) x kg/h of the dosed
    // flow, its density that of the conditioned water (EOS-80 at S 22.63, 15 C).
    const double rho = tw::seawater::density_kg_per_l(lf->line.conditioned.salinity, lf->line.conditioned.temperature_c);
    CHECK(soda.grams_per_hour == doctest::Approx(soda.umol_per_kg * 1e-6 * 105.988 * 133.3333 * 60 * rho).epsilon(1e-4));
    // What a plan on the intake as read would meter (the defect this fixes): the intake is
    // already above the target, so it doses nothing, while the diluted water needs a dose.
    auto intake_only = plan_flow(in, intake_flow, s);
    REQUIRE(intake_only.ok());
    double intake_only_g_h = 0;
    for (const StockLine& l : intake_only->lines) intake_only_g_h += l.grams_per_hour;
    MESSAGE("through the line " << soda.grams_per_hour << " g/h; on the intake as read " << intake_only_g_h << " g/h");
    CHECK_FALSE(intake_only->treatment.dose_needed);
    CHECK(soda.grams_per_hour > 1);
  }

  SUBCASE("the other water as the whole flow is refused, naming the field") {
    OtherWater sea;
    sea.volume_fraction = 0.995;
    sea.salinity = 30;
    Conditioning c;
    c.mix = sea;
    auto lf = plan_line_flow(in, c, intake_flow, s);
    REQUIRE_FALSE(lf.ok());
    CHECK(lf.error().field == "mix_fraction");
    CHECK(lf.error().message.find("accepted 0 to 0.99") != std::string::npos);
  }

  SUBCASE("the pump-side table through the line: each row conditioned first, as plan_line_flow") {
    Water ph_in;
    ph_in.salinity = 30;
    ph_in.temperature_c = 15;
    ph_in.k1k2 = cb::K1K2Option::Millero2010;
    ph_in.measurements = {{cb::Quantity::PH, 7.80}, {cb::Quantity::Alkalinity, 2100}, cb::PhScale::Total};
    Conditioning c;
    c.tank_temperature_c = 22;
    auto table = build_line_pump_table(ph_in, c, intake_flow, {cb::Quantity::PH, 7.70, 7.90, 0.10}, s);
    REQUIRE(table.ok());
    REQUIRE(table->rows.size() == 3);
    auto middle = plan_line_flow(ph_in, c, intake_flow, s);
    REQUIRE(middle.ok());
    REQUIRE(table->rows[1].ok);
    CHECK(table->rows[1].pump_ml_per_min[0] == doctest::Approx(middle->flow.lines[0].pump_ml_per_min).epsilon(1e-9));
    CHECK(table->line_note.find("brought to 22 C") != std::string::npos);
    CHECK(pump_table_text(*table).find("through the line") != std::string::npos);
  }
}
