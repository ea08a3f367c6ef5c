// plumb audit: a plan from another solver checked exactly, its gap to the exact optimum proven.
#include "command.hpp"
#include "plumb/audit/audit.hpp"
#include "plumb/present/audit.hpp"
#include "plumb/run/budget.hpp"

#include <fstream>
#include <iostream>
#include <optional>
#include <sstream>

namespace plumb::cli {
namespace {

struct AuditCommandOptions {
  ModelOptions model;
  std::string plan_path;
  std::string duals_path;
  std::string tolerance = "1e-6";
  std::string gap;
  std::string claimed_objective;
  std::string repaired_path;
  bool json = false;
  bool no_solve = false;
  std::optional<double> time_limit;
};

// An option's number, read exactly like every number plumb reads.
numeric::Rational option_number(const std::string& text, const char* option, bool non_negative) {
  numeric::ParseFailure why;
  std::optional<numeric::Rational> value = numeric::parse_decimal(text, &why);
  if (!value || (non_negative && *value < 0))
    throw model::InputError({option}, "'" + text + "'", non_negative ? "a number of at least 0" : "a decimal number");
  return *value;
}

int exit_status(const audit::Audit& a) {
  // The findings are complete before the optimum is sought, so a plan that misses a limit says so
  // even when the solve stopped.
  if (a.verdict != audit::Verdict::feasible) return exit_plan_infeasible;
  if (a.optimum && a.optimum->solution.outcome == exact::Outcome::stopped) return exit_stopped;
  if (a.gap_verdict == audit::GapVerdict::outside || a.gap_verdict == audit::GapVerdict::unknown) return exit_outside_gap;
  return exit_ok;
}

int run_audit(const AuditCommandOptions& options) {
  stop_on_interrupt();
  model::Model model = load_model(options.model);
  audit::Values plan = audit::read_values(options.plan_path, model, audit::NamesOf::columns);
  present::AuditRequest request;
  request.plan_path = options.plan_path;
  request.plan_format = plan.format;
  request.options.tolerance = option_number(options.tolerance, "--tolerance", true);
  if (!options.gap.empty()) request.options.gap = option_number(options.gap, "--gap", true);
  if (!options.claimed_objective.empty())
    request.options.claimed_objective = option_number(options.claimed_objective, "--claimed-objective", false);
  std::optional<audit::Values> duals;
  if (!options.duals_path.empty()) {
    duals = audit::read_values(options.duals_path, model, audit::NamesOf::rows);
    request.duals_path = options.duals_path;
    request.options.duals = &duals->values;
  }
  request.options.solve_optimum = !options.no_solve;
  run::Budget budget(options.time_limit, std::nullopt);
  request.options.budget = &budget;

  audit::Audit result = audit::run_audit(model, plan, request.options);
  if (result.optimum)
    for (const std::string& rejection : result.optimum->rejections)
      std::cerr << "plumb: BUG: " << rejection << "\n"
                << "plumb: please report this; the optimum below, if any, comes from the pure exact engine\n";
  bool optimal = result.optimum && result.optimum->certified() && result.optimum->solution.outcome == exact::Outcome::optimal;
  if (!options.repaired_path.empty()) {
    if (optimal) {
      std::ostringstream text;
      present::write_repaired_csv(model, result.optimum->solution.x, text);
      std::ofstream file(options.repaired_path, std::ios::binary);
      file << text.str();
      if (!file.flush()) {
        std::cerr << "plumb: cannot write the repaired plan to " << options.repaired_path << "\n";
        return exit_bad_input;
      }
      request.repaired_path = options.repaired_path;
    } else {
      std::cerr << "plumb: no repaired plan written: no certified optimum"
                << (options.no_solve ? " (--no-solve)" : "") << "\n";
    }
  }
  if (result.optimum && result.optimum->solution.outcome == exact::Outcome::stopped)
    std::cerr << "plumb: the exact optimum was not reached: stopped (" << run::describe(result.optimum->solution.stop_reason)
              << "); the findings above it are complete\n";
  if (options.json) std::cout << present::audit_json(model, result, request).dump(2) << "\n";
  else present::write_audit_text(model, result, request, std::cout);
  return exit_status(result);
}

}  // namespace

void add_audit(CLI::App& app, Action& action) {
  auto options = std::make_shared<AuditCommandOptions>();
  auto* command = app.add_subcommand(
      "audit", "Check a plan from another solver exactly: what it misses and by how much, and how far it is from the best");
  add_model_options(*command, options->model);
  command->add_option("plan", options->plan_path, "Plan: CSV name,value, a two-column list, or a JSON object (docs/formats.md)")
      ->required();
  command->add_option("--duals", options->duals_path,
                      "Row duals from the other solver, same forms: a safe bound on the optimum without a solve");
  command->add_option("--tolerance", options->tolerance, "Relative size of a miss still called within tolerance (default 1e-6)");
  command->add_option("--gap", options->gap, "Relative gap to the best possible that is acceptable (exit 6 beyond it)");
  command->add_option("--claimed-objective", options->claimed_objective, "The objective the other solver reported");
  command->add_option("--repaired", options->repaired_path, "Write the exact optimal plan nearest in support as CSV");
  command->add_flag("--json", options->json, "Print a machine-readable result");
  command->add_flag("--no-solve", options->no_solve, "Solve no exact optimum: the gap comes from --duals alone");
  command->add_option("--time-limit", options->time_limit, "Stop the exact optimum after S seconds (exit 3)")
      ->check(CLI::PositiveNumber);
  command->callback([&action, options] { action = [options] { return run_audit(*options); }; });
}

}  // namespace plumb::cli
