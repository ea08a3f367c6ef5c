#include "plumb/model/model.hpp"

#include <algorithm>
#include <stdexcept>

namespace plumb::model {

Matrix Matrix::from_entries(int rows, int columns, std::vector<Entry> entries) {
  Matrix m;
  m.rows_ = rows;
  m.columns_ = columns;
  std::erase_if(entries, [](const Entry& e) { return e.value == 0; });
  std::sort(entries.begin(), entries.end(), [](const Entry& a, const Entry& b) {
    return a.column != b.column ? a.column < b.column : a.row < b.row;
  });
  m.column_start_.assign(static_cast<std::size_t>(columns) + 1, 0);
  m.row_index_.reserve(entries.size());
  m.values_.reserve(entries.size());
  for (std::size_t k = 0; k < entries.size(); ++k) {
    const Entry& e = entries[k];
    if (e.row < 0 || e.row >= rows || e.column < 0 || e.column >= columns)
      throw std::out_of_range("matrix entry outside the model");
    if (k > 0 && entries[k - 1].row == e.row && entries[k - 1].column == e.column)
      throw std::invalid_argument("matrix entry given twice");
    ++m.column_start_[static_cast<std::size_t>(e.column) + 1];
    m.row_index_.push_back(e.row);
    m.values_.push_back(std::move(entries[k].value));
  }
  for (int j = 0; j < columns; ++j) m.column_start_[j + 1] += m.column_start_[j];
  // Row-wise index: counting sort by row keeps columns ascending within a row.
  m.row_start_.assign(static_cast<std::size_t>(rows) + 1, 0);
  for (int r : m.row_index_) ++m.row_start_[static_cast<std::size_t>(r) + 1];
  for (int i = 0; i < rows; ++i) m.row_start_[i + 1] += m.row_start_[i];
  m.column_index_.resize(m.values_.size());
  m.row_position_.resize(m.values_.size());
  std::vector<std::size_t> fill(m.row_start_.begin(), m.row_start_.end() - 1);
  for (int j = 0; j < columns; ++j) {
    for (std::size_t p = m.column_start_[j]; p < m.column_start_[j + 1]; ++p) {
      std::size_t slot = fill[m.row_index_[p]]++;
      m.column_index_[slot] = j;
      m.row_position_[slot] = p;
    }
  }
  return m;
}

std::span<const int> Matrix::column_rows(int j) const {
  return {row_index_.data() + column_start_[j], column_start_[j + 1] - column_start_[j]};
}
std::span<const Rational> Matrix::column_values(int j) const {
  return {values_.data() + column_start_[j], column_start_[j + 1] - column_start_[j]};
}
std::span<const int> Matrix::row_columns(int i) const {
  return {column_index_.data() + row_start_[i], row_start_[i + 1] - row_start_[i]};
}
std::span<const std::size_t> Matrix::row_positions(int i) const {
  return {row_position_.data() + row_start_[i], row_start_[i + 1] - row_start_[i]};
}

Rational Matrix::at(int i, int j) const {
  auto rows_of_j = column_rows(j);
  auto it = std::lower_bound(rows_of_j.begin(), rows_of_j.end(), i);
  if (it == rows_of_j.end() || *it != i) return 0;
  return values_[column_start_[j] + static_cast<std::size_t>(it - rows_of_j.begin())];
}

bool Matrix::operator==(const Matrix& other) const {
  return rows_ == other.rows_ && columns_ == other.columns_ && column_start_ == other.column_start_ &&
         row_index_ == other.row_index_ && values_ == other.values_;
}

bool Model::has_integers() const {
  return std::any_of(columns.begin(), columns.end(), [](const Column& c) { return c.integer; });
}

void Model::index_names() {
  row_by_name_.clear();
  column_by_name_.clear();
  row_by_name_.reserve(rows.size());
  column_by_name_.reserve(columns.size());
  for (int i = 0; i < row_count(); ++i) row_by_name_.emplace(rows[i].name, i);
  for (int j = 0; j < column_count(); ++j) column_by_name_.emplace(columns[j].name, j);
}

std::optional<int> Model::find_row(std::string_view name) const {
  auto it = row_by_name_.find(std::string(name));
  if (it == row_by_name_.end()) return std::nullopt;
  return it->second;
}

std::optional<int> Model::find_column(std::string_view name) const {
  auto it = column_by_name_.find(std::string(name));
  if (it == column_by_name_.end()) return std::nullopt;
  return it->second;
}

Rational Model::objective_value(const std::vector<Rational>& x) const {
  // Over a common denominator of the terms that count only: a feasibility question has no costs,
  // and scaling every value of x for it had cost a filter's sub-solves a twentieth of their time.
  std::vector<int> counted;
  std::vector<Rational> values;
  for (int j = 0; j < column_count(); ++j)
    if (objective.coefficients[j] != 0 && x[j] != 0) {
      counted.push_back(j);
      values.push_back(x[j]);
    }
  numeric::CommonDenominator scaled = numeric::over_common_denominator(values);
  Rational sum = 0;
  for (std::size_t k = 0; k < counted.size(); ++k)
    sum += objective.coefficients[counted[k]] * scaled.numerators[k];
  return sum / scaled.denominator + objective.constant;
}

bool Model::same_content(const Model& other) const {
  return title == other.title && rows == other.rows && columns == other.columns &&
         objective == other.objective && matrix == other.matrix && decisions == other.decisions;
}

ModelBuilder::ModelBuilder(std::string title) {
  model_.title = std::move(title);
  model_.source.format = "built";
}
ModelBuilder& ModelBuilder::minimise() {
  model_.objective.sense = Sense::minimise;
  return *this;
}
ModelBuilder& ModelBuilder::maximise() {
  model_.objective.sense = Sense::maximise;
  return *this;
}
ModelBuilder& ModelBuilder::objective_constant(Rational constant) {
  model_.objective.constant = std::move(constant);
  return *this;
}
ModelBuilder& ModelBuilder::column(std::string name, Rational cost, Side lower, Side upper) {
  Column c;
  c.name = std::move(name);
  c.lower = std::move(lower);
  c.upper = std::move(upper);
  column_by_name_.emplace(c.name, model_.column_count());
  model_.columns.push_back(std::move(c));
  model_.objective.coefficients.push_back(std::move(cost));
  return *this;
}
ModelBuilder& ModelBuilder::row(std::string name, std::vector<std::pair<std::string, Rational>> terms, Side lower,
                                Side upper) {
  int i = model_.row_count();
  for (auto& [column_name, value] : terms) {
    auto j = column_by_name_.find(column_name);
    if (j == column_by_name_.end()) throw std::invalid_argument("row " + name + " names unknown column " + column_name);
    entries_.push_back({i, j->second, std::move(value)});
  }
  model_.rows.push_back(Row{std::move(name), std::move(lower), std::move(upper), {}});
  return *this;
}
Model ModelBuilder::build() {
  model_.matrix = Matrix::from_entries(model_.row_count(), model_.column_count(), std::move(entries_));
  model_.index_names();
  return std::move(model_);
}

}  // namespace plumb::model
