// Benchmark: two exact routes for the basic solution x_B and the duals y at the float simplex's
// final basis of Netlib LPs: the exact rational LU, against float LU with iterative refinement,
// rational reconstruction and an exact check.  Prints processor seconds per instance (factorization
// and both solves); both answers must agree.  Then the whole certification from that basis
// (exact::solve warm-started from it: checks, repair pivots and all), with its exact pivots.
//   plumb_refine_bench [--shared DIR] [--bases DIR] [NAME...]
// --bases keeps each float basis in DIR/NAME.basis and reads it from there next time, so that
// repeated runs skip the float search.
#include "exact/factor.hpp"
#include "exact/refine.hpp"
#include "plumb/exact/solve.hpp"
#include "plumb/model/read.hpp"
#include "plumb/run/budget.hpp"
#include "plumb/simplex/float_simplex.hpp"

#include <cstring>
#include <ctime>
#include <cstdio>
#include <filesystem>
#include <fstream>
#include <set>
#include <string>
#include <vector>

namespace fs = std::filesystem;
using namespace plumb;
using exact::detail::Rational;
using exact::detail::SparseColumn;

namespace {

std::vector<std::string> instance_names(const fs::path& csv) {
  std::ifstream in(csv);
  std::vector<std::string> names;
  std::string line;
  std::getline(in, line);
  while (std::getline(in, line))
    if (!line.empty() && line != "\r") names.push_back(line.substr(0, line.find(',')));
  return names;
}

// Processor time, not wall time: the machine is shared.
double cpu_seconds() {
  timespec now{};
  clock_gettime(CLOCK_PROCESS_CPUTIME_ID, &now);
  return static_cast<double>(now.tv_sec) + 1e-9 * static_cast<double>(now.tv_nsec);
}

// The basis system of the model's own form A x - r = 0: columns of the basic variables (a logical
// is -e_i), the right-hand side -N x_N from the nonbasic values, and the basic costs c'_B.
struct BasisSystem {
  int m = 0;
  std::vector<SparseColumn> columns;
  std::vector<Rational> rhs, costs;
  std::size_t nonzeros = 0;
};

bool basis_system(const model::Model& model, const simplex::Basis& basis, BasisSystem& system) {
  const int n = model.column_count(), m = model.row_count();
  system.m = m;
  system.rhs.assign(static_cast<std::size_t>(m), Rational(0));
  bool maximise = model.objective.sense == model::Sense::maximise;
  auto rest = [](const std::optional<Rational>& lower, const std::optional<Rational>& upper, simplex::VarStatus s) {
    if (s == simplex::VarStatus::at_upper && upper) return *upper;
    if (s != simplex::VarStatus::at_zero && lower) return *lower;
    if (s != simplex::VarStatus::at_zero && upper) return *upper;
    return Rational(0);
  };
  for (int j = 0; j < n; ++j) {
    auto rows = model.matrix.column_rows(j);
    auto values = model.matrix.column_values(j);
    if (basis.columns[j] == simplex::VarStatus::basic) {
      SparseColumn column;
      column.rows.assign(rows.begin(), rows.end());
      column.values.assign(values.begin(), values.end());
      system.nonzeros += rows.size();
      system.columns.push_back(std::move(column));
      const Rational& c = model.objective.coefficients[j];
      system.costs.push_back(maximise ? Rational(-c) : c);
      continue;
    }
    Rational x = rest(model.columns[j].lower, model.columns[j].upper, basis.columns[j]);
    if (x != 0)
      for (std::size_t e = 0; e < rows.size(); ++e) system.rhs[rows[e]] -= values[e] * x;
  }
  for (int i = 0; i < m; ++i) {
    if (basis.rows[i] == simplex::VarStatus::basic) {
      system.columns.push_back(SparseColumn{{i}, {Rational(-1)}});
      system.costs.push_back(Rational(0));
      ++system.nonzeros;
      continue;
    }
    system.rhs[i] += rest(model.rows[i].lower, model.rows[i].upper, basis.rows[i]);
  }
  return static_cast<int>(system.columns.size()) == m;
}

struct Answer {
  std::vector<Rational> x, y;
  bool found = false;
};

Answer by_rational_lu(const BasisSystem& s) {
  exact::detail::RationalBasisFactor factor;
  factor.factorize(s.m, s.columns);
  Answer answer;
  if (!factor.nonsingular()) return answer;
  exact::detail::RationalSparseVector in(s.m), out(s.m);
  for (int i = 0; i < s.m; ++i)
    if (s.rhs[i] != 0) in.at(i) = s.rhs[i];
  factor.ftran(in, out);
  answer.x.assign(static_cast<std::size_t>(s.m), Rational(0));
  for (int i : out.pattern()) answer.x[i] = out[i];
  for (int p = 0; p < s.m; ++p)
    if (s.costs[p] != 0) in.at(p) = s.costs[p];
  factor.btran(in, out);
  answer.y.assign(static_cast<std::size_t>(s.m), Rational(0));
  for (int i : out.pattern()) answer.y[i] = out[i];
  answer.found = true;
  return answer;
}

Answer by_refinement(const BasisSystem& s, exact::detail::RefineStats& primal, exact::detail::RefineStats& dual) {
  exact::detail::RefinedSolver solver;
  Answer answer;
  if (!solver.factorize(s.m, s.columns)) return answer;
  auto x = solver.solve(s.rhs);
  primal = solver.stats();
  auto y = solver.solve_transposed(s.costs);
  dual = solver.stats();
  if (!x || !y) return answer;
  answer.x = std::move(*x);
  answer.y = std::move(*y);
  answer.found = true;
  return answer;
}

// Runs `route` once, or repeatedly for at least a fifth of a second when it is quick; mean
// processor seconds.
template <class Route>
double timed(Route&& route) {
  double start = cpu_seconds();
  route();
  double once = cpu_seconds() - start;
  if (once >= 0.05) return once;
  int repeats = 0;
  start = cpu_seconds();
  while (cpu_seconds() - start < 0.2) route(), ++repeats;
  return (cpu_seconds() - start) / repeats;
}

const char status_letters[] = "BLUZ";  // in VarStatus order

void write_statuses(std::ostream& out, const std::vector<simplex::VarStatus>& statuses) {
  for (auto s : statuses) out << status_letters[static_cast<int>(s)];
  out << "\n";
}

bool read_statuses(std::istream& in, std::vector<simplex::VarStatus>& statuses) {
  std::string line;
  if (!std::getline(in, line)) return false;
  statuses.clear();
  for (char c : line) {
    const char* at = std::strchr(status_letters, c);
    if (!at || c == 0) return false;
    statuses.push_back(static_cast<simplex::VarStatus>(at - status_letters));
  }
  return true;
}

// The float search's result for one instance, from the cache when there is one.
struct FloatRun {
  simplex::FloatStatus status = simplex::FloatStatus::failed;
  simplex::Basis basis;
  double seconds = 0;
  std::string note;
};

FloatRun float_run(const model::Model& model, const fs::path& cache, double limit) {
  FloatRun run;
  if (!cache.empty()) {
    std::ifstream in(cache);
    int status = 0;
    if (in >> status >> run.seconds && in.ignore() && read_statuses(in, run.basis.columns) &&
        read_statuses(in, run.basis.rows)) {
      run.status = static_cast<simplex::FloatStatus>(status);
      return run;
    }
  }
  run::Budget budget(limit, std::nullopt);
  simplex::FloatOptions options;
  options.budget = &budget;
  double start = cpu_seconds();
  auto found = simplex::solve_float(model, options);
  run.seconds = cpu_seconds() - start;
  run.status = found.status;
  run.basis = std::move(found.basis);
  run.note = found.note;
  if (!cache.empty()) {
    std::ofstream out(cache);
    out << static_cast<int>(run.status) << " " << run.seconds << "\n";
    write_statuses(out, run.basis.columns);
    write_statuses(out, run.basis.rows);
  }
  return run;
}

const char* outcome_name(exact::Outcome outcome) {
  switch (outcome) {
    case exact::Outcome::optimal: return "optimal";
    case exact::Outcome::infeasible: return "infeasible";
    case exact::Outcome::unbounded: return "unbounded";
    case exact::Outcome::stopped: return "stopped";
  }
  return "?";
}

}  // namespace

