#include "journal_access.hpp"

#include <cstdio>

#include <fmt/format.h>

#include "commands.hpp"
#include "tidewright/journal/system_name.hpp"

namespace tw::shell {

std::unique_ptr<store::JournalStore> open_journal_or_fail(const std::string& given, store::Access access) {
  auto opened = store::open_journal(given, access);
  if (!opened) throw CommandError(opened.error().message);
  if (!opened->notice.empty()) std::fprintf(stderr, "%s\n", opened->notice.c_str());
  return std::move(opened->store);
}

journal::System system_or_fail(const store::JournalStore& store, const std::string& key, const std::string& option) {
  if (key.empty()) {
    auto all = store.systems();
    if (all.size() == 1) return all[0];
    throw CommandError(fmt::format("{} is needed: the journal has {} systems", option, all.size()));
  }
  // An id wins over a name: a name that reads as an id is refused today (system_name.hpp),
  // and one stored before the rule is still reached by its own id or by a name that is not
  // someone else's id.
  if (auto id = journal::id_from_text(key)) {
    if (auto s = store.system(*id)) return *s;
  }
  if (auto s = store.system_by_name(journal::trim_system_name(key))) return *s;
  std::string names;
  for (const auto& s : store.systems()) names += fmt::format("{}'{}' (id {})", names.empty() ? "" : ", ", s.name, s.id);
  throw CommandError(fmt::format("{} '{}' is not a system of this journal; it has: {}", option, key,
                                 names.empty() ? "no systems" : names));
}

}  // namespace tw::shell
