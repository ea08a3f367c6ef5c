// Benchmark: two exact routes for the basic solution x_B and the duals y at the float simplex's
// final basis of Netlib LPs: the exact rational LU, against float LU with iterative refinement,
// rational reconstruction and an exact check.  Prints processor seconds per instance (factorization
// and both solves); both answers must agree.
//   plumb_refine_bench [--shared DIR] [NAME...]
#include "exact/factor.hpp"
#include "exact/refine.hpp"
#include "plumb/model/read.hpp"
#include "plumb/run/budget.hpp"
#include "plumb/simplex/float_simplex.hpp"

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
  exact::detail::BasisFactor factor;
  factor.factorize(s.m, s.columns);
  Answer answer;
  if (!factor.nonsingular()) return answer;
  exact::detail::SparseVector in(s.m), out(s.m);
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

}  // namespace

int main(int argc, char** argv) {
  constexpr double float_limit = 120;  // seconds for the float simplex to find each basis
  fs::path shared = PLUMB_SHARED_DIR;
  std::set<std::string> only;  // instance names given on the command line; all when none
  for (int a = 1; a < argc; ++a) {
    if (std::string(argv[a]) == "--shared" && a + 1 < argc) shared = argv[++a];
    else only.insert(argv[a]);
  }
  std::printf("%-9s %6s %7s | %10s | %10s %5s %5s %6s %6s | %7s %s\n", "instance", "m", "nnz(B)", "LU s",
              "refine s", "itx", "ity", "den x", "den y", "LU/ref", "agree");
  for (const auto& name : instance_names(shared / "netlib" / "published.csv")) {
    if (!only.empty() && !only.count(name)) continue;
    model::ReadOptions read_options;
    read_options.constant_rule = model::ObjectiveConstantRule::ignored;
    model::Model model = model::read_model((shared / "netlib" / (name + ".mps.gz")).string(), read_options);
    run::Budget budget(float_limit, std::nullopt);
    simplex::FloatOptions options;
    options.budget = &budget;
    auto found = simplex::solve_float(model, options);
    BasisSystem system;
    if (found.status != simplex::FloatStatus::optimal || !basis_system(model, found.basis, system)) {
      std::printf("%-9s no optimal float basis (%s)\n", name.c_str(), found.note.c_str());
      std::fflush(stdout);
      continue;
    }
    Answer lu, refined;
    exact::detail::RefineStats primal, dual;
    double lu_seconds = timed([&] { lu = by_rational_lu(system); });
    double refine_seconds = timed([&] { refined = by_refinement(system, primal, dual); });
    const char* agree = !lu.found ? "LU singular" : !refined.found ? "refinement refused" :
                        (lu.x == refined.x && lu.y == refined.y) ? "yes" : "NO";
    std::printf("%-9s %6d %7zu | %10.4f | %10.4f %5d %5d %6ld %6ld | %7.2f %s\n", name.c_str(), system.m,
                system.nonzeros, lu_seconds, refine_seconds, primal.iterations, dual.iterations,
                primal.denominator_bits, dual.denominator_bits, lu_seconds / refine_seconds, agree);
    std::fflush(stdout);
  }
  return 0;
}
