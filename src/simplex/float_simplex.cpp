// Floating-point simplex: to be written.
#include "plumb/simplex/float_simplex.hpp"

namespace plumb::simplex {
FloatResult solve_float(const model::Model&, const FloatOptions&) { return {FloatStatus::failed, {}, 0, 0, "not yet written"}; }
}  // namespace plumb::simplex
