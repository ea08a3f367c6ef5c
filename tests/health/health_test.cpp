// Model-health findings on small models built in code.  Source of every expectation: constructed
// case (the model is made to have exactly the property checked, counted by hand).
#include "plumb/health/health.hpp"

#include <gtest/gtest.h>

#include <string>
#include <vector>

using plumb::health::BoundKind;
using plumb::health::HealthReport;
using plumb::health::NumberKind;
using plumb::health::RowKind;
using plumb::health::Severity;
using plumb::health::inspect;
using plumb::model::Model;
using plumb::model::ModelBuilder;
using plumb::numeric::Rational;
using Names = std::vector<std::string>;

namespace {

const plumb::model::Side inf;

bool has_finding(const HealthReport& report, const std::string& code, Severity severity) {
  for (const auto& f : report.findings)
    if (f.code == code) return f.severity == severity;
  return false;
}

// Two columns, two plain rows: nothing to report.
Model tidy_model() {
  return ModelBuilder("tidy")
      .minimise()
      .column("x", 2)
      .column("y", 3)
      .row("supply", {{"x", 1}, {"y", 1}}, Rational(4), inf)
      .row("capacity", {{"x", 2}, {"y", 1}}, inf, Rational(10))
      .build();
}

}  // namespace

TEST(HealthInspect, TidyModelHasNoFindings) {
  HealthReport r = inspect(tidy_model());
  EXPECT_EQ(r.title, "tidy");
  EXPECT_EQ(r.rows, 2);
  EXPECT_EQ(r.columns, 2);
  EXPECT_EQ(r.nonzeros, 4u);
  EXPECT_EQ(r.density, Rational(1));
  EXPECT_EQ(r.objective_nonzeros, 2u);
  EXPECT_TRUE(r.findings.empty());
}

TEST(HealthInspect, CountsRowKinds) {
  Model m = ModelBuilder()
                .column("x", 1)
                .row("eq", {{"x", 1}}, Rational(1), Rational(1))
                .row("le", {{"x", 1}}, inf, Rational(5))
                .row("ge", {{"x", 1}}, Rational(2), inf)
                .row("range", {{"x", 1}}, Rational(1), Rational(3))
                .row("free", {{"x", 1}}, inf, inf)
                .row("crossed", {{"x", 1}}, Rational(4), Rational(3))
                .build();
  HealthReport r = inspect(m);
  for (RowKind kind : {RowKind::equal, RowKind::at_most, RowKind::at_least, RowKind::ranged, RowKind::free,
                       RowKind::crossed})
    EXPECT_EQ(r.count(kind), 1) << to_string(kind);
  EXPECT_EQ(r.free_rows, Names{"free"});
  EXPECT_EQ(r.crossed_rows, Names{"crossed"});
  EXPECT_TRUE(has_finding(r, "crossed-rows", Severity::error));
  EXPECT_TRUE(has_finding(r, "free-rows", Severity::note));
  EXPECT_EQ(r.findings.front().severity, Severity::error);  // worst first
}

TEST(HealthInspect, CountsBoundKinds) {
  Model m = ModelBuilder()
                .column("nonneg", 1)
                .column("nonpos", 1, inf, Rational(0))
                .column("lower", 1, Rational(-2), inf)
                .column("upper", 1, inf, Rational(7))
                .column("boxed", 1, Rational(0), Rational(7))
                .column("fixed", 1, Rational(3), Rational(3))
                .column("free", 1, inf, inf)
                .column("crossed", 1, Rational(5), Rational(1))
                .row("all", {{"nonneg", 1}, {"nonpos", 1}, {"lower", 1}, {"upper", 1}, {"boxed", 1}, {"fixed", 1},
                             {"free", 1}, {"crossed", 1}},
                     inf, Rational(100))
                .build();
  HealthReport r = inspect(m);
  for (BoundKind kind : {BoundKind::non_negative, BoundKind::non_positive, BoundKind::lower_only, BoundKind::upper_only,
                         BoundKind::boxed, BoundKind::fixed, BoundKind::free, BoundKind::crossed})
    EXPECT_EQ(r.count(kind), 1) << to_string(kind);
  EXPECT_EQ(r.crossed_columns, Names{"crossed"});
  EXPECT_TRUE(has_finding(r, "crossed-columns", Severity::error));
}

