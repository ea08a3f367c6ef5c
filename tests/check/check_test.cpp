// The checker against certificates written by hand for small models whose answers are known.
#include "check/mutations.hpp"
#include "plumb/certificate/certificate.hpp"
#include "plumb/check/check.hpp"
#include "plumb/model/model.hpp"

#include <gtest/gtest.h>

namespace {

using plumb::certificate::Certificate;
using plumb::certificate::parse_certificate;
using plumb::check::verify;
using plumb::model::ModelBuilder;
using plumb::numeric::Rational;
using plumb::testing::expect_rejected;
using plumb::testing::expect_valid;
using plumb::testing::Mutation;

Rational q(long p, long d = 1) { return Rational(p, d); }

// Chvatal, Linear Programming (1983), chapter 2, first example: maximise 5x1 + 4x2 + 3x3 subject to
// three <= rows and x >= 0; optimum 13 at x = (2, 0, 1) with textbook duals (1, 0, 1).
plumb::model::Model chvatal() {
  return ModelBuilder("chvatal-2.1")
      .maximise()
      .column("x1", 5)
      .column("x2", 4)
      .column("x3", 3)
      .row("c1", {{"x1", 2}, {"x2", 3}, {"x3", 1}}, {}, q(5))
      .row("c2", {{"x1", 4}, {"x2", 1}, {"x3", 2}}, {}, q(11))
      .row("c3", {{"x1", 3}, {"x2", 4}, {"x3", 2}}, {}, q(8))
      .build();
}

// In plumb's minimisation form (c' = -c) a <= row's multiplier is negative: the textbook's (1, 0, 1)
// becomes (-1, 0, -1).  Written by hand.
const char* chvatal_optimal = R"({
  "plumb_certificate": 1,
  "model": {"file": "chvatal-2.1", "sha256": "", "rows": 3, "columns": 3, "objective_constant": "0"},
  "status": "optimal",
  "objective": "13",
  "x": {"x1": "2", "x3": "1"},
  "y": {"c1": "-1", "c3": "-1"}
})";

Certificate read(const char* text) { return parse_certificate(text, "hand-written.json"); }

TEST(CheckOptimal, ChvatalTextbookExample) {
  auto m = chvatal();
  Certificate c = read(chvatal_optimal);
  auto verdict = verify(m, c);
  ASSERT_TRUE(verdict.valid) << verdict.failure;
  EXPECT_EQ(verdict.proven,
            "optimal: objective 13 is attained by x and no feasible point is better (the dual bound equals it)");
}

TEST(CheckOptimal, ChvatalMutationsAreRejected) {
  auto m = chvatal();
  Certificate c = read(chvatal_optimal);
  auto shifted = c;
  shifted.x[0].second = q(21, 10);  // row c1: 2*2.1 + 1 = 5.2 > 5
  expect_rejected(m, {"x1 shifted", shifted,
                      "x is not feasible: row c1: a.x = 26/5 (5.2) is above its upper side 5 by 1/5 (0.2)"});
  auto flipped = c;
  flipped.y[0].second = 1;  // c1 has no lower side for a positive multiplier to press on
  expect_rejected(m, {"y_c1 flipped", flipped,
                      "row c1: multiplier y = 1 is positive, which needs a finite lower side, and there is none"});
  auto objective = c;
  objective.objective = 14;
  expect_rejected(m, {"objective changed", objective,
                      "objective: the certificate states 14, but the objective at x is 13"});
  // Without y_c1, d = c' - A^T y = (-2, 0, -1): x1 would profit from growing without limit.
  auto dropped = plumb::testing::drop_multiplier(c, "c1");
  dropped.expected = "column x1: reduced cost d = c' - A^T y = -2 is negative, which needs a finite upper bound";
  expect_rejected(m, dropped);
  auto renamed = c;
  renamed.x[0].first = "x9";
  expect_rejected(m, {"x1 renamed", renamed, "x names column x9, which the model does not have"});
  auto renamed_row = c;
  renamed_row.y[1].first = "c4";
  expect_rejected(m, {"c3 renamed", renamed_row, "y names row c4, which the model does not have"});
  // x = 0 is feasible but costs 0 while the dual bound is 13: weak duality leaves a gap.
  auto origin = c;
  origin.x.clear();
  origin.objective = 0;
  expect_rejected(m, {"x at the origin", origin,
                      "x is not proven optimal: the dual bound 13 differs from the objective at x, 0, by 13"});
  for (const Mutation& mutation : plumb::testing::provable_mutations(m, c)) expect_rejected(m, mutation);
}

