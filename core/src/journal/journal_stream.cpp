// The JSON journal read from a stream, one event at a time (journal_stream.hpp says why two
// passes). The records are read and checked by the same code as parse_journal's
// (journal_json_internal.hpp), so the errors are the same.
//
// Map: 1. SAX handler (keeps the head, hands on one event object at a time)
//      2. helpers (line and column of a syntax error; the whole-tree way)   3. the reader
#include "tidewright/journal/journal_stream.hpp"

#include <algorithm>

#include <fmt/format.h>
#include <nlohmann/json.hpp>

#include "tidewright/journal/journal_file.hpp"
#include "journal_json_internal.hpp"

namespace tw::journal {

using nlohmann::json;

namespace {

// ---------------------------------------------------------------- 1. SAX handler
// depth_ counts the open arrays and objects: the document's object is depth 1, the value of
// one of its keys depth 2, an element of "events" depth 3 (or a scalar at depth 2).
class JournalSax final : public nlohmann::json_sax<json> {
 public:
  enum class Pass { Head, Events };
  explicit JournalSax(Pass pass) : pass_(pass) {}

  // After the head pass.
  bool top_is_object = false;
  json head = json::object();  // the top-level fields parse_journal reads, systems included
  int events_keys = 0;         // how many times the key "events" appears at the top
  bool events_is_array = false;
  // The events pass: called with each element of "events" and its index.
  std::function<Status(json&&, std::size_t)> on_element;
  // How it ended.
  bool syntax_error = false;
  std::size_t error_byte = 0;
  std::string error_what;
  std::optional<Error> handler_error;

  bool null() override { return scalar(json(nullptr)); }
  bool boolean(bool v) override { return scalar(json(v)); }
  bool number_integer(number_integer_t v) override { return scalar(json(v)); }
  bool number_unsigned(number_unsigned_t v) override { return scalar(json(v)); }
  bool number_float(number_float_t v, const string_t&) override { return scalar(json(v)); }
  bool string(string_t& v) override { return scalar(json(std::move(v))); }
  bool binary(binary_t& v) override { return scalar(json(std::move(v))); }
  bool start_object(std::size_t) override { return open(json::value_t::object); }
  bool start_array(std::size_t) override { return open(json::value_t::array); }
  bool end_object() override { return close(); }
  bool end_array() override { return close(); }
  bool key(string_t& k) override {
    if (capturing_) pending_key_ = k;
    else if (depth_ == 1) top_key_ = k;
    return true;
  }
  bool parse_error(std::size_t position, const std::string&, const nlohmann::detail::exception& ex) override {
    syntax_error = true;
    error_byte = position;
    error_what = ex.what();
    return false;
  }

 private:
  static bool kept_in_head(const std::string& key) {
    return key == "format" || key == "schema_version" || key == "description" || key == "next_id" ||
           key == "systems";
  }

  bool scalar(json v) {
    if (capturing_) {
      json* parent = stack_.back();
      if (parent->is_array()) parent->push_back(std::move(v));
      else (*parent)[pending_key_] = std::move(v);
      return true;
    }
    if (depth_ == 1 && top_is_object) {
      if (top_key_ == "events") {
        ++events_keys;
        events_is_array = false;
      } else if (pass_ == Pass::Head && kept_in_head(top_key_)) {
        head[top_key_] = std::move(v);  // a key given twice: the last counts, as in parse_journal
      }
    } else if (depth_ == 2 && in_events_) {
      return deliver(std::move(v));  // not an object: read_event says so
    }
    return true;
  }

  bool open(json::value_t kind) {
    ++depth_;
    if (capturing_) {
      json* parent = stack_.back();
      json* child = nullptr;
      if (parent->is_array()) {
        parent->push_back(json(kind));
        child = &parent->back();
      } else {
        child = &((*parent)[pending_key_] = json(kind));
      }
      stack_.push_back(child);
      return true;
    }
    if (depth_ == 1) {
      top_is_object = kind == json::value_t::object;
    } else if (depth_ == 2 && top_is_object) {
      if (top_key_ == "events") {
        ++events_keys;
        events_is_array = kind == json::value_t::array;
        in_events_ = pass_ == Pass::Events && events_is_array;
      } else if (pass_ == Pass::Head && kept_in_head(top_key_)) {
        begin_capture(kind);
      }
    } else if (depth_ == 3 && in_events_) {
      begin_capture(kind);
    }
    return true;
  }

  bool close() {
    if (capturing_ && depth_ == capture_depth_) {
      capturing_ = false;
      stack_.clear();
      --depth_;
      if (in_events_) return deliver(std::move(captured_));
      head[top_key_] = std::move(captured_);
      return true;
    }
    if (capturing_) stack_.pop_back();
    else if (in_events_ && depth_ == 2) in_events_ = false;
    --depth_;
    return true;
  }

  void begin_capture(json::value_t kind) {
    capturing_ = true;
    capture_depth_ = depth_;
    captured_ = json(kind);
    stack_.assign(1, &captured_);
  }

  bool deliver(json&& element) {
    Status st = on_element(std::move(element), index_++);
    if (st) return true;
    handler_error = st.error();
    return false;
  }

