// plumb audit: a plan checked exactly against the model, its gap to the exact optimum proven, and
// the exact optimal plan nearest in support to it.
#pragma once

#include "plumb/audit/evaluate.hpp"
#include "plumb/audit/values.hpp"
#include "plumb/exact/solve.hpp"
#include "plumb/run/budget.hpp"
#include "plumb/simplex/basis.hpp"

#include <optional>
#include <string>
#include <vector>

namespace plumb::audit {

struct AuditOptions {
  Rational tolerance = Rational(1, 1000000);  // relative size of a miss the user tolerates
  std::optional<Rational> gap;                // relative gap the user accepts, when given
  std::optional<Rational> claimed_objective;  // what the other solver said the objective was
  const std::vector<Rational>* duals = nullptr;  // one per row, model sense, when given
  bool solve_optimum = true;  // false: no exact optimum, the duals' bound alone
  run::Budget* budget = nullptr;
};

// Plan objective minus the reference, in the direction of worse: positive when the plan is worse.
struct Gap {
  Rational absolute;
  Rational relative;  // absolute / max(|reference|, 1)
};
Gap gap_between(const model::Model& model, const Rational& plan_objective, const Rational& reference);

enum class Verdict {
  feasible,            // every side and bound met exactly
  within_tolerance,    // missed, but every miss within the tolerance (relative)
  infeasible,          // some miss beyond the tolerance
};

enum class GapVerdict {
  not_asked,      // no --gap
  within,         // proven within G (by the optimum or the duals' bound)
  outside,        // proven outside G
  unknown,        // not proven either way: the solve stopped, or only duals that do not settle it
};

// A column whose value the exact optimum changes.
struct Change {
  int column;
  Rational from, to;
};

struct Audit {
  Evaluation evaluation;
  std::size_t plan_missing = 0;  // columns the plan did not name (counted as zero)
  Verdict verdict = Verdict::feasible;
  std::vector<std::size_t> hard_crossed;  // indices into evaluation.violations of hard limits
  std::optional<DualBound> dual_bound;
  std::optional<Gap> gap_to_bound;           // to the duals' bound (an over-estimate of the gap)
  std::optional<exact::CertifiedSolution> optimum;  // when solved
  simplex::Basis start_basis;                // guessed from the plan
  int start_basics = 0;                      // how many the guess made basic (a basis has one per row)
  bool optimum_from_warm_start = false;      // the warm search from the guess was kept, not given up
  std::optional<Gap> gap_to_optimum;         // when the optimum is certified optimal
  GapVerdict gap_verdict = GapVerdict::not_asked;
  std::vector<Change> changes;               // to the optimum, largest first
  // Wall time of each part, for the benchmark and --json.
  double evaluate_seconds = 0, bound_seconds = 0, optimum_seconds = 0;
};

// The basis a plan suggests: a column strictly inside its bounds is basic, one at a bound (within
// the tolerance, relative) rests there; a row meeting a side (likewise) has its logical there,
// otherwise its logical is basic; then fitted to one basic variable per row and completed by the
// float LU into a regular basis (run_audit guesses at 1e-3 relative, or the audit's tolerance
// when larger).
simplex::Basis guess_basis(const model::Model& model, const std::vector<Rational>& x, const Evaluation& evaluation,
                           const Rational& tolerance);

// Runs the whole audit of plan x.  The optimum is solved warm from guess_basis unless the duals'
// bound already proves the plan within the gap, or options.solve_optimum is false.
Audit run_audit(const model::Model& model, const Values& plan, const AuditOptions& options);

}  // namespace plumb::audit
