// Ways out of an infeasible model: the least change of one requirement alone and the least total
// change, each asserted exactly against values worked by hand, and each answer's certificate
// accepted by the checker on its changed model.
#include "plumb/explain/ways_out.hpp"
#include "plumb/exact/solve.hpp"
#include "plumb/model/read.hpp"

#include <gtest/gtest.h>

namespace plumb::explain {
namespace {

using certificate::Limit;
using model::ModelBuilder;
using numeric::Rational;

Rational q(long p, long d = 1) { return Rational(p, d); }

const SingleChange& change_of(const WaysOut& ways, const std::string& name) {
  for (const SingleChange& c : ways.single)
    if (c.member.entry.name == name) return c;
  throw std::runtime_error("no way out for " + name);
}

// The corpus's tight blend (invented data).  Worked by hand from its header: ethanol is 10 % of the
// batch B, butane 0 (it is the worst for vapour pressure), naphtha the rest; the cap 52 butane +
// 11.5 naphtha + 3.2 reformate + 4.6 alkylate + 18 ethanol <= 78000 then needs
//   batch alone:     1.8 B + 16000 + 13800 + 11.5 (0.9 B - 8000) <= 78000, B <= 140200/12.15
//   reformate alone: 125100 - 8.3 R <= 78000, R >= 47100/8.3
//   alkylate alone:  104300 - 6.9 A <= 78000, A >= 26300/6.9
TEST(WaysOut, TightBlendEachAloneAndTheLeastTotal) {
  model::Model m = model::read_model(std::string(PLUMB_CORPUS_DIR) + "/summer-blend-tight.plumb");
  Explanation e = explain(m);
  ASSERT_EQ(e.outcome, Outcome::infeasible_subsystem);
  WaysOut ways = find_ways_out(m, e, nullptr, 20);
  ASSERT_EQ(ways.single.size(), 3u);
  EXPECT_EQ(ways.not_tried, 0u);
  const SingleChange& batch = change_of(ways, "batch");
  ASSERT_EQ(batch.result, SingleChange::Result::moves);
  EXPECT_EQ(batch.to, q(2804000, 243));  // 140200 / 12.15
  EXPECT_EQ(batch.by, q(112000, 243));
  const SingleChange& reformate = change_of(ways, "reformate");
  ASSERT_EQ(reformate.result, SingleChange::Result::moves);
  EXPECT_EQ(reformate.to, q(471000, 83));  // 47100 / 8.3
  const SingleChange& alkylate = change_of(ways, "alkylate");
  ASSERT_EQ(alkylate.result, SingleChange::Result::moves);
  EXPECT_EQ(alkylate.to, q(263000, 69));  // 26300 / 6.9
  for (const SingleChange& c : ways.single) {
    EXPECT_TRUE(c.verdict.valid) << c.member.entry.name << ": " << c.verdict.failure;
    EXPECT_TRUE(c.proof.model.sha256.empty());  // a changed model never passes for the file
  }
  // Per unit, the batch is the cheapest to move: 460.9 bbl against 674.7 and 811.6.
  ASSERT_EQ(ways.least.result, LeastTotalChange::Result::found);
  EXPECT_TRUE(ways.least.verdict.valid) << ways.least.verdict.failure;
  EXPECT_EQ(ways.least.total, q(112000, 243));
  ASSERT_EQ(ways.least.moves.size(), 1u);
  EXPECT_EQ(ways.least.moves[0].member.entry.name, "batch");
  EXPECT_EQ(ways.least.moves[0].to, q(2804000, 243));
}

// Each way out checked outside ways_out.cpp: the demo with the member moved to the reported value is
// feasible, and with it stopped a millionth short of that value it is still infeasible (each an
// exact certified solve of the edited model).
TEST(WaysOut, TightBlendValuesAreExactlyTheBoundary) {
  model::Model m = model::read_model(std::string(PLUMB_CORPUS_DIR) + "/summer-blend-tight.plumb");
  WaysOut ways = find_ways_out(m, explain(m), nullptr, 20);
  for (const SingleChange& c : ways.single) {
    ASSERT_EQ(c.result, SingleChange::Result::moves) << c.member.entry.name;
    bool lower = c.member.entry.limit == Limit::lower;
    auto solved_at = [&](const Rational& value) {
      model::Model edited = m;
      if (c.member.entry.kind == certificate::EntryKind::row)
        (lower ? edited.rows[c.member.index].lower : edited.rows[c.member.index].upper) = value;
      else
        (lower ? edited.columns[c.member.index].lower : edited.columns[c.member.index].upper) = value;
      return exact::certified_solve(edited).solution.outcome;
    };
    Rational short_of = lower ? Rational(c.to + q(1, 1000000)) : Rational(c.to - q(1, 1000000));
    EXPECT_EQ(solved_at(c.to), exact::Outcome::optimal) << c.member.entry.name;
    EXPECT_EQ(solved_at(short_of), exact::Outcome::infeasible) << c.member.entry.name;
  }
}

// A weight of 10 per barrel on the batch (its label) makes moving it dearer than the reformate
// nomination: per unit of the conflict's 112000 (whole-number weights 243, 166 and 138 in the
// derivation) the batch costs 10/243, the reformate 1/166, the alkylate 1/138; so the reformate
// alone moves, by 112000/166 = 56000/83 bbl.
TEST(WaysOut, LabelWeightsSteerTheLeastTotalChange) {
  model::Model m = model::read_model(std::string(PLUMB_CORPUS_DIR) + "/summer-blend-tight.plumb");
  m.rows[*m.find_row("batch")].label.weight = Rational(10);
  LeastTotalChange least = least_total_change(m);
  ASSERT_EQ(least.result, LeastTotalChange::Result::found);
  EXPECT_TRUE(least.weighted);
  EXPECT_TRUE(least.verdict.valid) << least.verdict.failure;
  ASSERT_EQ(least.moves.size(), 1u);
  EXPECT_EQ(least.moves[0].member.entry.name, "reformate");
  EXPECT_EQ(least.moves[0].by, q(56000, 83));
  EXPECT_EQ(least.total, q(56000, 83));
}

// Invented: two deliveries of at least 5 t each through one gate of at most 8 t, and a second,
// separate conflict y >= 3 against y <= 1.
model::Model two_conflicts() {
  return ModelBuilder("two-conflicts")
      .column("a", 0)
      .column("b", 0)
      .column("y", 0, q(0), q(1))
      .row("first", {{"a", 1}}, q(5), std::nullopt)
      .row("second", {{"b", 1}}, q(5), std::nullopt)
      .row("gate", {{"a", 1}, {"b", 1}}, std::nullopt, q(8))
      .row("y_floor", {{"y", 1}}, q(3), std::nullopt)
      .build();
}

// Moving the gate alone cannot fix the second conflict.
TEST(WaysOut, OneChangeAloneIsNotEnoughWhenAnotherConflictRemains) {
  model::Model m = two_conflicts();
  Member gate;
  gate.entry = {certificate::EntryKind::row, "gate", Limit::upper};
  gate.index = 2;
  gate.value = 8;
  auto changes = single_changes(m, {gate});
  ASSERT_EQ(changes.size(), 1u);
  EXPECT_EQ(changes[0].result, SingleChange::Result::not_enough);
  EXPECT_TRUE(changes[0].verdict.valid) << changes[0].verdict.failure;
  // Both conflicts together: the gate up by 2 and the floor down by 2 (or y's cap up by 2), 4 in all.
  LeastTotalChange least = least_total_change(m);
  ASSERT_EQ(least.result, LeastTotalChange::Result::found);
  EXPECT_EQ(least.total, 4);
  EXPECT_TRUE(least.verdict.valid) << least.verdict.failure;
}

// The parametric argument, on its own: each way out's certificate is an optimality proof of
// "best g(x) over the rest of the model" whose dual bound equals the reported value t.  Weak
// duality then gives g(x) <= t (>= t for an upper side) for every x meeting the rest, so the member
// at any value past t, with those multipliers, is a Farkas proof of infeasibility; and x* meets
// the member at t.  Checked here: the certificate is valid on the changed model, it is an optimum,
// and its objective is t.
TEST(WaysOut, EachValueIsTheProvenOptimumOfTheRest) {
  model::Model m = model::read_model(std::string(PLUMB_CORPUS_DIR) + "/summer-blend-tight.plumb");
  WaysOut ways = find_ways_out(m, explain(m), nullptr, 20);
  for (const SingleChange& c : ways.single) {
    ASSERT_EQ(c.result, SingleChange::Result::moves);
    EXPECT_EQ(c.proof.status, certificate::Status::optimal);
    ASSERT_TRUE(c.proof.objective.has_value());
    EXPECT_EQ(*c.proof.objective, c.to) << c.member.entry.name;
    EXPECT_TRUE(c.verdict.valid) << c.verdict.failure;
  }
}

// The two-conflict model's elastic LP written out by hand (every soft side and bound with its own
// elastic s >= 0 costing 1; no entry is hard): its exact optimum is the least total change.
TEST(WaysOut, LeastTotalChangeIsTheHandWrittenElasticOptimum) {
  model::Model m = two_conflicts();
  auto elastic = ModelBuilder("two-conflicts, elastic, by hand")
                     .column("a", 0, std::nullopt)
                     .column("b", 0, std::nullopt)
                     .column("y", 0, std::nullopt)
                     .column("s_first", 1)
                     .column("s_second", 1)
                     .column("s_gate", 1)
                     .column("s_y_floor", 1)
                     .column("s_a_lower", 1)
                     .column("s_b_lower", 1)
                     .column("s_y_lower", 1)
                     .column("s_y_upper", 1)
                     .row("first", {{"a", 1}, {"s_first", 1}}, q(5), std::nullopt)
                     .row("second", {{"b", 1}, {"s_second", 1}}, q(5), std::nullopt)
                     .row("gate", {{"a", 1}, {"b", 1}, {"s_gate", -1}}, std::nullopt, q(8))
                     .row("y_floor", {{"y", 1}, {"s_y_floor", 1}}, q(3), std::nullopt)
                     .row("a_lower", {{"a", 1}, {"s_a_lower", 1}}, q(0), std::nullopt)
                     .row("b_lower", {{"b", 1}, {"s_b_lower", 1}}, q(0), std::nullopt)
                     .row("y_lower", {{"y", 1}, {"s_y_lower", 1}}, q(0), std::nullopt)
                     .row("y_upper", {{"y", 1}, {"s_y_upper", -1}}, std::nullopt, q(1))
                     .build();
  exact::CertifiedSolution by_hand = exact::certified_solve(elastic);
  ASSERT_EQ(by_hand.solution.outcome, exact::Outcome::optimal);
  LeastTotalChange least = least_total_change(m);
  ASSERT_EQ(least.result, LeastTotalChange::Result::found);
  EXPECT_EQ(least.total, by_hand.solution.objective);
  EXPECT_EQ(least.total, 4);
}

TEST(WaysOut, HardEntriesAloneConflictingLeaveNoLeastChange) {
  auto m = ModelBuilder("hard-conflict")
               .column("x", 0, q(0), q(1))
               .row("floor", {{"x", 1}}, q(3), std::nullopt)
               .build();
  m.rows[0].label.hard = true;
  m.columns[0].label.hard = true;
  EXPECT_EQ(least_total_change(m).result, LeastTotalChange::Result::hard_conflict);
}

}  // namespace
}  // namespace plumb::explain
