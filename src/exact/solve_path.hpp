// Internal to the exact module: the solve path with a warm float search, for Session::solve.
#pragma once

#include "plumb/exact/solve.hpp"
#include "plumb/simplex/float_simplex.hpp"

#include <functional>

namespace plumb::exact::detail {

// Where the float search starts: a basis when given, with its pricing weights, whether the
// zero-cost search found it (simplex::FloatOptions::warm_start_from_zero_costs) and then where the
// search on the model's costs last ended; and, when a session keeps one, the float LP of the
// model solved, asked for only when the float search runs.  The search's own final weights go to
// `weights_found` when given (left as they were when no float search ran).
struct SearchStart {
  const simplex::Basis* basis = nullptr;
  const simplex::DualWeights* weights = nullptr;
  bool from_zero_costs = false;
  const simplex::Basis* cost_search_basis = nullptr;  // simplex::FloatOptions::cost_search_start
  const simplex::DualWeights* cost_search_weights = nullptr;
  std::function<const simplex::FloatModel&()> float_model;
  simplex::DualWeights* weights_found = nullptr;
};

// solve(), with the float search starting from `start` (its infeasibility and unboundedness hints
// then serve as in a cold search).
Solution solve_from(const model::Model& model, const SolveOptions& options, const SearchStart& start);

// solve_from(), the certificate and its independent check; the pure exact engine from scratch
// when the checker rejects the result.  Never yields an unverified result as certified.
CertifiedSolution verified_solve(const model::Model& model, const SolveOptions& options,
                                 const SearchStart& start);

}  // namespace plumb::exact::detail
