// JournalStore::apply: an app's changes since it last saved, in one transaction.
#include <algorithm>

#include <fmt/format.h>

#include "store_internal.hpp"
#include "store_rows.hpp"
#include "store_changes.hpp"
#include "tidewright/journal/system_name.hpp"

namespace tw::store {

using namespace tw::journal;
using namespace tw::store::detail;

namespace {

bool row_exists(sqlite3* db, const char* table, std::int64_t id) {
  Statement st(db, fmt::format("SELECT 1 FROM {} WHERE id = ?", table).c_str());
  st.bind(1, id);
  return st.step();
}

bool id_taken(sqlite3* db, std::int64_t id) { return row_exists(db, "systems", id) || row_exists(db, "events", id); }

}  // namespace

Result<JournalStore::ApplyReport> JournalStore::apply(const JournalChanges& c) {
  return guarded(path_, [&]() -> Result<ApplyReport> {
    WriteTransaction tx(db_);
    ApplyReport report;
    std::int64_t next_id = std::max(read_next_id(db_), c.next_id);
    auto fresh_id = [&](std::int64_t wanted) {
      if (wanted < c.first_new_id || !id_taken(db_, wanted)) return wanted;
      const std::int64_t id = next_id++;
      report.moved_ids.emplace_back(wanted, id);
      return id;
    };
    for (EventId id : c.events_removed) {
      Statement st(db_, "DELETE FROM events WHERE id = ?");
      st.bind(1, id).run();
    }
    for (SystemId id : c.systems_removed) {
      Statement st(db_, "DELETE FROM systems WHERE id = ?");
      st.bind(1, id).run();  // refused by the foreign key if it still has events
    }
    Journal scratch;
    scratch.systems = all_systems(db_);
    std::vector<std::pair<SystemId, SystemId>> system_ids;  // for events of a moved system
    for (System s : c.systems_put) {
      const bool update = s.id < c.first_new_id && row_exists(db_, "systems", s.id);
      const SystemId wanted = s.id;
      if (!update) s.id = fresh_id(s.id);
      if (s.id != wanted) system_ids.emplace_back(wanted, s.id);
      auto it = std::find_if(scratch.systems.begin(), scratch.systems.end(), [&](const System& x) { return x.id == s.id; });
      if (it != scratch.systems.end()) *it = s;
      else scratch.systems.push_back(s);
      if (!update) {  // a new system's name meets today's rule (the core's add_system trims it)
        if (Status ok = check_system_name(s.name); !ok) return ok.error();
      }
      if (Status ok = validate_system(scratch, s); !ok) return ok.error();
      if (update) update_system_row(db_, s);
      else insert_system(db_, s);
      next_id = std::max(next_id, s.id + 1);
    }
    Statement insert(db_, event_insert_sql());
    for (Event e : c.events_put) {
      for (const auto& [from, to] : system_ids) {
        if (e.system_id == from) e.system_id = to;
      }
      const bool update = e.id < c.first_new_id && row_exists(db_, "events", e.id);
      if (!update) e.id = fresh_id(e.id);
      if (Status ok = validate_event(scratch, e); !ok) {
        return Error{ok.error().field, fmt::format("event {}: {}", e.id, ok.error().message)};
      }
      if (update) update_event_row(db_, e);
      else insert_event(insert, e);
      next_id = std::max(next_id, e.id + 1);
    }
    if (c.description) write_meta(db_, "description", *c.description);
    write_next_id(db_, next_id);
    if (!c.events_removed.empty() || !c.systems_removed.empty() || !c.systems_put.empty() || !c.events_put.empty()) {
      log_bulk(db_, "a save of the app's changes");
    }
    tx.commit();
    return report;
  });
}

}  // namespace tw::store
