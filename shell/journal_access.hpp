// Opening the journal named by --journal for a command (core/store: the database, or a JSON
// journal imported on first change). Prints the one-line notice of an import on stderr;
// throws CommandError with the store's reason otherwise.
#pragma once

#include <memory>
#include <string>

#include "tidewright/store/journal_location.hpp"
#include "tidewright/store/journal_store.hpp"

namespace tw::shell {

std::unique_ptr<store::JournalStore> open_journal_or_fail(const std::string& given, store::Access access);

// A system by id (journal::id_from_text: "2", "#2") or else by name (no case, trimmed); with an empty key the only system, if there is one.
// option is what the user typed ("--system"), used in the error.
journal::System system_or_fail(const store::JournalStore& store, const std::string& key,
                               const std::string& option = "--system");

}  // namespace tw::shell
