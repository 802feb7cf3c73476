// Streamed files for the batch commands: input read in chunks and output written as it is
// made, so a batch of any size runs in constant memory. (Whole-file helpers: file_io.hpp.)
#pragma once

#include <cstddef>
#include <string>
#include <string_view>

namespace tw::shell {

// Reads a file, or standard input for "-", a chunk at a time. Errors are CommandError
// "OPTION: cannot read PATH: reason".
class InputChunks {
 public:
  InputChunks(const std::string& path, const std::string& option);
  ~InputChunks();
  InputChunks(const InputChunks&) = delete;
  InputChunks& operator=(const InputChunks&) = delete;
  // Up to `capacity` bytes into buffer (replacing its content); false at the end of input.
  bool read(std::string& buffer, std::size_t capacity);

 private:
  int fd_ = -1;
  bool owns_ = false;
  std::string path_, prefix_;
};

// Where --out points: standard output when the path is empty or "-"; otherwise a temporary
// file in the same directory that commit() fsyncs and renames over the path (so the path
// holds either its old content or the whole new output). Without commit() the temporary file
// is removed. Errors are CommandError "--out: ...".
class OutputSink {
 public:
  explicit OutputSink(const std::string& path);
  ~OutputSink();
  OutputSink(const OutputSink&) = delete;
  OutputSink& operator=(const OutputSink&) = delete;
  void write(std::string_view text);
  void commit();

 private:
  int fd_ = 1;
  std::string path_, tmp_;
  bool committed_ = false;
};

}  // namespace tw::shell
