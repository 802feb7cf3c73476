// The change log and undo (store_changes.hpp; schema version 4, table changes).
// Undo puts back exactly what was there (a system name from before today's rule included),
// checked by the core's validate_system / validate_event, in one transaction.
#include "store_changes.hpp"

#include <fmt/format.h>
#include <nlohmann/json.hpp>

#include "store_internal.hpp"
#include "store_rows.hpp"
#include "tidewright/journal/journal_file.hpp"

namespace tw::store {

using namespace tw::journal;
using namespace tw::store::detail;
using nlohmann::json;

namespace detail {
namespace {

void log_row(sqlite3* db, const char* action, const char* record, std::int64_t id, const std::string* before,
             const std::string& summary) {
  Statement st(db, "INSERT INTO changes (action, record, record_id, before, summary, next_id) VALUES (?, ?, ?, ?, ?, ?)");
  st.bind(6, read_next_id(db));
  st.bind(1, std::string(action));
  if (record) st.bind(2, std::string(record)).bind(3, id);
  else st.bind_null(2).bind_null(3);
  if (before) st.bind(4, *before);
  else st.bind_null(4);
  st.bind(5, summary).run();
}

std::string dump(const json& j) { return j.dump(-1, ' ', false, json::error_handler_t::replace); }

}  // namespace

void log_added(sqlite3* db, const System& s) {
  log_row(db, "add", "system", s.id, nullptr, fmt::format("added system {} '{}'", s.id, s.name));
}
void log_added(sqlite3* db, const Event& e) {
  log_row(db, "add", "event", e.id, nullptr, fmt::format("added {} {}", event_type_name(e.data), e.id));
}
void log_edited(sqlite3* db, const System& before) {
  const std::string b = dump(system_to_json(before));
  log_row(db, "edit", "system", before.id, &b, fmt::format("edited system {} '{}'", before.id, before.name));
}
void log_edited(sqlite3* db, const Event& before) {
  const std::string b = dump(event_to_json(before));
  log_row(db, "edit", "event", before.id, &b, fmt::format("edited {} {}", event_type_name(before.data), before.id));
}
void log_removed(sqlite3* db, const System& before, const std::vector<Event>& events) {
  json evs = json::array();
  for (const Event& e : events) evs.push_back(event_to_json(e));
  const std::string b = dump(json{{"system", system_to_json(before)}, {"events", evs}});
  log_row(db, "remove", "system", before.id, &b,
          fmt::format("removed system {} '{}'{}", before.id, before.name,
                      events.empty() ? "" : fmt::format(" with {} events", events.size())));
}
void log_removed(sqlite3* db, const Event& before) {
  const std::string b = dump(event_to_json(before));
  log_row(db, "remove", "event", before.id, &b, fmt::format("removed {} {}", event_type_name(before.data), before.id));
}
void log_bulk(sqlite3* db, const std::string& summary) { log_row(db, "bulk", nullptr, 0, nullptr, summary); }

}  // namespace detail

namespace {

template <class T>
T parsed_or_throw(Result<T> r, const char* what) {
  if (!r) throw StoreFailure(fmt::format("the change log's copy of the {} cannot be read: {}", what, r.error().message));
  return std::move(r).value();
}

bool event_stored(sqlite3* db, EventId id) {
  Statement st(db, "SELECT 1 FROM events WHERE id = ?");
  st.bind(1, id);
  return st.step();
}

// A record put back must still pass the core's checks against what is stored now.
void check_or_throw(Status s, const std::string& what) {
  if (!s) throw StoreFailure(what + " cannot be put back: " + s.error().message);
}

}  // namespace

Result<std::string> JournalStore::undo_last() {
  return guarded(path_, [&]() -> Result<std::string> {
    WriteTransaction tx(db_);
    Statement last(db_, "SELECT seq, action, record, record_id, before, summary, next_id FROM changes ORDER BY seq DESC LIMIT 1");
    if (!last.step()) return Error{"undo", "there is no change to undo (changes are recorded from schema version 4 on)"};
    const std::int64_t seq = last.integer(0);
    const std::string action = last.text(1), record = last.text(2), summary = last.text(5);
    const std::int64_t id = last.integer(3);
    const std::string before = last.is_null(4) ? "" : last.text(4);
    Statement newer(db_, "SELECT 1 FROM systems WHERE id >= ?1 UNION ALL SELECT 1 FROM events WHERE id >= ?1 LIMIT 1");
    newer.bind(1, last.integer(6));
    if (newer.step()) {
      return Error{"undo", "records were added after the last recorded change (" + summary +
                           "), by an import; undo does not reach past them (remove them with log remove --id N)"};
    }
    if (action == "bulk") {
      return Error{"undo", "the last change was " + summary + "; undo reverts single adds, edits and removals, "
                           "not that"};
    }
    Journal scratch;
    scratch.systems = all_systems(db_);
    if (action == "add" && record == "system") {
      Statement n(db_, "SELECT count(*) FROM events WHERE system_id = ?");
      n.bind(1, id);
      n.step();
      if (n.integer(0) > 0) return Error{"undo", fmt::format("system {} has events now; remove them first", id)};
      Statement del(db_, "DELETE FROM systems WHERE id = ?");
      del.bind(1, id).run();
    } else if (action == "add") {
      Statement refs(db_, "SELECT id FROM events WHERE schedule_id = ? LIMIT 1");
      refs.bind(1, id);
      if (refs.step()) return Error{"undo", fmt::format("schedule {} has doses marked against it; remove those first", id)};
      Statement del(db_, "DELETE FROM events WHERE id = ?");
      del.bind(1, id).run();
    } else if (record == "system") {
      const json doc = json::parse(before);
      const json& sys_json = action == "remove" ? doc.at("system") : doc;
      const System s = parsed_or_throw(system_from_json(sys_json), "system");
      auto it = std::find_if(scratch.systems.begin(), scratch.systems.end(), [&](const System& x) { return x.id == s.id; });
      if (it != scratch.systems.end()) *it = s;
      else scratch.systems.push_back(s);
      check_or_throw(validate_system(scratch, s), fmt::format("system {}", s.id));
      if (action == "edit") {
        update_system_row(db_, s);
      } else {
        insert_system(db_, s);
        Statement ins(db_, event_insert_sql());
        for (const json& ej : doc.at("events")) {
          const Event e = parsed_or_throw(event_from_json(ej), "event");
          insert_event(ins, e);
        }
      }
    } else {
      const Event e = parsed_or_throw(event_from_json(json::parse(before)), "event");
      if (const auto* d = std::get_if<Dose>(&e.data); d && d->schedule_id) {
        if (auto sched = this->event(*d->schedule_id)) scratch.events.push_back(*sched);
      }
      check_or_throw(validate_event(scratch, e), fmt::format("event {}", e.id));
      if (action == "edit") {
        update_event_row(db_, e);
      } else {
        if (event_stored(db_, e.id)) return Error{"undo", fmt::format("id {} is in use again", e.id)};
        Statement ins(db_, event_insert_sql());
        insert_event(ins, e);
      }
    }
    Statement drop(db_, "DELETE FROM changes WHERE seq = ?");
    drop.bind(1, seq).run();
    tx.commit();
    return summary;
  });
}

}  // namespace tw::store
