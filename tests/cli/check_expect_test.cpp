// plumb check --expect STATUS end to end: a valid certificate of the demanded status exits 0, a
// valid one of another status exits 5 with one sentence saying both, an invalid one still exits 4.
// Models: Chvatal, Linear Programming (1983), ch. 2 (optimum 13), and the corpus's tight blend,
// infeasible by its own hand working (corpus/summer-blend-tight.plumb).
#include "support/run.hpp"

#include <gtest/gtest.h>

#include <filesystem>

namespace {

namespace fs = std::filesystem;
using plumb::test::run;

const std::string check_data = std::string(PLUMB_TEST_DATA_DIR) + "/check/";
const std::string chvatal = check_data + "chvatal-2.1.mps";
const std::string chvatal_optimal = check_data + "chvatal-2.1.optimal.json";

TEST(CheckExpect, TheDemandedStatusExitsZero) {
  auto result = run(PLUMB_EXECUTABLE, {"check", "--expect", "optimal", chvatal, chvatal_optimal});
  EXPECT_EQ(result.status, 0) << result.err;
  EXPECT_EQ(result.out.rfind("valid: optimal: objective 13", 0), 0u) << result.out;
}

TEST(CheckExpect, AValidCertificateOfAnotherStatusExitsFive) {
  for (const char* expected : {"infeasible", "unbounded"}) {
    SCOPED_TRACE(expected);
    auto result = run(PLUMB_EXECUTABLE, {"check", "--expect", expected, chvatal, chvatal_optimal});
    EXPECT_EQ(result.status, 5) << result.err;
    EXPECT_EQ(result.out.rfind(std::string("not the expected status: ") + expected +
                                   " was expected, but this valid certificate proves optimal: objective 13",
                               0),
              0u)
        << result.out;
  }
  auto json = run(PLUMB_EXECUTABLE, {"check", "--json", "--expect", "infeasible", chvatal, chvatal_optimal});
  EXPECT_EQ(json.status, 5);
  EXPECT_NE(json.out.find("\"valid\": true"), std::string::npos) << json.out;
  EXPECT_NE(json.out.find("\"expected\": \"infeasible\""), std::string::npos) << json.out;
  EXPECT_NE(json.out.find("\"as_expected\": false"), std::string::npos) << json.out;
}

TEST(CheckExpect, AnInfeasibilityProofWhereOptimalityWasDemanded) {
  const fs::path certificate = fs::temp_directory_path() / ("plumb-expect-" + std::to_string(getpid()) + ".json");
  const std::string model = std::string(PLUMB_CORPUS_DIR) + "/summer-blend-tight.plumb";
  auto solved = run(PLUMB_EXECUTABLE, {"solve", "--quiet", model, "--certificate", certificate.string()});
  ASSERT_EQ(solved.status, 10) << solved.err;
  auto demanded = run(PLUMB_EXECUTABLE, {"check", "--expect", "optimal", model, certificate.string()});
  EXPECT_EQ(demanded.status, 5) << demanded.err;
  EXPECT_NE(demanded.out.find("optimal was expected, but this valid certificate proves infeasible"), std::string::npos)
      << demanded.out;
  EXPECT_EQ(run(PLUMB_EXECUTABLE, {"check", "--expect", "infeasible", model, certificate.string()}).status, 0);
  fs::remove(certificate);
}

TEST(CheckExpect, AnInvalidCertificateStaysInvalidAndABadStatusIsAUsageError) {
  auto invalid = run(PLUMB_EXECUTABLE, {"check", "--expect", "infeasible", chvatal,
                                        check_data + "chvatal-2.1.wrong-objective.json"});
  EXPECT_EQ(invalid.status, 4);
  EXPECT_EQ(invalid.out.rfind("invalid optimal certificate: ", 0), 0u) << invalid.out;
  auto unknown = run(PLUMB_EXECUTABLE, {"check", "--expect", "feasible-ish", chvatal, chvatal_optimal});
  EXPECT_EQ(unknown.status, 1);
  EXPECT_NE(unknown.err.find("--expect"), std::string::npos) << unknown.err;
}

}  // namespace
