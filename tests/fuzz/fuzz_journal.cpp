// libFuzzer target: journal JSON parse and CSV import on arbitrary bytes.
// The first byte picks the path (even: JSON, odd: CSV with one of the date orders); the rest
// is the text. Checks: no crash, no sanitizer report, and for every journal that parses, the
// exact round trip parse(serialize(j)) == j, the CSV export re-imports without a reject, and
// the journal store's JSON import path (core/store: a JSON journal into an in-memory database,
// streamed back out) gives the very same text. The streaming reader (journal_stream.hpp) gets
// the same bytes and must accept and refuse as parse_journal does, with the same journal or
// the same error text; so must the store's streamed import.
#include <cstddef>
#include <cstdint>
#include <cstdlib>
#include <sstream>
#include <string>

#include "tidewright/journal/journal_csv.hpp"
#include "tidewright/journal/journal_file.hpp"
#include "tidewright/journal/journal_stream.hpp"
#include "tidewright/store/journal_store.hpp"

using namespace tw::journal;

namespace {

void check(bool ok) {
  if (!ok) std::abort();
}

Journal base_journal() {
  Journal j;
  System a;
  a.name = "Reef";
  a.volume_l = 380;
  System b;
  b.name = "Rack 1";
  b.volume_l = 1150;
  b.units.volume = tw::units::VolumeUnit::UsGallon;
  (void)add_system(j, a);
  (void)add_system(j, b);
  return j;
}

}  // namespace

extern "C" int LLVMFuzzerTestOneInput(const uint8_t* data, size_t size) {
  if (size == 0) return 0;
  const uint8_t mode = data[0];
  const std::string text(reinterpret_cast<const char*>(data + 1), size - 1);
  if (mode % 2 == 0) {
    auto r = parse_journal(text);
    std::istringstream in(text);
    auto s = parse_journal_stream(in);
    check(s.ok() == r.ok());
    if (r.ok()) check(*s == *r);
    else check(s.error().message == r.error().message);
    if (r.ok()) {
      const std::string out = serialize_journal(*r);
      auto back = parse_journal(out);
      check(back.ok());
      check(*back == *r);
      Journal copy = *r;
      copy.events.clear();
      auto imp = import_csv(copy, export_csv(*r));
      check(imp.ok() && imp->rejected.empty());
      auto store = tw::store::JournalStore::open(":memory:");
      check(store.ok());
      check((*store)->import_journal(*r).ok());
      std::ostringstream streamed;
      check((*store)->export_json(streamed).ok());
      check(streamed.str() == out);
      auto store2 = tw::store::JournalStore::open(":memory:");
      check(store2.ok());
      std::istringstream again(text);
      check((*store2)->import_journal_stream(again).ok());
      std::ostringstream streamed2;
      check((*store2)->export_json(streamed2).ok());
      check(streamed2.str() == out);
    }
  } else {
    Journal j = base_journal();
    const Journal before = j;
    CsvImportOptions opt;
    opt.time.order = static_cast<tw::datetime::DateOrder>((mode >> 1) % 3);
    opt.time.utc_offset_minutes = ((mode >> 3) % 5) * 60 - 120;
    auto r = import_csv(j, text, opt);
    if (!r.ok()) {
      check(j == before);  // a file-level error adds nothing
    } else {
      check(j.events.size() == r->added.size());
      // Whatever was imported serializes and reads back exactly.
      auto back = parse_journal(serialize_journal(j));
      check(back.ok() && *back == j);
    }
  }
  return 0;
}