TEST(CheckOptimal, ChvatalPointIsFeasible) {
  auto m = chvatal();
  Certificate c = read(chvatal_optimal);
  c.status = plumb::certificate::Status::feasible;
  c.objective.reset();
  c.y.clear();
  auto verdict = verify(m, c);
  ASSERT_TRUE(verdict.valid) << verdict.failure;
  EXPECT_EQ(verdict.proven, "feasible: x meets every row and bound, with objective 13");
}

// Invented for this test: minimise x + 2y + 5 with x free, 0 <= y <= 10, an equation x + y = 4 and a
// ranged row 1 <= x - y <= 2.  By hand: x = 4 - y, so 1 <= 4 - 2y <= 2 gives 1 <= y <= 3/2; the
// objective 9 + y is least at y = 1, x = 3, value 10.  Duals from d = c' - A^T y = 0 on both
// columns (x free, y strictly inside its bounds): y_e + y_g = 1, y_e - y_g = 2.
plumb::model::Model ranged_free() {
  return ModelBuilder("ranged-free")
      .minimise()
      .objective_constant(5)
      .column("x", 1, std::nullopt, std::nullopt)
      .column("y", 2, q(0), q(10))
      .row("e1", {{"x", 1}, {"y", 1}}, q(4), q(4))
      .row("g1", {{"x", 1}, {"y", -1}}, q(1), q(2))
      .build();
}

const char* ranged_free_optimal = R"({
  "plumb_certificate": 1,
  "model": {"file": "ranged-free", "sha256": "", "rows": 2, "columns": 2, "objective_constant": "5"},
  "status": "optimal",
  "objective": "10",
  "x": {"x": "3", "y": "1"},
  "y": {"e1": "3/2", "g1": "-1/2"},
  "basis": {"note": "ignored by the checker"}
})";

TEST(CheckOptimal, RangedRowFreeColumnAndConstant) {
  auto m = ranged_free();
  Certificate c = read(ranged_free_optimal);
  expect_valid(m, c);
  // Signs on the two-sided rows are free, but flipping g1's multiplier upsets the free column.
  auto flipped = c;
  flipped.y[1].second = q(1, 2);
  expect_rejected(m, {"y_g1 flipped", flipped,
                      "column x: reduced cost d = c' - A^T y = -1 is negative, which needs a finite upper bound"});
  auto pushed = c;
  pushed.x[1].second = q(1, 2);  // the equation e1 is the first row to notice: x + y = 7/2
  expect_rejected(m, {"y lowered", pushed, "x is not feasible: row e1: a.x = 7/2 (3.5) is below its lower side 4 by 1/2 (0.5)"});
  for (const Mutation& mutation : plumb::testing::provable_mutations(m, c)) expect_rejected(m, mutation);
}

TEST(CheckOptimal, ObjectiveConstantFromTheCertificateOrTheModel) {
  auto m = ranged_free();
  Certificate c = read(ranged_free_optimal);
  c.model.objective_constant.reset();  // absent: the model's constant 5 is used
  expect_valid(m, c);
  c.model.objective_constant = 0;  // as if read with the objective RHS left out
  c.objective = 5;
  auto verdict = verify(m, c);
  ASSERT_TRUE(verdict.valid) << verdict.failure;
  EXPECT_NE(verdict.proven.find("(the dual bound equals it; the objective includes the certificate's constant 0, the model as read has 5)"), std::string::npos);
  c.objective = 10;
  expect_rejected(m, {"constant mismatch", c, "objective: the certificate states 10, but the objective at x is 5"});
}

// Invented: 1 <= a + b <= 3 and a - b >= 6 with a free and b >= 0.  Adding (-1) x the first upper
// side and (+1) x the second: -(a + b) + (a - b) = -2b >= 6 - 3 = 3, impossible for b >= 0
// (Farkas' lemma, bounded-variable form: see docs/certificates.md).
plumb::model::Model infeasible_pair() {
  return ModelBuilder("infeasible-pair")
      .column("a", 1, std::nullopt, std::nullopt)
      .column("b", 1, q(0), q(4))
      .row("r1", {{"a", 1}, {"b", 1}}, q(1), q(3))
      .row("r2", {{"a", 1}, {"b", -1}}, q(6), std::nullopt)
      .build();
}

