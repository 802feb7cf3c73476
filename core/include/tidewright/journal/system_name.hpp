// The rule for a system's name, and reading an id typed where a system is meant.
//
// A name is what a keeper types after --system, so it must never be mistaken for an id and
// never look like another name: stored trimmed of surrounding white space, 1 to 100
// characters, no control characters (C0, DEL, C1: tabs and line breaks included), and not text
// that id_from_text reads as an id ("2", "+2", "#2", " 2 ").
//
// The rule applies where a system gets a name: journal::add_system and a renaming
// journal::update_system (the command line, the app and the store all go through these).
// A journal written before the rule may hold names it refuses; they still load, list and
// export unchanged (validate_system keeps the older, looser checks), an id always wins over
// such a name when resolving, and `log check` reports them so they can be renamed.
#pragma once

#include <cstdint>
#include <optional>
#include <string>

#include "tidewright/common/result.hpp"

namespace tw::journal {

inline constexpr std::size_t kMaxSystemNameChars = 100;  // bytes of UTF-8, as before the rule

// The text without surrounding ASCII white space (space, tab, CR, LF, VT, FF).
std::string trim_system_name(const std::string& name);

// An id typed by a person: optional surrounding white space, an optional '+' or '#', then 1 to
// 18 digits, and more than 0. Anything else is not an id.
std::optional<std::int64_t> id_from_text(const std::string& text);

// Checks a name that is about to be stored (already trimmed by the caller, or refused for its
// surrounding space). Error field "name", the message says the rule that was broken.
Status check_system_name(const std::string& name);

}  // namespace tw::journal
