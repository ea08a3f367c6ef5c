#include "factor.hpp"

#include <algorithm>
#include <cstdlib>
#include <limits>

namespace plumb::exact::detail {

void RationalSparseVector::resize(int size) {
  values_.assign(static_cast<std::size_t>(size), Rational(0));
  listed_.assign(static_cast<std::size_t>(size), 0);
  index_.clear();
}

void RationalSparseVector::clear() {
  for (int i : index_) {
    mpq_set_ui(values_[i].backend().data(), 0, 1);
    listed_[i] = 0;
  }
  index_.clear();
}

void RationalSparseVector::tidy() {
  std::erase_if(index_, [this](int i) {
    if (!is_zero(values_[i])) return false;
    listed_[i] = 0;
    return true;
  });
  std::sort(index_.begin(), index_.end());
}

namespace {

void erase_value(std::vector<int>& list, int value) {
  auto it = std::find(list.begin(), list.end(), value);
  if (it != list.end()) {
    *it = list.back();
    list.pop_back();
  }
}

bool is_unit(const Rational& value) {
  const mpq_t& q = value.backend().data();
  return mpz_cmp_ui(mpq_denref(q), 1) == 0 && mpz_cmpabs_ui(mpq_numref(q), 1) == 0;
}

using Entries = std::vector<std::pair<int, Rational>>;

// The active submatrix of the elimination, column-wise with values and row-wise as a pattern.
struct ActiveSubmatrix {
  std::vector<Entries> columns;
  std::vector<std::vector<int>> row_pattern;
  std::vector<char> column_done, row_done;
  std::vector<int> where;    // the Schur update's index of a row within the column being updated
  std::vector<int> emptied;  // rows whose entry cancelled in that column

  ActiveSubmatrix(int m, const std::vector<SparseColumn>& given)
      : columns(given.size()),
        row_pattern(static_cast<std::size_t>(m)),
        column_done(given.size(), 0),
        row_done(static_cast<std::size_t>(m), 0),
        where(static_cast<std::size_t>(m), -1) {
    for (std::size_t c = 0; c < given.size(); ++c) {
      const SparseColumn& column = given[c];
      for (std::size_t e = 0; e < column.rows.size(); ++e) {
        if (is_zero(column.values[e])) continue;
        columns[c].emplace_back(column.rows[e], column.values[e]);
        row_pattern[column.rows[e]].push_back(static_cast<int>(c));
      }
    }
  }

  struct Choice {
    int row = -1, column = -1;
  };

  // Markowitz search, restricted to a few shortest columns and rows (common practice): the entry
  // of least (row count - 1) (column count - 1), a unit preferred among equals.  Columns found
  // empty are done and listed in `dependent`; no column is chosen when none is left.
  Choice markowitz_search(std::vector<int>& dependent) {
    const int k = static_cast<int>(columns.size()), m = static_cast<int>(row_pattern.size());
    int min_column_count = std::numeric_limits<int>::max(), min_row_count = std::numeric_limits<int>::max();
    for (int c = 0; c < k; ++c) {
      if (column_done[c]) continue;
      int count = static_cast<int>(columns[c].size());
      if (count == 0) {
        column_done[c] = 1;
        dependent.push_back(c);
      } else {
        min_column_count = std::min(min_column_count, count);
      }
    }
    if (min_column_count == std::numeric_limits<int>::max()) return {};
    for (int r = 0; r < m; ++r)
      if (!row_done[r] && !row_pattern[r].empty())
        min_row_count = std::min(min_row_count, static_cast<int>(row_pattern[r].size()));

    long best_cost = std::numeric_limits<long>::max();
    bool best_unit = false;
    Choice best;
    auto consider = [&](int r, int c, const Rational& value) {
      long cost = static_cast<long>(row_pattern[r].size() - 1) * static_cast<long>(columns[c].size() - 1);
      bool unit = is_unit(value);
      if (cost < best_cost || (cost == best_cost && unit && !best_unit)) {
        best_cost = cost, best_unit = unit, best = {r, c};
      }
    };
    constexpr int search_limit = 4;
    int searched = 0;
    for (int c = 0; c < k && searched < search_limit; ++c) {
      if (column_done[c] || static_cast<int>(columns[c].size()) != min_column_count) continue;
      ++searched;
      for (const auto& [r, value] : columns[c]) consider(r, c, value);
      if (best_cost == 0 && best_unit) break;
    }
    searched = 0;
    for (int r = 0; r < m && searched < search_limit && !(best_cost == 0 && best_unit); ++r) {
      if (row_done[r] || static_cast<int>(row_pattern[r].size()) != min_row_count) continue;
      ++searched;
      for (int c : row_pattern[r]) {
        for (const auto& [row, value] : columns[c])
          if (row == r) consider(r, c, value);
      }
    }
    return best;
  }

