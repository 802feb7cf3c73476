// Free text on one line of a listing: control characters escaped, everything else kept.
#include <doctest/doctest.h>

#include "tidewright/common/one_line.hpp"

using tw::text::one_line;

TEST_CASE("one_line: line breaks and controls are escaped, spaces and letters kept") {
  CHECK(one_line(" =1+2") == " =1+2");
  CHECK(one_line("line one\nline two") == "line one\\nline two");
  CHECK(one_line("a\r\nb\tc") == "a\\r\\nb\\tc");
  CHECK(one_line("bell\x07") == "bell\\x07");
  CHECK(one_line("del\x7F") == "del\\x7F");
  CHECK(one_line("c1\xC2\x85x") == "c1\\u0085x");
  CHECK(one_line("back\\slash") == "back\\\\slash");
  CHECK(one_line("Récif ±0.2") == "Récif ±0.2");
}
