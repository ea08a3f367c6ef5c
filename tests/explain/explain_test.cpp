// plumb explain's search: every answer checked here by exact evaluation of its own, independent of
// the library's checker: the Farkas terms combine the subsystem's entries into "0 >= positive", and
// each member's witness meets every other entry.  Crafted models (invented, worked by hand) have
// one known IIS; itest2 and itest6 (Netlib's infeasible collection, ../shared/netlib-infeas) have
// several overlapping ones, so only validity and irreducibility are asserted there.
#include "plumb/explain/explain.hpp"
#include "plumb/exact/solve.hpp"
#include "plumb/model/read.hpp"
#include "shared_data.hpp"

#include <gtest/gtest.h>

#include <algorithm>
#include <map>
#include <set>

namespace plumb::explain {
namespace {

using certificate::Entry;
using certificate::EntryKind;
using certificate::Limit;
using model::ModelBuilder;
using numeric::Rational;
using Terms = std::vector<std::pair<std::string, Rational>>;

Rational q(long p, long d = 1) { return Rational(p, d); }

// The entry's left-hand side at x and its value, both exact, in the form "g(x) >= value" (an upper
// side negated), straight from the model's rows and columns.
struct Evaluated {
  Rational left, value;
};
Evaluated evaluate(const model::Model& m, const Entry& e, const std::map<std::string, Rational>& x) {
  auto at = [&x](const std::string& name) {
    auto it = x.find(name);
    return it == x.end() ? Rational(0) : it->second;
  };
  Rational left = 0;
  model::Side side;
  if (e.kind == EntryKind::row) {
    int i = *m.find_row(e.name);
    auto columns = m.matrix.row_columns(i);
    auto positions = m.matrix.row_positions(i);
    for (std::size_t k = 0; k < columns.size(); ++k)
      left += m.matrix.value(positions[k]) * at(m.columns[columns[k]].name);
    side = e.limit == Limit::lower ? m.rows[i].lower : m.rows[i].upper;
  } else {
    int j = *m.find_column(e.name);
    left = at(e.name);
    side = e.limit == Limit::lower ? m.columns[j].lower : m.columns[j].upper;
  }
  EXPECT_TRUE(side.has_value()) << e.name;
  Rational value = side.value_or(0);
  return e.limit == Limit::lower ? Evaluated{left, value} : Evaluated{-left, -value};
}

// Validity and irreducibility of an infeasible_subsystem certificate, by exact evaluation.
void expect_proven_iis(const model::Model& m, const Explanation& e) {
  const certificate::Certificate& c = e.certificate;
  ASSERT_EQ(c.status, certificate::Status::infeasible_subsystem);
  std::vector<Entry> subsystem = c.members;
  subsystem.insert(subsystem.end(), c.hard.begin(), c.hard.end());
  // Farkas' lemma (J. Farkas 1902), explicit form: non-negative multipliers on ">=" entries whose
  // left-hand sides cancel in every column and whose right-hand sides sum to a positive number.
  std::vector<Rational> combined(static_cast<std::size_t>(m.column_count()), Rational(0));
  Rational right = 0;
  for (const auto& term : c.farkas) {
    EXPECT_GE(term.multiplier, 0);
    EXPECT_NE(std::find(subsystem.begin(), subsystem.end(), term.entry), subsystem.end()) << term.entry.name;
    for (int j = 0; j < m.column_count(); ++j) {
      std::map<std::string, Rational> unit{{m.columns[j].name, Rational(1)}};
      std::map<std::string, Rational> zero;
      combined[j] +=
          term.multiplier * (evaluate(m, term.entry, unit).left - evaluate(m, term.entry, zero).left);
    }
    right += term.multiplier * evaluate(m, term.entry, {}).value;
  }
  for (int j = 0; j < m.column_count(); ++j) EXPECT_EQ(combined[j], 0) << m.columns[j].name;
  EXPECT_GT(right, 0);
  // Irreducible: every member is dropped by some witness that meets every other entry exactly.
  std::set<std::size_t> covered;
  for (const auto& w : c.witnesses) {
    std::map<std::string, Rational> x(w.x.begin(), w.x.end());
    for (std::size_t k = 0; k < subsystem.size(); ++k) {
      if (std::find(w.drop.begin(), w.drop.end(), k) != w.drop.end()) continue;
      Evaluated v = evaluate(m, subsystem[k], x);
      EXPECT_GE(v.left, v.value) << subsystem[k].name;
    }
    covered.insert(w.drop.begin(), w.drop.end());
  }
  EXPECT_EQ(covered.size(), c.members.size());
  // Hard entries are never members.
  for (const auto& member : e.members) EXPECT_FALSE(member.hard) << member.entry.name;
  EXPECT_TRUE(e.verdict.valid) << e.verdict.failure;
}

std::set<std::pair<std::string, Limit>> members_of(const Explanation& e) {
  std::set<std::pair<std::string, Limit>> set;
  for (const auto& m : e.certificate.members) set.emplace(m.name, m.limit);
  return set;
}

void set_hard(model::Model& m, const std::string& row_name) {
  m.rows[*m.find_row(row_name)].label.hard = true;
}

// Worked by hand: x + y = 10 with x <= 3 and y <= 4 (rows) cannot hold, since x + y <= 7; the
// equation takes part with its lower side only, and x, y >= 0 play no part.
model::Model equation_model() {
  return ModelBuilder("equation")
      .column("x", 1)
      .column("y", 1)
      .row("total", Terms{{"x", 1}, {"y", 1}}, q(10), q(10))
      .row("x_cap", Terms{{"x", 1}}, {}, q(3))
      .row("y_cap", Terms{{"y", 1}}, {}, q(4))
      .build();
}

TEST(Explain, EquationTakesPartWithOneSide) {
  model::Model m = equation_model();
  Explanation e = explain(m);
  ASSERT_EQ(e.outcome, Outcome::infeasible_subsystem);
  expect_proven_iis(m, e);
  std::set<std::pair<std::string, Limit>> expected{
      {"total", Limit::lower}, {"x_cap", Limit::upper}, {"y_cap", Limit::upper}};
  EXPECT_EQ(members_of(e), expected);
}

// Two disjoint conflicts, worked by hand: x >= 2 against x <= 1 (two rows), and u + v >= 5 against
// u <= 1, v <= 1 (a row and two bounds).  When the first certificate covers both, the orders find
// different subsystems: bounds first drops u's bound first and keeps the two rows, rows first drops
// x >= 2 first and keeps the row and two bounds; the smaller one is kept.
TEST(Explain, TwoOrdersAndTheSmallerSubsystemIsKept) {
  model::Model m = ModelBuilder("two-conflicts")
                       .column("x", 1)
                       .column("u", 1, q(0), q(1))
                       .column("v", 1, q(0), q(1))
                       .row("x_floor", Terms{{"x", 1}}, q(2), {})
                       .row("x_cap", Terms{{"x", 1}}, {}, q(1))
                       .row("uv_floor", Terms{{"u", 1}, {"v", 1}}, q(5), {})
                       .build();
  Explanation e = explain(m);
  ASSERT_EQ(e.outcome, Outcome::infeasible_subsystem);
  expect_proven_iis(m, e);
  std::set<std::pair<std::string, Limit>> expected{{"x_floor", Limit::lower}, {"x_cap", Limit::upper}};
  EXPECT_EQ(members_of(e), expected);
  ASSERT_EQ(e.support_size, 5);  // both conflicts: the premise of this test
  ASSERT_EQ(e.orders.size(), 2u);
  EXPECT_EQ(e.orders[0].members, 2u);
  EXPECT_EQ(e.orders[1].members, 3u);
  // The sub-solves, worked by hand from docs/explaining.md.  Bounds first: dropping u <= 1 leaves
  // the x conflict, whose certificate's support replaces the candidates; the doubled block
  // {x_floor, x_cap} turns feasible, then each alone proves needed: 4.  Rows first: dropping
  // x_floor leaves the u, v conflict as the support; the block {uv_floor, u <= 1} turns feasible,
  // then uv_floor, u <= 1 and v <= 1 each alone: 5.
  EXPECT_EQ(e.orders[0].sub_solves, 4);
  EXPECT_EQ(e.orders[1].sub_solves, 5);
}

// Worked by hand: 5 <= x + y <= 8 with x >= 6 and y >= 3 (rows): x + y >= 9 > 8, the range's upper
// side alone takes part.
// The same two conflicts with the u, v row first in the model.  Bounds first ends on the x
// conflict's proof, which then still stands for rows first's first probe (dropping uv_floor, which
// it does not use): that probe must be a new search all the same, or every order would start from
// the first order's subsystem (gran, ../shared/netlib-infeas: 6 members where rows first finds 2).
// Worked by hand: no sub-solve of either order is answered by an earlier proof.
TEST(Explain, EachOrderStartsWithANewSearch) {
  model::Model m = ModelBuilder("two-conflicts-row-first")
                       .column("x", 1)
                       .column("u", 1, q(0), q(1))
                       .column("v", 1, q(0), q(1))
                       .row("uv_floor", Terms{{"u", 1}, {"v", 1}}, q(5), {})
                       .row("x_floor", Terms{{"x", 1}}, q(2), {})
                       .row("x_cap", Terms{{"x", 1}}, {}, q(1))
                       .build();
  Explanation e = explain(m);
  ASSERT_EQ(e.outcome, Outcome::infeasible_subsystem);
  expect_proven_iis(m, e);
  ASSERT_EQ(e.support_size, 5);
  ASSERT_EQ(e.orders.size(), 2u);
  EXPECT_EQ(e.orders[0].earlier_proofs, 0);
  EXPECT_EQ(e.orders[1].earlier_proofs, 0);
}

TEST(Explain, RangedRowTakesPartWithItsUpperSide) {
  model::Model m = ModelBuilder("ranged")
                       .column("x", 1)
                       .column("y", 1)
                       .row("range", Terms{{"x", 1}, {"y", 1}}, q(5), q(8))
                       .row("x_floor", Terms{{"x", 1}}, q(6), {})
                       .row("y_floor", Terms{{"y", 1}}, q(3), {})
                       .build();
  Explanation e = explain(m);
  ASSERT_EQ(e.outcome, Outcome::infeasible_subsystem);
  expect_proven_iis(m, e);
  std::set<std::pair<std::string, Limit>> expected{
      {"range", Limit::upper}, {"x_floor", Limit::lower}, {"y_floor", Limit::lower}};
  EXPECT_EQ(members_of(e), expected);
}

// Only bounds conflict: x + y = 10 is hard, and the bounds x <= 3, y <= 4 cannot meet it.
TEST(Explain, OnlyBoundsConflictWithAHardRow) {
  model::Model m = ModelBuilder("bounds")
                       .column("x", 1, q(0), q(3))
                       .column("y", 1, q(0), q(4))
                       .column("z", 1, q(0), q(100))
                       .row("total", Terms{{"x", 1}, {"y", 1}}, q(10), q(10))
                       .row("spare", Terms{{"z", 1}}, q(1), {})
                       .build();
  set_hard(m, "total");
  Explanation e = explain(m);
  ASSERT_EQ(e.outcome, Outcome::infeasible_subsystem);
  expect_proven_iis(m, e);
  std::set<std::pair<std::string, Limit>> expected{{"x", Limit::upper}, {"y", Limit::upper}};
  EXPECT_EQ(members_of(e), expected);
  ASSERT_EQ(e.certificate.hard.size(), 2u);  // the equation's two sides, kept as given
  for (const auto& member : e.hard) EXPECT_EQ(member.entry.name, "total");
}

// Only bounds conflict: a column whose lower bound (5) lies above its upper bound (2).
TEST(Explain, CrossedBoundsAreTheirOwnSubsystem) {
  model::Model m = ModelBuilder("crossed-bounds")
                       .column("x", 1, q(5), q(2))
                       .column("y", 1)
                       .row("y_floor", Terms{{"y", 1}}, q(1), {})
                       .build();
  Explanation e = explain(m);
  ASSERT_EQ(e.outcome, Outcome::infeasible_subsystem);
  expect_proven_iis(m, e);
  std::set<std::pair<std::string, Limit>> expected{{"x", Limit::lower}, {"x", Limit::upper}};
  EXPECT_EQ(members_of(e), expected);
}

// A crossed row, 5 <= x <= 3: its two sides are the subsystem, proven by multipliers 1 and 1.
TEST(Explain, CrossedRowIsItsOwnSubsystem) {
  model::Model m = ModelBuilder("crossed-row")
                       .column("x", 1)
                       .row("crossed", Terms{{"x", 1}}, q(5), q(3))
                       .row("fine", Terms{{"x", 1}}, {}, q(10))
                       .build();
  Explanation e = explain(m);
  ASSERT_EQ(e.outcome, Outcome::infeasible_subsystem);
  expect_proven_iis(m, e);
  std::set<std::pair<std::string, Limit>> expected{{"crossed", Limit::lower}, {"crossed", Limit::upper}};
  EXPECT_EQ(members_of(e), expected);
}

TEST(Explain, HardEntriesAreNeverMembers) {
  model::Model m = equation_model();
  set_hard(m, "total");
  Explanation e = explain(m);
  ASSERT_EQ(e.outcome, Outcome::infeasible_subsystem);
  expect_proven_iis(m, e);
  std::set<std::pair<std::string, Limit>> expected{{"x_cap", Limit::upper}, {"y_cap", Limit::upper}};
  EXPECT_EQ(members_of(e), expected);
  bool total_used = false;
  for (const auto& term : e.certificate.farkas) total_used = total_used || term.entry.name == "total";
  EXPECT_TRUE(total_used);
}

// x >= 5 and x <= 3 are both hard: the model itself is inconsistent, whatever the soft rows say.
TEST(Explain, HardOnlyConflictMeansTheModelIsInconsistent) {
  model::Model m = ModelBuilder("inconsistent")
                       .column("x", 1)
                       .column("y", 1)
                       .row("floor", Terms{{"x", 1}}, q(5), {})
                       .row("cap", Terms{{"x", 1}}, {}, q(3))
                       .row("wish", Terms{{"x", 1}, {"y", 1}}, {}, q(1))
                       .build();
  set_hard(m, "floor");
  set_hard(m, "cap");
  Explanation e = explain(m);
  ASSERT_EQ(e.outcome, Outcome::inconsistent);
  EXPECT_TRUE(e.members.empty());
  EXPECT_TRUE(e.certificate.members.empty());
  std::set<std::string> hard;
  for (const auto& entry : e.certificate.hard) hard.insert(entry.name);
  EXPECT_EQ(hard, (std::set<std::string>{"floor", "cap"}));
  EXPECT_TRUE(e.verdict.valid) << e.verdict.failure;
}

// Worked by hand: x >= 4 and y >= 4 (group contract) against x + y <= 6 (group capacity); a third
// contract row, z <= 1, takes no part but belongs to the group.
model::Model grouped_model() {
  model::Model m = ModelBuilder("groups")
                       .column("x", 1)
                       .column("y", 1)
                       .column("z", 1)
                       .row("x_order", Terms{{"x", 1}}, q(4), {})
                       .row("y_order", Terms{{"y", 1}}, q(4), {})
                       .row("z_order", Terms{{"z", 1}}, {}, q(1))
                       .row("capacity", Terms{{"x", 1}, {"y", 1}}, {}, q(6))
                       .build();
  for (const char* name : {"x_order", "y_order", "z_order"})
    m.rows[*m.find_row(name)].label.group = "contract";
  m.rows[*m.find_row("capacity")].label.group = "plant";
  return m;
}

TEST(Explain, ByGroupDropsWholeGroups) {
  model::Model m = grouped_model();
  Options options;
  options.by_group = true;
  Explanation e = explain(m, options);
  ASSERT_EQ(e.outcome, Outcome::infeasible_subsystem);
  expect_proven_iis(m, e);
  EXPECT_EQ(e.groups, (std::vector<std::string>{"contract", "plant"}));
  std::set<std::pair<std::string, Limit>> expected{{"x_order", Limit::lower},
                                                   {"y_order", Limit::lower},
                                                   {"z_order", Limit::upper},
                                                   {"capacity", Limit::upper}};
  EXPECT_EQ(members_of(e), expected);
  ASSERT_EQ(e.certificate.witnesses.size(), 2u);
  EXPECT_EQ(e.certificate.witnesses[0].drop.size(), 3u);  // the whole contract group at once
}

// --within contract: the contract rows stand alone, the plant group stays whole; z_order, which
// took part only as a member of its group, drops out.
TEST(Explain, WithinOpensOneGroupToItsMembers) {
  model::Model m = grouped_model();
  Options options;
  options.by_group = true;
  options.within = "contract";
  Explanation e = explain(m, options);
  ASSERT_EQ(e.outcome, Outcome::infeasible_subsystem);
  expect_proven_iis(m, e);
  std::set<std::pair<std::string, Limit>> expected{
      {"x_order", Limit::lower}, {"y_order", Limit::lower}, {"capacity", Limit::upper}};
  EXPECT_EQ(members_of(e), expected);
  EXPECT_EQ(e.groups, (std::vector<std::string>{"", "", "plant"}));
}

TEST(Explain, WithoutGroupsTheSameModelGivesSingleRequirements) {
  model::Model m = grouped_model();
  Explanation e = explain(m);
  ASSERT_EQ(e.outcome, Outcome::infeasible_subsystem);
  expect_proven_iis(m, e);
  std::set<std::pair<std::string, Limit>> expected{
      {"x_order", Limit::lower}, {"y_order", Limit::lower}, {"capacity", Limit::upper}};
  EXPECT_EQ(members_of(e), expected);
  EXPECT_TRUE(e.groups.empty());
}

TEST(Explain, FeasibleModelGetsAFeasibleCertificate) {
  model::Model m = ModelBuilder("fine").column("x", 1).row("floor", Terms{{"x", 1}}, q(2), {}).build();
  Explanation e = explain(m);
  ASSERT_EQ(e.outcome, Outcome::feasible);
  EXPECT_EQ(e.certificate.status, certificate::Status::feasible);
  EXPECT_TRUE(e.verdict.valid) << e.verdict.failure;
}

TEST(Explain, ProgressReportsEverySubSolveOfTheFilter) {
  model::Model m = equation_model();
  std::vector<Progress> seen;
  Options options;
  options.progress = [&seen](const Progress& p) { seen.push_back(p); };
  Explanation e = explain(m, options);
  ASSERT_FALSE(seen.empty());
  EXPECT_EQ(seen.size(), static_cast<std::size_t>(e.sub_solves - 1));  // all but the first solve
  EXPECT_EQ(seen.front().phase, "deletion, bounds first");
  EXPECT_EQ(seen.back().candidates, 0);
  EXPECT_EQ(seen.back().sub_solves, e.sub_solves);
}

TEST(Explain, AnExhaustedBudgetStops) {
  model::Model m = equation_model();
  run::Budget budget(1e-9, std::nullopt);
  Options options;
  options.budget = &budget;
  Explanation e = explain(m, options);
  EXPECT_EQ(e.outcome, Outcome::stopped);
  EXPECT_EQ(e.stop_reason, run::StopReason::time_limit);
}

// The corpus's tight blend (invented data): its header works out by hand that with 10 % ethanol,
// 5 000 bbl of reformate and 3 000 of alkylate, the blend cannot get below 83600/12000 psi > 6.5.
// The cap and the ethanol share are hard (rules); the batch size and the two contract
// availabilities are soft, so they are what has to give.
TEST(Explain, TightBlendDemoNamesTheContractRequirements) {
  model::Model m = model::read_model(std::string(PLUMB_CORPUS_DIR) + "/summer-blend-tight.plumb");
  Explanation e = explain(m);
  ASSERT_EQ(e.outcome, Outcome::infeasible_subsystem);
  expect_proven_iis(m, e);
  std::set<std::pair<std::string, Limit>> expected{
      {"batch", Limit::lower}, {"reformate", Limit::upper}, {"alkylate", Limit::upper}};
  EXPECT_EQ(members_of(e), expected);
  std::set<std::string> hard_used;
  for (const auto& member : e.hard)
    if (member.multiplier != 0) hard_used.insert(member.entry.name);
  EXPECT_TRUE(hard_used.count("vapour_pressure"));
  EXPECT_TRUE(hard_used.count("ethanol_share"));
}

class ExplainItest : public ::testing::TestWithParam<std::string> {};

TEST_P(ExplainItest, SubsystemIsValidAndIrreducible) {
  auto folder = plumb::test::shared_dir / "netlib-infeas";
  if (!plumb::test::shared_folder_present(folder)) GTEST_SKIP() << "no " << folder;
  model::Model m = model::read_model((folder / (GetParam() + ".mps.gz")).string());
  Explanation e = explain(m);
  ASSERT_EQ(e.outcome, Outcome::infeasible_subsystem);
  expect_proven_iis(m, e);
  EXPECT_LT(e.members.size(), static_cast<std::size_t>(m.row_count() + 2 * m.column_count()));
}

// After --all, relaxing every set-aside requirement must leave a feasible model: solved exactly here,
// on a copy with those sides and bounds dropped, outside the search.
void expect_cover_removes_every_conflict(const model::Model& m, const Explanation& e) {
  model::Model relaxed = m;
  for (const Member& aside : e.set_aside) {
    bool lower = aside.entry.limit == Limit::lower;
    if (aside.entry.kind == EntryKind::row)
      (lower ? relaxed.rows[aside.index].lower : relaxed.rows[aside.index].upper).reset();
    else
      (lower ? relaxed.columns[aside.index].lower : relaxed.columns[aside.index].upper).reset();
  }
  EXPECT_NE(exact::certified_solve(relaxed).solution.outcome, exact::Outcome::infeasible);
}

TEST_P(ExplainItest, AllFindsEveryConflictEachProven) {
  auto folder = plumb::test::shared_dir / "netlib-infeas";
  if (!plumb::test::shared_folder_present(folder)) GTEST_SKIP() << "no " << folder;
  model::Model m = model::read_model((folder / (GetParam() + ".mps.gz")).string());
  Options options;
  options.all = true;
  Explanation e = explain(m, options);
  ASSERT_EQ(e.outcome, Outcome::infeasible_subsystem);
  expect_proven_iis(m, e);
  for (const Explanation& more : e.further) expect_proven_iis(m, more);
  EXPECT_GE(e.further.size(), 1u);  // both have overlapping conflicts (more than one)
  EXPECT_EQ(e.set_aside.size(), 1 + e.further.size());
  EXPECT_EQ(e.stop_reason, run::StopReason::none);
  expect_cover_removes_every_conflict(m, e);
}

// Invented, worked by hand: three quantities, each with a floor of 3 and a cap of 1: three
// disjoint conflicts, one per quantity.  --all finds all three; the cover holds one of each.
model::Model three_conflicts_model() {
  ModelBuilder builder("three-conflicts");
  for (const char* name : {"a", "b", "c"}) builder.column(name, 0, q(0), q(1));
  for (const char* name : {"a", "b", "c"})
    builder.row(std::string(name) + "_floor", Terms{{name, 1}}, q(3), {});
  return builder.build();
}

TEST(Explain, AllFindsThreeDisjointConflicts) {
  model::Model m = three_conflicts_model();
  Options options;
  options.all = true;
  Explanation e = explain(m, options);
  ASSERT_EQ(e.outcome, Outcome::infeasible_subsystem);
  ASSERT_EQ(e.further.size(), 2u);
  std::set<std::set<std::pair<std::string, Limit>>> found{members_of(e), members_of(e.further[0]),
                                                          members_of(e.further[1])};
  std::set<std::set<std::pair<std::string, Limit>>> expected;
  for (const char* name : {"a", "b", "c"})
    expected.insert({{std::string(name) + "_floor", Limit::lower}, {name, Limit::upper}});
  EXPECT_EQ(found, expected);
  for (const Explanation& more : e.further) expect_proven_iis(m, more);
  EXPECT_EQ(e.set_aside.size(), 3u);
  expect_cover_removes_every_conflict(m, e);
}

// --all stopped after its first conflict (the budget abandoned from the progress callback once
// the sub-solves of a plain explain are spent): the conflict found stands, proven, and the stop
// is reported; the search for the others did not finish.
TEST(Explain, AllStoppedAfterTheFirstConflictKeepsIt) {
  model::Model m = three_conflicts_model();
  const long first_search = explain(m).sub_solves;
  run::Budget budget;
  Options options;
  options.all = true;
  options.budget = &budget;
  options.progress = [&budget, first_search](const Progress& p) {
    if (p.sub_solves > first_search) budget.abandon();
  };
  Explanation e = explain(m, options);
  ASSERT_EQ(e.outcome, Outcome::infeasible_subsystem);
  EXPECT_TRUE(e.verdict.valid) << e.verdict.failure;
  expect_proven_iis(m, e);
  EXPECT_EQ(e.stop_reason, run::StopReason::abandoned);
  EXPECT_LT(e.further.size(), 2u);
  for (const Explanation& more : e.further) expect_proven_iis(m, more);
}

INSTANTIATE_TEST_SUITE_P(Netlib, ExplainItest, ::testing::Values("itest2", "itest6"),
                         [](const auto& info) { return info.param; });

}  // namespace
}  // namespace plumb::explain
