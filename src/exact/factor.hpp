// Internal to the exact engine: sparse rational vectors and the exact LU factorization of a basis.
#pragma once

#include "plumb/numeric/rational.hpp"
#include "plumb/run/budget.hpp"

#include <utility>
#include <vector>

namespace plumb::exact::detail {

using numeric::Rational;

// acc -= a * b, through a reused temporary instead of a fresh mpq per product.
inline void subtract_product(Rational& acc, const Rational& a, const Rational& b, Rational& scratch) {
  mpq_mul(scratch.backend().data(), a.backend().data(), b.backend().data());
  mpq_sub(acc.backend().data(), acc.backend().data(), scratch.backend().data());
}
inline void add_product(Rational& acc, const Rational& a, const Rational& b, Rational& scratch) {
  mpq_mul(scratch.backend().data(), a.backend().data(), b.backend().data());
  mpq_add(acc.backend().data(), acc.backend().data(), scratch.backend().data());
}
// Limbs of numerator and denominator: the cost of arithmetic with the value grows with it.
inline std::size_t limbs(const Rational& value) {
  return mpz_size(mpq_numref(value.backend().data())) + mpz_size(mpq_denref(value.backend().data()));
}
inline bool is_zero(const Rational& value) { return mpq_sgn(value.backend().data()) == 0; }
inline int sign_of(const Rational& value) { return mpq_sgn(value.backend().data()); }

// A dense array of rationals with the list of positions that may be non-zero, so that clearing
// and iterating cost the number of non-zeros, not the dimension.
class RationalSparseVector {
 public:
  explicit RationalSparseVector(int size = 0) { resize(size); }
  void resize(int size);
  int size() const { return static_cast<int>(values_.size()); }
  void clear();
  // Mutable access that records the position as possibly non-zero.
  Rational& at(int i) {
    if (!listed_[i]) listed_[i] = 1, index_.push_back(i);
    return values_[i];
  }
  const Rational& operator[](int i) const { return values_[i]; }
  // Positions possibly non-zero (some may hold zero after cancellation), in insertion order.
  const std::vector<int>& pattern() const { return index_; }
  // Drops listed zeros and sorts the pattern, for deterministic traversal.
  void tidy();
  // Exchanges the values at a position with `value` (mpq swap: no copy).
  void swap_in(int i, Rational& value) { at(i).backend().swap(value.backend()); }
  void swap_out(int i, Rational& value) { values_[i].backend().swap(value.backend()); }

 private:
  std::vector<Rational> values_;
  std::vector<char> listed_;
  std::vector<int> index_;
};

// One column of a basis matrix: row indices and values.
struct SparseColumn {
  std::vector<int> rows;
  std::vector<Rational> values;
};

// Exact LU factorization of a square basis matrix, chosen for sparsity by the Markowitz rule
// (H. M. Markowitz, "The elimination form of the inverse and its application to linear
// programming", Management Science 3, 1957): in exact arithmetic every non-zero pivot is stable,
// so only fill matters.  Later basis changes are kept as a product-form eta file
// (G. B. Dantzig and W. Orchard-Hays, "The product form for the inverse in the simplex method",
// 1954) until the next refactorization.
class RationalBasisFactor {
 public:
  // Factorizes the m x k matrix whose columns are given.  Columns found dependent on earlier
  // ones, and columns beyond the rank, are reported in dependent_columns; rows that got no pivot
  // in uncovered_rows.  The factor is usable only when both lists are empty and k == m.
  void factorize(int m, const std::vector<SparseColumn>& columns);
  // Polled once per pivot: factorize throws run::Stopped when it is exhausted (a large exact
  // basis can take minutes).
  run::Budget* budget = nullptr;
  const std::vector<int>& dependent_columns() const { return dependent_columns_; }
  const std::vector<int>& uncovered_rows() const { return uncovered_rows_; }
  bool nonsingular() const { return dependent_columns_.empty() && uncovered_rows_.empty(); }

  // Solves B x = b.  b is indexed by row on entry; on return `result` holds x indexed by basis
  // position and b is cleared.
  void ftran(RationalSparseVector& b, RationalSparseVector& result);
  // Solves B^T y = c.  c is indexed by basis position; on return `result` holds y indexed by row
  // and c is cleared.
  void btran(RationalSparseVector& c, RationalSparseVector& result);

  // B^T y = c in doubles through rounded copies of the same factors: an estimate for pricing,
  // never a decision.  c (by basis position) is overwritten; y is indexed by row.
  void estimate_btran(std::vector<double>& c, std::vector<double>& y) const;

  // Records that basis position `position` now holds the column whose ftran is `alpha`.
  void update(int position, const RationalSparseVector& alpha);
  int updates() const { return static_cast<int>(etas_.size()); }
  // Sizes in limbs: applying the eta file costs about eta_limbs(), the LU about factor_limbs().
  std::size_t eta_limbs() const { return eta_limbs_; }
  std::size_t factor_limbs() const { return factor_limbs_; }

 private:
  struct Pivot {
    int row;
    int position;
    Rational value;
    std::vector<std::pair<int, Rational>> lower;        // (row, multiplier) eliminated below
    std::vector<std::pair<int, Rational>> upper_row;    // (position, value) of later pivots
    // Double copies for estimate_btran, in the same order.
    double value_estimate = 0;
    std::vector<double> lower_estimate, upper_row_estimate;
  };
  struct Eta {
    int position;
    Rational pivot;
    std::vector<std::pair<int, Rational>> others;  // (position, alpha) for position != pivot's
    double pivot_estimate = 0;
    std::vector<double> others_estimate;
  };
  int m_ = 0;
  std::vector<Pivot> pivots_;
  // Column-wise copy of U: for each position, (row of an earlier pivot, value).
  std::vector<std::vector<std::pair<int, Rational>>> upper_column_;
  std::vector<Eta> etas_;
  std::vector<int> dependent_columns_;
  std::vector<int> uncovered_rows_;
  std::size_t eta_limbs_ = 0;
  std::size_t factor_limbs_ = 0;
  Rational scratch_;
  Rational value_;
};

}  // namespace plumb::exact::detail
