// JournalStore: opening, reads and single-record changes. Imports: store_import.cpp; exports:
// store_export.cpp; backup, restore and the integrity check: store_backup.cpp.
//
// Map: 1. meta helpers  2. opening  3. reads  4. changes  5. settings
#include <algorithm>
#include <sys/stat.h>
#include <unistd.h>

#include <fstream>

#include <fmt/format.h>

#include "store_internal.hpp"
#include "store_rows.hpp"
#include "store_schema.hpp"
#include "store_changes.hpp"

namespace tw::store {

using namespace tw::journal;
using namespace tw::store::detail;

// ---------------------------------------------------------------- 1. meta helpers
namespace detail {

std::string read_meta(sqlite3* db, const std::string& key, const std::string& fallback) {
  Statement st(db, "SELECT value FROM meta WHERE key = ?");
  st.bind(1, key);
  return st.step() ? st.text(0) : fallback;
}

void write_meta(sqlite3* db, const std::string& key, const std::string& value) {
  Statement st(db, "INSERT INTO meta (key, value) VALUES (?1, ?2) ON CONFLICT (key) DO UPDATE SET value = ?2");
  st.bind(1, key).bind(2, value).run();
}

std::int64_t read_next_id(sqlite3* db) {
  const std::string text = read_meta(db, "next_id", "1");
  try {
    return std::stoll(text);
  } catch (const std::exception&) {
    throw StoreFailure("next_id '" + text + "' in the journal's meta table is not a number");
  }
}

void write_next_id(sqlite3* db, std::int64_t next_id) { write_meta(db, "next_id", std::to_string(next_id)); }

std::vector<System> all_systems(sqlite3* db) {
  Statement st(db, (std::string("SELECT ") + kSystemColumns + " FROM systems ORDER BY id").c_str());
  std::vector<System> out;
  while (st.step()) out.push_back(read_system(st));
  return out;
}

void WhereClause::bind(Statement& st) const {
  int i = 1;
  if (filter.system_id) st.bind(i++, *filter.system_id);
  if (filter.parameter) st.bind(i++, std::string(tw::parameter_name(*filter.parameter)));
  if (filter.from_s) st.bind(i++, *filter.from_s);
  if (filter.to_s) st.bind(i++, *filter.to_s);
}

WhereClause where_of(const EventFilter& f) {
  std::string sql;
  auto add = [&sql](const char* cond) { sql += sql.empty() ? " WHERE " : " AND "; sql += cond; };
  if (f.system_id) add("system_id = ?");
  if (f.parameter) add("parameter = ?");
  if (f.from_s) add("time_s >= ?");
  if (f.to_s) add("time_s <= ?");
  return WhereClause{sql, f};
}

std::optional<EventId> equal_event_id(sqlite3* db, const Event& e) {
  Statement st(db, (std::string("SELECT ") + kEventColumns +
                    " FROM events WHERE system_id = ? AND time_s = ? AND type = ?").c_str());
  st.bind(1, e.system_id).bind(2, e.time_s).bind(3, std::string(event_type_name(e.data)));
  while (st.step()) {
    const Event stored = read_event(st);
    if (stored.data == e.data) return stored.id;
  }
  return std::nullopt;
}

void clear_all(sqlite3* db) {
  exec(db, "DELETE FROM events; DELETE FROM systems; DELETE FROM meta WHERE key = 'description';");
  write_next_id(db, 1);
}

void insert_journal_keeping_ids(sqlite3* db, const Journal& j) {
  for (const System& s : j.systems) insert_system(db, s);
  Statement ins(db, event_insert_sql());
  for (const Event& e : j.events) insert_event(ins, e);
  write_next_id(db, j.next_id);
  if (!j.description.empty()) write_meta(db, "description", j.description);
}

}  // namespace detail

// ---------------------------------------------------------------- 2. opening
bool is_database_file(const std::string& path) {
  std::ifstream in(path, std::ios::binary);
  char head[16] = {};
  in.read(head, sizeof head);
  return in.gcount() == 16 && std::string(head, 16) == std::string("SQLite format 3\0", 16);
}

namespace {
std::string immutable_uri(const std::string& path) {
  std::string uri = "file:";
  for (char c : path) {
    if (c == '?' || c == '#' || c == '%') {
      uri += fmt::format("%{:02X}", static_cast<unsigned char>(c));
    } else {
      uri += c;
    }
  }
  return uri + "?immutable=1";
}
}  // namespace

Result<std::unique_ptr<JournalStore>> JournalStore::open(const std::string& path, const OpenOptions& o) {
  struct stat st {};
  const bool exists = ::stat(path.c_str(), &st) == 0;
  if (!exists && (o.read_only || !o.create)) {
    return Error{"journal", path + " does not exist"};
  }
  if (exists && !S_ISREG(st.st_mode)) return Error{"journal", path + " is not a regular file"};
  if (exists && st.st_size > 0 && !is_database_file(path)) {
    return Error{"journal", path + " is not a Tidewright journal database (no SQLite header)"};
  }
  // No write permission, or no write bit at all (root may write anything: a file the user
  // marked read-only is still refused).
  const bool not_writable = exists && (::access(path.c_str(), W_OK) != 0 || (st.st_mode & 0222) == 0);
  if (!o.read_only && not_writable) {
    return Error{"journal", path + " is read-only (no permission to write it); nothing was changed"};
  }
  // A reader opens a writable file read-write with query_only set: it can then clean up the
  // -wal and -shm files when it is the last to close, and still never changes a record.
  const bool file_read_only = o.read_only && not_writable;
  sqlite3* db = nullptr;
  const int flags = (file_read_only ? SQLITE_OPEN_READONLY : SQLITE_OPEN_READWRITE | (o.create ? SQLITE_OPEN_CREATE : 0)) |
                    SQLITE_OPEN_NOMUTEX;
  // A read-only file with no pending -wal is opened immutable: nothing (no -shm) is created
  // beside a file the user protected.
  std::string name = path;
  if (file_read_only && ::access((path + "-wal").c_str(), F_OK) != 0) name = immutable_uri(path);
  const int rc = sqlite3_open_v2(name.c_str(), &db, flags | SQLITE_OPEN_URI, nullptr);
  if (rc != SQLITE_OK) {
    std::string why = db ? sqlite3_errmsg(db) : sqlite3_errstr(rc);
    sqlite3_close(db);
    return Error{"journal", "cannot open " + path + ": " + why};
  }
  std::unique_ptr<JournalStore> store(new JournalStore(db, path));
  return guarded(path, [&]() -> Result<std::unique_ptr<JournalStore>> {
    sqlite3_busy_timeout(db, o.busy_timeout_ms);
    exec(db, "PRAGMA foreign_keys = ON");
    // A reader of a writable journal written by an older build brings its schema up to date
    // first (the records are copied unchanged), so a read right after an update works.
    const int found_version = read_schema_version(db);
    const bool migrate_for_reader =
        o.read_only && !file_read_only && found_version >= 1 && found_version < latest_schema_version();
    if (!o.read_only || migrate_for_reader) {
      // WAL: readers never block the writer and a commit is one append; FULL: a commit that
      // returned has reached the disk (a dosing journal is small; durability comes first).
      std::string mode;
      {
        Statement read_mode(db, "PRAGMA journal_mode");
        read_mode.step();
        mode = read_mode.text(0);
      }
      if (mode != "wal" && mode != "memory") {
        Statement set(db, "PRAGMA journal_mode = WAL");
        set.step();
      }
      exec(db, "PRAGMA synchronous = FULL");
      migrate(db);
    }
    if (o.read_only) {
      const int v = read_schema_version(db);
      if (v > latest_schema_version()) {
        return Error{"journal", fmt::format("{}: the journal database has schema version {}, newer than this program "
                                            "knows (up to {}); update Tidewright to open it", path, v,
                                            latest_schema_version())};
      }
      if (v != latest_schema_version()) {
        return Error{"journal", fmt::format("{}: schema version {} cannot be read without writing (this program "
                                            "uses version {}){}", path, v, latest_schema_version(),
                                            file_read_only ? "; the file is read-only: make it writable once so "
                                                             "it can be brought up to date" : "")};
      }
      if (!file_read_only) exec(db, "PRAGMA query_only = ON");
    }
    return std::move(store);
  });
}

JournalStore::~JournalStore() { sqlite3_close(db_); }

int JournalStore::schema_version() const {
  try {
    return read_schema_version(db_);
  } catch (const std::exception&) {
    return 0;
  }
}

// ---------------------------------------------------------------- 3. reads
std::string JournalStore::description() const {
  try {
    return read_meta(db_, "description");
  } catch (const std::exception&) {
    return {};
  }
}

std::vector<System> JournalStore::systems() const {
  try {
    return all_systems(db_);
  } catch (const std::exception&) {
    return {};
  }
}

std::optional<System> JournalStore::system(SystemId id) const {
  try {
    Statement st(db_, (std::string("SELECT ") + kSystemColumns + " FROM systems WHERE id = ?").c_str());
    st.bind(1, id);
    if (!st.step()) return std::nullopt;
    return read_system(st);
  } catch (const std::exception&) {
    return std::nullopt;  // a damaged row reads as absent; check_integrity names it
  }
}

std::optional<System> JournalStore::system_by_name(const std::string& name) const {
  try {
    Statement st(db_, (std::string("SELECT ") + kSystemColumns + " FROM systems WHERE name = ? COLLATE NOCASE").c_str());
    st.bind(1, name);
    if (!st.step()) return std::nullopt;
    return read_system(st);
  } catch (const std::exception&) {
    return std::nullopt;  // a damaged row reads as absent; check_integrity names it
  }
}

std::optional<Event> JournalStore::event(EventId id) const {
  try {
    Statement st(db_, (std::string("SELECT ") + kEventColumns + " FROM events WHERE id = ?").c_str());
    st.bind(1, id);
    if (!st.step()) return std::nullopt;
    return read_event(st);
  } catch (const std::exception&) {
    return std::nullopt;  // a damaged row reads as absent; check_integrity names it
  }
}

std::int64_t JournalStore::event_count(const EventFilter& filter) const {
  try {
    const WhereClause w = where_of(filter);
    Statement st(db_, ("SELECT count(*) FROM events" + w.sql).c_str());
    w.bind(st);
    st.step();
    return st.integer(0);
  } catch (const std::exception&) {
    return 0;
  }
}

Status JournalStore::for_each_event(const Query& q, const std::function<bool(const Event&)>& visit) const {
  return guarded(path_, [&]() -> Status {
    const WhereClause w = where_of(q.filter);
    std::string sql = std::string("SELECT ") + kEventColumns + " FROM events" + w.sql +
                      (q.newest_first ? " ORDER BY time_s DESC, id DESC" : " ORDER BY time_s, id");
    if (q.limit > 0) sql += " LIMIT " + std::to_string(q.limit);
    Statement st(db_, sql.c_str());
    w.bind(st);
    while (st.step()) {
      if (!visit(read_event(st))) break;
    }
    return Ok{};
  });
}

Result<Journal> JournalStore::system_journal(SystemId id) const {
  return guarded(path_, [&]() -> Result<Journal> {
    ReadTransaction snapshot(db_);
    Journal j;
    auto s = system(id);
    if (!s) return Error{"system", fmt::format("system {} is not in the journal", id)};
    j.systems.push_back(std::move(*s));
    j.description = read_meta(db_, "description");
    j.next_id = read_next_id(db_);
    Statement st(db_, (std::string("SELECT ") + kEventColumns +
                       " FROM events WHERE system_id = ? ORDER BY time_s, id").c_str());
    st.bind(1, id);
    // Sized once from the index (a count reads no table rows): growing a vector of ~24,000
    // events by doubling copied them and faulted in fresh pages at each step.
    {
      Statement count(db_, "SELECT count(*) FROM events WHERE system_id = ?");
      count.bind(1, id);
      count.step();
      j.events.reserve(static_cast<std::size_t>(count.integer(0)));
    }
    while (st.step()) j.events.push_back(read_event(st));
    return j;
  });
}

// ---------------------------------------------------------------- 4. changes
namespace {

bool id_stored(sqlite3* db, std::int64_t id) {
  Statement st(db, "SELECT 1 FROM systems WHERE id = ?1 UNION ALL SELECT 1 FROM events WHERE id = ?1");
  st.bind(1, id);
  return st.step();
}

Error id_taken(std::int64_t id) { return Error{"id", fmt::format("id {} is already in use or negative", id)}; }

}  // namespace

Result<SystemId> JournalStore::add_system(const System& system) {
  return guarded(path_, [&]() -> Result<SystemId> {
    WriteTransaction tx(db_);
    Journal scratch;
    scratch.systems = all_systems(db_);
    scratch.next_id = read_next_id(db_);
    if (system.id != 0 && id_stored(db_, system.id)) return id_taken(system.id);
    auto id = journal::add_system(scratch, system);
    if (!id) return id.error();
    insert_system(db_, *journal::find_system(scratch, *id));
    write_next_id(db_, scratch.next_id);
    log_added(db_, *journal::find_system(scratch, *id));
    tx.commit();
    return *id;
  });
}

// What the core needs besides the event to validate a schedule mark: the schedule a marked
// dose names, and the doses marked against a schedule being changed.
void JournalStore::add_schedule_context(Journal& scratch, const Event& event) const {
  auto have = [&](EventId id) {
    return std::any_of(scratch.events.begin(), scratch.events.end(), [id](const Event& e) { return e.id == id; });
  };
  if (const auto* d = std::get_if<journal::Dose>(&event.data); d && d->schedule_id && !have(*d->schedule_id)) {
    if (auto s = this->event(*d->schedule_id)) scratch.events.push_back(std::move(*s));
  }
  if (std::holds_alternative<journal::DoseSchedule>(event.data)) {
    Statement st(db_, (std::string("SELECT ") + kEventColumns + " FROM events WHERE schedule_id = ?").c_str());
    st.bind(1, event.id);
    while (st.step()) {
      Event e = read_event(st);
      if (!have(e.id)) scratch.events.push_back(std::move(e));
    }
  }
  std::stable_sort(scratch.events.begin(), scratch.events.end(), [](const Event& a, const Event& b) {
    return a.time_s != b.time_s ? a.time_s < b.time_s : a.id < b.id;
  });
}

Result<EventId> JournalStore::add_event(const Event& event) {
  return guarded(path_, [&]() -> Result<EventId> {
    WriteTransaction tx(db_);
    Journal scratch;
    if (auto s = system(event.system_id)) scratch.systems.push_back(std::move(*s));
    add_schedule_context(scratch, event);
    scratch.next_id = read_next_id(db_);
    if (event.id != 0 && id_stored(db_, event.id)) return id_taken(event.id);
    auto id = journal::add_event(scratch, event);
    if (!id) return id.error();
    Statement ins(db_, event_insert_sql());
    insert_event(ins, *journal::find_event(scratch, *id));
    write_next_id(db_, scratch.next_id);
    log_added(db_, *journal::find_event(scratch, *id));
    tx.commit();
    return *id;
  });
}

Status JournalStore::update_system(const System& system) {
  return guarded(path_, [&]() -> Status {
    WriteTransaction tx(db_);
    Journal scratch;
    scratch.systems = all_systems(db_);
    Statement st(db_, (std::string("SELECT ") + kEventColumns + " FROM events WHERE system_id = ?").c_str());
    st.bind(1, system.id);
    while (st.step()) scratch.events.push_back(read_event(st));
    const System* stored = journal::find_system(scratch, system.id);
    const std::optional<System> before = stored ? std::optional<System>(*stored) : std::nullopt;
    Status s = journal::update_system(scratch, system);
    if (!s) return s;
    if (before) log_edited(db_, *before);
    update_system_row(db_, *journal::find_system(scratch, system.id));  // as the core stored it (name trimmed)
    tx.commit();
    return Ok{};
  });
}

Status JournalStore::update_event(const Event& event) {
  return guarded(path_, [&]() -> Status {
    WriteTransaction tx(db_);
    Journal scratch;
    scratch.systems = all_systems(db_);
    auto old = this->event(event.id);
    if (!old) return Error{"id", fmt::format("no event with id {}", event.id)};
    const Event before = *old;
    scratch.events.push_back(std::move(*old));
    add_schedule_context(scratch, event);
    Status s = journal::update_event(scratch, event);
    if (!s) return s;
    log_edited(db_, before);
    update_event_row(db_, *journal::find_event(scratch, event.id));  // as the core stored it (numbers rounded)
    tx.commit();
    return Ok{};
  });
}

Status JournalStore::remove_system(SystemId id, bool with_events) {
  return guarded(path_, [&]() -> Status {
    WriteTransaction tx(db_);
    const auto before = system(id);
    if (!before) return Error{"id", fmt::format("no system with id {}", id)};
    EventFilter f;
    f.system_id = id;
    const std::int64_t n = event_count(f);
    if (n > 0 && !with_events) {
      return Error{"id", fmt::format("system {} still has {} events; remove them too to delete it", id, n)};
    }
    std::vector<Event> removed;
    if (n > 0) {
      Statement all(db_, (std::string("SELECT ") + kEventColumns + " FROM events WHERE system_id = ? ORDER BY time_s, id").c_str());
      all.bind(1, id);
      while (all.step()) removed.push_back(read_event(all));
    }
    log_removed(db_, *before, removed);
    Statement ev(db_, "DELETE FROM events WHERE system_id = ?");
    ev.bind(1, id).run();
    Statement sy(db_, "DELETE FROM systems WHERE id = ?");
    sy.bind(1, id).run();
    tx.commit();
    return Ok{};
  });
}

Status JournalStore::remove_event(EventId id) {
  return guarded(path_, [&]() -> Status {
    WriteTransaction tx(db_);
    Statement refs(db_, "SELECT id FROM events WHERE schedule_id = ? LIMIT 1");
    refs.bind(1, id);
    if (refs.step()) {
      return Error{"id", fmt::format("schedule {} has doses marked against it (event {}); remove those first", id,
                                     refs.integer(0))};
    }
    const auto before = event(id);
    if (!before) return Error{"id", fmt::format("no event with id {}", id)};
    log_removed(db_, *before);
    Statement st(db_, "DELETE FROM events WHERE id = ?");
    st.bind(1, id).run();
    tx.commit();
    return Ok{};
  });
}

Status JournalStore::set_description(const std::string& text) {
  return guarded(path_, [&]() -> Status {
    WriteTransaction tx(db_);
    write_meta(db_, "description", text);
    tx.commit();
    return Ok{};
  });
}

// ---------------------------------------------------------------- 5. settings
std::optional<std::string> JournalStore::setting(const std::string& key) const {
  try {
    Statement st(db_, "SELECT value FROM meta WHERE key = ?");
    st.bind(1, "setting." + key);
    if (!st.step()) return std::nullopt;
    return st.text(0);
  } catch (const std::exception&) {
    return std::nullopt;
  }
}

Status JournalStore::set_setting(const std::string& key, const std::string& value) {
  return guarded(path_, [&]() -> Status {
    WriteTransaction tx(db_);
    write_meta(db_, "setting." + key, value);
    tx.commit();
    return Ok{};
  });
}

}  // namespace tw::store
