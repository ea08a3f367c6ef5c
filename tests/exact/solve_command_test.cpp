// plumb solve end to end: exit statuses, what reaches stdout, certificates written and checked.
#include <gtest/gtest.h>

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
  std::string first = scratch("one.json"), second = scratch("two.json");
  plumb("solve corpus/summer-blend.mps --quiet --certificate '" + first + "'");
  plumb("solve corpus/summer-blend.mps --quiet --method exact --certificate '" + second + "'");
  EXPECT_FALSE(slurp(first).empty());
  EXPECT_EQ(slurp(first), slurp(second));
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

TEST_F(SolveCommand, BadInputOrUsageExitsOne) {
  EXPECT_EQ(plumb("solve no-such-model.mps").exit_status, 1);
  EXPECT_EQ(plumb("solve corpus/summer-blend.mps --method guess").exit_status, 1);
  EXPECT_EQ(plumb("solve").exit_status, 1);
}

}  // namespace
