// Exports from the store, streamed: the JSON journal format byte for byte as
// serialize_journal writes it (members in the same order, 2-space indent), and long-form CSV
// in chunks through the core's writer. One read transaction each: a consistent snapshot while
// others write.
#include <algorithm>
#include <sstream>
#include <vector>

#include <nlohmann/json.hpp>

#include "store_internal.hpp"
#include "store_rows.hpp"
#include "tidewright/journal/journal_file.hpp"

namespace tw::store {

using namespace tw::journal;
using namespace tw::store::detail;
using nlohmann::json;

namespace {

// One record of an array two levels deep, as json::dump(2) would place it there.
void write_nested(std::ostream& out, const json& record) {
  const std::string text = record.dump(2, ' ', false, json::error_handler_t::replace);
  out << "    ";
  for (char c : text) {
    out << c;
    if (c == '\n') out << "    ";
  }
}

// The schedules that doses of the filter are marked against but the filter leaves out, in
// (time, id) order: a filtered journal must still hold what its marks refer to.
std::vector<Event> schedules_referred_to(sqlite3* db, const EventFilter& filter) {
  std::vector<Event> out;
  if (!filter.system_id && !filter.parameter && !filter.from_s && !filter.to_s) return out;
  const WhereClause w = where_of(filter);
  Statement ids(db, ("SELECT DISTINCT schedule_id FROM events" + w.sql +
                     (w.sql.empty() ? " WHERE" : " AND") + " schedule_id IS NOT NULL").c_str());
  w.bind(ids);
  std::vector<std::int64_t> wanted;
  while (ids.step()) wanted.push_back(ids.integer(0));
  for (std::int64_t id : wanted) {
    Statement one(db, (std::string("SELECT ") + kEventColumns + " FROM events WHERE id = ?").c_str());
    one.bind(1, id);
    if (!one.step()) continue;
    Event e = read_event(one);
    const bool selected = (!filter.system_id || e.system_id == *filter.system_id) && !filter.parameter &&
                          (!filter.from_s || e.time_s >= *filter.from_s) && (!filter.to_s || e.time_s <= *filter.to_s);
    if (!selected) out.push_back(std::move(e));
  }
  std::sort(out.begin(), out.end(), [](const Event& a, const Event& b) {
    return a.time_s != b.time_s ? a.time_s < b.time_s : a.id < b.id;
  });
  return out;
}

}  // namespace

Status JournalStore::export_json(std::ostream& out, const EventFilter& filter) const {
  return guarded(path_, [&]() -> Status {
    ReadTransaction snapshot(db_);
    // nlohmann::json keeps object members sorted by name: description, events, format,
    // next_id, schema_version, systems.
    out << "{\n";
    const std::string description = read_meta(db_, "description");
    if (!description.empty()) {
      out << "  \"description\": " << json(description).dump(-1, ' ', false, json::error_handler_t::replace) << ",\n";
    }
    out << "  \"events\": [";
    const std::vector<Event> extra = schedules_referred_to(db_, filter);
    std::size_t next_extra = 0;
    const WhereClause w = where_of(filter);
    Statement ev(db_, (std::string("SELECT ") + kEventColumns + " FROM events" + w.sql + " ORDER BY time_s, id").c_str());
    w.bind(ev);
    bool first = true;
    auto write = [&](const Event& e) {
      out << (first ? "\n" : ",\n");
      write_nested(out, event_to_json(e));
      first = false;
    };
    while (ev.step()) {
      const Event e = read_event(ev);
      while (next_extra < extra.size() && (extra[next_extra].time_s < e.time_s ||
                                           (extra[next_extra].time_s == e.time_s && extra[next_extra].id < e.id))) {
        write(extra[next_extra++]);
      }
      write(e);
    }
    while (next_extra < extra.size()) write(extra[next_extra++]);
    out << (first ? "],\n" : "\n  ],\n");
    out << "  \"format\": \"" << kFormatName << "\",\n";
    out << "  \"next_id\": " << read_next_id(db_) << ",\n";
    out << "  \"schema_version\": " << kSchemaVersion << ",\n";
    out << "  \"systems\": [";
    first = true;
    for (const System& s : all_systems(db_)) {
      if (filter.system_id && s.id != *filter.system_id) continue;
      out << (first ? "\n" : ",\n");
      write_nested(out, system_to_json(s));
      first = false;
    }
    out << (first ? "]\n" : "\n  ]\n") << "}\n";
    out.flush();
    if (!out) return Error{"output", "writing the export failed"};
    return Ok{};
  });
}

Status JournalStore::export_csv(std::ostream& out, const EventFilter& filter) const {
  return guarded(path_, [&]() -> Status {
    constexpr std::size_t kEventsPerChunk = 5000;
    ReadTransaction snapshot(db_);
    Journal chunk;
    chunk.systems = all_systems(db_);
    bool header_written = false;
    auto flush = [&](bool final_chunk) {
      if (chunk.events.empty() && (header_written || !final_chunk)) return;
      std::string text = journal::export_csv(chunk);
      if (header_written) {
        const auto eol = text.find('\n');
        text.erase(0, eol == std::string::npos ? text.size() : eol + 1);
      }
      out << text;
      header_written = true;
      chunk.events.clear();
    };
    const WhereClause w = where_of(filter);
    Statement ev(db_, (std::string("SELECT ") + kEventColumns + " FROM events" + w.sql + " ORDER BY time_s, id").c_str());
    w.bind(ev);
    while (ev.step()) {
      chunk.events.push_back(read_event(ev));
      if (chunk.events.size() == kEventsPerChunk) flush(false);
    }
    flush(true);
    out.flush();
    if (!out) return Error{"output", "writing the export failed"};
    return Ok{};
  });
}

}  // namespace tw::store