int main(int argc, char** argv) {
  constexpr double float_limit = 120;  // seconds for the float simplex to find each basis
  fs::path shared = PLUMB_SHARED_DIR;
  fs::path bases;
  std::set<std::string> only;  // instance names given on the command line; all when none
  for (int a = 1; a < argc; ++a) {
    if (std::string(argv[a]) == "--shared" && a + 1 < argc) shared = argv[++a];
    else if (std::string(argv[a]) == "--bases" && a + 1 < argc) bases = argv[++a];
    else only.insert(argv[a]);
  }
  if (!bases.empty()) fs::create_directories(bases);
  std::printf("%-9s %6s %7s %8s | %10s | %10s %5s %5s %6s %6s | %7s %-5s | %9s %6s %s\n", "instance", "m", "nnz(B)",
              "float s", "LU s", "refine s", "itx", "ity", "den x", "den y", "LU/ref", "agree", "certify s", "pivots",
              "outcome");
  for (const auto& name : instance_names(shared / "netlib" / "published.csv")) {
    if (!only.empty() && !only.count(name)) continue;
    model::ReadOptions read_options;
    read_options.constant_rule = model::ObjectiveConstantRule::ignored;
    model::Model model = model::read_model((shared / "netlib" / (name + ".mps.gz")).string(), read_options);
    FloatRun found = float_run(model, bases.empty() ? fs::path() : bases / (name + ".basis"), float_limit);
    if (found.status == simplex::FloatStatus::stopped || found.status == simplex::FloatStatus::failed) {
      std::printf("%-9s no float basis (%s)\n", name.c_str(), found.note.c_str());
      std::fflush(stdout);
      continue;
    }
    BasisSystem system;
    std::printf("%-9s %6d ", name.c_str(), model.row_count());
    if (found.status == simplex::FloatStatus::optimal && basis_system(model, found.basis, system)) {
      Answer lu, refined;
      exact::detail::RefineStats primal, dual;
      double lu_seconds = timed([&] { lu = by_rational_lu(system); });
      double refine_seconds = timed([&] { refined = by_refinement(system, primal, dual); });
      const char* agree = !lu.found ? "LU-sg" : !refined.found ? "refus" :
                          (lu.x == refined.x && lu.y == refined.y) ? "yes" : "NO";
      std::printf("%7zu %8.3f | %10.4f | %10.4f %5d %5d %6ld %6ld | %7.2f %-5s | ", system.nonzeros, found.seconds,
                  lu_seconds, refine_seconds, primal.iterations, dual.iterations, primal.denominator_bits,
                  dual.denominator_bits, lu_seconds / refine_seconds, agree);
    } else {
      std::printf("%7s %8.3f | %10s | %10s %5s %5s %6s %6s | %7s %-5s | ", "-", found.seconds, "-", "-", "-", "-", "-",
                  "-", "-", "-");
    }
    exact::SolveOptions from_basis;
    from_basis.warm_start = &found.basis;
    double start = cpu_seconds();
    exact::Solution certified = exact::solve(model, from_basis);
    std::printf("%9.3f %6ld %s\n", cpu_seconds() - start, certified.stats.exact_iterations,
                outcome_name(certified.outcome));
    std::fflush(stdout);
  }
  return 0;
}
