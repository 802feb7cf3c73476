// Small RAII helpers over the SQLite C API for the store (private to core/store).
// Failures throw StoreFailure; every public JournalStore call catches it and returns a
// tw::Error, so no exception leaves the store.
#pragma once

#include <sqlite3.h>

#include <cstdint>
#include <optional>
#include <stdexcept>
#include <string>

namespace tw::store::detail {

struct StoreFailure : std::runtime_error {
  using std::runtime_error::runtime_error;
};

// Throws StoreFailure with SQLite's message when rc is not one of the accepted codes.
void check(sqlite3* db, int rc, const char* what);
void exec(sqlite3* db, const char* sql);

class Statement {
 public:
  Statement(sqlite3* db, const char* sql);
  ~Statement();
  Statement(const Statement&) = delete;
  Statement& operator=(const Statement&) = delete;

  // Parameters are 1-based like SQLite's.
  Statement& bind(int i, std::int64_t v);
  Statement& bind(int i, double v);
  Statement& bind(int i, const std::string& v);
  Statement& bind(int i, const std::optional<double>& v);
  Statement& bind_text_or_null(int i, const std::string& v);  // empty text = NULL
  Statement& bind_null(int i);

  bool step();  // true = a row is ready; false = done
  void run();   // step to the end (for changes)
  void reset();

  bool is_null(int col) const;
  std::int64_t integer(int col) const;
  double real(int col) const;
  std::optional<double> optional_real(int col) const;
  std::string text(int col) const;  // NULL reads as ""

 private:
  sqlite3* db_;
  sqlite3_stmt* stmt_ = nullptr;
};

// BEGIN IMMEDIATE (takes the write lock at once, waiting up to the busy timeout, so two
// writers never both read and then collide), COMMIT on commit(), ROLLBACK otherwise.
class WriteTransaction {
 public:
  explicit WriteTransaction(sqlite3* db);
  ~WriteTransaction();
  void commit();

 private:
  sqlite3* db_;
  bool done_ = false;
};

// BEGIN (deferred): a consistent snapshot for several reads in a row.
class ReadTransaction {
 public:
  explicit ReadTransaction(sqlite3* db);
  ~ReadTransaction();

 private:
  sqlite3* db_;
};

}  // namespace tw::store::detail
