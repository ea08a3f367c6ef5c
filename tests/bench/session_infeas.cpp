// Benchmark: a deletion-filter-like loop on a solve session against cold certified solves.
// For each model: a cold exact::certified_solve (timed), then a session that relaxes rows of the
// Farkas proof to free one at a time, re-solves, restores and re-solves.  Each re-solve is
// compared with a cold certified_solve of the same model: the edited one after a relaxation, the
// original after a restore (issue 10's measure); and, as before, with the original's cold solve.
// Prints per model the cold time, its float time, the median and largest re-solve, the median
// speed-up against the same model and the outcomes, and the summary line:
//   session: N models, against a cold solve of the same model: median speed-up R (relaxed Rr,
//   restored Rs), within its float time K/M; against the original's cold solve: median R0 (relaxed
//   R0r, restored R0s), within its float time K0/M; certified C/M, answered by an earlier proof E/M
// A restored re-solve is often answered by the proof found before the relaxation, for the price
// of a check.
// Usage: plumb_session_bench [FOLDER] [--rows K] [--time-limit S] [--feasibility] [--each] [NAME...]
//   FOLDER defaults to PLUMB_SHARED_DIR/netlib-infeas; K rows per model (default 6); S seconds per
//   solve (default 60); --feasibility: the session solves under the feasibility goal, as plumb
//   explain's do (the cold solves too, as one-solve sessions); --each: one line per re-solve on
//   stderr; NAMEs restrict the run to those models.
#include "plumb/exact/session.hpp"
#include "plumb/model/read.hpp"

#include <algorithm>
#include <chrono>
#include <cstdio>
#include <cstdlib>
#include <filesystem>
#include <string>
#include <vector>

namespace {

namespace fs = std::filesystem;
using namespace plumb;

double median(std::vector<double> values) {
  if (values.empty()) return 0;
  std::sort(values.begin(), values.end());
  std::size_t k = values.size() / 2;
  return values.size() % 2 ? values[k] : (values[k - 1] + values[k]) / 2;
}

struct Timed {
  exact::CertifiedSolution result;
  double seconds = 0;
};

template <class Solve>
Timed timed(Solve&& solve, double time_limit) {
  run::Budget budget(time_limit, std::nullopt);
  exact::SolveOptions options;
  options.budget = &budget;
  auto start = std::chrono::steady_clock::now();
  Timed t{solve(options), 0};
  t.seconds = std::chrono::duration<double>(std::chrono::steady_clock::now() - start).count();
  return t;
}

// One letter per re-solve in the outcome column: optimal, infeasible, unbounded, stopped.
char outcome_letter(exact::Outcome outcome) { return "oius"[static_cast<int>(outcome)]; }

// A cold solve in a session of its own, under the benchmark's goal.
Timed cold_solve(const model::Model& model, exact::Goal goal, double time_limit) {
  return timed(
      [&](const exact::SolveOptions& o) {
        exact::Session session(model);
        session.set_goal(goal);
        return session.solve(o);
      },
      time_limit);
}

// Speed-ups and "within the float time" counts of the re-solves against one baseline.
struct Against {
  std::vector<double> all, relaxed, restored;  // per model: the median ratio of its re-solves
  int within_float = 0;
  void add_model(const std::vector<double>& relaxed_ratios, const std::vector<double>& restored_ratios) {
    std::vector<double> both = relaxed_ratios;
    both.insert(both.end(), restored_ratios.begin(), restored_ratios.end());
    all.push_back(median(both));
    relaxed.push_back(median(relaxed_ratios));
    restored.push_back(median(restored_ratios));
  }
  std::string summary() const {
    char text[160];
    std::snprintf(text, sizeof text,
                  "median speed-up %.1f (relaxed %.1f, restored %.1f), within its float time", median(all),
                  median(relaxed), median(restored));
    return text;
  }
};

}  // namespace

