// Limits on a solve: wall time, memory and interrupts, polled by every long loop.
#pragma once

#include <atomic>
#include <chrono>
#include <cstddef>
#include <optional>
#include <string>

namespace plumb::run {

// Why work stopped before it finished.
enum class StopReason { none, time_limit, memory_limit, interrupted, abandoned };
std::string describe(StopReason reason);

// Set from a signal handler (SIGINT, SIGTERM); every Budget sees it.
std::atomic<bool>& interrupt_flag();

// Installs handlers for SIGINT and SIGTERM that set interrupt_flag(), so that the next poll stops
// the work: what a command does before it reads a model.
void stop_on_interrupt_signals();

class Budget {
 public:
  Budget() = default;
  Budget(std::optional<double> time_limit_seconds, std::optional<std::size_t> memory_limit_mib);

  // Cheap enough to call every iteration: reads the clock, memory is sampled every 64th call.
  bool exhausted();
  StopReason reason() const { return reason_; }
  // Makes the next poll report StopReason::abandoned: safe from another thread, for a caller that
  // gives up one piece of work (a sub-solve of a session) and carries on with the rest.
  void abandon() { abandoned_.store(true, std::memory_order_relaxed); }
  double elapsed_seconds() const;

 private:
  std::chrono::steady_clock::time_point start_ = std::chrono::steady_clock::now();
  std::optional<double> time_limit_seconds_;
  std::optional<std::size_t> memory_limit_mib_;
  unsigned calls_ = 0;
  StopReason reason_ = StopReason::none;
  std::atomic<bool> abandoned_{false};
};

// Resident memory of this process in MiB (from /proc/self/statm), 0 when unknown.
std::size_t resident_mib();

// Peak resident memory of this program so far in MiB (VmHWM of /proc/self/status, else getrusage
// ru_maxrss), 0 when unknown.
double peak_resident_mib();

// Thrown by deep code (the readers, on an interrupt) to unwind to the command; `progress` says how
// far the work got, e.g. "reading m.mps, at line 4097".
struct Stopped {
  StopReason reason;
  std::string progress;
};

// Throws Stopped{interrupted, progress()} when interrupt_flag() is set; cheap (one relaxed load).
template <class Progress>
void stop_if_interrupted(Progress progress) {
  if (interrupt_flag().load(std::memory_order_relaxed)) throw Stopped{StopReason::interrupted, progress()};
}

// Throws Stopped{reason, progress()} when the budget is exhausted (or, without a budget, when
// interrupt_flag() is set): for long steps with no loop of their own to return from, such as an
// exact factorization.
template <class Progress>
void stop_if_exhausted(Budget* budget, Progress progress) {
  if (budget ? budget->exhausted() : interrupt_flag().load(std::memory_order_relaxed))
    throw Stopped{budget ? budget->reason() : StopReason::interrupted, progress()};
}

}  // namespace plumb::run