  Pass pass_;
  int depth_ = 0;
  std::string top_key_;
  bool in_events_ = false;
  std::size_t index_ = 0;
  bool capturing_ = false;
  int capture_depth_ = 0;
  json captured_;
  std::vector<json*> stack_;  // the open containers of captured_ (pointers stay valid: only the innermost grows)
  std::string pending_key_;
};

// ---------------------------------------------------------------- 2. helpers
// "line L, column C" of the byte before `byte` (as parse_journal counts), read again from start.
std::string stream_line_column(std::istream& in, std::streampos start, std::size_t byte) {
  in.clear();
  in.seekg(start);
  std::size_t line = 1, col = 1, left = byte ? byte - 1 : 0;
  char buf[1 << 16];
  while (left > 0 && in) {
    in.read(buf, static_cast<std::streamsize>(std::min(left, sizeof buf)));
    const auto got = static_cast<std::size_t>(in.gcount());
    if (got == 0) break;
    for (std::size_t i = 0; i < got; ++i) {
      if (buf[i] == '\n') {
        ++line;
        col = 1;
      } else {
        ++col;
      }
    }
    left -= got;
  }
  return fmt::format("line {}, column {}", line, col);
}

// The rest of the stream read whole and parsed by parse_journal: older versions, a stream that
// cannot seek back, a file with the key "events" twice. Events come sorted, named by id.
Status read_whole(std::istream& in, const std::function<Status(const JournalHead&)>& on_head,
                  const std::function<Status(Event&&, const std::string&)>& on_event) {
  std::string text((std::istreambuf_iterator<char>(in)), std::istreambuf_iterator<char>());
  int version = kSchemaVersion;
  auto parsed = parse_journal(text, &version);
  text = std::string();
  if (!parsed) return parsed.error();
  Journal j = std::move(parsed).value();
  JournalHead head{version, std::move(j.description), j.next_id, std::move(j.systems)};
  if (Status st = on_head(head); !st) return st;
  for (Event& e : j.events) {
    const std::string name = fmt::format("event {}", e.id);
    if (Status st = on_event(std::move(e), name); !st) return st;
  }
  return Ok{};
}

}  // namespace

// ---------------------------------------------------------------- 3. the reader
Status read_journal_stream(std::istream& in, const std::function<Status(const JournalHead&)>& on_head,
                           const std::function<Status(Event&&, const std::string& path)>& on_event) {
  const std::streampos start = in.tellg();
  if (start == std::streampos(-1)) return read_whole(in, on_head, on_event);

  JournalSax first(JournalSax::Pass::Head);
  first.on_element = [](json&&, std::size_t) -> Status { return Ok{}; };
  json::sax_parse(in, &first);
  if (first.syntax_error) {
    return detail::json_syntax_error(first.error_what, stream_line_column(in, start, first.error_byte));
  }
  const json doc = first.top_is_object ? std::move(first.head) : json(nullptr);
  auto version = detail::check_format_and_version(doc);
  if (!version) return version.error();
  if (*version < kSchemaVersion || first.events_keys > 1) {
    in.clear();
    in.seekg(start);
    return read_whole(in, on_head, on_event);
  }

  JournalHead head;
  head.source_version = *version;
  if (Status st = detail::read_head_fields(doc, head.description, head.next_id); !st) return st;
  const auto systems = doc.find("systems");
  if (systems == doc.end() || !systems->is_array()) return Error{"systems", "systems: is missing (an array)"};
  if (first.events_keys == 0 || !first.events_is_array) return Error{"events", "events: is missing (an array)"};
  detail::JournalChecks checks(head.next_id);
  for (std::size_t i = 0; i < systems->size(); ++i) {
    const std::string path = fmt::format("systems[{}]", i);
    auto s = detail::read_system_at((*systems)[i], path);
    if (!s) return s.error();
    if (Status st = checks.system(*s, path); !st) return st;
  }
  head.systems = checks.systems();
  if (Status st = on_head(head); !st) return st;

  in.clear();
  in.seekg(start);
  if (!in) return Error{"journal", "the journal could not be read again from its start"};
  JournalSax second(JournalSax::Pass::Events);
  second.on_element = [&](json&& element, std::size_t index) -> Status {
    const std::string path = fmt::format("events[{}]", index);
    auto e = detail::read_event_at(element, path);
    if (!e) return e.error();
    if (Status st = checks.event(*e, path); !st) return st;
    return on_event(std::move(e).value(), path);
  };
  json::sax_parse(in, &second);
  if (second.handler_error) return *second.handler_error;
  if (second.syntax_error) {  // the file changed between the two passes
    return detail::json_syntax_error(second.error_what, stream_line_column(in, start, second.error_byte));
  }
  return checks.finish();
}

Result<Journal> parse_journal_stream(std::istream& in, int* source_version) {
  Journal j;
  Status st = read_journal_stream(
      in,
      [&](const JournalHead& head) -> Status {
        j.description = head.description;
        j.next_id = head.next_id;
        j.systems = head.systems;
        if (source_version) *source_version = head.source_version;
        return Ok{};
      },
      [&](Event&& e, const std::string&) -> Status {
        j.events.push_back(std::move(e));
        return Ok{};
      });
  if (!st) return st.error();
  std::stable_sort(j.events.begin(), j.events.end(), [](const Event& a, const Event& b) {
    return a.time_s != b.time_s ? a.time_s < b.time_s : a.id < b.id;
  });
  return j;
}

}  // namespace tw::journal
