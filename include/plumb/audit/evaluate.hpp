// The exact evaluator: what a plan misses and by how much, its objective, and a safe bound on the
// optimum from any dual values.  Used by plumb audit and the report; the checker keeps its own code.
#pragma once

#include "plumb/model/model.hpp"

#include <optional>
#include <string>
#include <vector>

namespace plumb::audit {

using numeric::Rational;

// One side of a row or one bound of a column that a plan misses.
struct Violation {
  enum class Kind { row, column } kind = Kind::row;
  int index = 0;  // row or column of the model
  enum class Side { lower, upper } side = Side::lower;
  Rational limit;     // the side or bound missed
  Rational value;     // the row activity a.x or the column value
  Rational amount;    // how far beyond the limit, > 0
  Rational relative;  // amount / max(|limit|, 1)
};

// The size of an excess relative to its limit: amount / max(|limit|, 1), so that a limit of
// 12 000 bbl missed by 0.04 bbl and one of 0.5 missed by 0.04 differ (common practice).
Rational relative_to(const Rational& amount, const Rational& limit);

struct Evaluation {
  std::vector<Rational> activity;     // a.x, one per row
  std::vector<Violation> violations;  // the largest relative amount first, then the largest amount
  Rational objective;                 // the model's objective at x: its sense, constant included
};

// Evaluates x (one value per column) exactly against every row side and column bound.
Evaluation evaluate(const model::Model& model, const std::vector<Rational>& x);

// A bound on the optimum that holds whatever the dual values y (one per row, any accuracy) are:
// with r = c - A'y, every feasible x has c.x = y.(Ax) + r.x, and each term is bounded by the sides
// of its row and the bounds of its column; computed exactly, so no rounding can make it unsafe
// (A. Neumaier and O. Shcherbina, "Safe bounds in linear and mixed-integer linear programming",
// Math. Programming 99, 2004).  Duals are in the model's own sense: the change of the objective
// per unit of a row's activity.  A dual whose sign asks for an infinite side counts as zero.  A
// reduced cost whose sign asks for a column's infinite bound uses the bound one row implies from
// the other columns' bounds, when one does (rigorous too: every feasible point respects it).
struct DualBound {
  std::optional<Rational> bound;  // a lower bound when minimising, an upper one when maximising;
                                  // empty when a reduced cost meets an infinite bound
  std::string unbounded_by;       // the first column whose reduced cost met an infinite bound
  std::vector<int> rows_zeroed;   // rows whose dual asked for an infinite side
  int implied_bounds_used = 0;    // columns bounded through a row instead of their own bound
};
DualBound safe_dual_bound(const model::Model& model, const std::vector<Rational>& y);

}  // namespace plumb::audit
