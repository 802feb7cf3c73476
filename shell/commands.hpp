// Each subcommand lives in its own shell/cmd_<name>.cpp and registers itself on the app.
// A subcommand's callback throws CommandError for bad input; main() prints the one-line reason
// and exits with status 2 (usage) or 1 (failure).
#pragma once

#include <stdexcept>
#include <string>

#include <CLI/CLI.hpp>

namespace tw::shell {

struct CommandError : std::runtime_error {
  using std::runtime_error::runtime_error;
};

// Thrown after a command has written its output, to end with a status other than 0 (e.g. 3 for
// a dose plan that cannot hold the water inside its floors).
struct ExitStatus {
  int code;
};

void register_chem(CLI::App& app);      // carbonate state, one or a CSV batch
void register_salinity(CLI::App& app);  // specific gravity <-> conductivity <-> salinity
void register_buffer(CLI::App& app);    // hatchery buffering: flow, batch, pump table
void register_log(CLI::App& app);       // the tank journal: add, import, export, list
void register_demand(CLI::App& app);    // consumption estimate per system from the journal
void register_plan(CLI::App& app);      // dose plan within safety limits, with exports
void register_mix(CLI::App& app);       // stock solution recipes both ways

}  // namespace tw::shell
