// The float LP kept across searches (simplex::FloatModel): after taking a model's edited rows,
// columns or objective it must search exactly as a float LP built afresh from the edited model,
// iteration for iteration.
#include "plumb/model/read.hpp"
#include "plumb/simplex/float_simplex.hpp"
#include "shared_data.hpp"

#include <gtest/gtest.h>

#include <limits>

namespace {

using plumb::model::Model;
using plumb::model::ModelBuilder;
using plumb::model::Rational;
using plumb::simplex::FloatModel;
using plumb::simplex::FloatOptions;
using plumb::simplex::FloatResult;
using plumb::simplex::solve_float;

void expect_same_search(const FloatResult& kept, const FloatResult& afresh) {
  EXPECT_EQ(kept.status, afresh.status);
  EXPECT_EQ(kept.iterations, afresh.iterations);
  EXPECT_EQ(kept.objective, afresh.objective);  // the same doubles, so the same rounding
  EXPECT_EQ(kept.basis.columns, afresh.basis.columns);
  EXPECT_EQ(kept.basis.rows, afresh.basis.rows);
}

// Invented for this test: a print shop's week (posters, leaflets, booklets) under press hours,
// paper and a standing order; scaled entries of several magnitudes so that scaling matters.
Model print_shop() {
  return ModelBuilder("print-shop-week")
      .maximise()
      .column("posters", Rational(7, 2), Rational(0), Rational(400))
      .column("leaflets", Rational(1, 20), Rational(0))
      .column("booklets", 12, Rational(5), Rational(150))
      .row("press", {{"posters", Rational(3, 100)}, {"leaflets", Rational(1, 2000)}, {"booklets", Rational(1, 5)}}, {},
           Rational(40))
      .row("paper", {{"posters", 2}, {"leaflets", Rational(1, 10)}, {"booklets", 30}}, {}, Rational(6000))
      .row("order", {{"leaflets", 1}, {"booklets", 100}}, Rational(2000), {})
      .build();
}

// Edits one at a time, each taken by the kept LP and compared with a search on the edited model.
void expect_edits_taken(const Model& model, FloatOptions options) {
  FloatModel kept(model);
  Model edited = model;
  auto compare = [&](const char* what) {
    SCOPED_TRACE(what);
    expect_same_search(solve_float(kept, options), solve_float(edited, options));
  };
  compare("as given");

  edited.rows[0].upper = edited.rows[0].upper ? std::optional(*edited.rows[0].upper / 2) : std::nullopt;
  edited.rows[0].lower.reset();
  kept.take_row(edited, 0);
  compare("first row halved above, free below");

  const int last = model.column_count() - 1;
  edited.columns[last].upper = Rational(1, 3);
  edited.columns[last].lower = Rational(0);
  kept.take_column(edited, last);
  compare("last column boxed in [0, 1/3]");

  edited.objective.sense = plumb::model::Sense::minimise;
  for (auto& c : edited.objective.coefficients) c = -c;
  kept.take_objective(edited);
  compare("objective negated and minimised");

  edited.rows[0] = model.rows[0];
  edited.columns[last] = model.columns[last];
  edited.objective = model.objective;
  kept.take_row(edited, 0);
  kept.take_column(edited, last);
  kept.take_objective(edited);
  compare("restored");
}

TEST(FloatModel, TakesEditedLimitsAndObjectiveAsAFreshBuildWould) {
  FloatOptions options;
  options.feasibility_search = false;
  expect_edits_taken(print_shop(), options);
}

// A correction problem (its own bounds and costs on the model's matrix) searched on the kept LP
// as on a fresh build, and the kept LP unchanged by it.
TEST(FloatModel, CorrectionProblemSearchesAsOnAFreshBuild) {
  const Model model = print_shop();
  FloatModel kept(model);
  plumb::simplex::CorrectionProblem correction;
  const int variables = model.column_count() + model.row_count();
  correction.lower.assign(variables, -2.0);
  correction.upper.assign(variables, 3.0);
  correction.cost = {-1.0, 0.5, -4.0, 0.0, 0.25, 0.0};
  FloatOptions options;
  options.correction = &correction;
  expect_same_search(solve_float(kept, options), solve_float(model, options));
  FloatOptions plain;
  plain.feasibility_search = false;
  expect_same_search(solve_float(kept, plain), solve_float(model, plain));
}

TEST(NetlibFloatModel, AfiroEditsSearchAsAFreshBuild) {
  auto folder = plumb::test::shared_dir / "netlib";
  if (!plumb::test::shared_folder_present(folder)) GTEST_SKIP() << folder << " missing";
  auto model = plumb::model::read_model((folder / "afiro.mps.gz").string());
  FloatOptions options;
  options.feasibility_search = false;
  expect_edits_taken(model, options);
}

// A correction problem is bounded whenever the model's LP is (its costs are reduced costs), so a
// ray the float search meets there is rounding on costs scaled up to 2^40: the search shifts that
// cost and ends at a basis for the exact side to judge, never in a ray.  Here a ray is real (the
// correction's costs are made up: -1 on posters, every entry of whose column is positive, with
// every row free above), and the search still ends optimal, on shifted costs.
TEST(FloatModel, ACorrectionProblemNeverEndsInARay) {
  const Model model = print_shop();
  plumb::simplex::CorrectionProblem correction;
  const int variables = model.column_count() + model.row_count();
  correction.lower.assign(variables, 0.0);
  correction.upper.assign(variables, std::numeric_limits<double>::infinity());
  correction.cost.assign(variables, 0.0);
  correction.cost[0] = -1.0;
  FloatOptions options;
  options.correction = &correction;
  FloatResult result = solve_float(model, options);
  EXPECT_EQ(result.status, plumb::simplex::FloatStatus::optimal) << result.note;
  // The same LP as a model of its own: unbounded.
  Model same = model;
  for (auto& column : same.columns) column.lower = Rational(0), column.upper.reset();
  for (auto& row : same.rows) row.lower = Rational(0), row.upper.reset();
  same.objective.sense = plumb::model::Sense::minimise;
  same.objective.coefficients.assign(model.column_count(), Rational(0));
  same.objective.coefficients[0] = -1;
  FloatOptions plain;
  plain.feasibility_search = false;
  EXPECT_EQ(solve_float(same, plain).status, plumb::simplex::FloatStatus::unbounded);
}

// A search hands back its pricing weights with its basis (simplex::DualWeights), and a warm start
// from that basis prices with them: re-solved from its own optimum the print shop needs no
// iteration and ends with the weights it was given, where a start without them has 1s.
TEST(FloatModel, AWarmStartPricesWithTheWeightsItCameWith) {
  const Model model = print_shop();
  FloatModel kept(model);
  FloatOptions options;
  options.feasibility_search = false;
  const FloatResult first = solve_float(kept, options);
  ASSERT_EQ(first.status, plumb::simplex::FloatStatus::optimal) << first.note;
  const std::size_t variables = model.column_count() + model.row_count();
  ASSERT_EQ(first.dual_weights.size(), variables);
  std::vector<plumb::simplex::VarStatus> statuses = first.basis.columns;  // per variable, as the weights
  statuses.insert(statuses.end(), first.basis.rows.begin(), first.basis.rows.end());
  auto basic = [&](std::size_t j) { return statuses[j] == plumb::simplex::VarStatus::basic; };
  bool any_other_than_one = false;
  for (std::size_t j = 0; j < variables; ++j) {
    EXPECT_EQ(first.dual_weights[j] > 0, basic(j)) << "variable " << j;
    any_other_than_one |= basic(j) && first.dual_weights[j] != 1;
  }
  ASSERT_TRUE(any_other_than_one) << "the test needs a basis whose rows of B^-1 are not unit vectors";

  options.warm_start = &first.basis;
  options.warm_weights = &first.dual_weights;
  const FloatResult again = solve_float(kept, options);
  EXPECT_EQ(again.iterations, 0);
  EXPECT_EQ(again.dual_weights, first.dual_weights);

  options.warm_weights = nullptr;
  const FloatResult unweighted = solve_float(kept, options);
  EXPECT_EQ(unweighted.iterations, 0);
  for (std::size_t j = 0; j < variables; ++j) {
    if (!basic(j)) continue;
    EXPECT_EQ(unweighted.dual_weights[j], 1) << "variable " << j;
  }
}

}  // namespace
