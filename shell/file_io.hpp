// Files for the command line: whole-file reads with clear errors, and atomic replacement
// that keeps the previous copy. (The core never touches files; this is the shell's job.)
#pragma once

#include <functional>
#include <ostream>
#include <string>

namespace tw::shell {

// True if a file (or anything) exists at path.
bool file_exists(const std::string& path);

// Reads a whole file, or standard input for "-". Throws CommandError
// "OPTION: cannot read PATH: reason" on failure (no "OPTION: " when option is empty).
std::string read_text_file(const std::string& path, const std::string& option = "");

// Replaces path with text atomically:
//   1. writes PATH.tmp-<pid> in the same directory and fsyncs it;
//   2. if PATH exists, keeps its current content as PATH.bak (replacing an older .bak; by a
//      hard link, or a synced copy where links are not possible);
//   3. renames the temporary file over PATH (atomic on POSIX file systems) and fsyncs the
//      directory.
// Either the old or the new content is at PATH at every moment; on any failure the temporary
// file is removed, PATH is untouched and CommandError is thrown. "-" writes to standard output.
void write_text_file_atomic(const std::string& path, const std::string& text,
                            bool keep_backup = true);

// Like write_text_file_atomic without a backup, for output too large to hold in memory:
// write() fills the stream (PATH.tmp-<pid>, fsynced, renamed over PATH; removed on failure).
// "-" streams to standard output.
void write_stream_atomic(const std::string& path, const std::function<void(std::ostream&)>& write);

// Where an --out option points: standard output when path is empty or "-", otherwise an
// atomic replacement of the file (no .bak: outputs are regenerated, not edited). Errors start
// with "--out: ".
void write_output(const std::string& path, const std::string& text);

}  // namespace tw::shell
