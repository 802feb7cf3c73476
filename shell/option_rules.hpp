// The command line's rules that every command shares, written once:
//   1. errors name the option the user typed, not the core's field name;
//   2. a temperature is given in C or in F (never both) and converted by the core's one rule;
//   3. the choices of carbonate constants are parsed the same way wherever they are offered.
#pragma once

#include <optional>
#include <string>
#include <utility>
#include <vector>

#include "commands.hpp"
#include "tidewright/carbonate/carbonate.hpp"
#include "tidewright/common/ranges.hpp"
#include "tidewright/common/result.hpp"

namespace tw::shell {

// ------------------------------------------------------------ 1. errors in the user's words
// A command's table of core field names and the options that set them, e.g.
// {"salinity", "--salinity"}, {"temperature_c", "--temperature-f"} (when given in F).
using FieldOptions = std::vector<std::pair<std::string, std::string>>;

// The option for `field`, or the field itself when the command has none.
std::string option_for(const std::string& field, const FieldOptions& options);

// The core's message with its field names replaced by the options: "salinity 0.5 is outside
// the accepted range 1 to 42" -> "--salinity 0.5 is outside ..."; a message that does not
// start with its field gets the option in front ("--temperature-f: temperature_c 113 ...",
// a temperature given in F keeps the core's C wording behind the option).
std::string message_for_user(const Error& e, const FieldOptions& options);

[[noreturn]] void fail(const Error& e, const FieldOptions& options = {});

template <class T>
T or_fail(Result<T> r, const FieldOptions& options = {}) {
  if (!r) fail(r.error(), options);
  return std::move(r).value();
}

// ------------------------------------------------------------ 2. temperature in C or F
struct TemperatureGiven {
  double celsius;
  bool in_fahrenheit;  // the user typed F: errors and output name the F option
  std::string option;  // the option it came from ("--temperature" or "--temperature-f")
};
// `celsius_option` and `fahrenheit_option` are the option names, e.g. "--temperature" and
// "--temperature-f". Both given: CommandError "give --temperature or --temperature-f, not both".
TemperatureGiven temperature_from_options(const std::optional<double>& celsius, const std::optional<double>& fahrenheit,
                                          const std::string& celsius_option, const std::string& fahrenheit_option,
                                          double fallback_c);

// Refuses a water temperature outside the core's range (ranges::kTemperatureC) in the unit and
// option the user typed: "--temperature-f 120 F is outside the accepted range 28.4 to 104 F"
// (the range in F from the core's journal::accepted_in_unit).
void check_temperature(const TemperatureGiven& t);

// ------------------------------------------------------------ 3. constant choices
struct ConstantChoices {
  carbonate::K1K2Option k1k2;
  carbonate::BoronOption boron;
  carbonate::FluorideOption fluoride;
  carbonate::ConstantsConvention convention;
};
struct ConstantChoiceTexts {
  std::string k1k2 = "lueker2000", boron = "uppstrom1974", fluoride = "perezfraga1987", conventions = "co2sys";
};
// Each refused with the option's name and the accepted names (--k1k2, --boron, --fluoride, --conventions).
ConstantChoices constant_choices(const ConstantChoiceTexts& texts);

}  // namespace tw::shell
