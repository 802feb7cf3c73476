// `tidewright log`: the tank journal from the command line.
//   log add system|test|dose|water-change|top-off|note ...   log import FILE
//   log export [--format csv|json]   log list [filters]   log systems   log remove --id N
// Every change loads the journal, applies one validated core call and saves atomically
// (shell/file_io). A refused change prints one line naming the field and the accepted range,
// exits non-zero and leaves the file exactly as it was. A damaged file is never overwritten.
#include <cstdio>
#include <ctime>
#include <iostream>
#include <memory>
#include <optional>

#include <fmt/format.h>
#include <nlohmann/json.hpp>

#include "commands.hpp"
#include "file_io.hpp"
#include "log_format.hpp"
#include "tidewright/additives/additives.hpp"
#include "tidewright/common/datetime.hpp"
#include "tidewright/journal/journal.hpp"
#include "tidewright/journal/journal_csv.hpp"
#include "tidewright/journal/journal_file.hpp"

namespace tw::shell {
namespace {

using namespace tw::journal;

struct LogOptions {
  std::string journal = "tidewright-journal.json";
  bool json = false;
  // shared by add subcommands
  std::string system, time, date_order;
  int utc_offset_min = 0;
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
  std::int64_t id = 0;
};

template <class T>
T or_fail(Result<T> r) {
  if (!r) throw CommandError(r.error().message);
  return std::move(r).value();
}

Journal load(const std::string& path, bool must_exist) {
  if (!file_exists(path)) {
    if (must_exist) {
      throw CommandError("journal " + path + " does not exist (create it with `tidewright log add system`)");
    }
    return Journal{};
  }
  const std::string text = read_text_file(path, "--journal");
  auto j = parse_journal(text);
  if (!j) {
    const bool newer = j.error().field == "schema_version";
    throw CommandError(path + ": " + j.error().message + " (the file was not changed" +
                       (newer ? ")" : "; fix it or restore " + path + ".bak)"));
  }
  return std::move(j).value();
}

void save(const std::string& path, const Journal& j) {
  write_text_file_atomic(path, serialize_journal(j), true);
}

datetime::ParseOptions time_options(const LogOptions& o) {
  datetime::ParseOptions p;
  p.order = or_fail(datetime::date_order_from_string(o.date_order));
  p.utc_offset_minutes = o.utc_offset_min;
  return p;
}

// The event time: --time parsed, or now (the shell reads the clock; the core never does).
std::pair<std::int64_t, std::string> event_time(const LogOptions& o) {
  const auto now = static_cast<std::int64_t>(std::time(nullptr));
  if (o.time.empty()) return {now, ""};
  const std::int64_t t = or_fail(datetime::parse_datetime(o.time, time_options(o)));
  or_fail(check_not_in_future(t, now));
  return {t, o.time};
}

const System& system_arg(const Journal& j, const std::string& text) {
  if (text.empty()) {
    if (j.systems.size() == 1) return j.systems[0];
    throw CommandError(fmt::format("--system is needed: the journal has {} systems", j.systems.size()));
  }
  if (const System* s = find_system_by_name(j, text)) return *s;
  try {
    size_t used = 0;
    const long long id = std::stoll(text, &used);
    if (used == text.size()) {
      if (const System* s = find_system(j, id)) return *s;
    }
  } catch (const std::exception&) {
  }
  throw CommandError("--system '" + text + "' is not a system of this journal (see `tidewright log systems`)");
}

double to_litres(double v, const std::string& unit_text, units::VolumeUnit fallback) {
  const units::VolumeUnit u = unit_text.empty() ? fallback : or_fail(units::volume_unit_from_string(unit_text));
  return units::volume_to_litres(v, u);
}

void print_cautions(const std::vector<std::string>& cautions) {
  for (const auto& c : cautions) std::fprintf(stderr, "caution: %s\n", c.c_str());
}

void add_event_and_save(const LogOptions& o, Journal& j, Event e) {
  const EventId id = or_fail(add_event(j, std::move(e)));
  save(o.journal, j);
  const Event& added = *find_event(j, id);
  if (o.json) {
    std::cout << nlohmann::json{{"added", id}, {"event", event_to_json(added)}}.dump(2) << "\n";
  } else {
    std::cout << "added " << describe_event_line(j, added) << "\n";
  }
}

void run_add_system(const LogOptions& o) {
  Journal j = load(o.journal, false);
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
    s.default_temperature_c = s.units.temperature == TemperatureUnit::Fahrenheit
                                  ? units::fahrenheit_to_celsius(*o.temperature)
                                  : *o.temperature;
  }
  s.targets = Targets{o.target_alk, o.target_ca, o.target_mg};
  const SystemId id = or_fail(add_system(j, s));
  save(o.journal, j);
  if (o.json) {
    std::cout << nlohmann::json{{"added", id}, {"system", system_to_json(*find_system(j, id))}}.dump(2) << "\n";
  } else {
    std::cout << "added system " << id << ": " << describe_system_line(*find_system(j, id)) << "\n";
  }
}

void run_add_test(const LogOptions& o) {
  Journal j = load(o.journal, true);
  const System& sys = system_arg(j, o.system);
  TestResult t;
  t.parameter = or_fail(parameter_from_string(o.parameter));
  t.other_name = o.other_name;
  if (!o.value) throw CommandError("--value is needed");
  t.value = *o.value;
  std::string unit = o.unit;
  if (unit.empty()) {
    if (t.parameter == Parameter::Alkalinity) unit = units::to_string(sys.units.alkalinity);
    else if (t.parameter == Parameter::Calcium || t.parameter == Parameter::Magnesium)
      unit = units::to_string(sys.units.calcium_magnesium);
    else if (t.parameter == Parameter::Temperature) unit = to_string(sys.units.temperature);
    else if (t.parameter != Parameter::Other) unit = canonical_unit(t.parameter);
  }
  t.unit = or_fail(normalize_unit(t.parameter, unit));
  t.precision = o.precision;
  if (t.parameter == Parameter::PH) {
    t.ph_scale = o.ph_scale.empty() ? sys.units.ph_scale : or_fail(ph_scale_from_name(o.ph_scale));
  }
  t.kit = o.kit;
  auto [time_s, text] = event_time(o);
  add_event_and_save(o, j, Event{0, sys.id, time_s, text, t});
}

void run_add_dose(const LogOptions& o) {
  Journal j = load(o.journal, true);
  const System& sys = system_arg(j, o.system);
  if (!o.amount) throw CommandError("--amount is needed");
  Dose d{o.additive, *o.amount, or_fail(dose_unit_from_string(o.amount_unit)), o.stock_g_per_l};
  auto compound = additives::find_compound(o.additive);
  if (!compound) {
    std::fprintf(stderr, "note: additive '%s' is not in the compound catalog; it is logged as "
                         "given\n", o.additive.c_str());
  } else {
    print_cautions(additives::cautions_for(additives::additive_from_compound((*compound)->id)));
  }
  auto [time_s, text] = event_time(o);
  add_event_and_save(o, j, Event{0, sys.id, time_s, text, d});
}

void run_add_water_change(const LogOptions& o) {
  Journal j = load(o.journal, true);
  const System& sys = system_arg(j, o.system);
  if (!o.volume) throw CommandError("--volume is needed");
  WaterChange w{to_litres(*o.volume, o.volume_unit, sys.units.volume), o.new_alk, o.new_ca,
                o.new_mg, o.new_salinity};
  auto [time_s, text] = event_time(o);
  add_event_and_save(o, j, Event{0, sys.id, time_s, text, w});
}

void run_add_top_off(const LogOptions& o) {
  Journal j = load(o.journal, true);
  const System& sys = system_arg(j, o.system);
  if (!o.volume) throw CommandError("--volume is needed");
  TopOff t{to_litres(*o.volume, o.volume_unit, sys.units.volume),
           or_fail(top_off_kind_from_string(o.top_off_kind)), o.limewater_g_per_l};
  if (t.kind == TopOffKind::Limewater) {
    auto lw = additives::limewater_additive(sys.default_temperature_c);
    if (lw) print_cautions(additives::cautions_for(*lw));
  }
  auto [time_s, text] = event_time(o);
  add_event_and_save(o, j, Event{0, sys.id, time_s, text, t});
}

void run_add_note(const LogOptions& o) {
  Journal j = load(o.journal, true);
  const System& sys = system_arg(j, o.system);
  auto [time_s, text] = event_time(o);
  add_event_and_save(o, j, Event{0, sys.id, time_s, text, Note{o.text}});
}

EventFilter filter_from(const LogOptions& o, const Journal& j) {
  EventFilter f;
  if (!o.system.empty()) f.system_id = system_arg(j, o.system).id;
  if (!o.parameter.empty()) f.parameter = or_fail(parameter_from_string(o.parameter));
  if (!o.from.empty()) f.from_s = or_fail(datetime::parse_datetime(o.from, time_options(o)));
  if (!o.to.empty()) {
    f.to_s = or_fail(datetime::parse_datetime(o.to, time_options(o)));
    // A bare date as --to means the whole day.
    if (o.to.find(':') == std::string::npos) *f.to_s += 86399;
  }
  return f;
}

void run_import(const LogOptions& o) {
  Journal j = load(o.journal, true);
  CsvImportOptions opt;
  opt.time = time_options(o);
  if (!o.system.empty()) opt.default_system = system_arg(j, o.system).id;
  const std::string text = read_text_file(o.file);
  const CsvImportReport rep = or_fail(import_csv(j, text, opt));
  if (!rep.added.empty()) save(o.journal, j);
  if (o.json) {
    nlohmann::json rej = nlohmann::json::array();
    for (const auto& r : rep.rejected) rej.push_back({{"line", r.line}, {"field", r.field}, {"reason", r.reason}});
    std::cout << nlohmann::json{{"added", rep.added.size()},
                                {"duplicates_skipped", rep.duplicates_skipped},
                                {"rejected", rej}}.dump(2) << "\n";
  } else {
    std::cout << fmt::format("imported {} events, skipped {} duplicates, rejected {} rows\n",
                             rep.added.size(), rep.duplicates_skipped, rep.rejected.size());
    for (const auto& r : rep.rejected) {
      std::cerr << fmt::format("{}: line {}: {}\n", o.file, r.line, r.reason);
    }
  }
  if (!rep.rejected.empty()) {
    std::cout << std::flush;
    std::exit(3);  // documented: some rows were rejected (the accepted ones are saved)
  }
}

void run_export(const LogOptions& o) {
  const Journal j = load(o.journal, true);
  if (o.format == "json") {
    write_text_file_atomic(o.output, serialize_journal(j), false);
  } else if (o.format == "csv") {
    write_text_file_atomic(o.output, export_csv(j, filter_from(o, j)), false);
  } else {
    throw CommandError("--format '" + o.format + "' is not known; accepted: csv, json");
  }
}

void run_list(const LogOptions& o) {
  const Journal j = load(o.journal, true);
  const auto events = select_events(j, filter_from(o, j));
  if (o.json) {
    nlohmann::json arr = nlohmann::json::array();
    for (const Event* e : events) arr.push_back(event_to_json(*e));
    std::cout << arr.dump(2) << "\n";
    return;
  }
  if (events.empty()) {
    std::cout << "no events\n";
    return;
  }
  for (const Event* e : events) std::cout << describe_event_line(j, *e) << "\n";
}

void run_systems(const LogOptions& o) {
  const Journal j = load(o.journal, true);
  if (o.json) {
    nlohmann::json arr = nlohmann::json::array();
    for (const auto& s : j.systems) arr.push_back(system_to_json(s));
    std::cout << arr.dump(2) << "\n";
    return;
  }
  for (const auto& s : j.systems) std::cout << s.id << "  " << describe_system_line(s) << "\n";
}

void run_remove(const LogOptions& o) {
  Journal j = load(o.journal, true);
  if (find_event(j, o.id)) {
    or_fail(remove_event(j, o.id));
  } else {
    or_fail(remove_system(j, o.id, false));
  }
  save(o.journal, j);
  if (!o.json) std::cout << "removed " << o.id << "\n";
  else std::cout << nlohmann::json{{"removed", o.id}}.dump() << "\n";
}

void add_time_options(CLI::App* c, LogOptions& o) {
  c->add_option("--system", o.system, "System name or id (may be left out if there is only one)");
  c->add_option("--time", o.time, "When: 2026-11-01T08:00Z, '2026-11-01 08:00', 01/11/2026 ... (default: now)");
  c->add_option("--date-order", o.date_order, "dmy or mdy, for dates like 03/04/2026");
  c->add_option("--utc-offset", o.utc_offset_min, "Minutes east of UTC for times without a zone (default 0)");
}

}  // namespace

