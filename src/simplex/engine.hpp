// The bounded dual simplex with primal clean-up, working on LpData.
#pragma once

#include "basis_factor.hpp"
#include "lp_data.hpp"
#include "ratio_test.hpp"
#include "plumb/simplex/float_simplex.hpp"

#include <atomic>
#include <chrono>
#include <random>
#include <string>
#include <vector>

namespace plumb::simplex::detail {

// Thrown inside the engine when the factors cannot be trusted any more; solve() turns it into
// FloatStatus::failed.
struct NumericalTrouble {
  std::string what;
};

// What a search minimises: the model's costs, or nothing at all (zero costs: every basis is dual
// feasible, so the search only looks for a feasible point, and proves infeasibility when none exists).
enum class SearchGoal { model_costs, feasibility };

class FloatEngine {
 public:
  FloatEngine(const LpData& lp, const FloatOptions& options, SearchGoal goal = SearchGoal::model_costs);

  // Starts from the given statuses (one per variable, exactly `rows` basic), else from the
  // all-logical basis; prices with `weights` (per variable) where they are given and positive.
  void start_from(const std::vector<VarStatus>& statuses, const DualWeights* weights = nullptr);
  // From the all-logical basis: puts structural columns into the basis in place of the logicals
  // of equality rows that basis leaves infeasible, keeping the basis triangular and dual
  // feasible (docs/solving.md, "the crash").  Returns how many went in.
  int crash_equality_rows();
  FloatStatus solve();
  // Another thread may set `flag` to stop the search at its next poll (FloatStatus::stopped).
  void stop_when(const std::atomic<bool>& flag) { stop_flag_ = &flag; }

  const std::vector<VarStatus>& statuses() const { return status_; }
  // The dual steepest-edge weight of basic variable j's row of B^-1.
  double dual_weight(int j) const { return weight_[position_[j]]; }
  DualWeights dual_weights() const;  // per variable, 0 for nonbasic ones
  long iterations() const { return iterations_; }
  double objective() const;  // internal (minimising, scaled) objective of the current point
  const std::string& note() const { return note_; }
  int ray_variable() const { return ray_variable_; }

  double primal_tolerance = 1e-7;
  double dual_tolerance = 1e-7;
  double pivot_tolerance = 1e-7;
  // Largest dual infeasibility after refactorization still taken for rounding and shifted away.
  double shift_limit = 1e-5;

 private:
  enum class LoopEnd { optimal, infeasible, unbounded, stopped, limit, restart };

  bool boxed(int j) const { return lower_[j] > -inf_ && upper_[j] < inf_; }
  bool fixed(int j) const { return lower_[j] == upper_[j]; }
  double nonbasic_value(int j) const;
  void set_nonbasic(int j, VarStatus s);
  VarStatus default_status(int j) const;
  VarStatus status_for_reduced_cost(int j) const;

  // Calls f(row, value) for each entry of variable j's column of [A -I].
  template <class F>
  void for_column(int j, F&& f) const;

  void refactor();  // may swap logicals in for a singular basis; sets repaired_
  bool refresh();  // refactor and recompute primal and dual values; true when repaired
  // refresh(), then dual infeasibilities up to shift_limit are removed; larger ones mean the
  // updates lost accuracy: dual_feasibility_lost_ is set and true returned, so the loop restarts.
  bool refresh_dual_feasible();
  void raise_stability();  // stricter LU and ratio-test pivots, after accuracy was lost
  void compute_primal();  // also rebuilds the list of infeasible positions
  void note_moved(int k);  // the basic value at position k changed: list it if now infeasible
  void move_basics(const FloatSparseVector& change, double factor);  // x_B -= factor * change
  void compute_dual();
  void compute_pivot_row();  // alpha_row_ from rho_, over nonbasic variables
  void clear_pivot_row();
  // True (the pivot row cleared) when alpha from the column and from the row disagree or alpha is
  // too small; throws NumericalTrouble after more than `allowed` such pivots in all.
  bool pivot_disagrees(double alpha, double row_alpha, int allowed);
  double primal_infeasibility(int j) const;  // > 0 when outside its bounds beyond tolerance
  int count_primal_infeasible() const;
  double dual_infeasibility(int j) const;  // > 0 when its reduced cost has the wrong sign
  int count_dual_infeasible(bool boxed_too) const;
  bool polls_say_stop(const char* phase);

  LoopEnd dual_loop(const char* phase);
  int choose_leaving_position(bool& any_rejected);  // dual pricing; -1 when none qualifies
  void collect_breakpoints(bool to_lower);          // into candidates_, from the pivot row
  void flip_bounds(const std::vector<int>& flips);  // passed breakpoints to their other bound
  void update_dual_weights(int r, double alpha);    // after a pivot at position r
  LoopEnd primal_loop();
  LoopEnd dual_phase_one();
  void perturb_costs();
  void restore_costs();
  double remove_dual_infeasibilities(double limit);
  void pivot(int r, int entering, double primal_step);  // basis change at position r

  const LpData& lp_;
  const FloatOptions& options_;
  const int m_, n_;
  const double inf_;

  const std::vector<double> goal_cost_;       // the costs minimised: the model's, or zeros
  std::vector<double> cost_, lower_, upper_;  // working copies (perturbed, shifted, boxed)
  bool costs_modified_ = false;
  std::vector<double> x_, d_;
  std::vector<int> head_, position_;
  std::vector<VarStatus> status_;
  std::vector<double> weight_;  // dual steepest-edge weights per position
  std::vector<char> rejected_;  // positions left out of dual pricing until the next factorization
  // Positions that may be primal infeasible (every infeasible one is listed; pricing drops the
  // feasible ones), so dual pricing need not scan every row.
  std::vector<int> infeasible_;
  std::vector<char> listed_;
  FloatBasisFactor factor_;
  bool repaired_ = false;
  bool dual_feasibility_lost_ = false;
  int stability_level_ = 0;

  FloatSparseVector rho_, column_, tau_, flips_;  // B^-T e_r, B^-1 a_q, B^-1 rho, B^-1 (flipped columns)
  std::vector<double> work_;
  std::vector<double> alpha_row_;
  std::vector<int> row_touched_;
  std::vector<char> in_row_;
  std::vector<DualCandidate> candidates_;
  std::vector<PrimalCandidate> primal_candidates_;

  long iterations_ = 0;
  long iteration_limit_ = 0;
  int trouble_ = 0;
  int ray_variable_ = -1;
  std::string note_;
  const std::atomic<bool>* stop_flag_ = nullptr;
  std::mt19937 random_{20261201};
  std::chrono::steady_clock::time_point last_report_ = std::chrono::steady_clock::now();
  long last_report_iteration_ = 0;
};

}  // namespace plumb::simplex::detail
