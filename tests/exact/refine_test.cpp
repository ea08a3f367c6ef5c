// Exact basis solves by float LU, iterative refinement and rational reconstruction, checked
// against the exact rational LU (both must agree: the solution of a nonsingular system is unique).
#include "exact/factor.hpp"
#include "exact/refine.hpp"

#include <gtest/gtest.h>

#include <chrono>
#include <cmath>
#include <optional>
#include <random>
#include <thread>
#include <vector>

namespace plumb::exact::detail {
namespace {

using Columns = std::vector<SparseColumn>;

// Exact reference by the rational LU: x with B x = b, or y with B^T y = b.
std::optional<std::vector<Rational>> reference(int m, const Columns& columns, const std::vector<Rational>& b,
                                               bool transposed) {
  RationalBasisFactor factor;
  factor.factorize(m, columns);
  if (!factor.nonsingular()) return std::nullopt;
  RationalSparseVector in(m), out(m);
  for (int i = 0; i < m; ++i)
    if (b[i] != 0) in.at(i) = b[i];
  if (transposed) factor.btran(in, out);
  else factor.ftran(in, out);
  std::vector<Rational> result(static_cast<std::size_t>(m));
  for (int i = 0; i < m; ++i) result[i] = out[i];
  return result;
}

// Checks B x = b (or B^T x = b) directly, by multiplication.
bool satisfies(int m, const Columns& columns, const std::vector<Rational>& x, const std::vector<Rational>& b,
               bool transposed) {
  std::vector<Rational> product(static_cast<std::size_t>(m), Rational(0));
  for (int j = 0; j < m; ++j)
    for (std::size_t e = 0; e < columns[j].rows.size(); ++e) {
      int r = columns[j].rows[e];
      if (transposed) product[j] += columns[j].values[e] * x[r];
      else product[r] += columns[j].values[e] * x[j];
    }
  return product == b;
}

// A random sparse matrix with a full diagonal (so that it is nonsingular for most draws) and
// integer or small-fraction entries.
Columns random_matrix(int m, double density, bool fractions, std::mt19937& random) {
  std::uniform_real_distribution<double> coin(0, 1);
  std::uniform_int_distribution<int> numerator(-9, 9), denominator(1, 7);
  Columns columns(static_cast<std::size_t>(m));
  for (int j = 0; j < m; ++j)
    for (int i = 0; i < m; ++i) {
      if (i != j && coin(random) > density) continue;
      int top = numerator(random);
      if (top == 0) top = i == j ? 5 : 1;
      columns[j].rows.push_back(i);
      columns[j].values.push_back(fractions ? Rational(top, denominator(random)) : Rational(top));
    }
  return columns;
}

std::vector<Rational> random_vector(int m, bool fractions, std::mt19937& random) {
  std::uniform_int_distribution<int> numerator(-20, 20), denominator(1, 11);
  std::vector<Rational> b(static_cast<std::size_t>(m));
  for (auto& v : b) v = fractions ? Rational(numerator(random), denominator(random)) : Rational(numerator(random));
  return b;
}

// Both routes agree, in both directions, whenever the refinement answers; returns how often it did.
int compare_routes(int m, const Columns& columns, const std::vector<Rational>& b) {
  RefinedSolver solver;
  int answered = 0;
  bool factored = solver.factorize(m, columns);
  for (bool transposed : {false, true}) {
    auto expected = reference(m, columns, b, transposed);
    if (!factored) continue;
    auto found = transposed ? solver.solve_transposed(b) : solver.solve(b);
    if (!found) continue;
    ++answered;
    EXPECT_TRUE(satisfies(m, columns, *found, b, transposed));
    if (!expected) {
      ADD_FAILURE() << "refinement answered for a singular matrix";
      continue;
    }
    EXPECT_EQ(*found, *expected);
  }
  return answered;
}

// Random trials of growing size; well-conditioned systems, so refinement always answers.
void random_trials(unsigned seed, int trials, int first_size, int growth, double density, bool fractions) {
  std::mt19937 random(seed);
  int answered = 0;
  for (int trial = 0; trial < trials; ++trial) {
    int m = first_size + trial * growth;
    Columns columns = random_matrix(m, density, fractions, random);
    answered += compare_routes(m, columns, random_vector(m, fractions || trial % 2 == 1, random));
  }
  EXPECT_EQ(answered, 2 * trials);
}

TEST(Refine, RandomSparseIntegerMatricesAgreeWithRationalLU) { random_trials(20261201, 30, 5, 2, 0.15, false); }

TEST(Refine, RandomSparseRationalMatricesAgreeWithRationalLU) { random_trials(7, 20, 8, 3, 0.1, true); }

// Hilbert matrices H_ij = 1/(i+j+1) are the textbook ill-conditioned example (cond(H_8) is about
// 1.5e10, cond(H_12) about 1.7e16: from memory).  Embedded as a block beside an identity.
Columns hilbert_block(int n, int extra) {
  int m = n + extra;
  Columns columns(static_cast<std::size_t>(m));
  for (int j = 0; j < n; ++j)
    for (int i = 0; i < n; ++i) {
      columns[j].rows.push_back(i);
      columns[j].values.push_back(Rational(1, i + j + 1));
    }
  for (int j = n; j < m; ++j) {
    columns[j].rows = {j, 0};
    columns[j].values = {Rational(-1), Rational(j)};
  }
  return columns;
}

TEST(Refine, HilbertBlocksAreSolvedOrRefusedButNeverWrong) {
  std::mt19937 random(3);
  for (int n : {4, 6, 8, 10}) {
    Columns columns = hilbert_block(n, 5);
    int m = n + 5;
    EXPECT_EQ(compare_routes(m, columns, random_vector(m, true, random)), 2) << "Hilbert block of order " << n;
  }
  for (int n : {12, 14}) {  // beyond double precision: either answer is acceptable, a wrong one is not
    Columns columns = hilbert_block(n, 3);
    compare_routes(n + 3, columns, random_vector(n + 3, true, random));
  }
}

// Approximations stop short of reconstruction yet lie within their stated error of the exact
// solution (with the margin their users allow: the error is an estimate), in both directions.
// Source of truth: the rational LU (common practice).
TEST(Refine, ApproximationsLieWithinTheirErrorOfTheSolution) {
  std::mt19937 random(41);
  for (int trial = 0; trial < 10; ++trial) {
    const int m = 6 + 3 * trial;
    Columns columns = random_matrix(m, 0.3, true, random);
    std::vector<Rational> b = random_vector(m, true, random);
    RefinedSolver solver;
    if (!solver.factorize(m, columns)) continue;
    for (bool transposed : {false, true}) {
      auto exact = reference(m, columns, b, transposed);
      auto near = transposed ? solver.approximate_transposed(b, 96) : solver.approximate(b, 96);
      ASSERT_TRUE(exact && near) << "trial " << trial;
      ASSERT_EQ(near->values.size(), static_cast<std::size_t>(m));
      EXPECT_LT(near->error, 1e-20) << "trial " << trial;
      for (int j = 0; j < m; ++j) {
        const double value = numeric::to_double((*exact)[j]);
        EXPECT_NEAR(near->values[j], value, 0x1p16 * near->error + 0x1p-50 * std::abs(value))
            << "trial " << trial << (transposed ? " y " : " x ") << j;
      }
    }
  }
}

TEST(Refine, LargeDenominatorsAreRecovered) {
  // Diagonal entries that are distinct primes: the solution's denominator is their product.
  const int primes[] = {101, 103, 107, 109, 113, 127, 131, 137, 139, 149, 151, 157};
  int m = 12;
  Columns columns(static_cast<std::size_t>(m));
  for (int j = 0; j < m; ++j) {
    columns[j].rows = {j};
    columns[j].values = {Rational(primes[j], 3)};
    if (j + 1 < m) columns[j].rows.push_back(j + 1), columns[j].values.push_back(Rational(1));
  }
  std::vector<Rational> b(static_cast<std::size_t>(m), Rational(1));
  EXPECT_EQ(compare_routes(m, columns, b), 2);
}

TEST(Refine, EntriesBeyondSixtyFourBitsAreExact) {
  // Constructed case: diagonal entries 2^70 + j beside entries 1/3 and -1 below them, so that the
  // integer-scaled matrix holds entries both within and beyond a machine word.
  const Rational big = Rational(numeric::Integer(1) << 70);
  int m = 8;
  Columns columns(static_cast<std::size_t>(m));
  for (int j = 0; j < m; ++j) {
    columns[j].rows = {j};
    columns[j].values = {big + j};
    if (j + 1 < m) columns[j].rows.push_back(j + 1), columns[j].values.push_back(j % 2 == 0 ? Rational(1, 3) : Rational(-1));
  }
  std::vector<Rational> b(static_cast<std::size_t>(m));
  for (int i = 0; i < m; ++i) b[i] = Rational(i + 1, 2);
  EXPECT_EQ(compare_routes(m, columns, b), 2);
}

TEST(Refine, RightHandSidesBeyond128BitsAreExact) {
  // Constructed case: a right-hand side of 10^45 and more (over 150 bits), so that the integer
  // residual does not fit the 128-bit step and GMP takes each step; beside it the same system with
  // a short right-hand side, whose steps fit.
  std::mt19937 random(20261204);
  int m = 15;
  Columns columns = random_matrix(m, 0.2, false, random);
  std::vector<Rational> huge = random_vector(m, true, random);
  const Rational scale(boost::multiprecision::pow(numeric::Integer(10), 45));
  for (Rational& v : huge) v = v * scale + 1;
  EXPECT_EQ(compare_routes(m, columns, huge), 2);
  EXPECT_EQ(compare_routes(m, columns, random_vector(m, false, random)), 2);
}

TEST(Refine, SingularMatricesAreRefused) {
  // Two equal columns.
  Columns columns(3);
  columns[0] = {{0, 1}, {Rational(1), Rational(2)}};
  columns[1] = {{0, 1}, {Rational(1), Rational(2)}};
  columns[2] = {{2}, {Rational(1)}};
  RefinedSolver solver;
  std::vector<Rational> b = {Rational(1), Rational(2), Rational(3)};
  if (solver.factorize(3, columns)) {
    EXPECT_FALSE(solver.solve(b));
    EXPECT_FALSE(solver.solve_transposed(b));
  }
  // Singular in exact arithmetic though its float image may look regular: 1/3 + 2/3 == 1.
  Columns tricky(2);
  tricky[0] = {{0, 1}, {Rational(1, 3), Rational(1)}};
  tricky[1] = {{0, 1}, {Rational(2, 3), Rational(2)}};
  EXPECT_EQ(compare_routes(2, tricky, {Rational(1), Rational(3)}), 0);
}

TEST(Refine, NearlySingularMatricesGiveTheExactAnswerOrNone) {
  // [[1, 1], [1, 1 + 10^-k]]: the float LU loses the perturbation once k passes about 16.
  for (int k : {4, 8, 12, 15, 17, 25}) {
    Columns columns(2);
    Rational tiny = 1;
    for (int t = 0; t < k; ++t) tiny /= 10;
    columns[0] = {{0, 1}, {Rational(1), Rational(1)}};
    columns[1] = {{0, 1}, {Rational(1), Rational(1) + tiny}};
    compare_routes(2, columns, {Rational(2), Rational(3)});
  }
}

// Answers that are not dyadic need the continued-fraction step: 1/3, 22/7 and 355/113 (the
// classical convergents of pi, from memory) as the solution of a diagonal system, and the same
// answer as integers over one common denominator.
TEST(Refine, NonDyadicFractionsAreReconstructedOverACommonDenominator) {
  Columns columns(3);
  columns[0] = {{0}, {Rational(3)}};
  columns[1] = {{1}, {Rational(7)}};
  columns[2] = {{2}, {Rational(113)}};
  RefinedSolver solver;
  ASSERT_TRUE(solver.factorize(3, columns));
  auto x = solver.solve({Rational(1), Rational(22), Rational(355)});
  ASSERT_TRUE(x);
  EXPECT_EQ(*x, (std::vector<Rational>{Rational(1, 3), Rational(22, 7), Rational(355, 113)}));
  const auto& numerators = solver.common_numerators();
  ASSERT_EQ(numerators.size(), 3u);
  for (int i = 0; i < 3; ++i)
    EXPECT_EQ(Rational(numerators[i]) / Rational(solver.common_denominator()), (*x)[i]) << i;
}

TEST(Refine, ZeroRightHandSideGivesZero) {
  std::mt19937 random(11);
  Columns columns = random_matrix(10, 0.2, false, random);
  RefinedSolver solver;
  ASSERT_TRUE(solver.factorize(10, columns));
  auto x = solver.solve(std::vector<Rational>(10, Rational(0)));
  ASSERT_TRUE(x);
  for (const auto& v : *x) EXPECT_EQ(v, 0);
}

// y solved on a second thread (TransposedSolveBeside, as certification does when x_B is slow) is
// the rational LU's y, and its solver holds it over one common denominator.
TEST(Refine, TheDualSolvedBesideAgreesWithTheRationalLU) {
  std::mt19937 random(20261205);
  for (int m : {6, 30, 60}) {
    Columns columns = random_matrix(m, 0.1, true, random);
    std::vector<Rational> c = random_vector(m, true, random);
    auto expected = reference(m, columns, c, true);
    if (!expected) continue;
    TransposedSolveBeside beside(
        RefineLimits{}, m,
        [&] {
          return TransposedSolveBeside::System{columns, c};
        },
        std::chrono::milliseconds(0));
    auto y = beside.take(nullptr);
    ASSERT_TRUE(y) << m;
    EXPECT_EQ(*y, *expected) << m;
    const auto& numerators = beside.solver().common_numerators();
    for (int i = 0; i < m; ++i)
      EXPECT_EQ(Rational(numerators[i]) / Rational(beside.solver().common_denominator()), (*y)[i]) << i;
  }
}

// The caller's budget binds while it waits: an exhausted one stops the wait with its reason.
// (That the solve still running is then abandoned as it drops is not observed here: it only
// shortens the wait.)
TEST(Refine, WaitingForTheDualBesideHonoursTheCallersBudget) {
  std::mt19937 random(5);
  const int m = 250;  // dense fractions: the solve takes far longer than the first poll
  Columns columns = random_matrix(m, 0.6, true, random);
  run::Budget spent(0.0, std::nullopt);
  std::vector<Rational> c = random_vector(m, true, random);
  TransposedSolveBeside beside(
      RefineLimits{}, m,
      [&] {
        return TransposedSolveBeside::System{columns, c};
      },
      std::chrono::milliseconds(0));
  try {
    beside.take(&spent);
    ADD_FAILURE() << "the wait ignored an exhausted budget";
  } catch (const run::Stopped& stopped) {
    EXPECT_EQ(stopped.reason, run::StopReason::time_limit);
  }
}

// Cancelled while it waits out its delay, the solve beside never starts (its system is never
// asked for) and is dropped at once, not an hour later.
TEST(Refine, ADualBesideCancelledInItsDelayNeverStarts) {
  bool asked = false;
  {
    TransposedSolveBeside beside(
        RefineLimits{}, 1,
        [&] {
          asked = true;
          return TransposedSolveBeside::System{{SparseColumn{{0}, {Rational(2)}}}, {Rational(1)}};
        },
        std::chrono::hours(1));
    std::this_thread::sleep_for(std::chrono::milliseconds(50));  // so that it waits already
    EXPECT_TRUE(beside.cancel_if_waiting());
  }
  EXPECT_FALSE(asked);
}

}  // namespace
}  // namespace plumb::exact::detail