void register_log(CLI::App& app) {
  auto o = std::make_shared<LogOptions>();
  CLI::App* log = app.add_subcommand("log", "The tank journal: log tests, doses, water changes, top-offs and notes");
  log->require_subcommand(1);
  log->fallthrough();
  log->add_option("--journal", o->journal, "Journal file")->default_str("tidewright-journal.json");
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

  CLI::App* imp = log->add_subcommand("import", "Import test results and doses from CSV (see docs/journal-format.md); exit 3 if rows were rejected");
  imp->add_option("file", o->file, "CSV file, or - for standard input")->required();
  imp->add_option("--system", o->system, "System for rows without a system column");
  imp->add_option("--date-order", o->date_order, "dmy or mdy, for dates like 03/04/2026");
  imp->add_option("--utc-offset", o->utc_offset_min, "Minutes east of UTC for times without a zone");
  imp->callback([o] { run_import(*o); });

  auto add_filters = [&o](CLI::App* c) {
    c->add_option("--system", o->system, "Only this system (name or id)");
    c->add_option("--parameter", o->parameter, "Only test results of this parameter");
    c->add_option("--from", o->from, "From this date or time");
    c->add_option("--to", o->to, "Up to this date (whole day) or time");
    c->add_option("--date-order", o->date_order, "dmy or mdy");
  };
  CLI::App* exp = log->add_subcommand("export", "Export events as CSV, or the whole journal as JSON");
  exp->add_option("--format", o->format, "csv or json")->default_str("csv");
  exp->add_option("--output,-o", o->output, "File to write (- for standard output)")->default_str("-");
  add_filters(exp);
  exp->callback([o] { run_export(*o); });

  CLI::App* list = log->add_subcommand("list", "List events");
  add_filters(list);
  list->callback([o] { run_list(*o); });

  CLI::App* systems = log->add_subcommand("systems", "List systems");
  systems->callback([o] { run_systems(*o); });

  CLI::App* rm = log->add_subcommand("remove", "Remove an event, or a system without events, by id");
  rm->add_option("--id", o->id, "Id of the event or system")->required();
  rm->callback([o] { run_remove(*o); });
}

}  // namespace tw::shell
