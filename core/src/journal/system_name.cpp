// System names: trimming, the rule for a new or changed name, and ids typed as text.
#include "tidewright/journal/system_name.hpp"

#include <fmt/format.h>

namespace tw::journal {

namespace {

bool ascii_space(char c) { return c == ' ' || c == '\t' || c == '\n' || c == '\r' || c == '\v' || c == '\f'; }

// The first control character (C0, DEL, or C1 written in UTF-8 as C2 80..C2 9F), as U+XXXX.
std::optional<unsigned> control_character(const std::string& s) {
  for (std::size_t i = 0; i < s.size(); ++i) {
    const auto c = static_cast<unsigned char>(s[i]);
    if (c < 0x20 || c == 0x7F) return c;
    if (c == 0xC2 && i + 1 < s.size()) {
      const auto d = static_cast<unsigned char>(s[i + 1]);
      if (d >= 0x80 && d <= 0x9F) return d;
    }
  }
  return std::nullopt;
}

}  // namespace

std::string trim_system_name(const std::string& name) {
  std::size_t b = 0, e = name.size();
  while (b < e && ascii_space(name[b])) ++b;
  while (e > b && ascii_space(name[e - 1])) --e;
  return name.substr(b, e - b);
}

std::optional<std::int64_t> id_from_text(const std::string& text) {
  const std::string t = trim_system_name(text);
  std::size_t i = 0;
  if (i < t.size() && (t[i] == '+' || t[i] == '#')) ++i;
  const std::size_t digits = t.size() - i;
  if (digits == 0 || digits > 18) return std::nullopt;
  std::int64_t id = 0;
  for (; i < t.size(); ++i) {
    if (t[i] < '0' || t[i] > '9') return std::nullopt;
    id = id * 10 + (t[i] - '0');
  }
  if (id <= 0) return std::nullopt;
  return id;
}

Status check_system_name(const std::string& name) {
  const std::string trimmed = trim_system_name(name);
  if (trimmed.empty()) {
    return Error{"name", "name is empty; a system name needs 1 to 100 characters other than spaces"};
  }
  if (trimmed != name) {
    return Error{"name", "name '" + name + "' has spaces around it; it is stored trimmed, as '" + trimmed + "'"};
  }
  if (name.size() > kMaxSystemNameChars) {
    return Error{"name", fmt::format("name has {} characters; accepted: 1 to {}", name.size(), kMaxSystemNameChars)};
  }
  if (auto c = control_character(name)) {
    return Error{"name", fmt::format("name contains the control character U+{:04X}; accepted: printable "
                                     "characters only (no tabs or line breaks)",
                                     *c)};
  }
  if (auto id = id_from_text(name)) {
    return Error{"name", fmt::format("name '{}' reads as the id {}; a system name must not be a number "
                                     "(add a letter, e.g. 'tank {}')",
                                     name, *id, name)};
  }
  return Ok{};
}

}  // namespace tw::journal
