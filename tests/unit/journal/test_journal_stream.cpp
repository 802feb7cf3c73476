// The streaming JSON journal reader (journal_stream.hpp) reads what parse_journal reads and
// refuses what it refuses, with the same error text: the demo journal, a generated one, keys
// in either order, the older versions (read whole), a stream that cannot seek back, and a
// list of broken files. Events are handed on one at a time, in file order.
#include <doctest/doctest.h>

#include <algorithm>
#include <fstream>
#include <sstream>
#include <string>
#include <vector>

#include <nlohmann/json.hpp>

#include "tidewright/journal/journal_file.hpp"
#include "tidewright/journal/journal_stream.hpp"

using namespace tw::journal;
using tw::Ok;
using tw::Result;
using tw::Status;

namespace {

std::string demo_text() {
  std::string here = __FILE__;  // .../tests/unit/<area>/test_journal_stream.cpp
  const std::string root = here.substr(0, here.rfind("/tests/"));
  std::ifstream in(root + "/assets/demo/demo_journal.json", std::ios::binary);
  REQUIRE_MESSAGE(in.good(), "assets/demo/demo_journal.json not found from " << root);
  std::ostringstream s;
  s << in.rdbuf();
  return s.str();
}

// Invented data: two systems, a schedule with a missed dose, n tests a day apart.
Journal generated(int tests) {
  Journal j;
  j.description = "invented";
  System a;
  a.name = "Reef";
  a.volume_l = 380;
  System b;
  b.name = "Rack";
  b.volume_l = 900;
  REQUIRE(add_system(j, a).ok());
  REQUIRE(add_system(j, b).ok());
  const std::int64_t t0 = 1700000000;
  DoseSchedule sched;
  sched.device = "pump 1";
  sched.additive_id = "sodium_carbonate";
  sched.amount = 2;
  sched.unit = DoseUnit::Grams;
  sched.doses_per_day = 4;
  auto sid = add_event(j, Event{0, 1, t0, "", sched});
  REQUIRE(sid.ok());
  Dose missed{"sodium_carbonate", 2, DoseUnit::Grams, std::nullopt};
  missed.mark = ScheduleMark::Missed;
  missed.schedule_id = *sid;
  REQUIRE(add_event(j, Event{0, 1, t0 + 3600, "", missed}).ok());
  for (int i = 0; i < tests; ++i) {
    TestResult t{Parameter::Alkalinity, "", 7.5 + 0.01 * (i % 100), "dKH", std::nullopt, std::nullopt, ""};
    REQUIRE(add_event(j, Event{0, 1 + i % 2, t0 + 86400LL * i + 7200, "", t}).ok());
  }
  return j;
}

// A stream whose buffer cannot seek: tellg() fails, as on a pipe.
struct OneWayBuf : std::stringbuf {
  explicit OneWayBuf(const std::string& s) : std::stringbuf(s) {}
  pos_type seekoff(off_type, std::ios_base::seekdir, std::ios_base::openmode) override { return pos_type(-1); }
  pos_type seekpos(pos_type, std::ios_base::openmode) override { return pos_type(-1); }
};

Result<Journal> streamed(const std::string& text, int* version = nullptr) {
  std::istringstream in(text);
  return parse_journal_stream(in, version);
}

// Both readers refuse, with the same text; or both read the same journal.
void same_as_whole(const std::string& text) {
  auto whole = parse_journal(text);
  auto stream = streamed(text);
  REQUIRE_MESSAGE(whole.ok() == stream.ok(), text);
  if (whole.ok()) {
    CHECK(*whole == *stream);
  } else {
    CHECK(whole.error().message == stream.error().message);
    CHECK(whole.error().field == stream.error().field);
  }
}

}  // namespace

TEST_CASE("journal stream: the demo journal and a generated one read as parse_journal reads them") {
  const std::string demo = demo_text();
  int v_whole = 0, v_stream = 0;
  auto whole = parse_journal(demo, &v_whole);
  auto stream = streamed(demo, &v_stream);
  REQUIRE(whole.ok());
  REQUIRE_MESSAGE(stream.ok(), (stream.ok() ? "" : stream.error().message));
  CHECK(*stream == *whole);
  CHECK(v_stream == v_whole);
  const Journal j = generated(500);
  auto back = streamed(serialize_journal(j));
  REQUIRE(back.ok());
  CHECK(*back == j);
}

TEST_CASE("journal stream: systems before events, events out of time order, and a stream that cannot seek") {
  const Journal j = generated(50);
  // The same document with its keys in another order (nlohmann::ordered_json keeps insertion order).
  const auto doc = nlohmann::json::parse(serialize_journal(j));
  nlohmann::ordered_json o;
  for (const char* k : {"systems", "format", "schema_version", "next_id", "description", "events"}) o[k] = doc[k];
  std::reverse(o["events"].begin() + 2, o["events"].end());  // the schedule stays before its marked dose
  same_as_whole(o.dump(1));
  auto back = streamed(o.dump(1));
  REQUIRE(back.ok());
  CHECK(*back == j);  // sorted on reading

  OneWayBuf buf(serialize_journal(j));
  std::istream one_way(&buf);
  auto read = parse_journal_stream(one_way);
  REQUIRE(read.ok());
  CHECK(*read == j);
}

