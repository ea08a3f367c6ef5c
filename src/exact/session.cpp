// The solve session: the model as edited, its last basis, and the verified solve path.
#include "plumb/exact/session.hpp"

#include "solve_path.hpp"

#include <map>
#include <optional>
#include <stdexcept>
#include <string>

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
  simplex::Basis basis;  // where the last solve ended; empty before the first

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
    copy().rows[row].*side = std::move(value);
    note("row", row, edited->rows, original.rows, changed_rows);
  }
  void edit_column(int column, model::Side model::Column::*side, model::Side value) {
    require_index(column, original.column_count(), "column");
    copy().columns[column].*side = std::move(value);
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
  state_->edited->rows[row] = state_->original.rows[row];
  state_->changed_rows.erase(row);
}

void Session::restore_column(int column) {
  require_index(column, state_->original.column_count(), "column");
  if (!state_->changed_columns.contains(column)) return;
  state_->edited->columns[column] = state_->original.columns[column];
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
}

Goal Session::goal() const { return state_->goal; }

bool Session::edited() const { return state_->any_change(); }

const model::Model& Session::current() const { return edited() ? *state_->edited : state_->original; }

CertifiedSolution Session::solve(const SolveOptions& options) {
  const simplex::Basis* last = state_->basis.empty() ? options.search_start : &state_->basis;
  CertifiedSolution result = detail::verified_solve(current(), options, last);
  if (result.solution.outcome != Outcome::stopped && !result.solution.basis.empty()) state_->basis = result.solution.basis;
  if (result.certified() && edited()) result.certificate.extra["changes"] = state_->changes();
  return result;
}

CertifiedSolution certified_solve(const model::Model& model, const SolveOptions& options) {
  return Session(model).solve(options);
}

}  // namespace plumb::exact
