// Numbers on the command line follow the one rule for numbers people type
// (tidewright/common/number_text.hpp): plain decimals only; 0x10, inf, nan, 1e999 are refused
// with the option's name before any command runs.
#pragma once

#include <CLI/CLI.hpp>

namespace tw::shell {

// Puts the rule on every FLOAT and INT option of `app` and of all its subcommands (call once
// after every command is registered).
void require_plain_numbers(CLI::App& app);

}  // namespace tw::shell
