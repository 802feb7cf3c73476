// The JSON journal (journal_file.hpp, docs/journal-format.md) read from a stream one event at a
// time, never holding the whole document: for imports and restores of large exports (the
// store's import_journal_stream). It accepts and refuses exactly what parse_journal does, with
// the same error texts (the JSON path, e.g. "events[12].value: ...").
//
// How: nlohmann::json's SAX interface, in two passes over the stream. A written journal lists
// its keys in alphabetical order, so "events" comes before "format", "next_id",
// "schema_version" and "systems"; an event cannot be checked before the systems are known.
// The first pass checks the JSON syntax of the whole file and keeps the top-level fields and
// the systems (small), skipping the events; the second pass (after seeking back) builds one
// event object at a time, reads and checks it and hands it on. The stream must therefore be
// seekable (a file); one that is not is read whole, as are the older schema versions 1 and 2
// (small historic files: migrate_v1_to_v2 works on the whole tree) and a file that holds the
// "events" key twice (whose last one counts), through parse_journal.
#pragma once

#include <cstdint>
#include <functional>
#include <istream>
#include <string>
#include <vector>

#include "tidewright/common/result.hpp"
#include "tidewright/journal/journal.hpp"

namespace tw::journal {

// Everything of a journal but its events, checked as parse_journal checks it.
struct JournalHead {
  int source_version = 3;  // the schema_version found in the file
  std::string description;
  std::int64_t next_id = 1;
  std::vector<System> systems;
};

// on_head is called once, before the first event. on_event gets each event in file order (not
// sorted by time, unlike parse_journal), read, its numbers rounded as stored and checked
// against the systems and the schedules before it, with its JSON path ("events[12]") to name
// it in errors. A handler's error stops the reading and is returned as it is. The check that
// next_id is above every id can only come after the last event: an importer must keep what it
// did undone (in a transaction) until this returns Ok.
Status read_journal_stream(std::istream& in, const std::function<Status(const JournalHead&)>& on_head,
                           const std::function<Status(Event&&, const std::string& path)>& on_event);

// The whole journal through the stream, sorted as parse_journal sorts it (tests, fuzzing).
Result<Journal> parse_journal_stream(std::istream& in, int* source_version = nullptr);

}  // namespace tw::journal
