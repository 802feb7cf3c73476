// Backups of a journal that can be named in advice (backup_finder.hpp).
#include "backup_finder.hpp"

#include <filesystem>
#include <system_error>

#include <fmt/format.h>

namespace tw::shell {

std::optional<std::string> newest_backup_of(const std::string& journal_path) {
  namespace fs = std::filesystem;
  std::string db = journal_path;
  if (db.size() >= 5 && db.compare(db.size() - 5, 5, ".json") == 0) db = db.substr(0, db.size() - 5) + ".db";
  const fs::path p(db);
  const fs::path dir = p.has_parent_path() ? p.parent_path() : fs::path(".");
  const std::string prefix = p.filename().string() + ".before-restore-";
  std::error_code ec;
  std::optional<fs::path> best;
  fs::file_time_type best_time{};
  for (fs::directory_iterator it(dir, ec), end; !ec && it != end; it.increment(ec)) {
    const std::string name = it->path().filename().string();
    if (name.rfind(prefix, 0) != 0 || name.size() < 3 || name.compare(name.size() - 3, 3, ".db") != 0) continue;
    std::error_code tec;
    const auto t = fs::last_write_time(it->path(), tec);
    if (tec) continue;
    if (!best || t > best_time) best = it->path(), best_time = t;
  }
  if (!best) return std::nullopt;
  return best->string();
}

std::string damaged_journal_advice(const std::string& journal_path) {
  if (auto backup = newest_backup_of(journal_path)) {
    return fmt::format("restore the copy kept before the last restore (tidewright log --journal {} restore {}) or "
                       "export what can be read (tidewright log export --format json)\n",
                       journal_path, *backup);
  }
  return "no backup of this journal was found beside it; export what can be read "
         "(tidewright log export --format json), and keep copies with tidewright log backup FILE\n";
}

}  // namespace tw::shell
