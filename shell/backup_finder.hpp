// Backups of a journal that this program made and can name: the copies `log restore` keeps
// beside the journal (JOURNAL.before-restore-<time>.db). Error advice names one only when it
// exists; otherwise it says there is none.
#pragma once

#include <optional>
#include <string>

namespace tw::shell {

// The newest JOURNAL.before-restore-*.db beside the journal (the .json given names its .db).
std::optional<std::string> newest_backup_of(const std::string& journal_path);

// One line of advice after a damaged journal: restore the named backup if there is one, else
// export what can still be read.
std::string damaged_journal_advice(const std::string& journal_path);

}  // namespace tw::shell
