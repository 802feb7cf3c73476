// Backup (SQLite's online backup into a new file), restore (a whole replacement in one
// transaction) and the integrity check.
#include <unistd.h>

#include <cstdio>

#include <fmt/format.h>

#include "store_internal.hpp"
#include "store_rows.hpp"
#include "store_changes.hpp"
#include "tidewright/journal/system_name.hpp"
#include "store_schema.hpp"

namespace tw::store {

using namespace tw::journal;
using namespace tw::store::detail;

Status JournalStore::backup_to(const std::string& target) const {
  return guarded(path_, [&]() -> Status {
    if (::access(target.c_str(), F_OK) == 0) {
      return Error{"backup", target + " already exists; give a new file name (nothing was written)"};
    }
    const std::string tmp = target + ".tmp-" + std::to_string(::getpid());
    sqlite3* out = nullptr;
    if (sqlite3_open_v2(tmp.c_str(), &out, SQLITE_OPEN_READWRITE | SQLITE_OPEN_CREATE, nullptr) != SQLITE_OK) {
      std::string why = out ? sqlite3_errmsg(out) : "out of memory";
      sqlite3_close(out);
      std::remove(tmp.c_str());
      return Error{"backup", "cannot create " + target + ": " + why};
    }
    sqlite3_backup* b = sqlite3_backup_init(out, "main", db_, "main");
    int rc = b ? sqlite3_backup_step(b, -1) : sqlite3_errcode(out);
    if (b) sqlite3_backup_finish(b);
    std::string why = rc == SQLITE_DONE ? "" : sqlite3_errmsg(out);
    if (rc == SQLITE_DONE) {
      // The copy is a whole file on its own: no -wal beside it.
      char* err = nullptr;
      if (sqlite3_exec(out, "PRAGMA journal_mode = DELETE", nullptr, nullptr, &err) != SQLITE_OK) {
        why = err ? err : "journal mode";
        rc = SQLITE_ERROR;
      }
      sqlite3_free(err);
    }
    sqlite3_close(out);
    if (rc != SQLITE_DONE || std::rename(tmp.c_str(), target.c_str()) != 0) {
      std::remove(tmp.c_str());
      return Error{"backup", "cannot write " + target + ": " + (why.empty() ? "rename failed" : why)};
    }
    return Ok{};
  });
}

Status JournalStore::restore_from_database(const std::string& backup_path) {
  // Read the backup through the store itself (its schema checked, its records validated),
  // then replace everything in one transaction.
  auto source = JournalStore::open(backup_path, OpenOptions{true, false, 5000});
  if (!source) return source.error();
  const IntegrityReport check = (*source)->check_integrity();
  if (!check.ok) {
    return Error{"restore", backup_path + " fails the integrity check: " + check.problems.front() +
                                " (nothing was changed)"};
  }
  return guarded(path_, [&]() -> Status {
    WriteTransaction tx(db_);
    clear_all(db_);
    sqlite3* src = (*source)->handle();
    ReadTransaction snapshot(src);
    for (const System& s : all_systems(src)) insert_system(db_, s);
    Statement ev(src, (std::string("SELECT ") + kEventColumns + " FROM events ORDER BY id").c_str());
    Statement ins(db_, event_insert_sql());
    while (ev.step()) insert_event(ins, read_event(ev));
    write_next_id(db_, read_next_id(src));
    const std::string description = read_meta(src, "description");
    if (!description.empty()) write_meta(db_, "description", description);
    log_bulk(db_, "a restore from " + backup_path);
    tx.commit();
    return Ok{};
  });
}

Status JournalStore::restore_from_journal(const Journal& journal) {
  return guarded(path_, [&]() -> Status {
    WriteTransaction tx(db_);
    clear_all(db_);
    insert_journal_keeping_ids(db_, journal);
    log_bulk(db_, "a restore from a JSON journal");
    tx.commit();
    return Ok{};
  });
}

JournalStore::IntegrityReport JournalStore::check_integrity() const {
  IntegrityReport r;
  auto problem = [&r](std::string text) {
    r.ok = false;
    if (r.problems.size() < 50) r.problems.push_back(std::move(text));
  };
  try {
    r.schema_version = read_schema_version(db_);
    if (r.schema_version != latest_schema_version()) {
      problem(fmt::format("schema version {} (this program uses {})", r.schema_version, latest_schema_version()));
    }
    Statement pages(db_, "PRAGMA integrity_check");
    while (pages.step()) {
      if (pages.text(0) != "ok") problem("SQLite: " + pages.text(0));
    }
    Statement keys(db_, "PRAGMA foreign_key_check");
    while (keys.step()) {
      problem(fmt::format("table {} row {} refers to a missing {}", keys.text(0), keys.integer(1), keys.text(2)));
    }
    ReadTransaction snapshot(db_);
    Journal all;
    all.systems = all_systems(db_);
    r.systems = static_cast<std::int64_t>(all.systems.size());
    std::int64_t max_id = 0;
    for (const System& s : all.systems) {
      max_id = std::max(max_id, s.id);
      if (Status st = validate_system(all, s); !st) problem(fmt::format("system {}: {}", s.id, st.error().message));
      else if (Status n = check_system_name(s.name); !n && r.notes.size() < 50) r.notes.push_back(fmt::format("system {}: {}", s.id, n.error().message));
    }
    // In id order: a schedule always has a lower id than the doses marked against it, and is
    // kept in `all` so that their marks can be checked.
    Statement ev(db_, (std::string("SELECT ") + kEventColumns + " FROM events ORDER BY id").c_str());
    while (ev.step()) {
      ++r.events;
      try {
        const Event e = read_event(ev);
        max_id = std::max(max_id, e.id);
        if (Status st = validate_event(all, e); !st) problem(fmt::format("event {}: {}", e.id, st.error().message));
        if (std::holds_alternative<journal::DoseSchedule>(e.data)) all.events.push_back(e);
      } catch (const std::exception& e) {
        problem(e.what());
      }
    }
    const std::int64_t next_id = read_next_id(db_);
    if (next_id <= max_id) problem(fmt::format("next id {} is not above the largest id {}", next_id, max_id));
  } catch (const std::exception& e) {
    problem(e.what());
  }
  return r;
}

}  // namespace tw::store