const char* infeasible_pair_farkas = R"({
  "plumb_certificate": 1,
  "model": {"file": "infeasible-pair", "sha256": "", "rows": 2, "columns": 2},
  "status": "infeasible",
  "y": {"r1": "-1", "r2": "1"}
})";

TEST(CheckInfeasible, FarkasMultipliers) {
  auto m = infeasible_pair();
  Certificate c = read(infeasible_pair_farkas);
  auto verdict = verify(m, c);
  ASSERT_TRUE(verdict.valid) << verdict.failure;
  EXPECT_EQ(verdict.proven, "infeasible: no x meets every row and bound (Farkas: the rows weighted by y force "
                            "y.Ax >= 3, while the bounds keep y.Ax <= 0)");
  auto flipped = c;
  flipped.y[1].second = -1;
  expect_rejected(m, {"y_r2 flipped", flipped,
                      "row r2: Farkas multiplier y = -1 is negative, which needs a finite upper side"});
  auto dropped = plumb::testing::drop_multiplier(c, "r1");  // A^T y = (1, -1): a is free above
  dropped.expected = "column a: (A^T y) = 1 is positive, which needs a finite upper bound, and there is none";
  expect_rejected(m, dropped);
  // Weakened: b's lower bound pushed to -2 makes 2b reachable up to 4 > 3; the same y proves nothing.
  auto loose = infeasible_pair();
  loose.columns[1].lower = q(-2);
  expect_rejected(loose, {"weaker model", c,
                          "no contradiction: the rows weighted by y force y.Ax >= 3, but the bounds let y.Ax reach 4"});
  for (const Mutation& mutation : plumb::testing::provable_mutations(m, c)) expect_rejected(m, mutation);
}

// The same proof on single sides and bounds, worked by hand: -(a + b) >= -3 (r1's upper side),
// a - b >= 6 (r2's lower side) and 2 x (b >= 0) add up to 0 >= 3.
const char* infeasible_pair_explicit = R"({
  "plumb_certificate": 1,
  "model": {"file": "infeasible-pair", "sha256": "", "rows": 2, "columns": 2},
  "status": "infeasible",
  "farkas": [
    {"kind": "row", "name": "r1", "side": "upper", "multiplier": "1"},
    {"kind": "row", "name": "r2", "side": "lower", "multiplier": "1"},
    {"kind": "column", "name": "b", "side": "lower", "multiplier": "2"}
  ]
})";

TEST(CheckInfeasible, ExplicitFarkasOnSidesAndBounds) {
  using plumb::certificate::EntryKind;
  using plumb::certificate::Limit;
  auto m = infeasible_pair();
  Certificate c = read(infeasible_pair_explicit);
  auto verdict = verify(m, c);
  ASSERT_TRUE(verdict.valid) << verdict.failure;
  EXPECT_EQ(
      verdict.proven,
      "infeasible: no x meets every row and bound (Farkas: 3 weighted sides and bounds add up to 0 >= 3)");
  auto negative = c;
  negative.farkas[1].multiplier = -1;
  expect_rejected(m, {"a negative multiplier", negative, "multipliers must be at least 0"});
  auto dropped = c;
  dropped.farkas.pop_back();
  expect_rejected(m, {"b's bound dropped", dropped, "column b keeps the coefficient -2"});
  auto infinite = c;
  infinite.farkas.push_back({{EntryKind::column, "a", Limit::upper}, q(0)});
  expect_rejected(m,
                  {"a's missing upper bound", infinite, "is infinite, so a multiplier on it proves nothing"});
  auto unknown = c;
  unknown.farkas[0].entry.name = "r9";
  expect_rejected(m, {"an unknown row", unknown, "farkas names row r9, which the model does not have"});
  auto twice = c;
  twice.farkas.push_back(twice.farkas[0]);
  expect_rejected(m, {"an entry twice", twice, "lists the upper limit of r1 twice"});
  auto as_column = c;
  as_column.farkas[2].entry.kind = EntryKind::row;  // no row is called b
  expect_rejected(m, {"a bound named as a row", as_column, "farkas names row b"});
  // Weakened: b >= -2 turns the limits' sum into -3 + 6 - 4 = -1: the same terms prove nothing.
  auto loose = infeasible_pair();
  loose.columns[1].lower = q(-2);
  expect_rejected(loose, {"weaker model", c, "no contradiction: the weighted entries sum to 0 >= -1"});
}

