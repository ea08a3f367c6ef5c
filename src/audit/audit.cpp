// plumb audit's library part (include/plumb/audit/audit.hpp).
#include "plumb/audit/audit.hpp"

#include "plumb/simplex/float_lu.hpp"
#include "plumb/simplex/float_simplex.hpp"

#include <algorithm>
#include <chrono>

namespace plumb::audit {
namespace {

using simplex::VarStatus;

bool near(const Rational& value, const model::Side& side, const Rational& tolerance) {
  return side && relative_to(abs(value - *side), *side) <= tolerance;
}

VarStatus resting_place(const Rational& value, const model::Side& lower, const model::Side& upper,
                        const Rational& tolerance) {
  if (near(value, lower, tolerance)) return VarStatus::at_lower;
  if (near(value, upper, tolerance)) return VarStatus::at_upper;
  if (!lower && !upper && value == 0) return VarStatus::at_zero;
  return VarStatus::basic;
}

// The optimum from a start basis: the float search from it, then exact certification (and
// repair) from where the search ends, as the one solve path does from a cold start.  Exact pivots
// from a guess can take minutes where the float search takes milliseconds.  A guess pays only
// when it is nearly optimal: on Netlib's rounded optima the warm search took about as many
// iterations as a cold one, and on pilot four times as many (25 684 against 6 649), so a warm
// search still running after a tenth of the rows' count in iterations (100 at least) is given up
// and the one solve path runs cold.
// `warm` tells whether the warm search was kept.
exact::CertifiedSolution solve_from(const model::Model& model, const simplex::Basis& start,
                                    run::Budget* budget, bool& warm) {
  const long warm_iteration_cap = std::max(100L, static_cast<long>(model.row_count()) / 10);
  run::Budget warm_budget;
  simplex::FloatOptions search;
  search.budget = &warm_budget;
  search.warm_start = &start;
  search.progress = [&](const simplex::FloatProgress& progress) {
    if (progress.iterations > warm_iteration_cap || (budget && budget->exhausted())) warm_budget.abandon();
  };
  simplex::FloatResult found = simplex::solve_float(model, search);
  exact::SolveOptions options;
  options.budget = budget;
  warm = found.status == simplex::FloatStatus::optimal;
  if (warm) options.warm_start = &found.basis;
  return exact::certified_solve(model, options);
}

// The bound a column nearest to x_j rests at when it leaves a guessed basis.
VarStatus nearest_bound(const model::Column& c, const Rational& value) {
  if (!c.lower && !c.upper) return VarStatus::at_zero;
  bool lower = c.lower && (!c.upper || abs(value - *c.lower) <= abs(value - *c.upper));
  return lower ? VarStatus::at_lower : VarStatus::at_upper;
}

// A basis has one basic variable per row.  A guess with too many drops the basic columns nearest
// a bound.  Then the float LU completes it: where the guess leaves rows uncovered (a degenerate
// vertex has fewer variables strictly inside their bounds than rows) or its columns are dependent,
// the logicals of the rows the factorization could not pivot take the free places, so the basis is
// regular and its vertex is the plan's (up to rounding).  Filling with the logicals of rows met
// with equality, in model order, made singular guesses whose repaired vertex missed hundreds of
// limits (pilot: 684), and the warm search cost four times a cold one.
void fit_basis_count(const model::Model& model, const std::vector<Rational>& x, simplex::Basis& basis) {
  const int m = model.row_count(), n = model.column_count();
  long basic = std::count(basis.columns.begin(), basis.columns.end(), VarStatus::basic) +
               std::count(basis.rows.begin(), basis.rows.end(), VarStatus::basic);
  if (basic > m) {
    std::vector<std::pair<Rational, std::size_t>> nearness;  // distance to the nearest finite bound
    for (std::size_t j = 0; j < basis.columns.size(); ++j) {
      if (basis.columns[j] != VarStatus::basic) continue;
      const model::Column& c = model.columns[j];
      if (!c.lower && !c.upper) continue;
      Rational to_lower = c.lower ? Rational(abs(x[j] - *c.lower)) : Rational(-1);
      Rational to_upper = c.upper ? Rational(abs(x[j] - *c.upper)) : Rational(-1);
      Rational nearest = to_lower < 0 ? to_upper : to_upper < 0 ? to_lower : std::min(to_lower, to_upper);
      nearness.emplace_back(nearest, j);
    }
    std::sort(nearness.begin(), nearness.end());
    for (std::size_t k = 0; k < nearness.size() && basic > m; ++k, --basic) {
      std::size_t j = nearness[k].second;
      basis.columns[j] = nearest_bound(model.columns[j], x[j]);
    }
  }
  // Positions: the basic variables (column j, or row i's logical as n + i), then empty columns
  // for the places still free.
  std::vector<int> members;
  simplex::FloatColumns columns;
  for (int j = 0; j < n; ++j) {
    if (basis.columns[static_cast<std::size_t>(j)] != VarStatus::basic) continue;
    members.push_back(j);
    auto rows = model.matrix.column_rows(j);
    auto values = model.matrix.column_values(j);
    for (std::size_t k = 0; k < rows.size(); ++k) columns.push(rows[k], numeric::to_double(values[k]));
    columns.close();
  }
  for (int i = 0; i < m; ++i) {
    if (basis.rows[static_cast<std::size_t>(i)] != VarStatus::basic) continue;
    members.push_back(n + i);
    columns.push(i, -1.0);
    columns.close();
  }
  if (members.size() > static_cast<std::size_t>(m))
    return;  // free columns alone overfill it: the engine decides
  while (members.size() < static_cast<std::size_t>(m)) {
    members.push_back(-1);
    columns.close();
  }
  simplex::FloatLu lu;
  constexpr double pivot_floor = 1e-9;  // a guess: a doubtful pivot is better replaced by a logical
  if (lu.factorize(m, std::move(columns), pivot_floor)) return;
  for (auto [position, row] : lu.unpivoted()) {
    int leaving = members[static_cast<std::size_t>(position)];
    if (leaving >= n) {
      const model::Row& r = model.rows[static_cast<std::size_t>(leaving - n)];
      basis.rows[static_cast<std::size_t>(leaving - n)] = r.lower   ? VarStatus::at_lower
                                                          : r.upper ? VarStatus::at_upper
                                                                    : VarStatus::at_zero;
    } else if (leaving >= 0) {
      basis.columns[static_cast<std::size_t>(leaving)] = nearest_bound(
          model.columns[static_cast<std::size_t>(leaving)], x[static_cast<std::size_t>(leaving)]);
    }
    basis.rows[static_cast<std::size_t>(row)] = VarStatus::basic;
  }
}

// How near a side or bound a plan's value must be for the guess to rest it there, relative.  A plan
// rounded to 6 significant digits misses its active sides by more than the user's tolerance (each
// value is off by up to 5e-6 relative, and row sums add them up): at 1e-6 the guess made hundreds
// of active rows basic.  Measured on the Netlib audit benchmark (plans rounded to 6 digits): 1e-3
// made the audit of the 91 take 37.3 s against 41.4 s for their solves (1e-4: 39.0 s; 1e-6:
// 48.9 s against 45.0 s); fit2p 0.39 s against 1.5 s.  The guess only steers the float search.
const Rational basis_guess_tolerance{1, 1000};

bool is_hard(const model::Model& model, const Violation& v) {
  if (v.kind == Violation::Kind::row) return model.rows[static_cast<std::size_t>(v.index)].label.hard.value_or(false);
  const model::Column& column = model.columns[static_cast<std::size_t>(v.index)];
  const model::Label& label = v.side == Violation::Side::lower ? column.lower_label : column.upper_label;
  return label.hard.value_or(false);
}

double seconds_since(std::chrono::steady_clock::time_point start) {
  return std::chrono::duration<double>(std::chrono::steady_clock::now() - start).count();
}

GapVerdict judge(const Gap& gap, const Rational& allowed) { return gap.relative <= allowed ? GapVerdict::within : GapVerdict::outside; }

}  // namespace

Gap gap_between(const model::Model& model, const Rational& plan_objective, const Rational& reference) {
  Rational absolute = model.objective.sense == model::Sense::minimise ? Rational(plan_objective - reference)
                                                                      : Rational(reference - plan_objective);
  return {absolute, relative_to(absolute, reference)};
}

simplex::Basis guess_basis(const model::Model& model, const std::vector<Rational>& x, const Evaluation& evaluation,
                           const Rational& tolerance) {
  simplex::Basis basis;
  basis.columns.reserve(model.columns.size());
  for (std::size_t j = 0; j < model.columns.size(); ++j)
    basis.columns.push_back(resting_place(x[j], model.columns[j].lower, model.columns[j].upper, tolerance));
  basis.rows.reserve(model.rows.size());
  for (std::size_t i = 0; i < model.rows.size(); ++i) {
    VarStatus status = resting_place(evaluation.activity[i], model.rows[i].lower, model.rows[i].upper, tolerance);
    basis.rows.push_back(status == VarStatus::at_zero ? VarStatus::basic : status);  // a free row stays basic
  }
  fit_basis_count(model, x, basis);
  return basis;
}

Audit run_audit(const model::Model& model, const Values& plan, const AuditOptions& options) {
  Audit audit;
  audit.plan_missing = plan.missing;
  auto clock = std::chrono::steady_clock::now();
  audit.evaluation = evaluate(model, plan.values);
  const auto& violations = audit.evaluation.violations;
  if (!violations.empty())
    audit.verdict = violations.front().relative <= options.tolerance ? Verdict::within_tolerance : Verdict::infeasible;
  for (std::size_t k = 0; k < violations.size(); ++k)
    if (is_hard(model, violations[k])) audit.hard_crossed.push_back(k);
  bool feasible = audit.verdict == Verdict::feasible;
  audit.evaluate_seconds = seconds_since(clock);

  if (options.duals) {
    clock = std::chrono::steady_clock::now();
    audit.dual_bound = safe_dual_bound(model, *options.duals);
    if (audit.dual_bound->bound) audit.gap_to_bound = gap_between(model, audit.evaluation.objective, *audit.dual_bound->bound);
    audit.bound_seconds = seconds_since(clock);
  }
  if (options.gap) {
    audit.gap_verdict = GapVerdict::unknown;
    // The bound over-estimates the gap: it can prove a plan within G, never outside it.
    if (feasible && audit.gap_to_bound && judge(*audit.gap_to_bound, *options.gap) == GapVerdict::within)
      audit.gap_verdict = GapVerdict::within;
  }
  bool settled = audit.gap_verdict == GapVerdict::within;
  if (options.solve_optimum && !settled) {
    audit.start_basis =
        guess_basis(model, plan.values, audit.evaluation, std::max(options.tolerance, basis_guess_tolerance));
    audit.start_basics = static_cast<int>(std::count(audit.start_basis.columns.begin(), audit.start_basis.columns.end(), VarStatus::basic) +
                                          std::count(audit.start_basis.rows.begin(), audit.start_basis.rows.end(), VarStatus::basic));
    clock = std::chrono::steady_clock::now();
    audit.optimum = solve_from(model, audit.start_basis, options.budget, audit.optimum_from_warm_start);
    audit.optimum_seconds = seconds_since(clock);
    const exact::Solution& s = audit.optimum->solution;
    if (audit.optimum->certified() && s.outcome == exact::Outcome::optimal) {
      audit.gap_to_optimum = gap_between(model, audit.evaluation.objective, s.objective);
      if (options.gap && feasible) audit.gap_verdict = judge(*audit.gap_to_optimum, *options.gap);
      for (std::size_t j = 0; j < s.x.size(); ++j)
        if (s.x[j] != plan.values[j]) audit.changes.push_back({static_cast<int>(j), plan.values[j], s.x[j]});
      std::stable_sort(audit.changes.begin(), audit.changes.end(), [](const Change& a, const Change& b) {
        return abs(a.to - a.from) > abs(b.to - b.from);
      });
    } else if (audit.optimum->certified() && s.outcome == exact::Outcome::unbounded && options.gap && feasible) {
      audit.gap_verdict = GapVerdict::outside;  // every plan is infinitely far from the best
    }
  }
  return audit;
}

}  // namespace plumb::audit
