#include "tidewright/journal/journal_diff.hpp"

#include <algorithm>
#include <unordered_map>
#include <unordered_set>

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

namespace {

// Removes records whose id is in ids or among the records put, then adds the records put.
template <class Record, class Id>
void put_and_remove(std::vector<Record>& records, const std::vector<Record>& put, const std::vector<Id>& removed) {
  std::unordered_set<Id> gone(removed.begin(), removed.end());
  for (const Record& r : put) gone.insert(r.id);
  records.erase(std::remove_if(records.begin(), records.end(), [&](const Record& r) { return gone.count(r.id) > 0; }),
                records.end());
  records.insert(records.end(), put.begin(), put.end());
}

}  // namespace

void apply_changes(Journal& journal, const JournalChanges& changes) {
  put_and_remove(journal.systems, changes.systems_put, changes.systems_removed);
  put_and_remove(journal.events, changes.events_put, changes.events_removed);
  std::sort(journal.systems.begin(), journal.systems.end(), [](const System& a, const System& b) { return a.id < b.id; });
  std::sort(journal.events.begin(), journal.events.end(), [](const Event& a, const Event& b) {
    return a.time_s != b.time_s ? a.time_s < b.time_s : a.id < b.id;
  });
  if (changes.description) journal.description = *changes.description;
  std::int64_t next = std::max(journal.next_id, changes.next_id);
  for (const System& s : journal.systems) next = std::max(next, s.id + 1);
  for (const Event& e : journal.events) next = std::max(next, e.id + 1);
  journal.next_id = next;
}

}  // namespace tw::journal
