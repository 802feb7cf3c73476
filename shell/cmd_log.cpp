// `tidewright log`: the tank journal from the command line.
//   log add system|test|dose|water-change|top-off|note ...   log import FILE (CSV or JSON)
//   log export [--format csv|json]   log list [filters] [--last N]   log systems
//   log remove --id N   log edit event|system --id N ...   log undo (cmd_log_edit.cpp)
//   log backup FILE   log restore FILE   log check
//   log schedule start|change|stop|missed|extra|list   (cmd_log_schedule.cpp)
// The journal is a database (core/store, SQLite; --journal rules in journal_location.hpp).
// Every change is one transaction validated by the core: a refused change prints one line
// naming the field and the accepted range, exits non-zero and changes nothing. Reads stream
// from the database: nothing loads the whole journal.
#include <sys/stat.h>

#include <algorithm>
#include <cerrno>
#include <cstring>
#include <cstdio>
#include <fstream>
#include <ctime>
#include <iostream>
#include <memory>
#include <optional>

#include <fmt/format.h>
#include <nlohmann/json.hpp>

#include "backup_finder.hpp"
#include "commands.hpp"
#include "path_options.hpp"
#include "file_io.hpp"
#include "journal_access.hpp"
#include "log_common.hpp"
#include "log_format.hpp"
#include "time_zone.hpp"
#include "tidewright/additives/additives.hpp"
#include "tidewright/common/datetime.hpp"
#include "tidewright/journal/journal.hpp"
#include "tidewright/journal/journal_csv.hpp"
#include "tidewright/journal/journal_file.hpp"
#include "tidewright/store/journal_store.hpp"

