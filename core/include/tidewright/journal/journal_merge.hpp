// One journal added into another (the app's "Add to what is here" for a Tidewright file).
//
// The rules, the same as the command line's `log import` of a JSON journal (store_import.cpp):
// - Systems are matched by name, ignoring case and surrounding space. A matched system keeps
//   its own settings (volume, units, targets ...): the file's are not copied over it, and when
//   they differ the report names the system (settings_kept) so the keeper can look.
// - A system of the file with no match here is added with all its settings and a new id.
// - Every event gets a new id and the id of its system here. An event equal to one already
//   here (find_equal_event: same system, time and content) is skipped and counted, so merging
//   the same file twice adds nothing the second time.
// - Standing dose schedules come along as events; a dose marked against a schedule points at
//   the schedule's id here (the new one, or the equal one already here).
// All or nothing: if any system or event is refused by the core's checks, the error names it
// and the target is left exactly as it was.
#pragma once

#include <map>
#include <string>
#include <vector>

#include "tidewright/common/result.hpp"
#include "tidewright/journal/journal.hpp"

namespace tw::journal {

struct MergeReport {
  int systems_added = 0;
  int systems_matched = 0;
  std::vector<std::string> settings_kept;  // matched systems whose settings in the file differ
  int entries_added = 0;
  int duplicates_skipped = 0;
  std::map<SystemId, SystemId> system_ids;  // the file's system id -> the id here
};

Result<MergeReport> merge_journal(Journal& target, const Journal& source);

// The settings of two systems equal, their ids and names aside.
bool same_system_settings(const System& a, const System& b);

}  // namespace tw::journal