TEST(HealthInspect, IntegerColumnsAreCountedAsANote) {
  Model m = tidy_model();
  m.columns[1].integer = true;
  HealthReport r = inspect(m);
  EXPECT_EQ(r.integer_columns, 1);
  EXPECT_TRUE(has_finding(r, "integer-columns", Severity::note));
}

TEST(HealthInspect, RangesOfEachKindExactly) {
  Model m = ModelBuilder()
                .column("x", Rational(1, 3), Rational(0), Rational(1000))
                .column("y", Rational(-6), Rational(1, 2), inf)
                .row("r1", {{"x", Rational(1, 8)}, {"y", 4}}, Rational(-2), Rational(-2))
                .row("r2", {{"x", -32}, {"y", 1}}, Rational(0), Rational(50))
                .build();
  HealthReport r = inspect(m);
  const auto& matrix = r.range(NumberKind::matrix);
  EXPECT_EQ(matrix.count, 4u);
  EXPECT_EQ(matrix.smallest, Rational(1, 8));
  EXPECT_EQ(matrix.largest, Rational(32));
  EXPECT_EQ(matrix.ratio(), Rational(256));
  EXPECT_EQ(matrix.smallest_at.row, "r1");
  EXPECT_EQ(matrix.smallest_at.column, "x");
  EXPECT_EQ(matrix.largest_at.row, "r2");
  EXPECT_EQ(matrix.median, Rational(1));  // magnitudes 1/8, 1, 4, 32: the lower middle one
  const auto& costs = r.range(NumberKind::objective);
  EXPECT_EQ(costs.smallest, Rational(1, 3));
  EXPECT_EQ(costs.largest, Rational(6));
  EXPECT_EQ(costs.largest_at.column, "y");
  // Row sides: the equation's -2 once ("both"), r2's 0 left out as zero, 50.
  const auto& sides = r.range(NumberKind::row_side);
  EXPECT_EQ(sides.count, 2u);
  EXPECT_EQ(sides.smallest, Rational(2));
  EXPECT_EQ(sides.smallest_at.side, "both");
  EXPECT_EQ(sides.largest, Rational(50));
  EXPECT_EQ(sides.largest_at.side, "upper");
  // Bounds: x's 1000 and y's 1/2; zero lower bound and infinite upper left out.
  const auto& bounds = r.range(NumberKind::bound);
  EXPECT_EQ(bounds.count, 2u);
  EXPECT_EQ(bounds.ratio(), Rational(2000));
  EXPECT_FALSE(bounds.wide());
}

TEST(HealthInspect, WideRangeIsFlagged) {
  Model m = ModelBuilder()
                .column("x", 1)
                .column("y", 1)
                .row("r", {{"x", Rational(1, 1000)}, {"y", 1000}}, inf, Rational(1))
                .build();
  HealthReport r = inspect(m);
  EXPECT_EQ(r.range(NumberKind::matrix).ratio(), Rational(1000000));
  EXPECT_TRUE(r.range(NumberKind::matrix).wide());
  EXPECT_TRUE(has_finding(r, "wide-range-matrix", Severity::warning));
  EXPECT_FALSE(has_finding(r, "wide-range-objective", Severity::warning));
}