namespace tw::shell {
namespace {

using namespace tw::journal;

struct LogOptions {
  std::string journal = "tidewright-journal.db";
  bool json = false;
  // shared by add subcommands
  std::string system, time, date_order, utc_offset, time_zone;
  // test
  std::string parameter, unit, ph_scale, kit, other_name;
  std::optional<double> value, precision;
  // dose
  std::string additive, amount_unit;
  std::optional<double> amount, stock_g_per_l;
  // water change / top-off / system volume
  std::optional<double> volume, new_alk, new_ca, new_mg, new_salinity, limewater_g_per_l;
  std::string volume_unit, top_off_kind = "plain";
  // note
  std::string text;
  // system
  std::string name, kind = "reef_display", alk_unit = "dKH", ca_mg_unit = "mg/L",
                    temperature_unit = "C", system_ph_scale = "nbs";
  std::optional<double> display, sump, rock, salinity, temperature, target_alk, target_ca,
      target_mg;
  // import / export / list / remove
  std::string file, format = "csv", output = "-", from, to;
  // import
  std::string delimiter;
  std::vector<std::string> mappings;
  bool dry_run = false;
  std::int64_t id = 0;
  std::int64_t last = 0;
};

template <class T>
T or_fail(Result<T> r) {
  if (!r) throw CommandError(r.error().message);
  return std::move(r).value();
}

using Store = store::JournalStore;
using store::Access;

std::unique_ptr<Store> open_for(const LogOptions& o, Access access) { return open_journal_or_fail(o.journal, access); }

template <class T>
T stored_or_fail(Result<T> r) {
  if (!r) throw CommandError(r.error().message + " (nothing was changed)");
  return std::move(r).value();
}

// A journal holding every system (few) and no events: what describe_event_line needs.
Journal systems_only(const Store& st) {
  Journal j;
  j.systems = st.systems();
  return j;
}

datetime::ParseOptions time_options(const LogOptions& o) {
  return time_parse_options(o.date_order, o.utc_offset, o.time_zone);
}

// The event time: --time parsed, or now (the shell reads the clock; the core never does).
std::pair<std::int64_t, std::string> event_time(const LogOptions& o) {
  const auto now = static_cast<std::int64_t>(std::time(nullptr));
  if (o.time.empty()) return {now, ""};
  const std::int64_t t = or_fail(datetime::parse_datetime(o.time, time_options(o)));
  or_fail(check_not_in_future(t, now));
  return {t, o.time};
}

double to_litres(double v, const std::string& unit_text, units::VolumeUnit fallback) {
  const units::VolumeUnit u = unit_text.empty() ? fallback : or_fail(units::volume_unit_from_string(unit_text));
  return units::volume_to_litres(v, u);
}

void print_cautions(const std::vector<std::string>& cautions) {
  for (const auto& c : cautions) std::fprintf(stderr, "caution: %s\n", c.c_str());
}

void add_event_and_report(const LogOptions& o, Store& st, const System& sys, Event e) {
  const EventId id = stored_or_fail(st.add_event(e));
  const Event added = *st.event(id);
  if (o.json) {
    std::cout << nlohmann::json{{"added", id}, {"event", event_to_json(added)}}.dump(2) << "\n";
  } else {
    Journal one;
    one.systems = {sys};
    std::cout << "added " << describe_event_line(one, added) << "\n";
  }
}

void run_add_system(const LogOptions& o) {
  auto st = open_for(o, Access::WriteOrCreate);
  System s;
  s.name = o.name;
  s.kind = or_fail(system_kind_from_string(o.kind));
  s.units.alkalinity = or_fail(units::alkalinity_unit_from_string(o.alk_unit));
  s.units.calcium_magnesium = or_fail(units::concentration_unit_from_string(o.ca_mg_unit));
  s.units.temperature = or_fail(temperature_unit_from_string(o.temperature_unit));
  s.units.ph_scale = or_fail(ph_scale_from_name(o.system_ph_scale));
  s.units.volume = o.volume_unit.empty() ? units::VolumeUnit::Litre
                                         : or_fail(units::volume_unit_from_string(o.volume_unit));
  if (o.display || o.sump || o.rock) {
    if (o.volume) throw CommandError("give --volume or the parts (--display, --sump, --rock), not both");
    s.volume_parts = VolumeParts{to_litres(o.display.value_or(0), o.volume_unit, s.units.volume),
                                 to_litres(o.sump.value_or(0), o.volume_unit, s.units.volume),
                                 to_litres(o.rock.value_or(0), o.volume_unit, s.units.volume)};
    s.volume_l = net_volume_l(*s.volume_parts);
  } else if (o.volume) {
    s.volume_l = to_litres(*o.volume, o.volume_unit, s.units.volume);
  } else {
    throw CommandError("--volume (net water volume) or --display/--sump/--rock is needed");
  }
  if (o.salinity) s.default_salinity = *o.salinity;
  if (o.temperature) {
    s.default_temperature_c = units::temperature_to_celsius(*o.temperature, s.units.temperature);
  }
  s.targets = Targets{o.target_alk, o.target_ca, o.target_mg};
  const SystemId id = stored_or_fail(st->add_system(s));
  const System added = *st->system(id);
  if (o.json) {
    std::cout << nlohmann::json{{"added", id}, {"system", system_to_json(added)}}.dump(2) << "\n";
  } else {
    std::cout << "added system " << id << ": " << describe_system_line(added) << "\n";
  }
}

void run_add_test(const LogOptions& o) {
  auto st = open_for(o, Access::Write);
  const System sys = system_or_fail(*st, o.system);
  TestResult t;
  t.parameter = or_fail(tw::parameter_from_name(o.parameter));
  t.other_name = o.other_name;
  if (!o.value) throw CommandError("--value is needed");
  t.value = *o.value;
  std::string unit = o.unit;
  if (unit.empty()) {
    if (t.parameter == Parameter::Alkalinity) unit = units::to_string(sys.units.alkalinity);
    else if (t.parameter == Parameter::Calcium || t.parameter == Parameter::Magnesium)
      unit = units::to_string(sys.units.calcium_magnesium);
    else if (t.parameter == Parameter::Temperature) unit = to_string(sys.units.temperature);
    else if (t.parameter != Parameter::Other) unit = tw::parameter_unit(t.parameter);
  }
  t.unit = or_fail(normalize_unit(t.parameter, unit));
  t.precision = o.precision;
  if (t.parameter == Parameter::PH) {
    t.ph_scale = o.ph_scale.empty() ? sys.units.ph_scale : or_fail(ph_scale_from_name(o.ph_scale));
  }
  t.kit = o.kit;
  auto [time_s, text] = event_time(o);
  add_event_and_report(o, *st, sys, Event{0, sys.id, time_s, text, t});
}

void run_add_dose(const LogOptions& o) {
  auto st = open_for(o, Access::Write);
  const System sys = system_or_fail(*st, o.system);
  if (!o.amount) throw CommandError("--amount is needed");
  Dose d;
  d.additive_id = o.additive;
  d.amount = *o.amount;
  d.unit = or_fail(dose_unit_from_string(o.amount_unit));
  d.stock_g_per_l = o.stock_g_per_l;
  auto [time_s, text] = event_time(o);
  // Stored (or refused, with its one-line error) first; the compound's cautions follow.
  add_event_and_report(o, *st, sys, Event{0, sys.id, time_s, text, d});
  auto compound = additives::find_compound(o.additive);
  if (!compound) {
    std::fprintf(stderr, "note: additive '%s' is not in the compound catalog; it is logged as "
                         "given\n", o.additive.c_str());
  } else {
    print_cautions(additives::cautions_for(additives::additive_from_compound((*compound)->id)));
  }
}

void run_add_water_change(const LogOptions& o) {
  auto st = open_for(o, Access::Write);
  const System sys = system_or_fail(*st, o.system);
  if (!o.volume) throw CommandError("--volume is needed");
  WaterChange w{to_litres(*o.volume, o.volume_unit, sys.units.volume), o.new_alk, o.new_ca,
                o.new_mg, o.new_salinity};
  auto [time_s, text] = event_time(o);
  add_event_and_report(o, *st, sys, Event{0, sys.id, time_s, text, w});
}

void run_add_top_off(const LogOptions& o) {
  auto st = open_for(o, Access::Write);
  const System sys = system_or_fail(*st, o.system);
  if (!o.volume) throw CommandError("--volume is needed");
  TopOff t{to_litres(*o.volume, o.volume_unit, sys.units.volume),
           or_fail(top_off_kind_from_string(o.top_off_kind)), o.limewater_g_per_l};
  auto [time_s, text] = event_time(o);
  add_event_and_report(o, *st, sys, Event{0, sys.id, time_s, text, t});
  if (t.kind == TopOffKind::Limewater) {
    auto lw = additives::limewater_additive(sys.default_temperature_c);
    if (lw) print_cautions(additives::cautions_for(*lw));
  }
}

void run_add_note(const LogOptions& o) {
  auto st = open_for(o, Access::Write);
  const System sys = system_or_fail(*st, o.system);
  auto [time_s, text] = event_time(o);
  add_event_and_report(o, *st, sys, Event{0, sys.id, time_s, text, Note{o.text}});
}

EventFilter filter_from(const LogOptions& o, const Store& st) {
  EventFilter f;
  if (!o.system.empty()) f.system_id = system_or_fail(st, o.system).id;
  if (!o.parameter.empty()) f.parameter = or_fail(tw::parameter_from_name(o.parameter));
  if (!o.from.empty()) f.from_s = or_fail(datetime::parse_datetime(o.from, time_options(o)));
  if (!o.to.empty()) {
    f.to_s = or_fail(datetime::parse_datetime(o.to, time_options(o)));
    // A bare date as --to means the whole day.
    if (o.to.find(':') == std::string::npos) *f.to_s += 86399;
  }
  return f;
}

bool looks_like_json(const std::string& path) {
  if (path.size() >= 5 && path.compare(path.size() - 5, 5, ".json") == 0) return true;
  std::ifstream in(path);
  char c = 0;
  while (in.get(c) && std::isspace(static_cast<unsigned char>(c))) {
  }
  return c == '{';
}

const char* delimiter_name(char c) { return c == ';' ? "semicolon" : c == '\t' ? "tab" : "comma"; }

const char* date_order_name(datetime::DateOrder d) {
  return d == datetime::DateOrder::DayMonthYear   ? "day/month/year"
         : d == datetime::DateOrder::MonthDayYear ? "month/day/year"
                                                  : "";
}

// A dry run's events, printed as the import finds them (memory stays flat whatever the file's
// size): "would add ..." lines, or with --json the opening of the object and its "events" array
// (opened by the first event, so that a file refused before any event leaves stdout empty),
// which print_import_report closes. A system the import would add is not stored, so its events
// show "?" for its name.
struct DryRunJson {
  bool opened = false;
  void open() {
    if (!opened) std::cout << "{\n  \"events\": [";
    opened = true;
  }
};

Store::WouldAdd dry_run_listing(const LogOptions& o, const Journal& names, DryRunJson& json) {
  if (!o.json) {
    return [&names](const Event& e) { std::cout << "would add " << describe_event_line(names, e) << "\n"; };
  }
  return [&json](const Event& e) {
    const bool first = !json.opened;
    json.open();
    std::string text = event_to_json(e).dump(2);
    std::string indented;
    for (char c : text) indented += c == '\n' ? std::string("\n    ") : std::string(1, c);
    std::cout << (first ? "\n    " : ",\n    ") << indented;
  };
}

void print_import_report(const LogOptions& o, const Store::ImportReport& rep, DryRunJson& dry_json) {
  if (o.json) {
    nlohmann::json rej = nlohmann::json::array();
    for (const auto& r : rep.rejected) rej.push_back({{"line", r.line}, {"field", r.field}, {"reason", r.reason}});
    nlohmann::json unused = nlohmann::json::array();
    for (const auto& u : rep.unused_columns) unused.push_back({{"column", u.name}, {"reason", u.reason}});
    nlohmann::json out{{o.dry_run ? "would_add" : "added", rep.events_added},
                       {"systems_added", rep.systems_added},
                       {"duplicates_skipped", rep.duplicates_skipped},
                       {"blank_rows_skipped", rep.blank_rows_skipped},
                       {"delimiter", delimiter_name(rep.delimiter)},
                       {"unused_columns", unused},
                       {"rejected", rej},
                       {"dry_run", o.dry_run}};
    if (!o.dry_run) {
      std::cout << out.dump(2) << "\n";
      return;
    }
    // The dry run's "events" were written first, as the import went (dry_run_listing): the
    // rest of the object follows them.
    dry_json.open();
    const std::string rest = out.dump(2);
    std::cout << "\n  ],\n" << rest.substr(rest.find('\n') + 1) << "\n";
    return;
  }
  std::cout << fmt::format("{} {} events{}, skipped {} duplicates and {} blank rows, rejected {} rows{}\n",
                           o.dry_run ? "dry run: would import" : "imported", rep.events_added,
                           rep.systems_added ? fmt::format(" and {} systems", rep.systems_added) : "",
                           rep.duplicates_skipped, rep.blank_rows_skipped, rep.rejected.size(),
                           o.dry_run ? "; nothing was stored" : "");
  if (!rep.unused_columns.empty()) {
    std::string names_list;
    for (const auto& u : rep.unused_columns) names_list += (names_list.empty() ? "'" : ", '") + u.name + "'";
    std::cout << fmt::format("columns not imported: {} (reasons on stderr; read one your way with --map "
                             "'HEADER=MEANING', or leave it out with --map 'HEADER=skip')\n", names_list);
    for (const auto& u : rep.unused_columns) std::cerr << fmt::format("{}: not imported: {}\n", o.file, u.reason);
  }
  // A CSV's separator as detected, when it is not the comma (a JSON journal has none).
  if ((o.delimiter.empty() || o.delimiter == "auto") && rep.delimiter != ',' && !looks_like_json(o.file)) {
    std::cout << fmt::format("read as {}-separated (detected from the header; --delimiter sets it)\n",
                             delimiter_name(rep.delimiter));
  }
  if (o.date_order.empty() && *date_order_name(rep.date_order)) {
    std::cout << fmt::format("dates read as {} (the file's own dates show it; --date-order sets it)\n",
                             date_order_name(rep.date_order));
  }
  for (const auto& r : rep.rejected) std::cerr << fmt::format("{}: line {}: {}\n", o.file, r.line, r.reason);
}

char delimiter_from_option(const std::string& text) {
  if (text.empty() || text == "auto") return 0;
  if (text == "comma" || text == ",") return ',';
  if (text == "semicolon" || text == ";") return ';';
  if (text == "tab" || text == "\\t" || text == "\t") return '\t';
  throw CommandError("--delimiter '" + text + "' is not known; accepted: auto, comma, semicolon, tab");
}

// A file to read as a stream, refused as read_text_file refuses it (missing, unreadable, a directory).
void open_input_file(std::ifstream& file, const std::string& path) {
  struct stat st {};
  if (::stat(path.c_str(), &st) == 0 && S_ISDIR(st.st_mode)) throw CommandError("cannot read " + path + ": " + std::strerror(EISDIR));
  file.open(path, std::ios::binary);
  if (!file) throw CommandError("cannot read " + path + ": " + std::strerror(errno));
}

// CSV rows (streamed, one transaction: the accepted rows together, every refused row
// reported), or a whole JSON journal (an export or backup) merged in, all or nothing.
// --dry-run does the same work and checks and rolls back.
void run_import(const LogOptions& o) {
  const bool json_file = o.file != "-" && looks_like_json(o.file);
  auto st = open_for(o, json_file ? Access::WriteOrCreate : Access::Write);
  const auto mode = o.dry_run ? Store::ImportMode::DryRun : Store::ImportMode::Commit;
  const Journal names = systems_only(*st);
  DryRunJson dry_json;
  const Store::WouldAdd listing = o.dry_run ? dry_run_listing(o, names, dry_json) : Store::WouldAdd{};
  Store::ImportReport rep;
  if (json_file) {
    // Read one event at a time (the whole file never in memory), in one transaction.
    std::ifstream file;
    open_input_file(file, o.file);
    auto r = st->import_journal_stream(file, mode, listing);
    if (!r) {  // the file's own errors name the file; the database's name the database
      const std::string where = r.error().field != "journal" ? o.file + ": " : "";
      throw CommandError(where + r.error().message + " (nothing was imported)");
    }
    rep = std::move(r).value();
  } else {
    CsvImportOptions opt;
    opt.time = time_options(o);
    opt.now_s = static_cast<std::int64_t>(std::time(nullptr));  // future rows refused like log add
    opt.delimiter = delimiter_from_option(o.delimiter);
    for (const auto& m : o.mappings) {
      auto parsed = parse_column_mapping(m);
      if (!parsed) throw CommandError("--map: " + parsed.error().message);
      opt.mappings.push_back(*parsed);
    }
    if (!o.system.empty()) opt.default_system = system_or_fail(*st, o.system).id;
    std::ifstream file;
    if (o.file != "-") {
      file.open(o.file, std::ios::binary);
      if (!file) throw CommandError("cannot read " + o.file + ": " + std::strerror(errno));
    }
    auto r = st->import_csv(o.file == "-" ? std::cin : file, opt, mode, listing);
    if (!r) {
      const std::string where = r.error().field == "column mapping" ? "--map: " : o.file + ": ";
      throw CommandError(where + r.error().message + " (nothing was imported)");
    }
    rep = std::move(r).value();
  }
  print_import_report(o, rep, dry_json);
  if (!rep.rejected.empty()) {
    std::cout << std::flush;
    std::exit(3);  // documented: some rows were rejected (the accepted ones are saved)
  }
}

void run_export(const LogOptions& o) {
  auto st = open_for(o, Access::Read);
  if (o.format != "json" && o.format != "csv") {
    throw CommandError("--format '" + o.format + "' is not known; accepted: csv, json");
  }
  const EventFilter f = filter_from(o, *st);
  write_stream_atomic(o.output, [&](std::ostream& out) {
    Status done = o.format == "json" ? st->export_json(out, f) : st->export_csv(out, f);
    if (!done) throw CommandError(done.error().message);
  });
}

void run_list(const LogOptions& o) {
  auto st = open_for(o, Access::Read);
  const Journal names = systems_only(*st);
  Store::Query q{filter_from(o, *st), false, 0};
  if (o.last < 0) throw CommandError("--last must be 1 or more");
  std::vector<Event> last;  // --last N: the newest N, printed oldest first
  if (o.last > 0) {
    q.newest_first = true;
    q.limit = o.last;
    Status s = st->for_each_event(q, [&](const Event& e) { last.push_back(e); return true; });
    if (!s) throw CommandError(s.error().message);
    std::reverse(last.begin(), last.end());
  }
  nlohmann::json arr = nlohmann::json::array();
  std::size_t shown = 0;
  auto show = [&](const Event& e) {
    ++shown;
    if (o.json) arr.push_back(event_to_json(e));
    else std::cout << describe_event_line(names, e) << "\n";
    return true;
  };
  if (o.last > 0) {
    for (const Event& e : last) show(e);
  } else {
    Status s = st->for_each_event(q, show);
    if (!s) throw CommandError(s.error().message);
  }
  if (o.json) std::cout << arr.dump(2) << "\n";
  else if (shown == 0) std::cout << "no events\n";
}

void run_systems(const LogOptions& o) {
  auto st = open_for(o, Access::Read);
  const auto systems = st->systems();
  if (o.json) {
    nlohmann::json arr = nlohmann::json::array();
    for (const auto& s : systems) arr.push_back(system_to_json(s));
    std::cout << arr.dump(2) << "\n";
    return;
  }
  for (const auto& s : systems) std::cout << s.id << "  " << describe_system_line(s) << "\n";
}

void run_remove(const LogOptions& o) {
  auto st = open_for(o, Access::Write);
  if (st->event(o.id)) {
    stored_or_fail(st->remove_event(o.id));
  } else {
    stored_or_fail(st->remove_system(o.id, false));
  }
  if (!o.json) std::cout << "removed " << o.id << "\n";
  else std::cout << nlohmann::json{{"removed", o.id}}.dump() << "\n";
}

// A copy while others may keep writing: a database (SQLite online backup), or a JSON
// journal (the documented format) when FILE ends in .json.
void run_backup(const LogOptions& o) {
  auto st = open_for(o, Access::Read);
  const bool json_file = o.file.size() >= 5 && o.file.compare(o.file.size() - 5, 5, ".json") == 0;
  if (json_file) {
    if (file_exists(o.file)) throw CommandError(o.file + " already exists; give a new file name (nothing was written)");
    write_stream_atomic(o.file, [&](std::ostream& out) {
      Status done = st->export_json(out);
      if (!done) throw CommandError(done.error().message);
    });
  } else {
    Status done = st->backup_to(o.file);
    if (!done) throw CommandError(done.error().message);
  }
  std::cout << fmt::format("backed up {} systems and {} events to {}\n", st->systems().size(), st->event_count(),
                           o.file);
}

// Replaces the whole journal with a backup, after keeping the current one as
// JOURNAL.before-restore-<time>.db.
void run_restore(const LogOptions& o) {
  auto st = open_for(o, Access::WriteOrCreate);
  // A JSON journal is read one event at a time during the restore (the whole file never in
  // memory) and checked as it goes: a refused record rolls the restore back.
  std::ifstream from_json;
  if (!store::is_database_file(o.file)) {
    open_input_file(from_json, o.file);
  }
  // A second restore within the same second must not collide with the first one's copy.
  std::string keep = fmt::format("{}.before-restore-{}.db", st->path(), std::time(nullptr));
  for (int n = 2; file_exists(keep); ++n)
    keep = fmt::format("{}.before-restore-{}-{}.db", st->path(), std::time(nullptr), n);
  if (st->systems().size() + static_cast<std::size_t>(st->event_count()) > 0) {
    Status kept = st->backup_to(keep);
    if (!kept) throw CommandError(kept.error().message + " (nothing was changed)");
  }
  Status done = from_json.is_open() ? st->restore_from_journal_stream(from_json) : st->restore_from_database(o.file);
  if (!done) {
    std::remove(keep.c_str());  // nothing was changed: the copy of the journal as it is is not needed
    const std::string where = from_json.is_open() && done.error().field != "journal" ? o.file + ": " : "";
    throw CommandError(where + done.error().message + " (nothing was changed)");
  }
  std::cout << fmt::format("restored {} systems and {} events from {}", st->systems().size(), st->event_count(),
                           o.file);
  if (file_exists(keep)) std::cout << "; the journal as it was is kept in " << keep;
  std::cout << "\n";
}


void run_check(const LogOptions& o) {
  std::unique_ptr<Store> st;
  try {
    st = open_for(o, Access::Read);
  } catch (const CommandError& e) {  // a file too damaged to open is a finding, not a usage error
    std::cout << "problem: " << e.what() << "\n" << damaged_journal_advice(o.journal) << std::flush;
    std::exit(4);
  }
  const auto r = st->check_integrity();
  if (o.json) {
    std::cout << nlohmann::json{{"ok", r.ok}, {"schema_version", r.schema_version}, {"systems", r.systems},
                                {"events", r.events}, {"problems", r.problems}, {"notes", r.notes}}.dump(2) << "\n";
  } else {
    std::cout << fmt::format("{}: schema version {}, {} systems, {} events\n", st->path(), r.schema_version,
                             r.systems, r.events);
    for (const auto& n : r.notes) {
      std::cout << "note: " << n << " (kept from before the rule; rename it with tidewright log edit system --id N --name NEW)\n";
    }
    if (r.ok) {
      std::cout << "ok: the database file is sound, every event belongs to a system, and every record "
                   "passes the same checks as a new entry\n";
    } else {
      for (const auto& p : r.problems) std::cout << "problem: " << p << "\n";
      std::cout << damaged_journal_advice(st->path());
    }
  }
  if (!r.ok) {
    std::cout << std::flush;
    std::exit(4);
  }
}

void add_zone_options(CLI::App* c, LogOptions& o) {
  c->add_option("--date-order", o.date_order, "dmy or mdy, for dates like 03/04/2026 (default: as the dates show)");
  c->add_option("--utc-offset", o.utc_offset, kUtcOffsetHelp);
  c->add_option("--time-zone", o.time_zone, kTimeZoneHelp);
}

void add_time_options(CLI::App* c, LogOptions& o) {
  c->add_option("--system", o.system, "System name or id (may be left out if there is only one)");
  c->add_option("--time", o.time, "When: 2026-11-01T08:00Z, '2026-11-01 08:00', 01/11/2026 ... (default: now); "
                                  "a time without a zone is local time: the machine's time zone, or --time-zone/--utc-offset");
  add_zone_options(c, o);
}

}  // namespace

void register_log(CLI::App& app) {
  auto o = std::make_shared<LogOptions>();
  CLI::App* log = app.add_subcommand("log", "The tank journal: log tests, doses, water changes, top-offs and notes");
  log->require_subcommand(1);
  log->fallthrough();
  log->add_option("--journal", o->journal, "Journal: a database FILE.db, or a JSON journal FILE.json (copied into FILE.db on the first change)")->default_str("tidewright-journal.db");
  log->add_flag("--json", o->json, "Print JSON instead of text");

  CLI::App* add = log->add_subcommand("add", "Add a system or an event");
  add->require_subcommand(1);
  add->fallthrough();

  CLI::App* sys = add->add_subcommand("system", "Add a system (tank)");
  sys->add_option("--name", o->name, "Name, unique in the journal")->required();
  sys->add_option("--kind", o->kind, "reef_display, coral_grow_out, larval_culture, fish_only, other")->default_str("reef_display");
  sys->add_option("--volume", o->volume, "Net water volume, in --volume-unit");
  sys->add_option("--display", o->display, "Display volume (with --sump, --rock instead of --volume)");
  sys->add_option("--sump", o->sump, "Sump volume");
  sys->add_option("--rock", o->rock, "Water displaced by rock and sand");
  sys->add_option("--volume-unit", o->volume_unit, "L or gal (US); also the system's display unit")->default_str("L");
  sys->add_option("--salinity", o->salinity, "Default practical salinity (35)");
  sys->add_option("--temperature", o->temperature, "Default temperature in --temperature-unit (25 C)");
  sys->add_option("--alkalinity-unit", o->alk_unit, "dKH, meq/L, mg/L CaCO3, umol/kg")->default_str("dKH");
  sys->add_option("--ca-mg-unit", o->ca_mg_unit, "mg/L, mmol/kg, umol/kg")->default_str("mg/L");
  sys->add_option("--temperature-unit", o->temperature_unit, "C or F")->default_str("C");
  sys->add_option("--ph-scale", o->system_ph_scale, "Scale of your pH meter: nbs, total, sws, free")->default_str("nbs");
  sys->add_option("--target-alkalinity", o->target_alk, "Target alkalinity [dKH]");
  sys->add_option("--target-calcium", o->target_ca, "Target calcium [mg/L]");
  sys->add_option("--target-magnesium", o->target_mg, "Target magnesium [mg/L]");
  sys->callback([o] { run_add_system(*o); });

  CLI::App* test = add->add_subcommand("test", "Add a test result");
  add_time_options(test, *o);
  test->add_option("--parameter", o->parameter, "alkalinity, calcium, magnesium, ph, salinity, specific_gravity, temperature, nitrate, phosphate, other")->required();
  test->add_option("--value", o->value, "Measured value")->required();
  test->add_option("--unit", o->unit, "Unit of --value (default: the system's preference)");
  test->add_option("--precision", o->precision, "Kit precision, one standard deviation, same unit");
  test->add_option("--ph-scale", o->ph_scale, "For pH: nbs, total, sws, free (default: the system's)");
  test->add_option("--kit", o->kit, "Kit or meter name");
  test->add_option("--other-name", o->other_name, "For parameter other: what was measured");
  test->callback([o] { run_add_test(*o); });

  CLI::App* dose = add->add_subcommand("dose", "Add a dose");
  add_time_options(dose, *o);
  dose->add_option("--additive", o->additive, "Catalog id, e.g. sodium_carbonate")->required();
  dose->add_option("--amount", o->amount, "Amount dosed")->required();
  dose->add_option("--unit", o->amount_unit, "g or mL")->required();
  dose->add_option("--stock-g-per-l", o->stock_g_per_l, "For mL of a stock solution: its strength [g/L]");
  dose->callback([o] { run_add_dose(*o); });

  CLI::App* wc = add->add_subcommand("water-change", "Add a water change");
  add_time_options(wc, *o);
  wc->add_option("--volume", o->volume, "Volume changed")->required();
  wc->add_option("--volume-unit", o->volume_unit, "L or gal (default: the system's)");
  wc->add_option("--new-alkalinity", o->new_alk, "New water's alkalinity [dKH]");
  wc->add_option("--new-calcium", o->new_ca, "New water's calcium [mg/L]");
  wc->add_option("--new-magnesium", o->new_mg, "New water's magnesium [mg/L]");
  wc->add_option("--new-salinity", o->new_salinity, "New water's practical salinity");
  wc->callback([o] { run_add_water_change(*o); });

  CLI::App* top = add->add_subcommand("top-off", "Add a top-off (evaporation replaced)");
  add_time_options(top, *o);
  top->add_option("--volume", o->volume, "Volume added")->required();
  top->add_option("--volume-unit", o->volume_unit, "L or gal (default: the system's)");
  top->add_option("--kind", o->top_off_kind, "plain or limewater")->default_str("plain");
  top->add_option("--limewater-g-per-l", o->limewater_g_per_l, "Limewater strength [g Ca(OH)2 per L] (default: saturated)");
  top->callback([o] { run_add_top_off(*o); });

  CLI::App* note = add->add_subcommand("note", "Add a free note");
  add_time_options(note, *o);
  note->add_option("--text", o->text, "The note")->required();
  note->callback([o] { run_add_note(*o); });

  CLI::App* imp = log->add_subcommand("import", "Import test results and doses from CSV, or a whole JSON journal (an export or backup), in one transaction (see docs/journal-format.md); exit 3 if rows were rejected");
  imp->add_option("file", o->file, "CSV file (- for standard input) or JSON journal")->required();
  imp->add_option("--system", o->system, "System for rows without a system column");
  add_zone_options(imp, *o);
  imp->add_option("--delimiter", o->delimiter, "Separator: auto (from the header), comma, semicolon or tab")->default_str("auto");
  imp->add_option("--map", o->mappings, "Read a column your way: 'HEADER=MEANING', e.g. 'Reading 1=alkalinity dKH', 'Tank=system', 'Extra=skip' (repeatable)");
  imp->add_flag("--dry-run", o->dry_run, "Show what would be imported, check every row, store nothing");
  imp->callback([o] { run_import(*o); });

  auto add_filters = [&o](CLI::App* c) {
    c->add_option("--system", o->system, "Only this system (name or id)");
    c->add_option("--parameter", o->parameter, "Only test results of this parameter");
    c->add_option("--from", o->from, "From this date or time");
    c->add_option("--to", o->to, "Up to this date (whole day) or time");
    add_zone_options(c, *o);
  };
  CLI::App* exp = log->add_subcommand("export", "Export events as CSV, or as a JSON journal; both keep only what the filters select (JSON adds any schedule a kept dose is marked against)");
  exp->add_option("--format", o->format, "csv or json")->default_str("csv");
  exp->add_option("--output,-o", o->output, "File to write (- for standard output)")->default_str("-")->check(non_empty_path());
  add_filters(exp);
  exp->callback([o] { run_export(*o); });

  CLI::App* list = log->add_subcommand("list", "List events");
  add_filters(list);
  list->add_option("--last", o->last, "Only the newest N events (of the filter)");
  list->callback([o] { run_list(*o); });

  CLI::App* systems = log->add_subcommand("systems", "List systems");
  systems->callback([o] { run_systems(*o); });

  CLI::App* rm = log->add_subcommand("remove", "Remove an event, or a system without events, by id");
  rm->add_option("--id", o->id, "Id of the event or system")->required();
  rm->callback([o] { run_remove(*o); });

  CLI::App* backup = log->add_subcommand("backup", "Copy the journal to a new file while it stays in use: a database, or JSON if FILE ends in .json");
  backup->add_option("file", o->file, "New file to write")->required();
  backup->callback([o] { run_backup(*o); });

  CLI::App* restore = log->add_subcommand("restore", "Replace the journal with a backup (database or JSON journal); the journal as it was is kept beside it");
  restore->add_option("file", o->file, "Backup to restore")->required();
  restore->callback([o] { run_restore(*o); });

  CLI::App* chk = log->add_subcommand("check", "Check the journal's integrity: the database file, links between records, and every record against the entry rules; exit 4 on a problem");
  chk->callback([o] { run_check(*o); });

  register_log_schedule(*log, &o->journal, &o->json);
  register_log_edit(*log, &o->journal, &o->json);
}

// ---------------------------------------------------------------- shared with cmd_log_schedule
std::int64_t when_or_now(const std::string& text, const std::string& date_order, const std::string& utc_offset,
                         const std::string& time_zone) {
  LogOptions o;
  o.time = text;
  o.date_order = date_order;
  o.utc_offset = utc_offset;
  o.time_zone = time_zone;
  return event_time(o).first;
}

}  // namespace tw::shell
