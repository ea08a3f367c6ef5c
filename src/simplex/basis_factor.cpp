#include "basis_factor.hpp"

#include <algorithm>
#include <cmath>
#include <limits>

namespace plumb::simplex::detail {

// Rows keep values, columns keep only their pattern (Suhl & Suhl 1990, section 3); rows and
// columns sit in doubly linked lists by their count of active entries.
struct BasisFactor::Active {
  std::vector<std::vector<int>> row_columns;
  std::vector<std::vector<double>> row_values;
  std::vector<std::vector<int>> column_rows;
  std::vector<double> row_max;  // largest |value| of the row, negative when stale
  std::vector<int> row_head, row_next, row_prev, column_head, column_next, column_prev;

  static void link(std::vector<int>& head, std::vector<int>& next, std::vector<int>& prev, int item, int count) {
    prev[item] = -1;
    next[item] = head[count];
    if (head[count] >= 0) prev[head[count]] = item;
    head[count] = item;
  }
  static void unlink(std::vector<int>& head, std::vector<int>& next, std::vector<int>& prev, int item, int count) {
    if (prev[item] >= 0) next[prev[item]] = next[item];
    else head[count] = next[item];
    if (next[item] >= 0) prev[next[item]] = prev[item];
  }
  int row_count(int i) const { return static_cast<int>(row_columns[i].size()); }
  int column_count(int j) const { return static_cast<int>(column_rows[j].size()); }
  double largest_in_row(int i) {
    if (row_max[i] < 0) {
      double best = 0;
      for (double v : row_values[i]) best = std::max(best, std::abs(v));
      row_max[i] = best;
    }
    return row_max[i];
  }
  double value_at(int i, int j) const {
    const auto& cols = row_columns[i];
    for (std::size_t t = 0; t < cols.size(); ++t)
      if (cols[t] == j) return row_values[i][t];
    return 0;
  }
};

namespace {

void remove_from(std::vector<int>& list, int item) {
  auto it = std::find(list.begin(), list.end(), item);
  if (it != list.end()) {
    *it = list.back();
    list.pop_back();
  }
}

}  // namespace

BasisFactor::Singularity BasisFactor::factorize(int m, const SparseVectors& columns) {
  m_ = m;
  pivot_row_.clear();
  pivot_position_.clear();
  diagonal_.clear();
  l_columns_.clear();
  u_rows_.clear();
  etas_.clear();
  eta_position_.clear();
  eta_pivot_.clear();

  Active a;
  a.row_columns.assign(m, {});
  a.row_values.assign(m, {});
  a.column_rows.assign(m, {});
  a.row_max.assign(m, -1);
  for (int j = 0; j < m; ++j) {
    for (int p = columns.start[j]; p < columns.start[j + 1]; ++p) {
      if (columns.value[p] == 0) continue;
      int i = columns.index[p];
      a.row_columns[i].push_back(j);
      a.row_values[i].push_back(columns.value[p]);
      a.column_rows[j].push_back(i);
    }
  }
  a.row_head.assign(m + 1, -1);
  a.column_head.assign(m + 1, -1);
  a.row_next.assign(m, -1);
  a.row_prev.assign(m, -1);
  a.column_next.assign(m, -1);
  a.column_prev.assign(m, -1);
  for (int i = 0; i < m; ++i) Active::link(a.row_head, a.row_next, a.row_prev, i, a.row_count(i));
  for (int j = 0; j < m; ++j) Active::link(a.column_head, a.column_next, a.column_prev, j, a.column_count(j));

  std::vector<char> row_done(m, 0), column_done(m, 0);
  std::vector<int> slot(m, -1);            // position of a column inside the row being updated
  std::vector<double> pivot_values(m, 0);  // the pivot row, scattered by column

  auto recount_column = [&](int j, int old_count) {
    Active::unlink(a.column_head, a.column_next, a.column_prev, j, old_count);
    Active::link(a.column_head, a.column_next, a.column_prev, j, a.column_count(j));
  };

  for (int step = 0; step < m; ++step) {
    // Markowitz search over the sparsest columns and rows, a few candidates deep.
    int best_row = -1, best_column = -1;
    double best_cost = std::numeric_limits<double>::infinity();
    int searched = 0;
    auto enough = [&](int count) {
      return best_row >= 0 && (searched >= 4 || best_cost <= double(count - 1) * (count - 1));
    };
    for (int count = 1; count <= m; ++count) {
      for (int j = a.column_head[count]; j >= 0; j = a.column_next[j]) {
        for (int i : a.column_rows[j]) {
          double v = std::abs(a.value_at(i, j));
          if (v < absolute_tolerance) continue;
          if (count > 1 && v < pivot_threshold * a.largest_in_row(i)) continue;
          double cost = double(a.row_count(i) - 1) * (count - 1);
          if (cost < best_cost) best_cost = cost, best_row = i, best_column = j;
        }
        if (best_row >= 0) ++searched;
        if (enough(count)) break;
      }
      if (enough(count)) break;
      for (int i = a.row_head[count]; i >= 0; i = a.row_next[i]) {
        double limit = std::max(absolute_tolerance, pivot_threshold * a.largest_in_row(i));
        for (std::size_t t = 0; t < a.row_columns[i].size(); ++t) {
          if (std::abs(a.row_values[i][t]) < limit) continue;
          int j = a.row_columns[i][t];
          double cost = double(count - 1) * (a.column_count(j) - 1);
          if (cost < best_cost) best_cost = cost, best_row = i, best_column = j;
        }
        if (best_row >= 0) ++searched;
        if (enough(count)) break;
      }
      if (enough(count)) break;
    }
    if (best_row < 0) break;

    const int r = best_row, c = best_column;
    Active::unlink(a.row_head, a.row_next, a.row_prev, r, a.row_count(r));
    Active::unlink(a.column_head, a.column_next, a.column_prev, c, a.column_count(c));
    row_done[r] = 1;
    column_done[c] = 1;
    double pivot = 0;
    // The pivot row leaves the active matrix and becomes row `step` of U.
    for (std::size_t t = 0; t < a.row_columns[r].size(); ++t) {
      int j = a.row_columns[r][t];
      double v = a.row_values[r][t];
      if (j == c) {
        pivot = v;
        continue;
      }
      pivot_values[j] = v;
      u_rows_.push(j, v);
      int old = a.column_count(j);
      remove_from(a.column_rows[j], r);
      recount_column(j, old);
    }
    u_rows_.close();
    pivot_row_.push_back(r);
    pivot_position_.push_back(c);
    diagonal_.push_back(pivot);

    // Eliminate column c from the other rows.
    for (int i : a.column_rows[c]) {
      if (i == r) continue;
      auto& cols = a.row_columns[i];
      auto& vals = a.row_values[i];
      int old_count = a.row_count(i);
      double multiplier = 0;
      for (std::size_t t = 0; t < cols.size(); ++t) {
        if (cols[t] == c) {
          multiplier = vals[t] / pivot;
          cols[t] = cols.back();
          vals[t] = vals.back();
          cols.pop_back();
          vals.pop_back();
          break;
        }
      }
      l_columns_.push(i, multiplier);
      for (std::size_t t = 0; t < cols.size(); ++t) slot[cols[t]] = static_cast<int>(t);
      for (int p = u_rows_.start[step]; p < u_rows_.start[step + 1]; ++p) {
        int j = u_rows_.index[p];
        double change = -multiplier * pivot_values[j];
        if (slot[j] >= 0) {
          vals[slot[j]] += change;
        } else if (std::abs(change) > drop_tolerance) {
          cols.push_back(j);
          vals.push_back(change);
          int old = a.column_count(j);
          a.column_rows[j].push_back(i);
          recount_column(j, old);
        }
      }
      for (int j : cols) slot[j] = -1;
      a.row_max[i] = -1;
      Active::unlink(a.row_head, a.row_next, a.row_prev, i, old_count);
      Active::link(a.row_head, a.row_next, a.row_prev, i, a.row_count(i));
    }
    l_columns_.close();
    for (int p = u_rows_.start[step]; p < u_rows_.start[step + 1]; ++p) pivot_values[u_rows_.index[p]] = 0;
    a.column_rows[c].clear();
    a.row_columns[r].clear();
    a.row_values[r].clear();
  }

  Singularity singular;
  if (static_cast<int>(pivot_row_.size()) < m) {
    for (int j = 0; j < m; ++j)
      if (!column_done[j]) singular.positions.push_back(j);
    for (int i = 0; i < m; ++i)
      if (!row_done[i]) singular.rows.push_back(i);
    return singular;
  }
  build_transposes();
  return singular;
}

void BasisFactor::build_transposes() {
  // l_rows_: for each row i, the (row of step k, multiplier) pairs of L column k holding row i.
  std::vector<int> counts(m_ + 1, 0);
  auto transpose = [&](const SparseVectors& source, SparseVectors& target, auto&& target_of_vector) {
    counts.assign(m_ + 1, 0);
    for (int i : source.index) ++counts[i + 1];
    target.start.assign(m_ + 1, 0);
    for (int i = 0; i < m_; ++i) target.start[i + 1] = target.start[i] + counts[i + 1];
    target.index.resize(source.index.size());
    target.value.resize(source.index.size());
    std::vector<int> fill(target.start.begin(), target.start.end() - 1);
    for (int k = 0; k < source.size(); ++k)
      for (int p = source.start[k]; p < source.start[k + 1]; ++p) {
        int slot = fill[source.index[p]]++;
        target.index[slot] = target_of_vector(k);
        target.value[slot] = source.value[p];
      }
  };
  transpose(l_columns_, l_rows_, [&](int k) { return pivot_row_[k]; });
  transpose(u_rows_, u_columns_, [&](int k) { return pivot_row_[k]; });
}

void BasisFactor::ftran(std::vector<double>& x) const {
  for (int k = 0; k < m_; ++k) {
    double xr = x[pivot_row_[k]];
    if (xr == 0) continue;
    for (int p = l_columns_.start[k]; p < l_columns_.start[k + 1]; ++p) x[l_columns_.index[p]] -= l_columns_.value[p] * xr;
  }
  work_.resize(m_);
  for (int k = m_ - 1; k >= 0; --k) {
    int c = pivot_position_[k];
    double z = x[pivot_row_[k]];
    if (z != 0) {
      z /= diagonal_[k];
      for (int p = u_columns_.start[c]; p < u_columns_.start[c + 1]; ++p) x[u_columns_.index[p]] -= u_columns_.value[p] * z;
    }
    work_[c] = z;
  }
  x.swap(work_);
  for (int e = 0; e < etas_.size(); ++e) {
    int p = eta_position_[e];
    double xp = x[p];
    if (xp == 0) continue;
    xp /= eta_pivot_[e];
    x[p] = xp;
    for (int q = etas_.start[e]; q < etas_.start[e + 1]; ++q) x[etas_.index[q]] -= etas_.value[q] * xp;
  }
}

void BasisFactor::btran(std::vector<double>& x) const {
  for (int e = etas_.size() - 1; e >= 0; --e) {
    int p = eta_position_[e];
    double s = x[p];
    for (int q = etas_.start[e]; q < etas_.start[e + 1]; ++q) s -= etas_.value[q] * x[etas_.index[q]];
    x[p] = s / eta_pivot_[e];
  }
  work_.resize(m_);
  for (int k = 0; k < m_; ++k) {
    double w = x[pivot_position_[k]];
    if (w != 0) {
      w /= diagonal_[k];
      for (int p = u_rows_.start[k]; p < u_rows_.start[k + 1]; ++p) x[u_rows_.index[p]] -= u_rows_.value[p] * w;
    }
    work_[pivot_row_[k]] = w;
  }
  x.swap(work_);
  for (int k = m_ - 1; k >= 0; --k) {
    int i = pivot_row_[k];
    double yi = x[i];
    if (yi == 0) continue;
    for (int p = l_rows_.start[i]; p < l_rows_.start[i + 1]; ++p) x[l_rows_.index[p]] -= l_rows_.value[p] * yi;
  }
}

void BasisFactor::update(int position, const std::vector<double>& column) {
  for (int i = 0; i < m_; ++i)
    if (i != position && column[i] != 0) etas_.push(i, column[i]);
  etas_.close();
  eta_position_.push_back(position);
  eta_pivot_.push_back(column[position]);
}

}  // namespace plumb::simplex::detail
