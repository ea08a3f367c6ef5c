// plumb solve: solves a model exactly, checks the certificate independently, then reports.
#include "plumb/exact/solve.hpp"
#include "command.hpp"
#include "plumb/certificate/basis.hpp"
#include "plumb/certificate/certificate.hpp"
#include "plumb/present/output.hpp"
#include "plumb/present/solve.hpp"
#include "plumb/run/budget.hpp"

#include <chrono>
#include <cstdio>
#include <future>
#include <iostream>
#include <optional>

#include <unistd.h>

namespace plumb::cli {
namespace {

struct SolveCommandOptions {
  ModelOptions model;
  std::string certificate_path;
  std::string from_basis_path;
  std::string write_basis_path;
  bool json = false;
  bool all = false;
  std::optional<double> time_limit;
  std::optional<std::size_t> memory_limit;
  std::string method = "hybrid";
  bool quiet = false;
};

// The start basis from a file, with a warning on stderr for what does not fit the model: another
// model file, or a count of basic variables other than the row count (the engine repairs that).
simplex::Basis start_basis(const std::string& path, const model::Model& model) {
  certificate::BasisFile file = certificate::read_basis(path, model);
  if (!file.model.sha256.empty() && !model.source.sha256.empty() && file.model.sha256 != model.source.sha256)
    std::cerr << "plumb: warning: " << path << " was saved for another model file (sha256 "
              << file.model.sha256.substr(0, 16) << "..., this one is " << model.source.sha256.substr(0, 16)
              << "...); every name it lists is in this model, so the solve starts from it\n";
  if (file.basic_count != model.row_count())
    std::cerr << "plumb: warning: " << path << " makes " << file.basic_count << " variables basic, but a basis of "
              << "this model has " << model.row_count() << " (one per row); the exact engine repairs it: "
              << "dependent columns leave, row logicals fill the gaps\n";
  return std::move(file.basis);
}

int run_solve(const SolveCommandOptions& options) {
  stop_on_interrupt();
  model::Model model = load_model(options.model);
  run::Budget budget(options.time_limit, options.memory_limit);
  exact::SolveOptions solve;
  solve.method = options.method == "exact" ? exact::Method::exact : exact::Method::hybrid;
  solve.budget = &budget;
  simplex::Basis warm_start;
  if (!options.from_basis_path.empty()) {
    warm_start = start_basis(options.from_basis_path, model);
    solve.warm_start = &warm_start;
  }
  bool live_progress = !options.quiet && isatty(STDERR_FILENO);
  if (live_progress) solve.progress = progress_printer<exact::Progress>(present::progress_line);
  auto clock = std::chrono::steady_clock::now();
  exact::CertifiedSolution result = exact::certified_solve(model, solve);
  present::RunFigures figures{std::chrono::duration<double>(std::chrono::steady_clock::now() - clock).count(),
                              run::peak_resident_mib()};
  if (live_progress) std::fprintf(stderr, "\r\033[K");
  for (const std::string& rejection : result.rejections)
    std::cerr << "plumb: BUG: " << rejection << "\n"
              << "plumb: please report this; the result below, if any, comes from the pure exact engine\n";

  const exact::Solution& s = result.solution;
  if (s.outcome == exact::Outcome::stopped) {
    std::cerr << "plumb: stopped (" << run::describe(s.stop_reason) << ") after " << s.stats.float_iterations
              << " float and " << s.stats.exact_iterations << " exact iterations, during " << s.stats.phase
              << "; nothing is certified and no certificate was written\n";
    if (options.json) std::cout << present::solve_json(model, result, figures).dump(2) << "\n";
    return exit_stopped;
  }
  if (!result.certified()) {
    std::cerr << "plumb: the independent checker rejected every result (" << result.verdict.failure
              << "); nothing is reported\n";
    return exit_certificate_invalid;
  }
  // The certificate's text and the JSON result spell out the same long fractions (30 MB each on
  // maros-r7): built on two cores (maros-r7 and pilot87 end 0.3 to 0.6 s sooner), and nothing is
  // shown before the certificate is on disk.
  std::future<std::string> certificate_text;
  if (!options.certificate_path.empty())
    certificate_text =
        std::async(std::launch::async, [&] { return certificate::to_json_text(result.certificate); });
  std::string json_text = options.json ? present::solve_json(model, result, figures).dump(2) : std::string();
  if (certificate_text.valid())
    present::write_file(options.certificate_path, certificate_text.get(), "certificate");
  if (!options.write_basis_path.empty())
    present::write_file(options.write_basis_path, certificate::to_basis_text(model, s.basis), "basis");
  if (options.json)
    std::cout << json_text << "\n";
  else present::write_solve_text(model, result, {options.all, options.certificate_path, options.write_basis_path}, std::cout);
  switch (s.outcome) {
    case exact::Outcome::infeasible: return exit_infeasible;
    case exact::Outcome::unbounded: return exit_unbounded;
    default: return exit_ok;
  }
}

}  // namespace

void add_solve(CLI::App& app, Action& action) {
  auto options = std::make_shared<SolveCommandOptions>();
  auto* command = app.add_subcommand("solve", "Solve a model exactly and prove the result with a checked certificate");
  add_model_options(*command, options->model);
  command->add_option("--certificate", options->certificate_path, "Write the certificate (JSON) to FILE");
  command->add_option("--from-basis", options->from_basis_path,
                      "Start the exact engine from the basis in FILE (docs/basis.md) instead of searching");
  command->add_option("--write-basis", options->write_basis_path, "Write the final basis (JSON, docs/basis.md) to FILE");
  command->add_flag("--json", options->json, "Print a machine-readable result");
  command->add_flag("--all", options->all, "List every column, zero or not");
  command->add_option("--time-limit", options->time_limit, "Stop after S seconds (exit 3, nothing certified)")
      ->check(CLI::PositiveNumber);
  command->add_option("--memory-limit", options->memory_limit, "Stop above MiB of resident memory (exit 3)")
      ->check(CLI::PositiveNumber);
  command->add_option("--method", options->method, "hybrid: float search, exact certification (default); exact: exact only")
      ->check(CLI::IsMember({"hybrid", "exact"}));
  command->add_flag("--quiet", options->quiet, "No live progress line on stderr (it is shown only when stderr is a terminal)");
  command->callback([&action, options] { action = [options] { return run_solve(*options); }; });
}

}  // namespace plumb::cli
