// SIGINT and SIGTERM stop a read and a solve at the next poll, with the handlers every command
// installs (run::stop_on_interrupt_signals).  Each signal is raised from inside the work at a known
// point, so nothing depends on timing: from the reader's poll of a given line, and from the solve's
// progress callback.  Constructed cases; the model is the invented summer blend of corpus/.
#include "plumb/model/input_file.hpp"
#include "plumb/exact/solve.hpp"
#include "plumb/model/read.hpp"
#include "plumb/run/budget.hpp"

#include <gtest/gtest.h>

#include <csignal>

namespace plumb {
namespace {

// Handlers installed and the flag clear; afterwards the defaults again, for the tests that follow.
class Interrupts : public ::testing::TestWithParam<int> {
 protected:
  void SetUp() override {
    run::interrupt_flag().store(false);
    run::stop_on_interrupt_signals();
  }
  void TearDown() override {
    model::detail::LineCursor::before_interrupt_poll = nullptr;
    std::signal(SIGINT, SIG_DFL);
    std::signal(SIGTERM, SIG_DFL);
    run::interrupt_flag().store(false);
  }
};

int raised_signal = 0;  // the signal under test, for the hooks (plain function pointers)

TEST_P(Interrupts, SignalInsideAReadStopsItAtThatPoll) {
  raised_signal = GetParam();
  std::string text;
  for (int k = 0; k < 10000; ++k) text += "* a comment line\n";
  text += "NAME long\nROWS\n N cost\n L cap\nCOLUMNS\n x cost -1 cap 1\nRHS\n rhs cap 4\nENDATA\n";
  // The reader looks at the flag on lines 1, 4097, 8193, ...: the signal comes at the second look.
  model::detail::LineCursor::before_interrupt_poll = [](long line) {
    if (line == 4097) std::raise(raised_signal);
  };
  try {
    model::read_model_text(text, "long.mps");
    ADD_FAILURE() << "the read did not stop";
  } catch (const run::Stopped& stopped) {
    EXPECT_EQ(stopped.reason, run::StopReason::interrupted);
    EXPECT_EQ(stopped.progress, "reading long.mps, at line 4097");
  }
}

TEST_P(Interrupts, SignalDuringASolveStopsItUncertified) {
  raised_signal = GetParam();
  model::Model model = model::read_model(std::string(PLUMB_CORPUS_DIR) + "/summer-blend.plumb");
  for (exact::Method method : {exact::Method::exact, exact::Method::hybrid}) {
    SCOPED_TRACE(method == exact::Method::exact ? "exact" : "hybrid");
    run::interrupt_flag().store(false);
    run::Budget budget;
    exact::SolveOptions options;
    options.method = method;
    options.budget = &budget;
    int calls = 0;
    // The first report comes before the exact engine factorizes its first basis.
    options.progress = [&calls](const exact::Progress&) {
      if (calls++ == 0) std::raise(raised_signal);
    };
    exact::CertifiedSolution result = exact::certified_solve(model, options);
    EXPECT_EQ(calls > 0, true);
    EXPECT_EQ(result.solution.outcome, exact::Outcome::stopped);
    EXPECT_EQ(result.solution.stop_reason, run::StopReason::interrupted);
    EXPECT_FALSE(result.certified());
  }
}

INSTANTIATE_TEST_SUITE_P(Signals, Interrupts, ::testing::Values(SIGINT, SIGTERM),
                         [](const auto& info) { return info.param == SIGINT ? "SIGINT" : "SIGTERM"; });

}  // namespace
}  // namespace plumb
