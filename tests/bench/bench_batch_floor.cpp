// The floor for `tidewright chem --batch` (bench_batch runs it): the same streaming read and
// the same CSV record and number parsing, then 15 numbers printed per row with fmt into a
// reused buffer, and no chemistry. What is left between this and the real batch is the
// chemistry and its bookkeeping.
//   bench_batch_floor FILE > /dev/null     (FILE: a header, then rows of numbers)
#include <fcntl.h>
#include <unistd.h>

#include <charconv>
#include <cstdio>
#include <iterator>
#include <string>
#include <vector>

#include <fmt/format.h>

#include "tidewright/common/csv_stream.hpp"

namespace {

bool parse_double(std::string_view text, double& value) {
  const auto [end, ec] = std::from_chars(text.data(), text.data() + text.size(), value);
  return ec == std::errc{} && end == text.data() + text.size();
}

void write_all(const std::string& text) {
  std::size_t done = 0;
  while (done < text.size()) {
    const ssize_t n = ::write(1, text.data() + done, text.size() - done);
    if (n <= 0) return;
    done += static_cast<std::size_t>(n);
  }
}

}  // namespace

int main(int argc, char** argv) {
  if (argc != 2) {
    std::fprintf(stderr, "usage: bench_batch_floor FILE\n");
    return 2;
  }
  const int fd = ::open(argv[1], O_RDONLY);
  if (fd < 0) return 1;
  tw::csv::RecordStream stream;
  std::vector<std::string_view> cells;
  std::string scratch, chunk(std::size_t{1} << 19, '\0'), out;
  bool header = true, more = true;
  long long rows = 0;
  while (more) {
    const ssize_t n = ::read(fd, chunk.data(), chunk.size());
    more = n > 0;
    if (more) {
      stream.append(std::string_view(chunk.data(), static_cast<std::size_t>(n)));
    } else {
      stream.finish();
    }
    tw::csv::RecordStream::Record record;
    while (stream.next(record)) {
      tw::csv::split_record(record.text, cells, scratch);
      if (header) {
        header = false;
        continue;
      }
      double v[4] = {0, 0, 0, 0};
      for (std::size_t i = 0; i < 4 && i < cells.size(); ++i) parse_double(tw::csv::trim_view(cells[i]), v[i]);
      // 15 numbers of full precision, as the real output has (pH, pCO2, species, Omega ...).
      const double printed[15] = {v[0],        v[1],        v[2],        v[3],
                                  v[2] / v[3], v[3] / v[2], v[0] / v[1], v[1] / v[0],
                                  v[2] * 1e-3 + v[0] / 7, v[3] * 1e-3 + v[1] / 3, v[2] / 9.1,
                                  v[3] / 11.3, v[0] * v[1] / 1e3, v[2] / v[0], v[3] / v[1]};
      auto it = std::back_inserter(out);
      for (double d : printed) fmt::format_to(it, "{},", d);
      out += "\r\n";
      ++rows;
    }
    write_all(out);
    out.clear();
    stream.compact();
  }
  ::close(fd);
  std::fprintf(stderr, "%lld rows\n", rows);
  return 0;
}
