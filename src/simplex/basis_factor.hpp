// Sparse LU factors of a simplex basis with Forrest-Tomlin updates and hypersparse solves, in
// double precision.
#pragma once

#include <cstddef>
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

// A vector of length m held densely, with the list of its nonzeros so that sparse work can skip
// the zeros.  Invariant: every i with values[i] != 0 is listed in index; a listed entry may have
// become zero by cancellation.
struct FloatSparseVector {
  std::vector<double> values;
  std::vector<int> index;

  void reset(int m) {
    values.assign(m, 0.0);
    index.clear();
  }
  int count() const { return static_cast<int>(index.size()); }
  // Zeroes every listed entry (cost proportional to the count, not to m).
  void clear() {
    for (int i : index) values[i] = 0;
    index.clear();
  }
  // Adds v to entry i, listing it if it was zero.  Cancellation can then list an entry twice,
  // which the solves accept on input; their results list each entry once.
  void add(int i, double v) {
    if (values[i] == 0) index.push_back(i);
    values[i] += v;
  }
  void copy_from(const FloatSparseVector& other) {
    clear();
    for (int i : other.index) values[i] = other.values[i];
    index = other.index;
  }
  void rebuild_index();  // lists the nonzeros after dense work on values
  double operator[](int i) const { return values[i]; }
};

// Lists of (index, value) pairs, one per row or column of a factor, in one pool; a list that
// outgrows its room moves to the end of the pool.  Emptied until the next reset.
class ListPool {
 public:
  void reset(int lists, const std::vector<int>& room);
  void append(int list, int i, double v);
  double take(int list, int i);  // removes the entry with index i, if present; its value, else 0
  template <class Predicate>
  void remove_if(int list, Predicate&& drop) {  // the entries whose index satisfies `drop`
    int* index = index_.data() + start_[list];
    double* value = value_.data() + start_[list];
    int kept = 0;
    for (int t = 0; t < size_[list]; ++t)
      if (!drop(index[t])) index[kept] = index[t], value[kept] = value[t], ++kept;
    size_[list] = kept;
  }
  void clear(int list) { size_[list] = 0; }
  int size(int list) const { return size_[list]; }
  const int* indices(int list) const { return index_.data() + start_[list]; }
  const double* values(int list) const { return value_.data() + start_[list]; }
  double* values(int list) { return value_.data() + start_[list]; }

 private:
  std::vector<int> start_, size_, room_;
  std::vector<int> index_;
  std::vector<double> value_;
};

// B = L U up to permutations, found by Markowitz pivot search with threshold partial pivoting
// over rows (Suhl & Suhl, "Computing sparse LU factorizations for large-scale linear programming
// bases", ORSA J. Computing 2(4), 1990).  A basis change replaces one column of U by the
// partially solved entering column and restores triangularity with one row transformation
// (Forrest & Tomlin, "Updated triangular factors of the basis to maintain sparsity in the product
// form simplex method", Math. Programming 2, 1972), so U and the row transformations R stay
// sparse:  B = L R^-1 U with permutations.
//
// Solves run stage by stage (L, R, U).  A stage on a sparse vector first finds the nonzero
// pattern of its result by depth-first search through the factor's graph and then works only
// there (Gilbert & Peierls, "Sparse partial pivoting in time proportional to arithmetic
// operations", SIAM J. Sci. Stat. Comput. 9(5), 1988); a vector that is, or turns out, dense
// takes the plain loop instead (Hall & McKinnon, "Hyper-sparsity in the revised simplex method
// and how to exploit it", Comput. Optim. Appl. 32, 2005).
//
// Indexing: the basis matrix has rows 0..m-1 and positions 0..m-1 (its columns).  ftran takes a
// row-indexed right-hand side and returns the position-indexed solution of B x = b; btran takes
// a position-indexed c and returns the row-indexed solution of B^T y = c.
class FloatBasisFactor {
 public:
  // What could not be pivoted: the positions and rows left when the basis is singular.  The
  // caller puts the logical of each such row into one such position and factorizes again.
  struct Singularity {
    std::vector<int> positions;
    std::vector<int> rows;
    bool empty() const { return positions.empty(); }
  };

  double pivot_threshold = 0.1;       // |pivot| >= threshold * largest |entry| of its row
  double absolute_tolerance = 1e-11;  // smaller pivots count as zero
  double drop_tolerance = 1e-14;      // smaller fill-in is not stored
  int update_limit = 100;             // updates before a fresh factorization is due
  double update_tolerance = 1e-8;     // allowed relative gap between an update's pivot and alpha
  double sparse_density = 0.1;        // a vector denser than this (share of m) takes dense loops
  // The factorization ends on a dense copy of the active submatrix once it has at least
  // dense_minimum rows and this share of its entries is nonzero.  Measured on pilot87: 0.7 halves
  // the factorizations' time (2.8 -> 1.6 s over a solve) at the sparse steps' fill; at 0.3 and
  // 0.5 the denser factors cost the solves more than the factorizations saved.
  double dense_share = 0.7;
  int dense_minimum = 16;

