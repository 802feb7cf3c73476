// Issue 18: the low-salinity constant set (Millero 2010) offered, with a reason, where the
// default set (Lueker et al. 2000) is used outside its calibration range -- in chem and in
// the hatchery. Ranges: Lueker et al. (2000) S 19-43, 2-35 C (from memory, kRangeLueker2000);
// Millero (2010) S 1-50, 0-50 C (CO2SYS.m v3.1.1 option list: "T: 0-50 S: 1-50").
#include <doctest/doctest.h>

#include <string>

#include "tidewright/carbonate/carbonate.hpp"
#include "tidewright/hatchery/hatchery.hpp"

namespace cb = tw::carbonate;
namespace hy = tw::hatchery;

TEST_CASE("carbonate: Millero (2010) suggested for brackish water, with its reason, and only then") {
  cb::Conditions c;
  c.salinity = 12;
  c.temperature_c = 22;
  const auto hint = cb::suggest_k1k2(c);
  REQUIRE(hint.has_value());
  CHECK(hint->option == cb::K1K2Option::Millero2010);
  CHECK(hint->reason.find("Lueker et al. (2000), S 19 to 43") != std::string::npos);
  CHECK(hint->reason.find("Millero (2010)") != std::string::npos);
  const auto k = cb::compute_constants(c);
  REQUIRE(k.ok());
  REQUIRE(k->k1k2_suggestion.has_value());
  bool warned = false;
  for (const auto& w : k->warnings) warned |= w == hint->reason;
  CHECK(warned);  // every front end that lists warnings shows it
  c.salinity = 35;  // inside Lueker's range: nothing to suggest
  CHECK_FALSE(cb::suggest_k1k2(c).has_value());
  c.salinity = 12;
  c.k1k2 = cb::K1K2Option::Millero2010;  // already chosen
  CHECK_FALSE(cb::suggest_k1k2(c).has_value());
  CHECK_FALSE(cb::compute_constants(c)->k1k2_suggestion.has_value());
  c.k1k2 = cb::K1K2Option::Lueker2000;
  c.salinity = 0.5 + 0.5;  // S 1: Millero (2010)'s own lower end still covers it
  CHECK(cb::suggest_k1k2(c).has_value());
}

TEST_CASE("hatchery: a brackish intake takes the chosen K1 K2 set, and is told of Millero (2010)") {
  hy::Water w;
  w.salinity = 12;
  w.temperature_c = 18;
  w.measurements = {{cb::Quantity::Alkalinity, 1600.0}, {cb::Quantity::PH, 7.7}, cb::PhScale::Total};
  hy::Settings s;
  s.target = {hy::TargetKind::OmegaAragonite, 1.5, cb::PhScale::Total};
  const auto lueker = hy::plan_flow(w, 100, s);
  REQUIRE(lueker.ok());
  bool suggested = false;
  for (const auto& m : lueker->warnings) suggested |= m.find("is the set suggested for this water") != std::string::npos;
  CHECK(suggested);
  w.k1k2 = cb::K1K2Option::Millero2010;
  const auto millero = hy::plan_flow(w, 100, s);
  REQUIRE(millero.ok());
  for (const auto& m : millero->warnings) CHECK(m.find("suggested for this water") == std::string::npos);
  // The set matters at S 12: the dose to the same Omega differs (K2 differs by several %).
  INFO("added alkalinity Lueker ", lueker->treatment.dose.alkalinity_umol_kg(), ", Millero ",
       millero->treatment.dose.alkalinity_umol_kg());
  CHECK(lueker->treatment.dose.alkalinity_umol_kg() != millero->treatment.dose.alkalinity_umol_kg());
}
