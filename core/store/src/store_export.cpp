// Exports from the store, streamed: the JSON journal format byte for byte as
// serialize_journal writes it (members in the same order, 2-space indent), and long-form CSV
// in chunks through the core's writer. One read transaction each: a consistent snapshot while
// others write.
#include <sstream>

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

}  // namespace

Status JournalStore::export_json(std::ostream& out) const {
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
    Statement ev(db_, (std::string("SELECT ") + kEventColumns + " FROM events ORDER BY time_s, id").c_str());
    bool first = true;
    while (ev.step()) {
      out << (first ? "\n" : ",\n");
      write_nested(out, event_to_json(read_event(ev)));
      first = false;
    }
    out << (first ? "],\n" : "\n  ],\n");
    out << "  \"format\": \"" << kFormatName << "\",\n";
    out << "  \"next_id\": " << read_next_id(db_) << ",\n";
    out << "  \"schema_version\": " << kSchemaVersion << ",\n";
    out << "  \"systems\": [";
    first = true;
    for (const System& s : all_systems(db_)) {
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
