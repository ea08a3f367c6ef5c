// The crash basis of the float search (docs/solving.md, "The crash"): triangular, dual feasible,
// with exact dual steepest-edge weights, and a dual simplex that starts there.
#include "plumb/simplex/float_simplex.hpp"
#include "simplex/engine.hpp"
#include "simplex/lp_data.hpp"

#include <gtest/gtest.h>

#include <cmath>
#include <string>
#include <vector>

namespace {

using plumb::model::ModelBuilder;
using plumb::model::Rational;
using plumb::simplex::FloatOptions;
using plumb::simplex::FloatStatus;
using plumb::simplex::VarStatus;
using plumb::simplex::detail::FloatEngine;
using plumb::simplex::detail::LpData;

// Invented: two products over three periods; per product and period make (5 or 7 a unit), keep
// in store (1 a unit and period) or buy in (15 or 21); a balance row per product and period and
// a machine-hours row per period with room to spare.  Making each period's demand in its period
// is optimal (worked by hand): 5 (10 + 20 + 30) + 7 (5 + 10 + 15) = 510.
plumb::model::Model loose_plan() {
  ModelBuilder builder("loose-plan");
  const char* product[] = {"a", "b"};
  const int make_cost[] = {5, 7}, hours[] = {1, 2}, demand[2][3] = {{10, 20, 30}, {5, 10, 15}};
  for (int p = 0; p < 2; ++p)
    for (int t = 0; t < 3; ++t) {
      std::string at = std::string(product[p]) + std::to_string(t);
      builder.column("make_" + at, make_cost[p]).column("keep_" + at, 1).column("buy_" + at, 3 * make_cost[p]);
    }
  for (int p = 0; p < 2; ++p)
    for (int t = 0; t < 3; ++t) {
      std::string at = std::string(product[p]) + std::to_string(t);
      std::vector<std::pair<std::string, Rational>> entries = {{"make_" + at, 1}, {"buy_" + at, 1}, {"keep_" + at, -1}};
      if (t > 0) entries.push_back({"keep_" + std::string(product[p]) + std::to_string(t - 1), 1});
      builder.row("balance_" + at, entries, Rational(demand[p][t]), Rational(demand[p][t]));
    }
  for (int t = 0; t < 3; ++t)
    builder.row("hours_" + std::to_string(t),
                {{"make_a" + std::to_string(t), hours[0]}, {"make_b" + std::to_string(t), hours[1]}}, {}, Rational(100));
  return builder.build();
}

LpData scaled(const plumb::model::Model& model) {
  LpData lp = plumb::simplex::detail::lp_from_model(model);
  plumb::simplex::detail::scale(lp);
  return lp;
}

// The loose plan's engine right after its crash.
struct CrashedPlan {
  plumb::model::Model model = loose_plan();
  LpData lp = scaled(model);
  FloatOptions options;
  FloatEngine engine{lp, options};
  int crashed = engine.crash_equality_rows();
};

TEST(FloatCrash, EachBalanceRowTakesItsMakeColumnAndTheSearchStartsOptimal) {
  CrashedPlan plan;
  auto& [model, lp, options, engine, crashed] = plan;
  EXPECT_EQ(crashed, 6);
  for (int j = 0; j < model.column_count(); ++j)
    EXPECT_EQ(engine.statuses()[j] == VarStatus::basic, model.columns[j].name.rfind("make_", 0) == 0) << model.columns[j].name;
  ASSERT_EQ(engine.solve(), FloatStatus::optimal) << engine.note();
  EXPECT_EQ(engine.iterations(), 0);
  EXPECT_NEAR(lp.model_objective(engine.objective()), 510, 1e-9);

  auto from_crash = plumb::simplex::solve_float(model);
  ASSERT_EQ(from_crash.status, FloatStatus::optimal);
  EXPECT_EQ(from_crash.iterations, 0);

  options.crash = false;
  auto logical_start = plumb::simplex::solve_float(model, options);
  ASSERT_EQ(logical_start.status, FloatStatus::optimal);
  EXPECT_NEAR(logical_start.objective, 510, 1e-9);
  EXPECT_GT(logical_start.iterations, 0);
}

// The weights are ||e_k^T B^-1||^2, here from B^-1 found by dense Gauss-Jordan elimination.
TEST(FloatCrash, ItsDualSteepestEdgeWeightsAreExact) {
  CrashedPlan plan;
  const auto& [model, lp, options, engine, crashed] = plan;
  ASSERT_GT(crashed, 0);
  const int m = lp.rows, n = lp.columns;
  std::vector<int> basic;
  for (int j = 0; j < n + m; ++j)
    if (engine.statuses()[j] == VarStatus::basic) basic.push_back(j);
  ASSERT_EQ(static_cast<int>(basic.size()), m);
  // [B | I] -> [I | B^-1]; column k of B is basic[k]'s column of [A -I].
  std::vector<std::vector<double>> work(m, std::vector<double>(2 * m, 0));
  for (int k = 0; k < m; ++k) {
    const int j = basic[k];
    if (j >= n) {
      work[j - n][k] = -1;
    } else {
      for (int p = lp.by_column.start[j]; p < lp.by_column.start[j + 1]; ++p) work[lp.by_column.index[p]][k] = lp.by_column.value[p];
    }
    work[k][m + k] = 1;
  }
  for (int c = 0; c < m; ++c) {
    int pivot = c;
    for (int r = c; r < m; ++r)
      if (std::abs(work[r][c]) > std::abs(work[pivot][c])) pivot = r;
    std::swap(work[c], work[pivot]);
    const double value = work[c][c];
    for (double& entry : work[c]) entry /= value;
    for (int r = 0; r < m; ++r)
      if (r != c && work[r][c] != 0) {
        const double factor = work[r][c];
        for (int t = 0; t < 2 * m; ++t) work[r][t] -= factor * work[c][t];
      }
  }
  for (int k = 0; k < m; ++k) {
    double norm = 0;
    for (int t = 0; t < m; ++t) norm += work[k][m + t] * work[k][m + t];
    EXPECT_NEAR(engine.dual_weight(basic[k]), norm, 1e-9 * norm) << "variable " << basic[k];
  }
}

// Invented shape of the choice tests: rows r: x + y = r_side and s: x + z = s_side, x costing 1;
// the engine right after its crash.
struct CrashedPair {
  CrashedPair(Rational cost_y, Rational cost_z, Rational r_side, Rational s_side)
      : model(ModelBuilder("crash-pair")
                  .column("x", 1)
                  .column("y", cost_y)
                  .column("z", cost_z)
                  .row("r", {{"x", 1}, {"y", 1}}, r_side, r_side)
                  .row("s", {{"x", 1}, {"z", 1}}, s_side, s_side)
                  .build()) {}
  plumb::model::Model model;
  LpData lp = scaled(model);
  FloatOptions options;
  FloatEngine engine{lp, options};
  int crashed = engine.crash_equality_rows();
};

// In row r the column y closes no other equality row and is tried first, but with y_r = 3 (its
// cost) x's reduced cost 1 - 3 would be dual infeasible; x, which closes row s, is the crash's
// choice.
TEST(FloatCrash, AColumnThatWouldBreakDualFeasibilityStaysOut) {
  CrashedPair pair(3, 1, 4, 2);
  EXPECT_EQ(pair.crashed, 1);
  EXPECT_EQ(pair.engine.statuses()[0], VarStatus::basic);
  EXPECT_NE(pair.engine.statuses()[1], VarStatus::basic);
  ASSERT_EQ(pair.engine.solve(), FloatStatus::optimal) << pair.engine.note();
  EXPECT_NEAR(pair.lp.model_objective(pair.engine.objective()), 8, 1e-9);  // x = 2, y = 2 (worked by hand)
}

// Row r takes y (it closes no other row); then x, though cheapest in row s, has an entry in r,
// where y is already basic, and stays out (the basis stays triangular); z would make x's reduced
// cost 0.5 - 2 < 0, so row s keeps its logical.  Optimum 4 at x = 2, z = 1 (worked by hand: the
// cost is 7 - 1.5 x on 0 <= x <= 2).
TEST(FloatCrash, AColumnWithAnEntryInACrashedRowStaysOut) {
  CrashedPair pair(Rational(1, 2), 2, 2, 3);
  EXPECT_EQ(pair.crashed, 1);
  EXPECT_NE(pair.engine.statuses()[0], VarStatus::basic);
  EXPECT_EQ(pair.engine.statuses()[1], VarStatus::basic);
  ASSERT_EQ(pair.engine.solve(), FloatStatus::optimal) << pair.engine.note();
  EXPECT_NEAR(pair.lp.model_objective(pair.engine.objective()), 4, 1e-9);
}

}  // namespace