// A crossed row and a crossed column: each is its own proof, lower minus upper > 0.
TEST(CheckInfeasible, CrossedLimitsProveThemselves) {
  auto m = ModelBuilder("crossed").column("x", 1, q(3), q(1)).row("r", {{"x", 1}}, q(5), q(2)).build();
  for (auto kind : {plumb::certificate::EntryKind::row, plumb::certificate::EntryKind::column}) {
    Certificate c;
    c.model = plumb::certificate::identify(m);
    c.status = plumb::certificate::Status::infeasible;
    std::string name = kind == plumb::certificate::EntryKind::row ? "r" : "x";
    c.farkas = {{{kind, name, plumb::certificate::Limit::lower}, q(1)},
                {{kind, name, plumb::certificate::Limit::upper}, q(1)}};
    auto verdict = verify(m, c);
    EXPECT_TRUE(verdict.valid) << verdict.failure;
    c.farkas[1].multiplier = q(2);
    expect_rejected(m, {"unequal weights", c, "keeps the coefficient -1"});
  }
}

// Invented: a delivery of at least 10 t from two suppliers that can send at most 4 t and 3 t.
// x + y >= 10, x <= 4 and y <= 3 cannot all hold (1 x the row, 1 x each cap: 0 >= 10 - 4 - 3 = 3);
// drop any one and the rest can.  The caps share the group "supply"; x, y >= 0 are hard.
plumb::model::Model short_delivery() {
  auto m = ModelBuilder("short-delivery")
               .column("x", 0, q(0), q(4))
               .column("y", 0, q(0), q(3))
               .row("total", {{"x", 1}, {"y", 1}}, q(10), std::nullopt)
               .build();
  for (auto& column : m.columns) {
    column.label.hard = true;
    column.upper_label.hard = false;
    column.upper_label.group = "supply";
  }
  return m;
}

const char* short_delivery_subsystem = R"({
  "plumb_certificate": 1,
  "model": {"file": "short-delivery", "sha256": "", "rows": 1, "columns": 2},
  "status": "infeasible_subsystem",
  "farkas": [
    {"kind": "row", "name": "total", "side": "lower", "multiplier": "1"},
    {"kind": "column", "name": "x", "side": "upper", "multiplier": "1"},
    {"kind": "column", "name": "y", "side": "upper", "multiplier": "1"}],
  "members": [
    {"kind": "row", "name": "total", "side": "lower"},
    {"kind": "column", "name": "x", "side": "upper"},
    {"kind": "column", "name": "y", "side": "upper"}],
  "hard": [
    {"kind": "column", "name": "x", "side": "lower"},
    {"kind": "column", "name": "y", "side": "lower"}],
  "witnesses": [
    {"drop": [0], "x": {}},
    {"drop": [1], "x": {"x": "7", "y": "3"}},
    {"drop": [2], "x": {"x": "4", "y": "6"}}]
})";

