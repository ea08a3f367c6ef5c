// Models that trip floating-point solvers: coefficients of 1e+-300 and 500-digit decimals, margins
// of 1e-12, nearly parallel rows, bad scaling, huge ranges on free variables, degenerate and
// cycling-prone vertices.  Each must be solved with its known exact answer and a certificate the
// independent checker accepts.
#include "plumb/certificate/certificate.hpp"
#include "plumb/check/check.hpp"
#include "plumb/exact/solve.hpp"
#include "plumb/model/model.hpp"

#include <gtest/gtest.h>

#include <string>

namespace plumb::exact {
namespace {

using model::ModelBuilder;
using model::Side;
using numeric::Rational;

Rational n(const char* text) { return *numeric::parse_number(text); }

// Solves by both methods through the one certified path: each answer must carry the expected
// outcome and objective, pass the independent checker with no rejection on the way, and pass it
// again after a trip through its JSON text.
void expect_solved(const model::Model& m, Outcome outcome, std::optional<Rational> objective = {}) {
  for (Method method : {Method::hybrid, Method::exact}) {
    SCOPED_TRACE(method == Method::hybrid ? "hybrid" : "exact");
    SolveOptions options;
    options.method = method;
    CertifiedSolution result = certified_solve(m, options);
    EXPECT_TRUE(result.rejections.empty()) << result.rejections.front();
    ASSERT_TRUE(result.certified()) << result.verdict.failure;
    ASSERT_EQ(result.solution.outcome, outcome);
    if (objective) {
      EXPECT_EQ(result.solution.objective, *objective) << numeric::to_fraction(result.solution.objective);
    }
    certificate::Certificate read_back =
        certificate::parse_certificate(certificate::to_json_text(result.certificate), "hard.certificate.json");
    check::Verdict again = check::verify(m, read_back);
    EXPECT_TRUE(again.valid) << again.failure;
  }
}

TEST(HardNumerics, ExtremeCoefficientsSolveExactly) {
  // Constructed case: 1e300 x >= 1, 1e-300 y >= 1 and d z <= e with 500-digit decimals d and e
  // (250 digits each side of the point); min x + y - z is 1e-300 + 1e300 - e/d, exactly.
  std::string digits;
  for (int k = 0; k < 50; ++k) digits += "1234567890";
  std::string reversed(digits.rbegin(), digits.rend());
  Rational d = n((digits.substr(0, 250) + "." + digits.substr(250)).c_str());
  Rational e = n((reversed.substr(0, 250) + "." + reversed.substr(250)).c_str());
  auto m = ModelBuilder("extreme-coefficients")
               .column("x", 1).column("y", 1).column("z", -1)
               .row("huge_coefficient", {{"x", n("1e300")}}, Rational(1), {})
               .row("tiny_coefficient", {{"y", n("1e-300")}}, Rational(1), {})
               .row("long_decimals", {{"z", d}}, {}, e)
               .build();
  expect_solved(m, Outcome::optimal, n("1e-300") + n("1e300") - e / d);
}

TEST(HardNumerics, InfeasibleByOneTrillionth) {
  // Constructed case: x + y >= 1 and x + y <= 1 - 1e-12; a solver with a 1e-9 tolerance calls it
  // feasible, exactly it is not.
  auto m = ModelBuilder("infeasible-by-1e-12")
               .column("x", 1).column("y", 1)
               .row("at_least_one", {{"x", 1}, {"y", 1}}, Rational(1), {})
               .row("just_below_one", {{"x", 1}, {"y", 1}}, {}, 1 - n("1e-12"))
               .build();
  expect_solved(m, Outcome::infeasible);
}

TEST(HardNumerics, FeasibleByOneTrillionthOnly) {
  // Constructed case: the reverse, x + y between 1 and 1 + 1e-12; max x + y is 1 + 1e-12 exactly.
  auto m = ModelBuilder("feasible-by-1e-12")
               .maximise()
               .column("x", 1).column("y", 1)
               .row("at_least_one", {{"x", 1}, {"y", 1}}, Rational(1), {})
               .row("just_above_one", {{"x", 1}, {"y", 1}}, {}, 1 + n("1e-12"))
               .build();
  expect_solved(m, Outcome::optimal, 1 + n("1e-12"));
}

TEST(HardNumerics, InfeasibleByARelativeMarginBelowDoublePrecision) {
  // Constructed case: x + y >= 1e6 and x + y <= 1e6 - 1e-10 (relative gap 1e-16: below one ulp).
  auto m = ModelBuilder("infeasible-below-ulp")
               .column("x", 1).column("y", 2)
               .row("demand", {{"x", 1}, {"y", 1}}, n("1e6"), {})
               .row("supply", {{"x", 1}, {"y", 1}}, {}, n("1e6") - n("1e-10"))
               .build();
  expect_solved(m, Outcome::infeasible);
}

TEST(HardNumerics, NearlyParallelRowsMeetWhereExpected) {
  // Constructed case: x + y <= 2 and x + (1 + e) y <= 2 + e/2 (e = 1e-12) meet at (3/2, 1/2);
  // max x + (1 + e/2) y lies between the two normals, so the optimum is there: 2 + e/4.
  Rational e = n("1e-12");
  auto m = ModelBuilder("nearly-parallel")
               .maximise()
               .column("x", 1).column("y", 1 + e / 2)
               .row("first", {{"x", 1}, {"y", 1}}, {}, Rational(2))
               .row("second", {{"x", 1}, {"y", 1 + e}}, {}, 2 + e / 2)
               .build();
  expect_solved(m, Outcome::optimal, 2 + e / 4);
}

TEST(HardNumerics, BadlyScaledRowsKeepTheirExactOptimum) {
  // Constructed case: min x + y with a x + b y >= 1 and b x + a y >= 1, a = 1e20, b = 1e-20:
  // both rows hold at x = y = 1/(a + b), objective 2/(a + b) (any other vertex costs about 1e20).
  Rational a = n("1e20"), b = n("1e-20");
  auto m = ModelBuilder("badly-scaled")
               .column("x", 1).column("y", 1)
               .row("first", {{"x", a}, {"y", b}}, Rational(1), {})
               .row("second", {{"x", b}, {"y", a}}, Rational(1), {})
               .build();
  expect_solved(m, Outcome::optimal, 2 / (a + b));
}

TEST(HardNumerics, FreeVariablesWithHugeRanges) {
  // Constructed case: x free, y <= 1e300, x + y >= -1e300, z free with z >= x; min x + 0 z is
  // x = -1e300 - y at y = 1e300: -2e300.  Dropping the bound on y makes it unbounded.
  auto bounded = ModelBuilder("huge-ranges")
                     .column("x", 1, Side{}, Side{})
                     .column("y", 0, Side{}, n("1e300"))
                     .column("z", 0, Side{}, Side{})
                     .row("floor", {{"x", 1}, {"y", 1}}, -n("1e300"), {})
                     .row("z_above_x", {{"z", 1}, {"x", -1}}, Rational(0), {})
                     .build();
  expect_solved(bounded, Outcome::optimal, -2 * n("1e300"));
  auto unbounded = ModelBuilder("huge-ranges-open")
                       .column("x", 1, Side{}, Side{})
                       .column("y", 0, Side{}, Side{})
                       .row("floor", {{"x", 1}, {"y", 1}}, -n("1e300"), {})
                       .build();
  expect_solved(unbounded, Outcome::unbounded);
}

TEST(HardNumerics, BealeCyclingExample) {
  // Beale (1955), "Cycling in the dual simplex algorithm", the classic cycling example as usually
  // restated (from memory): min -3/4 x4 + 20 x5 - 1/2 x6 + 6 x7, optimum -5/4 at x4 = x6 = 1.
  auto m = ModelBuilder("beale-1955")
               .column("x4", n("-3/4")).column("x5", 20).column("x6", n("-1/2")).column("x7", 6)
               .row("r1", {{"x4", n("1/4")}, {"x5", -8}, {"x6", -1}, {"x7", 9}}, {}, Rational(0))
               .row("r2", {{"x4", n("1/2")}, {"x5", -12}, {"x6", n("-1/2")}, {"x7", 3}}, {}, Rational(0))
               .row("r3", {{"x6", 1}}, {}, Rational(1))
               .build();
  expect_solved(m, Outcome::optimal, n("-5/4"));
}

TEST(HardNumerics, KuhnCyclingExample) {
  // Kuhn's cycling example (from memory): min -2 x1 - 3 x2 + x3 + 12 x4 with
  // -2x1 - 9x2 + x3 + 9x4 <= 0, x1/3 + x2 - x3/3 - 2x4 <= 0, 2x1 + 3x2 - x3 - 12x4 <= 2.
  // The third row bounds the objective below by -2, reached at x1 = x3 = 2.
  auto m = ModelBuilder("kuhn")
               .column("x1", -2).column("x2", -3).column("x3", 1).column("x4", 12)
               .row("r1", {{"x1", -2}, {"x2", -9}, {"x3", 1}, {"x4", 9}}, {}, Rational(0))
               .row("r2", {{"x1", n("1/3")}, {"x2", 1}, {"x3", n("-1/3")}, {"x4", -2}}, {}, Rational(0))
               .row("r3", {{"x1", 2}, {"x2", 3}, {"x3", -1}, {"x4", -12}}, {}, Rational(2))
               .build();
  expect_solved(m, Outcome::optimal, Rational(-2));
}

TEST(HardNumerics, FiftyRowsThroughOneVertex) {
  // Constructed case: i x + y <= i for i = 1..50 all hold with equality at (1, 0), the optimum of
  // max 2x + y (value 2): a vertex degenerate fifty times over.
  ModelBuilder builder("degenerate-fifty");
  builder.maximise().column("x", 2).column("y", 1);
  for (int i = 1; i <= 50; ++i)
    builder.row("through_" + std::to_string(i), {{"x", i}, {"y", 1}}, {}, Rational(i));
  expect_solved(builder.build(), Outcome::optimal, Rational(2));
}

}  // namespace
}  // namespace plumb::exact
