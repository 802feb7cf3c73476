// `tidewright plan`: a dose plan from a JSON plan input (format in core/src/plan/plan_json.cpp),
// printed as a table (default), JSON, CSV, iCalendar or plain text, to stdout or --out.
// Every plan is replayed by the independent checker before it is printed; a plan the checker
// refuses is not printed (exit 1). A plan that cannot hold the water inside its floors is
// written in full with its verdict first and ends with exit status 3; one that holds, 0.
#include <algorithm>
#include <cctype>
#include <cstdio>
#include <cstdlib>
#include <cstring>
#include <ctime>
#include <memory>

#include <fmt/format.h>

#include "commands.hpp"
#include "path_options.hpp"
#include "option_rules.hpp"
#include "time_zone.hpp"
#include "file_io.hpp"
#include "journal_access.hpp"
#include "tidewright/journal/journal_file.hpp"
#include "tidewright/journal/journal.hpp"
#include "tidewright/plan/plan.hpp"
#include "log_format.hpp"
#include "tidewright/common/datetime.hpp"
#include "tidewright/plan/plan_adopt.hpp"
#include "tidewright/plan/plan_from_journal.hpp"
#include "tidewright/plan/plan_starter.hpp"

namespace tw::shell {
namespace {

struct PlanOptions {
  std::string input;
  std::string out;
  bool json = false, csv = false, ics = false, text = false;
  bool ics_all_doses = false;  // --ics-all-doses: pumps' doses in the calendar too
  int horizon_days = 0;
  std::string dtstamp;
  std::string journal, system;  // --journal FILE --system NAME|ID
  bool accept_stale = false;     // --accept-stale: plan from levels the journal cannot vouch for today
  bool adopt = false;            // --adopt: the plan becomes the system's standing schedules
  std::string utc_offset, time_zone;  // for --adopt: the keeper's zone (time_zone.hpp)
  std::string starter;           // --starter FILE: write a plan input from --journal/--system and stop
  std::string at;                // --at TIME: the journal read as at this time instead of now
};


std::string now_dtstamp() {
  const std::time_t t = std::time(nullptr);
  std::tm tm{};
  gmtime_r(&t, &tm);
  char buf[20];
  std::strftime(buf, sizeof buf, "%Y%m%dT%H%M%SZ", &tm);
  return buf;
}

// --journal/--system: the system's state and demand from the journal (plan_from_journal.hpp).
std::vector<std::string> apply_journal(const PlanOptions& o, plan::PlanInput& in,
                                       const std::vector<std::string>& not_in_file) {
  if (o.journal.empty()) throw CommandError("--system: needs --journal FILE");
  if (o.system.empty()) throw CommandError("--journal: needs --system NAME or ID");
  // Only this system's events are read from the journal database (core/store).
  auto st = open_journal_or_fail(o.journal, store::Access::Read);
  const journal::System sys = system_or_fail(*st, o.system);
  auto j = st->system_journal(sys.id);
  if (!j) throw CommandError(fmt::format("--journal: {}", j.error().message));
  plan::BasisOptions bo;
  bo.series.until_s = now_or_at(o.at, "--at");  // levels carried to now (or --at)
  bo.accept_stale = o.accept_stale;
  auto basis = plan::plan_basis_from_journal(*j, sys.id, bo);
  if (!basis && basis.error().field == "stale") {
    throw CommandError(fmt::format("--journal: {} (--accept-stale plans from it anyway)", basis.error().message));
  }
  if (!basis) throw CommandError(fmt::format("--journal: {}", basis.error().message));
  std::vector<std::string> lines = plan::apply_journal_basis(*basis, in);
  if (!not_in_file.empty()) {
    lines.push_back(fmt::format("not in the plan input, so from the journal only: system.{}",
                                fmt::join(not_in_file, ", system.")));
  }
  return lines;
}

// --adopt: the plan's doses become the system's standing schedules in the journal (the pumps'
// earlier schedules stop where the plan starts), saved atomically like `tidewright log`.
void adopt(const PlanOptions& o, const plan::PlanInput& in, const plan::Plan& p) {
  if (o.journal.empty() || o.system.empty()) throw CommandError("--adopt: needs --journal FILE and --system NAME or ID");
  auto st = open_journal_or_fail(o.journal, store::Access::Write);
  const journal::System sys = system_or_fail(*st, o.system);
  auto before = st->system_journal(sys.id);
  if (!before) throw CommandError(fmt::format("--journal: {}", before.error().message));
  auto day1 = datetime::parse_datetime(in.start_date + "T00:00:00Z");
  if (!day1) throw CommandError("start_date: " + day1.error().message);
  journal::Journal after = *before;
  auto ids = plan::adopt_plan(after, sys.id, in, p, *day1 - 60LL * offset_minutes_at(*day1, o.utc_offset, o.time_zone));
  if (!ids) throw CommandError(fmt::format("--adopt: {}", ids.error().message));
  // Checked whole by the core above; now the stopped schedules, the removed ones (later runs of
  // an earlier plan, not begun), then the new ones.
  for (const auto& e : before->events) {
    const journal::Event* now = journal::find_event(after, e.id);
    if (!now) {
      if (auto s = st->remove_event(e.id); !s) throw CommandError("--adopt: " + s.error().message);
    } else if (!(*now == e)) {
      if (auto s = st->update_event(*now); !s) throw CommandError("--adopt: " + s.error().message);
    }
  }
  for (journal::EventId id : *ids) {
    journal::Event e = *journal::find_event(after, id);
    e.id = 0;
    auto added = st->add_event(e);
    if (!added) throw CommandError("--adopt: " + added.error().message);
    std::fprintf(stderr, "adopted: %s\n", describe_event_line(after, *st->event(*added)).c_str());
  }
}

// --starter: a plan input built from the journal's system (plan_starter.hpp), with comment
// lines saying where each number came from and how to make the plan from it.
void write_starter(const PlanOptions& o) {
  if (o.journal.empty() || o.system.empty()) throw CommandError("--starter: needs --journal FILE and --system NAME or ID");
  if (!o.input.empty()) throw CommandError("--starter: writes a plan input; give no input file with it");
  auto st = open_journal_or_fail(o.journal, store::Access::Read);
  const journal::System sys = system_or_fail(*st, o.system);
  auto j = st->system_journal(sys.id);
  if (!j) throw CommandError(fmt::format("--journal: {}", j.error().message));
  const std::int64_t now = now_or_at(o.at, "--at");
  auto starter = plan::starter_plan_input(*j, sys.id, now);
  if (!starter) throw CommandError(fmt::format("--starter: {}", starter.error().message));
  auto body = plan::plan_input_to_json(starter->input);
  if (!body) throw CommandError(fmt::format("--starter: {}", body.error().message));
  // Paths quoted for a POSIX shell when they hold anything but plain characters.
  auto quoted = [](const std::string& path) {
    const bool plain = std::all_of(path.begin(), path.end(), [](unsigned char c) {
      return std::isalnum(c) || std::strchr("/._-+,:@", c) != nullptr;
    });
    if (plain && !path.empty()) return path;
    std::string q = "'";
    for (char c : path) q += c == '\'' ? std::string("'\\''") : std::string(1, c);
    return q + "'";
  };
  const std::string file = o.starter == "-" ? "FILE" : quoted(o.starter);
  std::string text = fmt::format("// Plan input for \"{}\", written by `tidewright plan --starter` on {} (UTC) from {}.\n",
                                 sys.name, datetime::format_date_utc(now), quoted(o.journal));
  text += "// Lines starting with // are comments. Make the plan with the water and consumption read again\n";
  text += fmt::format("// from the journal (room kept for their uncertainty):\n//   tidewright plan {} --journal {} --system {}\n",
                      file, quoted(o.journal), sys.id);
  text += fmt::format("// or from the numbers below as they stand:  tidewright plan {}\n", file);
  text += "// The keys are listed in the README (`plan`); an unknown key is refused with the nearest known one.\n";
  text += "// Where the numbers came from:\n";
  for (const auto& n : starter->notes) text += "//   " + n + "\n";
  write_output(o.starter, text + *body);
  if (o.starter != "-") std::fprintf(stderr, "wrote %s: a plan input for \"%s\"\n", o.starter.c_str(), sys.name.c_str());
}

void run(const PlanOptions& o) {
  if (!o.starter.empty()) return write_starter(o);
  if (o.input.empty()) throw CommandError("input: the plan input file is required (--starter FILE writes one from --journal)");
  const bool from_journal = !o.journal.empty() || !o.system.empty();
  std::vector<std::string> not_in_file;
  auto in = plan::plan_input_from_json(read_text_file(o.input), from_journal ? &not_in_file : nullptr);
  if (!in) throw CommandError(in.error().message);
  if (o.horizon_days > 0) in->horizon_days = o.horizon_days;
  std::vector<std::string> basis_lines;
  if (from_journal) basis_lines = apply_journal(o, in.value(), not_in_file);
  auto plan = plan::make_plan(*in);
  if (!plan) throw CommandError(plan.error().message);
  // The independent checker: a plan it refuses is never printed. Floors and falls crossed are
  // what the verdict explains, so they pass only when the verdict says the plan cannot hold.
  const plan::CheckReport check = plan::check_plan(*in, *plan);
  if (!check.ok()) {
    const bool explained = !plan->verdict.holds && check.only_floors_and_falls();
    if (!explained) {
      const std::string why = !check.other.empty() ? check.other.front() : check.violations.front().message;
      throw CommandError("the independent checker refused this plan: " + why);
    }
  }
  const bool holds = plan->verdict.holds;
  // The verdict comes first: on stderr for the machine formats (CSV, iCalendar, JSON carry the
  // schedule on stdout), at the top of the text.
  // A target the room air puts out of bounds is flagged the same way (the exit status stays the verdict's).
  const bool flagged = !plan->verdict.target_conflicts.empty();
  if ((!holds || flagged) && (o.json || o.csv || o.ics)) std::fprintf(stderr, "%s", plan::verdict_to_text(*plan).c_str());
  if (o.adopt) {
    if (!holds) throw CommandError("--adopt: this plan cannot hold the water within its floors (see the verdict); not adopted");
    adopt(o, *in, *plan);
  }
  std::string text;
  if (o.json) {
    text = plan::plan_to_json(*in, *plan);
    if (!basis_lines.empty()) {
      auto doc = nlohmann::json::parse(text);
      doc["basis"] = basis_lines;
      text = doc.dump(2) + "\n";
    }
  } else if (o.csv) {
    text = plan::plan_to_csv(*in, *plan);
  } else if (o.ics) {
    auto ics = plan::plan_to_icalendar(*in, *plan, o.dtstamp.empty() ? now_dtstamp() : o.dtstamp,
                                       o.ics_all_doses ? plan::IcsDoses::All : plan::IcsDoses::HandOnly);
    if (!ics) fail(ics.error(), {{"dtstamp_utc", "--dtstamp"}});
    text = *ics;
  } else {
    text = plan::plan_to_text(*in, *plan);
    if (!basis_lines.empty()) {
      std::string head;
      for (const auto& l : basis_lines) head += (head.empty() ? "" : "  ") + l + "\n";
      text = head + "\n" + text;
    }
    if (!o.text) {
      text += "\nIf a dose is missed or a pump runs twice (every dose of the plan tried; the worst shown):\n";
      for (const auto& w : plan::mishap_summary(*in, *plan)) text += "  " + w.summary + "\n";
    }
  }
  write_output(o.out, text);
  // CSV and iCalendar have no place for them: where the numbers came from (--journal) and the
  // cautions go to stderr. Cautions go there for JSON too (a file nobody reads aloud).
  if (o.csv || o.ics) {
    for (const auto& l : basis_lines) std::fprintf(stderr, "basis: %s\n", l.c_str());
  }
  if ((o.json || o.csv || o.ics) && !plan->cautions.empty()) {
    for (const auto& c : plan->cautions) std::fprintf(stderr, "caution: %s\n", c.c_str());
  }
  if (!holds) throw ExitStatus{3};
}

}  // namespace

void register_plan(CLI::App& app) {
  auto opts = std::make_shared<PlanOptions>();
  CLI::App* sub = app.add_subcommand(
      "plan",
      "Day-by-day dose plan within safety limits, from a JSON plan input. Exit status: 0 the plan holds the "
      "water inside every limit; 3 it cannot hold it inside its floors (the plan is still written, its verdict "
      "first: what is short and what would fix it); 1 refused input or a plan the checker refuses. Targets whose "
      "water, settled with the room air, already crosses a pH or saturation limit are flagged after the verdict "
      "with the target that fits");
  sub->add_option("input", opts->input, "plan input file (JSON, // comment lines allowed; - for stdin); see assets/demo/demo_plan.json, "
                  "or write one with --starter");
  sub->add_option("--horizon-days", opts->horizon_days, "override the plan's horizon (1..365 days)");
  auto* fmt_group = sub->add_option_group("format");
  fmt_group->add_flag("--json", opts->json, "the whole plan as JSON");
  fmt_group->add_flag("--csv", opts->csv, "one row per dose (RFC 4180)");
  fmt_group->add_flag("--ics", opts->ics, "iCalendar (RFC 5545): the doses given by hand, each with a reminder");
  sub->add_flag("--ics-all-doses", opts->ics_all_doses, "with --ics: every dose, the pumps' too (pumps get no reminder)");
  fmt_group->add_flag("--text", opts->text, "plain text for print");
  fmt_group->require_option(0, 1);
  sub->add_option("--dtstamp", opts->dtstamp, "DTSTAMP for --ics as YYYYMMDDTHHMMSSZ (default: now)");
  sub->add_option("--journal", opts->journal, "take the system's state and demand from this journal (database, or JSON journal)");
  sub->add_option("--system", opts->system, "the journal's system, by name or id (with --journal)");
  sub->add_option("--at", opts->at, std::string("with --journal: ") + kAtHelp);
  sub->add_option("--out", opts->out, "write to this file instead of stdout")->check(non_empty_path());
  sub->add_flag("--accept-stale", opts->accept_stale,
                "with --journal: plan from a level whose last test is too old, or with unlogged dosing since (flagged)");
  sub->add_option("--starter", opts->starter,
                  "write a plan input for --system from --journal to this file (- for stdout), each number with where "
                  "it came from, and stop")
      ->check(non_empty_path());
  sub->add_flag("--adopt", opts->adopt,
                "make the plan the system's standing dose schedules in --journal (its pumps' earlier schedules stop)");
  sub->add_option("--utc-offset", opts->utc_offset, std::string("with --adopt: the plan's days start at local midnight; ") + kUtcOffsetHelp);
  sub->add_option("--time-zone", opts->time_zone, std::string("with --adopt: ") + kTimeZoneHelp);
  sub->callback([opts] { run(*opts); });
}

}  // namespace tw::shell
