// Internal to the exact module: the solve path with a warm float search, for Session::solve.
#pragma once

#include "plumb/exact/solve.hpp"

namespace plumb::exact::detail {

// solve(), with the float search starting from `float_start` when given (its infeasibility and
// unboundedness hints then serve as in a cold search).
Solution solve_from(const model::Model& model, const SolveOptions& options, const simplex::Basis* float_start);

// solve_from(), the certificate and its independent check; the pure exact engine from scratch
// when the checker rejects the result.  Never yields an unverified result as certified.
CertifiedSolution verified_solve(const model::Model& model, const SolveOptions& options,
                                 const simplex::Basis* float_start);

}  // namespace plumb::exact::detail
