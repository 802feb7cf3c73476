// Rounding a system's or an event's numbers as the journal stores them (journal_tidy.cpp).
#pragma once

#include "tidewright/journal/journal.hpp"

namespace tw::journal {

void tidy_numbers(System& system);
void tidy_numbers(Event& event);

}  // namespace tw::journal
