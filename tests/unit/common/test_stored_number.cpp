// Numbers as the journal stores and shows them: no conversion noise, volumes in the system's unit.
#include <doctest/doctest.h>

#include <cmath>
#include <cstdlib>
#include <random>
#include <string>

#include <fmt/format.h>

#include "tidewright/common/stored_number.hpp"
#include "tidewright/journal/journal.hpp"
#include "tidewright/journal/journal_file.hpp"

using tw::stored_number;
using tw::volume_text;
using tw::units::VolumeUnit;

TEST_CASE("stored_number: binary noise goes, meaningful digits stay") {
  CHECK(stored_number(2300.000000000001) == 2300.0);
  CHECK(stored_number(0.1 + 0.2) == 0.3);
  CHECK(stored_number(7.570823568) == 7.570823568);
  CHECK(stored_number(-2.5) == -2.5);
  CHECK(stored_number(0.0) == 0.0);
  CHECK(std::isnan(stored_number(std::nan(""))));
}

// The rule itself, written the slow way: text with 12 significant digits, parsed back.
double rounded_to_12_digits(double value) {
  return std::strtod(fmt::format("{:.12g}", value).c_str(), nullptr);
}

TEST_CASE("stored_number: the fast path for short numbers gives exactly what the rounding gives") {
  std::mt19937_64 rng(20261205);
  std::uniform_real_distribution<double> mantissa(1.0, 10.0);
  std::uniform_int_distribution<int> exponent(-12, 15), digits(1, 17), sign(0, 1);
  int fast = 0;
  for (int i = 0; i < 200000; ++i) {
    // Numbers of 1 to 17 significant digits at magnitudes 1e-12 to 1e15: short ones as people
    // type them, long ones as unit conversions leave them.
    const int n = digits(rng);
    const double scale = std::pow(10.0, n - 1);
    double v = std::round(mantissa(rng) * scale) / scale * std::pow(10.0, exponent(rng));
    if (sign(rng)) v = -v;
    if (stored_number(v) == v) ++fast;
    REQUIRE_MESSAGE(stored_number(v) == rounded_to_12_digits(v), fmt::format("{:.17g}", v));
  }
  CHECK(fast > 100000);  // most of them are already stored as they are
}

TEST_CASE("volume_text: gallons with two decimals, litres without noise") {
  CHECK(volume_text(tw::units::us_gallons_to_litres(2.0), VolumeUnit::UsGallon) == "2.00 gal");
  CHECK(volume_text(40, VolumeUnit::Litre) == "40 L");
  CHECK(volume_text(7.570823568, VolumeUnit::Litre) == "7.57 L");
}

TEST_CASE("journal: what is added is stored rounded, so its JSON shows no float noise") {
  using namespace tw::journal;
  Journal j;
  System s;
  s.name = "Garage";
  s.volume_l = 2300.000000000001;
  const SystemId id = *add_system(j, s);
  CHECK(find_system(j, id)->volume_l == 2300.0);
  TestResult ca{Parameter::Calcium, "", 0.1 + 0.2 + 419.7, "mg/L", std::nullopt, std::nullopt, ""};
  const EventId e = *add_event(j, Event{0, id, 1700000000, "", ca});
  CHECK(std::get<TestResult>(find_event(j, e)->data).value == 420.0);
  const std::string text = serialize_journal(j);
  CHECK(text.find("000000000") == std::string::npos);
  CHECK(text.find("999999999") == std::string::npos);
}

TEST_CASE("journal JSON: a record stored before rounding is written without noise and reads back exactly") {
  using namespace tw::journal;
  Journal old;  // put in directly, as an older program stored it
  System s;
  s.id = 1;
  s.name = "Old reef";
  s.volume_l = 2300.000000000001;
  old.systems = {s};
  old.next_id = 2;
  const std::string text = serialize_journal(old);
  CHECK(text.find("2300.000000000001") == std::string::npos);
  CHECK(text.find("2300.0") != std::string::npos);
  auto back = parse_journal(text);
  REQUIRE(back.ok());
  CHECK(back->systems[0].volume_l == 2300.0);
  CHECK(serialize_journal(*back) == text);
  CHECK(system_to_json(s).dump().find("000000000") == std::string::npos);
}
