// The search on zero costs beside the main float search (docs/solving.md, "The zero-cost search"):
// taken only when it proves infeasibility, never on a feasible model, and stoppable from the other
// thread.
#include "plumb/model/read.hpp"
#include "plumb/simplex/float_simplex.hpp"
#include "shared_data.hpp"
#include "simplex/engine.hpp"
#include "simplex/lp_data.hpp"

#include <gtest/gtest.h>

#include <atomic>
#include <thread>

namespace {

using plumb::model::ModelBuilder;
using plumb::model::Rational;
using plumb::simplex::FloatOptions;
using plumb::simplex::FloatStatus;
using plumb::simplex::solve_float;

// GTEST_SKIP returns only from the function it is in, so tests call it themselves on this.
bool one_core() { return std::thread::hardware_concurrency() < 2; }

FloatOptions main_search_only() {
  FloatOptions options;
  options.feasibility_search = false;
  return options;
}

// Invented: min -x1 - x2 with x1 - x2 <= 1 has no dual feasible basis, and z in [0, 1] must reach
// 2, so no point exists.  The main search needs its dual phase 1 and must then say infeasible
// rather than unbounded; the zero-cost search needs no phase 1.
plumb::model::Model infeasible_and_dual_infeasible() {
  return ModelBuilder("infeasible-and-no-dual-feasible-basis")
      .column("x1", -1)
      .column("x2", -1)
      .column("z", 0, Rational(0), Rational(1))
      .row("r", {{"x1", 1}, {"x2", -1}}, {}, Rational(1))
      .row("need", {{"z", 1}}, Rational(2), {})
      .build();
}

TEST(ZeroCostSearch, ItsProofOfInfeasibilityIsTaken) {
  if (one_core()) GTEST_SKIP() << "one core: the zero-cost search does not run";
  auto model = infeasible_and_dual_infeasible();
  auto raced = solve_float(model);
  EXPECT_EQ(raced.status, FloatStatus::infeasible) << raced.note;
  EXPECT_TRUE(raced.zero_cost_search);
  auto alone = solve_float(model, main_search_only());
  EXPECT_EQ(alone.status, FloatStatus::infeasible) << alone.note;
  EXPECT_FALSE(alone.zero_cost_search);
}

// Invented, worked by hand: min 3a + 2b with a + b >= 4 and a + 3b >= 6, a, b >= 0.  The
// vertices are (0, 4), (3, 1) and (6, 0), at costs 8, 11 and 18: the optimum is 8.
plumb::model::Model two_covering_rows() {
  return ModelBuilder("two-covering-rows")
      .column("a", 3)
      .column("b", 2)
      .row("cover", {{"a", 1}, {"b", 1}}, Rational(4), {})
      .row("weighted", {{"a", 1}, {"b", 3}}, Rational(6), {})
      .build();
}

// The zero-cost search finds a feasible point and is dropped; the main search's result is the
// same with or without it.
TEST(ZeroCostSearch, AFeasibleModelKeepsTheMainResult) {
  auto model = two_covering_rows();
  auto raced = solve_float(model);
  auto alone = solve_float(model, main_search_only());
  ASSERT_EQ(raced.status, FloatStatus::optimal) << raced.note;
  EXPECT_FALSE(raced.zero_cost_search);
  EXPECT_EQ(raced.basis.columns, alone.basis.columns);
  EXPECT_EQ(raced.basis.rows, alone.basis.rows);
  EXPECT_EQ(raced.iterations, alone.iterations);
  EXPECT_NEAR(raced.objective, 8.0, 1e-9);
}

// The same model, warm from its optimal basis: the search on the costs starts there and needs no
// iteration, unless the basis is marked as the zero-cost search's, when only that search starts
// there and the search on the costs goes its cold way (the same iterations as cold).
TEST(ZeroCostSearch, ABasisItFoundIsOnlyItsOwnStart) {
  if (one_core()) GTEST_SKIP() << "one core: the zero-cost search does not run";
  auto model = two_covering_rows();
  auto cold = solve_float(model);
  ASSERT_EQ(cold.status, FloatStatus::optimal) << cold.note;
  ASSERT_GT(cold.iterations, 0);
  FloatOptions warm;
  warm.warm_start = &cold.basis;
  EXPECT_EQ(solve_float(model, warm).iterations, 0);
  warm.warm_start_from_zero_costs = true;
  auto again = solve_float(model, warm);
  ASSERT_EQ(again.status, FloatStatus::optimal) << again.note;
  EXPECT_EQ(again.iterations, cold.iterations);
  EXPECT_EQ(again.basis.columns, cold.basis.columns);
}

// With the zero-cost search's basis as the warm start, the search on the costs starts where it
// last ended when told (simplex::FloatOptions::cost_search_start): from the optimum, no iteration.
TEST(ZeroCostSearch, TheSearchOnTheCostsCanStartWhereItLastEnded) {
  if (one_core()) GTEST_SKIP() << "one core: the zero-cost search does not run";
  auto model = two_covering_rows();
  auto cold = solve_float(model);
  ASSERT_EQ(cold.status, FloatStatus::optimal) << cold.note;
  ASSERT_GT(cold.iterations, 0);
  using plumb::simplex::VarStatus;
  plumb::simplex::Basis logical{{VarStatus::at_lower, VarStatus::at_lower},
                                {VarStatus::basic, VarStatus::basic}};
  FloatOptions warm;
  warm.warm_start = &logical;
  warm.warm_start_from_zero_costs = true;
  warm.cost_search_start = &cold.basis;
  auto again = solve_float(model, warm);
  ASSERT_EQ(again.status, FloatStatus::optimal) << again.note;
  EXPECT_EQ(again.iterations, 0);
  EXPECT_NEAR(again.objective, 8.0, 1e-9);
}

TEST(ZeroCostSearch, ASearchStopsWhenTheOtherThreadAsks) {
  auto model = infeasible_and_dual_infeasible();
  auto lp = plumb::simplex::detail::lp_from_model(model);
  plumb::simplex::detail::scale(lp);
  FloatOptions options;
  plumb::simplex::detail::FloatEngine engine(lp, options);
  std::atomic<bool> stop{true};
  engine.stop_when(stop);
  EXPECT_EQ(engine.solve(), FloatStatus::stopped);
  EXPECT_EQ(engine.iterations(), 0);
}

// ceria3d of the infeasible Netlib set (../shared/netlib-infeas): the zero-cost search proves it
// infeasible in far fewer iterations than the search on its costs (850 against 2 970 here).
TEST(NetlibZeroCostSearch, CeriaThreeDeeInFewerIterations) {
  const auto folder = plumb::test::shared_dir / "netlib-infeas";
  if (!plumb::test::shared_folder_present(folder))
    GTEST_SKIP() << "shared data folder " << folder << " is missing";
  if (one_core()) GTEST_SKIP() << "one core: the zero-cost search does not run";
  auto model = plumb::model::read_model((folder / "ceria3d.mps.gz").string());
  auto raced = solve_float(model);
  auto alone = solve_float(model, main_search_only());
  ASSERT_EQ(raced.status, FloatStatus::infeasible) << raced.note;
  ASSERT_EQ(alone.status, FloatStatus::infeasible) << alone.note;
  EXPECT_TRUE(raced.zero_cost_search);
  EXPECT_LT(2 * raced.iterations, alone.iterations);
}

}  // namespace
