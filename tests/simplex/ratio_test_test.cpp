// Ratio tests on small crafted cases: bound flipping, Harris groups, dual unboundedness.
#include "simplex/ratio_test.hpp"

#include <gtest/gtest.h>

#include <limits>

namespace {

using plumb::simplex::detail::DualCandidate;
using plumb::simplex::detail::dual_ratio_test;
using plumb::simplex::detail::primal_ratio_test;
using plumb::simplex::detail::PrimalCandidate;

constexpr double infinity = std::numeric_limits<double>::infinity();
constexpr double tolerance = 1e-7;

// Long-step rule (Koberstein 2005, section 3.2.1): a boxed breakpoint is passed while the slope
// stays positive, its variable flipping to the other bound.
TEST(DualRatioTest, PassesABoxedBreakpointWhileTheSlopeStaysPositive) {
  std::vector<DualCandidate> candidates = {{1, 1.0, 1.0, 1.0}, {2, 2.0, 1.0, infinity}};
  auto step = dual_ratio_test(candidates, 3.0, tolerance, tolerance);
  EXPECT_EQ(step.entering, 2);
  ASSERT_EQ(step.flips.size(), 1u);
  EXPECT_EQ(step.flips[0], 1);
  EXPECT_DOUBLE_EQ(step.step, 2.0);
}

TEST(DualRatioTest, StopsAtTheFirstBreakpointWhenItsFlipWouldTurnTheSlope) {
  std::vector<DualCandidate> candidates = {{1, 1.0, 1.0, 1.0}, {2, 2.0, 1.0, infinity}};
  auto step = dual_ratio_test(candidates, 0.5, tolerance, tolerance);
  EXPECT_EQ(step.entering, 1);
  EXPECT_TRUE(step.flips.empty());
  EXPECT_DOUBLE_EQ(step.step, 1.0);
}

// Every breakpoint passed and the slope still positive: the dual is unbounded, the primal
// infeasible (the row cannot reach its bound even with every variable at its best bound).
TEST(DualRatioTest, ReportsAnUnboundedDualWhenEveryBreakpointCanBePassed) {
  std::vector<DualCandidate> candidates = {{1, 1.0, 1.0, 1.0}, {2, 2.0, 1.0, 1.0}};
  EXPECT_EQ(dual_ratio_test(candidates, 10.0, tolerance, tolerance).entering, -1);
  std::vector<DualCandidate> none;
  EXPECT_EQ(dual_ratio_test(none, 1.0, tolerance, tolerance).entering, -1);
}

// The slope left after the last breakpoint is rounding, not infeasibility: a pivot is made.
TEST(DualRatioTest, RoundingLeftInTheSlopeIsNotUnboundedness) {
  std::vector<DualCandidate> candidates = {{1, 1.0, 1.0, 1.0}, {2, 2.0, 1.0, 1.0}};
  auto step = dual_ratio_test(candidates, 2.0 + 1e-12, tolerance, tolerance);
  EXPECT_EQ(step.entering, 2);
}

// Harris (1973): among breakpoints within the tolerance of the smallest, the largest rate wins.
TEST(DualRatioTest, HarrisPrefersTheLargestRateInTheGroup) {
  std::vector<DualCandidate> candidates = {{1, 0.0, 1e-3, infinity}, {2, 5e-8, 1.0, infinity}, {3, 1.0, 2.0, infinity}};
  auto step = dual_ratio_test(candidates, 1.0, tolerance, tolerance);
  EXPECT_EQ(step.entering, 2);
}

TEST(PrimalRatioTest, HarrisPrefersTheLargestRateInTheGroup) {
  std::vector<PrimalCandidate> candidates = {{0, 0.0, 1e-4}, {1, 1e-8, 1.0}, {2, 1.0, 1.0}};
  auto step = primal_ratio_test(candidates, tolerance);
  EXPECT_EQ(step.leaving, 1);
  EXPECT_NEAR(step.step, 1e-8, 1e-20);
}

TEST(PrimalRatioTest, NoCandidateMeansNothingBlocks) {
  EXPECT_EQ(primal_ratio_test({}, tolerance).leaving, -1);
}

// A breakpoint already slightly past zero (a reduced cost within the tolerance on the wrong
// side) limits the step to zero; Harris (1973) still lets the larger rate enter.
TEST(DualRatioTest, ABreakpointSlightlyPastZeroAllowsNoPositiveStep) {
  std::vector<DualCandidate> candidates = {{1, -5e-8, 1e-2, infinity}, {2, 0.0, 1.0, infinity}, {3, 1.0, 1.0, infinity}};
  auto step = dual_ratio_test(candidates, 1.0, tolerance, tolerance);
  EXPECT_EQ(step.entering, 2);
  EXPECT_LE(step.step, 0.0);
  EXPECT_TRUE(step.flips.empty());
}

// Several boxed breakpoints are passed in order of their ratios while the slope stays positive
// (Fourer 1994; Maros 2003, section 10.3): slope 3 - 1*1 - 1*1 = 1 > 0 after the first two, and
// the third, unboxed, enters.
TEST(DualRatioTest, PassesSeveralBoxedBreakpointsInRatioOrder) {
  std::vector<DualCandidate> candidates = {
      {4, 3.0, 1.0, infinity}, {2, 2.0, 1.0, 1.0}, {1, 1.0, 1.0, 1.0}};
  auto step = dual_ratio_test(candidates, 3.0, tolerance, tolerance);
  EXPECT_EQ(step.entering, 4);
  ASSERT_EQ(step.flips.size(), 2u);
  EXPECT_EQ(step.flips[0], 1);
  EXPECT_EQ(step.flips[1], 2);
  EXPECT_DOUBLE_EQ(step.step, 3.0);
}

// After a group is passed, the next group is still a Harris group (Harris 1973; Koberstein 2005,
// algorithm 7): breakpoints 2 and 2.00005 lie within the tolerance-relaxed bound 2.0001 of the
// small-rate one, and the larger rate enters, not the smaller ratio.
TEST(DualRatioTest, AfterPassingAGroupTheNextIsAHarrisGroupToo) {
  std::vector<DualCandidate> candidates = {
      {4, 5.0, 1.0, infinity}, {3, 2.00005, 1.0, infinity}, {2, 0.002, 0.001, infinity}, {1, 1.0, 1.0, 1.0}};
  auto step = dual_ratio_test(candidates, 1.5, tolerance, tolerance);
  EXPECT_EQ(step.entering, 3);
  EXPECT_EQ(step.flips, std::vector<int>{1});
  EXPECT_DOUBLE_EQ(step.step, 2.00005);
}

// A free nonbasic variable (infinite range) can never be passed: it enters at its breakpoint
// even when the slope would allow more.
TEST(DualRatioTest, AFreeVariableIsNeverPassed) {
  std::vector<DualCandidate> candidates = {{7, 0.5, 2.0, infinity}, {8, 1.0, 1.0, 1.0}};
  auto step = dual_ratio_test(candidates, 100.0, tolerance, tolerance);
  EXPECT_EQ(step.entering, 7);
  EXPECT_TRUE(step.flips.empty());
}

TEST(PrimalRatioTest, ABasicVariableAlreadyPastItsBoundBlocksAtOnce) {
  std::vector<PrimalCandidate> candidates = {{0, -5e-8, 1.0}, {1, 1.0, 1.0}};
  auto step = primal_ratio_test(candidates, tolerance);
  EXPECT_EQ(step.leaving, 0);
  EXPECT_LE(step.step, 0.0);
}

}  // namespace