int main(int argc, char** argv) {
  fs::path folder = fs::path(PLUMB_SHARED_DIR) / "netlib-infeas";
  int rows_per_model = 6;
  double time_limit = 60;
  exact::Goal goal = exact::Goal::model_objective;
  bool each = false;
  std::vector<std::string> names;
  for (int a = 1; a < argc; ++a) {
    std::string arg = argv[a];
    if (arg == "--rows" && a + 1 < argc) rows_per_model = std::atoi(argv[++a]);
    else if (arg == "--time-limit" && a + 1 < argc) time_limit = std::atof(argv[++a]);
    else if (arg == "--feasibility")
      goal = exact::Goal::feasibility;
    else if (arg == "--each")
      each = true;
    else if (fs::is_directory(arg)) folder = arg;
    else names.push_back(arg);
  }
  std::vector<fs::path> files;
  for (const auto& entry : fs::directory_iterator(folder)) {
    std::string name = entry.path().filename().string();
    if (!name.ends_with(".mps.gz")) continue;
    std::string stem = name.substr(0, name.size() - 7);
    if (names.empty() || std::find(names.begin(), names.end(), stem) != names.end()) files.push_back(entry.path());
  }
  std::sort(files.begin(), files.end());

  std::printf("%-10s %6s %10s %9s %5s %11s %11s %7s %s\n", "model", "rows", "cold_s", "float_s", "runs",
              "median_re_s", "max_re_s", "speedup", "outcomes (relaxed/restored)");
  Against same, original;
  int runs_total = 0, certified_total = 0, earlier_total = 0;
  for (const auto& file : files) {
    std::string name = file.filename().string();
    name = name.substr(0, name.size() - 7);
    model::Model model = model::read_model(file.string());
    Timed cold = cold_solve(model, goal, time_limit);
    double cold_float = cold.result.solution.stats.float_seconds;

    exact::Session session(model);
    session.set_goal(goal);
    Timed first = timed([&](const exact::SolveOptions& o) { return session.solve(o); }, time_limit);
    std::vector<int> support;
    for (std::size_t i = 0; i < first.result.solution.y.size(); ++i)
      if (first.result.solution.y[i] != 0) support.push_back(static_cast<int>(i));
    if (static_cast<int>(support.size()) > rows_per_model) {  // spread over the support
      std::vector<int> picked;
      for (int k = 0; k < rows_per_model; ++k) picked.push_back(support[k * support.size() / rows_per_model]);
      support = picked;
    }
    std::vector<double> re_solves, same_ratio[2], original_ratio[2];
    std::string outcomes;
    for (int row : support) {
      session.set_row_lower(row, std::nullopt);
      session.set_row_upper(row, std::nullopt);
      for (int pass = 0; pass < 2; ++pass) {  // 0: relaxed, 1: restored
        Timed again = timed([&](const exact::SolveOptions& o) { return session.solve(o); }, time_limit);
        // The same model cold: the relaxed one solved afresh, or the original again.
        const Timed same_cold = pass == 0 ? cold_solve(session.current(), goal, time_limit) : cold;
        const exact::SolveStats& stats = again.result.solution.stats;
        re_solves.push_back(again.seconds);
        same_ratio[pass].push_back(same_cold.seconds / again.seconds);
        original_ratio[pass].push_back(cold.seconds / again.seconds);
        same.within_float += again.seconds <= same_cold.result.solution.stats.float_seconds;
        original.within_float += again.seconds <= cold_float;
        earlier_total += stats.proof == "earlier proof";
        ++runs_total;
        certified_total += again.result.certified();
        outcomes += outcome_letter(again.result.solution.outcome);
        if (each)
          std::fprintf(stderr,
                       "%s row %d %s: %c in %.4f s (float %.4f s, %ld it; certify %.4f s; %s); cold %.4f s "
                       "(float %.4f s, %ld it)\n",
                       name.c_str(), row, pass ? "restored" : "relaxed",
                       outcome_letter(again.result.solution.outcome), again.seconds, stats.float_seconds,
                       stats.float_iterations, stats.certify_seconds, stats.proof.c_str(), same_cold.seconds,
                       same_cold.result.solution.stats.float_seconds,
                       same_cold.result.solution.stats.float_iterations);
        session.restore_row(row);
      }
      outcomes += ' ';
    }
    if (!re_solves.empty()) {
      same.add_model(same_ratio[0], same_ratio[1]);
      original.add_model(original_ratio[0], original_ratio[1]);
    }
    std::printf("%-10s %6d %10.3f %9.3f %5zu %11.4f %11.4f %7.1f %s%s\n", name.c_str(), model.row_count(),
                cold.seconds, cold_float, re_solves.size(), median(re_solves),
                re_solves.empty() ? 0.0 : *std::max_element(re_solves.begin(), re_solves.end()),
                re_solves.empty() ? 0.0 : same.all.back(),
                cold.result.certified() ? "" : "(cold not certified) ", outcomes.c_str());
    std::fflush(stdout);
  }
  std::printf(
      "session: %zu models, against a cold solve of the same model: %s %d/%d; against the original's cold "
      "solve: %s %d/%d; certified %d/%d, answered by an earlier proof %d/%d\n",
      same.all.size(), same.summary().c_str(), same.within_float, runs_total, original.summary().c_str(),
      original.within_float, runs_total, certified_total, runs_total, earlier_total, runs_total);
  return 0;
}
