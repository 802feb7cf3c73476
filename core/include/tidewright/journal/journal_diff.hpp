// What changed between two states of a journal, record by record: what a store writes after an
// edit instead of the whole journal (core/store for the desktop, IndexedDB in the browser).
#pragma once

#include <optional>
#include <string>
#include <vector>

#include "tidewright/journal/journal.hpp"

namespace tw::journal {

struct JournalChanges {
  std::vector<System> systems_put;        // new or changed systems (whole records)
  std::vector<SystemId> systems_removed;
  std::vector<Event> events_put;          // new or changed events (whole records)
  std::vector<EventId> events_removed;
  std::optional<std::string> description; // set when it changed
  std::int64_t next_id = 1;               // the journal's next id after the change
  std::int64_t first_new_id = 1;          // ids from here on were handed out by this change
  bool empty() const {
    return systems_put.empty() && systems_removed.empty() && events_put.empty() && events_removed.empty() &&
           !description;
  }
};

// Records are matched by id; a record whose content differs is "put" whole. Time and memory
// grow with the size of the journals (a hash of ids), not with their product.
JournalChanges diff_journals(const Journal& before, const Journal& after);

// The other way: a journal brought up to date with changes another copy of the app stored
// (records put whole by id, removed by id; events kept in (time, id) order, systems in id
// order; next_id never goes back). apply_changes(a, diff_journals(a, b)) makes a equal b. No
// validation: the records come from a store that validated them when they were written.
void apply_changes(Journal& journal, const JournalChanges& changes);

}  // namespace tw::journal