  // Takes the chosen entry's column and row out of the active submatrix: the column's other
  // entries, divided by the pivot, become the L multipliers `lower` (by row), the row's other
  // entries the U row `upper_row` (by position).  Returns the pivot.
  Rational take_pivot(Choice choice, Entries& lower, Entries& upper_row) {
    Rational pivot;
    for (auto& [r, value] : columns[choice.column]) {
      if (r == choice.row) {
        pivot = std::move(value);
        continue;
      }
      erase_value(row_pattern[r], choice.column);
    }
    for (auto& [r, value] : columns[choice.column]) {
      if (r == choice.row) continue;
      value /= pivot;
      lower.emplace_back(r, std::move(value));
    }
    std::sort(lower.begin(), lower.end(), [](const auto& a, const auto& b) { return a.first < b.first; });
    columns[choice.column].clear();
    column_done[choice.column] = 1;
    std::vector<int> row_columns = std::move(row_pattern[choice.row]);
    row_pattern[choice.row].clear();
    row_done[choice.row] = 1;
    std::sort(row_columns.begin(), row_columns.end());
    for (int c : row_columns) {
      if (c == choice.column) continue;
      auto& entries = columns[c];
      auto it =
          std::find_if(entries.begin(), entries.end(), [&](const auto& e) { return e.first == choice.row; });
      upper_row.emplace_back(c, std::move(it->second));
      *it = std::move(entries.back());
      entries.pop_back();
    }
    return pivot;
  }

