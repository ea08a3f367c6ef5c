// The solve session: every edit, restore and goal switch compared with solving the edited model
// from scratch exactly (the pure exact engine, a path that shares no state with the session), each
// certificate checked against the edited model by the independent checker.
#include "plumb/exact/session.hpp"
#include "plumb/check/check.hpp"
#include "plumb/model/read.hpp"
#include "shared_data.hpp"

#include <gtest/gtest.h>

#include <functional>
#include <thread>

namespace plumb::exact {
namespace {

using model::ModelBuilder;
using model::Side;
using numeric::Rational;
using Terms = std::vector<std::pair<std::string, Rational>>;

Rational q(long p, long d = 1) { return Rational(p, d); }

// Invented for these tests: a village bakery plans a day's loaves (rye, wheat, spelt) under oven
// hours, flour and a delivery promise; the file hash is made up so identity checks can bite.
model::Model bakery() {
  auto model = ModelBuilder("bakery-day")
                   .maximise()
                   .column("rye", 3, q(0), q(40))
                   .column("wheat", 2, q(0))
                   .column("spelt", 4, q(0), q(10))
                   .row("oven", Terms{{"rye", q(1, 2)}, {"wheat", q(1, 4)}, {"spelt", 1}}, {}, q(20))
                   .row("flour", Terms{{"rye", 1}, {"wheat", 1}, {"spelt", q(3, 2)}}, {}, q(50))
                   .row("promise", Terms{{"wheat", 1}, {"spelt", 1}}, q(12), {})
                   .build();
  model.source.path = "bakery.plumb";
  model.source.sha256 = std::string(64, 'b');
  return model;
}

// The outcome and objective of the pure exact engine on `model`, solved from scratch.
Solution fresh(const model::Model& model) {
  SolveOptions options;
  options.method = Method::exact;
  CertifiedSolution result = certified_solve(model, options);
  EXPECT_TRUE(result.certified()) << result.verdict.failure;
  return result.solution;
}

// Solves the session and compares with `expected`, the edited model built by the test itself.
CertifiedSolution expect_as_fresh(Session& session, const model::Model& expected) {
  CertifiedSolution result = session.solve();
  EXPECT_TRUE(result.certified()) << result.verdict.failure;
  EXPECT_TRUE(result.rejections.empty());
  check::Verdict against_edited = check::verify(expected, result.certificate);
  EXPECT_TRUE(against_edited.valid) << against_edited.failure;
  Solution reference = fresh(expected);
  EXPECT_EQ(result.solution.outcome, reference.outcome);
  if (reference.outcome == Outcome::optimal) {
    EXPECT_EQ(result.solution.objective, reference.objective);
  }
  EXPECT_TRUE(session.current().same_content(expected));
  return result;
}

TEST(ExactSession, UneditedSolveIsTheFilesOwn) {
  auto model = bakery();
  Session session(model);
  EXPECT_FALSE(session.edited());
  CertifiedSolution result = expect_as_fresh(session, model);
  ASSERT_EQ(result.solution.outcome, Outcome::optimal);
  EXPECT_EQ(result.certificate.model.sha256, model.source.sha256);
  EXPECT_FALSE(result.certificate.extra.contains("changes"));
  // Worked by hand (vertex enumeration): oven and flour tight, spelt 0, rye 30, wheat 20,
  // 3*30 + 2*20 = 130.
  EXPECT_EQ(result.solution.objective, 130);
}

TEST(ExactSession, RowEditsAndRestoresMatchFreshSolves) {
  auto model = bakery();
  Session session(model);
  expect_as_fresh(session, model);

  auto edited = model;
  edited.source.sha256.clear();
  session.set_row_upper(1, q(30));  // less flour
  edited.rows[1].upper = q(30);
  CertifiedSolution tighter = expect_as_fresh(session, edited);
  EXPECT_TRUE(session.edited());
  EXPECT_TRUE(tighter.certificate.model.sha256.empty());
  // Never the file's certificate: the checker refuses it for the file as given.
  EXPECT_FALSE(check::verify(model, tighter.certificate).valid);
  ASSERT_TRUE(tighter.certificate.extra.contains("changes"));
  EXPECT_EQ(tighter.certificate.extra["changes"].dump(), R"([{"row":"flour","lower":null,"upper":"30"}])");

  session.set_row_upper(0, std::nullopt);  // the oven row relaxed to free
  edited.rows[0].upper.reset();
  expect_as_fresh(session, edited);

  session.set_row_lower(2, q(45));  // a promise beyond the flour: infeasible
  edited.rows[2].lower = q(45);
  CertifiedSolution infeasible = expect_as_fresh(session, edited);
  EXPECT_EQ(infeasible.solution.outcome, Outcome::infeasible);

  session.restore_row(2);
  edited.rows[2] = model.rows[2];
  expect_as_fresh(session, edited);

  session.set_row_lower(1, q(31));  // flour: at least 31 and at most 30, crossed
  edited.rows[1].lower = q(31);
  CertifiedSolution crossed = expect_as_fresh(session, edited);
  EXPECT_EQ(crossed.solution.stats.proof, "crossed limits");
  session.set_row_lower(1, model.rows[1].lower);
  edited.rows[1].lower = model.rows[1].lower;

  session.restore_row(0);
  session.restore_row(1);
  EXPECT_FALSE(session.edited());
  CertifiedSolution back = expect_as_fresh(session, model);
  EXPECT_EQ(back.certificate.model.sha256, model.source.sha256);
  EXPECT_FALSE(back.certificate.extra.contains("changes"));
}

TEST(ExactSession, ColumnEditsAndRestoresMatchFreshSolves) {
  auto model = bakery();
  Session session(model);
  auto edited = model;
  edited.source.sha256.clear();

  session.set_column_upper(2, std::nullopt);  // spelt unlimited
  edited.columns[2].upper.reset();
  expect_as_fresh(session, edited);

  session.set_column_lower(0, q(35));  // at least 35 rye: the oven cannot also bake the promise
  edited.columns[0].lower = q(35);
  EXPECT_EQ(expect_as_fresh(session, edited).solution.outcome, Outcome::infeasible);

  // Rye free below, oven and flour rows free: wheat grows without end.
  session.set_column_lower(0, std::nullopt);
  edited.columns[0].lower.reset();
  session.set_row_upper(1, std::nullopt);
  edited.rows[1].upper.reset();
  session.set_row_upper(0, std::nullopt);
  edited.rows[0].upper.reset();
  EXPECT_EQ(expect_as_fresh(session, edited).solution.outcome, Outcome::unbounded);

  session.restore_all();
  EXPECT_FALSE(session.edited());
  expect_as_fresh(session, model);
}

// A proof of infeasibility stands while every row and column whose limits moved since it was
// found carries no multiplier: the session answers with it after one check, and solves again
// otherwise.
TEST(ExactSession, AnEarlierProofOfInfeasibilityAnswersWhileItsLimitsStand) {
  auto model = bakery();
  Session session(model);
  auto edited = model;
  edited.source.sha256.clear();
  auto expect_proof = [&](bool earlier, Outcome outcome) {
    CertifiedSolution result = expect_as_fresh(session, edited);
    EXPECT_EQ(result.solution.outcome, outcome);
    EXPECT_EQ(result.solution.stats.proof == "earlier proof", earlier) << result.solution.stats.proof;
    return result;
  };

  // At least 60 wheat and spelt, from at most 50 flour: infeasible by promise and flour.
  session.set_row_lower(2, q(60));
  edited.rows[2].lower = q(60);
  CertifiedSolution first = expect_proof(false, Outcome::infeasible);
  ASSERT_EQ(first.solution.y[0], 0);  // the oven plays no part in the proof
  ASSERT_NE(first.solution.y[1], 0);

  session.set_row_upper(0, std::nullopt);  // the oven freed: outside the proof
  edited.rows[0].upper.reset();
  CertifiedSolution again = expect_proof(true, Outcome::infeasible);
  EXPECT_EQ(again.certificate.extra["changes"].size(), 2u);

  session.set_row_upper(1, q(70));  // more flour: the proof's own row moved, and it is feasible
  edited.rows[1].upper = q(70);
  expect_proof(false, Outcome::optimal);
  session.restore_row(1);  // back to the limits the proof was found with
  edited.rows[1] = model.rows[1];
  expect_proof(true, Outcome::infeasible);

  session.set_column_lower(0, std::nullopt);  // rye below zero frees flour: its bound was pressed
  edited.columns[0].lower.reset();
  expect_proof(false, Outcome::optimal);
  session.restore_column(0);
  edited.columns[0] = model.columns[0];
  expect_proof(true, Outcome::infeasible);

  // The oven crossed: infeasible twice over, and the proof above still stands.  With the promise
  // restored the crossed row is the proof, on its two limits alone, and stands while they do.
  session.set_row_lower(0, q(25));
  session.set_row_upper(0, q(20));
  edited.rows[0].lower = q(25);
  edited.rows[0].upper = q(20);
  expect_proof(true, Outcome::infeasible);
  session.restore_row(2);
  edited.rows[2] = model.rows[2];
  EXPECT_EQ(expect_proof(false, Outcome::infeasible).solution.stats.proof, "crossed limits");
  session.set_row_upper(1, q(70));
  edited.rows[1].upper = q(70);
  expect_proof(true, Outcome::infeasible);
  session.restore_row(0);
  edited.rows[0] = model.rows[0];
  expect_proof(false, Outcome::optimal);
}

TEST(ExactSession, AnUnprovenProofRowGivesWayToASecondSearch) {
  auto model = bakery();
  auto edited = model;
  edited.source.sha256.clear();
  edited.rows[2].lower = q(60);  // infeasible by promise and flour
  SolveOptions first_row_unproven;
  first_row_unproven.fault = Fault::first_row_not_refined;
  auto expect_second_search = [&](const CertifiedSolution& result) {
    ASSERT_TRUE(result.certified()) << result.verdict.failure;
    EXPECT_EQ(result.solution.outcome, Outcome::infeasible);
    EXPECT_EQ(result.solution.stats.proof, "refined row of the inverse, second search");
    EXPECT_EQ(result.solution.stats.auxiliary_iterations, 0);  // no least-infeasibility LP
    check::Verdict against_edited = check::verify(edited, result.certificate);
    EXPECT_TRUE(against_edited.valid) << against_edited.failure;
  };

  // Cold, on the costs: the zero-cost search, beside the search on the costs on two cores, gives
  // the first row; the second search is the search on the costs alone.
  Session cold(model);
  cold.set_row_lower(2, q(60));
  CertifiedSolution cold_result = cold.solve(first_row_unproven);
  expect_second_search(cold_result);
  EXPECT_FALSE(cold_result.solution.stats.zero_cost_search);

  // Cold, under the feasibility goal (no zero-cost search beside it): from the other cold start.
  Session feasibility(model);
  feasibility.set_goal(Goal::feasibility);
  feasibility.set_row_lower(2, q(60));
  expect_second_search(feasibility.solve(first_row_unproven));

  // Warm: the second search starts from scratch.
  Session session(model);
  ASSERT_EQ(session.solve().solution.outcome, Outcome::optimal);  // the basis the next search starts from
  session.set_row_lower(2, q(60));
  expect_second_search(session.solve(first_row_unproven));
}

TEST(ExactSession, SettingTheOriginalValueIsNoEdit) {
  auto model = bakery();
  Session session(model);
  session.set_row_upper(0, q(7));
  session.set_row_upper(0, q(20));
  EXPECT_FALSE(session.edited());
  EXPECT_EQ(&session.current(), &model);
}

TEST(ExactSession, GoalSwitchesBetweenObjectiveAndFeasibility) {
  auto model = bakery();
  Session session(model);
  session.set_goal(Goal::feasibility);
  EXPECT_TRUE(session.edited());
  auto feasibility = model;
  feasibility.source.sha256.clear();
  feasibility.objective.sense = model::Sense::minimise;
  feasibility.objective.coefficients.assign(3, Rational(0));
  CertifiedSolution found = expect_as_fresh(session, feasibility);
  ASSERT_EQ(found.solution.outcome, Outcome::optimal);
  EXPECT_EQ(found.solution.objective, 0);
  EXPECT_EQ(found.certificate.extra["changes"].dump(), R"([{"goal":"feasibility"}])");

  session.set_goal(Goal::model_objective);
  EXPECT_EQ(expect_as_fresh(session, model).solution.objective, 130);
}

TEST(ExactSession, AbandonedSolveLeavesTheSessionUsable) {
  auto model = bakery();
  Session session(model);
  session.set_row_upper(1, q(30));
  run::Budget given_up;
  given_up.abandon();
  SolveOptions options;
  options.budget = &given_up;
  CertifiedSolution stopped = session.solve(options);
  EXPECT_EQ(stopped.solution.outcome, Outcome::stopped);
  EXPECT_EQ(stopped.solution.stop_reason, run::StopReason::abandoned);
  EXPECT_FALSE(stopped.certified());

  auto edited = model;
  edited.source.sha256.clear();
  edited.rows[1].upper = q(30);
  expect_as_fresh(session, edited);
}

TEST(ExactSession, ResolvingUnchangedModelStartsAtTheLastBasis) {
  auto model = bakery();
  Session session(model);
  EXPECT_GT(session.solve().solution.stats.float_iterations, 0);
  EXPECT_EQ(session.solve().solution.stats.float_iterations, 0);
}

// The session's float LP follows every kind of edit: each re-solve's float search ends at a basis
// optimal for the edited model, so certification needs no correction round or exact pivot.  A
// search on stale limits or costs would end at the old optimum, which each edit here moves.
TEST(ExactSession, ItsFloatSearchSeesEachEdit) {
  auto model = bakery();
  Session session(model);
  auto expect_found_by_the_search = [&](const char* what, const Rational& objective) {
    SCOPED_TRACE(what);
    CertifiedSolution result = session.solve();
    ASSERT_TRUE(result.certified()) << result.verdict.failure;
    EXPECT_EQ(result.solution.objective, objective);
    EXPECT_FALSE(result.solution.stats.repaired);
    EXPECT_EQ(result.solution.stats.correction_rounds, 0);
  };
  session.set_goal(Goal::feasibility);  // the float LP is made with zero costs
  expect_found_by_the_search("feasibility first", 0);
  session.set_goal(Goal::model_objective);
  expect_found_by_the_search("as given", 130);
  // Worked by hand: with rye at 10, oven and flour both bind (wheat/4 + spelt = 15, wheat +
  // 3/2 spelt = 40): spelt 8, wheat 28, 30 + 56 + 32 = 118; spelt at 10 or at 0 gives 110.
  session.set_column_upper(0, q(10));
  expect_found_by_the_search("rye at most 10", 118);
  session.set_goal(Goal::feasibility);
  expect_found_by_the_search("feasibility", 0);
  session.set_goal(Goal::model_objective);
  expect_found_by_the_search("the objective again", 118);
  session.restore_column(0);
  expect_found_by_the_search("rye restored", 130);
  session.set_row_upper(1, q(30));  // less flour
  expect_found_by_the_search("less flour", fresh(session.current()).objective);
  session.restore_row(1);
  expect_found_by_the_search("flour restored", 130);
}

// Sub-solves whose certificates are never written ask for no extra keys; the certificate still
// passes the checker, which ignores them.  An earlier proof's answer leaves them out too.
TEST(ExactSession, CertificatesWithoutExtraKeysOnRequest) {
  auto model = bakery();
  Session session(model);
  SolveOptions bare;
  bare.certificate_extras = false;
  session.set_row_upper(1, q(30));
  CertifiedSolution optimal = session.solve(bare);
  ASSERT_TRUE(optimal.certified()) << optimal.verdict.failure;
  EXPECT_TRUE(optimal.certificate.extra.empty());
  session.set_row_lower(2, q(45));  // infeasible
  ASSERT_EQ(session.solve(bare).solution.outcome, Outcome::infeasible);
  session.set_row_upper(0, q(19));  // oven: no multiplier in that proof, so it stands
  CertifiedSolution earlier = session.solve(bare);
  ASSERT_TRUE(earlier.certified()) << earlier.verdict.failure;
  EXPECT_EQ(earlier.solution.stats.proof, "earlier proof");
  EXPECT_TRUE(earlier.certificate.extra.empty());
  CertifiedSolution full = session.solve();
  EXPECT_TRUE(full.certificate.extra.contains("changes"));
  session.restore_all();
  EXPECT_TRUE(session.solve().certificate.extra.contains("basis"));
}

// A search start given from outside steers the float search of a fresh session (certification
// runs as from a cold start): the first solve then needs no iteration.  The session's own last
// basis comes first once it has one.
TEST(ExactSession, SearchStartSteersTheFirstFloatSearch) {
  auto model = bakery();
  CertifiedSolution cold = certified_solve(model);
  ASSERT_TRUE(cold.certified()) << cold.verdict.failure;
  ASSERT_GT(cold.solution.stats.float_iterations, 0);
  SolveOptions options;
  options.search_start = &cold.solution.basis;
  CertifiedSolution steered = certified_solve(model, options);
  ASSERT_TRUE(steered.certified()) << steered.verdict.failure;
  EXPECT_EQ(steered.solution.stats.float_iterations, 0);
  EXPECT_EQ(steered.solution.objective, cold.solution.objective);
  EXPECT_EQ(steered.solution.stats.proof, "refined basis");  // not the exact engine's warm start
}

TEST(ExactSession, IndexOutOfRangeThrows) {
  auto model = bakery();
  Session session(model);
  EXPECT_THROW(session.set_row_lower(3, q(0)), std::out_of_range);
  EXPECT_THROW(session.restore_column(-1), std::out_of_range);
}

// A deletion-filter-like loop on a Netlib model: each row in turn relaxed to free, solved, and
// restored, each solve compared with a fresh exact solve of the edited model.
void relax_rows_in_turn(const model::Model& model, const std::vector<int>& rows) {
  Session session(model);
  expect_as_fresh(session, model);
  for (int row : rows) {
    SCOPED_TRACE(model.rows[row].name);
    auto edited = model;
    edited.source.sha256.clear();
    edited.rows[row].lower.reset();
    edited.rows[row].upper.reset();
    session.set_row_lower(row, std::nullopt);
    session.set_row_upper(row, std::nullopt);
    if (session.edited()) expect_as_fresh(session, edited);
    session.restore_row(row);
    expect_as_fresh(session, model);
  }
}

TEST(NetlibSession, AfiroRowsRelaxedInTurn) {
  auto folder = test::shared_dir / "netlib";
  if (!test::shared_folder_present(folder)) GTEST_SKIP() << folder << " missing";
  auto model = model::read_model((folder / "afiro.mps.gz").string());
  relax_rows_in_turn(model, {0, 3, 7, 12, 20});
}

TEST(NetlibSession, InfeasibleModelsRowsOfTheFarkasProofRelaxedInTurn) {
  auto folder = test::shared_dir / "netlib-infeas";
  if (!test::shared_folder_present(folder)) GTEST_SKIP() << folder << " missing";
  for (const char* name : {"itest6", "woodinfe", "ex72a"}) {
    SCOPED_TRACE(name);
    auto model = model::read_model((folder / (std::string(name) + ".mps.gz")).string());
    Session session(model);
    CertifiedSolution first = session.solve();
    ASSERT_EQ(first.solution.outcome, Outcome::infeasible);  // Netlib lp/infeas readme
    std::vector<int> support;
    for (int i = 0; i < model.row_count() && support.size() < 4; ++i)
      if (first.solution.y[i] != 0) support.push_back(i);
    relax_rows_in_turn(model, support);
  }
}

// chemcom (../shared/netlib-infeas) is proven infeasible by the zero-cost search; with row 84 of
// its proof freed it is feasible.  The session's next search on the costs must not start from the
// zero-cost search's basis (simplex::FloatOptions::warm_start_from_zero_costs): it takes the cold
// search's path, iteration for iteration.
TEST(NetlibSession, AZeroCostBasisStartsOnlyTheZeroCostSearch) {
  auto folder = test::shared_dir / "netlib-infeas";
  if (!test::shared_folder_present(folder)) GTEST_SKIP() << folder << " missing";
  if (std::thread::hardware_concurrency() < 2) GTEST_SKIP() << "one core: the zero-cost search does not run";
  auto model = model::read_model((folder / "chemcom.mps.gz").string());
  Session session(model);
  CertifiedSolution first = session.solve();
  ASSERT_EQ(first.solution.outcome, Outcome::infeasible);  // Netlib lp/infeas readme
  ASSERT_TRUE(first.solution.stats.zero_cost_search);
  ASSERT_NE(first.solution.y[84], 0);
  session.set_row_lower(84, std::nullopt);
  session.set_row_upper(84, std::nullopt);
  CertifiedSolution relaxed = session.solve();
  CertifiedSolution cold = certified_solve(session.current());
  ASSERT_EQ(relaxed.solution.outcome, Outcome::optimal);
  EXPECT_EQ(relaxed.solution.objective, cold.solution.objective);
  EXPECT_EQ(relaxed.solution.stats.float_iterations, cold.solution.stats.float_iterations);
}

// klein2 (../shared/netlib-infeas) searched for a feasible point: with row 0 of its proof freed
// it stays infeasible.  From its last basis, priced with the weights the search ended with
// (simplex::DualWeights), the re-solve needs a handful of iterations; priced from 1s it had needed
// 475, more than the cold search's 279 (measured when this test was written).
TEST(NetlibSession, ARelaxedResolvePricesWithTheWeightsTheLastSearchEndedWith) {
  auto folder = test::shared_dir / "netlib-infeas";
  if (!test::shared_folder_present(folder)) GTEST_SKIP() << folder << " missing";
  auto model = model::read_model((folder / "klein2.mps.gz").string());
  Session session(model);
  session.set_goal(Goal::feasibility);
  CertifiedSolution first = session.solve();
  ASSERT_EQ(first.solution.outcome, Outcome::infeasible);  // Netlib lp/infeas readme
  ASSERT_NE(first.solution.y[0], 0);
  session.set_row_lower(0, std::nullopt);
  session.set_row_upper(0, std::nullopt);
  CertifiedSolution relaxed = session.solve();
  ASSERT_TRUE(relaxed.certified()) << relaxed.verdict.failure;
  Session cold(session.current());
  CertifiedSolution afresh = cold.solve();
  ASSERT_EQ(afresh.solution.outcome, relaxed.solution.outcome);
  EXPECT_LT(relaxed.solution.stats.float_iterations, afresh.solution.stats.float_iterations / 4);
}

// Invented, worked by hand: min 3a + 2b with a + b >= 4, a + 3b >= 6 and a + b <= 10 has its
// optimum 8 at (0, 4).  With the cap lowered to 1 no point exists, which the zero-cost search
// proves; with the cap restored, the search on the costs starts where it last ended, at the
// optimum, and needs no iteration (from the logical basis it needs some).
TEST(ExactSession, TheSearchOnTheCostsResumesWhereItLastEnded) {
  if (std::thread::hardware_concurrency() < 2) GTEST_SKIP() << "one core: the zero-cost search does not run";
  auto model = ModelBuilder("two-covers-and-a-cap")
                   .column("a", 3)
                   .column("b", 2)
                   .row("cover", Terms{{"a", 1}, {"b", 1}}, q(4), {})
                   .row("weighted", Terms{{"a", 1}, {"b", 3}}, q(6), {})
                   .row("cap", Terms{{"a", 1}, {"b", 1}}, {}, q(10))
                   .build();
  Session session(model);
  CertifiedSolution first = session.solve();
  ASSERT_EQ(first.solution.outcome, Outcome::optimal);
  EXPECT_EQ(first.solution.objective, q(8));
  EXPECT_GT(first.solution.stats.float_iterations, 0);
  session.set_row_upper(2, q(1));
  CertifiedSolution capped = session.solve();
  ASSERT_EQ(capped.solution.outcome, Outcome::infeasible);
  ASSERT_TRUE(capped.solution.stats.zero_cost_search);
  session.restore_row(2);
  CertifiedSolution restored = session.solve();
  ASSERT_EQ(restored.solution.outcome, Outcome::optimal);
  EXPECT_EQ(restored.solution.objective, q(8));
  EXPECT_EQ(restored.solution.stats.float_iterations, 0);
}

// gran (../shared/netlib-infeas) searched for a feasible point with one row of its proof freed
// stays infeasible, and some searches end at a row of B^-1 that refinement cannot make exact: from
// the last basis with row 1 freed, and cold from the crash basis with row 419 freed (measured when
// this test was written).  A second search from another start (from scratch, or from the logical
// basis) ends at a row that refines; before it, each took the least-infeasibility LP (1.3-1.4 s).
TEST(NetlibSession, AProofRowThatWillNotRefineGivesWayToASecondSearch) {
  auto folder = test::shared_dir / "netlib-infeas";
  if (!test::shared_folder_present(folder)) GTEST_SKIP() << folder << " missing";
  auto model = model::read_model((folder / "gran.mps.gz").string());
  auto expect_row_proof = [](const CertifiedSolution& result) {
    ASSERT_TRUE(result.certified()) << result.verdict.failure;
    EXPECT_EQ(result.solution.outcome, Outcome::infeasible);
    EXPECT_NE(result.solution.stats.proof, "least infeasibility");
  };
  Session session(model);
  session.set_goal(Goal::feasibility);
  ASSERT_EQ(session.solve().solution.outcome, Outcome::infeasible);  // Netlib lp/infeas readme
  session.set_row_lower(1, std::nullopt);
  session.set_row_upper(1, std::nullopt);
  expect_row_proof(session.solve());

  Session cold(model);
  cold.set_goal(Goal::feasibility);
  cold.set_row_lower(419, std::nullopt);
  cold.set_row_upper(419, std::nullopt);
  expect_row_proof(cold.solve());
}

}  // namespace

}  // namespace plumb::exact
