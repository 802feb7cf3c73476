// Plan basis from the demo journal (assets/demo/demo_journal.json, invented data from
// assets/demo/make_demo_journal.py: "Living room reef", 380 L, 1.1 dKH/day put in).
#include <fstream>
#include <iterator>
#include <string>

#include <doctest/doctest.h>

#include "tidewright/journal/journal_file.hpp"
#include "tidewright/plan/plan_from_journal.hpp"
#include "tidewright/seawater/seawater.hpp"

using namespace tw;

namespace {
std::string demo_file(const char* name) {
  std::string here = __FILE__;
  return here.substr(0, here.rfind("/tests/")) + "/assets/demo/" + name;
}
std::string read(const std::string& path) {
  std::ifstream in(path, std::ios::binary);
  REQUIRE_MESSAGE(in.good(), "cannot open " << path);
  return std::string((std::istreambuf_iterator<char>(in)), std::istreambuf_iterator<char>());
}
}  // namespace

TEST_CASE("plan from journal: demo reef basis holds the generator's demand and plans safely") {
  auto j = journal::parse_journal(read(demo_file("demo_journal.json")));
  REQUIRE(j.ok());
  const journal::System* sys = journal::find_system_by_name(*j, "Living room reef");
  REQUIRE(sys != nullptr);
  auto b = plan::plan_basis_from_journal(*j, sys->id);
  REQUIRE(b.ok());
  CHECK(b->volume_l == doctest::Approx(380));  // make_demo_journal.py
  REQUIRE(b->alkalinity_dkh.has_value());
  CHECK(b->alkalinity_dkh->demand_known);
  CHECK(b->alkalinity_dkh->demand_low95 <= 1.1);  // generator: 1.1 dKH/day
  CHECK(b->alkalinity_dkh->demand_high95 >= 1.1);
  // 1 dKH = 0.357 meq/L (facts.md): demand in meq/day for 380 L
  CHECK(b->demand.alkalinity_meq_per_day ==
        doctest::Approx(b->alkalinity_dkh->demand_per_day * 380 / 2.8).epsilon(0.01));
  auto in = plan::plan_input_from_json(read(demo_file("demo_plan.json")));
  REQUIRE(in.ok());
  auto lines = plan::apply_journal_basis(*b, in.value());
  CHECK(lines.size() >= 8);
  CHECK(in->system.alkalinity_dkh == doctest::Approx(b->alkalinity_dkh->level));
  auto p = plan::make_plan(*in);
  REQUIRE(p.ok());
  CHECK(plan::check_plan(*in, *p).ok());
}

TEST_CASE("plan from journal: a system with no tests keeps the plan input's values") {
  journal::Journal j;
  journal::System s;
  s.name = "Empty tank";
  s.volume_l = 100;
  auto id = journal::add_system(j, s);
  REQUIRE(id.ok());
  auto b = plan::plan_basis_from_journal(j, *id);
  REQUIRE(b.ok());
  CHECK_FALSE(b->alkalinity_dkh.has_value());
  plan::PlanInput in;
  in.system.alkalinity_dkh = 7.7;
  in.demand.alkalinity_meq_per_day = 12;
  auto lines = plan::apply_journal_basis(*b, in);
  CHECK(in.system.alkalinity_dkh == 7.7);
  CHECK(in.demand.alkalinity_meq_per_day == 12);
  CHECK(in.system.volume_l == 100);
  bool said = false;
  for (const auto& l : lines) said = said || l.find("alkalinity: no test in the journal") != std::string::npos;
  CHECK(said);
  CHECK_FALSE(plan::plan_basis_from_journal(j, 9999).ok());
}

// Issue 12: one rule for a system's conditions. The app's Plan and Water screens and
// `tidewright plan --journal` all take them from plan::current_conditions; on the demo reef
// the plan basis must carry exactly those numbers (the CLI once planned at 25.6 C / S 34.9
// while the app used the system's 25.5 C / S 35.0), and a newer specific-gravity test counts.
TEST_CASE("plan: the demo reef's plan basis uses the one conditions rule (specific gravity counts)") {
  auto parsed = tw::journal::parse_journal(read(demo_file("demo_journal.json")));
  REQUIRE(parsed.ok());
  tw::journal::Journal demo = *parsed;
  tw::journal::Journal* j = &demo;
  const tw::journal::System* reef = tw::journal::find_system_by_name(*j, "Living room reef");
  REQUIRE(reef != nullptr);
  const std::int64_t now = j->events.back().time_s + 86400;
  tw::plan::BasisOptions bo;
  bo.series.until_s = now;
  bo.accept_stale = true;
  auto basis = tw::plan::plan_basis_from_journal(*j, reef->id, bo);
  REQUIRE(basis.ok());
  const auto cond = tw::plan::current_conditions(*j, *reef, now);
  CHECK(basis->salinity == cond.salinity.value);
  CHECK(basis->temperature_c == cond.temperature_c.value);
  CHECK(cond.salinity.time_s.has_value());  // the demo logs salinity: not the default
  // A specific-gravity reading newer than the salinity test wins, converted by EOS-80.
  tw::journal::Event sg;
  sg.system_id = reef->id;
  sg.time_s = now - 60;
  sg.data = tw::journal::TestResult{tw::journal::Parameter::SpecificGravity, "", 1.0264, "sg", std::nullopt,
                                    std::nullopt, ""};
  REQUIRE(tw::journal::add_event(*j, sg).ok());
  const auto after = tw::plan::current_conditions(*j, *reef, now);
  const auto expected = tw::seawater::salinity_from_specific_gravity(1.0264);
  REQUIRE(expected.ok());
  CHECK(after.salinity.value == *expected);
  CHECK(after.salinity.source.find("specific gravity") != std::string::npos);
}
