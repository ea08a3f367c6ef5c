// Floating-point bounded dual simplex: the entry point, from the exact model to a basis.
#include "plumb/simplex/float_simplex.hpp"

#include "engine.hpp"
#include "lp_data.hpp"

#include <algorithm>
#include <atomic>
#include <chrono>
#include <condition_variable>
#include <exception>
#include <mutex>
#include <thread>

namespace plumb::simplex {

namespace {

FloatResult result_of(const detail::FloatEngine& engine, const detail::LpData& lp, FloatStatus status) {
  FloatResult result;
  result.status = status;
  const auto& statuses = engine.statuses();
  result.basis.columns.assign(statuses.begin(), statuses.begin() + lp.columns);
  result.basis.rows.assign(statuses.begin() + lp.columns, statuses.end());
  result.dual_weights = engine.dual_weights();
  result.iterations = engine.iterations();
  result.objective = lp.model_objective(engine.objective());
  result.ray_variable = engine.ray_variable();
  result.note = engine.note();
  return result;
}

// Infeasibility does not depend on the costs, and a search with none needs no dual phase 1 and
// meets none of the dual degeneracy the costs bring: on the infeasible Netlib models it ends
// infeasible in at most the time of the search on the model's costs, often far less (gosh: 2 048
// iterations against 16 301).  On a model that turns out feasible it only finds a feasible point,
// useless here, and often costs as much as the whole search (dfl001).  So it runs on a second
// core beside the search on the model's costs, and counts only when it proves infeasibility:
//  - it ends infeasible first: the main search is stopped, the zero-cost result is used;
//  - the main search ends infeasible first: it waits for the zero-cost search and prefers its
//    result when infeasible, so that which of the two is used never depends on timing;
//  - the main search ends any other way: the zero-cost search is stopped, the main result used.
FloatResult race_with_feasibility_search(detail::FloatEngine& main, const detail::LpData& lp,
                                         const std::vector<VarStatus>* start, const DualWeights* weights,
                                         run::Budget* budget) {
  FloatOptions silent;  // no budget (it is not thread-safe) and no progress: the main search has them
  detail::FloatEngine scout(lp, silent, detail::SearchGoal::feasibility);
  if (start) scout.start_from(*start, weights);
  std::atomic<bool> stop_main{false}, stop_scout{false};
  bool scout_done = false;  // guarded by `done_mutex`, announced on `done_signal`
  std::mutex done_mutex;
  std::condition_variable done_signal;
  scout.stop_when(stop_scout);
  main.stop_when(stop_main);
  FloatStatus scout_status = FloatStatus::failed;
  std::exception_ptr scout_error;
  std::thread second([&] {
    try {
      scout_status = scout.solve();
    } catch (...) {
      scout_error = std::current_exception();
    }
    if (scout_status == FloatStatus::infeasible) stop_main.store(true);
    std::lock_guard lock(done_mutex);
    scout_done = true;
    done_signal.notify_one();
  });
  FloatStatus main_status;
  try {
    main_status = main.solve();
  } catch (...) {
    stop_scout.store(true);
    second.join();
    throw;
  }
  if (main_status != FloatStatus::infeasible) stop_scout.store(true);
  // While it waits, the caller's budget (polled here, on the thread that owns it) still binds.
  // Woken at once when the zero-cost search ends: a fixed sleep had cost a millisecond per solve,
  // most of a session's re-solve of a small model.
  {
    std::unique_lock lock(done_mutex);
    while (!done_signal.wait_for(lock, std::chrono::milliseconds(1), [&] { return scout_done; }))
      if (budget && budget->exhausted()) stop_scout.store(true);
  }
  second.join();
  if (scout_error) std::rethrow_exception(scout_error);
  bool main_decided = main_status == FloatStatus::optimal || main_status == FloatStatus::unbounded;
  if (scout_status == FloatStatus::infeasible && !main_decided) {
    FloatResult result = result_of(scout, lp, scout_status);
    result.zero_cost_search = true;
    return result;
  }
  return result_of(main, lp, main_status);
}

// The correction problem's bounds and costs in place of the model's, in lp's scale.
void take_correction(detail::LpData& lp, const CorrectionProblem& correction) {
  lp.lower = correction.lower;
  lp.upper = correction.upper;
  lp.cost = correction.cost;
  lp.sense = 1;
  lp.constant = 0;
  detail::scale_limits_and_costs(lp);
}

// The search on lp, scaled, with its bounds and costs as they are.
FloatResult solve_lp(const detail::LpData& lp, const FloatOptions& options) {
  FloatResult result;
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
  detail::FloatEngine engine(lp, options);  // at the logical basis
  // A correction problem is feasible by construction; with no costs the two searches are one; on
  // one core the race would take the time of both.
  bool race = options.feasibility_search && !options.correction && std::thread::hardware_concurrency() >= 2 &&
              std::any_of(lp.cost.begin(), lp.cost.end(), [](double c) { return c != 0; });
  auto statuses_of = [n, m](const Basis* basis) {
    std::vector<VarStatus> statuses;
    if (basis && static_cast<int>(basis->columns.size()) == n && static_cast<int>(basis->rows.size()) == m) {
      statuses = basis->columns;
      statuses.insert(statuses.end(), basis->rows.begin(), basis->rows.end());
    }
    return statuses;
  };
  std::vector<VarStatus> statuses = statuses_of(options.warm_start);
  const bool zero_cost_start = race && options.warm_start_from_zero_costs;
  std::vector<VarStatus> cost_search_statuses =
      zero_cost_start ? statuses_of(options.cost_search_start) : statuses;
  const DualWeights* cost_search_weights =
      zero_cost_start ? options.cost_search_weights : options.warm_weights;
  if (!cost_search_statuses.empty())
    engine.start_from(cost_search_statuses, cost_search_weights);
  else if (options.crash)
    engine.crash_equality_rows();
  if (race)
    return race_with_feasibility_search(engine, lp, statuses.empty() ? nullptr : &statuses,
                                        options.warm_weights, options.budget);
  return result_of(engine, lp, engine.solve());
}

}  // namespace

FloatModel::FloatModel(const model::Model& model)
    : lp_(std::make_unique<detail::LpData>(detail::lp_from_model(model))) {
  detail::scale(*lp_);
}
FloatModel::~FloatModel() = default;
FloatModel::FloatModel(FloatModel&&) noexcept = default;
FloatModel& FloatModel::operator=(FloatModel&&) noexcept = default;

void FloatModel::take_row(const model::Model& model, int row) {
  detail::take_row_limits(*lp_, row, model.rows[row]);
}
void FloatModel::take_column(const model::Model& model, int column) {
  detail::take_column_limits(*lp_, column, model.columns[column]);
}
void FloatModel::take_objective(const model::Model& model) { detail::take_objective(*lp_, model.objective); }

FloatResult solve_float(const model::Model& model, const FloatOptions& options) {
  FloatModel built(model);
  if (options.correction) take_correction(*built.lp_, *options.correction);  // this search's own LP
  return solve_lp(*built.lp_, options);
}

FloatResult solve_float(const FloatModel& model, const FloatOptions& options) {
  if (!options.correction) return solve_lp(*model.lp_, options);
  detail::LpData corrected = *model.lp_;  // the kept LP stays as it is
  take_correction(corrected, *options.correction);
  return solve_lp(corrected, options);
}

}  // namespace plumb::simplex
