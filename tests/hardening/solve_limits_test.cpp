// plumb solve at its limits, end to end: time and memory limits, inputs too large to take, and
// byte-identical certificates from repeated runs (SIGINT and SIGTERM: interrupt_test.cpp).
// Constructed cases on Netlib models (the limits do not depend on which model).
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

class NetlibSolveLimits : public SolveLimitsBase {
 protected:
  // A model no solve finishes without polling its budget many times (821 rows, 1571 columns).
  fs::path big_model() const { return test::shared_dir / "netlib" / "25fv47.mps.gz"; }
  bool have_model() const { return test::shared_folder_present(test::shared_dir / "netlib") && fs::exists(big_model()); }
};

TEST_F(NetlibSolveLimits, TimeAndMemoryLimitsExitThreeSayHowFarAndWriteNoCertificate) {
  if (!have_model()) GTEST_SKIP() << "no " << big_model();
  // Budgets exhausted at the first poll, whatever the machine's speed: a nanosecond has passed
  // since the budget started, and the process holds more than 1 MiB.
  for (auto [option, value, reason] : {std::tuple{"--time-limit", "1e-9", "time limit"},
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
