// The plumb driver end to end: help, version, refusals.  Source: common practice for command-line
// tools (help and version exit 0; a usage error exits non-zero with a message on stderr), and the
// exit statuses of src/cli/command.hpp.
#include "support/run.hpp"

#include <gtest/gtest.h>

using plumb::test::lines_of;
using plumb::test::run;

TEST(Cli, HelpAndVersionExitZero) {
  auto help = run(PLUMB_EXECUTABLE, {"--help"});
  EXPECT_EQ(help.status, 0);
  EXPECT_NE(help.out.find("inspect"), std::string::npos);
  auto version = run(PLUMB_EXECUTABLE, {"--version"});
  EXPECT_EQ(version.status, 0);
  EXPECT_NE(version.out.find("plumb " PLUMB_VERSION), std::string::npos);
  auto inspect_help = run(PLUMB_EXECUTABLE, {"inspect", "--help"});
  EXPECT_EQ(inspect_help.status, 0);
  EXPECT_NE(inspect_help.out.find("--json"), std::string::npos);
  EXPECT_NE(inspect_help.out.find("--labels"), std::string::npos);
}

TEST(Cli, UnknownSubcommandOrOptionExitsOne) {
  for (const auto& args : std::vector<std::vector<std::string>>{
           {"frobnicate"}, {"inspect", "--no-such-option", "x.mps"}, {"--no-such-option"}, {}, {"inspect"}}) {
    auto result = run(PLUMB_EXECUTABLE, args);
    std::string shown = args.empty() ? "(no arguments)" : args[0] + (args.size() > 1 ? " " + args[1] : "");
    EXPECT_EQ(result.status, 1) << shown;
    EXPECT_FALSE(result.err.empty()) << shown;
  }
}

TEST(Cli, MissingFileExitsOneWithOneLine) {
  const std::string path = "/nonexistent-folder/no-such-model.mps";
  auto result = run(PLUMB_EXECUTABLE, {"inspect", path});
  EXPECT_EQ(result.status, 1);
  EXPECT_TRUE(result.out.empty());
  auto lines = lines_of(result.err);
  ASSERT_EQ(lines.size(), 1u) << result.err;
  EXPECT_NE(lines[0].find(path), std::string::npos);
  EXPECT_NE(lines[0].find("expected"), std::string::npos);
}
