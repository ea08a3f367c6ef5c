// The exact engine on textbook examples and hand-made models (each check names its source).
#include "plumb/exact/solve.hpp"

#include <gtest/gtest.h>

#include <algorithm>

namespace plumb::exact {
namespace {

using model::ModelBuilder;
using model::Side;
using numeric::Integer;
using numeric::Rational;
using Terms = std::vector<std::pair<std::string, Rational>>;
using simplex::VarStatus;

Rational q(long p, long d = 1) { return Rational(p, d); }

// Solves with the pure engine (from `start` when given); the independent checker must accept the
// result at once, with no rejection and no fallback.
Solution solve_exactly(const model::Model& model, const simplex::Basis* start = nullptr) {
  SolveOptions options;
  options.method = Method::exact;
  options.warm_start = start;
  CertifiedSolution result = certified_solve(model, options);
  EXPECT_TRUE(result.certified()) << result.verdict.failure;
  EXPECT_TRUE(result.rejections.empty());
  return result.solution;
}

// V. Chvatal, Linear Programming (1983), chapter 2, the first worked example: optimum 13 at
// x = (2, 0, 1).
model::Model chvatal_chapter2(Rational constant = 0) {
  return ModelBuilder("chvatal-ch2")
      .maximise()
      .objective_constant(constant)
      .column("x1", 5)
      .column("x2", 4)
      .column("x3", 3)
      .row("r1", Terms{{"x1", 2}, {"x2", 3}, {"x3", 1}}, {}, q(5))
      .row("r2", Terms{{"x1", 4}, {"x2", 1}, {"x3", 2}}, {}, q(11))
      .row("r3", Terms{{"x1", 3}, {"x2", 4}, {"x3", 2}}, {}, q(8))
      .build();
}

TEST(ExactSolve, ChvatalChapterTwoExample) {
  auto model = chvatal_chapter2();
  Solution s = solve_exactly(model);
  ASSERT_EQ(s.outcome, Outcome::optimal);
  EXPECT_EQ(s.objective, 13);  // Chvatal 1983, ch. 2
  EXPECT_EQ(s.x, (std::vector<Rational>{2, 0, 1}));
}

TEST(ExactSolve, ObjectiveConstantIsIncluded) {
  auto model = chvatal_chapter2(q(7));
  Solution s = solve_exactly(model);
  ASSERT_EQ(s.outcome, Outcome::optimal);
  EXPECT_EQ(s.objective, 20);  // Chvatal's 13 plus the constant 7
}

// E. M. L. Beale, "Cycling in the dual simplex algorithm", Naval Research Logistics Quarterly 2
// (1955): the textbook simplex with the largest-coefficient rule cycles on it.  Optimum -5/4 at
// x4 = 1, x6 = 1 (from memory; confirmed here by the certificate conditions).
TEST(ExactSolve, BealeCyclingExampleTerminates) {
  auto model = ModelBuilder("beale-1955")
                   .minimise()
                   .column("x4", q(-3, 4))
                   .column("x5", 20)
                   .column("x6", q(-1, 2))
                   .column("x7", 6)
                   .row("c1", Terms{{"x4", q(1, 4)}, {"x5", -8}, {"x6", -1}, {"x7", 9}}, {}, q(0))
                   .row("c2", Terms{{"x4", q(1, 2)}, {"x5", -12}, {"x6", q(-1, 2)}, {"x7", 3}}, {}, q(0))
                   .row("c3", Terms{{"x6", 1}}, {}, q(1))
                   .build();
  Solution s = solve_exactly(model);
  ASSERT_EQ(s.outcome, Outcome::optimal);
  EXPECT_EQ(s.objective, q(-5, 4));
}

// V. Klee and G. J. Minty, "How good is the simplex algorithm?", in Inequalities III (1972), in the
// form max sum_j 2^(n-j) x_j s.t. sum_{j<i} 2^(i-j+1) x_j + x_i <= 5^i, x >= 0 (as in
// C. H. Papadimitriou and K. Steiglitz, Combinatorial Optimization, 1982, from memory): the optimum
// is 5^n at x_n = 5^n, all other x_j = 0.
TEST(ExactSolve, KleeMintyCubes) {
  for (int n = 3; n <= 8; ++n) {
    ModelBuilder builder("klee-minty");
    builder.maximise();
    for (int j = 1; j <= n; ++j) builder.column("x" + std::to_string(j), Rational(Integer(1) << (n - j)));
    Integer five_power = 1;
    for (int i = 1; i <= n; ++i) {
      five_power *= 5;
      Terms terms;
      for (int j = 1; j < i; ++j)
        terms.emplace_back("x" + std::to_string(j), Rational(Integer(1) << (i - j + 1)));
      terms.emplace_back("x" + std::to_string(i), 1);
      builder.row("k" + std::to_string(i), terms, {}, Rational(five_power));
    }
    auto model = builder.build();
    Solution s = solve_exactly(model);
    ASSERT_EQ(s.outcome, Outcome::optimal) << "n = " << n;
    EXPECT_EQ(s.objective, Rational(five_power)) << "n = " << n;
    EXPECT_EQ(s.x.back(), Rational(five_power)) << "n = " << n;
  }
}

// Invented: min x1 + 2 x2, x1 free, x2 >= 0, x1 + x2 >= 3, x1 - x2 <= 1.  By hand: x1 = 3 - x2 on
// the first row, then the second needs x2 >= 1, so x = (2, 1) and the optimum is 4.
TEST(ExactSolve, FreeColumn) {
  auto model = ModelBuilder("free")
                   .column("x1", 1, Side{}, Side{})
                   .column("x2", 2)
                   .row("a", Terms{{"x1", 1}, {"x2", 1}}, q(3), {})
                   .row("b", Terms{{"x1", 1}, {"x2", -1}}, {}, q(1))
                   .build();
  Solution s = solve_exactly(model);
  ASSERT_EQ(s.outcome, Outcome::optimal);
  EXPECT_EQ(s.objective, 4);
  EXPECT_EQ(s.x, (std::vector<Rational>{2, 1}));
}

// Invented: a free row (no sides) must not disturb anything.
TEST(ExactSolve, FreeRowIsIgnored) {
  auto model = ModelBuilder("free-row")
                   .column("x", 1)
                   .row("info", Terms{{"x", 5}}, {}, {})
                   .row("need", Terms{{"x", 1}}, q(2), {})
                   .build();
  Solution s = solve_exactly(model);
  ASSERT_EQ(s.outcome, Outcome::optimal);
  EXPECT_EQ(s.objective, 2);
  EXPECT_EQ(s.y[0], 0);
}

// Invented: 2 <= x + 2y <= 4 with x, y in [0, 3].  By hand: min x + y is 1 at (0, 1) on the lower
// side; max x + y is 7/2 at (3, 1/2) on the upper side.
TEST(ExactSolve, RangedRowBothSides) {
  auto build = [](bool maximise) {
    ModelBuilder b("ranged");
    if (maximise) b.maximise();
    return b.column("x", 1, q(0), q(3))
        .column("y", 1, q(0), q(3))
        .row("range", Terms{{"x", 1}, {"y", 2}}, q(2), q(4))
        .build();
  };
  auto low = build(false);
  Solution s = solve_exactly(low);
  ASSERT_EQ(s.outcome, Outcome::optimal);
  EXPECT_EQ(s.objective, 1);
  EXPECT_GT(s.y[0], 0);
  auto high = build(true);
  s = solve_exactly(high);
  ASSERT_EQ(s.outcome, Outcome::optimal);
  EXPECT_EQ(s.objective, q(7, 2));
  EXPECT_LT(s.y[0], 0);  // minimisation form: c' = -c
}

// Invented: x1 + x2 + x3 = 6, x1 - x2 = 1, min x1 + 2 x2 + 3 x3.  By hand: substituting leaves
// 16 - 3 x2 with x2 <= 5/2, so the optimum is 17/2 at (7/2, 5/2, 0).
TEST(ExactSolve, EqualitiesOnly) {
  auto model = ModelBuilder("equalities")
                   .column("x1", 1)
                   .column("x2", 2)
                   .column("x3", 3)
                   .row("total", Terms{{"x1", 1}, {"x2", 1}, {"x3", 1}}, q(6), q(6))
                   .row("gap", Terms{{"x1", 1}, {"x2", -1}}, q(1), q(1))
                   .build();
  Solution s = solve_exactly(model);
  ASSERT_EQ(s.outcome, Outcome::optimal);
  EXPECT_EQ(s.objective, q(17, 2));
  EXPECT_EQ(s.x, (std::vector<Rational>{q(7, 2), q(5, 2), 0}));
}

// Invented covering model: min 2x + 3y, x + y >= 4, x + 3y >= 6.  By hand: the vertices are (0,4),
// (3,1), (6,0) with costs 12, 9, 12.  The logical basis is dual feasible: the dual simplex runs.
TEST(ExactSolve, DualFeasibleStartUsesDualSimplex) {
  auto model = ModelBuilder("cover")
                   .column("x", 2)
                   .column("y", 3)
                   .row("a", Terms{{"x", 1}, {"y", 1}}, q(4), {})
                   .row("b", Terms{{"x", 1}, {"y", 3}}, q(6), {})
                   .build();
  Solution s = solve_exactly(model);
  ASSERT_EQ(s.outcome, Outcome::optimal);
  EXPECT_EQ(s.objective, 9);
  EXPECT_EQ(s.stats.phase, "exact primal");  // the dual phase hands over to a confirming primal check
}

// Invented: max x + y with x - y <= 1, x, y >= 0 grows without bound along (1, 1).
model::Model unbounded_model() {
  return ModelBuilder("unbounded")
      .maximise()
      .column("x", 1)
      .column("y", 1)
      .row("a", Terms{{"x", 1}, {"y", -1}}, {}, q(1))
      .build();
}

// Invented: x + y <= 1 and x + y >= 3 cannot both hold.
model::Model infeasible_rows_model() {
  return ModelBuilder("infeasible")
      .column("x", 1)
      .column("y", 1)
      .row("cap", Terms{{"x", 1}, {"y", 1}}, {}, q(1))
      .row("need", Terms{{"x", 1}, {"y", 1}}, q(3), {})
      .build();
}

TEST(ExactSolve, Unbounded) {
  Solution s = solve_exactly(unbounded_model());
  EXPECT_EQ(s.outcome, Outcome::unbounded);
}

TEST(ExactSolve, InfeasibleRows) {
  Solution s = solve_exactly(infeasible_rows_model());
  EXPECT_EQ(s.outcome, Outcome::infeasible);
}

// Invented: a bound and a row in conflict: x <= 1 and 2x >= 3, under either sign of the cost.
TEST(ExactSolve, InfeasibleAgainstBound) {
  for (int cost : {1, -1}) {
    auto model = ModelBuilder("infeasible-bound")
                     .column("x", cost, q(0), q(1))
                     .row("need", Terms{{"x", 2}}, q(3), {})
                     .build();
    Solution s = solve_exactly(model);
    EXPECT_EQ(s.outcome, Outcome::infeasible) << cost;
  }
}

// Fact of the trade: a model without rows or columns is optimal at its constant; without rows
// each column sits at its better bound, or the model is unbounded.
TEST(ExactSolve, EmptyModels) {
  auto nothing = ModelBuilder("empty").objective_constant(q(5, 3)).build();
  Solution s = solve_exactly(nothing);
  ASSERT_EQ(s.outcome, Outcome::optimal);
  EXPECT_EQ(s.objective, q(5, 3));

  auto no_rows = ModelBuilder("no-rows").column("x", 1, q(1), q(5)).column("y", -1, q(-2), q(4)).build();
  s = solve_exactly(no_rows);
  ASSERT_EQ(s.outcome, Outcome::optimal);
  EXPECT_EQ(s.objective, -3);

  auto open = ModelBuilder("no-rows-open").column("x", -1).build();
  s = solve_exactly(open);
  EXPECT_EQ(s.outcome, Outcome::unbounded);

  auto rows_only = ModelBuilder("no-columns").build();
  s = solve_exactly(rows_only);
  EXPECT_EQ(s.outcome, Outcome::optimal);
}

// Warm starts on Chvatal's example: the optimal basis (x1, x3 and the logical of r2 basic) is
// certified without a pivot; a singular basis and one of the wrong size are repaired.
TEST(ExactSolve, WarmStartFromOptimalBasis) {
  auto model = chvatal_chapter2();
  simplex::Basis basis{{VarStatus::basic, VarStatus::at_lower, VarStatus::basic},
                       {VarStatus::at_upper, VarStatus::basic, VarStatus::at_upper}};
  Solution s = solve_exactly(model, &basis);
  ASSERT_EQ(s.outcome, Outcome::optimal);
  EXPECT_EQ(s.objective, 13);
  EXPECT_EQ(s.stats.exact_iterations, 0);
  EXPECT_FALSE(s.stats.repaired);
  EXPECT_EQ(s.stats.proof, "refined basis");  // float LU and refinement, no rational LU
}

// From the logical basis of Chvatal's example, feasible but not optimal: approximate duals show
// wrong reduced-cost signs before any exact solution, one float re-solve of the correction problem
// reaches the optimal basis, and that is certified by refinement with no exact pivot.
TEST(ExactSolve, WarmStartIsCorrectedByAFloatReSolve) {
  auto model = chvatal_chapter2();
  simplex::Basis logical{{VarStatus::at_lower, VarStatus::at_lower, VarStatus::at_lower},
                         {VarStatus::basic, VarStatus::basic, VarStatus::basic}};
  Solution s = solve_exactly(model, &logical);
  ASSERT_EQ(s.outcome, Outcome::optimal);
  EXPECT_EQ(s.objective, 13);  // Chvatal 1983, ch. 2
  EXPECT_EQ(s.stats.correction_rounds, 1);
  EXPECT_EQ(s.stats.approximate_corrections, 1);
  EXPECT_EQ(s.stats.exact_iterations, 0);
  EXPECT_EQ(s.stats.proof, "refined basis");
  EXPECT_TRUE(s.stats.repaired);
}

// A basis clearly not optimal (x1's reduced cost -1 at its lower bound) whose basic value, 10^400,
// lies beyond double range: the approximate values cannot serve, so the certification takes the
// exact ones and still reaches the optimum x1 = 10^400, objective -10^400 (by hand).
TEST(ExactSolve, ApproximationsBeyondDoubleRangeLeaveTheRoundToExactValues) {
  Rational huge(1);
  for (int k = 0; k < 400; ++k) huge *= 10;
  auto model = ModelBuilder("beyond-double")
                   .minimise()
                   .column("x1", q(-1))
                   .column("x2", q(0))
                   .row("total", Terms{{"x1", q(1)}, {"x2", q(1)}}, huge, huge)
                   .build();
  simplex::Basis x2_basic{{VarStatus::at_lower, VarStatus::basic}, {VarStatus::at_lower}};
  Solution s = solve_exactly(model, &x2_basic);
  ASSERT_EQ(s.outcome, Outcome::optimal);
  EXPECT_EQ(s.objective, -huge);
  EXPECT_EQ(s.stats.approximate_corrections, 0);
}

TEST(ExactSolve, WarmStartRepairsWrongBases) {
  auto model = chvatal_chapter2();
  // Too many basic variables: all three columns and all three logicals.
  simplex::Basis too_many{{VarStatus::basic, VarStatus::basic, VarStatus::basic},
                          {VarStatus::basic, VarStatus::basic, VarStatus::basic}};
  // Wrong size altogether.
  simplex::Basis wrong_size{{VarStatus::basic}, {}};
  // Too few: nothing basic.
  simplex::Basis too_few{{VarStatus::at_lower, VarStatus::at_lower, VarStatus::at_lower},
                         {VarStatus::at_upper, VarStatus::at_upper, VarStatus::at_upper}};
  for (const auto* basis : {&too_many, &wrong_size, &too_few}) {
    Solution s = solve_exactly(model, basis);
    ASSERT_EQ(s.outcome, Outcome::optimal);
    EXPECT_EQ(s.objective, 13);
    EXPECT_TRUE(s.stats.repaired);
  }
}

// Invented: two identical columns make a basis holding both singular.
TEST(ExactSolve, WarmStartRepairsSingularBasis) {
  auto model = ModelBuilder("twins")
                   .column("a", 1)
                   .column("b", 2)
                   .column("c", 3)
                   .row("r1", Terms{{"a", 1}, {"b", 1}, {"c", 1}}, q(2), {})
                   .row("r2", Terms{{"a", 1}, {"b", 1}, {"c", 2}}, q(3), {})
                   .build();
  // By hand: a = 3 costs 3, proven by y = (0, 1) (reduced costs 0, 1, 1); a and b are twins, so
  // a basis holding both is singular.
  simplex::Basis singular{{VarStatus::basic, VarStatus::basic, VarStatus::at_lower},
                          {VarStatus::at_lower, VarStatus::at_lower}};
  Solution s = solve_exactly(model, &singular);
  ASSERT_EQ(s.outcome, Outcome::optimal);
  EXPECT_EQ(s.objective, 3);
  EXPECT_TRUE(s.stats.repaired);
}

// The hybrid path on the invented infeasible and unbounded models above: the float search's
// infeasible row of B^{-1} by refinement, and the feasible-point and ray LPs certified by
// refinement (docs/solving.md).
TEST(ExactSolve, HybridCertifiesInfeasibleAndUnboundedOutcomes) {
  auto unbounded = unbounded_model();
  auto infeasible = infeasible_rows_model();
  for (const auto* model : {&unbounded, &infeasible}) {
    CertifiedSolution result = certified_solve(*model);
    EXPECT_TRUE(result.certified()) << result.verdict.failure;
    EXPECT_TRUE(result.rejections.empty());
    const bool is_unbounded = model == &unbounded;
    EXPECT_EQ(result.solution.outcome, is_unbounded ? Outcome::unbounded : Outcome::infeasible);
    EXPECT_EQ(result.solution.stats.exact_iterations, 0) << model->title;
    EXPECT_EQ(result.solution.stats.proof,
              is_unbounded ? "feasible point and ray" : "refined row of the inverse");
  }
  // By hand: the rows say x + y <= 1 and x + y >= 3; the multipliers -1 on cap and 1 on need sum
  // them to 0 >= 2, and a row of B^{-1} can only be +-1 on each (every entry is 1).
  CertifiedSolution result = certified_solve(infeasible);
  EXPECT_EQ(result.solution.y, (std::vector<Rational>{-1, 1}));
}

// When the float search's row of B^{-1} is not proven by refinement, the least-infeasibility LP
// proves infeasibility (by hand: its optimum is 2 and its duals are the multipliers above); when
// refinement cannot certify that LP's float basis either (gran with one row relaxed does it for
// real), the exact engine pivots on that LP from the basis: the proof is still its certified
// optimum, not pivots on the model from the float search's basis.  Likewise when the float search
// on that LP fails (greenbea does it for real): its basis is certified all the same.  All three
// injected here.
TEST(ExactSolve, LeastInfeasibilityProvesWhatTheRowDoesNot) {
  for (Fault fault : {Fault::row_not_refined, Fault::auxiliary_not_refined, Fault::auxiliary_search_fails}) {
    SolveOptions options;
    options.fault = fault;
    CertifiedSolution result = certified_solve(infeasible_rows_model(), options);
    ASSERT_TRUE(result.certified()) << result.verdict.failure;
    EXPECT_EQ(result.solution.outcome, Outcome::infeasible);
    EXPECT_EQ(result.solution.stats.proof, "least infeasibility");
    EXPECT_EQ(result.solution.y, (std::vector<Rational>{-1, 1}));
    EXPECT_EQ(result.solution.stats.float_note,
              fault == Fault::auxiliary_search_fails ? "least infeasibility: failure injected" : "");
  }
}

// Invented: min -x - y with x - y <= 1 has no dual feasible basis, and z in [0, 1] must reach 2,
// so it is infeasible too.  The float search, after its dual phase 1 finds no dual feasible
// basis, must still find the infeasibility, and the row of B^{-1} it ends on proves it.
TEST(ExactSolve, InfeasibleWithoutADualFeasibleBasis) {
  auto model = ModelBuilder("both")
                   .column("x", -1)
                   .column("y", -1)
                   .column("z", 0, q(0), q(1))
                   .row("cap", Terms{{"x", 1}, {"y", -1}}, {}, q(1))
                   .row("need", Terms{{"z", 1}}, q(2), {})
                   .build();
  CertifiedSolution result = certified_solve(model);
  EXPECT_TRUE(result.certified()) << result.verdict.failure;
  EXPECT_EQ(result.solution.outcome, Outcome::infeasible);
  EXPECT_EQ(result.solution.stats.proof, "refined row of the inverse");
}

// A crossed row or column is proven at once by its own two limits, and the checker agrees.
TEST(ExactSolve, CrossedLimitsAreProvenByThemselves) {
  auto row = ModelBuilder("crossed-row").column("x", 1).row("r", Terms{{"x", 1}}, q(4), q(1)).build();
  auto column =
      ModelBuilder("crossed-column").column("x", 1, q(2), q(1)).row("r", Terms{{"x", 1}}, q(0), {}).build();
  for (const model::Model* m : {&row, &column}) {
    CertifiedSolution result = certified_solve(*m);
    ASSERT_TRUE(result.certified()) << result.verdict.failure;
    EXPECT_EQ(result.solution.outcome, Outcome::infeasible);
    EXPECT_EQ(result.solution.stats.proof, "crossed limits");
    ASSERT_EQ(result.certificate.farkas.size(), 2u);
    EXPECT_EQ(result.certificate.farkas[0].entry.name, m == &row ? "r" : "x");
    EXPECT_TRUE(result.certificate.y.empty());
  }
}

// Worked by hand (invented): minimise 2 x1 + 3 x2 with x1 + x2 >= 4 and x1 + 3 x2 >= 6, x >= 0.
// The logical basis is dual feasible (costs >= 0) and primal infeasible, which is the exact dual
// simplex's case; it ends at the vertex (3, 1) with objective 9 (the other vertices, (6, 0) and
// (0, 4), cost 12).  The progress callback sees the dual's phase: a stub of the dual that returns
// at once leaves the optimum to the primal and fails here.
TEST(ExactSolve, ExactDualSimplexRunsFromADualFeasibleBasis) {
  auto model = model::ModelBuilder("dual-case")
                   .column("x1", 2)
                   .column("x2", 3)
                   .row("r1", {{"x1", 1}, {"x2", 1}}, Rational(4), std::nullopt)
                   .row("r2", {{"x1", 1}, {"x2", 3}}, Rational(6), std::nullopt)
                   .build();
  SolveOptions options;
  options.method = Method::exact;
  std::vector<std::string> phases;
  options.progress = [&phases](const Progress& p) { phases.push_back(p.phase); };
  CertifiedSolution result = certified_solve(model, options);
  ASSERT_TRUE(result.certified()) << result.verdict.failure;
  EXPECT_EQ(result.solution.objective, 9);
  EXPECT_EQ(result.solution.x, (std::vector<Rational>{3, 1}));
  EXPECT_NE(std::find(phases.begin(), phases.end(), "exact dual"), phases.end());
}

// An injected float failure (at the optimal basis the search reached) sends the solve to the exact
// engine from where the search stopped: refinement proves that basis, no pivot and no restart.
TEST(ExactSolve, HybridFallsBackWhenTheFloatSearchFails) {
  auto model = chvatal_chapter2();
  SolveOptions options;
  options.fault = Fault::float_search_fails;
  CertifiedSolution result = certified_solve(model, options);
  EXPECT_TRUE(result.certified()) << result.verdict.failure;
  const Solution& s = result.solution;
  ASSERT_EQ(s.outcome, Outcome::optimal);
  EXPECT_EQ(s.objective, 13);  // Chvatal 1983, ch. 2
  EXPECT_TRUE(s.stats.fell_back);
  EXPECT_EQ(s.stats.float_note, "failure injected");
  EXPECT_EQ(s.stats.proof, "refined basis");
  EXPECT_EQ(s.stats.exact_iterations, 0);
}

// An injected spoiled result: the checker rejects it, the rejection is kept, and the pure exact
// engine's result (no float search) is certified instead, for each outcome.
TEST(ExactSolve, CheckerRejectionSendsTheSolveToThePureEngine) {
  auto optimal = chvatal_chapter2();
  auto unbounded = unbounded_model();
  auto infeasible = infeasible_rows_model();
  const std::pair<const model::Model*, Outcome> cases[] = {
      {&optimal, Outcome::optimal}, {&unbounded, Outcome::unbounded}, {&infeasible, Outcome::infeasible}};
  for (const auto& [model, outcome] : cases) {
    SolveOptions options;
    options.fault = Fault::result_corrupted;
    CertifiedSolution result = certified_solve(*model, options);
    EXPECT_TRUE(result.certified()) << result.verdict.failure;
    EXPECT_EQ(result.solution.outcome, outcome);
    ASSERT_EQ(result.rejections.size(), 1u) << model->title;
    EXPECT_NE(result.rejections[0].find("the checker rejected the solve path's"), std::string::npos)
        << result.rejections[0];
    EXPECT_EQ(result.solution.stats.float_iterations, 0) << model->title;  // the pure engine ran
    EXPECT_EQ(result.solution.stats.proof, "exact pivots") << model->title;
  }
}

TEST(ExactSolve, StopsAtTheBudget) {
  auto model = chvatal_chapter2();
  run::Budget budget(0.0, std::nullopt);
  while (budget.elapsed_seconds() <= 0) {
  }
  SolveOptions options;
  options.method = Method::exact;
  options.budget = &budget;
  Solution s = solve(model, options);
  EXPECT_EQ(s.outcome, Outcome::stopped);
  EXPECT_EQ(s.stop_reason, run::StopReason::time_limit);
}

}  // namespace
}  // namespace plumb::exact
