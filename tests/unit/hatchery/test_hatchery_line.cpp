// The hatchery line (issue 18): intake -> conditioned (mixed, heated) -> dosed, with pH and
// saturation at each point. Check values worked by hand.
#include <doctest/doctest.h>

#include "tidewright/hatchery/hatchery_line.hpp"

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
}  // namespace

TEST_CASE("hatchery: the line mixes two end-members by mass from a volume fraction (hand-worked)") {
  // 1 part fresh water (S 0, TA 800, DIC 850, Ca 1000 umol/kg, 15 C) to 3 parts intake (S 30,
  // TA 2100, DIC 1950, 15 C, calcium scaled from salinity). Densities (EOS-80, UNESCO 1983, at
  // 0 dbar): 0.999101 and 1.022121 kg/L. Worked by hand:
  //   mass fraction of fresh water x = 0.999101 / (0.999101 + 3 x 1.022121) = 0.245753
  //   salinity 30 (1 - x) = 22.6274; TA 2100 (1 - x) + 800 x = 1780.52; DIC 1679.67
  //   calcium: Riley & Tongudai 1967 at S 30, 0.02128 / 40.078 x 30 / 1.80655 mol/kg = 8817.3
  //   umol/kg, mixed 8817.3 (1 - x) + 1000 x = 6896.2 umol/kg.
  OtherWater fresh;
  fresh.volume_fraction = 0.25;
  fresh.salinity = 0;
  fresh.temperature_c = 15;
  fresh.alkalinity_umol_kg = 800;
  fresh.dic_umol_kg = 850;
  fresh.calcium_umol_kg = 1000;
  Conditioning c;
  c.mix = fresh;
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
