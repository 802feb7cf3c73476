#include "option_rules.hpp"

#include <cctype>

#include <fmt/format.h>

#include "tidewright/common/units.hpp"
#include "tidewright/journal/journal.hpp"

namespace tw::shell {

std::string option_for(const std::string& field, const FieldOptions& options) {
  for (const auto& [f, option] : options)
    if (f == field) return option;
  return field;
}

namespace {
bool name_char(char c) { return std::isalnum(static_cast<unsigned char>(c)) || c == '_' || c == '-'; }
// The name at msg[at, at + n) stands alone: not part of a longer name (or an option already put in).
bool whole_name_at(const std::string& msg, size_t at, size_t n) {
  return (at == 0 || !name_char(msg[at - 1])) && (at + n >= msg.size() || !name_char(msg[at + n]));
}
}  // namespace

std::string message_for_user(const Error& e, const FieldOptions& options) {
  std::string msg = e.message;
  // Field names with an underscore cannot be ordinary words: replaced wherever they appear
  // (a message may name a second field, e.g. a stock above its solubility at a temperature).
  // Short names ("salinity", "flow") only at the start, where they are the subject.
  const std::string own_option = option_for(e.field, options);
  bool named = false;
  for (const auto& [field, option] : options) {
    // A value the user gave in F reaches the core in C: its wording stays behind the option.
    if (option.size() > 2 && option.compare(option.size() - 2, 2, "-f") == 0) continue;
    if (field.find('_') == std::string::npos) {
      if (msg.rfind(field + " ", 0) == 0) {
        msg = option + msg.substr(field.size());
        named |= field == e.field;
      }
      continue;
    }
    for (size_t at = msg.find(field); at != std::string::npos;) {
      if (!whole_name_at(msg, at, field.size())) {  // "temperature_c" inside "tank_temperature_c"
        at = msg.find(field, at + 1);
        continue;
      }
      msg.replace(at, field.size(), option);
      named |= field == e.field;
      at = msg.find(field, at + option.size());
    }
  }
  if (!named && own_option != e.field) msg = own_option + ": " + msg;
  return msg;
}

void fail(const Error& e, const FieldOptions& options) { throw CommandError(message_for_user(e, options)); }

TemperatureGiven temperature_from_options(const std::optional<double>& celsius, const std::optional<double>& fahrenheit,
                                          const std::string& celsius_option, const std::string& fahrenheit_option,
                                          double fallback_c) {
  if (celsius && fahrenheit) {
    throw CommandError(fmt::format("give {} or {}, not both", celsius_option, fahrenheit_option));
  }
  if (fahrenheit) return {units::temperature_to_celsius(*fahrenheit, units::TemperatureUnit::Fahrenheit), true, fahrenheit_option};
  return {celsius.value_or(fallback_c), false, celsius_option};
}

void check_temperature(const TemperatureGiven& t) {
  if (!t.in_fahrenheit) {
    if (auto r = ranges::check(t.option, t.celsius, ranges::kTemperatureC); !r) throw CommandError(r.error().message);
    return;
  }
  const auto f = units::TemperatureUnit::Fahrenheit;
  const journal::UnitBounds b = or_fail(journal::accepted_in_unit(journal::Parameter::Temperature, "F"));
  // The value as typed (rounded back from C only by the float conversion).
  const double typed = units::temperature_from_celsius(t.celsius, f);
  if (auto r = ranges::check(t.option, typed, ranges::Range{b.lo, b.hi, "F"}); !r) throw CommandError(r.error().message);
}

ConstantChoices constant_choices(const ConstantChoiceTexts& t) {
  return {or_fail(carbonate::k1k2_from_string(t.k1k2, "--k1k2")), or_fail(carbonate::boron_from_string(t.boron, "--boron")),
          or_fail(carbonate::fluoride_from_string(t.fluoride, "--fluoride")),
          or_fail(carbonate::convention_from_string(t.conventions, "--conventions"))};
}

}  // namespace tw::shell
