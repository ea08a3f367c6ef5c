// plumb check end to end: exit statuses and what reaches stdout, on MPS files with hand-made certificates.
#include <gtest/gtest.h>

#include <cstdio>
#include <string>
#include <sys/wait.h>

namespace {

struct CommandResult {
  int status;
  std::string out;
};

CommandResult plumb_check(const std::string& arguments) {
  std::string command = "cd '";
  for (const std::string& part : {std::string(PLUMB_TEST_DATA_DIR), std::string("/check' && '"),
                                  std::string(PLUMB_EXECUTABLE), std::string("' check "), arguments,
                                  std::string(" 2>/dev/null")})
    command += part;
  FILE* pipe = popen(command.c_str(), "r");
  if (!pipe) return {-1, ""};
  std::string out;
  char buffer[4096];
  while (std::size_t n = fread(buffer, 1, sizeof buffer, pipe)) out.append(buffer, n);
  int status = pclose(pipe);
  return {WIFEXITED(status) ? WEXITSTATUS(status) : -1, out};
}

// Chvatal, Linear Programming (1983), chapter 2: optimum 13 at x = (2, 0, 1).
TEST(CheckCommand, ValidCertificateExitsZeroAndSaysWhatItProves) {
  CommandResult run = plumb_check("chvatal-2.1.mps chvatal-2.1.optimal.json");
  EXPECT_EQ(run.status, 0);
  EXPECT_NE(run.out.find("valid: optimal: objective 13 is attained by x"), std::string::npos) << run.out;
  EXPECT_NE(run.out.find("qualified people under local codes"), std::string::npos) << run.out;
}

TEST(CheckCommand, InvalidCertificateExitsFourWithTheFailingCondition) {
  CommandResult run = plumb_check("chvatal-2.1.mps chvatal-2.1.wrong-objective.json");
  EXPECT_EQ(run.status, 4);
  EXPECT_EQ(run.out, "invalid optimal certificate: objective: the certificate states 14, but the objective at x is 13\n");
  run = plumb_check("ranged-free.mps ranged-free.other-model.json");
  EXPECT_EQ(run.status, 4);
  EXPECT_NE(run.out.find("the certificate is for another model"), std::string::npos) << run.out;
}

// The MPS objective-row RHS -5 becomes the constant 5 by default; the certificate states 5 either way.
TEST(CheckCommand, ObjectiveRhsRuleAndJson) {
  EXPECT_EQ(plumb_check("ranged-free.mps ranged-free.optimal.json").status, 0);
  CommandResult run = plumb_check("--json --ignore-objective-rhs ranged-free.mps ranged-free.optimal.json");
  EXPECT_EQ(run.status, 0);
  EXPECT_NE(run.out.find("\"valid\": true"), std::string::npos) << run.out;
  EXPECT_NE(run.out.find("the certificate's constant 5, the model as read has 0"), std::string::npos) << run.out;
}

TEST(CheckCommand, UnreadableInputExitsOne) {
  EXPECT_EQ(plumb_check("chvatal-2.1.mps broken.json").status, 1);
  EXPECT_EQ(plumb_check("chvatal-2.1.mps no-such-certificate.json").status, 1);
  EXPECT_EQ(plumb_check("no-such-model.mps chvatal-2.1.optimal.json").status, 1);
}

}  // namespace
