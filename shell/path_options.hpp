// File-name options: an empty name (--out '') is refused with the option's name instead of
// quietly meaning "standard output"; "-" is the way to ask for standard output.
#pragma once

#include <string>

#include <CLI/CLI.hpp>

namespace tw::shell {

inline CLI::Validator non_empty_path() {
  return CLI::Validator(
      [](std::string& text) -> std::string {
        if (text.find_first_not_of(" \t") != std::string::npos) return "";
        return "the file name is empty; give a file, or - for standard output";
      },
      "", "file name");
}

}  // namespace tw::shell
