// shaftwork — rates turbines, compressors and pumps. main() only parses and dispatches.
#include <CLI/CLI.hpp>

int main(int argc, char** argv) {
  CLI::App app{"shaftwork: rate turbines, compressors and pumps"};
  app.require_subcommand(1);
  CLI11_PARSE(app, argc, argv);
  return 0;
}
