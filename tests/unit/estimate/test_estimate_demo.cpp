// The demo journal (assets/demo/demo_journal.json, invented data from
// assets/demo/make_demo_journal.py) run through the adapter and the filter: each system's
// estimate should hold the demand the generator put in (make_demo_journal.py: "Living room
// reef" 1.1 dKH, 7.5 mg/L Ca, 1.5 mg/L Mg per day; "Grow-out rack 1" 1.8, 12.5, 2.5).
#include <fstream>
#include <iterator>
#include <string>

#include <doctest/doctest.h>

#include "tidewright/estimate/estimate.hpp"
#include "tidewright/journal/journal_file.hpp"

using namespace tw;
using namespace tw::estimate;

namespace {
std::string demo_path() {
  std::string here = __FILE__;  // .../tests/unit/<area>/test_estimate_demo.cpp
  return here.substr(0, here.rfind("/tests/")) + "/assets/demo/demo_journal.json";
}

void check_system(const journal::Journal& j, const char* name, const double truth[3]) {
  const journal::System* sys = journal::find_system_by_name(j, name);
  REQUIRE(sys != nullptr);
  auto s = series_from_journal(j, sys->id);
  REQUIRE(s.ok());
  for (Parameter p : kAllParameters) {
    auto e = estimate_series(s->of(p), default_filter_options(p));
    REQUIRE(e.ok());
    REQUIRE(e->demand_known);
    const double t = truth[static_cast<int>(p)];
    MESSAGE(std::string(name) << " " << std::string(tw::parameter_name(p)) << ": demand " << e->demand_per_day << " +/- "
                 << e->demand_sd << " " << std::string(tw::parameter_unit(p)) << "/day (put in: " << t << ")");
    CHECK(t >= e->demand_low95);
    CHECK(t <= e->demand_high95);
  }
}
}  // namespace

TEST_CASE("estimate: the demo journal gives back the demands it was generated with") {
  std::ifstream in(demo_path(), std::ios::binary);
  REQUIRE_MESSAGE(in.good(), "cannot open " << demo_path());
  const std::string text((std::istreambuf_iterator<char>(in)), std::istreambuf_iterator<char>());
  auto j = journal::parse_journal(text);
  REQUIRE(j.ok());
  const double living_room[3] = {1.1, 7.5, 1.5};
  const double grow_out[3] = {1.8, 12.5, 2.5};
  check_system(*j, "Living room reef", living_room);
  check_system(*j, "Grow-out rack 1", grow_out);
}
