// plumb explain end to end on the corpus's tight blend (invented data; its header works the
// conflict out by hand) and on the feasible demo: exit statuses, the members in the owner's words,
// the JSON keys, and the certificate accepted by `plumb check --expect infeasible_subsystem`.
#include "support/run.hpp"

#include <gtest/gtest.h>
#include <nlohmann/json.hpp>

#include <cstdio>
#include <filesystem>
#include <fstream>
#include <iterator>
#include <string>

namespace {

namespace fs = std::filesystem;

const std::string corpus = PLUMB_CORPUS_DIR;

bool has(const std::string& text, const std::string& part) { return text.find(part) != std::string::npos; }

TEST(ExplainCommand, TightBlendNamesTheSoftRequirementsAndIsChecked) {
  fs::path certificate = fs::path(PLUMB_BUILD_DIR) / "explain-tight.certificate.json";
  fs::remove(certificate);
  auto run = plumb::test::run(PLUMB_EXECUTABLE, {"explain", corpus + "/summer-blend-tight.plumb",
                                                 "--certificate", certificate.string()});
  ASSERT_EQ(run.status, 10) << run.err;
  EXPECT_TRUE(has(run.out, "the batch is exactly 12 000 barrels")) << run.out;
  EXPECT_TRUE(has(run.out, "the pipeline nomination for today is 5 000 bbl")) << run.out;
  EXPECT_TRUE(has(run.out, "the supplier can deliver at most 3 000 bbl today")) << run.out;
  EXPECT_TRUE(has(run.out, "the lower side of row batch (an equation)")) << run.out;
  EXPECT_TRUE(has(run.out, "reformate <= 5000 bbl")) << run.out;
  EXPECT_TRUE(has(run.out, "the summer vapour pressure of the blend is at most 6.5 psi")) << run.out;
  EXPECT_TRUE(has(run.out, "caution")) << run.out;
  auto check = plumb::test::run(PLUMB_EXECUTABLE, {"check", corpus + "/summer-blend-tight.plumb",
                                                   certificate.string(), "--expect", "infeasible_subsystem"});
  EXPECT_EQ(check.status, 0) << check.out << check.err;
}

TEST(ExplainCommand, JsonListsMembersWithSidesValuesAndFigures) {
  auto run = plumb::test::run(PLUMB_EXECUTABLE, {"explain", corpus + "/summer-blend-tight.plumb", "--json"});
  ASSERT_EQ(run.status, 10) << run.err;
  auto json = nlohmann::json::parse(run.out);
  EXPECT_EQ(json["status"], "infeasible_subsystem");
  ASSERT_EQ(json["members"].size(), 3u);
  EXPECT_EQ(json["members"][0]["name"], "batch");
  EXPECT_EQ(json["members"][0]["side"], "lower");
  EXPECT_EQ(json["members"][0]["value"]["fraction"], "12000");
  EXPECT_EQ(json["members"][0]["hard"], false);
  EXPECT_EQ(json["sizes"]["row_sides"], 1);
  EXPECT_EQ(json["sizes"]["bounds"], 2);
  EXPECT_GE(json["search"]["sub_solves"].get<long>(), 4);
  EXPECT_GE(json["search"]["orders"].size(), 1u);  // one when the first support is irreducible already
  EXPECT_EQ(json["checked"], true);
}

TEST(ExplainCommand, ByGroupNamesTheContractGroup) {
  auto run = plumb::test::run(PLUMB_EXECUTABLE,
                              {"explain", corpus + "/summer-blend-tight.plumb", "--by-group", "--json"});
  ASSERT_EQ(run.status, 10) << run.err;
  auto json = nlohmann::json::parse(run.out);
  EXPECT_EQ(json["groups"], nlohmann::json::array({"contract"}));
}

TEST(ExplainCommand, FeasibleModelSaysSoWithAFeasibleCertificate) {
  fs::path certificate = fs::path(PLUMB_BUILD_DIR) / "explain-feasible.certificate.json";
  auto run = plumb::test::run(
      PLUMB_EXECUTABLE, {"explain", corpus + "/summer-blend.plumb", "--certificate", certificate.string()});
  ASSERT_EQ(run.status, 0) << run.err;
  EXPECT_TRUE(has(run.out, "feasible")) << run.out;
  auto check =
      plumb::test::run(PLUMB_EXECUTABLE, {"check", corpus + "/summer-blend.plumb", certificate.string()});
  EXPECT_EQ(check.status, 0) << check.out << check.err;
  EXPECT_TRUE(has(check.out, "feasible")) << check.out;
}

TEST(ExplainCommand, ExhaustedTimeLimitExitsThree) {
  auto run = plumb::test::run(PLUMB_EXECUTABLE,
                              {"explain", corpus + "/summer-blend-tight.plumb", "--time-limit", "1e-9"});
  EXPECT_EQ(run.status, 3) << run.out << run.err;
  EXPECT_TRUE(has(run.err, "stopped")) << run.err;
  EXPECT_TRUE(run.out.empty());
}

}  // namespace

namespace {

// The README shows the demo's explanation from the conflict to the ways out; it must be the real
// output, every exact way out included (worked by hand in ways_out_test.cpp).
TEST(ExplainCommand, ReadmeShowsTheRealExplanation) {
  auto run = plumb::test::run(PLUMB_EXECUTABLE, {"explain", corpus + "/summer-blend-tight.plumb"});
  ASSERT_EQ(run.status, 10) << run.err;
  std::ifstream file(fs::path(corpus).parent_path() / "README.md");
  std::string readme((std::istreambuf_iterator<char>(file)), std::istreambuf_iterator<char>());
  auto start = readme.find("These requirements cannot all hold together:");
  ASSERT_NE(start, std::string::npos);
  auto end = readme.find("```", start);
  std::string shown = readme.substr(start, end - start);
  EXPECT_TRUE(has(run.out, shown)) << "README block:\n" << shown << "\nactual output:\n" << run.out;
  EXPECT_TRUE(has(shown, "raise it from 5000 to at least ~5674.6988 bbl")) << shown;
  EXPECT_TRUE(has(shown, "0 >= 112000, which is false")) << shown;
}

}  // namespace
