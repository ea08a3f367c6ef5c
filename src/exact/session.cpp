// The solve session: the model as edited, its last basis, and the verified solve path.
#include "plumb/exact/session.hpp"

#include "solve_path.hpp"

#include <chrono>
#include <map>
#include <optional>
#include <set>
#include <stdexcept>
#include <string>
#include <utility>
#include <vector>

namespace plumb::exact {

namespace {

void require_index(int index, int count, const char* what) {
  if (index < 0 || index >= count)
    throw std::out_of_range(std::string("Session: no ") + what + " " + std::to_string(index));
}

}  // namespace

struct Session::State {
  explicit State(const model::Model& model) : original(model) {}

  const model::Model& original;
  // A copy made at the first edit; current() while edited() holds.
  std::optional<model::Model> edited;
  // Per changed row and column (whose sides or bounds differ from the original), its entry of the
  // "changes" key, made at the edit: a filter's solves carry hundreds of changes, and formatting
  // them again for every certificate had taken a sixth of its time.
  std::map<int, nlohmann::ordered_json> changed_rows, changed_columns;
  Goal goal = Goal::model_objective;
  // The float LP of current(), made at the first float search; the rows and columns edited since
  // it was last brought up to date, and whether the objective changed.
  std::optional<simplex::FloatModel> float_model;
  std::set<int> stale_rows, stale_columns;
  bool stale_objective = false;
  simplex::Basis basis;  // where the last solve ended; empty before the first
  // The pricing weights the last float search ended with, and those of the search on the costs
  // (simplex::DualWeights): a guide for the next start, whose basis is where the exact engine
  // ended, the float search's own basis unless certification had to move on from it.
  simplex::DualWeights weights, cost_search_weights;
  bool basis_from_zero_costs = false;  // found by the zero-cost search (detail::SearchStart)
  // The last basis a solve ended at that the search on the model's costs found: when solves the
  // zero-cost search answered came after it, the next search on the costs starts there, not
  // cold.  (Where the search on the costs stood when the zero-cost search's proof was taken is
  // not kept: whether it had ended by then depends on timing, and no re-solve's path may.)
  simplex::Basis cost_search_basis;
  // The last proof of infeasibility a solve found, and the limits (lower, upper) its rows and
  // columns had then, for those edited since: the proof holds still while every row or column
  // whose limits differ from then carries no multiplier (earlier_proof_unaffected).
  std::optional<Solution> infeasible;
  bool infeasible_has_few_multipliers = false;
  using Limits = std::pair<model::Side, model::Side>;
  std::map<int, Limits> rows_then, columns_then;

  template <class Item>
  static void remember(int k, const Item& item, std::map<int, Limits>& then) {
    then.try_emplace(k, item.lower, item.upper);
  }
  template <class Item>
  static std::vector<int> differing(const std::vector<Item>& now, const std::map<int, Limits>& then) {
    std::vector<int> moved;
    for (const auto& [k, limits] : then)
      if (now[k].lower != limits.first || now[k].upper != limits.second) moved.push_back(k);
    return moved;
  }

  const model::Model& current_model() const { return edited ? *edited : original; }
  const simplex::FloatModel& float_model_now() {
    if (!float_model) {
      float_model.emplace(current_model());
    } else {
      for (int row : stale_rows) float_model->take_row(current_model(), row);
      for (int column : stale_columns) float_model->take_column(current_model(), column);
      if (stale_objective) float_model->take_objective(current_model());
    }
    stale_rows.clear();
    stale_columns.clear();
    stale_objective = false;
    return *float_model;
  }
  model::Model& copy() {
    if (!edited) {
      edited = original;
      edited->source.sha256.clear();  // never the file's certificate once edited
    }
    return *edited;
  }
  bool any_change() const { return !changed_rows.empty() || !changed_columns.empty() || goal != Goal::model_objective; }

