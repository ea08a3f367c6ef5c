// plumb explain: why a model is infeasible, as a proven irreducible infeasible subsystem.
#include "plumb/explain/explain.hpp"
#include "command.hpp"
#include "plumb/certificate/certificate.hpp"
#include "plumb/explain/ways_out.hpp"
#include "plumb/present/explain.hpp"
#include "plumb/present/output.hpp"
#include "plumb/run/budget.hpp"

#include <chrono>
#include <cstdio>
#include <filesystem>
#include <iostream>
#include <optional>

#include <unistd.h>

namespace plumb::cli {
namespace {

struct ExplainCommandOptions {
  ModelOptions model;
  std::string certificate_path;
  bool json = false;
  bool by_group = false;
  bool all = false;
  std::string within;
  std::optional<double> time_limit;
  std::optional<std::size_t> memory_limit;
  bool quiet = false;
  std::size_t ways_out = 20;  // members whose single way out is worked out
};

// --all --certificate FILE: conflict k's certificate beside FILE, "blend.json" -> "blend-k.json".
std::string further_certificate_path(const std::string& path, std::size_t k) {
  std::filesystem::path p(path);
  return p.replace_filename(p.stem().string() + "-" + std::to_string(k) + p.extension().string()).string();
}

int run_explain(const ExplainCommandOptions& options) {
  stop_on_interrupt();
  auto start = std::chrono::steady_clock::now();
  model::Model model = load_model(options.model);
  run::Budget budget(options.time_limit, options.memory_limit);
  explain::Options search;
  search.by_group = options.by_group;
  search.all = options.all;
  search.within = options.within;
  if (!options.within.empty()) search.by_group = true;
  search.budget = &budget;
  bool live_progress = !options.quiet && isatty(STDERR_FILENO);
  if (live_progress) search.progress = progress_printer<explain::Progress>(present::explain_progress_line);
  explain::Explanation result = explain::explain(model, search);
  std::optional<explain::WaysOut> ways;
  if (result.outcome == explain::Outcome::infeasible_subsystem && result.verdict.valid &&
      options.ways_out > 0) {
    if (live_progress)
      search.progress(
          {"ways out", static_cast<long>(result.members.size()), result.sub_solves, result.seconds});
    ways = explain::find_ways_out(model, result, &budget, options.ways_out);
  }
  if (live_progress) std::fprintf(stderr, "\r\033[K");
  present::RunFigures figures{std::chrono::duration<double>(std::chrono::steady_clock::now() - start).count(),
                              run::peak_resident_mib()};

  if (result.outcome == explain::Outcome::stopped) {
    std::cerr << "plumb: stopped (" << run::describe(result.stop_reason) << ") after " << result.sub_solves
              << " sub-solves, during " << result.stopped_during
              << "; nothing is certified and no certificate was written\n";
    if (options.json)
      std::cout << present::explain_json(model, result, ways ? &*ways : nullptr, figures).dump(2) << "\n";
    return exit_stopped;
  }
  bool all_valid = result.verdict.valid;
  for (const explain::Explanation& more : result.further) all_valid = all_valid && more.verdict.valid;
  if (!all_valid) {
    std::cerr << "plumb: BUG: the independent checker rejected the explanation (" << result.verdict.failure
              << "); nothing is reported\n";
    return exit_certificate_invalid;
  }
  if (!options.certificate_path.empty()) {
    present::write_file(options.certificate_path, certificate::to_json_text(result.certificate),
                        "certificate");
    for (std::size_t k = 0; k < result.further.size(); ++k)
      present::write_file(further_certificate_path(options.certificate_path, k + 2),
                          certificate::to_json_text(result.further[k].certificate), "certificate");
  }
  if (options.json)
    std::cout << present::explain_json(model, result, ways ? &*ways : nullptr, figures).dump(2) << "\n";
  else
    present::write_explain_text(model, result, ways ? &*ways : nullptr, options.certificate_path, std::cout);
  if (result.outcome == explain::Outcome::feasible) return exit_ok;
  // A stopped --all has reported the conflicts it found, each proven; the search is incomplete.
  return result.stop_reason == run::StopReason::none ? exit_infeasible : exit_stopped;
}

}  // namespace

void add_explain(CLI::App& app, Action& action) {
  auto options = std::make_shared<ExplainCommandOptions>();
  auto* command = app.add_subcommand(
      "explain", "Find a proven irreducible set of requirements that cannot all hold (an infeasible model)");
  add_model_options(*command, options->model);
  command->add_option("--certificate", options->certificate_path,
                      "Write the certificate (JSON): the subsystem's proof, or a feasible point");
  command->add_flag("--json", options->json, "Print a machine-readable result");
  command->add_flag("--by-group", options->by_group,
                    "Treat each group of requirements (the labels' group) as one requirement");
  command->add_option("--time-limit", options->time_limit, "Stop after S seconds (exit 3, nothing certified)")
      ->check(CLI::PositiveNumber);
  command->add_option("--memory-limit", options->memory_limit, "Stop above MiB of resident memory (exit 3)")
      ->check(CLI::PositiveNumber);
  command->add_option(
      "--within", options->within,
      "With groups: open this group to its single requirements, the other groups staying whole "
      "(implies --by-group)");
  command->add_flag(
      "--all", options->all,
      "Keep going after the first conflict: set one of its requirements aside and search again, until "
      "the rest is feasible (each conflict proven; certificates FILE-2, FILE-3, ... beside --certificate)");
  command->add_option("--ways-out", options->ways_out,
                      "Work out the least change of each of the first N members alone, and the least total "
                      "change (default 20; 0 skips the ways out)");
  command->add_flag("--quiet", options->quiet,
                    "No live progress line on stderr (it is shown only when stderr is a terminal)");
  command->callback([&action, options] { action = [options] { return run_explain(*options); }; });
}

}  // namespace plumb::cli
