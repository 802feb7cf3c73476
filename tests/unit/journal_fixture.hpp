// Shared by unit tests that build a journal event by event: adds one event and stops the test
// with the core's message if the journal refuses it.
#pragma once

#include <cstdint>
#include <string>
#include <utility>

#include <doctest/doctest.h>

#include "tidewright/journal/journal.hpp"

namespace tw::test {

inline void add(journal::Journal& j, journal::SystemId id, std::int64_t t, journal::EventData data) {
  journal::Event e;
  e.system_id = id;
  e.time_s = t;
  e.data = std::move(data);
  auto r = journal::add_event(j, e);
  INFO((r.ok() ? std::string() : r.error().message));
  REQUIRE(r.ok());
}

}  // namespace tw::test