TEST(CheckSubsystem, IrreducibleSubsystemWithWitnesses) {
  auto m = short_delivery();
  Certificate c = read(short_delivery_subsystem);
  auto verdict = verify(m, c);
  ASSERT_TRUE(verdict.valid) << verdict.failure;
  EXPECT_EQ(verdict.proven,
            "infeasible subsystem: 3 members and 2 hard entries admit no x, and dropping any one member (or "
            "group) leaves them satisfiable (Farkas: they add up to 0 >= 3)");
  auto removed = c;  // the member x <= 4 left out: the proof now leans on an entry outside the subsystem
  removed.members.erase(removed.members.begin() + 1);
  expect_rejected(m, {"a member removed", removed, "neither a member nor a hard entry of the subsystem"});
  auto broken = c;
  broken.witnesses[0].x = {{"x", q(5)}};
  expect_rejected(m, {"a witness above x's cap", broken, "witness 0 breaks the upper bound of column x"});
  auto changed = c;
  changed.farkas[0].multiplier = q(2);
  expect_rejected(m, {"a multiplier changed", changed, "column x keeps the coefficient 1"});
  auto hard_member = c;
  hard_member.members.push_back(hard_member.hard.back());
  hard_member.hard.pop_back();
  expect_rejected(m, {"a hard entry as a member", hard_member, "is hard by its label"});
  auto two = c;
  two.witnesses = {two.witnesses[1], {{0, 2}, {{"x", q(4)}, {"y", q(6)}}}};
  expect_rejected(m, {"a drop set of two outside one group", two, "do not share one group"});
  auto unwitnessed = c;
  unwitnessed.witnesses.pop_back();
  expect_rejected(m, {"a member without a witness", unwitnessed, "has no witness"});
  auto twice = c;
  twice.witnesses[1].drop = {0};
  expect_rejected(m, {"a member dropped twice", twice, "which witness 0 drops already"});
  auto repeated = c;
  repeated.hard.push_back(repeated.members[0]);
  expect_rejected(m, {"an entry both member and hard", repeated, "is listed twice in the subsystem"});
  auto infinite = c;
  infinite.hard.push_back({plumb::certificate::EntryKind::row, "total", plumb::certificate::Limit::upper});
  expect_rejected(m, {"an infinite side", infinite, "it constrains nothing"});
}

TEST(CheckSubsystem, GroupDropsTheWholeGroup) {
  auto m = short_delivery();
  Certificate c = read(short_delivery_subsystem);
  c.witnesses = {c.witnesses[0], {{1, 2}, {{"x", q(10)}}}};
  auto verdict = verify(m, c);
  EXPECT_TRUE(verdict.valid) << verdict.failure;
  m.columns[1].upper_label.group = "other supply";
  expect_rejected(m, {"members of two groups", c, "do not share one group"});
}

TEST(CheckSubsystem, HardEntriesAloneConflict) {
  auto m = short_delivery();
  for (auto& column : m.columns) column.upper_label.hard = true;
  m.rows[0].label.hard = true;
  Certificate c = read(short_delivery_subsystem);
  c.hard.insert(c.hard.end(), c.members.begin(), c.members.end());
  c.members.clear();
  c.witnesses.clear();
  auto verdict = verify(m, c);
  ASSERT_TRUE(verdict.valid) << verdict.failure;
  EXPECT_NE(verdict.proven.find("the hard entries alone conflict: 5 of them admit no x"), std::string::npos);
}

// Invented: maximise 2u + v + 10 with u - v <= 1, v >= 2, u, v >= 0.  From x = (0, 2), moving along
// r = (1, 1) keeps u - v fixed, raises v, and raises the objective by 3 per step, without end.
plumb::model::Model unbounded_pair() {
  return ModelBuilder("unbounded-pair")
      .maximise()
      .objective_constant(10)
      .column("u", 2)
      .column("v", 1)
      .row("s1", {{"u", 1}, {"v", -1}}, std::nullopt, q(1))
      .row("s2", {{"v", 1}}, q(2), std::nullopt)
      .build();
}

const char* unbounded_pair_ray = R"({
  "plumb_certificate": 1,
  "model": {"file": "unbounded-pair", "sha256": "", "rows": 2, "columns": 2, "objective_constant": "10"},
  "status": "unbounded",
  "x": {"v": "2"},
  "ray": {"u": "1", "v": "1"}
})";

TEST(CheckUnbounded, RayFromAFeasiblePoint) {
  auto m = unbounded_pair();
  Certificate c = read(unbounded_pair_ray);
  auto verdict = verify(m, c);
  ASSERT_TRUE(verdict.valid) << verdict.failure;
  EXPECT_NE(verdict.proven.find("improves by 3 per unit of t"), std::string::npos) << verdict.proven;
  auto reversed = c;
  for (auto& entry : reversed.ray) entry.second = -entry.second;
  expect_rejected(m, {"ray reversed", reversed,
                      "ray: column u: r = -1 is negative, but the lower bound 0 is finite, so the ray leaves the model"});
  auto sideways = c;
  sideways.ray = {{"u", 1}};
  expect_rejected(m, {"ray along u only", sideways, "ray: row s1: (A r) = 1 is positive, but the upper side 1 is finite"});
  auto flat = c;
  flat.ray.clear();
  expect_rejected(m, {"no ray", flat, "ray: the objective does not improve along the ray: c.r = 0, and maximising needs it positive"});
  auto infeasible_start = c;
  infeasible_start.x = {{"v", 1}};
  expect_rejected(m, {"x below s2", infeasible_start, "x is not feasible: row s2: a.x = 1 is below its lower side 2 by 1"});
  for (const Mutation& mutation : plumb::testing::provable_mutations(m, c)) expect_rejected(m, mutation);
}

