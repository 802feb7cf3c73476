// `tidewright demand`: daily demand of alkalinity, calcium and magnesium per system from the
// journal's tests, doses, water changes and top-offs (core: estimate.hpp), with uncertainty,
// outlier flags, the Ca:alkalinity reading and a forecast under the current dosing.
#include <algorithm>
#include <cmath>
#include <cstdio>
#include <ctime>
#include <memory>
#include <optional>
#include <string>
#include <vector>

#include <fmt/format.h>
#include <nlohmann/json.hpp>

#include "commands.hpp"
#include "file_io.hpp"
#include "journal_access.hpp"
#include "time_zone.hpp"
#include "tidewright/common/datetime.hpp"
#include "tidewright/common/ranges.hpp"
#include "tidewright/estimate/estimate.hpp"
#include "tidewright/journal/journal.hpp"
#include "tidewright/journal/journal_file.hpp"

namespace tw::shell {
namespace {

namespace est = tw::estimate;

struct DemandOptions {
  std::string journal_path;
  std::string system;
  int days = 7;
  double dose_window_days = est::kRecentDosingWindowDays;
  bool json = false;
  bool history = false;
  bool outliers = false;   // list every flagged test (default: a summary line)
  std::string at;          // the time the state is read at (default: now)
};

// The systems to estimate: the one named by --system, or every system.
std::vector<journal::System> pick_systems(const store::JournalStore& st, const std::string& key) {
  if (key.empty()) return st.systems();
  return {system_or_fail(st, key)};
}

std::string when(double time_days) {
  return datetime::format_iso8601_utc(static_cast<std::int64_t>(std::llround(time_days * 86400.0)));
}
std::string date_of(double time_days) {
  return datetime::format_date_utc(static_cast<std::int64_t>(std::llround(time_days * 86400.0)));
}

struct ParamResult {
  est::Parameter p;
  est::SeriesEstimate e;
  double dose_per_day = 0.0;
  std::vector<est::ForecastPoint> forecast;
};

struct SystemResult {
  std::shared_ptr<const journal::System> system;
  est::SystemSeries series;
  double now_days = 0.0;
  std::vector<ParamResult> params;
  est::CalciumAlkalinityReading ratio;
};

SystemResult compute(const journal::Journal& j, const journal::System& sys, const DemandOptions& o,
                     std::int64_t now_s) {
  // Standing schedules give their doses up to now, and the state is read at now.
  est::JournalSeriesOptions so;
  so.until_s = now_s;
  auto series = est::series_from_journal(j, sys.id, so);
  if (!series) throw CommandError(series.error().message);
  SystemResult r{std::make_shared<const journal::System>(sys), std::move(series).value(),
                 static_cast<double>(now_s) / 86400.0, {}, {}};
  for (est::Parameter p : est::kAllParameters) {
    const auto i = static_cast<std::size_t>(p);
    const est::FilterOptions fo = est::default_filter_options(p);
    auto e = est::estimate_series(r.series.of(p), fo, r.now_days);
    if (!e) throw CommandError(fmt::format("{} of '{}': {}", tw::parameter_name(p), sys.name, e.error().message));
    ParamResult pr{p, std::move(e).value(), 0.0, {}};
    // Current dosing: the running schedules, else the logged doses of the window.
    pr.dose_per_day = r.series.scheduled[i] ? r.series.scheduled_per_day[i]
                                            : est::recent_daily_addition(r.series.of(p), o.dose_window_days, r.now_days);
    if (pr.e.demand_known && !est::is_stale(pr.e, r.now_days)) {
      auto f = est::forecast_levels(pr.e, pr.dose_per_day, o.days, fo);
      if (!f) throw CommandError(f.error().message);
      pr.forecast = std::move(f).value();
    }
    r.params.push_back(std::move(pr));
  }
  r.ratio = est::read_calcium_alkalinity(r.params[0].e, r.params[1].e, r.now_days);
  return r;
}

// ------------------------------------------------------------ JSON
nlohmann::json param_json(const ParamResult& pr, double now_days) {
  const est::SeriesEstimate& e = pr.e;
  nlohmann::json j{{"unit", tw::parameter_unit(pr.p)},
                   {"tests", e.tests},
                   {"tests_used", e.tests_used},
                   {"demand_known", e.demand_known}};
  if (e.tests_used > 0) {
    j["level"] = e.level;
    j["level_sd"] = e.level_sd;
  }
  if (e.demand_known) {
    j["demand_per_day"] = e.demand_per_day;
    j["demand_sd"] = e.demand_sd;
    j["demand_low95"] = e.demand_low95;
    j["demand_high95"] = e.demand_high95;
  } else {
    j["demand_per_day"] = nullptr;
  }
  j["daily_dose_effect"] = pr.dose_per_day;
  if (e.last_test_days) j["last_test"] = when(*e.last_test_days);
  j["stale"] = false;
  if (est::is_stale(e, now_days)) {  // the text's rule: one function in the core
    j["stale"] = true;
    j.erase("level");
    j.erase("level_sd");
  }
  if (e.disagreement) {
    const auto& d = *e.disagreement;
    j["disagreement"] = {{"time", when(d.time_days)}, {"reading", d.reading}, {"expected", d.expected},
                         {"expected_sd", d.expected_sd}, {"difference", d.difference}, {"z", d.z},
                         {"reasons", d.reasons}, {"question", d.question}};
  }
  nlohmann::json hist = nlohmann::json::array();
  for (const auto& h : e.history) {
    hist.push_back({{"time", when(h.time_days)}, {"reading", h.reading}, {"status", est::to_string(h.status)},
                    {"level", h.level}, {"level_sd", h.level_sd}, {"demand_per_day", h.demand_per_day},
                    {"demand_sd", h.demand_sd}, {"smoothed_demand_per_day", h.smoothed_demand_per_day},
                    {"smoothed_demand_sd", h.smoothed_demand_sd}});
  }
  j["history"] = hist;
  nlohmann::json out = nlohmann::json::array();
  for (const auto& f : e.outliers) {
    out.push_back({{"time", when(f.time_days)}, {"reading", f.reading}, {"expected", f.expected},
                   {"expected_sd", f.expected_sd}, {"z", f.z}, {"reason", f.reason}});
  }
  j["outliers"] = out;
  nlohmann::json fc = nlohmann::json::array();
  for (const auto& f : pr.forecast) {
    fc.push_back({{"day", f.day}, {"date", date_of(f.time_days)}, {"level", f.level},
                  {"level_sd", f.level_sd}, {"low95", f.low95}, {"high95", f.high95}});
  }
  j["forecast"] = fc;
  return j;
}

nlohmann::json system_json(const SystemResult& r) {
  nlohmann::json params = nlohmann::json::object();
  for (const auto& pr : r.params) params[tw::parameter_name(pr.p)] = param_json(pr, r.now_days);
  const auto& c = r.ratio;
  nlohmann::json ratio{{"verdict", est::to_string(c.verdict)},
                       {"expected_mg_l_per_dkh", c.expected_mg_l_per_dkh},
                       {"reading", c.reading}};
  if (c.verdict != est::RatioVerdict::NotEnoughData) {
    ratio["excess_calcium_mg_l_per_day"] = c.excess_calcium_mg_l_per_day;
    ratio["excess_sd"] = c.excess_sd;
  }
  if (c.ratio_valid) {
    ratio["ratio_mg_l_per_dkh"] = c.ratio_mg_l_per_dkh;
    ratio["ratio_sd"] = c.ratio_sd;
  }
  return {{"id", r.system->id},         {"name", r.system->name},
          {"volume_l", r.system->volume_l}, {"now", when(r.now_days)},
          {"parameters", params},       {"calcium_alkalinity", ratio},
          {"notes", r.series.notes}};
}

// ------------------------------------------------------------ text
int decimals(est::Parameter p) { return p == est::Parameter::Alkalinity ? 2 : 1; }

void print_trimmed(std::string line) {
  while (!line.empty() && line.back() == ' ') line.pop_back();
  std::printf("%s\n", line.c_str());
}

void print_system(const SystemResult& r, const DemandOptions& o) {
  std::printf("%s (id %lld, %g L), state at %s\n", r.system->name.c_str(),
              static_cast<long long>(r.system->id), r.system->volume_l, when(r.now_days).c_str());
  for (const auto& pr : r.params) {
    const auto& e = pr.e;
    const char* u = tw::parameter_unit(pr.p);
    const int d = decimals(pr.p);
    if (est::is_stale(e, r.now_days)) {
      std::printf("  %-10s  stale: the last test is %s, %.0f days ago, beyond the %.0f-day horizon; not estimated (test it)\n",
                  tw::parameter_name(pr.p), date_of(*e.last_test_days).c_str(), r.now_days - *e.last_test_days,
                  est::useful_horizon_days(pr.p));
      continue;
    }
    if (!e.demand_known) {
      std::printf("  %-10s  not enough tests for a demand (%zu test%s; needs two usable on different days)\n",
                  tw::parameter_name(pr.p), e.tests, e.tests == 1 ? "" : "s");
      continue;
    }
    std::printf("  %-10s  demand %s +/- %s %s/day (95 %%: %s to %s); level %s +/- %s %s; %zu tests, %zu used\n",
                tw::parameter_name(pr.p), fmt::format("{:.{}f}", e.demand_per_day, d + 1).c_str(),
                fmt::format("{:.{}f}", e.demand_sd, d + 1).c_str(), u,
                fmt::format("{:.{}f}", e.demand_low95, d + 1).c_str(),
                fmt::format("{:.{}f}", e.demand_high95, d + 1).c_str(),
                fmt::format("{:.{}f}", e.level, d).c_str(), fmt::format("{:.{}f}", e.level_sd, d).c_str(), u,
                e.tests, e.tests_used);
    if (o.outliers) {
      for (const auto& f : e.outliers)
        std::printf("              outlier %s: %s\n", when(f.time_days).c_str(), f.reason.c_str());
    } else if (!e.outliers.empty()) {
      std::printf("              %zu test%s flagged as outliers and left out (the latest %s reads %.4g); --outliers lists them\n",
                  e.outliers.size(), e.outliers.size() == 1 ? "" : "s", when(e.outliers.back().time_days).c_str(),
                  e.outliers.back().reading);
    }
    if (e.disagreement) {
      std::printf("              log and test disagree: %s\n              %s\n", e.disagreement->reasons.c_str(),
                  e.disagreement->question.c_str());
    }
    if (o.history) {
      std::printf("              %-20s %9s %-13s %10s %10s %10s\n", "time", "reading", "status", "demand", "sd",
                  "smoothed");
      for (const auto& h : e.history)
        std::printf("              %-20s %9.*f %-13s %10.*f %10.*f %10.*f\n", when(h.time_days).c_str(), d,
                    h.reading, est::to_string(h.status), d + 1, h.demand_per_day, d + 1, h.demand_sd, d + 1,
                    h.smoothed_demand_per_day);
    }
  }
  std::printf("  Ca:alkalinity: %s\n", r.ratio.reading.c_str());
  std::vector<const ParamResult*> fc;
  for (const auto& pr : r.params)
    if (!pr.forecast.empty()) fc.push_back(&pr);
  if (!fc.empty()) {
    std::printf("  Forecast with the current dosing continuing (schedules, else the doses logged in the last %g days: ",
                o.dose_window_days);
    for (std::size_t i = 0; i < fc.size(); ++i)
      std::printf("%s%s %+.*f %s/day", i ? ", " : "", tw::parameter_name(fc[i]->p), decimals(fc[i]->p) + 1,
                  fc[i]->dose_per_day, tw::parameter_unit(fc[i]->p));
    std::printf("; water changes not included), level and 95 %% band:\n");
    std::string line = fmt::format("    {:<4} {:<10}", "day", "date");
    for (const auto* pr : fc) line += fmt::format(" {:<26}", fmt::format("{} {}", tw::parameter_name(pr->p), tw::parameter_unit(pr->p)));
    print_trimmed(line);
    for (int k = 0; k < o.days; ++k) {
      line = fmt::format("    {:<4} {:<10}", k + 1, date_of(fc[0]->forecast[static_cast<std::size_t>(k)].time_days));
      for (const auto* pr : fc) {
        const auto& f = pr->forecast[static_cast<std::size_t>(k)];
        const int d = decimals(pr->p);
        line += fmt::format(" {:<26}", fmt::format("{:.{}f} ({:.{}f} to {:.{}f})", f.level, d, f.low95, d, f.high95, d));
      }
      print_trimmed(line);
    }
  }
  if (r.series.uncounted_after_last_test > 0) {
    std::printf("  The forecast leaves out %d dose%s logged after the last test whose strength or additive is unknown "
                "(see the notes).\n", r.series.uncounted_after_last_test, r.series.uncounted_after_last_test == 1 ? "" : "s");
  }
  for (const auto& n : r.series.notes) std::printf("  note: %s\n", n.c_str());
}

void run(const DemandOptions& o) {
  if (auto r = ranges::check("--days", o.days, ranges::kForecastDays); !r) throw CommandError(r.error().message);
  if (auto r = ranges::check("--dose-window", o.dose_window_days, ranges::kDosingWindowDays); !r)
    throw CommandError(r.error().message);
  // One system's events at a time from the journal database (core/store): memory follows
  // the largest system, not the whole journal.
  auto st = open_journal_or_fail(o.journal_path, store::Access::Read);
  const std::int64_t now_s = now_or_at(o.at, "--at");
  std::vector<SystemResult> results;
  for (const journal::System& s : pick_systems(*st, o.system)) {
    auto j = st->system_journal(s.id);
    if (!j) throw CommandError(j.error().message);
    results.push_back(compute(*j, j->systems.front(), o, now_s));
  }
  if (o.json) {
    nlohmann::json out{{"systems", nlohmann::json::array()}};
    for (const auto& r : results) out["systems"].push_back(system_json(r));
    std::printf("%s\n", out.dump(2).c_str());
    return;
  }
  for (std::size_t i = 0; i < results.size(); ++i) {
    if (i) std::printf("\n");
    print_system(results[i], o);
  }
}

}  // namespace

void register_demand(CLI::App& app) {
  auto o = std::make_shared<DemandOptions>();
  CLI::App* cmd = app.add_subcommand(
      "demand", "Daily demand of alkalinity, calcium and magnesium per system from the journal, with "
                "uncertainty, outliers, the Ca:alkalinity reading and a forecast");
  cmd->add_option("--journal", o->journal_path, "Journal: a database FILE.db or a JSON journal (see tidewright log --help)")->required();
  cmd->add_option("--system", o->system, "Only this system (name or id); default: every system");
  cmd->add_option("--days", o->days,
                  fmt::format("Days to forecast, {:g} to {:g} (default 7)", ranges::kForecastDays.lo, ranges::kForecastDays.hi));
  cmd->add_option("--dose-window", o->dose_window_days,
                  fmt::format("Days of logged doses averaged as the current dosing, {:g} to {:g} (default {:g})",
                              ranges::kDosingWindowDays.lo, ranges::kDosingWindowDays.hi, est::kRecentDosingWindowDays));
  cmd->add_flag("--history", o->history, "Also print the demand at every test (text output)");
  cmd->add_flag("--outliers", o->outliers, "List every test flagged as an outlier (text output; default: a summary)");
  cmd->add_option("--at", o->at, kAtHelp);
  cmd->add_flag("--json", o->json, "JSON output (always includes the history)");
  cmd->callback([o] { run(*o); });
}

}  // namespace tw::shell