TEST_CASE("journal stream: events are handed on one at a time in file order, after the head") {
  const Journal j = generated(20);
  std::istringstream in(serialize_journal(j));
  bool head_seen = false;
  std::vector<std::string> paths;
  Status st = read_journal_stream(
      in,
      [&](const JournalHead& h) -> Status {
        head_seen = true;
        CHECK(h.systems.size() == 2);
        CHECK(h.next_id == j.next_id);
        CHECK(h.description == "invented");
        CHECK(paths.empty());
        return Ok{};
      },
      [&](Event&& e, const std::string& path) -> Status {
        CHECK(e == j.events[paths.size()]);
        paths.push_back(path);
        if (paths.size() == 5) return tw::Error{"stop", "stopped by the handler"};
        return Ok{};
      });
  CHECK(head_seen);
  REQUIRE_FALSE(st.ok());
  CHECK(st.error().message == "stopped by the handler");
  CHECK(paths == std::vector<std::string>{"events[0]", "events[1]", "events[2]", "events[3]", "events[4]"});
}

TEST_CASE("journal stream: older versions are read whole and migrated, as parse_journal does") {
  const std::string v1 = R"({"format":"tidewright-journal","schema_version":1,
    "systems":[{"id":1,"name":"Old reef","kind":"reef_display","volume_l":300,"salinity":35,"temperature_c":25}],
    "events":[{"id":2,"system_id":1,"time_s":1600000000,"type":"test","parameter":"ph","value":8.1,"unit":"pH"}]})";
  int version = 0;
  auto r = streamed(v1, &version);
  REQUIRE_MESSAGE(r.ok(), (r.ok() ? "" : r.error().message));
  CHECK(version == 1);
  same_as_whole(v1);
  const std::string v2 = R"({"format": "tidewright-journal", "schema_version": 2, "next_id": 3, "systems": [], "events": []})";
  same_as_whole(v2);
}

TEST_CASE("journal stream: every refusal is parse_journal's, with the same text") {
  const std::string good = serialize_journal(generated(3));
  auto with = [&](const std::string& from, const std::string& to) {
    std::string t = good;
    const auto at = t.find(from);
    REQUIRE_MESSAGE(at != std::string::npos, from);
    t.replace(at, from.size(), to);
    return t;
  };
  const std::vector<std::string> bad = {
      "",
      "   \n  ",
      "[1, 2, 3]",
      "42",
      "{\"format\": \"tidewright-journal\"",
      "{\"format\": \"tidewright-journal\",\n \"schema_version\": 3,\n \"x\": \"unclosed\n\"}",
      good + "garbage",
      with("\"format\": \"tidewright-journal\"", "\"format\": \"other\""),
      with("\"schema_version\": 3", "\"schema_version\": 4"),
      with("\"schema_version\": 3", "\"schema_version\": 0"),
      with("\"schema_version\": 3", "\"schema_version\": \"3\""),
      with("\"next_id\": ", "\"next\": "),
      with("\"next_id\": ", "\"next_id\": 1, \"old\": "),
      with("\"systems\": [", "\"systemz\": ["),
      with("\"events\": [", "\"events\": 5, \"evts\": ["),
      with("\"value\": 7.5", "\"value\": -1"),
      with("\"value\": 7.5", "\"value\": \"7.5\""),
      with("\"system_id\": 2", "\"system_id\": 9"),
      with("\"id\": 2,", "\"id\": 1,"),
      with("\"id\": 5,", "\"id\": 4,"),
      with("\"id\": 5,", "\"id\": -5,"),
      with("\"schedule_id\": 3", "\"schedule_id\": 5"),
      with("\"type\": \"test\"", "\"type\": \"tset\""),
      with("\"name\": \"Rack\"", "\"name\": \"reef\""),
      with("\"events\": [", "\"events\": [7, "),
      with("\"value\": 7.5", "\"value\": 1e400"),  // too large for a double: refused, not thrown
      with("\"next_id\": ", "\"big\": -1e999,\n \"next_id\": "),
  };
  for (const auto& text : bad) {
    INFO(text.substr(0, 200));
    CHECK_FALSE(parse_journal(text).ok());
    same_as_whole(text);
  }
  // A duplicated "events" key: the last one counts (read whole), in both readers.
  same_as_whole(with("\"events\": [", "\"events\": [], \"events\": ["));
  same_as_whole(with("\"events\": [", "\"events\": [{}], \"events\": ["));
}
