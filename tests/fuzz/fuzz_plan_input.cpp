// libFuzzer target: the plan input file (plan_input_from_json) on arbitrary bytes, as the
// command line reads `tidewright plan FILE` and a plan file imported by hand.
// Checks: no crash, no exception, no sanitizer report; every input that reads is written back
// by plan_input_to_json to a file that reads again, and writing that back gives the very same
// text (the file is a fixed point after one round).
#include <cstddef>
#include <cstdint>
#include <cstdlib>
#include <string>
#include <vector>

#include "tidewright/plan/plan.hpp"

namespace {
void check(bool ok) {
  if (!ok) std::abort();
}
}  // namespace

extern "C" int LLVMFuzzerTestOneInput(const uint8_t* data, size_t size) {
  if (size == 0) return 0;
  // The first byte picks whether the water may be left to a journal (odd) or is required.
  const bool journal_fills = data[0] % 2 == 1;
  const std::string text(reinterpret_cast<const char*>(data + 1), size - 1);
  std::vector<std::string> left;
  auto in = tw::plan::plan_input_from_json(text, journal_fills ? &left : nullptr);
  if (!in.ok()) {
    check(!in.error().field.empty() || !in.error().message.empty());
    return 0;
  }
  if (!left.empty()) return 0;  // the water is still to come from a journal: nothing to write
  auto written = tw::plan::plan_input_to_json(*in);
  if (!written.ok()) return 0;  // an additive with no description a file can hold
  auto again = tw::plan::plan_input_from_json(*written);
  check(again.ok());
  auto rewritten = tw::plan::plan_input_to_json(*again);
  check(rewritten.ok());
  check(*rewritten == *written);
  return 0;
}
