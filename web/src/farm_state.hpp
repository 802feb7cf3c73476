// State of the Systems screen's farm views (issue 15): the overview of every system (computed
// from the core once per journal revision and hour, farm.cpp) and the round of tests for many
// systems at once (farm_round.cpp). One member of UiState (`farm`) holds all of it.
#pragma once

#include <array>
#include <cstdint>
#include <map>
#include <optional>
#include <string>
#include <vector>

#include "tidewright/common/parameter.hpp"
#include "tidewright/journal/journal.hpp"

namespace twapp {

// What the Systems screen shows: the list to manage, the farm overview, the round of tests.
enum class SystemsView { Manage, Overview, Round };

// One dosed parameter of one system, in the core's units (dKH, mg/L; shown with shown_unit).
struct FarmLevel {
  bool tested = false;
  double latest = 0;             // newest test's reading
  std::int64_t latest_s = 0;     // and when
  bool stale = false;            // estimate::is_stale at now
  bool demand_known = false;
  double demand_per_day = 0, demand_sd = 0;  // the estimate at now (as the Demand screen)
  std::optional<tw::TargetBand> band;        // the system's target, else the default, +/- the band
  tw::BandSide side = tw::BandSide::Inside;  // of the newest reading
  std::string error;             // the core's message when the estimate failed
};

// One scheduled dose still to come today (journal::scheduled_doses).
struct FarmDue {
  std::string what;  // the schedule's summary (the core's words)
  int doses_left = 0;
};

struct FarmRow {
  tw::journal::SystemId id = 0;
  std::string name;
  tw::journal::UnitPreferences units;
  std::array<FarmLevel, 3> levels;  // kDosedParameters order
  std::vector<FarmDue> due;
  std::vector<std::string> attention;  // why this system needs a look, in words; empty = none
};

struct FarmCache {
  bool valid = false;
  std::uint64_t revision = 0;  // AppState::revision
  std::int64_t now_hour = 0;
  std::int64_t now_s = 0;
  std::vector<FarmRow> rows;   // systems needing attention first, then the others, each in journal order
  int needing_attention = 0;
  double build_ms = 0;         // CPU time computing the rows, all frames together (the browser test prints it)
  double wall_ms = 0;          // from the first frame of the build to the last
  int frames = 0;              // frames the build was spread over
  int computed_count = 0;
};

// A build of the overview in progress: a few systems a frame within a time budget, so that
// a farm's worth of estimates never holds up a frame; the finished rows replace the cache.
struct FarmBuild {
  bool active = false;
  std::uint64_t revision = 0;
  std::int64_t now_hour = 0, now_s = 0;
  size_t next = 0;             // index into journal.systems
  std::vector<FarmRow> rows;   // in journal order
  double compute_ms = 0, started_ms = 0;
  int frames = 0;
};

// Which systems the round of tests lists (saved in the app part, store.hpp "round"): every
// system, those due a test (due_a_test, farm.hpp), or the keeper's own choice (a rack tested
// together each morning). A system with a value typed stays listed whatever the choice, so Save
// never saves a value the screen does not show.
enum class RoundScope { All, Due, Chosen };
struct RoundChoice {
  RoundScope scope = RoundScope::All;
  std::vector<tw::journal::SystemId> chosen;  // ascending
  bool operator==(const RoundChoice&) const = default;
};

// The round of tests: one time for all, and per system the text typed for alkalinity,
// calcium, magnesium and pH (kept as typed; the core checks them all on Save).
inline constexpr int kRoundFields = 4;
struct RoundForm {
  std::optional<std::int64_t> when_s;  // empty = now (taken when saved)
  std::map<tw::journal::SystemId, std::array<std::string, kRoundFields>> typed;
  std::string error;       // the refusal of the last Save, naming system, field and range
  std::string error_field; // widget name of the refused field (drawn with the error)
  bool choosing = false;   // the list to choose the round's systems is open
};

struct FarmState {
  SystemsView view = SystemsView::Manage;
  FarmCache cache;
  FarmBuild build;
  RoundForm round;
};

}  // namespace twapp
