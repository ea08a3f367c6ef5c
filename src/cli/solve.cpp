// plumb solve: not yet written.
#include "command.hpp"

namespace plumb::cli {
void add_solve(CLI::App& app, Action& action) {
  auto* command = app.add_subcommand("solve", "(not yet available)");
  command->callback([&action] { action = [] { return exit_bad_input; }; });
}
}  // namespace plumb::cli
