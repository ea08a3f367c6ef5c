// plumb check: not yet written.
#include "command.hpp"

namespace plumb::cli {
void add_check(CLI::App& app, Action& action) {
  auto* command = app.add_subcommand("check", "(not yet available)");
  command->callback([&action] { action = [] { return exit_bad_input; }; });
}
}  // namespace plumb::cli
