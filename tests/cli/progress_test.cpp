// The live progress line of plumb solve (issue: phase, iterations, objective, infeasibility,
// elapsed; only when stderr is a terminal; --quiet silences it).  stderr is given a pseudo-
// terminal here; the model is the invented summer blend of corpus/.
#include "support/run.hpp"

#include <gtest/gtest.h>

#include <poll.h>
#include <pty.h>

namespace {

struct TerminalRun {
  int status = -1;
  std::string terminal;  // what plumb wrote to stderr, a terminal
};

TerminalRun solve_on_terminal(std::vector<std::string> args) {
  TerminalRun run;
  int master = -1, slave = -1;
  if (openpty(&master, &slave, nullptr, nullptr, nullptr) != 0) return run;
  posix_spawn_file_actions_t actions;
  posix_spawn_file_actions_init(&actions);
  posix_spawn_file_actions_addopen(&actions, 0, "/dev/null", O_RDONLY, 0);
  posix_spawn_file_actions_addopen(&actions, 1, "/dev/null", O_WRONLY, 0);
  posix_spawn_file_actions_adddup2(&actions, slave, 2);
  posix_spawn_file_actions_addclose(&actions, master);
  args.insert(args.begin(), {PLUMB_EXECUTABLE, "solve"});
  std::vector<char*> argv;
  for (auto& arg : args) argv.push_back(arg.data());
  argv.push_back(nullptr);
  pid_t pid = 0;
  int spawned = posix_spawn(&pid, PLUMB_EXECUTABLE, &actions, nullptr, argv.data(), environ);
  posix_spawn_file_actions_destroy(&actions);
  close(slave);
  if (spawned != 0) {
    close(master);
    return run;
  }
  // Read until the child has closed the terminal (read fails with EIO) or 60 s have passed.
  auto deadline = std::chrono::steady_clock::now() + std::chrono::seconds(60);
  char chunk[4096];
  while (std::chrono::steady_clock::now() < deadline) {
    pollfd ready{master, POLLIN, 0};
    if (poll(&ready, 1, 100) <= 0) continue;
    ssize_t got = read(master, chunk, sizeof chunk);
    if (got <= 0) break;
    run.terminal.append(chunk, static_cast<std::size_t>(got));
  }
  close(master);
  int wait_status = 0;
  waitpid(pid, &wait_status, 0);
  run.status = WIFEXITED(wait_status) ? WEXITSTATUS(wait_status) : -1;
  return run;
}

const std::string model = std::string(PLUMB_CORPUS_DIR) + "/summer-blend.mps";

TEST(SolveProgress, DrawnOnATerminalAndClearedBeforeTheResult) {
  TerminalRun run = solve_on_terminal({model});
  EXPECT_EQ(run.status, 0);
  // Each drawing starts by returning to the line's start and clearing it; the last one clears it.
  ASSERT_NE(run.terminal.find("\r\033[K  exact certify"), std::string::npos) << run.terminal;
  EXPECT_NE(run.terminal.find(" it "), std::string::npos) << run.terminal;
  EXPECT_NE(run.terminal.find(" s"), std::string::npos) << run.terminal;
  EXPECT_TRUE(run.terminal.ends_with("\r\033[K")) << run.terminal;
}

TEST(SolveProgress, QuietDrawsNothing) {
  TerminalRun run = solve_on_terminal({model, "--quiet"});
  EXPECT_EQ(run.status, 0);
  EXPECT_EQ(run.terminal, "");
}

TEST(SolveProgress, NothingWhenStderrIsNotATerminal) {
  auto run = plumb::test::run(PLUMB_EXECUTABLE, {"solve", model});
  EXPECT_EQ(run.status, 0);
  EXPECT_EQ(run.err, "");
}

}  // namespace
