// Infeasibility and unboundedness proven from the float search: auxiliary LPs on the model's
// matrix, solved in float and certified at their optimal bases by refinement, as optimality is.
#include "auxiliary.hpp"

#include <utility>

namespace plumb::exact::detail {
namespace {

using simplex::VarStatus;

// A copy of the model's rows, columns and matrix without names, labels or objective, plus the
// given extra columns: the shape of every auxiliary LP below.
model::Model auxiliary_shape(const model::Model& model, std::vector<model::Column> extra_columns,
                             std::vector<model::Entry> extra_entries) {
  model::Model shape;
  shape.source.format = "built";
  shape.rows.resize(model.rows.size());
  for (std::size_t i = 0; i < model.rows.size(); ++i) {
    shape.rows[i].lower = model.rows[i].lower;
    shape.rows[i].upper = model.rows[i].upper;
  }
  shape.columns.resize(model.columns.size());
  for (std::size_t j = 0; j < model.columns.size(); ++j) {
    shape.columns[j].lower = model.columns[j].lower;
    shape.columns[j].upper = model.columns[j].upper;
  }
  std::move(extra_columns.begin(), extra_columns.end(), std::back_inserter(shape.columns));
  std::vector<model::Entry> entries;
  entries.reserve(model.matrix.nonzeros() + extra_entries.size());
  for (int j = 0; j < model.column_count(); ++j) {
    auto rows = model.matrix.column_rows(j);
    auto values = model.matrix.column_values(j);
    for (std::size_t e = 0; e < rows.size(); ++e) entries.push_back({rows[e], j, values[e]});
  }
  std::move(extra_entries.begin(), extra_entries.end(), std::back_inserter(entries));
  shape.matrix = model::Matrix::from_entries(shape.row_count(), shape.column_count(), std::move(entries));
  shape.objective.coefficients.assign(shape.columns.size(), Rational(0));
  return shape;
}

// min sum of violations: row i may take a unit of slack at cost one below its lower side
// (a_i.x + p_i >= L_i) and above its upper side (a_i.x - q_i <= U_i); the bounds stay hard.  It is
// feasible whenever no bound pair crosses, and its optimum is zero exactly when the model is
// feasible.  Its dual bounds every |y_i| by one.
model::Model least_infeasibility_model(const model::Model& model) {
  std::vector<model::Column> elastic;
  std::vector<model::Entry> entries;
  for (int i = 0; i < model.row_count(); ++i) {
    for (int side : {1, -1}) {
      if (!(side > 0 ? model.rows[i].lower : model.rows[i].upper)) continue;
      entries.push_back({i, model.column_count() + static_cast<int>(elastic.size()), Rational(side)});
      elastic.push_back(model::Column{});  // at or above zero
    }
  }
  model::Model auxiliary = auxiliary_shape(model, std::move(elastic), std::move(entries));
  for (std::size_t j = model.columns.size(); j < auxiliary.columns.size(); ++j) auxiliary.objective.coefficients[j] = 1;
  return auxiliary;
}

// The model's own constraints under a zero objective: any optimum is a feasible point.
model::Model feasibility_model(const model::Model& model) { return auxiliary_shape(model, {}, {}); }

// The model's costs over its recession cone: a bound pair becomes zero and a single bound zero
// (so each variable may move only where the model lets it move without end), and columns are
// boxed to [-1, 1] so that the optimum is finite.  An improving optimum r is a ray of the model.
model::Model recession_model(const model::Model& model) {
  model::Model auxiliary = auxiliary_shape(model, {}, {});
  auxiliary.objective.sense = model.objective.sense;
  auxiliary.objective.coefficients = model.objective.coefficients;
  auto cone = [](model::Side& lower, model::Side& upper, bool boxed) {
    bool open_below = !lower, open_above = !upper;
    lower = open_below ? (boxed ? model::Side(Rational(-1)) : model::Side()) : model::Side(Rational(0));
    upper = open_above ? (boxed ? model::Side(Rational(1)) : model::Side()) : model::Side(Rational(0));
  };
  for (auto& column : auxiliary.columns) cone(column.lower, column.upper, true);
  for (auto& row : auxiliary.rows) cone(row.lower, row.upper, false);
  return auxiliary;
}

struct AuxiliaryOptimum {
  simplex::FloatResult found;         // the float search on the auxiliary LP
  std::optional<EngineResult> exact;  // its optimum, certified by refinement
};

// Solves the auxiliary LP in float from `start` and certifies the basis it ends at (with
// correction rounds as needed); when that fails, the exact engine pivots on the auxiliary LP from
// the last basis tried, which is nearly optimal there (gran with one row relaxed: 3 exact pivots
// here against 226 on the model itself from the float search's basis, 12.7 s).
AuxiliaryOptimum certified_optimum(const model::Model& auxiliary, const SolveOptions& options,
                                   const simplex::Basis& start, SolveStats& stats, const std::string& what) {
  simplex::FloatOptions search;
  search.budget = options.budget;
  search.warm_start = &start;
  search.progress = float_progress(options, what + ": float ");
  // The least-infeasibility and recession LPs are feasible by construction and the feasible-point
  // LP has no costs: a zero-cost search beside them would find nothing new.
  search.feasibility_search = false;
  AuxiliaryOptimum optimum{simplex::solve_float(auxiliary, search), std::nullopt};
  stats.auxiliary_iterations += optimum.found.iterations;
  if (options.fault == Fault::auxiliary_search_fails) {
    optimum.found.status = simplex::FloatStatus::failed;
    optimum.found.note = "failure injected";
  }
  if (optimum.found.status == simplex::FloatStatus::failed)
    stats.float_note = what + ": " + optimum.found.note;
  // A failed search usually gave up near an optimal basis (solve_from does the same on the model):
  // refinement may prove it, else the exact engine pivots on the auxiliary LP from there.  (The
  // least-infeasibility LP of greenbea, ../shared/netlib-infeas, had ended "no stable optimal
  // basis after repeated clean-up" at a basis refinement proved at once, where giving up had
  // meant minutes of exact pivots on the model; the float search's clean-up now ends optimal.)
  if (optimum.found.status != simplex::FloatStatus::optimal &&
      optimum.found.status != simplex::FloatStatus::failed)
    return optimum;
  RationalEngine engine(auxiliary, options.budget, &options.progress);
  simplex::Basis basis = optimum.found.basis;
  bool refined = options.fault != Fault::auxiliary_not_refined &&
                 certify_with_corrections(engine, auxiliary, options, basis, stats);
  if (!refined) engine.start_from(basis);
  optimum.exact = engine.run();
  stats.exact_iterations += optimum.exact->iterations;
  if (optimum.exact->outcome != Outcome::optimal) optimum.exact.reset();
  return optimum;
}

// The model's part of an auxiliary basis (its columns, then its rows): a warm start for later
// solves of the model, repaired there when it has too many basic variables.
simplex::Basis model_part(const model::Model& model, simplex::Basis basis) {
  basis.columns.resize(model.columns.size());
  return basis;
}

Solution proven(Outcome outcome, const SolveStats& stats, const char* proof) {
  Solution solution;
  solution.outcome = outcome;
  solution.stats = stats;
  solution.stats.proof = proof;
  solution.stats.repaired = stats.correction_rounds > 0 || stats.exact_iterations > 0;
  return solution;
}

}  // namespace

std::optional<Solution> prove_infeasible(const model::Model& model, const SolveOptions& options,
                                         const simplex::Basis& basis, SolveStats& stats) {
  model::Model auxiliary = least_infeasibility_model(model);
  simplex::Basis start = basis;
  start.columns.resize(auxiliary.columns.size(), VarStatus::at_lower);  // no slack taken
  AuxiliaryOptimum least = certified_optimum(auxiliary, options, start, stats, "least infeasibility");
  if (!least.exact || auxiliary.objective_value(least.exact->x) <= 0) return std::nullopt;
  Solution solution = proven(Outcome::infeasible, stats, "least infeasibility");
  solution.y = std::move(least.exact->y);
  solution.basis = model_part(model, std::move(least.exact->basis));
  return solution;
}

std::optional<Solution> prove_unbounded(const model::Model& model, const SolveOptions& options,
                                        const simplex::Basis& basis, SolveStats& stats) {
  AuxiliaryOptimum point = certified_optimum(feasibility_model(model), options, basis, stats, "feasible point");
  if (point.found.status == simplex::FloatStatus::infeasible) return prove_infeasible(model, options, point.found.basis, stats);
  if (!point.exact) return std::nullopt;
  model::Model cone = recession_model(model);
  AuxiliaryOptimum ray = certified_optimum(cone, options, point.exact->basis, stats, "ray");
  if (!ray.exact) return std::nullopt;
  Rational slope = cone.objective_value(ray.exact->x);  // c.r, in the model's sense
  if (model.objective.sense == model::Sense::maximise ? slope <= 0 : slope >= 0) return std::nullopt;
  Solution solution = proven(Outcome::unbounded, stats, "feasible point and ray");
  solution.x = std::move(point.exact->x);
  solution.ray = std::move(ray.exact->x);
  solution.basis = std::move(point.exact->basis);
  return solution;
}

}  // namespace plumb::exact::detail