  // Schur complement update: a_ic -= l_i * u_c over the pivot's multipliers and U row; entries
  // that cancel leave the pattern.
  void eliminate(const Entries& lower, const Entries& upper_row, Rational& scratch) {
    for (const auto& [c, u] : upper_row) {
      auto& entries = columns[c];
      for (std::size_t e = 0; e < entries.size(); ++e) where[entries[e].first] = static_cast<int>(e);
      for (const auto& [r, l] : lower) {
        if (where[r] >= 0) {
          Rational& target = entries[where[r]].second;
          subtract_product(target, l, u, scratch);
          if (is_zero(target)) emptied.push_back(r);
        } else {
          mpq_mul(scratch.backend().data(), l.backend().data(), u.backend().data());
          where[r] = static_cast<int>(entries.size());
          entries.emplace_back(r, -scratch);
          row_pattern[r].push_back(c);
        }
      }
      for (const auto& e : entries) where[e.first] = -1;
      if (!emptied.empty()) {
        for (int r : emptied) erase_value(row_pattern[r], c);
        std::erase_if(entries, [](const auto& e) { return is_zero(e.second); });
        emptied.clear();
      }
    }
  }
};

}  // namespace

void RationalBasisFactor::factorize(int m, const std::vector<SparseColumn>& columns) {
  m_ = m;
  const int k = static_cast<int>(columns.size());
  pivots_.clear();
  etas_.clear();
  eta_limbs_ = 0;
  factor_limbs_ = 0;
  dependent_columns_.clear();
  uncovered_rows_.clear();
  upper_column_.clear();

  ActiveSubmatrix active(m, columns);
  for (;;) {
    run::stop_if_exhausted(budget, [] { return std::string("factorizing the exact basis"); });
    ActiveSubmatrix::Choice choice = active.markowitz_search(dependent_columns_);
    if (choice.column < 0) break;
    Pivot pivot;
    pivot.row = choice.row;
    pivot.position = choice.column;
    pivot.value = active.take_pivot(choice, pivot.lower, pivot.upper_row);
    active.eliminate(pivot.lower, pivot.upper_row, scratch_);
    factor_limbs_ += limbs(pivot.value);
    for (const auto& entry : pivot.lower) factor_limbs_ += limbs(entry.second);
    for (const auto& entry : pivot.upper_row) factor_limbs_ += limbs(entry.second);
    pivots_.push_back(std::move(pivot));
  }
  for (int r = 0; r < m; ++r)
    if (!active.row_done[r]) uncovered_rows_.push_back(r);
  std::sort(dependent_columns_.begin(), dependent_columns_.end());
  if (!nonsingular() || k != m) return;

  upper_column_.assign(static_cast<std::size_t>(m), {});
  for (Pivot& pivot : pivots_) {
    pivot.value_estimate = numeric::to_double(pivot.value);
    for (const auto& [row, value] : pivot.lower) pivot.lower_estimate.push_back(numeric::to_double(value));
    for (const auto& [position, value] : pivot.upper_row) {
      upper_column_[position].emplace_back(pivot.row, value);
      pivot.upper_row_estimate.push_back(numeric::to_double(value));
    }
  }
}

void RationalBasisFactor::ftran(RationalSparseVector& b, RationalSparseVector& result) {
  for (const Pivot& pivot : pivots_) {
    const Rational& v = b[pivot.row];
    if (is_zero(v)) continue;
    for (const auto& [r, l] : pivot.lower) subtract_product(b.at(r), l, v, scratch_);
  }
  for (auto p = pivots_.rbegin(); p != pivots_.rend(); ++p) {
    if (is_zero(b[p->row])) continue;
    Rational& v = b.at(p->row);
    mpq_div(v.backend().data(), v.backend().data(), p->value.backend().data());
    for (const auto& [r, u] : upper_column_[p->position]) subtract_product(b.at(r), u, v, scratch_);
  }
  result.clear();
  for (const Pivot& pivot : pivots_)
    if (!is_zero(b[pivot.row])) result.swap_in(pivot.position, b.at(pivot.row));
  b.clear();
  for (const Eta& eta : etas_) {
    if (is_zero(result[eta.position])) continue;
    Rational& v = result.at(eta.position);
    mpq_div(v.backend().data(), v.backend().data(), eta.pivot.backend().data());
    for (const auto& [position, alpha] : eta.others) subtract_product(result.at(position), alpha, v, scratch_);
  }
}

void RationalBasisFactor::btran(RationalSparseVector& c, RationalSparseVector& result) {
  for (auto eta = etas_.rbegin(); eta != etas_.rend(); ++eta) {
    value_ = c[eta->position];
    bool any = !is_zero(value_);
    for (const auto& [position, alpha] : eta->others) {
      const Rational& other = c[position];
      if (is_zero(other)) continue;
      subtract_product(value_, alpha, other, scratch_);
      any = true;
    }
    if (!any) continue;
    Rational& target = c.at(eta->position);
    mpq_div(target.backend().data(), value_.backend().data(), eta->pivot.backend().data());
  }
  result.clear();
  for (const Pivot& pivot : pivots_) {
    if (is_zero(c[pivot.position])) continue;
    Rational& w = result.at(pivot.row);
    mpq_div(w.backend().data(), c[pivot.position].backend().data(), pivot.value.backend().data());
    for (const auto& [position, u] : pivot.upper_row) subtract_product(c.at(position), u, w, scratch_);
  }
  c.clear();
  for (auto p = pivots_.rbegin(); p != pivots_.rend(); ++p) {
    bool any = false;
    value_ = result[p->row];
    for (const auto& [r, l] : p->lower) {
      const Rational& other = result[r];
      if (is_zero(other)) continue;
      subtract_product(value_, l, other, scratch_);
      any = true;
    }
    if (any) result.at(p->row) = value_;
  }
}

void RationalBasisFactor::estimate_btran(std::vector<double>& c, std::vector<double>& y) const {
  for (auto eta = etas_.rbegin(); eta != etas_.rend(); ++eta) {
    double value = c[eta->position];
    for (std::size_t e = 0; e < eta->others.size(); ++e) value -= eta->others_estimate[e] * c[eta->others[e].first];
    c[eta->position] = value / eta->pivot_estimate;
  }
  std::fill(y.begin(), y.end(), 0.0);
  for (const Pivot& pivot : pivots_) {
    double w = c[pivot.position];
    if (w == 0) continue;
    w /= pivot.value_estimate;
    y[pivot.row] = w;
    for (std::size_t e = 0; e < pivot.upper_row.size(); ++e)
      c[pivot.upper_row[e].first] -= pivot.upper_row_estimate[e] * w;
  }
  for (auto p = pivots_.rbegin(); p != pivots_.rend(); ++p) {
    double value = y[p->row];
    for (std::size_t e = 0; e < p->lower.size(); ++e) value -= p->lower_estimate[e] * y[p->lower[e].first];
    y[p->row] = value;
  }
}

void RationalBasisFactor::update(int position, const RationalSparseVector& alpha) {
  Eta eta;
  eta.position = position;
  eta.pivot = alpha[position];
  for (int i : alpha.pattern())
    if (i != position && !is_zero(alpha[i])) eta.others.emplace_back(i, alpha[i]);
  std::sort(eta.others.begin(), eta.others.end(), [](const auto& a, const auto& b) { return a.first < b.first; });
  eta_limbs_ += limbs(eta.pivot);
  eta.pivot_estimate = numeric::to_double(eta.pivot);
  for (const auto& entry : eta.others) {
    eta_limbs_ += limbs(entry.second);
    eta.others_estimate.push_back(numeric::to_double(entry.second));
  }
  etas_.push_back(std::move(eta));
}

}  // namespace plumb::exact::detail
