// Journal file format: JSON writer, reader with validation, and the migrations v1 -> v2 -> v3.
//
// Map: 1. writer   2. field readers (typed, with JSON paths in errors)   3. record readers
//      4. migration v1 -> v2   4b. migration v2 -> v3   5. checks shared with the streaming
//      reader (journal_json_internal.hpp, journal_stream.cpp)   6. parse_journal
#include <algorithm>
#include <set>

#include <fmt/format.h>

#include "tidewright/common/datetime.hpp"
#include "tidewright/common/stored_number.hpp"
#include "tidewright/journal/journal_file.hpp"
#include "journal_json_internal.hpp"
#include "journal_tidy_internal.hpp"

namespace tw::journal {

using nlohmann::json;

// ---------------------------------------------------------------- 1. writer
namespace {
void put_optional(json& j, const char* key, const std::optional<double>& v) {
  if (v) j[key] = *v;
}
// Every number written as the journal stores it (stored_number.hpp): no 2300.000000000001,
// even from a record stored before numbers were rounded on entry.
json tidy_json(json j) {
  if (j.is_number_float()) return stored_number(j.get<double>());
  if (j.is_structured()) {
    for (auto& v : j) v = tidy_json(std::move(v));
  }
  return j;
}
}  // namespace

json system_to_json(const System& s) {
  json j = json::object();
  j["id"] = s.id;
  j["name"] = s.name;
  j["kind"] = to_string(s.kind);
  j["volume_l"] = s.volume_l;
  if (s.volume_parts) {
    j["volume_parts"] = {{"display_l", s.volume_parts->display_l},
                         {"sump_l", s.volume_parts->sump_l},
                         {"rock_displacement_l", s.volume_parts->rock_displacement_l}};
  }
  j["default_salinity"] = s.default_salinity;
  j["default_temperature_c"] = s.default_temperature_c;
  j["units"] = {{"alkalinity", units::to_string(s.units.alkalinity)},
                {"calcium_magnesium", units::to_string(s.units.calcium_magnesium)},
                {"temperature", to_string(s.units.temperature)},
                {"ph_scale", ph_scale_name(s.units.ph_scale)},
                {"volume", units::to_string(s.units.volume)}};
  json t = json::object();
  put_optional(t, "alkalinity_dkh", s.targets.alkalinity_dkh);
  put_optional(t, "calcium_mg_l", s.targets.calcium_mg_l);
  put_optional(t, "magnesium_mg_l", s.targets.magnesium_mg_l);
  j["targets"] = t;
  return tidy_json(std::move(j));
}

json event_to_json(const Event& e) {
  json j = json::object();
  j["id"] = e.id;
  j["system_id"] = e.system_id;
  j["time"] = datetime::format_iso8601_utc(e.time_s);
  if (!e.time_text.empty()) j["time_text"] = e.time_text;
  j["type"] = event_type_name(e.data);
  if (const auto* t = std::get_if<TestResult>(&e.data)) {
    j["parameter"] = tw::parameter_name(t->parameter);
    if (!t->other_name.empty()) j["other_name"] = t->other_name;
    j["value"] = t->value;
    j["unit"] = t->unit;
    put_optional(j, "precision", t->precision);
    if (t->ph_scale) j["ph_scale"] = ph_scale_name(*t->ph_scale);
    if (!t->kit.empty()) j["kit"] = t->kit;
  } else if (const auto* d = std::get_if<Dose>(&e.data)) {
    j["additive"] = d->additive_id;
    j["amount"] = d->amount;
    j["amount_unit"] = to_string(d->unit);
    put_optional(j, "stock_g_per_l", d->stock_g_per_l);
    if (d->mark != ScheduleMark::None) j["mark"] = to_string(d->mark);
    if (d->schedule_id) j["schedule_id"] = *d->schedule_id;
  } else if (const auto* p = std::get_if<DoseSchedule>(&e.data)) {
    j["device"] = p->device;
    j["additive"] = p->additive_id;
    j["amount"] = p->amount;
    j["amount_unit"] = to_string(p->unit);
    put_optional(j, "stock_g_per_l", p->stock_g_per_l);
    if (!p->stock_name.empty()) j["stock_name"] = p->stock_name;
    j["doses_per_day"] = p->doses_per_day;
    j["calibration"] = p->calibration;
    if (p->stop_time_s) j["stop"] = datetime::format_iso8601_utc(*p->stop_time_s);
  } else if (const auto* w = std::get_if<WaterChange>(&e.data)) {
    j["volume_l"] = w->volume_l;
    json n = json::object();
    put_optional(n, "alkalinity_dkh", w->alkalinity_dkh);
    put_optional(n, "calcium_mg_l", w->calcium_mg_l);
    put_optional(n, "magnesium_mg_l", w->magnesium_mg_l);
    put_optional(n, "salinity", w->salinity);
    j["new_water"] = n;
  } else if (const auto* o = std::get_if<TopOff>(&e.data)) {
    j["volume_l"] = o->volume_l;
    j["kind"] = to_string(o->kind);
    put_optional(j, "limewater_g_per_l", o->limewater_g_per_l);
  } else {
    j["text"] = std::get<Note>(e.data).text;
  }
  return tidy_json(std::move(j));
}

std::string serialize_journal(const Journal& journal) {
  json doc = json::object();
  doc["format"] = kFormatName;
  doc["schema_version"] = kSchemaVersion;
  if (!journal.description.empty()) doc["description"] = journal.description;
  doc["next_id"] = journal.next_id;
  json systems = json::array();
  for (const auto& s : journal.systems) systems.push_back(system_to_json(s));
  doc["systems"] = std::move(systems);
  json events = json::array();
  for (const auto& e : journal.events) events.push_back(event_to_json(e));
  doc["events"] = std::move(events);
  // Validated journals hold only UTF-8 text; the replace handler is a safety net so that a
  // journal edited in memory without validation (e.g. its description) never throws here.
  return doc.dump(2, ' ', false, json::error_handler_t::replace) + "\n";
}

// ---------------------------------------------------------------- 2. field readers
namespace {

Error at(const std::string& path, const std::string& why) { return Error{path, path + ": " + why}; }

const json* member(const json& obj, const char* key) {
  auto it = obj.find(key);
  return it == obj.end() ? nullptr : &*it;
}

Result<double> get_number(const json& obj, const std::string& path, const char* key) {
  const json* v = member(obj, key);
  if (!v) return at(path + "." + key, "is missing (a number)");
  if (!v->is_number()) return at(path + "." + key, "must be a number");
  return v->get<double>();
}

Result<std::optional<double>> get_optional_number(const json& obj, const std::string& path,
                                                  const char* key) {
  const json* v = member(obj, key);
  if (!v || v->is_null()) return std::optional<double>{};
  if (!v->is_number()) return at(path + "." + key, "must be a number");
  return std::optional<double>{v->get<double>()};
}

Result<std::int64_t> get_integer(const json& obj, const std::string& path, const char* key) {
  const json* v = member(obj, key);
  if (!v) return at(path + "." + key, "is missing (an integer)");
  if (!v->is_number_integer()) return at(path + "." + key, "must be an integer");
  if (v->is_number_unsigned() && v->get<std::uint64_t>() > 9007199254740992ULL) {
    return at(path + "." + key, "is too large");
  }
  return v->get<std::int64_t>();
}

Result<std::string> get_string(const json& obj, const std::string& path, const char* key,
                               bool required = true) {
  const json* v = member(obj, key);
  if (!v || v->is_null()) {
    if (required) return at(path + "." + key, "is missing (a text)");
    return std::string();
  }
  if (!v->is_string()) return at(path + "." + key, "must be a text");
  return v->get<std::string>();
}

// Wraps an error from a name parser or validator with the JSON path.
Error with_path(const std::string& path, const Error& e) {
  return Error{path + "." + e.field, path + ": " + e.message};
}

#define TW_TRY(var, expr)                 \
  auto var##_r = (expr);                  \
  if (!var##_r) return var##_r.error();   \
  auto var = std::move(var##_r).value()

#define TW_TRY_NAME(var, expr, path)                     \
  auto var##_r = (expr);                                 \
  if (!var##_r) return with_path(path, var##_r.error()); \
  auto var = std::move(var##_r).value()

// ---------------------------------------------------------------- 3. record readers
Result<System> read_system(const json& j, const std::string& path) {
  if (!j.is_object()) return at(path, "must be an object");
  System s;
  TW_TRY(id, get_integer(j, path, "id"));
  TW_TRY(name, get_string(j, path, "name"));
  TW_TRY(kind_text, get_string(j, path, "kind"));
  TW_TRY_NAME(kind, system_kind_from_string(kind_text), path);
  TW_TRY(volume, get_number(j, path, "volume_l"));
  s.id = id;
  s.name = name;
  s.kind = kind;
  s.volume_l = volume;
  if (const json* p = member(j, "volume_parts"); p && !p->is_null()) {
    const std::string pp = path + ".volume_parts";
    if (!p->is_object()) return at(pp, "must be an object");
    TW_TRY(display, get_number(*p, pp, "display_l"));
    TW_TRY(sump, get_number(*p, pp, "sump_l"));
    TW_TRY(rock, get_number(*p, pp, "rock_displacement_l"));
    s.volume_parts = VolumeParts{display, sump, rock};
  }
  TW_TRY(sal, get_number(j, path, "default_salinity"));
  TW_TRY(temp, get_number(j, path, "default_temperature_c"));
  s.default_salinity = sal;
  s.default_temperature_c = temp;
  const json* u = member(j, "units");
  const std::string up = path + ".units";
  if (!u || !u->is_object()) return at(up, "is missing (an object of unit preferences)");
  TW_TRY(alk_u, get_string(*u, up, "alkalinity"));
  TW_TRY_NAME(alk, units::alkalinity_unit_from_string(alk_u), up);
  TW_TRY(cm_u, get_string(*u, up, "calcium_magnesium"));
  TW_TRY_NAME(cm, units::concentration_unit_from_string(cm_u), up);
  TW_TRY(t_u, get_string(*u, up, "temperature"));
  TW_TRY_NAME(tu, temperature_unit_from_string(t_u), up);
  TW_TRY(ph_u, get_string(*u, up, "ph_scale"));
  TW_TRY_NAME(ph, ph_scale_from_name(ph_u), up);
  TW_TRY(v_u, get_string(*u, up, "volume"));
  TW_TRY_NAME(vu, units::volume_unit_from_string(v_u), up);
  s.units = UnitPreferences{alk, cm, tu, ph, vu};
  if (const json* t = member(j, "targets"); t && !t->is_null()) {
    const std::string tp = path + ".targets";
    if (!t->is_object()) return at(tp, "must be an object");
    TW_TRY(a, get_optional_number(*t, tp, "alkalinity_dkh"));
    TW_TRY(c, get_optional_number(*t, tp, "calcium_mg_l"));
    TW_TRY(m, get_optional_number(*t, tp, "magnesium_mg_l"));
    s.targets = Targets{a, c, m};
  }
  return s;
}

Result<EventData> read_payload(const json& j, const std::string& path, const std::string& type) {
  if (type == "test") {
    TestResult t;
    TW_TRY(p_text, get_string(j, path, "parameter"));
    TW_TRY_NAME(p, parameter_from_name(p_text), path);
    TW_TRY(other, get_string(j, path, "other_name", false));
    TW_TRY(value, get_number(j, path, "value"));
    TW_TRY(unit, get_string(j, path, "unit"));
    TW_TRY(prec, get_optional_number(j, path, "precision"));
    TW_TRY(scale_text, get_string(j, path, "ph_scale", false));
    TW_TRY(kit, get_string(j, path, "kit", false));
    t.parameter = p;
    t.other_name = other;
    t.value = value;
    t.unit = unit;
    t.precision = prec;
    if (!scale_text.empty()) {
      TW_TRY_NAME(scale, ph_scale_from_name(scale_text), path);
      t.ph_scale = scale;
    }
    t.kit = kit;
    return EventData{t};
  }
  if (type == "dose") {
    Dose d;
    TW_TRY(additive, get_string(j, path, "additive"));
    TW_TRY(amount, get_number(j, path, "amount"));
    TW_TRY(unit_text, get_string(j, path, "amount_unit"));
    TW_TRY_NAME(unit, dose_unit_from_string(unit_text), path);
    TW_TRY(stock, get_optional_number(j, path, "stock_g_per_l"));
    TW_TRY(mark_text, get_string(j, path, "mark", false));
    TW_TRY_NAME(mark, schedule_mark_from_string(mark_text), path);
    d.additive_id = additive;
    d.amount = amount;
    d.unit = unit;
    d.stock_g_per_l = stock;
    d.mark = mark;
    if (const json* sid = member(j, "schedule_id"); sid && !sid->is_null()) {
      TW_TRY(id, get_integer(j, path, "schedule_id"));
      d.schedule_id = id;
    }
    return EventData{d};
  }
  if (type == "schedule") {
    DoseSchedule d;
    TW_TRY(device, get_string(j, path, "device"));
    TW_TRY(additive, get_string(j, path, "additive"));
    TW_TRY(amount, get_number(j, path, "amount"));
    TW_TRY(unit_text, get_string(j, path, "amount_unit"));
    TW_TRY_NAME(unit, dose_unit_from_string(unit_text), path);
    TW_TRY(stock, get_optional_number(j, path, "stock_g_per_l"));
    TW_TRY(stock_name, get_string(j, path, "stock_name", false));
    TW_TRY(per_day, get_integer(j, path, "doses_per_day"));
    TW_TRY(calibration, get_optional_number(j, path, "calibration"));
    TW_TRY(stop_text, get_string(j, path, "stop", false));
    d.device = device;
    d.additive_id = additive;
    d.amount = amount;
    d.unit = unit;
    d.stock_g_per_l = stock;
    d.stock_name = stock_name;
    if (per_day < 1 || per_day > kMaxDosesPerDay) {
      return at(path + ".doses_per_day", fmt::format("{} is outside the accepted range 1 to {}", per_day, kMaxDosesPerDay));
    }
    d.doses_per_day = static_cast<int>(per_day);
    d.calibration = calibration.value_or(1.0);
    if (!stop_text.empty()) {
      auto stop = datetime::parse_datetime(stop_text);
      if (!stop) return with_path(path + ".stop", stop.error());
      d.stop_time_s = *stop;
    }
    return EventData{d};
  }
  if (type == "water_change") {
    WaterChange w;
    TW_TRY(volume, get_number(j, path, "volume_l"));
    w.volume_l = volume;
    if (const json* n = member(j, "new_water"); n && !n->is_null()) {
      const std::string np = path + ".new_water";
      if (!n->is_object()) return at(np, "must be an object");
      TW_TRY(a, get_optional_number(*n, np, "alkalinity_dkh"));
      TW_TRY(c, get_optional_number(*n, np, "calcium_mg_l"));
      TW_TRY(m, get_optional_number(*n, np, "magnesium_mg_l"));
      TW_TRY(s, get_optional_number(*n, np, "salinity"));
      w.alkalinity_dkh = a;
      w.calcium_mg_l = c;
      w.magnesium_mg_l = m;
      w.salinity = s;
    }
    return EventData{w};
  }
  if (type == "top_off") {
    TopOff o;
    TW_TRY(volume, get_number(j, path, "volume_l"));
    TW_TRY(kind_text, get_string(j, path, "kind"));
    TW_TRY_NAME(kind, top_off_kind_from_string(kind_text), path);
    TW_TRY(lw, get_optional_number(j, path, "limewater_g_per_l"));
    o.volume_l = volume;
    o.kind = kind;
    o.limewater_g_per_l = lw;
    return EventData{o};
  }
  if (type == "note") {
    TW_TRY(text, get_string(j, path, "text"));
    return EventData{Note{text}};
  }
  return at(path + ".type",
            "'" + type + "' is not known; accepted: test, dose, water_change, top_off, note, schedule");
}

Result<Event> read_event(const json& j, const std::string& path) {
  if (!j.is_object()) return at(path, "must be an object");
  Event e;
  TW_TRY(id, get_integer(j, path, "id"));
  TW_TRY(system_id, get_integer(j, path, "system_id"));
  TW_TRY(time_str, get_string(j, path, "time"));
  TW_TRY(time_text, get_string(j, path, "time_text", false));
  TW_TRY(type, get_string(j, path, "type"));
  auto time = datetime::parse_datetime(time_str);
  if (!time) return with_path(path, time.error());
  TW_TRY(data, read_payload(j, path, type));
  e.id = id;
  e.system_id = system_id;
  e.time_s = *time;
  e.time_text = time_text;
  e.data = std::move(data);
  return e;
}

}  // namespace

// Read numbers are rounded as stored (stored_number.hpp), so writing and reading again is exact.
Result<System> system_from_json(const json& j) {
  auto read = read_system(j, "system");
  if (!read) return read;
  System s = std::move(read).value();
  tidy_numbers(s);
  return s;
}
Result<Event> event_from_json(const json& j) {
  auto read = read_event(j, "event");
  if (!read) return read;
  Event e = std::move(read).value();
  tidy_numbers(e);
  return e;
}

// ---------------------------------------------------------------- 4. migration v1 -> v2
Result<json> migrate_v1_to_v2(const json& v1) {
  json v2 = v1;
  v2["schema_version"] = 2;
  std::int64_t max_id = 0;
  if (v2.contains("systems") && v2["systems"].is_array()) {
    for (size_t i = 0; i < v2["systems"].size(); ++i) {
      json& s = v2["systems"][i];
      const std::string path = fmt::format("systems[{}]", i);
      if (!s.is_object()) return at(path, "must be an object");
      for (const auto& [from, to] : {std::pair{"salinity", "default_salinity"},
                                     std::pair{"temperature_c", "default_temperature_c"}}) {
        if (s.contains(from)) {
          s[to] = s[from];
          s.erase(from);
        }
      }
      if (!s.contains("units")) {
        s["units"] = {{"alkalinity", "dKH"}, {"calcium_magnesium", "mg/L"}, {"temperature", "C"},
                      {"ph_scale", "nbs"},   {"volume", "L"}};
      }
      if (s.contains("id") && s["id"].is_number_integer()) {
        max_id = std::max(max_id, s["id"].get<std::int64_t>());
      }
    }
  }
  if (v2.contains("events") && v2["events"].is_array()) {
    for (size_t i = 0; i < v2["events"].size(); ++i) {
      json& e = v2["events"][i];
      const std::string path = fmt::format("events[{}]", i);
      if (!e.is_object()) return at(path, "must be an object");
      TW_TRY(time_s, get_integer(e, path, "time_s"));
      if (time_s < ranges::kEarliestTimeS || time_s > ranges::kLatestTimeS) {
        return at(path + ".time_s", "is outside the accepted range 1970-01-01 to 2200-01-01");
      }
      e["time"] = datetime::format_iso8601_utc(time_s);
      e.erase("time_s");
      // Compared as JSON values: json::value() would throw on a member of another type, and
      // such a member is refused with its path later, by the event reader.
      if (e.contains("type") && e["type"] == "test" && e.contains("parameter") &&
          e["parameter"] == "ph" && !e.contains("ph_scale")) {
        e["ph_scale"] = "nbs";
      }
      if (e.contains("id") && e["id"].is_number_integer()) {
        max_id = std::max(max_id, e["id"].get<std::int64_t>());
      }
    }
  }
  if (!v2.contains("next_id")) v2["next_id"] = max_id + 1;
  return v2;
}

// ---------------------------------------------------------------- 4b. migration v2 -> v3
// v3 added dose schedules (events of type "schedule") and the "mark"/"schedule_id" of a dose;
// a v2 file has neither, so only the version changes.
Result<json> migrate_v2_to_v3(const json& v2) {
  json v3 = v2;
  v3["schema_version"] = 3;
  return v3;
}

// ---------------------------------------------------------------- 5. shared checks
namespace detail {

Result<System> read_system_at(const json& j, const std::string& path) {
  auto read = read_system(j, path);
  if (!read) return read;
  System s = std::move(read).value();
  tidy_numbers(s);
  return s;
}

Result<Event> read_event_at(const json& j, const std::string& path) {
  auto read = read_event(j, path);
  if (!read) return read;
  Event e = std::move(read).value();
  tidy_numbers(e);
  return e;
}

Result<int> check_format_and_version(const json& doc) {
  if (!doc.is_object()) return Error{"format", "the journal must be a JSON object"};
  const json* fmt_name = member(doc, "format");
  if (!fmt_name || !fmt_name->is_string() || fmt_name->get<std::string>() != kFormatName) {
    return Error{"format", std::string("this is not a Tidewright journal: \"format\" must be \"") +
                               kFormatName + "\""};
  }
  const json* ver = member(doc, "schema_version");
  if (!ver || !ver->is_number_integer()) {
    return Error{"schema_version", "schema_version is missing or not an integer"};
  }
  const std::int64_t version = ver->get<std::int64_t>();
  if (version > kSchemaVersion) {
    return Error{"schema_version",
                 fmt::format("schema_version {} is newer than this program reads (up to {}); "
                             "update Tidewright to open this journal",
                             version, kSchemaVersion)};
  }
  if (version < 1) return Error{"schema_version", fmt::format("schema_version {} is not valid (1 to {})", version, kSchemaVersion)};
  return static_cast<int>(version);
}

Status read_head_fields(const json& doc, std::string& description, std::int64_t& next_id) {
  TW_TRY(d, get_string(doc, "journal", "description", false));
  TW_TRY(n, get_integer(doc, "journal", "next_id"));
  description = std::move(d);
  next_id = n;
  return Ok{};
}

Error json_syntax_error(const std::string& what, const std::string& line_column) {
  // nlohmann: "[json.exception.parse_error.101] parse error at line 3, column 12: why"
  std::string why = what;
  const auto pos = why.find("] ");
  if (pos != std::string::npos) why = why.substr(pos + 2);
  if (why.rfind("parse error at line", 0) == 0 && why.find(": ") != std::string::npos) {
    why = why.substr(why.find(": ") + 2);
  }
  return Error{"json", "the journal is not valid JSON (" + line_column + "): " + why};
}

JournalChecks::JournalChecks(std::int64_t next_id) : next_id_(next_id) {
  if (next_id > 1 && next_id <= kIdBitsLimit) below_next_.assign(static_cast<std::size_t>(next_id - 1), false);
}

Status JournalChecks::claim_id(std::int64_t id, const std::string& path) {
  if (id <= 0) return at(path + ".id", "must be a positive integer");
  bool fresh = true;
  if (id < next_id_ && static_cast<std::size_t>(id - 1) < below_next_.size()) {
    auto bit = below_next_[static_cast<std::size_t>(id - 1)];
    fresh = !bit;
    bit = true;
  } else {
    fresh = other_ids_.insert(id).second;
  }
  if (!fresh) return at(path + ".id", fmt::format("{} is used twice", id));
  max_id_ = std::max(max_id_, id);
  return Ok{};
}

Status JournalChecks::system(const System& s, const std::string& path) {
  Status st = claim_id(s.id, path);
  if (!st) return st;
  st = validate_system(context_, s);
  if (!st) return with_path(path, st.error());
  context_.systems.push_back(s);
  return Ok{};
}

Status JournalChecks::event(const Event& e, const std::string& path) {
  Status st = claim_id(e.id, path);
  if (!st) return st;
  st = validate_event(context_, e);
  if (!st) return with_path(path, st.error());
  // A mark is checked against its schedule only (validate_mark): the other events need not be kept.
  if (std::holds_alternative<DoseSchedule>(e.data)) context_.events.push_back(e);
  return Ok{};
}

Status JournalChecks::finish() const {
  if (next_id_ <= max_id_) {
    return at("next_id", fmt::format("{} must be greater than every id in the journal ({})", next_id_, max_id_));
  }
  return Ok{};
}

}  // namespace detail

// ---------------------------------------------------------------- 6. parse_journal
namespace {
std::string line_column(const std::string& text, size_t byte) {
  size_t line = 1, col = 1;
  for (size_t i = 0; i < byte && i < text.size(); ++i) {
    if (text[i] == '\n') {
      ++line;
      col = 1;
    } else {
      ++col;
    }
  }
  return fmt::format("line {}, column {}", line, col);
}

// Where nlohmann's parser stops on text it refuses. A number too large for a double ("1e400")
// is refused with an out_of_range exception, which carries no position; the SAX parser says
// where (as the streaming reader reports it).
class ErrorLocator final : public nlohmann::json_sax<json> {
 public:
  std::size_t byte = 0;
  bool null() override { return true; }
  bool boolean(bool) override { return true; }
  bool number_integer(number_integer_t) override { return true; }
  bool number_unsigned(number_unsigned_t) override { return true; }
  bool number_float(number_float_t, const string_t&) override { return true; }
  bool string(string_t&) override { return true; }
  bool binary(binary_t&) override { return true; }
  bool start_object(std::size_t) override { return true; }
  bool key(string_t&) override { return true; }
  bool end_object() override { return true; }
  bool start_array(std::size_t) override { return true; }
  bool end_array() override { return true; }
  bool parse_error(std::size_t position, const std::string&, const nlohmann::detail::exception&) override {
    byte = position;
    return false;
  }
};
}  // namespace

Result<Journal> parse_journal(const std::string& text, int* source_version) {
  json doc;
  try {
    doc = json::parse(text);
  } catch (const json::parse_error& e) {
    return detail::json_syntax_error(e.what(), line_column(text, e.byte ? e.byte - 1 : 0));
  } catch (const json::exception& e) {
    ErrorLocator where;
    json::sax_parse(text, &where);
    return detail::json_syntax_error(e.what(), line_column(text, where.byte ? where.byte - 1 : 0));
  }
  auto version = detail::check_format_and_version(doc);
  if (!version) return version.error();
  if (source_version) *source_version = *version;
  if (*version == 1) {
    auto migrated = migrate_v1_to_v2(doc);
    if (!migrated) return migrated.error();
    doc = std::move(migrated).value();
  }
  if (doc["schema_version"].get<std::int64_t>() == 2) {
    auto migrated = migrate_v2_to_v3(doc);
    if (!migrated) return migrated.error();
    doc = std::move(migrated).value();
  }

  Journal j;
  std::int64_t next_id = 0;
  if (Status head = detail::read_head_fields(doc, j.description, next_id); !head) return head.error();
  const json* systems = member(doc, "systems");
  const json* events = member(doc, "events");
  if (!systems || !systems->is_array()) return at("systems", "is missing (an array)");
  if (!events || !events->is_array()) return at("events", "is missing (an array)");
  detail::JournalChecks checks(next_id);
  for (size_t i = 0; i < systems->size(); ++i) {
    const std::string path = fmt::format("systems[{}]", i);
    TW_TRY(s, detail::read_system_at((*systems)[i], path));
    Status st = checks.system(s, path);
    if (!st) return st.error();
  }
  j.systems = checks.systems();
  j.events.reserve(events->size());
  for (size_t i = 0; i < events->size(); ++i) {
    const std::string path = fmt::format("events[{}]", i);
    TW_TRY(e, detail::read_event_at((*events)[i], path));
    Status st = checks.event(e, path);
    if (!st) return st.error();
    j.events.push_back(std::move(e));
  }
  std::stable_sort(j.events.begin(), j.events.end(), [](const Event& a, const Event& b) {
    return a.time_s != b.time_s ? a.time_s < b.time_s : a.id < b.id;
  });
  if (Status st = checks.finish(); !st) return st.error();
  j.next_id = next_id;
  return j;
}

}  // namespace tw::journal
