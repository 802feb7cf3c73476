#include "sqlite_util.hpp"

namespace tw::store::detail {

void check(sqlite3* db, int rc, const char* what) {
  if (rc == SQLITE_OK || rc == SQLITE_ROW || rc == SQLITE_DONE) return;
  const char* why = db ? sqlite3_errmsg(db) : sqlite3_errstr(rc);
  if ((rc & 0xff) == SQLITE_CORRUPT || (rc & 0xff) == SQLITE_NOTADB) {
    throw StoreFailure(std::string("the database file is damaged (SQLite: ") + why + ")");
  }
  std::string msg = std::string(what) + ": " + why;
  if (rc == SQLITE_BUSY) msg += " (another program kept the journal locked longer than the wait allows)";
  throw StoreFailure(msg);
}

void exec(sqlite3* db, const char* sql) {
  char* err = nullptr;
  const int rc = sqlite3_exec(db, sql, nullptr, nullptr, &err);
  if (rc != SQLITE_OK) {
    std::string msg = err ? err : sqlite3_errstr(rc);
    sqlite3_free(err);
    throw StoreFailure(msg);
  }
}

Statement::Statement(sqlite3* db, const char* sql) : db_(db) {
  check(db_, sqlite3_prepare_v2(db_, sql, -1, &stmt_, nullptr), "preparing a query");
}
Statement::~Statement() { sqlite3_finalize(stmt_); }

Statement& Statement::bind(int i, std::int64_t v) {
  check(db_, sqlite3_bind_int64(stmt_, i, v), "bind");
  return *this;
}
Statement& Statement::bind(int i, double v) {
  check(db_, sqlite3_bind_double(stmt_, i, v), "bind");
  return *this;
}
Statement& Statement::bind(int i, const std::string& v) {
  check(db_, sqlite3_bind_text(stmt_, i, v.data(), static_cast<int>(v.size()), SQLITE_TRANSIENT), "bind");
  return *this;
}
Statement& Statement::bind(int i, const std::optional<double>& v) {
  return v ? bind(i, *v) : bind_null(i);
}
Statement& Statement::bind_text_or_null(int i, const std::string& v) {
  return v.empty() ? bind_null(i) : bind(i, v);
}
Statement& Statement::bind_null(int i) {
  check(db_, sqlite3_bind_null(stmt_, i), "bind");
  return *this;
}

bool Statement::step() {
  const int rc = sqlite3_step(stmt_);
  if (rc == SQLITE_ROW) return true;
  if (rc == SQLITE_DONE) return false;
  check(db_, rc, "query");
  return false;
}
void Statement::run() {
  while (step()) {
  }
}
void Statement::reset() {
  sqlite3_reset(stmt_);
  sqlite3_clear_bindings(stmt_);
}

bool Statement::is_null(int col) const { return sqlite3_column_type(stmt_, col) == SQLITE_NULL; }
std::int64_t Statement::integer(int col) const { return sqlite3_column_int64(stmt_, col); }
double Statement::real(int col) const { return sqlite3_column_double(stmt_, col); }
std::optional<double> Statement::optional_real(int col) const {
  if (is_null(col)) return std::nullopt;
  return real(col);
}
std::string Statement::text(int col) const {
  const auto* p = reinterpret_cast<const char*>(sqlite3_column_text(stmt_, col));
  if (!p) return {};
  return std::string(p, static_cast<size_t>(sqlite3_column_bytes(stmt_, col)));
}

WriteTransaction::WriteTransaction(sqlite3* db) : db_(db) { exec(db_, "BEGIN IMMEDIATE"); }
WriteTransaction::~WriteTransaction() {
  if (!done_) sqlite3_exec(db_, "ROLLBACK", nullptr, nullptr, nullptr);
}
void WriteTransaction::commit() {
  exec(db_, "COMMIT");
  done_ = true;
}

ReadTransaction::ReadTransaction(sqlite3* db) : db_(db) { exec(db_, "BEGIN"); }
ReadTransaction::~ReadTransaction() { sqlite3_exec(db_, "COMMIT", nullptr, nullptr, nullptr); }

}  // namespace tw::store::detail
