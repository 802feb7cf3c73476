// Shared by the whole-tree JSON reader (journal_json.cpp, parse_journal) and the streaming one
// (journal_stream.cpp): the record readers and the checks across records, so that both give
// the very same errors (with the JSON path, e.g. "events[12].value: ...").
#pragma once

#include <cstdint>
#include <set>
#include <string>
#include <vector>

#include <nlohmann/json.hpp>

#include "tidewright/common/result.hpp"
#include "tidewright/journal/journal.hpp"

namespace tw::journal::detail {

// One record of the current version, read and its numbers rounded as stored; not yet checked
// against the rest of the journal. path names it in errors ("systems[0]", "events[12]").
Result<System> read_system_at(const nlohmann::json& j, const std::string& path);
Result<Event> read_event_at(const nlohmann::json& j, const std::string& path);

// The top-level checks of a document before its records: an object, "format", and a
// "schema_version" this program reads. Returns the version (1 to kSchemaVersion).
Result<int> check_format_and_version(const nlohmann::json& doc);
// description (optional text) and next_id (an integer) of a current-version document.
Status read_head_fields(const nlohmann::json& doc, std::string& description, std::int64_t& next_id);

// "the journal is not valid JSON (line L, column C): why" from nlohmann's parse error text.
Error json_syntax_error(const std::string& what, const std::string& line_column);

// The checks parse_journal makes across records, for a reader that sees one record at a time
// in file order: ids positive and unique across systems and events, each system against the
// systems before it, each event against the systems and the schedules before it (a marked
// dose needs its schedule, validate_event), and next_id above every id. Memory: the systems,
// the schedules, and one bit per id below next_id (ids from next_id up, and every id when
// next_id is beyond kIdBitsLimit, go into a set: such a file is refused at the end anyway).
class JournalChecks {
 public:
  static constexpr std::int64_t kIdBitsLimit = std::int64_t{1} << 27;  // 16 MB of bits at most
  explicit JournalChecks(std::int64_t next_id);
  // Each passes the record or returns the error naming path.
  Status system(const System& s, const std::string& path);
  Status event(const Event& e, const std::string& path);
  // After the last record: next_id must be greater than every id.
  Status finish() const;
  const std::vector<System>& systems() const { return context_.systems; }

 private:
  Status claim_id(std::int64_t id, const std::string& path);
  std::int64_t next_id_;
  std::vector<bool> below_next_;  // id i at [i - 1], for 1 <= i < next_id
  std::set<std::int64_t> other_ids_;
  std::int64_t max_id_ = 0;
  Journal context_;  // the systems and the schedules read so far
};

}  // namespace tw::journal::detail
