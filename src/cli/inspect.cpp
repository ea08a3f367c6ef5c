// plumb inspect: not yet written.
#include "command.hpp"

namespace plumb::cli {
void add_inspect(CLI::App& app, Action& action) {
  auto* command = app.add_subcommand("inspect", "(not yet available)");
  command->callback([&action] { action = [] { return exit_bad_input; }; });
}
}  // namespace plumb::cli
