// The farm overview's rows: for every system, the newest test and the estimate of each dosed
// parameter (the Demand screen's own estimate_system), its place against the target band
// (tw::band_side), staleness (estimate::is_stale) and the scheduled doses still to come today
// (journal::scheduled_doses). Computed once per journal revision and hour, a few systems a
// frame within a time budget (FarmBuild), never again on frames that change nothing.
#include "farm.hpp"

#include <cmath>
#include <map>

#include "actions.hpp"
#include "actions_dosing.hpp"
#include "format.hpp"
#include "local_time.hpp"
#include "platform.hpp"
#include "tidewright/carbonate/uncertainty.hpp"
#include "tidewright/journal/schedule.hpp"

namespace twapp {

namespace {

namespace jn = tw::journal;

// CPU time the overview may take from one frame (of the 16 ms a frame has at 60 Hz).
constexpr double kFarmFrameBudgetMs = 6.0;

// The last second of the local day that holds now_s (the next midnight in its own offset:
// the night of a daylight-saving change has 23 or 25 hours).
std::int64_t end_of_local_day(std::int64_t now_s) {
  const std::int64_t local = now_s + 60LL * platform::utc_offset_minutes_at(now_s);
  const std::int64_t day = local >= 0 ? local / 86400 : (local - 86399) / 86400;
  return local_time::to_utc((day + 1) * 86400) - 1;
}

std::string level_text(const FarmLevel& l, tw::Parameter p, const jn::UnitPreferences& units) {
  const ShownUnit su = shown_unit(units, p);
  return fmtx::fixed(l.latest * su.factor, su.decimals) + " " + su.unit;
}

FarmRow row_of(const jn::Journal& journal, const jn::System& sys, std::int64_t now_s, std::int64_t day_end_s) {
  FarmRow row;
  row.id = sys.id;
  row.name = sys.name;
  row.units = sys.units;
  DemandCache d;
  estimate_system(journal, sys, now_s, 1, d, false);  // no smoothed history: not shown here
  bool any_test = false;
  for (size_t i = 0; i < 3; ++i) {
    const tw::Parameter p = tw::kDosedParameters[i];
    const ParameterEstimate& pe = d.per_parameter[i];
    FarmLevel& l = row.levels[i];
    const char* label = tw::parameter_label(p);
    if (!d.error.empty() || !pe.ok) {
      l.error = d.error.empty() ? pe.error : d.error;
      row.attention.push_back(std::string(label) + ": " + l.error);
      continue;
    }
    const auto& e = pe.estimate;
    if (e.last_test_days && !e.history.empty()) {
      l.tested = any_test = true;
      l.latest = e.history.back().reading;
      l.latest_s = static_cast<std::int64_t>(std::llround(*e.last_test_days * 86400.0));
    }
    l.stale = pe.stale;
    l.demand_known = e.demand_known;
    l.demand_per_day = e.demand_per_day;
    l.demand_sd = e.demand_sd;
    const auto target = jn::target_of(sys, p);
    l.band = target ? tw::target_band(p, *target) : tw::default_target_band(p);
    if (!l.tested) continue;
    l.side = tw::band_side(*l.band, l.latest);
    const ShownUnit su = shown_unit(sys.units, p);
    if (l.side != tw::BandSide::Inside) {
      row.attention.push_back(std::string(label) + " " + level_text(l, p, sys.units) +
                              (l.side == tw::BandSide::Below ? " is below" : " is above") + " its band " +
                              fmtx::fixed(l.band->low * su.factor, su.decimals) + " to " +
                              fmtx::fixed(l.band->high * su.factor, su.decimals) + " " + su.unit);
    }
    if (l.stale) {
      row.attention.push_back(std::string(label) + ": last test " + farm_age_text(now_s, l.latest_s) +
                              ", too old to say today's level");
    }
  }
  if (d.error.empty() && !any_test) row.attention.push_back("No test of alkalinity, calcium or magnesium logged yet");
  // What the pumps still give today: the running schedules' doses from now to the day's end.
  std::map<jn::EventId, int> left;
  for (const jn::ScheduledDose& sd : jn::scheduled_doses(journal, sys.id, now_s, day_end_s)) ++left[sd.schedule_id];
  for (const jn::Event* ev : jn::schedules_running(journal, sys.id, now_s)) {
    row.due.push_back({jn::schedule_summary(std::get<jn::DoseSchedule>(ev->data)), left[ev->id]});
  }
  return row;
}

}  // namespace

std::string farm_age_text(std::int64_t now_s, std::int64_t then_s) {
  const std::int64_t ago = now_s - then_s;
  if (ago < 3600) return "under 1 h ago";
  if (ago < 48 * 3600) return std::to_string(ago / 3600) + " h ago";
  return std::to_string(ago / 86400) + " d ago";
}

std::string farm_level_text(const FarmRow& row, size_t i) {
  const FarmLevel& l = row.levels[i];
  if (!l.tested) return "no test";
  return level_text(l, tw::kDosedParameters[i], row.units);
}

std::string farm_demand_text(const FarmRow& row, size_t i) {
  const FarmLevel& l = row.levels[i];
  if (!l.demand_known) return "";
  // As the Demand screen prints it: digits set by the estimate's own uncertainty.
  const ShownUnit su = shown_unit(row.units, tw::kDosedParameters[i]);
  const int dd = tw::carbonate::decimals_for_uncertainty(l.demand_sd * su.factor);
  return fmtx::fixed(l.demand_per_day * su.factor, dd) + " " + su.unit;
}

void refresh_farm(AppState& app) {
  FarmCache& c = app.ui.farm.cache;
  FarmBuild& b = app.ui.farm.build;
  const std::int64_t now_s = platform::now_unix_seconds();
  if (c.valid && c.revision == app.revision && c.now_hour == now_s / 3600) return;
  const double t0 = platform::now_ms();
  if (!b.active || b.revision != app.revision || b.now_hour != now_s / 3600) {
    b = FarmBuild{true, app.revision, now_s / 3600, now_s, 0, {}, 0, t0, 0};
  }
  const auto& systems = app.journal.systems;
  const std::int64_t day_end = end_of_local_day(b.now_s);
  while (b.next < systems.size()) {  // at least one system a frame, more while the budget lasts
    b.rows.push_back(row_of(app.journal, systems[b.next], b.now_s, day_end));
    ++b.next;
    if (platform::now_ms() - t0 > kFarmFrameBudgetMs) break;
  }
  b.compute_ms += platform::now_ms() - t0;
  ++b.frames;
  if (b.next < systems.size()) {
    platform::request_frames(2);  // frames are drawn only on input: keep them coming until done
    return;
  }
  FarmCache out;
  out.valid = true;
  out.revision = b.revision;
  out.now_hour = b.now_hour;
  out.now_s = b.now_s;
  out.computed_count = c.computed_count + 1;
  std::vector<FarmRow> fine;
  for (FarmRow& row : b.rows) {
    if (row.attention.empty()) {
      fine.push_back(std::move(row));
    } else {
      out.rows.push_back(std::move(row));
    }
  }
  out.needing_attention = static_cast<int>(out.rows.size());
  for (FarmRow& r : fine) out.rows.push_back(std::move(r));
  out.build_ms = b.compute_ms;
  out.wall_ms = platform::now_ms() - b.started_ms;
  out.frames = b.frames;
  c = std::move(out);
  b = FarmBuild{};
}

}  // namespace twapp
