// Test support: runs a program with arguments and captures its exit status, stdout and stderr.
#pragma once

#include <fcntl.h>
#include <spawn.h>
#include <sys/wait.h>
#include <unistd.h>

#include <chrono>
#include <csignal>
#include <cstdlib>
#include <fstream>
#include <iterator>
#include <sstream>
#include <string>
#include <thread>
#include <vector>

extern char** environ;

namespace plumb::test {

struct RunResult {
  int status = -1;         // exit status; 128 + signal when killed; -1 when it could not start
  bool timed_out = false;  // killed after the time limit
  std::string out;
  std::string err;
};

namespace detail {

// A fresh file in the temporary folder, removed when the holder goes away.
class TempFile {
 public:
  TempFile() {
    const char* folder = std::getenv("TMPDIR");
    path_ = std::string(folder && *folder ? folder : "/tmp") + "/plumb-run-XXXXXX";
    int fd = mkstemp(path_.data());
    if (fd >= 0) close(fd);
  }
  ~TempFile() { unlink(path_.c_str()); }
  TempFile(const TempFile&) = delete;
  TempFile& operator=(const TempFile&) = delete;
  const std::string& path() const { return path_; }
  std::string read() const {
    std::ifstream in(path_, std::ios::binary);
    return {std::istreambuf_iterator<char>(in), std::istreambuf_iterator<char>()};
  }

 private:
  std::string path_;
};

}  // namespace detail

// Runs program with args (argv[0] is the program), stdin from /dev/null; output goes to temp
// files so a large output cannot block the child.  Kills it after time_limit.
inline RunResult run(const std::string& program, const std::vector<std::string>& args,
                     std::chrono::seconds time_limit = std::chrono::seconds(60)) {
  detail::TempFile out_file, err_file;
  posix_spawn_file_actions_t actions;
  posix_spawn_file_actions_init(&actions);
  posix_spawn_file_actions_addopen(&actions, 0, "/dev/null", O_RDONLY, 0);
  posix_spawn_file_actions_addopen(&actions, 1, out_file.path().c_str(), O_WRONLY | O_TRUNC, 0);
  posix_spawn_file_actions_addopen(&actions, 2, err_file.path().c_str(), O_WRONLY | O_TRUNC, 0);
  std::vector<std::string> owned{program};
  owned.insert(owned.end(), args.begin(), args.end());
  std::vector<char*> argv;
  for (auto& arg : owned) argv.push_back(arg.data());
  argv.push_back(nullptr);
  RunResult result;
  pid_t pid = 0;
  int spawned = posix_spawn(&pid, program.c_str(), &actions, nullptr, argv.data(), environ);
  posix_spawn_file_actions_destroy(&actions);
  if (spawned != 0) {
    result.err = "could not start " + program;
    return result;
  }
  auto deadline = std::chrono::steady_clock::now() + time_limit;
  int wait_status = 0;
  while (waitpid(pid, &wait_status, WNOHANG) == 0) {
    if (std::chrono::steady_clock::now() > deadline) {
      kill(pid, SIGKILL);
      waitpid(pid, &wait_status, 0);
      result.timed_out = true;
      break;
    }
    std::this_thread::sleep_for(std::chrono::milliseconds(2));
  }
  result.status = WIFEXITED(wait_status) ? WEXITSTATUS(wait_status) : 128 + WTERMSIG(wait_status);
  result.out = out_file.read();
  result.err = err_file.read();
  return result;
}

// Lines of text, a last line without '\n' included.
inline std::vector<std::string> lines_of(const std::string& text) {
  std::vector<std::string> lines;
  std::istringstream in(text);
  for (std::string line; std::getline(in, line);) lines.push_back(line);
  return lines;
}

}  // namespace plumb::test
