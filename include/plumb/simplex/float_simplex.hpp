// Floating-point bounded simplex: finds a (nearly) optimal basis fast; never decides an answer.
#pragma once

#include "plumb/model/model.hpp"
#include "plumb/run/budget.hpp"
#include "plumb/simplex/basis.hpp"

#include <functional>
#include <memory>
#include <string>
#include <vector>

namespace plumb::simplex {

namespace detail {
struct LpData;
}

enum class FloatStatus { optimal, infeasible, unbounded, stopped, failed };

struct FloatProgress {
  std::string phase;  // e.g. "dual phase 1", "dual", "primal clean-up"
  long iterations = 0;
  double objective = 0;
  double infeasibility = 0;
};

// Bounds and costs that replace the model's, on the model's own matrix: the correction problem
// of LP iterative refinement (A. M. Gleixner, D. E. Steffy and K. Wolter, "Iterative refinement
// for linear programming", INFORMS J. Computing 28, 2016).  Its solution is a scaled step from a
// point computed exactly elsewhere, so violations far below double precision there are of order
// one here.
struct CorrectionProblem {
  std::vector<double> lower, upper;  // per variable: columns, then row logicals; +-inf when none
  std::vector<double> cost;          // per variable, minimised
};

// Dual steepest-edge weights per variable (columns, then row logicals): for a basic variable the
// squared norm of its row of B^-1 as the search last had it, 0 for a nonbasic one.  They depend
// on the basis alone, not on limits or costs, so a warm start from the basis they came with
// prices as the search left off; started at 1 instead, a warm dual simplex prices nearly by the
// largest infeasibility (klein2, one row freed: 475 iterations warm against 279 cold).
using DualWeights = std::vector<double>;

struct FloatOptions {
  run::Budget* budget = nullptr;              // polled every iteration when set
  const Basis* warm_start = nullptr;          // start from this basis when given
  const DualWeights* warm_weights = nullptr;  // and price with these weights from the start
  // The warm start is where a zero-cost search ended: rarely dual feasible for the model's costs
  // (gosh, one row freed: 2 827 dual infeasibilities, 38 337 iterations against 16 361 cold), so
  // when both searches run only the zero-cost one starts there, the other from the logical basis.
  bool warm_start_from_zero_costs = false;
  // Then the search on the model's costs starts here instead, when given: where that search last
  // ended on a like model (a session keeps it apart from the zero-cost search's basis).
  const Basis* cost_search_start = nullptr;
  const DualWeights* cost_search_weights = nullptr;  // the weights that came with it
  const CorrectionProblem* correction = nullptr;  // solve this instead of the model's bounds and costs
  std::function<void(const FloatProgress&)> progress;
  // Also search on zero costs, on a second core when there is one, and take its proof of
  // infeasibility when it finds one (docs/solving.md, "the zero-cost search").
  bool feasibility_search = true;
  // Without a warm start, begin from a triangular, dual feasible crash basis rather than the
  // all-logical one (docs/solving.md, "the crash").
  bool crash = true;
};

struct FloatResult {
  FloatStatus status = FloatStatus::failed;
  Basis basis;        // the final basis (a claim to be certified exactly, never trusted)
  DualWeights dual_weights;  // at that basis, for a later warm start from it
  long iterations = 0;
  double objective = 0;  // in the model's own sense, constant included
  std::string note;      // why it failed or stopped, for diagnostics
  // infeasible: the basic variable whose row of B^-1 gives the dual ray; unbounded: the entering
  // variable along whose edge the objective falls without end; else -1.  Variables are numbered
  // columns first, then row logicals (column_count() + row).  A hint, never trusted.
  int ray_variable = -1;
  bool zero_cost_search = false;  // the result is the zero-cost search's (FloatOptions::feasibility_search)
};

// A model's LP in doubles, scaled once (the matrix alone decides the scaling), for many searches
// on the same matrix under other limits or another objective: a session's re-solves take the
// edited rows, columns and objective again instead of converting and scaling the whole model.
class FloatModel {
 public:
  explicit FloatModel(const model::Model& model);
  ~FloatModel();
  FloatModel(FloatModel&&) noexcept;
  FloatModel& operator=(FloatModel&&) noexcept;

  // Row i's sides, column j's bounds or the objective as they now stand in `model`, which has
  // the matrix this was built from.
  void take_row(const model::Model& model, int row);
  void take_column(const model::Model& model, int column);
  void take_objective(const model::Model& model);

 private:
  friend FloatResult solve_float(const model::Model& model, const FloatOptions& options);
  friend FloatResult solve_float(const FloatModel& model, const FloatOptions& options);
  std::unique_ptr<detail::LpData> lp_;
};

// Works on the model's own form: columns with bounds, one logical per row bounded by its sides.
FloatResult solve_float(const model::Model& model, const FloatOptions& options = {});
FloatResult solve_float(const FloatModel& model, const FloatOptions& options = {});

}  // namespace plumb::simplex