  // Factorizes the m x m matrix whose column at position k is columns[k] (rows and values).
  Singularity factorize(int m, const SparseVectors& columns);

  void ftran(FloatSparseVector& x) const;
  void btran(FloatSparseVector& x) const;
  // ftran of the column about to enter the basis, keeping its partial solution for update().
  void ftran_entering(FloatSparseVector& x);
  // Dense right-hand sides (every entry looked at).
  void ftran(std::vector<double>& x) const;
  void btran(std::vector<double>& x) const;

  // Position p now holds the column last given to ftran_entering, whose solution had `alpha` at
  // p.  Returns false when the updated factors disagree with alpha beyond rounding or the new
  // pivot is too small: the factors are then unusable and factorize() must come next.
  bool update(int position, double alpha);

  int update_count() const { return updates_; }
  // True when the next solve should come from a fresh factorization: after a failed update,
  // update_limit updates, or when the updates' fill exceeds twice the fresh factors' size.
  bool refactor_due() const;
  std::size_t nonzeros() const { return l_nonzeros_ + u_nonzeros_ + r_etas_.index.size(); }

 private:
  struct Active;       // the active submatrix during factorization
  struct Elimination;  // the steps of a factorization
  void install_factors(const Elimination& steps);

  // The stages of the solves, each on a vector that is row-indexed on entry and exit except
  // where noted.
  void solve_l(FloatSparseVector& x) const;
  void solve_r(FloatSparseVector& x) const;
  void solve_u(FloatSparseVector& x) const;   // row-indexed in, position-indexed out
  void solve_ut(FloatSparseVector& x) const;  // position-indexed in, row-indexed out
  void solve_rt(FloatSparseVector& x) const;
  void solve_lt(FloatSparseVector& x) const;
  template <class Solve>
  void solve_dense(std::vector<double>& x, Solve&& solve) const;  // through dense_
  bool sparse_enough(const FloatSparseVector& x) const;
  // Depth-first search from x's nonzeros over the graph whose edges from node v are
  // neighbours(v); on success x.index holds the reached nodes in topological order.  Gives up
  // (false, x unchanged) when more than `limit` nodes are reached.
  template <class Neighbours>
  bool reach(FloatSparseVector& x, Neighbours&& neighbours) const;
  void eliminate(FloatSparseVector& x, const SparseVectors& lists, const std::vector<int>& dense_order) const;
  template <class Pivot, class DenseOrder>
  void substitute(FloatSparseVector& x, const ListPool& lists, const std::vector<int>& key, Pivot&& pivot,
                  DenseOrder&& dense_order) const;

  int m_ = 0;
  std::vector<int> position_of_row_, row_of_position_;  // the pivots pair each row with a position
  std::vector<double> diagonal_;  // per row: its pivot in U
  // L: per pivot row r, the (row i, multiplier) pairs of row i -= multiplier * row r, applied in
  // l_order_; l_rows_ is the transpose (per row i, the pairs (pivot row r, multiplier)).
  SparseVectors l_columns_, l_rows_;
  std::vector<int> l_order_;   // pivot rows with a nonempty L column, in elimination order
  std::vector<int> lt_order_;  // rows with a nonempty L row, in reverse elimination order
  std::size_t l_nonzeros_ = 0;
  // U without its diagonal, by row (position, value) and by position (row, value).  u_order_
  // lists rows in pivot order, -1 where a row moved to the end on an update: row u_order_[k]
  // has entries only at the positions of rows listed after it.
  ListPool u_rows_, u_columns_;
  std::vector<int> u_order_, u_rank_;
  std::size_t u_nonzeros_ = 0, factored_nonzeros_ = 0;
  // R: update e holds row r_row_[e] -= sum of multiplier * row i over its (row i, multiplier).
  SparseVectors r_etas_;
  std::vector<int> r_row_;
  int updates_ = 0;
  bool usable_ = false;  // false after a singular factorization or a failed update

  FloatSparseVector spike_;          // L and R applied to the entering column, for update()
  mutable FloatSparseVector dense_;  // the dense solves' vector
  mutable std::vector<char> visited_;
  mutable FloatSparseVector solved_;  // the triangular solves' results, swapped into place
  mutable std::vector<int> stack_, next_edge_, scratch_index_;
  std::vector<double> row_work_;  // update(): the row being eliminated, by position
};

}  // namespace plumb::simplex::detail