  void edit_row(int row, model::Side model::Row::*side, model::Side value) {
    require_index(row, original.row_count(), "row");
    remember(row, current_model().rows[row], rows_then);
    copy().rows[row].*side = std::move(value);
    stale_rows.insert(row);
    note("row", row, edited->rows, original.rows, changed_rows);
  }
  void edit_column(int column, model::Side model::Column::*side, model::Side value) {
    require_index(column, original.column_count(), "column");
    remember(column, current_model().columns[column], columns_then);
    copy().columns[column].*side = std::move(value);
    stale_columns.insert(column);
    note("column", column, edited->columns, original.columns, changed_columns);
  }
  template <class Item>
  static void note(const char* kind, int k, const std::vector<Item>& now, const std::vector<Item>& was,
                   std::map<int, nlohmann::ordered_json>& changed) {
    if (now[k].lower == was[k].lower && now[k].upper == was[k].upper) {
      changed.erase(k);
      return;
    }
    auto side = [](const model::Side& value) -> nlohmann::ordered_json {
      return value ? nlohmann::ordered_json(numeric::to_fraction(*value)) : nlohmann::ordered_json(nullptr);
    };
    changed[k] = {{kind, now[k].name}, {"lower", side(now[k].lower)}, {"upper", side(now[k].upper)}};
  }

  // Whether the edits since the last solve leave its proof of infeasibility standing: no edited
  // row carries a multiplier and no edited column's bounds are pressed (its entry of A^T y is 0),
  // or, for a proof on single sides and bounds, none of its entries was edited.  A necessary
  // condition only: the checker has the last word on the proof as a certificate of current().
  bool earlier_proof_unaffected() const {
    const Solution& proof = *infeasible;
    const model::Model& now = current_model();
    std::vector<int> rows = differing(now.rows, rows_then), columns = differing(now.columns, columns_then);
    if (!proof.farkas.empty()) {
      for (const certificate::FarkasTerm& term : proof.farkas) {
        bool row = term.entry.kind == certificate::EntryKind::row;
        for (int k : row ? rows : columns)
          if ((row ? now.rows[k].name : now.columns[k].name) == term.entry.name) return false;
      }
      return true;
    }
    for (int row : rows)
      if (proof.y[row] != 0) return false;
    for (int column : columns) {
      Rational pressure = 0;
      std::span<const int> entry_rows = now.matrix.column_rows(column);
      std::span<const Rational> values = now.matrix.column_values(column);
      for (std::size_t k = 0; k < entry_rows.size(); ++k) pressure += values[k] * proof.y[entry_rows[k]];
      if (pressure != 0) return false;
    }
    return true;
  }

