// The one solve path: float search for a basis, exact certification and repair from it, exact
// fallback; then the certificate and its independent check.
#include "plumb/exact/solve.hpp"

#include "auxiliary.hpp"
#include "engine.hpp"
#include "solve_path.hpp"
#include "plumb/certificate/basis.hpp"
#include "plumb/simplex/float_simplex.hpp"

#include <algorithm>
#include <chrono>
#include <functional>
#include <limits>
#include <optional>

namespace plumb::exact {
namespace {

double seconds_since(std::chrono::steady_clock::time_point start) {
  return std::chrono::duration<double>(std::chrono::steady_clock::now() - start).count();
}

}  // namespace

namespace detail {

std::function<void(const simplex::FloatProgress&)> float_progress(const SolveOptions& options, const std::string& prefix) {
  if (!options.progress) return {};
  auto clock = std::chrono::steady_clock::now();
  return [&options, prefix, clock](const simplex::FloatProgress& p) {
    double elapsed = options.budget ? options.budget->elapsed_seconds() : seconds_since(clock);
    options.progress(Progress{prefix + p.phase, p.iterations, p.objective, p.infeasibility, elapsed});
  };
}

// Rounds of LP iterative refinement before exact repair (A. M. Gleixner, D. E. Steffy and
// K. Wolter, "Iterative refinement for linear programming", INFORMS J. Computing 28, 2016): when a
// basis's exact solution is slightly infeasible or its reduced costs slightly wrong, the float
// search re-solves the correction problem from that basis, where those violations are of order
// one, and the basis it ends at is certified afresh.  A round costs one float solve from a warm
// start; exact pivots on long fractions can cost seconds each.
constexpr int correction_rounds = 4;

bool certify_with_corrections(RationalEngine& engine, const model::Model& model, const SolveOptions& options,
                              simplex::Basis& basis, SolveStats& stats) {
  for (int round = 0;; ++round) {
    simplex::CorrectionProblem correction;
    if (engine.certify_by_refinement(basis, round < correction_rounds ? &correction : nullptr)) return true;
    if (correction.cost.empty()) return false;
    simplex::FloatOptions search;
    search.budget = options.budget;
    search.warm_start = &basis;
    search.correction = &correction;
    search.progress = float_progress(options, "correction: ");
    simplex::FloatResult corrected = simplex::solve_float(model, search);
    stats.correction_rounds = round + 1;
    stats.approximate_corrections += engine.correction_was_approximate();
    stats.correction_iterations += corrected.iterations;
    if (corrected.status != simplex::FloatStatus::optimal) return false;
    basis = std::move(corrected.basis);
  }
}

}  // namespace detail

namespace {

// A float search from another start, for when the first ends infeasible at a row of B^-1 that
// refinement cannot make exact: the second often ends at another row that it can.  gran
// (../shared/netlib-infeas) under the feasibility goal, on a session with row 1 of its proof
// freed: the least-infeasibility LP took 1.4 s after a warm search, a cold search and its row
// 75 ms; solved cold with row 419 freed, 1.3 s after the crash basis's search, a search from the
// logical basis and its row 0.14 s.  Searched once, on demand.
struct SecondSearch {
  std::function<simplex::FloatResult()> search;
  std::optional<simplex::FloatResult> found;
  double seconds = 0;
  bool used = false;  // its row proved the outcome
};

// The exact engine's part of run_exact.
Solution engine_solution(const model::Model& model, const SolveOptions& options, const simplex::Basis* start,
                         const simplex::FloatResult* found, SecondSearch* second) {
  SolveStats correction_stats;
  detail::RationalEngine engine(model, options.budget, &options.progress);
  bool repaired = false;
  const char* proof = "rational basis";  // start_from's exact LU, then no pivot
  const bool may_refine_row = found && found->status == simplex::FloatStatus::infeasible &&
                              !options.few_multipliers && options.fault != Fault::row_not_refined &&
                              options.fault != Fault::auxiliary_not_refined &&
                              options.fault != Fault::auxiliary_search_fails;
  bool row_refined = may_refine_row && options.fault != Fault::first_row_not_refined &&
                     engine.certify_infeasible_row_by_refinement(*start, found->ray_variable);
  if (may_refine_row && !row_refined && second) {
    auto clock = std::chrono::steady_clock::now();
    second->found = second->search();
    second->seconds = seconds_since(clock);
    row_refined = second->used =
        second->found->status == simplex::FloatStatus::infeasible &&
        engine.certify_infeasible_row_by_refinement(second->found->basis, second->found->ray_variable);
  }
  std::optional<Solution> proven;
  if (found && found->status == simplex::FloatStatus::infeasible && !row_refined)
    proven = detail::prove_infeasible(model, options, *start, correction_stats);
  else if (found && found->status == simplex::FloatStatus::unbounded)
    proven = detail::prove_unbounded(model, options, *start, correction_stats);
  if (proven) return std::move(*proven);

  if (row_refined) {
    proof =
        second && second->used ? "refined row of the inverse, second search" : "refined row of the inverse";
  } else if (!start) {
    engine.start_from_logicals();
  } else if (found && (found->status == simplex::FloatStatus::infeasible ||
                       found->status == simplex::FloatStatus::unbounded)) {
    repaired = engine.start_from(*start);
    if (found->status == simplex::FloatStatus::infeasible && engine.certify_infeasible_row(found->ray_variable))
      proof = "row of the inverse";
    else if (found->status == simplex::FloatStatus::unbounded && engine.certify_ray(found->ray_variable))
      proof = "edge of the basis";
  } else {
    simplex::Basis basis = *start;
    if (detail::certify_with_corrections(engine, model, options, basis, correction_stats)) proof = "refined basis";
    else repaired = engine.start_from(basis);
  }
  detail::EngineResult result = engine.run();

  Solution solution;
  solution.outcome = result.outcome;
  solution.x = std::move(result.x);
  solution.y = std::move(result.y);
  solution.ray = std::move(result.ray);
  solution.basis = std::move(result.basis);
  solution.stop_reason = result.stop_reason;
  solution.stats = correction_stats;
  solution.stats.exact_iterations = result.iterations;
  solution.stats.phase = result.phase;
  solution.stats.proof = !start || result.iterations > 0 ? "exact pivots" : proof;
  solution.stats.repaired = start && (repaired || result.iterations > 0 || correction_stats.correction_rounds > 0);
  if (solution.outcome == Outcome::optimal) solution.objective = model.objective_value(solution.x);
  return solution;
}

// Runs the exact engine from the given basis (or from the logical basis when null).  `found`, the
// float search's result ending at that basis, lets its claim be proven without pivots: optimality
// by refinement, infeasibility from the row of B^{-1} it names (by refinement, else by the
// least-infeasibility LP, else by rational LU), unboundedness along its edge.
Solution run_exact(const model::Model& model, const SolveOptions& options, const simplex::Basis* start,
                   const simplex::FloatResult* found = nullptr, SecondSearch* second = nullptr) {
  auto clock = std::chrono::steady_clock::now();
  if (options.progress) {  // factorizing the start can take a while before the first pivot
    double nothing_yet = std::numeric_limits<double>::quiet_NaN();
    options.progress(Progress{start ? "exact certify" : "exact start", 0, nothing_yet, nothing_yet,
                              options.budget ? options.budget->elapsed_seconds() : 0});
  }
  Solution solution;
  try {
    solution = engine_solution(model, options, start, found, second);
  } catch (const run::Stopped& stop) {  // inside a factorization or a refinement
    solution.stop_reason = stop.reason;
    solution.stats.phase = stop.progress;
  }
  (start ? solution.stats.certify_seconds : solution.stats.exact_seconds) =
      seconds_since(clock) - (second ? second->seconds : 0);
  return solution;
}

certificate::NamedValues named_nonzeros(const std::vector<Rational>& values, auto name_of) {
  certificate::NamedValues named;
  for (std::size_t k = 0; k < values.size(); ++k)
    if (values[k] != 0) named.emplace_back(name_of(k), values[k]);
  return named;
}

// Makes a result wrong in a way the checker must see: an objective one off, or a Farkas vector
// (in either form) or ray of zeros.
void spoil(Solution& solution) {
  solution.objective += 1;
  for (certificate::FarkasTerm& term : solution.farkas) term.multiplier = 0;
  for (auto* values : {&solution.y, &solution.ray})
    if (solution.outcome != Outcome::optimal) std::fill(values->begin(), values->end(), Rational(0));
}

// The first row or column whose lower limit is above its upper one, as an infeasible solution
// proven by those two limits alone (lower - upper > 0 while the entries cancel), or nothing.
std::optional<Solution> crossed_limits(const model::Model& model) {
  auto crossed = [&](certificate::EntryKind kind, const std::string& name) {
    Solution solution;
    solution.outcome = Outcome::infeasible;
    solution.y.assign(model.rows.size(), Rational(0));
    solution.farkas = {{{kind, name, certificate::Limit::lower}, Rational(1)},
                       {{kind, name, certificate::Limit::upper}, Rational(1)}};
    solution.stats.proof = "crossed limits";
    return solution;
  };
  for (const model::Row& row : model.rows)
    if (row.lower && row.upper && *row.lower > *row.upper)
      return crossed(certificate::EntryKind::row, row.name);
  for (const model::Column& column : model.columns)
    if (column.lower && column.upper && *column.lower > *column.upper)
      return crossed(certificate::EntryKind::column, column.name);
  return std::nullopt;
}

}  // namespace

Solution solve(const model::Model& model, const SolveOptions& options) {
  return detail::solve_from(model, options, {});
}

Solution detail::solve_from(const model::Model& model, const SolveOptions& options,
                            const SearchStart& start) {
  if (std::optional<Solution> crossed = crossed_limits(model)) return *crossed;
  if (options.warm_start) return run_exact(model, options, options.warm_start);
  if (options.method == Method::exact) return run_exact(model, options, nullptr);

  auto clock = std::chrono::steady_clock::now();
  simplex::FloatOptions search;
  search.budget = options.budget;
  search.warm_start = start.basis;
  search.warm_weights = start.weights;
  search.warm_start_from_zero_costs = start.from_zero_costs;
  search.cost_search_start = start.cost_search_basis;
  search.cost_search_weights = start.cost_search_weights;
  search.progress = detail::float_progress(options, "float ");
  simplex::FloatResult found = start.float_model ? simplex::solve_float(start.float_model(), search)
                                                 : simplex::solve_float(model, search);
  if (options.fault == Fault::float_search_fails) {
    found.status = simplex::FloatStatus::failed;
    found.note = "failure injected";
  }
  double float_seconds = seconds_since(clock);
  Solution solution;
  if (found.status == simplex::FloatStatus::stopped) {
    solution.stop_reason = options.budget ? options.budget->reason() : run::StopReason::interrupted;
    solution.stats.phase = "float search";
  } else if (found.status == simplex::FloatStatus::failed) {
    // Where the search gave up is usually near an optimal basis (it failed to clean one up):
    // refinement may still prove it, and the exact engine starts there rather than from the
    // logical basis (gosh's ways out: minutes of exact pivots from the logical basis).
    solution = run_exact(model, options, &found.basis, &found);
    solution.stats.fell_back = true;
    solution.stats.float_note = found.note;
  } else {
    // From scratch after a warm start.  After a cold one, the search on the costs alone when the
    // zero-cost search gave the row (from the logical basis it would end there again), else the
    // search on the costs from the other cold start (the zero-cost search starts at the logical
    // basis either way).
    SecondSearch second;
    second.search = [&] {
      simplex::FloatOptions other = search;
      if (start.basis) {
        other.warm_start = nullptr;
        other.warm_weights = nullptr;
        other.warm_start_from_zero_costs = false;
        other.cost_search_start = nullptr;
        other.cost_search_weights = nullptr;
      } else if (found.zero_cost_search) {
        other.feasibility_search = false;
      } else {
        other.crash = !search.crash;
      }
      return start.float_model ? simplex::solve_float(start.float_model(), other)
                               : simplex::solve_float(model, other);
    };
    solution = run_exact(model, options, &found.basis, &found, &second);
    if (second.found) {  // its iterations count; its basis, when used, is where the next search starts
      float_seconds += second.seconds;
      found.iterations += second.found->iterations;
      if (second.used) {
        found.dual_weights = std::move(second.found->dual_weights);
        found.zero_cost_search = second.found->zero_cost_search;
      }
    }
  }
  if (start.weights_found) *start.weights_found = std::move(found.dual_weights);
  solution.stats.float_seconds = float_seconds;
  solution.stats.float_iterations = found.iterations;
  solution.stats.zero_cost_search = found.zero_cost_search;
  return solution;
}

certificate::Certificate make_certificate(const model::Model& model, const Solution& solution,
                                          bool with_basis) {
  certificate::Certificate proof;
  proof.model = certificate::identify(model);
  auto column_name = [&model](std::size_t j) { return model.columns[j].name; };
  auto row_name = [&model](std::size_t i) { return model.rows[i].name; };
  switch (solution.outcome) {
    case Outcome::optimal:
      proof.status = certificate::Status::optimal;
      proof.objective = solution.objective;
      proof.x = named_nonzeros(solution.x, column_name);
      proof.y = named_nonzeros(solution.y, row_name);
      break;
    case Outcome::infeasible:
      proof.status = certificate::Status::infeasible;
      if (solution.farkas.empty())
        proof.y = named_nonzeros(solution.y, row_name);
      else
        proof.farkas = solution.farkas;
      break;
    case Outcome::unbounded:
      proof.status = certificate::Status::unbounded;
      proof.x = named_nonzeros(solution.x, column_name);
      proof.ray = named_nonzeros(solution.ray, column_name);
      break;
    case Outcome::stopped:
      throw std::logic_error("make_certificate: a stopped solve proves nothing");
  }
  // For warm starts and readers; the checker ignores it (docs/certificates.md, extra keys).
  if (with_basis && !solution.basis.empty())
    proof.extra["basis"] = certificate::basis_json(model, solution.basis);
  return proof;
}

CertifiedSolution detail::verified_solve(const model::Model& model, const SolveOptions& options,
                                         const SearchStart& start) {
  CertifiedSolution result;
  result.solution = solve_from(model, options, start);
  for (int attempt = 0;; ++attempt) {
    if (result.solution.outcome == Outcome::stopped) {
      result.certificate = {};
      result.verdict = {false, "", "stopped before a result: " + run::describe(result.solution.stop_reason)};
      return result;
    }
    if (attempt == 0 && options.fault == Fault::result_corrupted) spoil(result.solution);
    result.certificate = make_certificate(model, result.solution, options.certificate_extras);
    result.verdict = check::verify(model, result.certificate);
    if (result.verdict.valid) return result;
    bool pure = options.method == Method::exact && !options.warm_start;
    result.rejections.push_back("the checker rejected the " + std::string(pure || attempt > 0 ? "exact engine's" : "solve path's") +
                                " " + certificate::to_string(result.certificate.status) +
                                " result: " + result.verdict.failure);
    if (pure || attempt > 0) return result;
    SolveOptions from_scratch = options;
    from_scratch.method = Method::exact;
    from_scratch.warm_start = nullptr;
    result.solution = solve(model, from_scratch);
  }
}

}  // namespace plumb::exact
