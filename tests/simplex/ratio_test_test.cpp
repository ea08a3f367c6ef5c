// Ratio tests on crafted cases and against a plain reading of the rule: bound flipping, Harris
// groups, dual unboundedness.
#include "simplex/ratio_test.hpp"

#include <gtest/gtest.h>

#include <algorithm>
#include <limits>
#include <random>

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

// The rule read plainly (Koberstein 2005, algorithm 7): each group is every breakpoint whose
// ratio is within the least relaxed ratio left; pass it while the slope stays positive.
plumb::simplex::detail::DualStep plain_long_step(std::vector<DualCandidate> left, double slope,
                                                 double dual_tolerance, double primal_tolerance) {
  plumb::simplex::detail::DualStep step;
  while (true) {
    double bound = infinity;
    for (const auto& c : left) bound = std::min(bound, (std::max(c.slack, 0.0) + dual_tolerance) / c.rate);
    std::vector<DualCandidate> group, rest;
    for (const auto& c : left) (c.slack / c.rate <= bound ? group : rest).push_back(c);
    for (const auto& c : group) slope -= c.rate * c.range;
    if (!(slope > 0 && !rest.empty())) {
      if (slope > primal_tolerance) return {};
      auto best =
          std::max_element(group.begin(), group.end(), [](auto& a, auto& b) { return a.rate < b.rate; });
      step.entering = best->variable;
      step.step = best->slack / best->rate;
      return step;
    }
    for (const auto& c : group) step.flips.push_back(c.variable);
    left = rest;
  }
}

// 2 000 breakpoints, 50 to 1 000 of them passed in Harris groups of several (tolerance 0.01
// against ratios a few thousandths apart): the ratio test orders the candidates a batch at a
// time, and must take the step the plain reading takes, through every batch.  Invented data,
// fixed seed.
TEST(DualRatioTest, PassesManyGroupsAsThePlainRuleDoes) {
  std::mt19937 random(7);
  std::uniform_real_distribution<double> slack(0.0, 10.0), rate(0.1, 2.0), range(0.001, 0.01);
  std::vector<DualCandidate> candidates;
  for (int j = 0; j < 2000; ++j) candidates.push_back({j, slack(random), rate(random), range(random)});
  for (int j = 399; j < 2000; j += 400)
    candidates[j].slack = 9.9, candidates[j].range = infinity;  // late stops
  for (double slope = 1.0; slope < 8; slope += 0.2) {
    auto expected = plain_long_step(candidates, slope, 0.01, tolerance);
    auto reordered = candidates;
    auto step = dual_ratio_test(reordered, slope, 0.01, tolerance);
    ASSERT_GE(expected.entering, 0);
    EXPECT_GT(expected.flips.size(), 50u) << "slope " << slope;
    EXPECT_EQ(step.entering, expected.entering) << "slope " << slope;
    EXPECT_DOUBLE_EQ(step.step, expected.step);
    std::sort(step.flips.begin(), step.flips.end());
    std::sort(expected.flips.begin(), expected.flips.end());
    EXPECT_EQ(step.flips, expected.flips) << "slope " << slope;
  }
}

// The group after 64 single-breakpoint groups (the first batch the ratio test orders) is bounded
// by a breakpoint not yet ordered: B's relaxed ratio 64.5 + 0.01 / 10 caps the group at {A, B},
// and B, the larger rate, enters; C (ratio 64.9, rate 50) lies beyond that bound, though within
// A's own relaxed ratio 64 + 0.01 / 0.01.  Invented numbers.
TEST(DualRatioTest, AGroupBoundLooksBeyondTheBreakpointsOrderedSoFar) {
  std::vector<DualCandidate> candidates = {{0, 0.5, 1.0, 1.0}};
  for (int k = 1; k <= 63; ++k) candidates.push_back({k, double(k), 1.0, 1.0});
  candidates.push_back({100, 0.64, 0.01, 1.0});    // A: ratio 64
  candidates.push_back({101, 645.0, 10.0, 1.0});   // B: ratio 64.5
  candidates.push_back({102, 3245.0, 50.0, 1.0});  // C: ratio 64.9
  for (int k = 66; k <= 80; ++k) candidates.push_back({k, double(k), 1.0, 1.0});
  std::reverse(candidates.begin(), candidates.end());
  auto step = dual_ratio_test(candidates, 69.0, 0.01, tolerance);
  EXPECT_EQ(step.entering, 101);
  EXPECT_EQ(step.flips.size(), 64u);
  EXPECT_DOUBLE_EQ(step.step, 64.5);
}

// A breakpoint whose ratio is not a number cannot be ordered; it is left out rather than let the
// walk through the groups stall on it (it had looped for ever).  Common practice: a NaN must
// not hang a solver.
TEST(DualRatioTest, ARatioThatIsNotANumberIsLeftOut) {
  const double nan = std::numeric_limits<double>::quiet_NaN();
  std::vector<DualCandidate> candidates = {{1, nan, 1.0, 1.0}, {2, 1.0, 1.0, 1.0}, {3, 2.0, 1.0, infinity}};
  auto step = dual_ratio_test(candidates, 5.0, tolerance, tolerance);
  EXPECT_EQ(step.entering, 3);
  EXPECT_EQ(step.flips, std::vector<int>{2});
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
