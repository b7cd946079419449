// The subcommands of shaftwork: each registers its options on a CLI11 subcommand
// and, when chosen, runs and stores the process exit status in `exit_status`.
#pragma once

#include <CLI/CLI.hpp>

namespace shaftwork::cli {

// Exit statuses (the contract): every case rated; some case failed; the command
// line or a whole file could not be used; every case rated, but a guarantee not met (rate)
// or a check failed (an expectation or a baseline key of `check`). The highest applicable
// wins in the order 2, 1, 3, 0.
inline constexpr int kExitOk = 0;
inline constexpr int kExitCaseFailed = 1;
inline constexpr int kExitUnusable = 2;
inline constexpr int kExitCheckFailed = 3;
inline constexpr int kExitGuaranteeFailed = kExitCheckFailed;  // the same status: a guarantee not met

struct Subcommand {
  const char* name;
  const char* summary;
  void (*install)(CLI::App& sub, int& exit_status);
};

void install_rate(CLI::App& sub, int& exit_status);
void install_state(CLI::App& sub, int& exit_status);
void install_fluids(CLI::App& sub, int& exit_status);
void install_check(CLI::App& sub, int& exit_status);

inline constexpr Subcommand kSubcommands[] = {
    {"rate", "Rate every case in JSON case files, or every row of a CSV of test points with --case", install_rate},
    {"state", "Print the thermodynamic state of a fluid at a pressure and T, h or s", install_state},
    {"fluids", "List the named fluids, species and property models with their ranges", install_fluids},
    {"check", "Rate case files and directories and compare with their expect blocks and a baseline (for CI)",
     install_check},
};

}  // namespace shaftwork::cli
