// What `tidewright log` shares with its `schedule` subcommands (defined in cmd_log.cpp):
// --time (or now), and the registration of `log schedule ...` (cmd_log_schedule.cpp).
#pragma once

#include <cstdint>
#include <string>

#include <CLI/CLI.hpp>

namespace tw::shell {

// --time parsed (refused in the future), or now when empty.
// A time without a zone is local time (time_zone.hpp: --utc-offset, --time-zone, else the machine's).
std::int64_t when_or_now(const std::string& text, const std::string& date_order, const std::string& utc_offset,
                         const std::string& time_zone);

// `log schedule ...` under the log command; journal_path and json are the log command's options.
void register_log_schedule(CLI::App& log, const std::string* journal_path, const bool* json);

// `log edit event|system` and `log undo` (cmd_log_edit.cpp).
void register_log_edit(CLI::App& log, const std::string* journal_path, const bool* json);

}  // namespace tw::shell
