#include "plumb/run/budget.hpp"

#include <sys/resource.h>
#include <unistd.h>
#include <csignal>
#include <cstdio>

namespace plumb::run {

std::string describe(StopReason reason) {
  switch (reason) {
    case StopReason::none: return "not stopped";
    case StopReason::time_limit: return "time limit reached";
    case StopReason::memory_limit: return "memory limit reached";
    case StopReason::interrupted: return "interrupted";
    case StopReason::abandoned: return "abandoned by the caller";
  }
  return "stopped";
}

std::atomic<bool>& interrupt_flag() {
  static std::atomic<bool> flag{false};
  return flag;
}

namespace {
extern "C" void on_interrupt(int) { interrupt_flag().store(true); }
}  // namespace

void stop_on_interrupt_signals() {
  std::signal(SIGINT, on_interrupt);
  std::signal(SIGTERM, on_interrupt);
}

Budget::Budget(std::optional<double> time_limit_seconds, std::optional<std::size_t> memory_limit_mib)
    : time_limit_seconds_(time_limit_seconds), memory_limit_mib_(memory_limit_mib) {}

double Budget::elapsed_seconds() const {
  return std::chrono::duration<double>(std::chrono::steady_clock::now() - start_).count();
}

bool Budget::exhausted() {
  if (reason_ != StopReason::none) return true;
  if (interrupt_flag().load(std::memory_order_relaxed)) reason_ = StopReason::interrupted;
  else if (abandoned_.load(std::memory_order_relaxed)) reason_ = StopReason::abandoned;
  else if (time_limit_seconds_ && elapsed_seconds() > *time_limit_seconds_) reason_ = StopReason::time_limit;
  else if (memory_limit_mib_ && (calls_++ % 64) == 0 && resident_mib() > *memory_limit_mib_)
    reason_ = StopReason::memory_limit;
  return reason_ != StopReason::none;
}

std::size_t resident_mib() {
  std::FILE* statm = std::fopen("/proc/self/statm", "r");
  if (!statm) return 0;
  unsigned long pages_total = 0, pages_resident = 0;
  int read = std::fscanf(statm, "%lu %lu", &pages_total, &pages_resident);
  std::fclose(statm);
  if (read != 2) return 0;
  return pages_resident * static_cast<std::size_t>(sysconf(_SC_PAGESIZE)) >> 20;
}

double peak_resident_mib() {
  // VmHWM belongs to this program's own address space; ru_maxrss would also count what the parent
  // that forked us had resident before exec (a few MiB from a shell, tens from a script).
  if (std::FILE* status = std::fopen("/proc/self/status", "r")) {
    char line[256];
    unsigned long kib = 0;
    bool found = false;
    while (!found && std::fgets(line, sizeof line, status)) found = std::sscanf(line, "VmHWM: %lu kB", &kib) == 1;
    std::fclose(status);
    if (found) return static_cast<double>(kib) / 1024;
  }
  rusage usage{};
  if (getrusage(RUSAGE_SELF, &usage) != 0) return 0;
  return static_cast<double>(usage.ru_maxrss) / 1024;  // KiB on Linux
}

}  // namespace plumb::run
