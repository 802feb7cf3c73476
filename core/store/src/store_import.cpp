// Imports into the store: a whole journal (the JSON format, already parsed and validated by
// the core; the streamed JSON import is store_import_stream.cpp) and CSV streamed in chunks
// of rows. Each import is one write transaction: all of it or nothing.
#include <algorithm>
#include <cctype>
#include <map>
#include <unordered_map>

#include <fmt/format.h>

#include "store_internal.hpp"
#include "store_rows.hpp"

namespace tw::store {

using namespace tw::journal;
using namespace tw::store::detail;

namespace detail {

std::string lower_ascii(std::string s) {
  for (char& c : s) c = static_cast<char>(std::tolower(static_cast<unsigned char>(c)));
  return s;
}

bool database_empty(sqlite3* db) {
  Statement st(db, "SELECT (SELECT count(*) FROM systems) + (SELECT count(*) FROM events)");
  st.step();
  return st.integer(0) == 0;
}

JournalMerge::JournalMerge(sqlite3* db) : db_(db), next_id_(read_next_id(db)) { scratch_.systems = all_systems(db); }

void JournalMerge::systems(const std::vector<System>& from_file, std::int64_t& systems_added) {
  for (const System& s : from_file) {
    auto same = std::find_if(scratch_.systems.begin(), scratch_.systems.end(),
                             [&](const System& t) { return lower_ascii(t.name) == lower_ascii(s.name); });
    if (same != scratch_.systems.end()) {
      system_of_[s.id] = same->id;
      continue;
    }
    System copy = s;
    copy.id = next_id_++;
    insert_system(db_, copy);
    scratch_.systems.push_back(copy);
    system_of_[s.id] = copy.id;
    ++systems_added;
  }
}

Result<bool> JournalMerge::event(Event e, Statement& insert, Event* stored) {
  const EventId file_id = e.id;
  e.system_id = system_of_.at(e.system_id);  // the reader checked it names a system of the file
  if (auto* dose = std::get_if<Dose>(&e.data); dose && dose->schedule_id) {
    if (auto it = schedule_of_.find(*dose->schedule_id); it != schedule_of_.end()) dose->schedule_id = it->second;
  }
  const bool schedule = std::holds_alternative<DoseSchedule>(e.data);
  if (auto same = equal_event_id(db_, e)) {
    if (schedule) {
      schedule_of_[file_id] = *same;
      e.id = *same;
      scratch_.events.push_back(std::move(e));
    }
    return false;
  }
  e.id = next_id_;
  if (Status ok = validate_event(scratch_, e); !ok) return ok.error();
  insert_event(insert, e);
  ++next_id_;
  if (schedule) {
    schedule_of_[file_id] = e.id;
    scratch_.events.push_back(e);
  }
  if (stored) *stored = std::move(e);
  return true;
}

}  // namespace detail

namespace {

// Adds one validated event (id assigned here) unless an equal one is stored; the scratch
// journal holds the stored systems for the core's validation.
void add_checked(sqlite3* db, Statement& insert, const Journal& scratch, Event e, std::int64_t& next_id,
                 JournalStore::ImportReport& report, const std::string& where, bool dry,
                 const JournalStore::WouldAdd& would_add) {
  if (has_equal_event(db, e)) {
    ++report.duplicates_skipped;
    return;
  }
  e.id = next_id;
  Status ok = validate_event(scratch, e);
  if (!ok) throw StoreFailure(where + ": " + ok.error().message);
  insert_event(insert, e);
  ++next_id;
  ++report.events_added;
  if (dry) note_would_add(report, would_add, std::move(e));
}

// Splits CSV text read line by line into records (a quoted cell may hold line breaks).
class CsvRecordReader {
 public:
  explicit CsvRecordReader(std::istream& in) : in_(in) {}
  // The next record (without its final line break) and the file line it starts on.
  bool next(std::string& record, int& first_line) {
    record.clear();
    std::string line;
    bool open_quote = false;
    bool any = false;
    while (std::getline(in_, line)) {
      ++line_;
      if (!any) first_line = line_;
      if (any) record += '\n';
      record += line;
      any = true;
      for (char c : line) {
        if (c == '"') open_quote = !open_quote;
      }
      if (!open_quote) return true;
    }
    return any;  // an unclosed quote at the end: the core reports it
  }