TEST(HealthInspect, EmptyRowsAndColumns) {
  Model m = ModelBuilder()
                .column("used", 1)
                .column("idle", 0)
                .column("runaway", -1)  // minimise, cost -1, no upper bound, in no row
                .row("real", {{"used", 1}}, Rational(1), inf)
                .row("harmless", {}, inf, Rational(3))
                .row("impossible", {}, Rational(2), inf)
                .build();
  HealthReport r = inspect(m);
  EXPECT_EQ(r.empty_rows, (Names{"harmless", "impossible"}));
  EXPECT_EQ(r.infeasible_empty_rows, Names{"impossible"});
  EXPECT_EQ(r.empty_columns, (Names{"idle", "runaway"}));
  EXPECT_EQ(r.unbounded_empty_columns, Names{"runaway"});
  EXPECT_TRUE(has_finding(r, "infeasible-empty-rows", Severity::error));
  EXPECT_TRUE(has_finding(r, "unbounded-empty-columns", Severity::warning));
  EXPECT_TRUE(has_finding(r, "empty-rows", Severity::note));
}

TEST(HealthInspect, EmptyColumnUnboundedDependsOnSenseAndBounds) {
  Model m = ModelBuilder()
                .maximise()
                .column("capped", 5, Rational(0), Rational(9))
                .column("open", 5)
                .column("falls", -5, inf, Rational(0))
                .build();
  EXPECT_EQ(inspect(m).unbounded_empty_columns, (Names{"open", "falls"}));
}

TEST(HealthInspect, SingletonRowsImplyBounds) {
  Model m = ModelBuilder()
                .column("x", 1)
                .column("y", 1)
                .row("cap", {{"x", 2}}, inf, Rational(6))
                .row("floor", {{"y", -4}}, Rational(-2), Rational(8))
                .row("both", {{"x", 1}, {"y", 1}}, Rational(1), inf)
                .build();
  HealthReport r = inspect(m);
  ASSERT_EQ(r.singleton_rows.size(), 2u);
  EXPECT_EQ(r.singleton_rows[0].row, "cap");
  EXPECT_EQ(r.singleton_rows[0].column, "x");
  EXPECT_FALSE(r.singleton_rows[0].implied_lower);
  EXPECT_EQ(*r.singleton_rows[0].implied_upper, Rational(3));
  // -2 <= -4y <= 8  gives  -2 <= y <= 1/2.
  EXPECT_EQ(*r.singleton_rows[1].implied_lower, Rational(-2));
  EXPECT_EQ(*r.singleton_rows[1].implied_upper, Rational(1, 2));
  EXPECT_TRUE(has_finding(r, "singleton-rows", Severity::note));
}

TEST(HealthInspect, DuplicateRowsNeedSameCoefficientsAndSides) {
  Model m = ModelBuilder()
                .column("x", 1)
                .column("y", 1)
                .row("a", {{"x", Rational(1, 3)}, {"y", 2}}, inf, Rational(5))
                .row("b", {{"x", 1}, {"y", 1}}, inf, Rational(5))
                .row("a_again", {{"y", 2}, {"x", Rational(2, 6)}}, inf, Rational(5))
                .row("a_other_side", {{"x", Rational(1, 3)}, {"y", 2}}, inf, Rational(6))
                .row("a_ge", {{"x", Rational(1, 3)}, {"y", 2}}, Rational(5), inf)
                .row("b_again", {{"x", 1}, {"y", 1}}, inf, Rational(5))
                .row("a_third", {{"x", Rational(1, 3)}, {"y", 2}}, inf, Rational(5))
                .build();
  HealthReport r = inspect(m);
  std::vector<Names> expected{{"a", "a_again", "a_third"}, {"b", "b_again"}};
  EXPECT_EQ(r.duplicate_rows, expected);
  EXPECT_TRUE(has_finding(r, "duplicate-rows", Severity::warning));
}

TEST(HealthInspect, DuplicateColumnsNeedSameCoefficientsAndCost) {
  Model m = ModelBuilder()
                .column("x", 1)
                .column("x_copy", 1, Rational(0), Rational(4))  // bounds may differ
                .column("x_dearer", 2)
                .column("z", 1)
                .row("r1", {{"x", 3}, {"x_copy", 3}, {"x_dearer", 3}, {"z", 3}}, inf, Rational(9))
                .row("r2", {{"x", 1}, {"x_copy", 1}, {"x_dearer", 1}}, Rational(1), inf)
                .build();
  HealthReport r = inspect(m);
  EXPECT_EQ(r.duplicate_columns, std::vector<Names>{(Names{"x", "x_copy"})});
}

