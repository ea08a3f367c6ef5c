// Sparse LU factors of a simplex basis with product-form updates, in double precision.
#pragma once

#include <cstddef>
#include <span>
#include <vector>

namespace plumb::simplex::detail {

// A compressed list of sparse vectors: entries of vector k are [start[k], start[k+1]).
struct SparseVectors {
  std::vector<int> start{0};
  std::vector<int> index;
  std::vector<double> value;
  void clear() {
    start.assign(1, 0);
    index.clear();
    value.clear();
  }
  void push(int i, double v) {
    index.push_back(i);
    value.push_back(v);
  }
  void close() { start.push_back(static_cast<int>(index.size())); }
  int size() const { return static_cast<int>(start.size()) - 1; }
};

// B = L U up to permutations, found by Markowitz pivot search with threshold partial pivoting
// over rows (Suhl & Suhl, "Computing sparse LU factorizations for large-scale linear programming
// bases", ORSA J. Computing 2(4), 1990).  Later basis changes are kept as product-form eta
// vectors (Dantzig & Orchard-Hays 1954) until the next factorization.
//
// Indexing: the basis matrix has rows 0..m-1 and positions 0..m-1 (its columns).  ftran takes a
// row-indexed right-hand side and returns the position-indexed solution of B x = b; btran takes
// a position-indexed c and returns the row-indexed solution of B^T y = c.
class BasisFactor {
 public:
  // What could not be pivoted: the positions and rows left when the basis is singular.  The
  // caller puts the logical of each such row into one such position and factorizes again.
  struct Singularity {
    std::vector<int> positions;
    std::vector<int> rows;
    bool empty() const { return positions.empty(); }
  };

  double pivot_threshold = 0.1;      // |pivot| >= threshold * largest |entry| of its row
  double absolute_tolerance = 1e-11;  // smaller pivots count as zero
  double drop_tolerance = 1e-14;      // smaller fill-in is not stored

  // Factorizes the m x m matrix whose column at position k is columns[k] (rows and values).
  Singularity factorize(int m, const SparseVectors& columns);

  void ftran(std::vector<double>& x) const;
  void btran(std::vector<double>& x) const;

  // Records that position p now holds a column whose ftran was `column` (before the change).
  void update(int position, const std::vector<double>& column);

  int update_count() const { return etas_.size(); }
  std::size_t nonzeros() const { return l_columns_.index.size() + u_rows_.index.size() + etas_.index.size(); }

 private:
  // Active submatrix during factorization.
  struct Active;
  void build_transposes();

  int m_ = 0;
  std::vector<int> pivot_row_;       // per step
  std::vector<int> pivot_position_;  // per step
  std::vector<double> diagonal_;     // per step
  SparseVectors l_columns_;  // per step k: (row i, multiplier) with row i -= multiplier * row of step k
  SparseVectors l_rows_;     // per row i: (row of step k, multiplier), the transpose, for btran
  SparseVectors u_rows_;     // per step k: (position j, value) off the diagonal
  SparseVectors u_columns_;  // per position j: (row of step k, value), the transpose, for ftran
  SparseVectors etas_;       // per update: (position, value) off the pivot
  std::vector<int> eta_position_;
  std::vector<double> eta_pivot_;
  mutable std::vector<double> work_;
};

}  // namespace plumb::simplex::detail