 private:
  std::istream& in_;
  int line_ = 0;
};

}  // namespace

Result<JournalStore::ImportReport> JournalStore::import_journal(const Journal& journal, ImportMode mode,
                                                               const WouldAdd& would_add) {
  const bool dry = mode == ImportMode::DryRun;
  return guarded(path_, [&]() -> Result<ImportReport> {
    WriteTransaction tx(db_);
    ImportReport report;
    if (database_empty(db_)) {
      insert_journal_keeping_ids(db_, journal);
      report.systems_added = static_cast<std::int64_t>(journal.systems.size());
      report.events_added = static_cast<std::int64_t>(journal.events.size());
      if (dry) {
        for (const Event& e : journal.events) note_would_add(report, would_add, e);
      }
      else tx.commit();
      return report;
    }
    // Merge: systems by name, new ids for everything added (store_internal.hpp).
    JournalMerge merge(db_);
    merge.systems(journal.systems, report.systems_added);
    Statement insert(db_, event_insert_sql());
    for (const Event& e : journal.events) {
      Event stored;
      auto added = merge.event(e, insert, dry ? &stored : nullptr);
      if (!added) throw StoreFailure(fmt::format("event {}: {}", e.id, added.error().message));
      if (!*added) {
        ++report.duplicates_skipped;
        continue;
      }
      ++report.events_added;
      if (dry) note_would_add(report, would_add, std::move(stored));
    }
    const std::int64_t next_id = merge.next_id();
    write_next_id(db_, next_id);
    if (!dry) tx.commit();
    return report;
  });
}

Result<JournalStore::ImportReport> JournalStore::import_csv(std::istream& in, const CsvImportOptions& given,
                                                           ImportMode mode, const WouldAdd& would_add) {
  const bool dry = mode == ImportMode::DryRun;
  CsvImportOptions options = given;
  return guarded(path_, [&]() -> Result<ImportReport> {
    constexpr int kRowsPerChunk = 2000;  // memory stays flat: one chunk of rows at a time
    WriteTransaction tx(db_);
    ImportReport report;
    Journal scratch;
    scratch.systems = all_systems(db_);
    std::int64_t next_id = read_next_id(db_);
    Statement insert(db_, event_insert_sql());

    CsvRecordReader reader(in);
    std::string header;
    int header_line = 0;
    if (!reader.next(header, header_line)) header.clear();
    const int header_lines = 1 + static_cast<int>(std::count(header.begin(), header.end(), '\n'));

    std::string record;
    int line = 0;
    bool first_chunk = true;
    bool more = true;
    while (more) {
      std::string text = header + "\n";
      int chunk_first_line = 0;
      int rows = 0;
      while (rows < kRowsPerChunk && (more = reader.next(record, line))) {
        if (rows == 0) chunk_first_line = line;
        text += record;
        text += '\n';
        ++rows;
      }
      if (rows == 0 && !first_chunk) break;
      first_chunk = false;
      scratch.events.clear();
      scratch.next_id = 1;
      for (const System& s : scratch.systems) scratch.next_id = std::max(scratch.next_id, s.id + 1);
      auto chunk = journal::import_csv(scratch, text, options);
      if (!chunk) return chunk.error();  // file-level: nothing of the file is added
      report.unused_columns = chunk->unused_columns;  // the same header in every chunk
      report.delimiter = chunk->delimiter;
      report.blank_rows_skipped += chunk->blank_rows_skipped;
      // The date order the first chunk's dates show holds for the rest of the file.
      options.time.order = chunk->date_order;
      report.date_order = chunk->date_order;
      for (RejectedRow r : chunk->rejected) {
        if (r.line > header_lines) r.line = r.line - header_lines - 1 + chunk_first_line;
        report.rejected.push_back(std::move(r));
      }
      report.duplicates_skipped += chunk->duplicates_skipped;
      std::unordered_map<EventId, const Event*> by_id;
      for (const Event& e : scratch.events) by_id[e.id] = &e;
      for (EventId id : chunk->added) {
        Event e = *by_id.at(id);
        add_checked(db_, insert, scratch, std::move(e), next_id, report, "CSV row", dry, would_add);
      }
    }
    write_next_id(db_, next_id);
    if (!dry) tx.commit();
    return report;
  });
}

}  // namespace tw::store
