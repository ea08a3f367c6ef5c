// plumb inspect: the model-health report, as text or JSON.
#include "command.hpp"
#include "plumb/health/health.hpp"
#include "plumb/present/health.hpp"

#include <iostream>
#include <memory>

namespace plumb::cli {

void add_inspect(CLI::App& app, Action& action) {
  struct Options {
    ModelOptions model;
    bool json = false;
  };
  auto options = std::make_shared<Options>();
  auto* command = app.add_subcommand(
      "inspect", "Report a model's size, kinds of rows and bounds, number ranges and structural trouble, without solving");
  add_model_options(*command, options->model);
  command->add_flag("--json", options->json, "Write the report as JSON (keys in docs/inspect.md)");
  command->callback([&action, options] {
    action = [options] {
      health::HealthReport report = health::inspect(load_model(options->model));
      if (options->json)
        present::write_health_json(report, std::cout);
      else
        present::write_health_text(report, std::cout);
      return exit_ok;
    };
  });
}

}  // namespace plumb::cli
