// plumb solve at its limits, end to end: time and memory limits, SIGINT and SIGTERM, inputs too
// large to take, and byte-identical certificates from repeated runs.  Constructed cases on Netlib
// models (the limits do not depend on which model, only that it takes a while to solve).
#include "shared_data.hpp"

#include <gtest/gtest.h>
#include <fcntl.h>
#include <signal.h>
#include <spawn.h>
#include <sys/wait.h>
#include <unistd.h>

#include <chrono>
#include <filesystem>
#include <fstream>
#include <iterator>
#include <optional>
#include <string>
#include <thread>
#include <tuple>
#include <vector>

extern char** environ;

namespace plumb::hardening {
namespace {

namespace fs = std::filesystem;
using namespace std::chrono_literals;

std::string contents(const fs::path& path) {
  std::ifstream in(path, std::ios::binary);
  return {std::istreambuf_iterator<char>(in), std::istreambuf_iterator<char>()};
}

// A running `plumb` with stdout and stderr captured in files of its own folder.
class PlumbProcess {
 public:
  PlumbProcess(const fs::path& folder, std::vector<std::string> arguments)
      : out_(folder / "stdout"), err_(folder / "stderr") {
    static char program[] = PLUMB_EXECUTABLE;
    std::vector<char*> argv{program};
    for (std::string& a : arguments) argv.push_back(a.data());
    argv.push_back(nullptr);
    posix_spawn_file_actions_t actions;
    posix_spawn_file_actions_init(&actions);
    posix_spawn_file_actions_addopen(&actions, 0, "/dev/null", O_RDONLY, 0);
    posix_spawn_file_actions_addopen(&actions, 1, out_.c_str(), O_WRONLY | O_CREAT | O_TRUNC, 0644);
    posix_spawn_file_actions_addopen(&actions, 2, err_.c_str(), O_WRONLY | O_CREAT | O_TRUNC, 0644);
    if (posix_spawn(&pid_, PLUMB_EXECUTABLE, &actions, nullptr, argv.data(), environ) != 0) pid_ = -1;
    posix_spawn_file_actions_destroy(&actions);
  }
  ~PlumbProcess() {
    if (pid_ > 0 && !status_) {
      kill(pid_, SIGKILL);
      waitpid(pid_, nullptr, 0);
    }
  }
  bool started() const { return pid_ > 0; }
  void signal(int number) const { kill(pid_, number); }
  // The exit status, or -1 when it has not ended within `patience` (a hang guard, not a timing)
  // or ended by a signal.
  int wait(std::chrono::seconds patience = 300s) {
    auto give_up = std::chrono::steady_clock::now() + patience;
    while (!status_ && std::chrono::steady_clock::now() < give_up) {
      int status = 0;
      if (waitpid(pid_, &status, WNOHANG) == pid_) status_ = status;
      else std::this_thread::sleep_for(10ms);
    }
    return status_ && WIFEXITED(*status_) ? WEXITSTATUS(*status_) : -1;
  }
  // Waits until the process has a handler for `number` (its SigCgt mask in /proc), so a signal
  // sent then reaches plumb's own handling; false when it ended first or did not within patience.
  bool wait_until_catching(int number, std::chrono::seconds patience = 300s) {
    auto give_up = std::chrono::steady_clock::now() + patience;
    while (std::chrono::steady_clock::now() < give_up) {
      std::ifstream status("/proc/" + std::to_string(pid_) + "/status");
      std::string line;
      while (std::getline(status, line))
        if (line.starts_with("SigCgt:") && (std::stoull(line.substr(7), nullptr, 16) >> (number - 1) & 1)) return true;
      int exit_status = 0;
      if (waitpid(pid_, &exit_status, WNOHANG) == pid_) {
        status_ = exit_status;
        return false;
      }
      std::this_thread::sleep_for(5ms);
    }
    return false;
  }
  std::string stdout_text() const { return contents(out_); }
  std::string stderr_text() const { return contents(err_); }

