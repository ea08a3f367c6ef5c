// plumb report: solves a model exactly, then writes one self-contained document (HTML or
// Markdown) of what was analysed, found and proven, and how to check it again.
#include "plumb/present/report.hpp"
#include "command.hpp"
#include "plumb/audit/audit.hpp"
#include "plumb/certificate/certificate.hpp"
#include "plumb/exact/solve.hpp"
#include "plumb/explain/explain.hpp"
#include "plumb/explain/ways_out.hpp"
#include "plumb/health/health.hpp"
#include "plumb/model/read.hpp"
#include "plumb/present/explain.hpp"
#include "plumb/run/budget.hpp"

#include <chrono>
#include <ctime>
#include <filesystem>
#include <fstream>
#include <iostream>
#include <iterator>
#include <optional>
#include <sstream>

namespace plumb::cli {
namespace {

struct ReportCommandOptions {
  ModelOptions model;
  std::string plan_path;
  std::string duals_path;
  std::string output;
  std::string format;  // "html" or "md"; empty: from the output's extension, else html
  std::optional<double> time_limit;
};

present::ReportFile describe_file(const std::string& path) {
  std::ifstream in(path, std::ios::binary);
  std::string bytes{std::istreambuf_iterator<char>(in), std::istreambuf_iterator<char>()};
  if (!in && !in.eof()) throw model::InputError({path}, "a file that cannot be read", "a readable file");
  return {path, model::sha256_hex(bytes), bytes.size()};
}

std::string utc_now() {
  std::time_t now = std::chrono::system_clock::to_time_t(std::chrono::system_clock::now());
  std::tm parts{};
  gmtime_r(&now, &parts);
  char text[32];
  std::strftime(text, sizeof text, "%Y-%m-%dT%H:%M:%SZ", &parts);
  return text;
}

// Reads the plan (and duals) before anything is solved, so that a bad file stops the command at
// once; the audit itself runs after the solve, against its certified optimum.
struct PlanForReport {
  audit::Values plan;
  std::optional<audit::Values> duals;
  present::AuditRequest request;
};

std::optional<PlanForReport> read_plan(const ReportCommandOptions& options, const model::Model& model) {
  if (options.plan_path.empty()) {
    if (!options.duals_path.empty())
      throw model::InputError({options.duals_path}, "duals without a plan", "--duals together with --plan");
    return std::nullopt;
  }
  PlanForReport read{audit::read_values(options.plan_path, model, audit::NamesOf::columns), std::nullopt, {}};
  read.request.plan_path = options.plan_path;
  read.request.plan_format = read.plan.format;
  if (!options.duals_path.empty()) {
    read.duals = audit::read_values(options.duals_path, model, audit::NamesOf::rows);
    read.request.duals_path = options.duals_path;
  }
  read.request.options.solve_optimum = false;  // the report's own solve is the optimum
  return read;
}

constexpr std::size_t report_ways_out = 20;  // members whose single way out the report works out

std::string default_output(const std::string& model_path, bool markdown) {
  std::filesystem::path path(model_path);
  if (path.extension() == ".gz") path.replace_extension();
  return path.filename().replace_extension(markdown ? ".report.md" : ".report.html").string();
}

void write_text_file(const std::string& path, const std::string& text, const char* what) {
  std::ofstream out(path, std::ios::binary);
  out << text;
  if (!out.flush()) throw model::InputError({path}, std::string("a ") + what + " that cannot be written", "a writable path");
}

// An infeasible model's conflict from plumb explain (a proven IIS, its derivation and ways out);
// the solve's own Farkas multipliers when explain stops or finds nothing to say.
std::optional<present::ConflictSection> conflict_of(const model::Model& model,
                                                    const exact::CertifiedSolution& result,
                                                    run::Budget& budget) {
  if (result.solution.outcome != exact::Outcome::infeasible) return std::nullopt;
  explain::Options search;
  search.budget = &budget;
  explain::Explanation explanation = explain::explain(model, search);
  bool proven = explanation.verdict.valid && (explanation.outcome == explain::Outcome::infeasible_subsystem ||
                                              explanation.outcome == explain::Outcome::inconsistent);
  if (!proven) return present::conflict_from_farkas(model, result);
  std::optional<explain::WaysOut> ways;
  if (explanation.outcome == explain::Outcome::infeasible_subsystem)
    ways = explain::find_ways_out(model, explanation, &budget, report_ways_out);
  return present::conflict_from_explanation(model, explanation, ways ? &*ways : nullptr);
}

int run_report(const ReportCommandOptions& options) {
  stop_on_interrupt();
  bool markdown = options.format == "md" || (options.format.empty() && options.output.ends_with(".md"));
  model::Model model = load_model(options.model);
  std::optional<PlanForReport> plan = read_plan(options, model);
  health::HealthReport health = health::inspect(model);
  run::Budget budget(options.time_limit, std::nullopt);
  exact::SolveOptions solve;
  solve.budget = &budget;
  exact::CertifiedSolution result = exact::certified_solve(model, solve);
  for (const std::string& rejection : result.rejections) std::cerr << "plumb: BUG: " << rejection << "\n";
  bool stopped = result.solution.outcome == exact::Outcome::stopped;
  if (!stopped && !result.certified()) {
    std::cerr << "plumb: the independent checker rejected every result (" << result.verdict.failure
              << "); no report is written\n";
    return exit_certificate_invalid;
  }

  std::string output = options.output.empty() ? default_output(options.model.path, markdown) : options.output;
  present::ReportInput input;
  input.model = &model;
  input.health = &health;
  input.result = &result;
  input.run.command = command_line();
  input.run.utc_time = utc_now();
  input.run.version = PLUMB_VERSION;
  input.run.model_file = describe_file(options.model.path);
  if (!model.source.labels_path.empty()) input.run.labels_file = describe_file(model.source.labels_path);
  if (plan) input.run.plan_file = describe_file(options.plan_path);
  if (plan && plan->duals) input.run.duals_file = describe_file(options.duals_path);
  if (!stopped) {
    input.certificate.text = certificate::to_json_text(result.certificate);
    input.certificate.sha256 = model::sha256_hex(input.certificate.text);
    if (markdown) {
      std::filesystem::path sibling(output == "-" ? default_output(options.model.path, true) : output);
      input.certificate.sibling_path = sibling.replace_extension(".certificate.json").string();
      write_text_file(input.certificate.sibling_path, input.certificate.text, "certificate");
    }
  }
  input.conflict = conflict_of(model, result, budget);
  if (plan && !stopped) {
    if (plan->duals) plan->request.options.duals = &plan->duals->values;
    audit::Audit audited = audit::run_audit(model, plan->plan, plan->request.options);
    input.audit = present::audit_section_from(model, audited, plan->request, result);
  }
  std::ostringstream text;
  present::write_report(input, markdown ? present::ReportFormat::markdown : present::ReportFormat::html, text);
  if (output == "-") std::cout << text.str();
  else write_text_file(output, text.str(), "report");
  if (output != "-") std::cerr << "plumb: report written to " << output << " (" << text.str().size() << " bytes)\n";
  if (!input.certificate.sibling_path.empty()) std::cerr << "plumb: certificate written to " << input.certificate.sibling_path << "\n";
  return stopped ? exit_stopped : exit_ok;
}

}  // namespace

void add_report(CLI::App& app, Action& action) {
  auto options = std::make_shared<ReportCommandOptions>();
  auto* command = app.add_subcommand(
      "report", "Solve a model exactly and write one self-contained document of the model, the result and its proof");
  add_model_options(*command, options->model);
  command->add_option(
      "--plan", options->plan_path,
      "A plan from another solver to audit beside the solve (docs/formats.md: CSV, list or JSON)");
  command->add_option("--duals", options->duals_path,
                      "That solver's duals, for a safe bound on the optimum (with --plan)");
  command->add_option("-o,--output", options->output,
                      "Write the report to FILE ('-': standard output); default MODEL.report.html in this folder");
  command->add_option("--format", options->format, "html (default) or md; by default from the output's extension")
      ->check(CLI::IsMember({"html", "md"}));
  command->add_option("--time-limit", options->time_limit, "Stop the solve after S seconds (the report says so; exit 3)")
      ->check(CLI::PositiveNumber);
  command->callback([&action, options] { action = [options] { return run_report(*options); }; });
}

}  // namespace plumb::cli
