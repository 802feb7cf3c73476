// The one rule for reading a number typed by a person (command-line options, CSV cells):
// plain decimal notation only -- an optional sign, digits with at most one decimal mark, an
// optional exponent (1e-3). No hexadecimal (0x10), no inf or nan, no spaces inside, finite.
#pragma once

#include <optional>
#include <string>
#include <string_view>

#include "tidewright/common/result.hpp"

namespace tw::number_text {

enum class DecimalMark {
  Point,         // 8.2 only
  PointOrComma,  // 8.2 or 8,2 (a spreadsheet in a comma-decimal locale)
};

// The value of `text` read by the rule above, or nothing.
std::optional<double> read_decimal(std::string_view text, DecimalMark mark = DecimalMark::Point);

// The same, as an Error naming `field` when the text is not a number:
// "<field> 'abc' is not a number; write a decimal number such as 8.2".
Result<double> read_decimal_or_error(const std::string& field, std::string_view text,
                                     DecimalMark mark = DecimalMark::Point);

}  // namespace tw::number_text
