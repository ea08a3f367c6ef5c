// Small textbook LPs: the float simplex must return a basis whose objective matches the known optimum.
#include "plumb/simplex/float_simplex.hpp"

#include <gtest/gtest.h>

#include <cmath>
#include <string>

namespace {

using plumb::model::ModelBuilder;
using plumb::model::Rational;
using plumb::simplex::FloatStatus;
using plumb::simplex::solve_float;
using plumb::simplex::VarStatus;

int basic_count(const plumb::simplex::Basis& basis) {
  int count = 0;
  for (auto s : basis.columns) count += s == VarStatus::basic;
  for (auto s : basis.rows) count += s == VarStatus::basic;
  return count;
}

// Chvatal, "Linear Programming" (1983), chapter 2, the first worked example: optimum 13 at
// x = (2, 0, 1).
TEST(FloatSimplexTextbook, ChvatalChapterTwo) {
  auto model = ModelBuilder("chvatal-2")
                   .maximise()
                   .column("x1", 5)
                   .column("x2", 4)
                   .column("x3", 3)
                   .row("c1", {{"x1", 2}, {"x2", 3}, {"x3", 1}}, {}, Rational(5))
                   .row("c2", {{"x1", 4}, {"x2", 1}, {"x3", 2}}, {}, Rational(11))
                   .row("c3", {{"x1", 3}, {"x2", 4}, {"x3", 2}}, {}, Rational(8))
                   .build();
  auto result = solve_float(model);
  ASSERT_EQ(result.status, FloatStatus::optimal) << result.note;
  EXPECT_NEAR(result.objective, 13.0, 1e-9);
  EXPECT_EQ(basic_count(result.basis), 3);
  EXPECT_EQ(result.basis.columns[0], VarStatus::basic);
  EXPECT_EQ(result.basis.columns[2], VarStatus::basic);
}

// Klee & Minty, "How good is the simplex algorithm?" (1972), in the common textbook form
//   max sum_j 2^(n-j) x_j,  2 sum_{j<i} 2^(i-j) x_j + x_i <= 5^i,  x >= 0,
// whose optimum is 5^n at x = (0, ..., 0, 5^n) (from memory; common practice in textbooks).
TEST(FloatSimplexTextbook, KleeMinty) {
  for (int n = 3; n <= 8; ++n) {
    ModelBuilder builder("klee-minty-" + std::to_string(n));
    builder.maximise();
    for (int j = 1; j <= n; ++j) builder.column("x" + std::to_string(j), Rational(1 << (n - j)));
    Rational rhs = 1;
    for (int i = 1; i <= n; ++i) {
      rhs *= 5;
      std::vector<std::pair<std::string, Rational>> terms;
      for (int j = 1; j < i; ++j) terms.push_back({"x" + std::to_string(j), Rational(2 * (1 << (i - j)))});
      terms.push_back({"x" + std::to_string(i), Rational(1)});
      builder.row("r" + std::to_string(i), terms, {}, rhs);
    }
    auto model = builder.build();
    auto result = solve_float(model);
    ASSERT_EQ(result.status, FloatStatus::optimal) << "n=" << n << ": " << result.note;
    EXPECT_NEAR(result.objective, std::pow(5.0, n), 1e-9 * std::pow(5.0, n)) << "n=" << n;
    EXPECT_EQ(basic_count(result.basis), n);
  }
}

}  // namespace

namespace {

// Facts of the trade: x >= 0 cannot make x1 + x2 <= -1, and max x1 with only x1 - x2 <= 1
// grows without end along x1 = x2 + 1.
TEST(FloatSimplexTextbook, InfeasibleAndUnbounded) {
  auto infeasible = ModelBuilder("infeasible")
                        .column("x1", 1)
                        .column("x2", 1)
                        .row("r", {{"x1", 1}, {"x2", 1}}, {}, Rational(-1))
                        .build();
  EXPECT_EQ(solve_float(infeasible).status, FloatStatus::infeasible);
  auto unbounded = ModelBuilder("unbounded")
                       .maximise()
                       .column("x1", 1)
                       .column("x2", 0)
                       .row("r", {{"x1", 1}, {"x2", -1}}, {}, Rational(1))
                       .build();
  EXPECT_EQ(solve_float(unbounded).status, FloatStatus::unbounded);
}

// Invented: min -x1 - x2 with x1 - x2 <= 1 has no dual feasible basis, so the dual phase 1 ends
// without one; the search must still name the edge of the ray (x1 = x2 + 1 grows without end),
// from a feasible basis, for the exact side to prove.
TEST(FloatSimplexTextbook, UnboundedAfterDualPhaseOneNamesTheRay) {
  auto model = ModelBuilder("no-dual-feasible-basis")
                   .column("x1", -1)
                   .column("x2", -1)
                   .row("r", {{"x1", 1}, {"x2", -1}}, {}, Rational(1))
                   .build();
  auto result = solve_float(model);
  ASSERT_EQ(result.status, FloatStatus::unbounded) << result.note;
  ASSERT_GE(result.ray_variable, 0) << result.note;
  ASSERT_LT(result.ray_variable, 3);
  const int k = result.ray_variable;
  EXPECT_NE(k < 2 ? result.basis.columns[k] : result.basis.rows[0], VarStatus::basic);  // it enters
  // With a requirement no point meets as well, the search must say infeasible rather than
  // unbounded: tests/simplex/zero_cost_search_test.cpp, infeasible_and_dual_infeasible().
}

// Free columns, a ranged row and an equation (worked by hand): min x - y with y free,
// 1 <= x + y <= 4 and x - y = -2, x in [0, 10]; y = x + 2 so x + y = 2x + 2 in [1, 4] gives
// x in [0, 1]; x - y = -2 always, so every feasible point has objective -2.
TEST(FloatSimplexTextbook, FreeColumnRangedRowAndEquation) {
  auto model = ModelBuilder("free-range")
                   .column("x", 1, Rational(0), Rational(10))
                   .column("y", -1, {}, {})
                   .row("range", {{"x", 1}, {"y", 1}}, Rational(1), Rational(4))
                   .row("equation", {{"x", 1}, {"y", -1}}, Rational(-2), Rational(-2))
                   .build();
  auto result = solve_float(model);
  ASSERT_EQ(result.status, FloatStatus::optimal) << result.note;
  EXPECT_NEAR(result.objective, -2.0, 1e-9);
  EXPECT_EQ(basic_count(result.basis), 2);
}

}  // namespace