TEST(HealthInspect, DuplicatesAreFoundInALargeModel) {
  // 20000 rows of two entries each, every 1000th row copied once more at the end.
  ModelBuilder builder;
  const int n = 20000;
  for (int j = 0; j <= n; ++j) builder.column("c" + std::to_string(j), 1);
  for (int i = 0; i < n; ++i)
    builder.row("r" + std::to_string(i), {{"c" + std::to_string(i), Rational(i + 1, 7)}, {"c" + std::to_string(i + 1), 1}},
                inf, Rational(i));
  for (int i = 0; i < n; i += 1000)
    builder.row("copy" + std::to_string(i),
                {{"c" + std::to_string(i), Rational(i + 1, 7)}, {"c" + std::to_string(i + 1), 1}}, inf, Rational(i));
  HealthReport r = inspect(builder.build());
  ASSERT_EQ(r.duplicate_rows.size(), 20u);
  EXPECT_EQ(r.duplicate_rows[3], (Names{"r3000", "copy3000"}));
  EXPECT_TRUE(r.duplicate_columns.empty());
}

TEST(HealthInspect, BigNumbersAbsoluteAndRelative) {
  Model m = ModelBuilder()
                .column("x", 1)
                .column("y", 1)
                .column("z", 1, Rational(0), Rational(plumb::numeric::Integer("100000000000000000000")))  // 1e20
                .row("r1", {{"x", 1}, {"y", 2}}, inf, Rational(10))
                .row("r2", {{"x", 3}, {"y", 2000000}}, inf, Rational(20))  // 2e6 >= 1e6 x median 1
                .row("r3", {{"x", 1}, {"z", 1}}, inf, Rational(30))
                .build();
  HealthReport r = inspect(m);
  ASSERT_EQ(r.big_numbers.size(), 2u);
  EXPECT_EQ(r.big_numbers[0].kind, NumberKind::matrix);
  EXPECT_EQ(r.big_numbers[0].value, Rational(2000000));
  EXPECT_EQ(r.big_numbers[0].at.row, "r2");
  EXPECT_EQ(r.big_numbers[0].at.column, "y");
  EXPECT_FALSE(r.big_numbers[0].absolute);
  EXPECT_EQ(r.big_numbers[1].kind, NumberKind::bound);
  EXPECT_EQ(r.big_numbers[1].at.column, "z");
  EXPECT_EQ(r.big_numbers[1].at.side, "upper");
  EXPECT_TRUE(r.big_numbers[1].absolute);
  EXPECT_TRUE(has_finding(r, "big-numbers", Severity::warning));
}

TEST(HealthInspect, LabelCoverage) {
  Model m = tidy_model();
  m.rows[0].label.statement = "at least 4 units leave the depot";
  m.rows[1].label.unit = "units";  // a unit alone is not a statement
  m.columns[0].label.statement = "units shipped by road";
  m.columns[1].upper_label.statement = "rail slots are limited";
  HealthReport r = inspect(m);
  EXPECT_EQ(r.labels.rows_with_statement, 1);
  EXPECT_EQ(r.labels.columns_with_statement, 1);
  EXPECT_EQ(r.labels.bounds_with_statement, 1);
  EXPECT_FALSE(r.labels.objective_has_statement);
}

TEST(HealthInspect, EmptyModel) {
  HealthReport r = inspect(ModelBuilder("nothing").build());
  EXPECT_EQ(r.rows, 0);
  EXPECT_EQ(r.density, Rational(0));
  EXPECT_EQ(r.range(NumberKind::matrix).count, 0u);
  EXPECT_TRUE(r.findings.empty());
}
