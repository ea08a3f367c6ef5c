// A simplex basis: which columns and row logicals are basic, and where the others rest.
#pragma once

#include <vector>

namespace plumb::simplex {

// Where a variable (a column, or the logical of a row, whose value is the row activity a.x) sits.
enum class VarStatus : unsigned char {
  basic,
  at_lower,
  at_upper,
  at_zero,  // nonbasic free variable resting at zero
};

struct Basis {
  std::vector<VarStatus> columns;  // one per model column
  std::vector<VarStatus> rows;     // one per row logical
  bool empty() const { return columns.empty() && rows.empty(); }
};

}  // namespace plumb::simplex
