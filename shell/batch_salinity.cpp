// `salinity --batch`, streamed (batch_stream.hpp): one record in, one row (CSV) or one array
// element (JSON) out, as they come.
#include <nlohmann/json.hpp>

#include "batch_stream.hpp"
#include "commands.hpp"
#include "stream_io.hpp"
#include "tidewright/common/csv_stream.hpp"

namespace tw::shell {

namespace {
constexpr std::size_t kChunkBytes = std::size_t{1} << 19;

nlohmann::json row_json(const seawater::SalinityBatchRow& row) {
  if (!row.report) return {{"error", row.report.error().message}, {"line", row.line}};
  nlohmann::json j = salinity_report_json(*row.report);
  j["line"] = row.line;
  return j;
}

// "  {...}" indented as nlohmann's dump(2) indents an element of a top-level array.
std::string element_text(const nlohmann::json& j) {
  std::string text = j.dump(2);
  std::string out = "  ";
  for (char c : text) {
    out += c;
    if (c == '\n') out += "  ";
  }
  return out;
}
}  // namespace

BatchCounts run_salinity_batch(const std::string& input, const std::string& out,
                               const seawater::SalinitySample& defaults, bool json) {
  InputChunks in(input, "--batch");
  OutputSink sink(out);
  csv::RecordStream stream;
  std::optional<seawater::SalinityBatchReader> reader;
  std::string chunk, buffer;
  BatchCounts counts;
  bool more = true;
  while (more) {
    more = in.read(chunk, kChunkBytes);
    if (more) {
      stream.append(chunk);
    } else {
      stream.finish();
    }
    csv::RecordStream::Record record;
    while (stream.next(record)) {
      const csv::Row row = csv::to_row(record);
      if (!reader) {
        auto r = seawater::SalinityBatchReader::from_header(row.cells, defaults);
        if (!r) throw CommandError("--batch: " + r.error().message);
        reader = std::move(r).value();
        buffer += json ? "[" : seawater::format_salinity_batch_header();
        continue;
      }
      const seawater::SalinityBatchRow result = reader->describe(row.cells, row.line);
      if (!result.report) ++counts.failed;
      if (json) {
        buffer += counts.rows == 0 ? "\n" : ",\n";
        buffer += element_text(row_json(result));
      } else {
        buffer += seawater::format_salinity_batch_row(result);
      }
      ++counts.rows;
    }
    sink.write(buffer);
    buffer.clear();
    stream.compact();
  }
  if (!stream.error()) throw CommandError("--batch: " + stream.error().error().message);
  if (!reader) throw CommandError("--batch: the CSV text is empty; it needs a header row");
  if (json) sink.write(counts.rows == 0 ? "]\n" : "\n]\n");
  sink.commit();
  return counts;
}

}  // namespace tw::shell
