// The exact evaluator and the audit on small models worked by hand.
#include "plumb/audit/audit.hpp"

#include <gtest/gtest.h>

namespace plumb::audit {
namespace {

using model::Side;

// Invented: two sources of one product, at most 3 from each, at least 4 in all, costs 3 and 2.
// Worked by hand: the optimum takes 3 from the cheaper source and 1 from the other, cost 9.
model::Model two_sources() {
  return model::ModelBuilder("two sources")
      .column("x", 3, Rational(0), Rational(3))
      .column("y", 2, Rational(0), Rational(3))
      .row("need", {{"x", 1}, {"y", 1}}, Rational(4), Side())
      .build();
}

Values plan_of(std::vector<Rational> x) {
  Values v;
  v.given.assign(x.size(), true);
  v.values = std::move(x);
  v.format = "csv";
  return v;
}

TEST(AuditEvaluate, ViolationsExactAndSorted) {
  model::Model m = two_sources();
  // Worked by hand: need = 3.5 misses 4 by 1/2 (relative 1/8); y = 3.25 misses 3 by 1/4 (1/12).
  Evaluation e = evaluate(m, {Rational(1, 4), Rational(13, 4)});
  EXPECT_EQ(e.activity, (std::vector<Rational>{Rational(7, 2)}));
  ASSERT_EQ(e.violations.size(), 2u);
  EXPECT_EQ(e.violations[0].kind, Violation::Kind::row);
  EXPECT_EQ(e.violations[0].amount, Rational(1, 2));
  EXPECT_EQ(e.violations[0].relative, Rational(1, 8));
  EXPECT_EQ(e.violations[1].kind, Violation::Kind::column);
  EXPECT_EQ(e.violations[1].side, Violation::Side::upper);
  EXPECT_EQ(e.violations[1].amount, Rational(1, 4));
  EXPECT_EQ(e.violations[1].relative, Rational(1, 12));
  EXPECT_EQ(e.objective, Rational(3, 4) + Rational(13, 2));
  // A limit below one in size: the relative amount is the amount itself (common practice).
  EXPECT_EQ(relative_to(Rational(1, 100), Rational(1, 2)), Rational(1, 100));
}

TEST(AuditRun, KnownExactGap) {
  model::Model m = two_sources();
  AuditOptions options;
  options.gap = Rational(1, 10);
  Audit a = run_audit(m, plan_of({2, 2}), options);  // cost 10 against 9: gap 1, relative 1/9
  EXPECT_EQ(a.verdict, Verdict::feasible);
  ASSERT_TRUE(a.optimum && a.optimum->certified());
  EXPECT_EQ(a.optimum->solution.objective, 9);
  ASSERT_TRUE(a.gap_to_optimum);
  EXPECT_EQ(a.gap_to_optimum->absolute, 1);
  EXPECT_EQ(a.gap_to_optimum->relative, Rational(1, 9));
  EXPECT_EQ(a.gap_verdict, GapVerdict::outside);
  ASSERT_EQ(a.changes.size(), 2u);
  options.gap = Rational(1, 9);
  EXPECT_EQ(run_audit(m, plan_of({2, 2}), options).gap_verdict, GapVerdict::within);
}

TEST(AuditRun, ExactOptimumHasNoGapAndNoChanges) {
  Audit a = run_audit(two_sources(), plan_of({1, 3}), {});
  EXPECT_EQ(a.verdict, Verdict::feasible);
  EXPECT_TRUE(a.evaluation.violations.empty());
  ASSERT_TRUE(a.gap_to_optimum);
  EXPECT_EQ(a.gap_to_optimum->absolute, 0);
  EXPECT_TRUE(a.changes.empty());
  EXPECT_TRUE(a.optimum_from_warm_start);  // the plan's own basis: nothing to give up
}

TEST(AuditRun, ToleranceDecidesTheWords) {
  model::Model m = two_sources();
  AuditOptions options;  // tolerance 1e-6, relative
  EXPECT_EQ(run_audit(m, plan_of({Rational(9999999, 10000000), 3}), options).verdict, Verdict::within_tolerance);
  EXPECT_EQ(run_audit(m, plan_of({Rational(99, 100), 3}), options).verdict, Verdict::infeasible);
}

TEST(AuditRun, HardLimitsNamedEvenWithinTolerance) {
  model::Model m = two_sources();
  m.rows[0].label.hard = true;
  Audit a = run_audit(m, plan_of({Rational(9999999, 10000000), 3}), {});
  EXPECT_EQ(a.verdict, Verdict::within_tolerance);
  ASSERT_EQ(a.hard_crossed.size(), 1u);
  EXPECT_EQ(a.evaluation.violations[a.hard_crossed[0]].index, 0);
}

// The bound of Neumaier and Shcherbina (Math. Programming 99, 2004), worked by hand on two_sources:
// with y = 2 on need, r = (1, 0) and the bound is 2*4 + 1*0 = 8 <= 9; with y = 3, r = (0, -1) and
// the bound is 3*4 - 1*3 = 9, the optimum (y = 3 is the exact dual).
TEST(AuditDualBound, WorkedByHand) {
  model::Model m = two_sources();
  EXPECT_EQ(*safe_dual_bound(m, {2}).bound, 8);
  EXPECT_EQ(*safe_dual_bound(m, {3}).bound, 9);
  // A dual of the wrong sign for the infinite upper side counts as zero: bound 0.
  DualBound wrong = safe_dual_bound(m, {-1});
  EXPECT_EQ(*wrong.bound, 0);
  EXPECT_EQ(wrong.rows_zeroed, (std::vector<int>{0}));
  // Without the upper bound on y, y = 3 leaves r_y = -1 against an infinite bound: no bound.
  m.columns[1].upper.reset();
  DualBound none = safe_dual_bound(m, {3});
  EXPECT_FALSE(none.bound);
  EXPECT_EQ(none.unbounded_by, "y");
}

// Maximising: duals in the model's own sense give an upper bound.  Invented: earn 3x + 2y with
// x + y <= 4, x <= 3; by hand the best is x = 3, y = 1, earning 11; the exact dual on the row is 2
// (one more unit of room earns 2), and the bound is 2*4 + (3-2)*3 = 11.
TEST(AuditDualBound, MaximisingGivesAnUpperBound) {
  model::Model m = model::ModelBuilder("earn")
                       .maximise()
                       .column("x", 3, Rational(0), Rational(3))
                       .column("y", 2)
                       .row("room", {{"x", 1}, {"y", 1}}, Side(), Rational(4))
                       .build();
  EXPECT_EQ(*safe_dual_bound(m, {2}).bound, 11);
  EXPECT_EQ(*safe_dual_bound(m, {Rational(5, 2)}).bound, 10 + Rational(3, 2));  // above 11: still safe
  // With the dual 3/2, y's reduced cost 2 - 3/2 > 0 asks for y's upper bound, which is infinite;
  // the row implies y <= 4 - 0 (x >= 0), so the bound is 3/2*4 + (3 - 3/2)*3 + (1/2)*4 = 25/2.
  DualBound implied = safe_dual_bound(m, {Rational(3, 2)});
  ASSERT_TRUE(implied.bound);
  EXPECT_EQ(*implied.bound, Rational(25, 2));
  EXPECT_EQ(implied.implied_bounds_used, 1);
}

TEST(AuditRun, DualsProveTheGapWithoutASolve) {
  model::Model m = two_sources();
  std::vector<Rational> duals{Rational(29, 10)};  // r = (1/10, -9/10): bound 11.6 - 2.7 = 8.9
  AuditOptions options;
  options.duals = &duals;
  options.gap = Rational(2, 100);
  Audit a = run_audit(m, plan_of({1, 3}), options);
  ASSERT_TRUE(a.dual_bound && a.dual_bound->bound);
  EXPECT_EQ(*a.dual_bound->bound, Rational(89, 10));
  EXPECT_EQ(a.gap_to_bound->absolute, Rational(1, 10));
  EXPECT_EQ(a.gap_verdict, GapVerdict::within);
  EXPECT_FALSE(a.optimum);  // proven by the bound alone
  options.gap = Rational(1, 100);  // 0.1/8.9 > 1/100: the bound cannot settle it, the solve does
  Audit solved = run_audit(m, plan_of({1, 3}), options);
  EXPECT_TRUE(solved.optimum);
  EXPECT_EQ(solved.gap_verdict, GapVerdict::within);
}

TEST(AuditGuess, BasisFromSupportAndTightSides) {
  model::Model m = two_sources();
  std::vector<Rational> x{1, 3};
  simplex::Basis b = guess_basis(m, x, evaluate(m, x), Rational(1, 1000000));
  using simplex::VarStatus;
  EXPECT_EQ(b.columns, (std::vector<VarStatus>{VarStatus::basic, VarStatus::at_upper}));
  EXPECT_EQ(b.rows, (std::vector<VarStatus>{VarStatus::at_lower}));
}

}  // namespace
}  // namespace plumb::audit
