#include "tidewright/common/number_text.hpp"

#include <cctype>
#include <cmath>
#include <cstdlib>

namespace tw::number_text {

namespace {
bool digit(char c) { return c >= '0' && c <= '9'; }
}  // namespace

std::optional<double> read_decimal(std::string_view text, DecimalMark mark) {
  // Grammar: [+-] digits [mark digits] | [+-] mark digits, then optionally [eE] [+-] digits.
  std::string plain;
  plain.reserve(text.size());
  std::size_t i = 0;
  if (i < text.size() && (text[i] == '+' || text[i] == '-')) plain += text[i++];
  int mantissa_digits = 0;
  while (i < text.size() && digit(text[i])) {
    plain += text[i++];
    ++mantissa_digits;
  }
  if (i < text.size() && (text[i] == '.' || (text[i] == ',' && mark == DecimalMark::PointOrComma))) {
    plain += '.';
    ++i;
    while (i < text.size() && digit(text[i])) {
      plain += text[i++];
      ++mantissa_digits;
    }
  }
  if (mantissa_digits == 0) return std::nullopt;
  if (i < text.size() && (text[i] == 'e' || text[i] == 'E')) {
    plain += 'e';
    ++i;
    if (i < text.size() && (text[i] == '+' || text[i] == '-')) plain += text[i++];
    int exponent_digits = 0;
    while (i < text.size() && digit(text[i])) {
      plain += text[i++];
      ++exponent_digits;
    }
    if (exponent_digits == 0) return std::nullopt;
  }
  if (i != text.size()) return std::nullopt;
  char* end = nullptr;
  const double v = std::strtod(plain.c_str(), &end);
  if (end != plain.c_str() + plain.size() || !std::isfinite(v)) return std::nullopt;
  return v;
}

Result<double> read_decimal_or_error(const std::string& field, std::string_view text, DecimalMark mark) {
  if (auto v = read_decimal(text, mark)) return *v;
  return Error{field, field + " '" + std::string(text) + "' is not a number; write a decimal number such as 8.2" +
                          (mark == DecimalMark::PointOrComma ? " or 8,2" : "")};
}

}  // namespace tw::number_text
