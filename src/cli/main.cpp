// shaftwork — rates turbines, compressors and pumps. main() only parses and dispatches.
#include <exception>
#include <iostream>
#include <new>

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
  // Each command turns its own errors (shaftwork::Error) into messages and exit statuses.
  // What reaches here is the last resort: nothing may end the program with an abort, and
  // unwinding to here removes any temporary output file on the way.
  try {
    app.parse(argc, argv);
  } catch (const CLI::ParseError& e) {
    const int code = app.exit(e);
    return code == 0 ? kExitOk : kExitUnusable;
  } catch (const std::bad_alloc&) {
    std::cerr << "error: out of memory\n";
    return kExitUnusable;
  } catch (const std::exception& e) {
    std::cerr << "error: " << e.what() << " (an internal error: please report it with the command line)\n";
    return kExitUnusable;
  } catch (...) {
    std::cerr << "error: an unknown internal error (please report it with the command line)\n";
    return kExitUnusable;
  }
  return exit_status;
}
