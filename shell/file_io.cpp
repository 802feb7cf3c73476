#include "file_io.hpp"

#include <fcntl.h>
#include <sys/stat.h>
#include <unistd.h>

#include <cerrno>
#include <cstdio>
#include <cstring>
#include <fstream>
#include <iostream>
#include <iterator>
#include <sstream>

#include "commands.hpp"

namespace tw::shell {

namespace {

std::string reason() { return std::strerror(errno); }

std::string directory_of(const std::string& path) {
  const auto slash = path.rfind('/');
  if (slash == std::string::npos) return ".";
  if (slash == 0) return "/";
  return path.substr(0, slash);
}

// Writes all of text to fd; false on error (errno set).
bool write_all(int fd, const std::string& text) {
  size_t done = 0;
  while (done < text.size()) {
    const ssize_t n = ::write(fd, text.data() + done, text.size() - done);
    if (n < 0) {
      if (errno == EINTR) continue;
      return false;
    }
    done += static_cast<size_t>(n);
  }
  return true;
}

// Writes text to a new file at path (created exclusively), fsyncs and closes it.
void write_new_synced(const std::string& path, const std::string& text, mode_t mode) {
  const int fd = ::open(path.c_str(), O_WRONLY | O_CREAT | O_EXCL | O_CLOEXEC, mode);
  if (fd < 0) throw CommandError("cannot create " + path + ": " + reason());
  if (!write_all(fd, text) || ::fsync(fd) != 0) {
    const std::string why = reason();
    ::close(fd);
    ::unlink(path.c_str());
    throw CommandError("cannot write " + path + ": " + why);
  }
  if (::close(fd) != 0) {
    const std::string why = reason();
    ::unlink(path.c_str());
    throw CommandError("cannot write " + path + ": " + why);
  }
}

void sync_directory(const std::string& dir) {
  const int fd = ::open(dir.c_str(), O_RDONLY | O_DIRECTORY | O_CLOEXEC);
  if (fd < 0) return;  // best effort: some file systems do not allow it
  (void)::fsync(fd);
  ::close(fd);
}

// Keeps the current content of path as path.bak, replacing an older backup atomically.
void keep_backup_of(const std::string& path, mode_t mode) {
  const std::string bak = path + ".bak";
  const std::string bak_tmp = bak + ".tmp-" + std::to_string(::getpid());
  ::unlink(bak_tmp.c_str());
  if (::link(path.c_str(), bak_tmp.c_str()) != 0) {
    write_new_synced(bak_tmp, read_text_file(path), mode);  // no hard links here: copy
  }
  if (::rename(bak_tmp.c_str(), bak.c_str()) != 0) {
    const std::string why = reason();
    ::unlink(bak_tmp.c_str());
    throw CommandError("cannot keep the previous copy as " + bak + ": " + why);
  }
}

}  // namespace

bool file_exists(const std::string& path) {
  struct stat st {};
  return ::stat(path.c_str(), &st) == 0;
}

std::string read_text_file(const std::string& path, const std::string& option) {
  const std::string prefix = option.empty() ? "" : option + ": ";
  if (path == "-") {
    return std::string(std::istreambuf_iterator<char>(std::cin), std::istreambuf_iterator<char>());
  }
  const int fd = ::open(path.c_str(), O_RDONLY | O_CLOEXEC);
  if (fd < 0) throw CommandError(prefix + "cannot read " + path + ": " + reason());
  std::string out;
  char buf[65536];
  for (;;) {
    const ssize_t n = ::read(fd, buf, sizeof buf);
    if (n < 0) {
      if (errno == EINTR) continue;
      const std::string why = reason();
      ::close(fd);
      throw CommandError(prefix + "cannot read " + path + ": " + why);
    }
    if (n == 0) break;
    out.append(buf, static_cast<size_t>(n));
  }
  ::close(fd);
  return out;
}

void write_text_file_atomic(const std::string& path, const std::string& text, bool keep_backup) {
  if (path == "-") {
    std::cout << text << std::flush;
    return;
  }
  mode_t mode = 0644;
  struct stat st {};
  const bool exists = ::stat(path.c_str(), &st) == 0;
  if (exists) {
    if (!S_ISREG(st.st_mode)) throw CommandError(path + " is not a regular file");
    mode = st.st_mode & 07777;
  }
  const std::string tmp = path + ".tmp-" + std::to_string(::getpid());
  ::unlink(tmp.c_str());
  try {
    write_new_synced(tmp, text, mode);
  } catch (const CommandError& e) {  // name the file the user asked for, not only the temporary one
    throw CommandError("cannot write " + path + " (" + e.what() + ")");
  }
  try {
    if (exists && keep_backup) keep_backup_of(path, mode);
  } catch (...) {
    ::unlink(tmp.c_str());
    throw;
  }
  if (::rename(tmp.c_str(), path.c_str()) != 0) {
    const std::string why = reason();
    ::unlink(tmp.c_str());
    throw CommandError("cannot replace " + path + ": " + why);
  }
  sync_directory(directory_of(path));
}

void write_stream_atomic(const std::string& path, const std::function<void(std::ostream&)>& write) {
  if (path == "-") {
    write(std::cout);
    std::cout.flush();
    return;
  }
  const std::string tmp = path + ".tmp-" + std::to_string(::getpid());
  try {
    {
      std::ofstream out(tmp, std::ios::binary | std::ios::trunc);
      if (!out) throw CommandError("cannot create " + tmp + ": " + reason());
      write(out);
      out.flush();
      if (!out) throw CommandError("cannot write " + path + ": " + reason());
    }
    const int fd = ::open(tmp.c_str(), O_RDONLY | O_CLOEXEC);
    if (fd >= 0) {
      (void)::fsync(fd);
      ::close(fd);
    }
    if (::rename(tmp.c_str(), path.c_str()) != 0) throw CommandError("cannot replace " + path + ": " + reason());
  } catch (...) {
    ::unlink(tmp.c_str());
    throw;
  }
  sync_directory(directory_of(path));
}

void write_output(const std::string& path, const std::string& text) {
  try {
    write_text_file_atomic(path.empty() ? std::string("-") : path, text, /*keep_backup=*/false);
  } catch (const CommandError& e) {
    throw CommandError(std::string("--out: ") + e.what());
  }
}

}  // namespace tw::shell
