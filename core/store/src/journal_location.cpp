// Resolving --journal to a database, importing a JSON journal on first use (see
// journal_location.hpp for the rules the user sees).
#include "tidewright/store/journal_location.hpp"

#include <sys/stat.h>

#include <cstdio>
#include <fstream>

#include <fmt/format.h>

namespace tw::store {

namespace {

bool exists(const std::string& path) {
  struct stat st {};
  return ::stat(path.c_str(), &st) == 0;
}

bool empty_file(const std::string& path) {
  struct stat st {};
  return ::stat(path.c_str(), &st) == 0 && st.st_size == 0;
}

bool ends_with(const std::string& s, const std::string& tail) {
  return s.size() >= tail.size() && s.compare(s.size() - tail.size(), tail.size(), tail) == 0;
}

std::string without_json_suffix(const std::string& path) {
  return ends_with(path, ".json") ? path.substr(0, path.size() - 5) : path;
}

// The JSON journal's error, said as the user sees it: the file, the record, and that the file is kept.
Error json_journal_error(const std::string& path, const Error& e) {
  return Error{"journal", path + ": " + e.message + " (the file was not changed)"};
}

// The old JSON journal into the store, one event at a time (import_journal_stream): memory
// stays flat whatever its size.
Result<JournalStore::ImportReport> import_json_journal(JournalStore& store, const std::string& path) {
  std::ifstream in(path, std::ios::binary);
  if (!in) return Error{"journal", "cannot read " + path};
  auto report = store.import_journal_stream(in);
  if (!report) return json_journal_error(path, report.error());
  return report;
}

}  // namespace

JournalLocation locate_journal(const std::string& given) {
  if (exists(given) && (is_database_file(given) || (ends_with(given, ".db") && empty_file(given)))) {
    return {given, std::nullopt};
  }
  if (exists(given)) return {without_json_suffix(given) + ".db", given};  // a JSON journal
  if (ends_with(given, ".json")) return {without_json_suffix(given) + ".db", std::nullopt};
  if (ends_with(given, ".db")) {
    const std::string sibling = given.substr(0, given.size() - 3) + ".json";
    if (exists(sibling)) return {given, sibling};
  }
  return {given, std::nullopt};
}

Result<OpenedJournal> open_journal(const std::string& given, Access access) {
  const JournalLocation where = locate_journal(given);
  OpenedJournal out;
  const bool have_database = exists(where.database);
  if (!have_database && where.json_source && access == Access::Read) {
    // Read the JSON journal into memory: reading never creates a file.
    auto mem = JournalStore::open(":memory:");
    if (!mem) return mem.error();
    auto imported = import_json_journal(**mem, *where.json_source);
    if (!imported) return imported.error();
    out.store = std::move(mem).value();
    return out;
  }
  if (!have_database && !where.json_source) {
    if (ends_with(given, ".json")) {
      return Error{"journal", "journal " + given + " does not exist; a new journal is a database: give --journal " +
                                  without_json_suffix(given) + ".db"};
    }
    if (access != Access::WriteOrCreate) {
      return Error{"journal", "journal " + given + " does not exist (create it with `tidewright log add system`)"};
    }
  }
  if (!have_database && where.json_source && !std::ifstream(*where.json_source, std::ios::binary)) {
    return Error{"journal", "cannot read " + *where.json_source};  // before a database is created
  }
  OpenOptions options;
  options.read_only = access == Access::Read;
  auto store = JournalStore::open(where.database, options);
  if (!store) return store.error();
  out.store = std::move(store).value();
  if (!have_database && where.json_source) {
    auto report = import_json_journal(*out.store, *where.json_source);
    if (!report) {
      out.store.reset();
      // Created just now and left empty (the import was rolled back): leave nothing behind.
      for (const char* tail : {"", "-wal", "-shm"}) std::remove((where.database + tail).c_str());
      return report.error();
    }
    out.notice = fmt::format(
        "note: the JSON journal {} was copied into the database {} ({} systems, {} events); {} is "
        "kept unchanged and is not written again: use --journal {} from now on",
        *where.json_source, where.database, report->systems_added, report->events_added, *where.json_source,
        where.database);
  }
  return out;
}

}  // namespace tw::store
