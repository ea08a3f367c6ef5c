// The sparse LU of simplex bases: solves against exact rational elimination, Forrest-Tomlin
// updates, and the sparse and dense solve paths against each other.
#include "simplex/basis_factor.hpp"

#include "plumb/numeric/rational.hpp"

#include <gtest/gtest.h>

#include <algorithm>
#include <cmath>
#include <optional>
#include <random>
#include <string>
#include <vector>

namespace {

using plumb::numeric::Rational;
using plumb::simplex::detail::FloatBasisFactor;
using plumb::simplex::detail::FloatSparseVector;
using plumb::simplex::detail::SparseVectors;

// A random sparse m x m matrix with small integer entries and a nonzero diagonal (so it is
// usually nonsingular), columns permuted so the factorization has to find the diagonal.
std::vector<std::vector<int>> random_matrix(int m, double density, std::mt19937& random) {
  std::uniform_real_distribution<double> unit(0, 1);
  std::uniform_int_distribution<int> value(-9, 9);
  std::vector<std::vector<int>> a(m, std::vector<int>(m, 0));
  for (int i = 0; i < m; ++i)
    for (int j = 0; j < m; ++j)
      if (i == j || unit(random) < density) a[i][j] = value(random);
  for (int i = 0; i < m; ++i)
    if (a[i][i] == 0) a[i][i] = 10;
  std::vector<int> order(m);
  for (int j = 0; j < m; ++j) order[j] = j;
  std::shuffle(order.begin(), order.end(), random);
  std::vector<std::vector<int>> permuted(m, std::vector<int>(m));
  for (int i = 0; i < m; ++i)
    for (int j = 0; j < m; ++j) permuted[i][j] = a[i][order[j]];
  return permuted;
}

SparseVectors columns_of(const std::vector<std::vector<int>>& a) {
  SparseVectors columns;
  const int m = static_cast<int>(a.size());
  for (int j = 0; j < m; ++j) {
    for (int i = 0; i < m; ++i)
      if (a[i][j] != 0) columns.push(i, a[i][j]);
    columns.close();
  }
  return columns;
}

// Exact solution of A x = b by Gauss-Jordan elimination in rationals (nullopt if singular).
std::optional<std::vector<Rational>> exact_solve(const std::vector<std::vector<int>>& a, const std::vector<int>& b,
                                                 bool transposed) {
  const int m = static_cast<int>(a.size());
  std::vector<std::vector<Rational>> t(m, std::vector<Rational>(m + 1));
  for (int i = 0; i < m; ++i) {
    for (int j = 0; j < m; ++j) t[i][j] = transposed ? a[j][i] : a[i][j];
    t[i][m] = b[i];
  }
  for (int k = 0; k < m; ++k) {
    int p = k;
    while (p < m && t[p][k] == 0) ++p;
    if (p == m) return std::nullopt;
    std::swap(t[p], t[k]);
    for (int i = 0; i < m; ++i) {
      if (i == k || t[i][k] == 0) continue;
      Rational f = t[i][k] / t[k][k];
      for (int j = k; j <= m; ++j) t[i][j] -= f * t[k][j];
    }
  }
  std::vector<Rational> x(m);
  for (int i = 0; i < m; ++i) x[i] = t[i][m] / t[i][i];
  return x;
}

// The factor's two ways of solving: always the depth-first sparse path, or always dense loops.
enum class Path { sparse, dense };

void use_path(FloatBasisFactor& factor, Path path) {
  factor.sparse_density = path == Path::sparse ? 1.0 : 0.0;
}

FloatSparseVector sparse_of(const std::vector<int>& b) {
  FloatSparseVector v;
  v.reset(static_cast<int>(b.size()));
  for (std::size_t i = 0; i < b.size(); ++i)
    if (b[i] != 0) v.add(static_cast<int>(i), b[i]);
  return v;
}

// Each nonzero is listed exactly once in a solve's result.
void expect_index_exact(const FloatSparseVector& v, const std::string& context) {
  std::vector<int> listed(v.values.size(), 0);
  for (int i : v.index) ++listed[i];
  for (std::size_t i = 0; i < v.values.size(); ++i) {
    EXPECT_LE(listed[i], 1) << context << " entry " << i << " listed twice";
    if (v.values[i] != 0) {
      EXPECT_EQ(listed[i], 1) << context << " entry " << i << " not listed";
    }
  }
}

// ftran and btran of b (dense and sparse interfaces) agree with the exact solutions of A x = b
// and A^T y = b.
void expect_solves_exactly(const FloatBasisFactor& factor, const std::vector<std::vector<int>>& a,
                           const std::vector<int>& b, double tolerance, const std::string& context) {
  auto x = exact_solve(a, b, false);
  auto y = exact_solve(a, b, true);
  ASSERT_TRUE(x && y) << context;
  std::vector<double> fx(b.begin(), b.end()), by(b.begin(), b.end());
  factor.ftran(fx);
  factor.btran(by);
  FloatSparseVector sx = sparse_of(b), sy = sparse_of(b);
  factor.ftran(sx);
  factor.btran(sy);
  expect_index_exact(sx, context + " sparse ftran");
  expect_index_exact(sy, context + " sparse btran");
  for (std::size_t i = 0; i < b.size(); ++i) {
    double ex = plumb::numeric::to_double((*x)[i]), ey = plumb::numeric::to_double((*y)[i]);
    EXPECT_NEAR(fx[i], ex, tolerance * (1 + std::abs(ex))) << context << " ftran " << i;
    EXPECT_NEAR(by[i], ey, tolerance * (1 + std::abs(ey))) << context << " btran " << i;
    EXPECT_NEAR(sx[i], ex, tolerance * (1 + std::abs(ex))) << context << " sparse ftran " << i;
    EXPECT_NEAR(sy[i], ey, tolerance * (1 + std::abs(ey))) << context << " sparse btran " << i;
  }
}

// Source of truth: exact rational elimination (the definition of the solution, common practice).
TEST(FloatBasisFactor, SolvesMatchExactEliminationOnRandomSparseMatrices) {
  std::mt19937 random(7);
  std::uniform_int_distribution<int> rhs(-5, 5);
  int checked = 0;
  for (int trial = 0; trial < 60; ++trial) {
    const int m = 5 + trial % 20;
    auto a = random_matrix(m, 0.15, random);
    std::vector<int> b(m);
    for (int& v : b) v = rhs(random);
    if (!exact_solve(a, b, false)) continue;
    for (Path path : {Path::sparse, Path::dense}) {
      FloatBasisFactor factor;
      use_path(factor, path);
      ASSERT_TRUE(factor.factorize(m, columns_of(a)).empty()) << "trial " << trial;
      expect_solves_exactly(factor, a, b, 1e-9, "trial " + std::to_string(trial));
    }
    ++checked;
  }
  EXPECT_GT(checked, 40);
}

// How the elimination ends: by Markowitz steps only, on a dense copy from the first step, or
// switching to the dense copy once the active submatrix fills in (the engine's setting).
enum class Tail { sparse_only, dense_from_start, dense_when_filled };

void use_tail(FloatBasisFactor& factor, Tail tail) {
  factor.dense_share = tail == Tail::sparse_only ? 2.0 : tail == Tail::dense_from_start ? 0.0 : 0.3;
  factor.dense_minimum = tail == Tail::dense_from_start ? 1 : 16;
}

// Replaces column p of `a` by `column` through ftran_entering and update; false when the
// changed matrix would be close to singular (then nothing changes).
bool replace_column(FloatBasisFactor& factor, std::vector<std::vector<int>>& a, int p,
                    const std::vector<int>& column) {
  FloatSparseVector alpha = sparse_of(column);
  factor.ftran_entering(alpha);
  if (std::abs(alpha[p]) < 0.1) return false;
  EXPECT_TRUE(factor.update(p, alpha[p]));
  for (std::size_t i = 0; i < a.size(); ++i) a[i][p] = column[i];
  return true;
}

// Source of truth: exact rational elimination (common practice).  Matrices dense enough to fill
// in, each eliminated the three ways, solved and then updated.
TEST(FloatBasisFactor, DenseTailSolvesLikeTheSparseElimination) {
  std::mt19937 random(5);
  std::uniform_int_distribution<int> rhs(-5, 5);
  for (int trial = 0; trial < 8; ++trial) {
    const int m = 18 + 2 * trial;
    auto a = random_matrix(m, 0.25, random);
    std::vector<int> b(m);
    for (int& v : b) v = rhs(random);
    if (!exact_solve(a, b, false)) continue;
    for (Tail tail : {Tail::sparse_only, Tail::dense_from_start, Tail::dense_when_filled}) {
      const std::string context =
          "trial " + std::to_string(trial) + " tail " + std::to_string(static_cast<int>(tail));
      FloatBasisFactor factor;
      use_tail(factor, tail);
      ASSERT_TRUE(factor.factorize(m, columns_of(a)).empty()) << context;
      expect_solves_exactly(factor, a, b, 1e-9, context);
      auto changed = a;
      std::vector<int> column(m);
      for (int& v : column) v = rhs(random);
      if (replace_column(factor, changed, trial % m, column) && exact_solve(changed, b, false))
        expect_solves_exactly(factor, changed, b, 1e-8, context + " after an update");
    }
  }
}

// Replacing columns one at a time through Forrest-Tomlin updates must solve like a fresh
// factorization of the changed matrix; checked against exact elimination after each update,
// on both solve paths.
TEST(FloatBasisFactor, UpdatesSolveTheChangedMatrix) {
  for (Path path : {Path::sparse, Path::dense}) {
    std::mt19937 random(11);
    std::uniform_int_distribution<int> value(-9, 9);
    const int m = 15;
    auto a = random_matrix(m, 0.2, random);
    FloatBasisFactor factor;
    use_path(factor, path);
    ASSERT_TRUE(factor.factorize(m, columns_of(a)).empty());
    int updates = 0;
    for (int round = 0; round < 100 && updates < 30; ++round) {
      int p = std::uniform_int_distribution<int>(0, m - 1)(random);
      std::vector<int> column(m);
      for (int& v : column) v = random() % 3 == 0 ? value(random) : 0;
      if (!replace_column(factor, a, p, column)) continue;
      ++updates;
      EXPECT_EQ(factor.update_count(), updates);
      std::vector<int> b(m);
      for (int& v : b) v = value(random);
      expect_solves_exactly(factor, a, b, 1e-8, "update " + std::to_string(updates));
    }
    EXPECT_EQ(updates, 30);
  }
}

// Larger and sparser, like a simplex basis (mostly unit columns, a few structural ones): a long
// run of updates, then the relative residual of B x = b and B^T y = b, sparse against dense.
TEST(FloatBasisFactor, LongUpdateRunsKeepSmallResiduals) {
  std::mt19937 random(5);
  std::uniform_int_distribution<int> value(-9, 9);
  const int m = 300;
  std::vector<std::vector<int>> a(m, std::vector<int>(m, 0));
  for (int i = 0; i < m; ++i) a[i][i] = 1;
  auto random_column = [&](int p) {
    std::vector<int> column(m, 0);
    for (int t = 0; t < 3; ++t) column[random() % m] = value(random);
    column[p] = 1 + random() % 9;
    return column;
  };
  FloatBasisFactor sparse, dense;
  use_path(sparse, Path::sparse);
  use_path(dense, Path::dense);
  sparse.update_limit = dense.update_limit = 1000;
  ASSERT_TRUE(sparse.factorize(m, columns_of(a)).empty());
  ASSERT_TRUE(dense.factorize(m, columns_of(a)).empty());
  int updates = 0;
  for (int round = 0; round < 2000 && updates < 250; ++round) {
    int p = random() % m;
    auto column = random_column(p);
    auto before = a;
    if (!replace_column(sparse, a, p, column)) continue;
    a = before;
    ASSERT_TRUE(replace_column(dense, a, p, column));
    ++updates;
  }
  ASSERT_EQ(updates, 250);
  std::vector<int> b(m, 0);
  for (int t = 0; t < 5; ++t) b[random() % m] = value(random);
  for (bool transposed : {false, true}) {
    FloatSparseVector xs = sparse_of(b), xd = sparse_of(b);
    if (transposed) sparse.btran(xs), dense.btran(xd);
    else sparse.ftran(xs), dense.ftran(xd);
    expect_index_exact(xs, "sparse");
    double worst = 0, gap = 0;
    for (int i = 0; i < m; ++i) {
      double r = -b[i], size = std::abs(b[i]);
      for (int j = 0; j < m; ++j) {
        double term = (transposed ? a[j][i] : a[i][j]) * xs[j];
        r += term;
        size += std::abs(term);
      }
      worst = std::max(worst, std::abs(r) / (1 + size));
      gap = std::max(gap, std::abs(xs[i] - xd[i]) / (1 + std::abs(xd[i])));
    }
    EXPECT_LT(worst, 1e-9) << (transposed ? "btran" : "ftran") << " residual";
    EXPECT_LT(gap, 1e-10) << (transposed ? "btran" : "ftran") << " sparse against dense";
  }
}

// An update whose pivot disagrees with the alpha given (a factor gone wrong, or a column that
// makes the basis singular) is refused, and a fresh factorization is then due.
TEST(FloatBasisFactor, UpdateRefusesAPivotThatDisagreesWithAlpha) {
  std::vector<std::vector<int>> a = {{2, 0, 1}, {0, 3, 0}, {1, 0, 4}};
  FloatBasisFactor factor;
  ASSERT_TRUE(factor.factorize(3, columns_of(a)).empty());
  FloatSparseVector alpha = sparse_of({0, 3, 0});  // column 1 again: alpha = e_1
  factor.ftran_entering(alpha);
  EXPECT_NEAR(alpha[1], 1.0, 1e-15);
  EXPECT_FALSE(factor.update(1, 2.0));
  EXPECT_TRUE(factor.refactor_due());
  ASSERT_TRUE(factor.factorize(3, columns_of(a)).empty());
  EXPECT_FALSE(factor.refactor_due());
  // Column 0 replaced by 2 * column 2: singular, the new pivot is zero.
  alpha = sparse_of({2, 0, 8});
  factor.ftran_entering(alpha);
  EXPECT_NEAR(alpha[0], 0.0, 1e-15);
  EXPECT_FALSE(factor.update(0, alpha[0]));
  EXPECT_TRUE(factor.refactor_due());
}

// A fresh factorization is due after update_limit updates.
TEST(FloatBasisFactor, RefactorizationIsDueAfterTheUpdateLimit) {
  std::vector<std::vector<int>> a = {{1, 0}, {0, 1}};
  FloatBasisFactor factor;
  factor.update_limit = 3;
  ASSERT_TRUE(factor.factorize(2, columns_of(a)).empty());
  for (int k = 0; k < 3; ++k) {
    EXPECT_FALSE(factor.refactor_due());
    FloatSparseVector alpha = sparse_of({k + 2, 1});
    factor.ftran_entering(alpha);
    EXPECT_TRUE(factor.update(0, alpha[0]));
  }
  EXPECT_TRUE(factor.refactor_due());
}

// A nearly singular matrix (one column within 1e-13 of a multiple of another) counts as
// singular: its last pivot falls below the absolute tolerance (common practice).
TEST(FloatBasisFactor, NearlySingularMatrixIsReportedSingular) {
  SparseVectors columns;
  columns.push(0, 1), columns.push(1, 2), columns.close();
  columns.push(0, 2), columns.push(1, 4 + 1e-13), columns.close();
  FloatBasisFactor factor;
  auto singular = factor.factorize(2, columns);
  EXPECT_EQ(singular.positions.size(), 1u);
  EXPECT_TRUE(factor.refactor_due());
}

// A singular matrix: the factorization names as many positions as rows it could not pivot,
// whether the sparse steps or the dense copy meet the dependence.
TEST(FloatBasisFactor, ReportsSingularPositionsAndRows) {
  std::vector<std::vector<int>> a = {{1, 2, 3}, {2, 4, 6}, {0, 0, 1}};  // row 2 = 2 * row 1
  for (Tail tail : {Tail::sparse_only, Tail::dense_from_start}) {
    FloatBasisFactor factor;
    use_tail(factor, tail);
    auto singular = factor.factorize(3, columns_of(a));
    EXPECT_EQ(singular.positions.size(), 1u);
    EXPECT_EQ(singular.rows.size(), 1u);
  }
}

}  // namespace
