// A pump's name as typed (journal/device_name.hpp): trimmed, 1 to 60 characters.
#include <doctest/doctest.h>

#include <string>

#include "tidewright/journal/device_name.hpp"

using namespace tw::journal;

TEST_CASE("device name: trimmed, then 1 to 60 characters, refused naming the field and the length") {
  auto ok = device_name_from_text("  alk doser \t");
  REQUIRE(ok.ok());
  CHECK(*ok == "alk doser");
  CHECK(device_name_from_text(std::string(60, 'a')).ok());
  auto long_name = device_name_from_text(std::string(61, 'a'), "alkalinity pump name");
  REQUIRE_FALSE(long_name.ok());
  CHECK(long_name.error().field == "alkalinity pump name");
  CHECK(long_name.error().message.find("1 to 60 characters") != std::string::npos);
  auto blank = device_name_from_text("   ");
  REQUIRE_FALSE(blank.ok());
  CHECK(blank.error().message.find("1 to 60") != std::string::npos);
  CHECK_FALSE(device_name_from_text("pump\n2").ok());
}
