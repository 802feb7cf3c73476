#include "number_options.hpp"

#include <string>

#include "tidewright/common/number_text.hpp"

namespace tw::shell {

namespace {

const CLI::Validator& plain_decimal() {
  static const CLI::Validator v(
      [](std::string& text) -> std::string {
        if (number_text::read_decimal(text)) return "";
        return "'" + text + "' is not a number; write a decimal number such as 8.2 (no hex, inf or nan)";
      },
      "", "plain decimal");
  return v;
}

const CLI::Validator& plain_integer() {
  static const CLI::Validator v(
      [](std::string& text) -> std::string {
        const bool digits_only = text.find_first_not_of("+-0123456789") == std::string::npos;
        if (digits_only && number_text::read_decimal(text)) return "";
        return "'" + text + "' is not a whole number; write digits such as 7";
      },
      "", "plain integer");
  return v;
}

}  // namespace

void require_plain_numbers(CLI::App& app) {
  for (CLI::Option* opt : app.get_options()) {
    const std::string type = opt->get_type_name();
    if (type.find("FLOAT") != std::string::npos) opt->check(plain_decimal());
    else if (type.find("INT") != std::string::npos) opt->check(plain_integer());
  }
  for (CLI::App* sub : app.get_subcommands([](CLI::App*) { return true; })) require_plain_numbers(*sub);
}

}  // namespace tw::shell
