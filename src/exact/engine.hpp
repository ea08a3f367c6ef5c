// Internal to the exact module: the bounded revised simplex over rationals on the model's own form.
#pragma once

#include "factor.hpp"
#include "plumb/exact/solve.hpp"
#include "plumb/model/model.hpp"
#include "plumb/run/budget.hpp"
#include "plumb/simplex/basis.hpp"
#include "plumb/simplex/float_simplex.hpp"
#include "refine.hpp"

#include <functional>
#include <optional>
#include <span>
#include <string>
#include <vector>

namespace plumb::exact::detail {

using numeric::Integer;
using simplex::VarStatus;

struct EngineResult {
  Outcome outcome = Outcome::stopped;
  std::vector<Rational> x, y, ray;  // as in exact::Solution
  simplex::Basis basis;
  long iterations = 0;
  bool repaired = false;  // the starting basis was singular or of the wrong size
  std::string phase;      // the phase it was in when it finished or stopped
  run::StopReason stop_reason = run::StopReason::none;
};

// Variables are the model's columns x_j (0..n-1) and one logical r_i = a_i.x per row (n+i), so the
// system is A x - r = 0 with every variable between its own bounds.  Bounded-variable primal
// simplex with a composite phase 1 (minimise the sum of the basic variables' bound violations;
// V. Chvatal, Linear Programming, 1983, ch. 8; I. Maros, Computational Techniques of the Simplex
// Method, 2003, ch. 9), and a bounded dual simplex for dual feasible starts (C. E. Lemke, "The dual
// method of solving the linear programming problem", 1954).  Every sign and ratio is decided in
// exact arithmetic; doubles only rank pricing candidates.  After a run of degenerate pivots the
// choices follow Bland's rule (R. G. Bland, "New finite pivoting rules for the simplex method",
// Math. of OR 2, 1977) until progress resumes, so the method cannot cycle.
class RationalEngine {
 public:
  RationalEngine(const model::Model& model, run::Budget* budget,
                 const std::function<void(const Progress&)>* progress);

  // Starts from the all-logical basis, columns resting at a finite bound (or zero when free).
  void start_from_logicals();
  // Starts from a given basis; one of the wrong size or singular is repaired by putting logicals
  // in place of dependent columns.  Returns true when a repair was needed.
  bool start_from(const simplex::Basis& basis);
  // Certifies a basis without a rational LU or any pivot: x_B and y by float LU, iterative
  // refinement and rational reconstruction, each proven by exact multiplication (refine.hpp).
  // True when both are feasible; run() then reports the optimum.  False when the basis does not
  // fit, refinement gives up, or either check fails: then start_from the same basis.  When one is
  // infeasible (found exactly, or clearly so before either is computed) and `correction` is
  // given, it receives the correction problem of that basis, for a float re-solve from it.
  bool certify_by_refinement(const simplex::Basis& basis, simplex::CorrectionProblem* correction = nullptr);
  // The last correction problem was built from approximate duals and basic values, the basis
  // being clearly not optimal (no exact solution was computed).
  bool correction_was_approximate() const { return correction_was_approximate_; }
  // After start_from: proves infeasibility from the row of B^{-1} of this basic variable, which
  // violates a bound that no nonbasic variable can bring it towards (the float search's hint).
  bool certify_infeasible_row(int variable);
  // The same proof without a rational LU: the row of B^{-1} by refinement (refine.hpp) at this
  // basis, and the Farkas inequality it gives checked exactly.  When false, start_from the basis.
  bool certify_infeasible_row_by_refinement(const simplex::Basis& basis, int variable);
  // After start_from, on an exactly primal feasible basis: proves unboundedness along the edge on
  // which this nonbasic variable improves the objective and nothing blocks it.
  bool certify_ray(int variable);

  // Runs from the current basis: nothing when it is already optimal, dual simplex when it is dual
  // feasible, otherwise primal simplex with phase 1 as needed.  Called once: the result takes
  // the engine's values.
  EngineResult run();

