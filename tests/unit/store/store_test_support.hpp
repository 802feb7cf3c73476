// What the store's unit tests share: a temporary directory removed at the end of the test
// case, and opening a journal database in it (the test fails with the store's message).
#pragma once

#include <unistd.h>

#include <filesystem>
#include <memory>
#include <string>

#include <doctest/doctest.h>
#include <fmt/format.h>

#include "tidewright/store/journal_store.hpp"

namespace tw::store::testing {

struct TempDir {
  std::filesystem::path path;
  TempDir() {
    static int n = 0;
    path = std::filesystem::temp_directory_path() / fmt::format("tw_store_test_{}_{}", ::getpid(), ++n);
    std::filesystem::remove_all(path);
    std::filesystem::create_directories(path);
  }
  ~TempDir() { std::filesystem::remove_all(path); }
  TempDir(const TempDir&) = delete;
  TempDir& operator=(const TempDir&) = delete;
  std::string file(const std::string& name) const { return (path / name).string(); }
};

inline std::unique_ptr<JournalStore> open_store(const std::string& path) {
  auto s = JournalStore::open(path);
  REQUIRE_MESSAGE(s.ok(), (s.ok() ? "" : s.error().message));
  return std::move(s).value();
}

}  // namespace tw::store::testing
