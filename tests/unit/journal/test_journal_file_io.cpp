// The shell's atomic save (shell/file_io.cpp, compiled in here: tw_tests links only the core).
// Native only: the WebAssembly test build has no POSIX file system semantics to check.
#ifndef __EMSCRIPTEN__
#include <doctest/doctest.h>

#include <unistd.h>

#include <cstdlib>
#include <string>

#include "../../../shell/file_io.cpp"  // NOLINT: the unit under test lives in shell/

using tw::shell::CommandError;
using tw::shell::file_exists;
using tw::shell::read_text_file;
using tw::shell::write_text_file_atomic;

TEST_CASE("journal: atomic save keeps the previous copy and never leaves a partial file") {
  char dir_template[] = "/tmp/tw_journal_io_XXXXXX";
  const char* dir = ::mkdtemp(dir_template);
  REQUIRE(dir != nullptr);
  const std::string path = std::string(dir) + "/journal.json";

  write_text_file_atomic(path, "first\n");
  CHECK(read_text_file(path) == "first\n");
  CHECK_FALSE(file_exists(path + ".bak"));  // nothing to keep yet

  write_text_file_atomic(path, "second\n");
  CHECK(read_text_file(path) == "second\n");
  CHECK(read_text_file(path + ".bak") == "first\n");

  write_text_file_atomic(path, "third\n");
  CHECK(read_text_file(path) == "third\n");
  CHECK(read_text_file(path + ".bak") == "second\n");
  CHECK_FALSE(file_exists(path + ".tmp-" + std::to_string(::getpid())));

  // A directory in the way: refused with a reason, nothing written.
  CHECK_THROWS_AS(write_text_file_atomic(dir, "x"), CommandError);
  // A missing directory: refused, no stray files.
  CHECK_THROWS_AS(write_text_file_atomic(std::string(dir) + "/no/such/dir/j.json", "x"),
                  CommandError);
  CHECK(read_text_file(path) == "third\n");
  // Reading a missing file names it.
  try {
    (void)read_text_file(std::string(dir) + "/missing.json");
    CHECK(false);
  } catch (const CommandError& e) {
    CHECK(std::string(e.what()).find("missing.json") != std::string::npos);
  }

  for (const char* f : {"/journal.json", "/journal.json.bak"}) ::unlink((std::string(dir) + f).c_str());
  ::rmdir(dir);
}
#endif
