// tidewright: command-line front end over the Tidewright core.
#include <cstdio>
#include <exception>

#include "commands.hpp"
#include "number_options.hpp"

int main(int argc, char** argv) {
  CLI::App app{"Tidewright: seawater chemistry and dosing advisor for reef and aquaculture systems."};
  app.require_subcommand(1);
  app.set_version_flag("--version", "tidewright 0.1.0");
  tw::shell::register_chem(app);
  tw::shell::register_salinity(app);
  tw::shell::register_buffer(app);
  tw::shell::register_log(app);
  tw::shell::register_demand(app);
  tw::shell::register_plan(app);
  tw::shell::register_mix(app);
  tw::shell::require_plain_numbers(app);
  try {
    app.parse(argc, argv);
  } catch (const CLI::CallForHelp& e) {
    return app.exit(e);
  } catch (const CLI::CallForAllHelp& e) {
    return app.exit(e);
  } catch (const CLI::CallForVersion& e) {
    return app.exit(e);
  } catch (const CLI::ParseError& e) {
    std::fprintf(stderr, "tidewright: %s (see --help)\n", e.what());
    return 2;
  } catch (const tw::shell::ExitStatus& e) {
    return e.code;
  } catch (const tw::shell::CommandError& e) {
    std::fprintf(stderr, "tidewright: %s\n", e.what());
    return 1;
  } catch (const std::exception& e) {
    std::fprintf(stderr, "tidewright: %s\n", e.what());
    return 1;
  }
  return 0;
}
