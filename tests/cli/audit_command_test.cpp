// plumb audit end to end: exit statuses, the words of the verdict, --repaired, and the objective
// sense written only in a comment.  Models: the corpus blend (optimum 218176400/237 by its own hand
// working, corpus/README.md) and tests/data/audit/sense-in-comment.mps (invented, worked by hand).
#include "support/run.hpp"

#include <gtest/gtest.h>

#include <filesystem>
#include <fstream>

namespace {

using plumb::test::run;

const std::string corpus = PLUMB_CORPUS_DIR;
const std::string blend = corpus + "/summer-blend.mps";
const std::string data = std::string(PLUMB_TEST_DATA_DIR) + "/audit/";

struct TempPath {
  std::string path;
  explicit TempPath(const std::string& name) : path((std::filesystem::temp_directory_path() / name).string()) {}
  ~TempPath() { std::filesystem::remove(path); }
  void write(const std::string& text) const { std::ofstream(path) << text; }
  std::string read() const {
    std::ifstream in(path);
    return {std::istreambuf_iterator<char>(in), std::istreambuf_iterator<char>()};
  }
};

bool has(const std::string& text, const std::string& part) { return text.find(part) != std::string::npos; }

// The demo plan: rounding pushes the vapour-pressure sum 0.00056 psi-bbl over its cap of 108 000
// (52*340.0844 + 11.5*4000 + 3.2*5000 + 4.6*1459.9156 + 18*1200 = 108000.00056, by hand).
TEST(AuditCommand, DemoPlanCrossesAHardCapWithinTolerance) {
  auto r = run(PLUMB_EXECUTABLE, {"audit", blend, corpus + "/summer-blend.plan.txt", "--claimed-objective", "920575.527426"});
  EXPECT_EQ(r.status, 5) << r.err << r.out;
  EXPECT_TRUE(has(r.out, "NOT FEASIBLE exactly: 1 side or bound is missed, each within the tolerance 1e-6")) << r.out;
  EXPECT_TRUE(has(r.out, "hard limits crossed, however little: RVP")) << r.out;
  EXPECT_TRUE(has(r.out, "row RVP (<=)")) << r.out;
  EXPECT_TRUE(has(r.out, "7/12500 (0.00056) psi-bbl")) << r.out;
  EXPECT_TRUE(has(r.out, "218176400/237")) << r.out;  // the exact optimum
  EXPECT_TRUE(has(r.out, "caution")) << r.out;
}

TEST(AuditCommand, ExactOptimumExitsZero) {
  TempPath plan("plumb-audit-exact-plan.csv");
  plan.write("name,value\nBUT,80600/237\nLSR,4000\nREF,5000\nALK,346000/237\nETH,1200\n");
  auto r = run(PLUMB_EXECUTABLE, {"audit", blend, plan.path, "--gap", "0"});
  EXPECT_EQ(r.status, 0) << r.err << r.out;
  EXPECT_TRUE(has(r.out, "FEASIBLE exactly")) << r.out;
  EXPECT_TRUE(has(r.out, "nothing: the plan is an exact optimum")) << r.out;
}

// A feasible plan that buys 100 bbl less naphtha and 100 more alkylate (by hand: still meets every
// limit, 34 USD dearer a barrel moved, 3 400 USD in all, minus what the vapour-pressure room gives).
TEST(AuditCommand, FeasibleButOutsideTheGapExitsSix) {
  TempPath plan("plumb-audit-dear-plan.csv");
  plan.write("BUT,300\nLSR,3900\nREF,5000\nALK,1600\nETH,1200\n");
  auto inside = run(PLUMB_EXECUTABLE, {"audit", blend, plan.path});
  EXPECT_EQ(inside.status, 0) << inside.err << inside.out;
  auto r = run(PLUMB_EXECUTABLE, {"audit", blend, plan.path, "--gap", "1e-6", "--json"});
  EXPECT_EQ(r.status, 6) << r.err << r.out;
  EXPECT_TRUE(has(r.out, "\"gap_verdict\": \"outside\"")) << r.out;
}

TEST(AuditCommand, RepairedPlanIsTheExactOptimumAndAuditsClean) {
  TempPath repaired("plumb-audit-repaired.csv");
  auto r = run(PLUMB_EXECUTABLE, {"audit", blend, corpus + "/summer-blend.plan.txt", "--repaired", repaired.path});
  EXPECT_EQ(r.status, 5) << r.err;
  EXPECT_TRUE(has(r.out, "written to " + repaired.path)) << r.out;
  std::string text = repaired.read();
  EXPECT_TRUE(has(text, "BUT,80600/237,~340.08438818565401")) << text;
  auto again = run(PLUMB_EXECUTABLE, {"audit", blend, repaired.path, "--gap", "0"});
  EXPECT_EQ(again.status, 0) << again.err << again.out;
}

TEST(AuditCommand, BadPlanExitsOneWithALocatedMessage) {
  TempPath plan("plumb-audit-bad-plan.csv");
  plan.write("BUT,1\nBUTANE,2\n");
  auto r = run(PLUMB_EXECUTABLE, {"audit", blend, plan.path});
  EXPECT_EQ(r.status, 1);
  EXPECT_TRUE(has(r.err, plan.path + ":2:1: found 1 unknown column: 'BUTANE'")) << r.err;
  auto tolerance = run(PLUMB_EXECUTABLE, {"audit", blend, corpus + "/summer-blend.plan.txt", "--tolerance", "-1"});
  EXPECT_EQ(tolerance.status, 1);
}

TEST(AuditCommand, DualsGiveASafeBound) {
  TempPath duals("plumb-audit-duals.csv");
  // Rounded duals of the blend (from plumb solve, rounded by hand to 3 digits): a bound, never above.
  duals.write("BATCH,72.4\nRVP,-0.633\n");
  auto r = run(PLUMB_EXECUTABLE, {"audit", blend, corpus + "/summer-blend.plan.txt", "--duals", duals.path, "--json"});
  EXPECT_EQ(r.status, 5) << r.err;
  EXPECT_TRUE(has(r.out, "\"dual_bound\"")) << r.out;
}

// A maximisation stated only in a comment: every command warns, none changes the sense by itself,
// and --objective-sense max gives the maximum (11, by hand) instead of the minimum (0).
TEST(AuditCommand, SenseOnlyInAComment) {
  std::string model = data + "sense-in-comment.mps";
  auto inspect = run(PLUMB_EXECUTABLE, {"inspect", model});
  EXPECT_EQ(inspect.status, 0);
  auto attention = inspect.out.find("Attention");
  ASSERT_NE(attention, std::string::npos) << inspect.out;
  EXPECT_NE(inspect.out.find("objective sense: line 1 is a comment saying the objective is maximised", attention),
            std::string::npos)
      << inspect.out;
  EXPECT_TRUE(has(inspect.out, "plumb reads it as minimised")) << inspect.out;

  auto solve = run(PLUMB_EXECUTABLE, {"solve", model});
  EXPECT_EQ(solve.status, 0);
  EXPECT_TRUE(has(solve.err, "warning: " + model + ": line 1 is a comment saying the objective is maximised")) << solve.err;
  EXPECT_TRUE(has(solve.out, "objective  0, minimised")) << solve.out;

  auto maximised = run(PLUMB_EXECUTABLE, {"solve", model, "--objective-sense", "max"});
  EXPECT_EQ(maximised.status, 0);
  EXPECT_TRUE(has(maximised.out, "objective  11, maximised")) << maximised.out;
  EXPECT_FALSE(has(maximised.err, "warning")) << maximised.err;  // the option agrees with the comment

  auto audit = run(PLUMB_EXECUTABLE, {"audit", model, data + "sense-in-comment.plan.csv"});
  EXPECT_TRUE(has(audit.err, "line 1 is a comment saying the objective is maximised")) << audit.err;
  EXPECT_TRUE(has(audit.out, "gap      11 (1.1e+1 relative)")) << audit.out;  // against the minimum 0
  auto audit_max = run(PLUMB_EXECUTABLE, {"audit", model, data + "sense-in-comment.plan.csv", "--objective-sense", "max"});
  EXPECT_EQ(audit_max.status, 0) << audit_max.out;
  EXPECT_TRUE(has(audit_max.out, "nothing: the plan is an exact optimum")) << audit_max.out;

  auto inspect_max = run(PLUMB_EXECUTABLE, {"inspect", model, "--objective-sense", "max"});
  EXPECT_TRUE(has(inspect_max.out, "maximise")) << inspect_max.out;
}

}  // namespace
