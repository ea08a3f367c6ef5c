// Internal to the driver: how each subcommand plugs into main, and the options they share.
#pragma once

#include "plumb/model/model.hpp"
#include "plumb/model/read.hpp"

#include <CLI/CLI.hpp>

#include <chrono>
#include <cstdio>
#include <functional>
#include <memory>
#include <string>

namespace plumb::cli {

// Exit statuses, documented in the README.
enum Exit : int {
  exit_ok = 0,
  exit_bad_input = 1,
  exit_stopped = 3,  // a time, memory or interrupt limit was reached; nothing certified
  exit_certificate_invalid = 4,
  exit_other_status = 5,  // plumb check --expect: a valid certificate, but of another status
  exit_plan_infeasible = 5,  // plumb audit: the plan misses a side or bound (within the tolerance or not)
  exit_outside_gap = 6,      // plumb audit: feasible, but not proven within --gap of the best
  exit_infeasible = 10,
  exit_unbounded = 11,
};

// A subcommand's parsed options become one action returning the exit status.
using Action = std::function<int()>;

// The options every command that reads a model shares.
struct ModelOptions {
  std::string path;
  std::string labels;
  bool ignore_objective_rhs = false;
  std::string objective_sense;  // "min", "max" or empty: as the file says
};
void add_model_options(CLI::App& command, ModelOptions& options);
model::Model load_model(const ModelOptions& options);

// Commands that solve call this first: SIGINT and SIGTERM then set run::interrupt_flag(), which
// the readers and every solve loop poll, so the command ends with exit 3 wherever it is.
void stop_on_interrupt();

// A live progress line on stderr, redrawn in place at most four times a second and whenever the
// phase changes; commands install it only when stderr is a terminal, so logs and pipes see nothing
// but warnings.  `render` draws one snapshot (a present:: progress line).
template <class Snapshot>
std::function<void(const Snapshot&)> progress_printer(std::string (*render)(const Snapshot&)) {
  struct Shown {
    std::chrono::steady_clock::time_point at = std::chrono::steady_clock::now();
    std::string phase;
  };
  auto last = std::make_shared<Shown>();
  return [last, render](const Snapshot& p) {
    auto now = std::chrono::steady_clock::now();
    if (p.phase == last->phase && now - last->at < std::chrono::milliseconds(250)) return;
    last->at = now;
    last->phase = p.phase;
    std::fprintf(stderr, "\r\033[K%s", render(p).c_str());
  };
}

// The command line as typed, each word shell-quoted where it needs it (set by main).
const std::string& command_line();

// One function per subcommand; each adds itself to app and sets `action` when chosen.
void add_inspect(CLI::App& app, Action& action);
void add_convert(CLI::App& app, Action& action);
void add_solve(CLI::App& app, Action& action);
void add_check(CLI::App& app, Action& action);
void add_audit(CLI::App& app, Action& action);
void add_report(CLI::App& app, Action& action);
void add_explain(CLI::App& app, Action& action);

}  // namespace plumb::cli
