// plumb: the command-line driver.  Parses options and calls one library function per command.
#include "command.hpp"
#include "plumb/present/report.hpp"
#include "plumb/run/budget.hpp"

#include <iostream>
#include <new>
#include <string>

namespace plumb::cli {

namespace {

std::string typed_command;

}  // namespace

const std::string& command_line() { return typed_command; }

// Records argv for reports; the program is named "plumb" whatever path started it.
void record_command_line(int argc, char** argv) {
  typed_command = "plumb";
  for (int k = 1; k < argc; ++k) typed_command += " " + present::shell_quoted(argv[k]);
}

void stop_on_interrupt() { run::stop_on_interrupt_signals(); }

void add_model_options(CLI::App& command, ModelOptions& options) {
  command.add_option("model", options.path, "Model file: MPS (fixed or free, .gz allowed) or .plumb")->required();
  command.add_option("--labels", options.labels, "Labels sidecar CSV (default: MODEL.labels.csv if present)");
  command.add_flag("--ignore-objective-rhs", options.ignore_objective_rhs,
                   "Leave out an MPS RHS entry on the objective row instead of taking its negative "
                   "as the objective constant");
  command.add_option("--objective-sense", options.objective_sense,
                     "min or max: the objective sense, whatever the file says (an MPS file without OBJSENSE minimises)")
      ->check(CLI::IsMember({"min", "max"}));
}

model::Model load_model(const ModelOptions& options) {
  model::ReadOptions read;
  read.labels_path = options.labels;
  if (options.ignore_objective_rhs) read.constant_rule = model::ObjectiveConstantRule::ignored;
  model::Model m = model::read_model(options.path, read);
  if (!options.objective_sense.empty())
    model::set_sense_by_option(m, options.objective_sense == "max" ? model::Sense::maximise : model::Sense::minimise);
  for (const auto& warning : m.warnings) std::cerr << model::format_warning(warning) << "\n";
  if (auto note = model::sense_comment_note(m.source, m.objective.sense); note && note->warn)
    std::cerr << "plumb: warning: " << options.path << ": " << note->text << "\n";
  return m;
}

}  // namespace plumb::cli

int main(int argc, char** argv) {
  using namespace plumb::cli;
  CLI::App app{"plumb: audits linear programs in exact arithmetic, with certificates anyone can check"};
  app.set_version_flag("--version", std::string("plumb ") + PLUMB_VERSION);
  app.require_subcommand(1);
  record_command_line(argc, argv);
  Action action;
  add_inspect(app, action);
  add_convert(app, action);
  add_solve(app, action);
  add_check(app, action);
  add_audit(app, action);
  add_report(app, action);
  add_explain(app, action);
  try {
    app.parse(argc, argv);
  } catch (const CLI::ParseError& e) {
    int status = app.exit(e);
    return status == 0 ? exit_ok : exit_bad_input;
  }
  try {
    return action ? action() : exit_bad_input;
  } catch (const plumb::run::Stopped& stopped) {
    std::cerr << "plumb: stopped (" << plumb::run::describe(stopped.reason) << ") while " << stopped.progress
              << "; nothing is certified and no certificate was written\n";
    return exit_stopped;
  } catch (const plumb::model::InputError& e) {
    std::cerr << "plumb: " << e.what() << "\n";
    return exit_bad_input;
  } catch (const std::bad_alloc&) {
    std::cerr << "plumb: ran out of memory; nothing was certified\n";
    return exit_stopped;
  } catch (const std::exception& e) {
    std::cerr << "plumb: " << e.what() << "\n";
    return exit_bad_input;
  }
}
