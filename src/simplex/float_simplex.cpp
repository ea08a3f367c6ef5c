// Floating-point bounded dual simplex: the entry point, from the exact model to a basis.
#include "plumb/simplex/float_simplex.hpp"

#include "engine.hpp"
#include "lp_data.hpp"

namespace plumb::simplex {

FloatResult solve_float(const model::Model& model, const FloatOptions& options) {
  FloatResult result;
  detail::LpData lp = detail::lp_from_model(model);
  if (const CorrectionProblem* correction = options.correction) {
    lp.lower = correction->lower;
    lp.upper = correction->upper;
    lp.cost = correction->cost;
    lp.sense = 1;
    lp.constant = 0;
  }
  detail::scale(lp);
  const int n = lp.columns, m = lp.rows;
  for (int j = 0; j < lp.variables(); ++j) {
    if (lp.lower[j] > lp.upper[j]) {
      result.status = FloatStatus::infeasible;
      result.basis.columns.assign(n, VarStatus::at_lower);
      result.basis.rows.assign(m, VarStatus::basic);
      result.ray_variable = j;
      result.note = "a bound pair crosses";
      return result;
    }
  }
  detail::FloatEngine engine(lp, options);
  if (options.warm_start && static_cast<int>(options.warm_start->columns.size()) == n &&
      static_cast<int>(options.warm_start->rows.size()) == m) {
    std::vector<VarStatus> statuses(options.warm_start->columns);
    statuses.insert(statuses.end(), options.warm_start->rows.begin(), options.warm_start->rows.end());
    engine.start_from(statuses);
  }
  result.status = engine.solve();
  const auto& statuses = engine.statuses();
  result.basis.columns.assign(statuses.begin(), statuses.begin() + n);
  result.basis.rows.assign(statuses.begin() + n, statuses.end());
  result.iterations = engine.iterations();
  result.objective = lp.model_objective(engine.objective());
  result.ray_variable = engine.ray_variable();
  result.note = engine.note();
  return result;
}

}  // namespace plumb::simplex
