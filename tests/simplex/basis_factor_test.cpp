// The sparse LU of simplex bases: solves against exact rational elimination, and eta updates.
#include "simplex/basis_factor.hpp"

#include "plumb/numeric/rational.hpp"

#include <gtest/gtest.h>

#include <cmath>
#include <optional>
#include <random>
#include <string>
#include <vector>

namespace {

using plumb::numeric::Rational;
using plumb::simplex::detail::BasisFactor;
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

// ftran and btran of b agree with the exact solutions of A x = b and A^T y = b.
void expect_solves_exactly(const BasisFactor& factor, const std::vector<std::vector<int>>& a, const std::vector<int>& b,
                           double tolerance, const std::string& context) {
  auto x = exact_solve(a, b, false);
  auto y = exact_solve(a, b, true);
  ASSERT_TRUE(x && y) << context;
  std::vector<double> fx(b.begin(), b.end()), by(b.begin(), b.end());
  factor.ftran(fx);
  factor.btran(by);
  for (std::size_t i = 0; i < b.size(); ++i) {
    double ex = plumb::numeric::to_double((*x)[i]), ey = plumb::numeric::to_double((*y)[i]);
    EXPECT_NEAR(fx[i], ex, tolerance * (1 + std::abs(ex))) << context << " ftran " << i;
    EXPECT_NEAR(by[i], ey, tolerance * (1 + std::abs(ey))) << context << " btran " << i;
  }
}

// Source of truth: exact rational elimination (the definition of the solution, common practice).
TEST(BasisFactor, SolvesMatchExactEliminationOnRandomSparseMatrices) {
  std::mt19937 random(7);
  std::uniform_int_distribution<int> rhs(-5, 5);
  int checked = 0;
  for (int trial = 0; trial < 60; ++trial) {
    const int m = 5 + trial % 20;
    auto a = random_matrix(m, 0.15, random);
    std::vector<int> b(m);
    for (int& v : b) v = rhs(random);
    if (!exact_solve(a, b, false)) continue;
    BasisFactor factor;
    ASSERT_TRUE(factor.factorize(m, columns_of(a)).empty()) << "trial " << trial;
    expect_solves_exactly(factor, a, b, 1e-9, "trial " + std::to_string(trial));
    ++checked;
  }
  EXPECT_GT(checked, 40);
}

// Replacing columns one at a time through eta updates must solve like a fresh factorization
// of the changed matrix (product form of the inverse, Dantzig & Orchard-Hays 1954).
TEST(BasisFactor, EtaUpdatesSolveTheChangedMatrix) {
  std::mt19937 random(11);
  std::uniform_int_distribution<int> value(-9, 9);
  const int m = 15;
  auto a = random_matrix(m, 0.2, random);
  BasisFactor factor;
  ASSERT_TRUE(factor.factorize(m, columns_of(a)).empty());
  int updates = 0;
  for (int round = 0; round < 40 && updates < 10; ++round) {
    int p = std::uniform_int_distribution<int>(0, m - 1)(random);
    std::vector<int> column(m);
    for (int& v : column) v = random() % 3 == 0 ? value(random) : 0;
    std::vector<double> alpha(column.begin(), column.end());
    factor.ftran(alpha);
    if (std::abs(alpha[p]) < 0.1) continue;  // keep the changed matrix well away from singular
    factor.update(p, alpha);
    for (int i = 0; i < m; ++i) a[i][p] = column[i];
    ++updates;
    std::vector<int> b(m);
    for (int& v : b) v = value(random);
    expect_solves_exactly(factor, a, b, 1e-8, "update " + std::to_string(updates));
  }
  EXPECT_EQ(updates, 10);
}

// A singular matrix: the factorization names as many positions as rows it could not pivot.
TEST(BasisFactor, ReportsSingularPositionsAndRows) {
  std::vector<std::vector<int>> a = {{1, 2, 3}, {2, 4, 6}, {0, 0, 1}};  // row 2 = 2 * row 1
  BasisFactor factor;
  auto singular = factor.factorize(3, columns_of(a));
  EXPECT_EQ(singular.positions.size(), 1u);
  EXPECT_EQ(singular.rows.size(), 1u);
}

}  // namespace
