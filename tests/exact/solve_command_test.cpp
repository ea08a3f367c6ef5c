// plumb solve end to end: exit statuses, what reaches stdout, certificates written and checked.
#include "support/run.hpp"

#include <gtest/gtest.h>
#include <nlohmann/json.hpp>

#include <cstdio>
#include <filesystem>
#include <fstream>
#include <sstream>
#include <string>
#include <sys/wait.h>
#include <unistd.h>

namespace {

namespace fs = std::filesystem;

struct Outcome {
  int exit_status;
  std::string stdout_text;
};

// Runs `plumb ARGUMENTS` from the project root, stderr discarded.
Outcome plumb(const std::string& arguments) {
  std::string line = "cd '" + (fs::path(PLUMB_TEST_DATA_DIR).parent_path().parent_path()).string() + "' && '" +
                     PLUMB_EXECUTABLE + "' " + arguments + " 2>/dev/null";
  Outcome run{-1, ""};
  if (FILE* pipe = popen(line.c_str(), "r")) {
    char chunk[4096];
    while (std::size_t got = fread(chunk, 1, sizeof chunk, pipe)) run.stdout_text.append(chunk, got);
    int status = pclose(pipe);
    if (WIFEXITED(status)) run.exit_status = WEXITSTATUS(status);
  }
  return run;
}

std::string slurp(const fs::path& path) {
  std::ifstream in(path, std::ios::binary);
  std::stringstream text;
  text << in.rdbuf();
  return text.str();
}

class SolveCommand : public ::testing::Test {
 protected:
  void SetUp() override {
    folder_ = fs::temp_directory_path() / ("plumb-solve-test-" + std::to_string(::getpid()));
    fs::create_directories(folder_);
  }
  void TearDown() override { fs::remove_all(folder_); }
  std::string scratch(const std::string& name) const { return (folder_ / name).string(); }
  fs::path folder_;
};

// corpus/README.md works the batch by hand: 218176400/237 USD, about 340.08 bbl butane.
TEST_F(SolveCommand, OptimalPrintsExactObjectiveLabelsAndWritesACheckedCertificate) {
  std::string certificate = scratch("blend.json");
  Outcome run = plumb("solve corpus/summer-blend.mps --quiet --certificate '" + certificate + "'");
  EXPECT_EQ(run.exit_status, 0);
  EXPECT_NE(run.stdout_text.find("218176400/237"), std::string::npos) << run.stdout_text;
  EXPECT_NE(run.stdout_text.find("normal butane from the storage sphere"), std::string::npos) << run.stdout_text;
  EXPECT_NE(run.stdout_text.find("bbl"), std::string::npos);
  EXPECT_NE(run.stdout_text.find("qualified people under local codes"), std::string::npos);
  EXPECT_EQ(plumb("check corpus/summer-blend.mps '" + certificate + "'").exit_status, 0);
}

TEST_F(SolveCommand, SameInputGivesByteIdenticalCertificates) {
  std::string first = scratch("one.json"), second = scratch("two.json"), exact = scratch("exact.json");
  plumb("solve corpus/summer-blend.mps --quiet --certificate '" + first + "'");
  plumb("solve corpus/summer-blend.mps --quiet --certificate '" + second + "'");
  plumb("solve corpus/summer-blend.mps --quiet --method exact --certificate '" + exact + "'");
  EXPECT_FALSE(slurp(first).empty());
  EXPECT_EQ(slurp(first), slurp(second));
  // The final basis may differ between the routes; what the certificate proves may not.
  auto proof = [](std::string text) {
    auto json = nlohmann::ordered_json::parse(text);
    json.erase("basis");
    return json.dump();
  };
  EXPECT_EQ(proof(slurp(first)), proof(slurp(exact)));
}

// The objective's decimal in solve's text is the one the checker's sentence shows.
TEST_F(SolveCommand, ObjectiveAndCheckerSentenceShowTheSameDecimal) {
  Outcome run = plumb("solve corpus/summer-blend.mps --quiet");
  const std::string shown = "218176400/237 (~920575.527426)";
  EXPECT_NE(run.stdout_text.find("objective  " + shown), std::string::npos) << run.stdout_text;
  EXPECT_NE(run.stdout_text.find("checked    optimal: objective " + shown), std::string::npos) << run.stdout_text;
}

// 1/7^40 has a 36-character fraction: text shows it rounded, --json and the certificate in full.
TEST_F(SolveCommand, FractionsTooLongToReadAreRoundedInTextOnly) {
  const std::string full = "1/6366805760909027985741435139224001";
  std::string certificate = scratch("long.json");
  Outcome text = plumb("solve tests/data/solve/long-fraction.plumb --quiet --certificate '" + certificate + "'");
  EXPECT_EQ(text.exit_status, 0);
  EXPECT_EQ(text.stdout_text.find(full), std::string::npos) << text.stdout_text;
  // 1 and 6366805760909027985741435139224001: 35 digits in all.
  EXPECT_NE(text.stdout_text.find("objective  ~1.57064631395e-34 (a fraction of 35 digits), minimised"),
            std::string::npos)
      << text.stdout_text;
  EXPECT_NE(slurp(certificate).find(full), std::string::npos);
  Outcome json = plumb("solve tests/data/solve/long-fraction.plumb --quiet --json");
  EXPECT_NE(json.stdout_text.find("\"fraction\": \"" + full + "\""), std::string::npos) << json.stdout_text;
}

// The certificate carries the final basis under "basis", which the checker ignores; Chvatal
// (1983, ch. 2): x1, x3 and the slack of c2 are basic at the optimum.
TEST_F(SolveCommand, CertificateCarriesTheFinalBasis) {
  std::string certificate = scratch("chvatal.json");
  EXPECT_EQ(plumb("solve tests/data/check/chvatal-2.1.mps --quiet --certificate '" + certificate + "'").exit_status, 0);
  auto json = nlohmann::ordered_json::parse(slurp(certificate));
  EXPECT_EQ(json["basis"].dump(), R"({"columns":{"x1":"basic","x3":"basic"},"rows":{"c2":"basic"}})");
  EXPECT_EQ(plumb("check tests/data/check/chvatal-2.1.mps '" + certificate + "'").exit_status, 0);
}

TEST_F(SolveCommand, WrittenBasisStartsTheSameSolveWithoutPivots) {
  std::string basis = scratch("blend.basis.json"), cold = scratch("cold.json"), warm = scratch("warm.json");
  EXPECT_EQ(plumb("solve corpus/summer-blend.mps --quiet --write-basis '" + basis + "' --certificate '" + cold + "'")
                .exit_status,
            0);
  Outcome run = plumb("solve corpus/summer-blend.mps --quiet --json --from-basis '" + basis + "' --certificate '" +
                      warm + "'");
  EXPECT_EQ(run.exit_status, 0);
  auto stats = nlohmann::ordered_json::parse(run.stdout_text)["stats"];
  EXPECT_EQ(stats["exact_iterations"], 0) << stats.dump();
  EXPECT_EQ(stats["float_iterations"], 0) << stats.dump();
  EXPECT_EQ(stats["repaired"], false) << stats.dump();
  EXPECT_EQ(slurp(cold), slurp(warm));
  EXPECT_EQ(plumb("solve corpus/summer-blend.mps --quiet --write-basis '" + basis + "'").exit_status, 0);
  EXPECT_EQ(slurp(basis).rfind("{\n  \"plumb_basis\": 1,\n", 0), 0u) << slurp(basis);
}

TEST_F(SolveCommand, StartBasisFromTheOptimumIsCertifiedAsIs) {
  Outcome run = plumb("solve tests/data/check/chvatal-2.1.mps --quiet --json --from-basis "
                      "tests/data/solve/chvatal-2.1.optimal.basis.json");
  EXPECT_EQ(run.exit_status, 0);
  auto json = nlohmann::ordered_json::parse(run.stdout_text);
  EXPECT_EQ(json["objective"]["fraction"], "13");
  EXPECT_EQ(json["stats"]["exact_iterations"], 0);
}

TEST_F(SolveCommand, StartBasisWithTooFewBasicVariablesIsRepairedWithAWarning) {
  const std::string data = PLUMB_TEST_DATA_DIR;
  auto run = plumb::test::run(PLUMB_EXECUTABLE, {"solve", data + "/check/chvatal-2.1.mps", "--quiet", "--from-basis",
                                                 data + "/solve/chvatal-2.1.one-basic.basis.json"});
  EXPECT_EQ(run.status, 0) << run.err;
  EXPECT_NE(run.out.find("objective  13"), std::string::npos) << run.out;
  auto lines = plumb::test::lines_of(run.err);
  ASSERT_EQ(lines.size(), 1u) << run.err;
  EXPECT_NE(lines[0].find("one-basic.basis.json makes 1 variables basic, but a basis of this model has 3"),
            std::string::npos)
      << lines[0];
}

TEST_F(SolveCommand, StartBasisSavedForAnotherFileIsUsedWithAWarning) {
  const std::string data = PLUMB_TEST_DATA_DIR;
  auto run = plumb::test::run(PLUMB_EXECUTABLE, {"solve", data + "/check/chvatal-2.1.mps", "--quiet", "--json",
                                                 "--from-basis", data + "/solve/chvatal-2.1.other-file.basis.json"});
  EXPECT_EQ(run.status, 0) << run.err;
  EXPECT_EQ(nlohmann::ordered_json::parse(run.out)["stats"]["exact_iterations"], 0);
  auto lines = plumb::test::lines_of(run.err);
  ASSERT_EQ(lines.size(), 1u) << run.err;
  EXPECT_NE(lines[0].find("other-file.basis.json was saved for another model file (sha256 abababababababab..., this "
                          "one is d7718d3307b3d441...)"),
            std::string::npos)
      << lines[0];
}

// JSON figures of the run (docs/solving.md), which the benchmark reads.
TEST_F(SolveCommand, JsonCarriesTheRunFigures) {
  auto json = nlohmann::ordered_json::parse(plumb("solve corpus/summer-blend.mps --quiet --json").stdout_text);
  for (const char* key :
       {"float_seconds", "certify_seconds", "exact_seconds", "solve_seconds", "float_iterations",
        "exact_iterations", "repaired", "fell_back", "zero_cost_search", "peak_memory_mib"})
    EXPECT_TRUE(json["stats"].contains(key)) << key;
  EXPECT_GT(json["stats"]["peak_memory_mib"].get<double>(), 0);
}

// corpus/README.md: the tight batch is infeasible on purpose.
TEST_F(SolveCommand, InfeasibleExitsTenWithAFarkasCertificate) {
  std::string certificate = scratch("tight.json");
  Outcome run = plumb("solve corpus/summer-blend-tight.plumb --quiet --certificate '" + certificate + "'");
  EXPECT_EQ(run.exit_status, 10);
  EXPECT_NE(run.stdout_text.find("infeasible"), std::string::npos) << run.stdout_text;
  EXPECT_EQ(plumb("check corpus/summer-blend-tight.plumb '" + certificate + "'").exit_status, 0);
}

TEST_F(SolveCommand, UnboundedExitsEleven) {
  std::string certificate = scratch("open.json");
  EXPECT_EQ(plumb("solve tests/data/solve/unbounded.mps --quiet --certificate '" + certificate + "'").exit_status, 11);
  EXPECT_EQ(plumb("check tests/data/solve/unbounded.mps '" + certificate + "'").exit_status, 0);
}

TEST_F(SolveCommand, IntegerMarkersAreNamedAndTheRelaxationSolved) {
  Outcome run = plumb("solve tests/data/solve/integer.mps --quiet");
  EXPECT_EQ(run.exit_status, 0);
  EXPECT_NE(run.stdout_text.find("LP relaxation"), std::string::npos) << run.stdout_text;
  EXPECT_NE(run.stdout_text.find("objective  13"), std::string::npos) << run.stdout_text;
}

TEST_F(SolveCommand, JsonResult) {
  Outcome run = plumb("solve corpus/summer-blend.mps --quiet --json");
  EXPECT_EQ(run.exit_status, 0);
  EXPECT_NE(run.stdout_text.find("\"status\": \"optimal\""), std::string::npos) << run.stdout_text;
  EXPECT_NE(run.stdout_text.find("\"fraction\": \"218176400/237\""), std::string::npos) << run.stdout_text;
  EXPECT_NE(run.stdout_text.find("\"checked\": true"), std::string::npos);
}

TEST_F(SolveCommand, LimitStopsWithExitThreeAndNoCertificate) {
  std::string certificate = scratch("none.json");
  EXPECT_EQ(plumb("solve corpus/summer-blend.mps --quiet --time-limit 1e-9 --certificate '" + certificate + "'").exit_status, 3);
  EXPECT_FALSE(fs::exists(certificate));
}

TEST_F(SolveCommand, StoppedJsonSaysWhyAndGivesTheFiguresSoFar) {
  Outcome run = plumb("solve corpus/summer-blend.mps --quiet --json --time-limit 1e-9");
  EXPECT_EQ(run.exit_status, 3);
  auto json = nlohmann::ordered_json::parse(run.stdout_text);
  EXPECT_EQ(json["status"], "stopped");
  EXPECT_EQ(json["stopped_because"], "time limit reached");
  EXPECT_EQ(json["checked"], false);
  EXPECT_FALSE(json.contains("x"));
  EXPECT_TRUE(json["stats"].contains("float_iterations"));
}

TEST_F(SolveCommand, BadInputOrUsageExitsOne) {
  EXPECT_EQ(plumb("solve no-such-model.mps").exit_status, 1);
  EXPECT_EQ(plumb("solve corpus/summer-blend.mps --method guess").exit_status, 1);
  EXPECT_EQ(plumb("solve").exit_status, 1);
}

// A crossed row (tests/data/solve/crossed-row.plumb, invented) is an infeasible model with a
// certificate: its two limits, each with multiplier 1, which plumb check accepts.
TEST_F(SolveCommand, CrossedRowIsProvenInfeasibleByItsTwoLimits) {
  const std::string data = PLUMB_TEST_DATA_DIR;
  std::string certificate =
      (std::filesystem::path(PLUMB_BUILD_DIR) / "crossed-row.certificate.json").string();
  auto run = plumb::test::run(PLUMB_EXECUTABLE,
                              {"solve", data + "/solve/crossed-row.plumb", "--certificate", certificate});
  EXPECT_EQ(run.status, 10) << run.out << run.err;
  EXPECT_NE(run.out.find("row window, lower side  x 1"), std::string::npos) << run.out;
  EXPECT_NE(run.out.find("add up to 0 >= 5"), std::string::npos) << run.out;
  auto check = plumb::test::run(
      PLUMB_EXECUTABLE, {"check", data + "/solve/crossed-row.plumb", certificate, "--expect", "infeasible"});
  EXPECT_EQ(check.status, 0) << check.out << check.err;
}

}  // namespace