 private:
  enum class Step { done, infeasible, unbounded, stopped };
  int total() const { return n_ + m_; }
  bool basic(int k) const { return position_[k] >= 0; }
  bool below(int k) const { return lower_[k] && value_[k] < *lower_[k]; }
  bool above(int k) const { return upper_[k] && value_[k] > *upper_[k]; }
  bool infeasible_basis() const;
  void scatter_column(int k, RationalSparseVector& target) const;
  void rest_nonbasic(int k, VarStatus wanted);
  bool fits(const simplex::Basis& basis) const;
  // Rests every nonbasic variable where the basis says and returns the basic ones.
  std::vector<int> rest_as_in(const simplex::Basis& basis);
  void nonbasic_activity(RationalSparseVector& target);
  SparseColumn constraint_column(int k) const;
  void refactor();
  bool install_basis(std::vector<int> basic_variables);
  void compute_basic_values();
  void compute_duals(bool phase_one);
  void reduced_cost(int k, bool phase_one, Rational& out);
  bool eligible(int k, const Rational& d) const;
  bool eligible_sign(int k, int sign) const;  // as eligible, for a reduced cost of this sign
  void exact_reduced_cost(int j, const Rational& cost, const std::vector<Integer>& numerators,
                          const Integer& denominator, Integer& sum);
  bool farkas_holds(const std::vector<Integer>& numerators, int sign);
  RefineLimits refine_limits() const;
  bool rest_for_refinement(const simplex::Basis& basis, RefinedSolver& solver);
  std::vector<SparseColumn> basic_columns() const;  // B, by position
  simplex::CorrectionProblem correction_problem(const std::vector<double>& reduced_costs) const;
  bool clearly_not_optimal(RefinedSolver& solver, const std::vector<Rational>& rhs,
                           simplex::CorrectionProblem& correction);
  std::vector<Rational> basic_costs() const;  // c' of the basic variables, by position
  // d_j = c'_j - a_j^T y in double from estimates of y: the value, a bound on the error of the
  // double arithmetic (infinite when it overflows), and sum |a_ij| (y's own error multiplies it).
  struct ReducedCostEstimate {
    double value, rounding, spread;
  };
  ReducedCostEstimate estimate_reduced_cost(int j, std::span<const int> rows, std::size_t entry,
                                            const std::vector<double>& dual_estimate) const;
  template <class Visit>
  void for_each_priced_column(Visit&& visit) const;
  bool improving_estimate(int k, double d) const;
  void entering_column(int k);  // alpha_ = B^{-1} times column k
  void reduced_cost_from_column(int k, bool phase_one, Rational& out);
  bool make_dual_feasible();
  void compute_pivot_row(int position);
  bool dual_candidate(int k, bool to_lower) const;
  void set_ray(int entering, int direction);
  Step primal();
  // The primal simplex's parts: pricing (by double estimates, then exactly) and the ratio test.
  struct PrimalBlock {
    bool bounded = false;  // some variable blocks the step
    bool flip = false;     // the entering variable's own other bound blocks first
    int position = -1;     // else the blocking basic variable's position, leaving to `status`
    VarStatus status = VarStatus::at_lower;
  };
  int price_by_estimates(bool phase_one, std::vector<std::pair<double, int>>& candidates);
  int price_exactly(bool phase_one);
  PrimalBlock primal_ratio_test(int entering, int direction);
  Step dual();
  bool poll(const char* phase);
  void exchange(int entering, int leaving_position, VarStatus leaving_status);
  void count_pivot(bool degenerate);
  void fill_result(EngineResult& result, Step step);

  const model::Model& model_;
  run::Budget* budget_;
  const std::function<void(const Progress&)>* progress_;
  int n_, m_;
  std::vector<const Rational*> lower_, upper_;  // null: infinite
  std::vector<char> fixed_;
  std::vector<Rational> cost_;                  // c' (minimisation form), logicals 0
  Integer scale_, term_;  // exact_reduced_cost(): D_j, and one scaled entry
  std::vector<double> cost_estimate_, matrix_estimate_;
  std::vector<Rational> value_;
  std::vector<VarStatus> status_;
  std::vector<int> head_;      // basis position -> variable
  std::vector<int> position_;  // variable -> basis position, -1 when nonbasic
  RationalBasisFactor factor_;
  RationalSparseVector rows_, positions_, alpha_, duals_, pivot_row_;
  std::vector<double> dual_estimate_, cost_estimate_of_basis_;
  Rational scratch_, d_, ratio_, best_ratio_;
  long iterations_ = 0;
  int degenerate_run_ = 0;
  bool bland_ = false;
  bool repaired_ = false;
  bool correction_was_approximate_ = false;
  std::optional<Step> settled_;  // set by the certify_ functions: run() reports it
  std::string phase_;
  std::vector<Rational> farkas_;
  std::vector<Rational> ray_;
};

}  // namespace plumb::exact::detail
