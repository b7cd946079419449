// shaftwork — rates turbines, compressors and pumps. main() only parses and dispatches.
#include <iostream>

#include <CLI/CLI.hpp>

#include "commands.hpp"

int main(int argc, char** argv) {
  using namespace shaftwork::cli;
  CLI::App app{"shaftwork: rate turbines, compressors and pumps from measured or design values"};
  app.require_subcommand(1);
  app.set_version_flag("--version", "shaftwork 0.1.0");
  int exit_status = kExitOk;
  for (const Subcommand& command : kSubcommands) {
    command.install(*app.add_subcommand(command.name, command.summary), exit_status);
  }
  try {
    app.parse(argc, argv);
  } catch (const CLI::ParseError& e) {
    const int code = app.exit(e);
    return code == 0 ? kExitOk : kExitUnusable;
  }
  return exit_status;
}
