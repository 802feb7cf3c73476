// The journal file format "tidewright-journal" (JSON, documented in docs/journal-format.md):
// text in, text out. The core never touches files; shell/file_io.hpp does the atomic writes
// and the web app keeps the text in browser storage.
//
// Versions: schema_version 3 is current (2 plus dose schedules and marked doses). Versions 1
// and 2 are migrated on reading: see migrate_v1_to_v2 / migrate_v2_to_v3 below and the format doc. A newer version than this build
// knows is refused with a clear error, never guessed at.
#pragma once

#include <string>

#include <nlohmann/json.hpp>

#include "tidewright/journal/journal.hpp"
#include "tidewright/common/result.hpp"

namespace tw::journal {

inline constexpr const char* kFormatName = "tidewright-journal";
inline constexpr int kSchemaVersion = 3;

// Pretty-printed JSON (2-space indent, trailing newline) of the current schema version.
// parse_journal(serialize_journal(j)) == j exactly, for every journal that passes validation.
std::string serialize_journal(const Journal& journal);

// Parses a journal file of any known version (migrating older ones) and validates every
// system and event. Errors: field "json" with "line L, column C: ..." for malformed text; a
// JSON path such as "events[3].value" with the reason and the accepted range otherwise;
// "schema_version" for a newer version. If source_version is given it receives the version
// found in the file.
Result<Journal> parse_journal(const std::string& text, int* source_version = nullptr);

// The version-1 document turned into a version-2 document (still unvalidated JSON).
// v1 -> v2: systems' "salinity"/"temperature_c" became "default_salinity"/
// "default_temperature_c"; v1 had no unit preferences (filled with dKH, mg/L, C, nbs, L); v1
// times were integer "time_s" (v2: ISO 8601 UTC text "time"); v1 pH results had no scale
// (taken as nbs, the scale of hobby meters); v1 had no "next_id" (set to the largest id + 1).
Result<nlohmann::json> migrate_v1_to_v2(const nlohmann::json& v1);
// v2 -> v3: v3 added events of type "schedule" and a dose's "mark" and "schedule_id"; a v2
// document has none, so only schema_version changes.
Result<nlohmann::json> migrate_v2_to_v3(const nlohmann::json& v2);

// Single records as JSON objects of the current version (for `tidewright log ... --json`).
nlohmann::json system_to_json(const System& system);
nlohmann::json event_to_json(const Event& event);
// And back: one record of the current version, its fields checked as parse_journal checks
// them, but not against a journal (the caller validates or trusts where it came from: the
// browser's database holds records this app wrote). Errors name the field.
Result<System> system_from_json(const nlohmann::json& j);
Result<Event> event_from_json(const nlohmann::json& j);

}  // namespace tw::journal
