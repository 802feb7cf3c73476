// Free text shown on one line of a listing (a note, a kit name, an older system name): control
// characters are written as escapes so that a multi-line note never breaks a list.
//   backslash -> \\   line feed -> \n   carriage return -> \r   tab -> \t
//   any other C0 control or DEL -> \xNN   C1 control (UTF-8 C2 80..C2 9F) -> \u00NN
// Everything else (spaces at either end included) is kept as it is.
#pragma once

#include <string>

namespace tw::text {

std::string one_line(const std::string& text);

}  // namespace tw::text