 private:
  fs::path out_, err_;
  pid_t pid_ = -1;
  std::optional<int> status_;
};

class SolveLimitsBase : public ::testing::Test {
 protected:
  void SetUp() override {
    folder_ = fs::temp_directory_path() / ("plumb-limits-" + std::to_string(getpid()) + "-" +
                                           ::testing::UnitTest::GetInstance()->current_test_info()->name());
    fs::create_directories(folder_);
  }
  void TearDown() override { fs::remove_all(folder_); }
  fs::path certificate() const { return folder_ / "never.certificate.json"; }
  fs::path folder_;
};

using SolveRefusals = SolveLimitsBase;

TEST_F(SolveRefusals, FileOverTwoGibibytesExitsOneWithAMessage) {
  // Constructed case: a sparse file one byte past 2 GiB.
  fs::path huge = folder_ / "huge.mps";
  std::ofstream(huge).put('*');
  fs::resize_file(huge, (std::uintmax_t(2) << 30) + 1);
  PlumbProcess run(folder_, {"solve", huge.string()});
  ASSERT_TRUE(run.started());
  EXPECT_EQ(run.wait(), 1);
  EXPECT_NE(run.stderr_text().find("larger than 2 GiB"), std::string::npos) << run.stderr_text();
}

using SolveSignals = SolveLimitsBase;

TEST_F(SolveSignals, SignalDuringAReadExitsThreeAndSaysWhere) {
  // Constructed case: 4 million comment lines before a tiny model, so the signal, sent as soon as
  // plumb catches it, arrives while the file is being read; plumb stops there, not later.
  fs::path model = folder_ / "long.mps";
  {
    std::ofstream out(model, std::ios::binary);
    std::string block;
    for (int k = 0; k < 1 << 19; ++k) block += "*\n";  // 1 MiB of comment lines
    for (int k = 0; k < 8; ++k) out << block;
    out << "NAME long\nROWS\n N cost\n L cap\nCOLUMNS\n x cost -1 cap 1\nRHS\n rhs cap 4\nENDATA\n";
  }
  for (int number : {SIGINT, SIGTERM}) {
    SCOPED_TRACE(number);
    PlumbProcess run(folder_, {"solve", model.string(), "--certificate", certificate().string()});
    ASSERT_TRUE(run.wait_until_catching(number)) << "never caught the signal: " << run.stderr_text();
    run.signal(number);
    EXPECT_EQ(run.wait(), 3) << run.stderr_text();
    EXPECT_NE(run.stderr_text().find("stopped (interrupted) while reading " + model.string() + ", at line "),
              std::string::npos) << run.stderr_text();
    EXPECT_FALSE(fs::exists(certificate()));
    EXPECT_EQ(run.stdout_text(), "");
  }
}

class NetlibSolveLimits : public SolveLimitsBase {
 protected:
  // A model the exact engine takes many seconds over (6071 rows, 12230 columns).
  fs::path big_model() const { return test::shared_dir / "netlib" / "dfl001.mps.gz"; }
  bool have_model() const { return test::shared_folder_present(test::shared_dir / "netlib") && fs::exists(big_model()); }
};

TEST_F(NetlibSolveLimits, TimeAndMemoryLimitsExitThreeSayHowFarAndWriteNoCertificate) {
  if (!have_model()) GTEST_SKIP() << "no " << big_model();
  for (auto [option, value, reason] : {std::tuple{"--time-limit", "0.01", "time limit"},
                                       std::tuple{"--memory-limit", "1", "memory limit"}}) {
    SCOPED_TRACE(option);
    PlumbProcess run(folder_, {"solve", big_model().string(), option, value, "--certificate", certificate().string()});
    EXPECT_EQ(run.wait(), 3) << run.stderr_text();
    EXPECT_NE(run.stderr_text().find(reason), std::string::npos) << run.stderr_text();
    EXPECT_NE(run.stderr_text().find("iterations"), std::string::npos) << run.stderr_text();
    EXPECT_FALSE(fs::exists(certificate()));
    EXPECT_EQ(run.stdout_text(), "");
  }
}

// SIGINT and SIGTERM once the solve is under way: plumb catches them, and a moment later.
void expect_signal_stops_solve(const fs::path& folder, const fs::path& model, const fs::path& certificate, int number) {
  PlumbProcess run(folder, {"solve", model.string(), "--method", "exact", "--certificate", certificate.string()});
  ASSERT_TRUE(run.wait_until_catching(number)) << "never caught the signal: " << run.stderr_text();
  std::this_thread::sleep_for(500ms);  // into the solve proper
  run.signal(number);
  EXPECT_EQ(run.wait(), 3) << run.stderr_text();
  EXPECT_NE(run.stderr_text().find("interrupted"), std::string::npos) << run.stderr_text();
  EXPECT_FALSE(fs::exists(certificate));
}

TEST_F(NetlibSolveLimits, InterruptStopsASolveWithExitThree) {
  if (!have_model()) GTEST_SKIP() << "no " << big_model();
  expect_signal_stops_solve(folder_, big_model(), certificate(), SIGINT);
}

TEST_F(NetlibSolveLimits, TerminateStopsASolveWithExitThree) {
  if (!have_model()) GTEST_SKIP() << "no " << big_model();
  expect_signal_stops_solve(folder_, big_model(), certificate(), SIGTERM);
}

TEST_F(NetlibSolveLimits, RepeatedSolvesWriteIdenticalCertificates) {
  // Determinism (common practice for anything a regulator may re-run): the same model and method
  // give the same certificate bytes.  Optimal, infeasible, native and MPS inputs.
  std::vector<fs::path> models{fs::path(PLUMB_CORPUS_DIR) / "summer-blend.plumb",
                               fs::path(PLUMB_TEST_DATA_DIR) / "check" / "chvatal-2.1.mps"};
  if (test::shared_folder_present(test::shared_dir / "netlib")) {
    models.push_back(test::shared_dir / "netlib" / "afiro.mps.gz");
    models.push_back(test::shared_dir / "netlib" / "sc50b.mps.gz");
    models.push_back(test::shared_dir / "netlib-infeas" / "itest6.mps.gz");
  }
  for (const fs::path& model : models) {
    for (const char* method : {"hybrid", "exact"}) {
      SCOPED_TRACE(model.filename().string() + " " + method);
      std::vector<std::string> bytes;
      for (const char* name : {"first.json", "second.json"}) {
        PlumbProcess run(folder_, {"solve", model.string(), "--quiet", "--method", method, "--certificate",
                                   (folder_ / name).string()});
        int status = run.wait();
        EXPECT_TRUE(status == 0 || status == 10) << status << run.stderr_text();
        bytes.push_back(contents(folder_ / name));
      }
      EXPECT_FALSE(bytes[0].empty());
      EXPECT_EQ(bytes[0], bytes[1]);
    }
  }
}

}  // namespace
}  // namespace plumb::hardening
