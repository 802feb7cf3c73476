// `chem --batch`, streamed (batch_stream.hpp). Per chunk of input: the complete records are
// split into as many contiguous slices as threads, each slice solved by its own
// carbonate::CarbonateBatch into its own buffer, and the buffers written in order.
#include <algorithm>
#include <functional>
#include <thread>
#include <vector>

#include "batch_stream.hpp"
#include "commands.hpp"
#include "stream_io.hpp"
#include "tidewright/common/csv_stream.hpp"

namespace tw::shell {

namespace {
constexpr std::size_t kChunkBytes = std::size_t{1} << 19;  // 512 KB of input per block
constexpr std::size_t kRowsPerThreadMin = 512;             // below this a thread is not worth it
}  // namespace

BatchCounts run_chem_batch(const std::string& input, const std::string& out,
                           const carbonate::BatchOptions& options, int threads) {
  threads = std::max(1, threads);
  InputChunks in(input, "--batch");
  OutputSink sink(out);
  csv::RecordStream stream;
  std::vector<carbonate::CarbonateBatch> workers;
  std::vector<std::string> buffers(static_cast<std::size_t>(threads));
  std::vector<long long> failed(static_cast<std::size_t>(threads), 0);
  std::vector<csv::RecordStream::Record> block;
  std::string chunk;
  BatchCounts counts;

  const auto solve_slice = [&](std::size_t worker, std::size_t begin, std::size_t end) {
    std::string& buffer = buffers[worker];
    for (std::size_t i = begin; i < end; ++i) {
      if (!workers[worker].solve_record(block[i].text, block[i].line, buffer)) ++failed[worker];
    }
  };

  bool more = true;
  while (more) {
    more = in.read(chunk, kChunkBytes);
    if (more) {
      stream.append(chunk);
    } else {
      stream.finish();
    }
    block.clear();
    csv::RecordStream::Record record;
    while (stream.next(record)) {
      if (workers.empty()) {
        carbonate::CarbonateBatch first(options);
        first.start(record.text, buffers[0]);
        workers.assign(static_cast<std::size_t>(threads), first);
        continue;
      }
      block.push_back(record);
    }
    const std::size_t n = block.size();
    const std::size_t used = std::clamp<std::size_t>(n / kRowsPerThreadMin, 1, workers.empty() ? 1 : workers.size());
    if (used == 1) {
      if (n > 0) solve_slice(0, 0, n);
    } else {
      std::vector<std::thread> pool;
      const std::size_t per = (n + used - 1) / used;
      for (std::size_t t = 1; t < used; ++t) {
        pool.emplace_back(solve_slice, t, std::min(n, t * per), std::min(n, (t + 1) * per));
      }
      solve_slice(0, 0, std::min(n, per));
      for (auto& th : pool) th.join();
    }
    counts.rows += static_cast<long long>(n);
    for (std::string& buffer : buffers) {
      sink.write(buffer);
      buffer.clear();  // keeps its capacity for the next block
    }
    stream.compact();
  }
  if (!stream.error()) throw CommandError("--batch: " + stream.error().error().message);
  if (workers.empty()) throw CommandError("--batch: the batch has no header row");
  for (long long f : failed) counts.failed += f;
  sink.commit();
  return counts;
}

}  // namespace tw::shell
