// Benchmark: a deletion-filter-like loop on a solve session against cold certified solves.
// For each model: a cold exact::certified_solve (timed), then a session that relaxes rows of the
// Farkas proof to free one at a time, re-solves, restores and re-solves.  Prints per model the
// cold time, the cold float time and the median re-solve time, and a summary line:
//   session: N models, median cold/re-solve R (relaxed Rr, restored Rs), re-solves within cold
//   float time K/M, certified C/M, answered by an earlier proof E/M
// Rr and Rs take the relaxed and the restored re-solves apart: a restored re-solve is often
// answered by the proof found before the relaxation, for the price of a check.
// Usage: plumb_session_bench [FOLDER] [--rows K] [--time-limit S] [NAME...]
//   FOLDER defaults to PLUMB_SHARED_DIR/netlib-infeas; K rows per model (default 6); S seconds per
//   solve (default 60); NAMEs restrict the run to those models.
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

}  // namespace

int main(int argc, char** argv) {
  fs::path folder = fs::path(PLUMB_SHARED_DIR) / "netlib-infeas";
  int rows_per_model = 6;
  double time_limit = 60;
  std::vector<std::string> names;
  for (int a = 1; a < argc; ++a) {
    std::string arg = argv[a];
    if (arg == "--rows" && a + 1 < argc) rows_per_model = std::atoi(argv[++a]);
    else if (arg == "--time-limit" && a + 1 < argc) time_limit = std::atof(argv[++a]);
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
  std::vector<double> speedups, relaxed_speedups, restored_speedups;
  int within_float = 0, runs_total = 0, certified_total = 0, earlier_total = 0;
  for (const auto& file : files) {
    std::string name = file.filename().string();
    name = name.substr(0, name.size() - 7);
    model::Model model = model::read_model(file.string());
    Timed cold = timed([&](const exact::SolveOptions& o) { return exact::certified_solve(model, o); }, time_limit);
    double cold_float = cold.result.solution.stats.float_seconds;

    exact::Session session(model);
    Timed first = timed([&](const exact::SolveOptions& o) { return session.solve(o); }, time_limit);
    std::vector<int> support;
    for (std::size_t i = 0; i < first.result.solution.y.size(); ++i)
      if (first.result.solution.y[i] != 0) support.push_back(static_cast<int>(i));
    if (static_cast<int>(support.size()) > rows_per_model) {  // spread over the support
      std::vector<int> picked;
      for (int k = 0; k < rows_per_model; ++k) picked.push_back(support[k * support.size() / rows_per_model]);
      support = picked;
    }
    std::vector<double> re_solves, by_pass[2];
    std::string outcomes;
    for (int row : support) {
      session.set_row_lower(row, std::nullopt);
      session.set_row_upper(row, std::nullopt);
      for (int pass = 0; pass < 2; ++pass) {
        Timed again = timed([&](const exact::SolveOptions& o) { return session.solve(o); }, time_limit);
        re_solves.push_back(again.seconds);
        by_pass[pass].push_back(again.seconds);
        earlier_total += again.result.solution.stats.proof == "earlier proof";
        ++runs_total;
        certified_total += again.result.certified();
        within_float += again.seconds <= cold_float;
        outcomes += outcome_letter(again.result.solution.outcome);
        session.restore_row(row);
      }
      outcomes += ' ';
    }
    double typical = median(re_solves);
    double speedup = typical > 0 ? cold.seconds / typical : 0;
    if (!re_solves.empty()) {
      speedups.push_back(speedup);
      relaxed_speedups.push_back(cold.seconds / median(by_pass[0]));
      restored_speedups.push_back(cold.seconds / median(by_pass[1]));
    }
    std::printf("%-10s %6d %10.3f %9.3f %5zu %11.4f %11.4f %7.1f %s%s\n", name.c_str(), model.row_count(), cold.seconds,
                cold_float, re_solves.size(), typical,
                re_solves.empty() ? 0.0 : *std::max_element(re_solves.begin(), re_solves.end()), speedup,
                cold.result.certified() ? "" : "(cold not certified) ", outcomes.c_str());
    std::fflush(stdout);
  }
  std::printf(
      "session: %zu models, median cold/re-solve %.1f (relaxed %.1f, restored %.1f), re-solves within cold "
      "float time "
      "%d/%d, certified %d/%d, answered by an earlier proof %d/%d\n",
      speedups.size(), median(speedups), median(relaxed_speedups), median(restored_speedups), within_float,
      runs_total, certified_total, runs_total, earlier_total, runs_total);
  return 0;
}
