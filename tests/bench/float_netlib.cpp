// Benchmark: the float simplex on every Netlib LP, with status, iterations, time and the
// relative error against the published optimum (../shared/netlib/published.csv).
//   plumb_bench [--limit SECONDS] [--only NAME[,NAME...]] [--progress] [SHARED_DIR]
#include "plumb/model/read.hpp"
#include "plumb/numeric/rational.hpp"
#include "plumb/run/budget.hpp"
#include "plumb/simplex/float_simplex.hpp"

#include <algorithm>
#include <chrono>
#include <cmath>
#include <cstdio>
#include <filesystem>
#include <fstream>
#include <optional>
#include <set>
#include <sstream>
#include <string>
#include <vector>

namespace fs = std::filesystem;
using namespace plumb;

namespace {

struct Instance {
  std::string name;
  std::optional<double> published;
};

std::vector<Instance> read_published(const fs::path& csv) {
  std::ifstream in(csv);
  std::vector<Instance> list;
  std::string line;
  std::getline(in, line);
  while (std::getline(in, line)) {
    if (!line.empty() && line.back() == '\r') line.pop_back();
    if (line.empty()) continue;
    std::vector<std::string> fields;
    std::stringstream s(line);
    for (std::string f; std::getline(s, f, ',');) fields.push_back(f);
    Instance instance{fields[0], std::nullopt};
    if (fields.size() > 4)
      if (auto value = numeric::parse_decimal(fields[4])) instance.published = numeric::to_double(*value);
    list.push_back(instance);
  }
  return list;
}

const char* status_name(simplex::FloatStatus s) {
  switch (s) {
    case simplex::FloatStatus::optimal: return "optimal";
    case simplex::FloatStatus::infeasible: return "infeasible";
    case simplex::FloatStatus::unbounded: return "unbounded";
    case simplex::FloatStatus::stopped: return "stopped";
    case simplex::FloatStatus::failed: return "failed";
  }
  return "?";
}

}  // namespace

int main(int argc, char** argv) {
  double limit = 60;
  std::set<std::string> only;
  bool show_progress = false;
  fs::path shared = PLUMB_SHARED_DIR;
  for (int a = 1; a < argc; ++a) {
    std::string arg = argv[a];
    if (arg == "--limit" && a + 1 < argc) {
      limit = std::stod(argv[++a]);
    } else if (arg == "--only" && a + 1 < argc) {
      std::stringstream s(argv[++a]);
      for (std::string name; std::getline(s, name, ',');) only.insert(name);
    } else if (arg == "--progress") {
      show_progress = true;
    } else {
      shared = arg;
    }
  }
  auto instances = read_published(shared / "netlib" / "published.csv");
  std::printf("%-10s %-10s %8s %8s %20s %20s %9s\n", "instance", "status", "iters", "seconds", "objective",
              "published", "rel.err");
  int solved = 0, matching = 0, count = 0;
  double total = 0;
  std::vector<std::pair<double, std::string>> times;
  for (const auto& instance : instances) {
    if (!only.empty() && !only.count(instance.name)) continue;
    model::ReadOptions read_options;
    read_options.constant_rule = model::ObjectiveConstantRule::ignored;  // as the published optima
    model::Model model = model::read_model((shared / "netlib" / (instance.name + ".mps.gz")).string(), read_options);
    run::Budget budget(limit, std::nullopt);
    simplex::FloatOptions options;
    options.budget = &budget;
    if (show_progress)
      options.progress = [](const simplex::FloatProgress& p) {
        std::fprintf(stderr, "  %-16s %8ld %22.12g %12.4g\n", p.phase.c_str(), p.iterations, p.objective, p.infeasibility);
      };
    auto start = std::chrono::steady_clock::now();
    auto result = simplex::solve_float(model, options);
    double seconds = std::chrono::duration<double>(std::chrono::steady_clock::now() - start).count();
    ++count;
    total += seconds;
    times.push_back({seconds, instance.name});
    bool optimal = result.status == simplex::FloatStatus::optimal;
    solved += optimal;
    std::string error = "-", published = "-";
    if (instance.published) {
      double rel = std::abs(result.objective - *instance.published) / std::max(1.0, std::abs(*instance.published));
      char buffer[64];
      std::snprintf(buffer, sizeof buffer, "%.1e", rel);
      error = buffer;
      std::snprintf(buffer, sizeof buffer, "%.11g", *instance.published);
      published = buffer;
      matching += optimal && rel <= 1e-6;
    }
    std::printf("%-10s %-10s %8ld %8.2f %20.11g %20s %9s%s%s\n", instance.name.c_str(), status_name(result.status),
                result.iterations, seconds, result.objective, published.c_str(), error.c_str(),
                result.note.empty() ? "" : "  ", result.note.c_str());
    std::fflush(stdout);
  }
  std::sort(times.rbegin(), times.rend());
  std::printf("summary: %d of %d optimal, %d matching published to 1e-6, %.1f s in all; slowest:", solved, count,
              matching, total);
  for (std::size_t k = 0; k < std::min<std::size_t>(5, times.size()); ++k)
    std::printf(" %s %.1f s%s", times[k].second.c_str(), times[k].first, k + 1 < std::min<std::size_t>(5, times.size()) ? "," : "\n");
  return 0;
}
