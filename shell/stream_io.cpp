#include "stream_io.hpp"

#include <fcntl.h>
#include <sys/stat.h>
#include <unistd.h>

#include <cerrno>
#include <cstring>

#include "commands.hpp"

namespace tw::shell {

namespace {
std::string reason() { return std::strerror(errno); }
}  // namespace

InputChunks::InputChunks(const std::string& path, const std::string& option)
    : path_(path), prefix_(option.empty() ? "" : option + ": ") {
  if (path == "-") {
    fd_ = 0;
    return;
  }
  fd_ = ::open(path.c_str(), O_RDONLY | O_CLOEXEC);
  if (fd_ < 0) throw CommandError(prefix_ + "cannot read " + path + ": " + reason());
  owns_ = true;
}

InputChunks::~InputChunks() {
  if (owns_) ::close(fd_);
}

bool InputChunks::read(std::string& buffer, std::size_t capacity) {
  buffer.resize(capacity);
  std::size_t got = 0;
  while (got < capacity) {  // fill the chunk: pipes hand out 64 KB at a time
    const ssize_t n = ::read(fd_, buffer.data() + got, capacity - got);
    if (n < 0) {
      if (errno == EINTR) continue;
      throw CommandError(prefix_ + "cannot read " + path_ + ": " + reason());
    }
    if (n == 0) break;
    got += static_cast<std::size_t>(n);
  }
  buffer.resize(got);
  return got > 0;
}

OutputSink::OutputSink(const std::string& path) : path_(path) {
  if (path.empty() || path == "-") return;
  mode_t mode = 0644;
  struct stat st {};
  if (::stat(path.c_str(), &st) == 0) {
    if (!S_ISREG(st.st_mode)) throw CommandError("--out: " + path + " is not a regular file");
    mode = st.st_mode & 07777;
  }
  tmp_ = path + ".tmp-" + std::to_string(::getpid());
  ::unlink(tmp_.c_str());
  fd_ = ::open(tmp_.c_str(), O_WRONLY | O_CREAT | O_EXCL | O_CLOEXEC, mode);
  if (fd_ < 0) throw CommandError("--out: cannot write " + path + ": " + reason());
}

OutputSink::~OutputSink() {
  if (tmp_.empty()) return;
  if (fd_ >= 0) ::close(fd_);
  if (!committed_) ::unlink(tmp_.c_str());
}

void OutputSink::write(std::string_view text) {
  std::size_t done = 0;
  while (done < text.size()) {
    const ssize_t n = ::write(fd_, text.data() + done, text.size() - done);
    if (n < 0) {
      if (errno == EINTR) continue;
      throw CommandError("--out: cannot write " + (tmp_.empty() ? std::string("standard output") : path_) +
                         ": " + reason());
    }
    done += static_cast<std::size_t>(n);
  }
}

void OutputSink::commit() {
  if (tmp_.empty() || committed_) return;
  if (::fsync(fd_) != 0 || ::close(fd_) != 0) {
    fd_ = -1;
    throw CommandError("--out: cannot write " + path_ + ": " + reason());
  }
  fd_ = -1;
  if (::rename(tmp_.c_str(), path_.c_str()) != 0)
    throw CommandError("--out: cannot replace " + path_ + ": " + reason());
  committed_ = true;
  const auto slash = path_.rfind('/');
  const std::string dir = slash == std::string::npos ? "." : (slash == 0 ? "/" : path_.substr(0, slash));
  const int dfd = ::open(dir.c_str(), O_RDONLY | O_DIRECTORY | O_CLOEXEC);
  if (dfd >= 0) {
    (void)::fsync(dfd);
    ::close(dfd);
  }
}

}  // namespace tw::shell
