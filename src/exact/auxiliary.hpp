// Internal to the exact module: infeasibility and unboundedness proven from the float search by
// auxiliary LPs whose optimal bases are certified the way optimality is.
#pragma once

#include "engine.hpp"
#include "plumb/exact/solve.hpp"
#include "plumb/simplex/float_simplex.hpp"

#include <functional>
#include <optional>
#include <string>

namespace plumb::exact::detail {

// The float search's progress, reported as the solve's, each phase name after `prefix`.
std::function<void(const simplex::FloatProgress&)> float_progress(const SolveOptions& options, const std::string& prefix);

// Certifies `basis` as optimal for `model` by refinement (RationalEngine::certify_by_refinement),
// correcting it by float re-solves of the correction problem as needed; `basis` ends as the last
// one tried.  True when certified: engine.run() then reports the optimum.
bool certify_with_corrections(RationalEngine& engine, const model::Model& model, const SolveOptions& options,
                              simplex::Basis& basis, SolveStats& stats);

// When the float search ends infeasible at `basis`: the least-infeasibility LP (every row may be
// violated at a cost of one per unit) is solved in float from that basis and its optimum
// certified by refinement; a positive optimum proves infeasibility and its row duals are the
// Farkas multipliers.  Nothing when the optimum is zero or cannot be certified without pivots.
// `stats` gathers the float iterations and correction rounds spent, proven or not.
std::optional<Solution> prove_infeasible(const model::Model& model, const SolveOptions& options,
                                         const simplex::Basis& basis, SolveStats& stats);

// When the float search ends unbounded at `basis`: a feasible point (the model with a zero
// objective) and a ray (the model's costs over its recession cone, columns boxed to [-1, 1]),
// each an optimal basis certified by refinement.  When the model proves infeasible instead, that
// proof.  Nothing when neither can be certified without pivots.
std::optional<Solution> prove_unbounded(const model::Model& model, const SolveOptions& options,
                                        const simplex::Basis& basis, SolveStats& stats);

}  // namespace plumb::exact::detail