  // The "changes" key of an edited model's certificates: each changed row or column with its
  // sides as solved, and the goal when it is not the model's objective.
  nlohmann::ordered_json changes() const {
    nlohmann::ordered_json list = nlohmann::ordered_json::array();
    for (const auto& entries : {&changed_rows, &changed_columns})
      for (const auto& [k, change] : *entries) list.push_back(change);
    if (goal == Goal::feasibility) list.push_back({{"goal", "feasibility"}});
    return list;
  }
};


Session::Session(const model::Model& model) : state_(std::make_unique<State>(model)) {}
Session::~Session() = default;
Session::Session(Session&&) noexcept = default;
Session& Session::operator=(Session&&) noexcept = default;

void Session::set_row_lower(int row, model::Side value) { state_->edit_row(row, &model::Row::lower, std::move(value)); }
void Session::set_row_upper(int row, model::Side value) { state_->edit_row(row, &model::Row::upper, std::move(value)); }
void Session::set_column_lower(int column, model::Side value) {
  state_->edit_column(column, &model::Column::lower, std::move(value));
}
void Session::set_column_upper(int column, model::Side value) {
  state_->edit_column(column, &model::Column::upper, std::move(value));
}

void Session::restore_row(int row) {
  require_index(row, state_->original.row_count(), "row");
  if (!state_->changed_rows.contains(row)) return;
  State::remember(row, state_->edited->rows[row], state_->rows_then);
  state_->edited->rows[row] = state_->original.rows[row];
  state_->stale_rows.insert(row);
  state_->changed_rows.erase(row);
}

void Session::restore_column(int column) {
  require_index(column, state_->original.column_count(), "column");
  if (!state_->changed_columns.contains(column)) return;
  State::remember(column, state_->edited->columns[column], state_->columns_then);
  state_->edited->columns[column] = state_->original.columns[column];
  state_->stale_columns.insert(column);
  state_->changed_columns.erase(column);
}

void Session::restore_all() {
  while (!state_->changed_rows.empty()) restore_row(state_->changed_rows.begin()->first);
  while (!state_->changed_columns.empty()) restore_column(state_->changed_columns.begin()->first);
  set_goal(Goal::model_objective);
}

void Session::set_goal(Goal goal) {
  if (goal == state_->goal) return;
  model::Objective& objective = state_->copy().objective;
  if (goal == Goal::feasibility) {
    objective.sense = model::Sense::minimise;
    objective.constant = 0;
    objective.coefficients.assign(objective.coefficients.size(), Rational(0));
  } else {
    objective = state_->original.objective;
  }
  state_->goal = goal;
  state_->stale_objective = true;
}

Goal Session::goal() const { return state_->goal; }

bool Session::edited() const { return state_->any_change(); }

const model::Model& Session::current() const { return edited() ? *state_->edited : state_->original; }

CertifiedSolution Session::solve(const SolveOptions& options) {
  State& state = *state_;
  auto started = std::chrono::steady_clock::now();
  // A deletion filter's restore, or a relaxation outside the proof: the last proof of
  // infeasibility may hold still, as the checker decides, for the price of one check.
  bool reusable = state.infeasible && options.earlier_proof && options.method == Method::hybrid &&
                  !options.warm_start && options.fault == Fault::none &&
                  (state.infeasible_has_few_multipliers || !options.few_multipliers);
  std::vector<std::string> rejections;
  if (reusable && state.earlier_proof_unaffected()) {
    CertifiedSolution result;
    result.solution = *state.infeasible;
    result.solution.stats = {};
    result.solution.stats.proof = "earlier proof";
    result.certificate = make_certificate(current(), result.solution, options.certificate_extras);
    result.verdict = check::verify(current(), result.certificate);
    if (result.verdict.valid) {
      result.solution.stats.certify_seconds =
          std::chrono::duration<double>(std::chrono::steady_clock::now() - started).count();
      if (edited() && options.certificate_extras) result.certificate.extra["changes"] = state.changes();
      return result;
    }
    // Unaffected by the edits, the proof must hold: a rejection is a bug, reported like the
    // solve path's; the solve below answers instead.
    rejections.push_back("the checker rejected the earlier proof of infeasibility: " +
                         result.verdict.failure);
  }

  detail::SearchStart start;
  start.basis = state.basis.empty() ? options.search_start : &state.basis;
  if (!state.basis.empty()) start.weights = &state.weights;
  start.from_zero_costs = !state.basis.empty() && state.basis_from_zero_costs;
  if (!state.cost_search_basis.empty()) {
    start.cost_search_basis = &state.cost_search_basis;
    start.cost_search_weights = &state.cost_search_weights;
  }
  start.float_model = [&state]() -> const simplex::FloatModel& { return state.float_model_now(); };
  simplex::DualWeights weights_found;
  start.weights_found = &weights_found;
  CertifiedSolution result = detail::verified_solve(current(), options, start);
  result.rejections.insert(result.rejections.begin(), rejections.begin(), rejections.end());
  if (result.solution.outcome == Outcome::stopped) return result;
  if (!result.solution.basis.empty()) {
    state.basis = result.solution.basis;
    state.weights = std::move(weights_found);
    state.basis_from_zero_costs = result.solution.stats.zero_cost_search;
    if (!state.basis_from_zero_costs) {
      state.cost_search_basis = state.basis;
      state.cost_search_weights = state.weights;
    }
  }
  if (result.certified() && result.solution.outcome == Outcome::infeasible) {
    state.infeasible = result.solution;
    state.infeasible_has_few_multipliers = options.few_multipliers;
    state.rows_then.clear();
    state.columns_then.clear();
  }
  if (result.certified() && edited() && options.certificate_extras)
    result.certificate.extra["changes"] = state.changes();
  return result;
}

CertifiedSolution certified_solve(const model::Model& model, const SolveOptions& options) {
  return Session(model).solve(options);
}

}  // namespace plumb::exact
