// The float simplex's sparse LU factorization of a square matrix, behind a narrow door: for
// modules that solve with it and check every answer themselves (exact refinement).
#pragma once

#include <memory>
#include <utility>
#include <vector>

namespace plumb::simplex {

// The columns of an m x m matrix in double, compressed: the entries of column k are
// [start[k], start[k+1]) of index (rows) and value.
struct FloatColumns {
  std::vector<int> start{0};
  std::vector<int> index;
  std::vector<double> value;
  void push(int row, double v) {
    index.push_back(row);
    value.push_back(v);
  }
  void close() { start.push_back(static_cast<int>(index.size())); }
};

// B = L U in double precision (the factorization the float simplex uses for its bases), solved
// with dense right-hand sides.  Its answers carry rounding error: callers refine and check them.
class FloatLu {
 public:
  FloatLu();
  ~FloatLu();
  FloatLu(FloatLu&&) noexcept;
  FloatLu& operator=(FloatLu&&) noexcept;

  // Factorizes B, whose k-th column is columns' column k, counting pivots below `pivot_floor` in
  // magnitude as zero.  False when B is singular to that floor; solves are then not allowed.
  bool factorize(int m, FloatColumns columns, double pivot_floor);
  // After a failed factorize: the positions and rows left unpivoted, paired.  Putting the logical
  // of each such row (a unit column) at its paired position makes the matrix regular.
  std::vector<std::pair<int, int>> unpivoted() const;
  // x <- B^-1 x (x indexed by row on entry, by column on return).
  void solve(std::vector<double>& x) const;
  // y <- B^-T y (y indexed by column on entry, by row on return).
  void solve_transposed(std::vector<double>& y) const;

 private:
  struct Factors;
  std::unique_ptr<Factors> factors_;
};

}  // namespace plumb::simplex
