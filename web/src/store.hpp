// What the app keeps between visits, as one JSON text: a "tidewright-journal" document (the
// core's format, readable by the command line) with one extra member "app" holding the app's
// own part, schema-versioned:
//   { "format": "tidewright-journal", "schema_version": 2, ...systems, events...,
//     "app": { "schema_version": 1, "settings": {...}, "current_system": 3, "demo_system_ids": [1],
//              "dosing_by_system": {"3": {"plan": {...}, "hatchery": {...}}},
//              "round": {"scope": "all"|"due"|"chosen", "systems": [3, 5]} } }
// (dosing_by_system: the Plan and Hatchery settings per system, dosing_saved.hpp; round: which
// systems the round of tests lists, farm_state.hpp RoundChoice. Both added without a new
// schema_version: an older build ignores them.)
// The same text is what Export writes and Import reads (Import also takes a bare journal).
#pragma once

#include <map>
#include <string>
#include <vector>

#include "app_state.hpp"
#include "tidewright/common/result.hpp"
#include "tidewright/journal/journal_diff.hpp"

namespace twapp {

inline constexpr int kAppSchemaVersion = 1;
inline constexpr const char* kStoreName = "tidewright.json";

struct StoredApp {
  Settings settings;
  tw::journal::Journal journal;
  tw::journal::SystemId current_system = 0;
  std::vector<tw::journal::SystemId> demo_system_ids;
  std::map<tw::journal::SystemId, SystemDosing> dosing_by_system;
  RoundChoice round_choice;
  std::vector<std::string> refused;  // saved settings refused (default used), one line each
  bool had_app_part = false;  // false for a bare journal file
};

std::string store_to_text(const AppState& app);
std::string app_part_to_text(const AppState& app);  // the "app" member alone, JSON
tw::Result<StoredApp> store_from_text(const std::string& text);

// The app part alone (another tab's, read back from the browser's database) for this journal:
// settings, demo systems and the Plan and Hatchery settings as store_from_text reads them.
tw::Result<StoredApp> app_part_from_text(const std::string& text, const tw::journal::Journal& journal);

// Two tabs changing settings at the same moment (issue 15): a save sends only what changed in
// the app part since this tab last wrote or read it, as RFC 6902 JSON Patch operations ("add"
// for a new or changed member, "remove" for a gone one; objects compared member by member,
// anything else as one value). web_store.js applies them to the stored part inside its write,
// so changes to different settings, or to different systems' Plan settings, are all kept; the
// last writer wins only for the same setting. Empty text: nothing changed.
std::string app_part_patch(const std::string& base, const std::string& now);

// Whether two app parts say the same, apart from the system each tab shows (a tab's own).
bool app_parts_agree(const std::string& a, const std::string& b);

// A change record by record, as JSON text: what the browser's database writes after a tap and
// what another tab reads back (web_store.js). Records are the journal format's (journal_file.hpp):
//   { "schema_version": 3, "first_new_id": N, "next_id": N, "systems_put": [system...],
//     "systems_removed": [id...], "events_put": [event...], "events_removed": [id...],
//     "description": "..." (when it changed) }
std::string changes_to_text(const tw::journal::JournalChanges& changes);
tw::Result<tw::journal::JournalChanges> changes_from_text(const std::string& text);

}  // namespace twapp
