// How a user names the journal, for the command line and the desktop app alike.
//
//   --journal FILE.db     the journal database (created by the first change if missing).
//   --journal FILE.json   a JSON journal (docs/journal-format.md, the export and backup
//                         format). Its database is FILE.db beside it. The first change
//                         copies the JSON journal into FILE.db (ids kept) and says so; the
//                         JSON file is never written again, so nothing of it is lost. Reading
//                         (list, export, demand, plan) before that reads the JSON file into
//                         memory and creates nothing.
//   --journal FILE        any other name: a database if the file is one (SQLite header), a
//                         JSON journal if it holds one, a new database if it does not exist.
// A missing FILE.db whose FILE.json exists is made from it the same way, so the default name
// tidewright-journal.db picks up an older tidewright-journal.json.
#pragma once

#include <memory>
#include <optional>
#include <string>

#include "tidewright/common/result.hpp"
#include "tidewright/store/journal_store.hpp"

namespace tw::store {

struct JournalLocation {
  std::string database;                   // the SQLite file used
  std::optional<std::string> json_source; // a JSON journal to import when the database is missing
};
JournalLocation locate_journal(const std::string& given);

enum class Access {
  Read,         // never writes, never creates a file
  Write,        // changes; the journal must already exist (database or JSON)
  WriteOrCreate // changes; a missing journal becomes a new, empty database
};

struct OpenedJournal {
  std::unique_ptr<JournalStore> store;
  std::string notice;  // one line for the user when a JSON journal was imported, else empty
};

// Errors: field "journal" with the file named and what to do (missing, read-only, damaged,
// newer schema, JSON that does not parse).
Result<OpenedJournal> open_journal(const std::string& given, Access access);

}  // namespace tw::store
