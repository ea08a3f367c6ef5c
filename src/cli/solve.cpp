// plumb solve: solves a model exactly, checks the certificate independently, then reports.
#include "command.hpp"
#include "plumb/certificate/certificate.hpp"
#include "plumb/exact/solve.hpp"
#include "plumb/numeric/rational.hpp"
#include "plumb/run/budget.hpp"

#include <nlohmann/json.hpp>

#include <algorithm>
#include <chrono>
#include <csignal>
#include <cstdio>
#include <fstream>
#include <iostream>
#include <optional>
#include <sstream>

#include <unistd.h>

namespace plumb::cli {
namespace {

using numeric::Rational;

constexpr const char* caution =
    "plumb verifies the mathematics of the model as written; whether the model captures the law or "
    "the specification is for qualified people under local codes.";

// Rows listed for an infeasibility proof unless --all.
constexpr std::size_t listed_rows_by_default = 20;

struct SolveCommandOptions {
  ModelOptions model;
  std::string certificate_path;
  bool json = false;
  bool all = false;
  std::optional<double> time_limit;
  std::optional<std::size_t> memory_limit;
  std::string method = "hybrid";
  bool quiet = false;
};

extern "C" void on_interrupt(int) { run::interrupt_flag().store(true); }

std::string status_words(exact::Outcome outcome) {
  switch (outcome) {
    case exact::Outcome::optimal: return "optimal: the best objective value is proven";
    case exact::Outcome::infeasible: return "infeasible: no point satisfies every row and bound";
    case exact::Outcome::unbounded: return "unbounded: the objective improves without limit";
    case exact::Outcome::stopped: return "stopped before a result";
  }
  return "unknown";
}

std::string constant_convention(const model::Model& model) {
  if (model.source.format.rfind("mps", 0) != 0) return "as stated in the model";
  return model.source.constant_rule == model::ObjectiveConstantRule::negated_rhs
             ? "an MPS RHS entry on the objective row counts as minus the constant"
             : "an MPS RHS entry on the objective row was left out (--ignore-objective-rhs)";
}

int integer_columns(const model::Model& model) {
  return static_cast<int>(std::count_if(model.columns.begin(), model.columns.end(),
                                        [](const model::Column& c) { return c.integer; }));
}

// Adds an exact value as its fraction and its (possibly rounded) decimal.
void put_number(nlohmann::ordered_json& target, const Rational& value) {
  numeric::Decimal decimal = numeric::to_decimal(value);
  target["fraction"] = numeric::to_fraction(value);
  target["decimal"] = decimal.text;
  target["rounded"] = decimal.rounded;
}

// Names with non-zero values (or all, when every index is wanted), in model order.
std::vector<int> listed(const std::vector<Rational>& values, bool all) {
  std::vector<int> indices;
  for (std::size_t k = 0; k < values.size(); ++k)
    if (all || values[k] != 0) indices.push_back(static_cast<int>(k));
  return indices;
}

// One line per index: name, value (with the fraction when the decimal is rounded or longer), the
// unit when the values are in the labelled quantity's own unit, and the label statement.
void print_values(std::ostream& out, const std::vector<int>& indices, const std::vector<Rational>& values,
                  auto name_of, auto label_of, bool own_unit, std::size_t limit) {
  std::size_t width = 0;
  for (int k : indices) width = std::max(width, name_of(k).size());
  std::size_t shown = 0;
  for (int k : indices) {
    if (shown++ == limit) {
      out << "    ... and " << indices.size() - limit << " more (--all lists every one)\n";
      break;
    }
    const model::Label& label = label_of(k);
    std::string value = numeric::to_display(values[k]);
    std::string fraction = numeric::to_fraction(values[k]);
    out << "    " << name_of(k) << std::string(width - name_of(k).size() + 2, ' ') << value;
    if (own_unit && !label.unit.empty()) out << " " << label.unit;
    if (value != fraction) out << "  (= " << fraction << ")";
    if (!label.statement.empty()) out << "  -- " << label.statement;
    out << "\n";
  }
}

void print_text(const model::Model& model, const exact::CertifiedSolution& result, const SolveCommandOptions& options) {
  const exact::Solution& s = result.solution;
  std::ostream& out = std::cout;
  out << "model      " << model.source.path << "\n";
  out << "           sha256 " << model.source.sha256.substr(0, 16) << "...  " << model.row_count() << " rows, "
      << model.column_count() << " columns, " << model.matrix.nonzeros() << " non-zeros\n";
  if (int integers = integer_columns(model))
    out << "note       " << integers << " columns are marked integer: plumb solved the LP relaxation\n";
  out << "status     " << status_words(s.outcome) << "\n";
  auto column_name = [&model](int j) { return model.columns[j].name; };
  auto column_label = [&model](int j) -> const model::Label& { return model.columns[j].label; };
  auto row_name = [&model](int i) { return model.rows[i].name; };
  auto row_label = [&model](int i) -> const model::Label& { return model.rows[i].label; };
  const std::size_t no_limit = static_cast<std::size_t>(-1);
  if (s.outcome == exact::Outcome::optimal) {
    bool maximise = model.objective.sense == model::Sense::maximise;
    std::string shown = numeric::to_display(s.objective), fraction = numeric::to_fraction(s.objective);
    out << "objective  " << shown << (shown == fraction ? "" : "  (= " + fraction + ")") << ", "
        << (maximise ? "maximised" : "minimised") << "\n";
    out << "           includes the objective constant " << numeric::to_fraction(model.objective.constant) << ": "
        << constant_convention(model) << "\n";
    auto indices = listed(s.x, options.all);
    out << "solution   " << (options.all ? "all " : "") << indices.size() << " of " << model.column_count()
        << " columns" << (options.all ? "" : " non-zero")
        << (options.all || static_cast<int>(indices.size()) == model.column_count() ? "" : "; the rest are 0") << "\n";
    print_values(out, indices, s.x, column_name, column_label, true, no_limit);
  } else if (s.outcome == exact::Outcome::infeasible) {
    auto indices = listed(s.y, false);
    out << "proof      Farkas multipliers on " << indices.size()
        << " rows: their weighted sum is a row no point within the bounds can satisfy\n";
    print_values(out, indices, s.y, row_name, row_label, false, options.all ? no_limit : listed_rows_by_default);
  } else if (s.outcome == exact::Outcome::unbounded) {
    auto indices = listed(s.ray, false);
    out << "proof      a feasible point and a direction along which the objective keeps improving\n";
    out << "direction  " << indices.size() << " columns move:\n";
    print_values(out, indices, s.ray, column_name, column_label, true, no_limit);
  }
  out << "checked    " << result.verdict.proven << "\n";
  if (!options.certificate_path.empty()) out << "certificate written to " << options.certificate_path << "\n";
  out << "caution    " << caution << "\n";
}

void print_json(const model::Model& model, const exact::CertifiedSolution& result) {
  const exact::Solution& s = result.solution;
  nlohmann::ordered_json out;
  out["model"] = {{"file", model.source.path},
                  {"sha256", model.source.sha256},
                  {"rows", model.row_count()},
                  {"columns", model.column_count()},
                  {"nonzeros", model.matrix.nonzeros()},
                  {"integer_columns", integer_columns(model)}};
  out["status"] = certificate::to_string(result.certificate.status);
  auto named = [](const certificate::NamedValues& values) {
    nlohmann::ordered_json list = nlohmann::ordered_json::array();
    for (const auto& [name, value] : values) {
      nlohmann::ordered_json item;
      item["name"] = name;
      put_number(item, value);
      list.push_back(std::move(item));
    }
    return list;
  };
  if (s.outcome == exact::Outcome::optimal) {
    put_number(out["objective"], s.objective);
    put_number(out["objective_constant"], model.objective.constant);
    out["objective_constant_rule"] = constant_convention(model);
    out["x"] = named(result.certificate.x);
    out["y"] = named(result.certificate.y);
  } else if (s.outcome == exact::Outcome::infeasible) {
    out["farkas_y"] = named(result.certificate.y);
  } else {
    out["x"] = named(result.certificate.x);
    out["ray"] = named(result.certificate.ray);
  }
  out["checked"] = result.verdict.valid;
  out["proven"] = result.verdict.proven;
  out["stats"] = {{"float_iterations", s.stats.float_iterations},
                  {"exact_iterations", s.stats.exact_iterations},
                  {"repaired", s.stats.repaired},
                  {"fell_back", s.stats.fell_back}};
  out["caution"] = caution;
  std::cout << out.dump(2) << "\n";
}

// A live progress line on stderr, redrawn in place at most four times a second; only on a
// terminal, so logs and pipes see nothing but warnings.
std::function<void(const exact::Progress&)> progress_printer() {
  auto last = std::make_shared<std::chrono::steady_clock::time_point>(std::chrono::steady_clock::now());
  return [last](const exact::Progress& p) {
    auto now = std::chrono::steady_clock::now();
    if (now - *last < std::chrono::milliseconds(250)) return;
    *last = now;
    std::fprintf(stderr, "\r\033[K  %-14s %8ld it  objective ~%-14.8g infeasibility ~%-9.3g %7.1f s", p.phase.c_str(),
                 p.iterations, p.objective, p.infeasibility, p.elapsed_seconds);
  };
}

int run_solve(const SolveCommandOptions& options) {
  model::Model model = load_model(options.model);
  std::signal(SIGINT, on_interrupt);
  std::signal(SIGTERM, on_interrupt);
  run::Budget budget(options.time_limit, options.memory_limit);
  exact::SolveOptions solve;
  solve.method = options.method == "exact" ? exact::Method::exact : exact::Method::hybrid;
  solve.budget = &budget;
  bool live_progress = !options.quiet && isatty(STDERR_FILENO);
  if (live_progress) solve.progress = progress_printer();
  exact::CertifiedSolution result = exact::certified_solve(model, solve);
  if (live_progress) std::fprintf(stderr, "\r\033[K");
  for (const std::string& rejection : result.rejections)
    std::cerr << "plumb: BUG: " << rejection << "\n"
              << "plumb: please report this; the result below, if any, comes from the pure exact engine\n";

  const exact::Solution& s = result.solution;
  if (s.outcome == exact::Outcome::stopped) {
    std::cerr << "plumb: stopped (" << run::describe(s.stop_reason) << ") after " << s.stats.float_iterations
              << " float and " << s.stats.exact_iterations << " exact iterations, in the " << s.stats.phase
              << " phase; nothing is certified and no certificate was written\n";
    return exit_stopped;
  }
  if (!result.certified()) {
    std::cerr << "plumb: the independent checker rejected every result (" << result.verdict.failure
              << "); nothing is reported\n";
    return exit_certificate_invalid;
  }
  if (!options.certificate_path.empty()) {
    std::ofstream file(options.certificate_path, std::ios::binary);
    file << certificate::to_json_text(result.certificate);
    if (!file.flush()) {
      std::cerr << "plumb: cannot write the certificate to " << options.certificate_path << "\n";
      return exit_bad_input;
    }
  }
  if (options.json) print_json(model, result);
  else print_text(model, result, options);
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
