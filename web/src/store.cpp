// Store text <-> app state (see store.hpp for the layout). The journal part is written and
// read by the core (journal_file.hpp); this file only adds the "app" member.
#include "store.hpp"

#include <algorithm>

#include <nlohmann/json.hpp>

#include "dosing_saved.hpp"
#include "theme.hpp"
#include "tidewright/journal/journal_file.hpp"

namespace twapp {
namespace {

using nlohmann::json;
namespace cb = tw::carbonate;
namespace jn = tw::journal;

json units_to_json(const jn::UnitPreferences& u) {
  return {{"alkalinity", tw::units::to_string(u.alkalinity)},
          {"calcium_magnesium", tw::units::to_string(u.calcium_magnesium)},
          {"temperature", jn::to_string(u.temperature)},
          {"ph_scale", jn::ph_scale_name(u.ph_scale)},
          {"volume", tw::units::to_string(u.volume)}};
}

// Unknown or missing unit names keep the default: a settings problem never loses data.
jn::UnitPreferences units_from_json(const json& j) {
  jn::UnitPreferences u;
  if (!j.is_object()) return u;
  auto text = [&](const char* key) { return j.contains(key) && j[key].is_string() ? j[key].get<std::string>() : std::string(); };
  if (auto r = tw::units::alkalinity_unit_from_string(text("alkalinity")); r) u.alkalinity = *r;
  if (auto r = tw::units::concentration_unit_from_string(text("calcium_magnesium")); r) u.calcium_magnesium = *r;
  if (auto r = jn::temperature_unit_from_string(text("temperature")); r) u.temperature = *r;
  if (auto r = jn::ph_scale_from_name(text("ph_scale")); r) u.ph_scale = *r;
  if (auto r = tw::units::volume_unit_from_string(text("volume")); r) u.volume = *r;
  return u;
}

json limits_to_json(const std::array<double, tw::plan::kLimitCount>& limits) {
  json out = json::object();
  for (const auto& spec : tw::plan::limit_specs()) out[spec.key] = limits[static_cast<std::size_t>(spec.id)];
  return out;
}

// Takes each known limit the core accepts without an override; anything else keeps its default
// (a damaged or hand-edited value must never loosen a limit past its hard ceiling).
void limits_from_json(const json& j, std::array<double, tw::plan::kLimitCount>& limits) {
  if (!j.is_object()) return;
  for (const auto& spec : tw::plan::limit_specs()) {
    if (!j.contains(spec.key) || !j[spec.key].is_number()) continue;
    const double v = j[spec.key].get<double>();
    if (tw::plan::make_limits({{spec.id, v, false, {}}})) limits[static_cast<std::size_t>(spec.id)] = v;
  }
}

}  // namespace

namespace {
const char* const kRoundScopeNames[] = {"all", "due", "chosen"};

json round_choice_to_json(const RoundChoice& r, const jn::Journal& journal) {
  json ids = json::array();
  for (jn::SystemId id : r.chosen) {
    if (jn::find_system(journal, id)) ids.push_back(id);  // a removed system's id goes
  }
  return {{"scope", kRoundScopeNames[static_cast<int>(r.scope)]}, {"systems", ids}};
}

// An unknown scope keeps All; ids of systems not in the journal are dropped.
RoundChoice round_choice_from_json(const json& j, const jn::Journal& journal) {
  RoundChoice r;
  if (!j.is_object()) return r;
  const std::string scope = j.contains("scope") && j["scope"].is_string() ? j["scope"].get<std::string>() : "";
  for (int i = 0; i < 3; ++i) {
    if (scope == kRoundScopeNames[i]) r.scope = static_cast<RoundScope>(i);
  }
  if (j.contains("systems") && j["systems"].is_array()) {
    for (const auto& id : j["systems"]) {
      if (id.is_number_integer() && jn::find_system(journal, id.get<jn::SystemId>())) r.chosen.push_back(id.get<jn::SystemId>());
    }
  }
  std::sort(r.chosen.begin(), r.chosen.end());
  r.chosen.erase(std::unique(r.chosen.begin(), r.chosen.end()), r.chosen.end());
  return r;
}

json app_part_json(const AppState& app) {
  json a;
  a["schema_version"] = kAppSchemaVersion;
  a["settings"] = {{"units", units_to_json(app.settings.units)},
                   {"text_size", app.settings.text_size},
                   {"look", theme::to_string(app.settings.look)},
                   {"room_co2_ppm", app.settings.room_co2_ppm},
                   {"constants_convention", tw::carbonate::to_string(app.settings.constants_convention)},
                   {"safety_limits", limits_to_json(app.settings.safety_limits)}};
  a["current_system"] = app.current_system;
  a["demo_system_ids"] = app.demo_system_ids;
  a["dosing_by_system"] = dosing_to_json(app.dosing_by_system, app.journal);
  a["round"] = round_choice_to_json(app.round_choice, app.journal);
  return a;
}
}  // namespace

std::string app_part_to_text(const AppState& app) { return app_part_json(app).dump(); }

std::string store_to_text(const AppState& app) {
  json doc = json::parse(jn::serialize_journal(app.journal));
  doc["app"] = app_part_json(app);
  return doc.dump(2) + "\n";
}

namespace {
// The app part's members into out (its journal already read): settings, the system shown, the
// demo's systems, the Plan and Hatchery settings per system. A value out of range keeps the
// default (refused Plan and Hatchery values are listed in out.refused by dosing_from_json).
tw::Result<bool> read_app_part(const json& app_part, StoredApp& out) {
  const jn::Journal& journal = out.journal;
  if (!app_part.is_object()) return tw::Error{"app", "the app part is not a JSON object"};
  const int version = app_part.value("schema_version", 0);
  if (version > kAppSchemaVersion) {
    return tw::Error{"app.schema_version", "app data version " + std::to_string(version) +
                                               " is newer than this build knows (" +
                                               std::to_string(kAppSchemaVersion) + "); update the app"};
  }
  if (app_part.contains("settings") && app_part["settings"].is_object()) {
    const json& s = app_part["settings"];
    if (s.contains("units")) out.settings.units = units_from_json(s["units"]);
    const double size = s.value("text_size", 1.0);
    if (size >= 0.8 && size <= 1.6) out.settings.text_size = static_cast<float>(size);
    if (s.contains("look") && s["look"].is_string()) {
      if (auto look = theme::look_from_string(s["look"].get<std::string>())) out.settings.look = *look;  // unknown: dark
    }
    const double co2 = s.value("room_co2_ppm", out.settings.room_co2_ppm);
    if (co2 >= 100 && co2 <= 10000) out.settings.room_co2_ppm = co2;
    if (s.contains("constants_convention") && s["constants_convention"].is_string()) {
      auto conv = tw::carbonate::convention_from_string(s["constants_convention"].get<std::string>());
      if (conv) out.settings.constants_convention = *conv;  // an unknown name keeps the default
    }
    if (s.contains("safety_limits")) limits_from_json(s["safety_limits"], out.settings.safety_limits);
  }
  const jn::SystemId current = app_part.value("current_system", jn::SystemId{0});
  if (jn::find_system(journal, current)) out.current_system = current;
  if (app_part.contains("demo_system_ids") && app_part["demo_system_ids"].is_array()) {
    for (const auto& id : app_part["demo_system_ids"]) {
      if (id.is_number_integer() && jn::find_system(journal, id.get<jn::SystemId>())) {
        out.demo_system_ids.push_back(id.get<jn::SystemId>());
      }
    }
  }
  if (app_part.contains("dosing_by_system")) {
    out.dosing_by_system = dosing_from_json(app_part["dosing_by_system"], journal, &out.refused);
  }
  if (app_part.contains("round")) out.round_choice = round_choice_from_json(app_part["round"], journal);
  return true;
}

tw::Result<StoredApp> store_from_text_unchecked(const std::string& text) {
  json doc = json::parse(text, nullptr, false);
  if (doc.is_discarded() || !doc.is_object()) {
    return tw::Error{"json", "the file is not a JSON object (damaged or not a Tidewright file)"};
  }
  StoredApp out;
  json app_part;
  if (doc.contains("app")) {
    app_part = doc["app"];
    doc.erase("app");
    out.had_app_part = true;
  }
  auto journal = jn::parse_journal(doc.dump());
  if (!journal) return journal.error();
  out.journal = std::move(journal).value();
  if (!out.had_app_part) return out;
  if (auto read = read_app_part(app_part, out); !read) return read.error();
  return out;
}
}  // namespace

std::string changes_to_text(const jn::JournalChanges& c) {
  json out = {{"schema_version", jn::kSchemaVersion}, {"first_new_id", c.first_new_id}, {"next_id", c.next_id},
              {"systems_put", json::array()}, {"systems_removed", c.systems_removed},
              {"events_put", json::array()}, {"events_removed", c.events_removed}};
  for (const auto& s : c.systems_put) out["systems_put"].push_back(jn::system_to_json(s));
  for (const auto& e : c.events_put) out["events_put"].push_back(jn::event_to_json(e));
  if (c.description) out["description"] = *c.description;
  return out.dump();
}

namespace {
tw::Result<jn::JournalChanges> changes_from_json(const json& doc) {
  jn::JournalChanges c;
  if (!doc.is_object()) return tw::Error{"records", "the records read back are not a JSON object"};
  for (const auto& j : doc.value("systems_put", json::array())) {
    auto s = jn::system_from_json(j);
    if (!s) return s.error();
    c.systems_put.push_back(std::move(s).value());
  }
  for (const auto& j : doc.value("events_put", json::array())) {
    auto e = jn::event_from_json(j);
    if (!e) return e.error();
    c.events_put.push_back(std::move(e).value());
  }
  c.systems_removed = doc.value("systems_removed", std::vector<jn::SystemId>{});
  c.events_removed = doc.value("events_removed", std::vector<jn::EventId>{});
  if (doc.contains("description") && doc["description"].is_string()) c.description = doc["description"].get<std::string>();
  c.next_id = doc.value("next_id", std::int64_t{1});
  return c;
}
}  // namespace

tw::Result<jn::JournalChanges> changes_from_text(const std::string& text) {
  try {
    return changes_from_json(json::parse(text));
  } catch (const nlohmann::json::exception& e) {
    return tw::Error{"records", std::string("the records read back could not be read: ") + e.what()};
  }
}

tw::Result<StoredApp> app_part_from_text(const std::string& text, const jn::Journal& journal) {
  try {
    StoredApp out;
    out.journal = journal;
    out.had_app_part = true;
    if (auto read = read_app_part(json::parse(text), out); !read) return read.error();
    return out;
  } catch (const nlohmann::json::exception& e) {
    return tw::Error{"app", std::string("the app part could not be read: ") + e.what()};
  }
}

namespace {
// RFC 6902 operations taking base to now: objects member by member, anything else whole.
void patch_members(const json& base, const json& now, const json::json_pointer& at, json& ops) {
  for (auto it = now.begin(); it != now.end(); ++it) {
    const json::json_pointer path = at / it.key();
    const auto was = base.find(it.key());
    if (was != base.end() && was->is_object() && it->is_object()) {
      patch_members(*was, *it, path, ops);
    } else if (was == base.end() || *was != *it) {
      ops.push_back({{"op", "add"}, {"path", path.to_string()}, {"value", *it}});
    }
  }
  for (auto it = base.begin(); it != base.end(); ++it) {
    if (!now.contains(it.key())) ops.push_back({{"op", "remove"}, {"path", (at / it.key()).to_string()}});
  }
}

json object_or_empty(const std::string& text) {
  json j = json::parse(text, nullptr, false);
  return j.is_object() ? j : json::object();
}
}  // namespace

std::string app_part_patch(const std::string& base, const std::string& now) {
  json ops = json::array();
  patch_members(object_or_empty(base), object_or_empty(now), json::json_pointer(), ops);
  return ops.empty() ? std::string() : ops.dump();
}

bool app_parts_agree(const std::string& a, const std::string& b) {
  json ja = object_or_empty(a), jb = object_or_empty(b);
  ja.erase("current_system");
  jb.erase("current_system");
  return ja == jb;
}

tw::Result<StoredApp> store_from_text(const std::string& text) {
  try {
    return store_from_text_unchecked(text);
  } catch (const nlohmann::json::exception& e) {  // a member of the wrong type in the app part
    return tw::Error{"app", std::string("the app part could not be read: ") + e.what()};
  }
}

}  // namespace twapp
