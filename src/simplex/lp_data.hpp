// The LP as the floating-point simplex sees it: scaled, minimising, columns then row logicals.
#pragma once

#include "basis_factor.hpp"
#include "plumb/model/model.hpp"

#include <vector>

namespace plumb::simplex::detail {

// min cost.x  subject to  A x - r = 0,  lower <= (x, r) <= upper.
// Variables 0..n-1 are the columns, n..n+m-1 the row logicals (r_i = a_i.x); infinite bounds
// are +-infinity.  After scaling, A holds R A C and the columns' values are x / C, the logicals'
// values R r; the objective keeps its value.
struct LpData {
  int rows = 0;
  int columns = 0;
  SparseVectors by_column;  // per column: (row, value)
  SparseVectors by_row;     // per row: (column, value)
  std::vector<double> cost;  // per variable, logicals 0
  std::vector<double> lower, upper;
  std::vector<double> column_scale, row_scale;
  double sense = 1;  // -1 when the model maximises: cost holds -c
  double constant = 0;

  int variables() const { return rows + columns; }
  // The model's objective (its sense, constant included) for internal objective value v.
  double model_objective(double v) const { return sense * v + constant; }
};

// Doubles of the model's numbers; no scaling yet (column_scale and row_scale are 1).
LpData lp_from_model(const model::Model& model);

// A column's bounds, a row's sides (its logical's bounds) or the objective, taken again from the
// model in the scale lp has: the same doubles lp_from_model and scale would give.
void take_column_limits(LpData& lp, int column, const model::Column& from);
void take_row_limits(LpData& lp, int row, const model::Row& from);
void take_objective(LpData& lp, const model::Objective& from);

// Scales rows and columns by powers of two: geometric-mean passes, which reduce the spread of
// log |a_ij| as Curtis & Reid ("On the automatic scaling of matrices for Gaussian elimination",
// J. Inst. Maths Applics 10, 1972) set out, then an equilibration pass bringing each column's
// largest entry to about 1.  Fills by_row.
void scale(LpData& lp);

// Limits and costs of unscaled values into the scale of column_scale and row_scale (a column's
// value x / C, a logical's R r).
void scale_limits_and_costs(LpData& lp);

// by_row from by_column.
void build_rows(LpData& lp);

}  // namespace plumb::simplex::detail