TEST(CheckFeasible, PointOnARangedRowWithAFreeColumn) {
  auto m = ranged_free();
  Certificate c = read(R"({"plumb_certificate": 1, "status": "feasible",
    "model": {"file": "ranged-free", "sha256": "", "rows": 2, "columns": 2},
    "x": {"x": "13/4", "y": "3/4"}})");  // x - y = 5/2: above g1's upper side 2
  expect_rejected(m, {"feasible claim", c, "x is not feasible: row g1: a.x = 5/2 (2.5) is above its upper side 2 by 1/2 (0.5)"});
  c.x = {{"x", q(11, 4)}, {"y", q(5, 4)}};  // x + y = 4, x - y = 3/2
  expect_valid(m, c);
  auto below = c;
  below.x = {{"x", -1}, {"y", 5}};  // x + y = 4 but x - y = -6
  expect_rejected(m, {"x - y too low", below, "row g1: a.x = -6 is below its lower side 1 by 7"});
}

TEST(CheckIdentity, CertificateForAnotherModel) {
  auto m = chvatal();
  m.source.path = "chvatal.mps";
  m.source.sha256 = std::string(64, 'a');
  Certificate c = read(chvatal_optimal);
  c.model.sha256 = std::string(64, 'b');
  auto verdict = verify(m, c);
  EXPECT_FALSE(verdict.valid);
  EXPECT_EQ(verdict.failure, "model: the certificate is for another model: it names sha256 " + std::string(64, 'b') +
                                 ", while chvatal.mps has sha256 " + std::string(64, 'a'));
  c.model.sha256 = m.source.sha256;
  expect_valid(m, c);
  c.model.columns = 4;
  expect_rejected(m, {"column count", c, "the certificate describes 3 rows and 4 columns, the model has 3 rows and 3 columns"});
}

TEST(CheckNames, RepeatedAndSpacedNames) {
  auto m = ModelBuilder("spaces")
               .column("MY COL", 1, q(0), q(1))
               .row("ROW 1", {{"MY COL", 1}}, q(1), std::nullopt)
               .build();
  Certificate c = read(R"({"plumb_certificate": 1, "status": "feasible",
    "model": {"file": "spaces", "sha256": "", "rows": 1, "columns": 1}, "x": {"MY COL": "1"}})");
  expect_valid(m, c);
  c.x.push_back({"MY COL", 1});
  expect_rejected(m, {"repeated", c, "x lists column \"MY COL\" twice"});
  c.x = {{"MY COL", q(1, 2)}};
  expect_rejected(m, {"short", c, "row \"ROW 1\": a.x = 1/2 (0.5) is below its lower side 1 by 1/2 (0.5)"});
}

}  // namespace

namespace {

TEST(CheckWording, FailuresQuoteTheOwnersStatement) {
  auto m = chvatal();
  m.rows[0].label.statement = "machine hours stay within the 5 available";
  Certificate c = read(chvatal_optimal);
  c.x[0].second = 3;
  expect_rejected(m, {"over the hours", c,
                      "row c1 (\"machine hours stay within the 5 available\"): a.x = 7 is above its upper side 5 by 2"});
}

TEST(CheckWording, ValidCertificateOfAnotherStatusSaysWhatItProves) {
  // Asked about optimality, handed a proof of infeasibility: the verdict leads with what is proven.
  auto verdict = verify(infeasible_pair(), read(infeasible_pair_farkas));
  ASSERT_TRUE(verdict.valid);
  EXPECT_EQ(verdict.proven.rfind("infeasible: ", 0), 0u) << verdict.proven;
}

}  // namespace
