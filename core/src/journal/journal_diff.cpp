#include "tidewright/journal/journal_diff.hpp"

#include <unordered_map>

namespace tw::journal {

namespace {

template <class Record, class Id>
void diff_records(const std::vector<Record>& before, const std::vector<Record>& after, std::vector<Record>& put,
                  std::vector<Id>& removed) {
  std::unordered_map<Id, const Record*> old;
  old.reserve(before.size());
  for (const Record& r : before) old.emplace(r.id, &r);
  for (const Record& r : after) {
    auto it = old.find(r.id);
    if (it == old.end()) {
      put.push_back(r);
    } else {
      if (!(*it->second == r)) put.push_back(r);
      old.erase(it);
    }
  }
  for (const Record& r : before) {
    if (old.count(r.id)) removed.push_back(r.id);
  }
}

}  // namespace

JournalChanges diff_journals(const Journal& before, const Journal& after) {
  JournalChanges c;
  diff_records(before.systems, after.systems, c.systems_put, c.systems_removed);
  diff_records(before.events, after.events, c.events_put, c.events_removed);
  if (before.description != after.description) c.description = after.description;
  c.next_id = after.next_id;
  c.first_new_id = before.next_id;
  return c;
}

}  // namespace tw::journal
