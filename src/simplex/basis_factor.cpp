#include "basis_factor.hpp"

#include <algorithm>
#include <cmath>
#include <functional>
#include <limits>
#include <queue>

namespace plumb::simplex::detail {

// What the elimination steps produce, in step order: each pivot, U's row and L's column.
struct FloatBasisFactor::Elimination {
  std::vector<int> pivot_row, pivot_position;
  std::vector<double> diagonal;
  SparseVectors l_columns, u_rows;
  std::vector<char> row_done, column_done;

  explicit Elimination(int m) : row_done(m, 0), column_done(m, 0) {}
  int steps() const { return static_cast<int>(pivot_row.size()); }
  void record(int row, int position, double pivot) {
    pivot_row.push_back(row);
    pivot_position.push_back(position);
    diagonal.push_back(pivot);
    row_done[row] = column_done[position] = 1;
  }
};

// Rows keep values, columns keep only their pattern (Suhl & Suhl 1990, section 3); rows and
// columns sit in doubly linked lists by their count of active entries.  Each side is one
// ListPool, so a factorization allocates a few large blocks rather than a vector per row and
// column (which had made memory allocation a third of the search's time at 16 000 rows).  A
// pivoted row stays in the column patterns until the column is next read (active_rows): taking
// it out of each of its columns at once had cost a scan of each, quadratic on bases with dense
// columns (a quarter of fit2p's search).
struct FloatBasisFactor::Active {
  ListPool rows;                // per row: (column, value)
  ListPool columns;             // per column: (row, unused), pivoted rows included until read
  std::vector<int> column_size;  // active entries per column
  long entries = 0;              // in the active submatrix
  std::vector<char> row_pivoted;
  std::vector<double> row_max;  // largest |value| of the row, negative when stale
  std::vector<int> row_head, row_next, row_prev, column_head, column_next, column_prev;
  std::vector<int> slot;             // position of a column inside the row being updated, else -1
  std::vector<double> pivot_values;  // the pivot row, scattered by column
  std::vector<int> pivot_column_rows;  // the pivot column's rows, copied: appends may move lists

  Active(int m, const SparseVectors& columns);

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
  int row_count(int i) const { return rows.size(i); }
  int column_count(int j) const { return column_size[j]; }
  const int* active_rows(int j) {
    columns.remove_if(j, [this](int i) { return row_pivoted[i] != 0; });
    return columns.indices(j);
  }
  double largest_in_row(int i) {
    if (row_max[i] < 0) {
      double best = 0;
      const double* values = rows.values(i);
      for (int t = 0; t < row_count(i); ++t) best = std::max(best, std::abs(values[t]));
      row_max[i] = best;
    }
    return row_max[i];
  }
  double value_at(int i, int j) const {
    const int* cols = rows.indices(i);
    for (int t = 0; t < row_count(i); ++t)
      if (cols[t] == j) return rows.values(i)[t];
    return 0;
  }
  void recount_column(int j, int old_count) {
    unlink(column_head, column_next, column_prev, j, old_count);
    link(column_head, column_next, column_prev, j, column_count(j));
  }

  struct Pivot {
    int row = -1, column = -1;
  };
  Pivot markowitz_search(double absolute_tolerance, double pivot_threshold);
  double take_pivot_row(Pivot pivot, SparseVectors& u_rows);
  void eliminate_column(Pivot pivot, double pivot_value, int step, const SparseVectors& u_rows,
                        SparseVectors& l_columns, double drop_tolerance);
  void eliminate_dense(double absolute_tolerance, double drop_tolerance, Elimination& steps) const;
};

FloatBasisFactor::Active::Active(int m, const SparseVectors& basis_columns)
    : column_size(m, 0),
      row_pivoted(m, 0),
      row_max(m, -1),
      row_head(m + 1, -1),
      row_next(m, -1),
      row_prev(m, -1),
      column_head(m + 1, -1),
      column_next(m, -1),
      column_prev(m, -1),
      slot(m, -1),
      pivot_values(m, 0) {
  // Room for each list's entries plus a little fill-in; a list that outgrows it moves.
  std::vector<int> row_room(m, 2), column_room(m, 2);
  for (int j = 0; j < m; ++j)
    for (int p = basis_columns.start[j]; p < basis_columns.start[j + 1]; ++p)
      if (basis_columns.value[p] != 0) ++row_room[basis_columns.index[p]], ++column_room[j];
  rows.reset(m, row_room);
  columns.reset(m, column_room);
  for (int j = 0; j < m; ++j) {
    for (int p = basis_columns.start[j]; p < basis_columns.start[j + 1]; ++p) {
      if (basis_columns.value[p] == 0) continue;
      int i = basis_columns.index[p];
      rows.append(i, j, basis_columns.value[p]);
      columns.append(j, i, 0);
      ++column_size[j];
      ++entries;
    }
  }
  for (int i = 0; i < m; ++i) link(row_head, row_next, row_prev, i, row_count(i));
  for (int j = 0; j < m; ++j) link(column_head, column_next, column_prev, j, column_count(j));
}

// Markowitz search over the sparsest columns and rows, a few candidates deep: the entry of least
// (row count - 1) (column count - 1) that passes the threshold test; no row when none is left.
FloatBasisFactor::Active::Pivot FloatBasisFactor::Active::markowitz_search(double absolute_tolerance,
                                                                           double pivot_threshold) {
  const int m = static_cast<int>(row_max.size());
  Pivot best;
  double best_cost = std::numeric_limits<double>::infinity();
  int searched = 0;
  auto enough = [&](int count) {
    return best.row >= 0 && (searched >= 4 || best_cost <= double(count - 1) * (count - 1));
  };
  for (int count = 1; count <= m; ++count) {
    for (int j = column_head[count]; j >= 0; j = column_next[j]) {
      const int* in_rows = active_rows(j);
      for (int t = 0; t < count; ++t) {
        const int i = in_rows[t];
        double v = std::abs(value_at(i, j));
        if (v < absolute_tolerance) continue;
        if (count > 1 && v < pivot_threshold * largest_in_row(i)) continue;
        double cost = double(row_count(i) - 1) * (count - 1);
        if (cost < best_cost) best_cost = cost, best = {i, j};
      }
      if (best.row >= 0) ++searched;
      if (enough(count)) break;
    }
    if (enough(count)) break;
    for (int i = row_head[count]; i >= 0; i = row_next[i]) {
      double limit = std::max(absolute_tolerance, pivot_threshold * largest_in_row(i));
      for (int t = 0; t < count; ++t) {
        if (std::abs(rows.values(i)[t]) < limit) continue;
        int j = rows.indices(i)[t];
        double cost = double(count - 1) * (column_count(j) - 1);
        if (cost < best_cost) best_cost = cost, best = {i, j};
      }
      if (best.row >= 0) ++searched;
      if (enough(count)) break;
    }
    if (enough(count)) break;
  }
  return best;
}

// The pivot row leaves the active matrix and becomes the next row of U (scattered into
// pivot_values as well); returns the pivot.
double FloatBasisFactor::Active::take_pivot_row(Pivot pivot, SparseVectors& u_rows) {
  const int r = pivot.row, c = pivot.column;
  row_pivoted[r] = 1;
  entries -= row_count(r);
  unlink(row_head, row_next, row_prev, r, row_count(r));
  unlink(column_head, column_next, column_prev, c, column_count(c));
  double value = 0;
  for (int t = 0; t < row_count(r); ++t) {
    int j = rows.indices(r)[t];
    double v = rows.values(r)[t];
    if (j == c) {
      value = v;
      continue;
    }
    pivot_values[j] = v;
    u_rows.push(j, v);
    --column_size[j];
    recount_column(j, column_size[j] + 1);
  }
  u_rows.close();
  return value;
}

// Eliminates the pivot column from the other active rows with U's row `step`, recording the
// multipliers as the next column of L; fill-in below drop_tolerance is not stored.
void FloatBasisFactor::Active::eliminate_column(Pivot pivot, double pivot_value, int step,
                                                const SparseVectors& u_rows, SparseVectors& l_columns,
                                                double drop_tolerance) {
  const int r = pivot.row, c = pivot.column;
  const int* in_rows = active_rows(c);
  pivot_column_rows.assign(in_rows, in_rows + columns.size(c));  // r itself is out already
  for (int i : pivot_column_rows) {
    int old_count = row_count(i);
    double multiplier = rows.take(i, c) / pivot_value;
    --entries;
    l_columns.push(i, multiplier);
    for (int t = 0; t < row_count(i); ++t) slot[rows.indices(i)[t]] = t;
    for (int p = u_rows.start[step]; p < u_rows.start[step + 1]; ++p) {
      int j = u_rows.index[p];
      double change = -multiplier * pivot_values[j];
      if (slot[j] >= 0) {
        rows.values(i)[slot[j]] += change;
      } else if (std::abs(change) > drop_tolerance) {
        rows.append(i, j, change);
        ++entries;
        columns.append(j, i, 0);
        ++column_size[j];
        recount_column(j, column_size[j] - 1);
      }
    }
    for (int t = 0; t < row_count(i); ++t) slot[rows.indices(i)[t]] = -1;
    row_max[i] = -1;
    unlink(row_head, row_next, row_prev, i, old_count);
    link(row_head, row_next, row_prev, i, row_count(i));
  }
  l_columns.close();
  for (int p = u_rows.start[step]; p < u_rows.start[step + 1]; ++p) pivot_values[u_rows.index[p]] = 0;
  columns.clear(c);
  column_size[c] = 0;
  rows.clear(r);
}

// The rest of the elimination on a dense copy of the active submatrix, each pivot the largest
// entry left in its column (partial pivoting), once that submatrix is dense enough that keeping
// its lists costs more than the arithmetic: on pilot87's bases the last 300 of 2 030 steps had
// taken three quarters of the factorization.  A column with no entry above absolute_tolerance
// is left unpivoted (the basis is singular).
void FloatBasisFactor::Active::eliminate_dense(double absolute_tolerance, double drop_tolerance,
                                               Elimination& steps) const {
  const int m = static_cast<int>(row_pivoted.size());
  std::vector<int> dense_rows, dense_columns, column_slot(m, -1);
  for (int i = 0; i < m; ++i)
    if (!row_pivoted[i]) dense_rows.push_back(i);
  for (int j = 0; j < m; ++j)
    if (!steps.column_done[j]) {
      column_slot[j] = static_cast<int>(dense_columns.size());
      dense_columns.push_back(j);
    }
  const int height = static_cast<int>(dense_rows.size()), width = static_cast<int>(dense_columns.size());
  std::vector<double> matrix(static_cast<std::size_t>(height) * width, 0.0);
  std::vector<double*> row_of(height);  // swapping rows swaps these
  for (int a = 0; a < height; ++a) {
    row_of[a] = matrix.data() + static_cast<std::size_t>(a) * width;
    const int i = dense_rows[a];
    for (int t = 0; t < row_count(i); ++t) row_of[a][column_slot[rows.indices(i)[t]]] = rows.values(i)[t];
  }
  int done = 0;  // rows [0, done) are pivoted
  for (int k = 0; k < width && done < height; ++k) {
    int best = done;
    for (int a = done + 1; a < height; ++a)
      if (std::abs(row_of[a][k]) > std::abs(row_of[best][k])) best = a;
    const double pivot = row_of[best][k];
    if (!(std::abs(pivot) >= absolute_tolerance)) continue;
    std::swap(row_of[done], row_of[best]);
    std::swap(dense_rows[done], dense_rows[best]);
    const double* pivot_row = row_of[done];
    for (int c = k + 1; c < width; ++c)
      if (std::abs(pivot_row[c]) > drop_tolerance) steps.u_rows.push(dense_columns[c], pivot_row[c]);
    steps.u_rows.close();
    for (int a = done + 1; a < height; ++a) {
      double* row = row_of[a];
      if (row[k] == 0) continue;
      const double multiplier = row[k] / pivot;
      steps.l_columns.push(dense_rows[a], multiplier);
      for (int c = k + 1; c < width; ++c) row[c] -= multiplier * pivot_row[c];
    }
    steps.l_columns.close();
    steps.record(dense_rows[done], dense_columns[k], pivot);
    ++done;
  }
}

FloatBasisFactor::Singularity FloatBasisFactor::factorize(int m, const SparseVectors& columns) {
  m_ = m;
  usable_ = false;
  Elimination steps(m);
  Active active(m, columns);
  for (int step = 0; step < m; ++step) {
    const double left = m - step;
    if (left >= dense_minimum && active.entries >= dense_share * left * left) {
      active.eliminate_dense(absolute_tolerance, drop_tolerance, steps);
      break;
    }
    Active::Pivot pivot = active.markowitz_search(absolute_tolerance, pivot_threshold);
    if (pivot.row < 0) break;
    double pivot_value = active.take_pivot_row(pivot, steps.u_rows);
    steps.record(pivot.row, pivot.column, pivot_value);
    active.eliminate_column(pivot, pivot_value, step, steps.u_rows, steps.l_columns, drop_tolerance);
  }

  Singularity singular;
  if (steps.steps() < m) {
    for (int j = 0; j < m; ++j)
      if (!steps.column_done[j]) singular.positions.push_back(j);
    for (int i = 0; i < m; ++i)
      if (!steps.row_done[i]) singular.rows.push_back(i);
    return singular;
  }
  install_factors(steps);
  return singular;
}

// Without a branch per entry: after dense work the nonzeros fall without pattern, and a
// mispredicted branch per entry had made this scan 5 % of dfl001's search.
void FloatSparseVector::rebuild_index() {
  const int n = static_cast<int>(values.size());
  index.resize(n);
  int count = 0;
  for (int i = 0; i < n; ++i) {
    index[count] = i;
    count += values[i] != 0;
  }
  index.resize(count);
}

void ListPool::reset(int lists, const std::vector<int>& room) {
  start_.resize(lists);
  size_.assign(lists, 0);
  room_ = room;
  int total = 0;
  for (int l = 0; l < lists; ++l) {
    start_[l] = total;
    total += room[l];
  }
  index_.resize(total);
  value_.resize(total);
}

void ListPool::append(int list, int i, double v) {
  if (size_[list] == room_[list]) {
    const int moved = static_cast<int>(index_.size());
    room_[list] = 2 * room_[list] + 4;
    index_.resize(moved + room_[list]);
    value_.resize(moved + room_[list]);
    std::copy_n(index_.begin() + start_[list], size_[list], index_.begin() + moved);
    std::copy_n(value_.begin() + start_[list], size_[list], value_.begin() + moved);
    start_[list] = moved;
  }
  const int slot = start_[list] + size_[list]++;
  index_[slot] = i;
  value_[slot] = v;
}

double ListPool::take(int list, int i) {
  const int begin = start_[list], last = begin + size_[list] - 1;
  for (int slot = begin; slot <= last; ++slot)
    if (index_[slot] == i) {
      const double value = value_[slot];
      index_[slot] = index_[last];
      value_[slot] = value_[last];
      --size_[list];
      return value;
    }
  return 0;
}

// The steps' factors are re-indexed by pivot row (for L and U) so that Forrest-Tomlin updates
// can reorder U without touching L.
void FloatBasisFactor::install_factors(const Elimination& steps) {
  const int m = m_;
  const std::vector<int>& pivot_row = steps.pivot_row;
  const SparseVectors &l_columns = steps.l_columns, &u_rows = steps.u_rows;
  position_of_row_.assign(m, -1);
  row_of_position_.assign(m, -1);
  diagonal_.assign(m, 0);
  u_order_ = pivot_row;
  u_rank_.assign(m, -1);
  l_order_.clear();
  lt_order_.clear();
  for (int k = 0; k < m; ++k) {
    const int r = pivot_row[k];
    position_of_row_[r] = steps.pivot_position[k];
    row_of_position_[steps.pivot_position[k]] = r;
    diagonal_[r] = steps.diagonal[k];
    u_rank_[r] = k;
    if (l_columns.start[k + 1] > l_columns.start[k]) l_order_.push_back(r);
  }

  // L by pivot row, and its transpose.
  std::vector<int> step_of_row(m);
  for (int k = 0; k < m; ++k) step_of_row[pivot_row[k]] = k;
  l_columns_.clear();
  for (int r = 0; r < m; ++r) {
    const int k = step_of_row[r];
    for (int p = l_columns.start[k]; p < l_columns.start[k + 1]; ++p) l_columns_.push(l_columns.index[p], l_columns.value[p]);
    l_columns_.close();
  }
  l_nonzeros_ = l_columns_.index.size();
  std::vector<int> counts(m, 0);
  for (int i : l_columns_.index) ++counts[i];
  l_rows_.start.assign(m + 1, 0);
  for (int i = 0; i < m; ++i) l_rows_.start[i + 1] = l_rows_.start[i] + counts[i];
  l_rows_.index.resize(l_nonzeros_);
  l_rows_.value.resize(l_nonzeros_);
  for (int k = m - 1; k >= 0; --k)
    if (counts[pivot_row[k]] > 0) lt_order_.push_back(pivot_row[k]);
  std::vector<int> fill(l_rows_.start.begin(), l_rows_.start.end() - 1);
  for (int r = 0; r < m; ++r)
    for (int p = l_columns_.start[r]; p < l_columns_.start[r + 1]; ++p) {
      const int slot = fill[l_columns_.index[p]]++;
      l_rows_.index[slot] = r;
      l_rows_.value[slot] = l_columns_.value[p];
    }

  // U by row and by position, with a little room for the updates' spikes.
  std::vector<int> row_room(m), column_room(m, 4);
  for (int k = 0; k < m; ++k) {
    row_room[pivot_row[k]] = u_rows.start[k + 1] - u_rows.start[k] + 4;
    for (int p = u_rows.start[k]; p < u_rows.start[k + 1]; ++p) ++column_room[u_rows.index[p]];
  }
  u_rows_.reset(m, row_room);
  u_columns_.reset(m, column_room);
  for (int k = 0; k < m; ++k)
    for (int p = u_rows.start[k]; p < u_rows.start[k + 1]; ++p) {
      u_rows_.append(pivot_row[k], u_rows.index[p], u_rows.value[p]);
      u_columns_.append(u_rows.index[p], pivot_row[k], u_rows.value[p]);
    }
  u_nonzeros_ = factored_nonzeros_ = u_rows.index.size();

  r_etas_.clear();
  r_row_.clear();
  updates_ = 0;
  usable_ = true;

  spike_.reset(m);
  dense_.index.clear();
  solved_.reset(m);
  visited_.assign(m, 0);
  stack_.resize(m);
  next_edge_.resize(m);
  row_work_.assign(m, 0);
}

bool FloatBasisFactor::refactor_due() const {
  return !usable_ || updates_ >= update_limit ||
         u_nonzeros_ + r_etas_.index.size() > 2 * (l_nonzeros_ + factored_nonzeros_ + m_);
}

bool FloatBasisFactor::sparse_enough(const FloatSparseVector& x) const {
  return x.count() <= sparse_density * m_;
}

template <class Neighbours>
bool FloatBasisFactor::reach(FloatSparseVector& x, Neighbours&& neighbours) const {
  const std::size_t limit = static_cast<std::size_t>(sparse_density * m_);
  scratch_index_.clear();  // finished nodes, in postorder
  std::size_t reached = 0;
  auto give_up = [&](int depth) {
    for (int v : scratch_index_) visited_[v] = 0;
    for (int d = 0; d <= depth; ++d) visited_[stack_[d]] = 0;
    return false;
  };
  for (int root : x.index) {
    if (visited_[root]) continue;
    if (++reached > limit) return give_up(-1);
    visited_[root] = 1;
    int depth = 0;
    stack_[0] = root;
    next_edge_[0] = 0;
    while (depth >= 0) {
      const int v = stack_[depth];
      const auto [edges, degree] = neighbours(v);
      int e = next_edge_[depth];
      while (e < degree && visited_[edges[e]]) ++e;
      if (e < degree) {
        next_edge_[depth] = e + 1;
        const int w = edges[e];
        if (++reached > limit) return give_up(depth);
        visited_[w] = 1;
        stack_[++depth] = w;
        next_edge_[depth] = 0;
      } else {
        scratch_index_.push_back(v);
        --depth;
      }
    }
  }
  x.index.assign(scratch_index_.rbegin(), scratch_index_.rend());
  for (int v : x.index) visited_[v] = 0;
  return true;
}

// x[i] -= value * x[r] for the (i, value) pairs of lists[r], each r after every r' whose list
// holds r: through the reached nodes in topological order, or through all of dense_order.  The
// dense way lists the nonzeros by one scan at the end, cheaper than marking each entry as it
// fills in (at least sparse_density * m entries are listed already when it is taken).
void FloatBasisFactor::eliminate(FloatSparseVector& x, const SparseVectors& lists,
                                 const std::vector<int>& dense_order) const {
  const int* index = lists.index.data();
  const double* value = lists.value.data();
  auto apply = [&](int r) {
    const double v = x.values[r];
    if (v == 0) return;
    for (int p = lists.start[r], end = lists.start[r + 1]; p < end; ++p) x.values[index[p]] -= value[p] * v;
  };
  auto edges = [&](int r) { return std::pair{index + lists.start[r], lists.start[r + 1] - lists.start[r]}; };
  if (sparse_enough(x) && reach(x, edges)) {
    for (int r : x.index) apply(r);
    return;
  }
  for (int r : dense_order) apply(r);
  x.rebuild_index();
}

void FloatBasisFactor::solve_l(FloatSparseVector& x) const { eliminate(x, l_columns_, l_order_); }

void FloatBasisFactor::solve_lt(FloatSparseVector& x) const { eliminate(x, l_rows_, lt_order_); }

// R in order; an update's row is listed when it turns nonzero (visited_ marks the listed rows).
void FloatBasisFactor::solve_r(FloatSparseVector& x) const {
  if (r_row_.empty()) return;
  for (int i : x.index) visited_[i] = 1;
  for (std::size_t e = 0; e < r_row_.size(); ++e) {
    double s = 0;
    for (int p = r_etas_.start[e]; p < r_etas_.start[e + 1]; ++p) s += r_etas_.value[p] * x.values[r_etas_.index[p]];
    if (s == 0) continue;
    const int r = r_row_[e];
    x.values[r] -= s;
    if (!visited_[r]) visited_[r] = 1, x.index.push_back(r);
  }
  for (int i : x.index) visited_[i] = 0;
}

void FloatBasisFactor::solve_rt(FloatSparseVector& x) const {
  if (r_row_.empty()) return;
  for (int i : x.index) visited_[i] = 1;
  for (int e = static_cast<int>(r_row_.size()) - 1; e >= 0; --e) {
    const double v = x.values[r_row_[e]];
    if (v == 0) continue;
    for (int p = r_etas_.start[e]; p < r_etas_.start[e + 1]; ++p) {
      const int i = r_etas_.index[p];
      x.values[i] -= r_etas_.value[p] * v;
      if (!visited_[i]) visited_[i] = 1, x.index.push_back(i);
    }
  }
  for (int i : x.index) visited_[i] = 0;
}

// A triangular solve with U or U^T.  Node v's own equation fixes the unknown key[v] (nodes are
// rows and keys positions for U, the other way round for U^T); its value then leaves the nodes
// in lists[key[v]].  The result goes to the key space through solved_, without a permutation.
template <class Pivot, class DenseOrder>
void FloatBasisFactor::substitute(FloatSparseVector& x, const ListPool& lists, const std::vector<int>& key,
                                  Pivot&& pivot, DenseOrder&& dense_order) const {
  auto solve = [&](int v) {
    double value = x.values[v];
    if (value == 0) return;
    x.values[v] = 0;
    value /= pivot(v);
    const int k = key[v];
    solved_.values[k] = value;
    solved_.index.push_back(k);
    const int* nodes = lists.indices(k);
    const double* entries = lists.values(k);
    for (int t = 0, size = lists.size(k); t < size; ++t) x.values[nodes[t]] -= entries[t] * value;
  };
  auto edges = [&](int v) { return std::pair{lists.indices(key[v]), lists.size(key[v])}; };
  if (sparse_enough(x) && reach(x, edges)) {
    for (int v : x.index) solve(v);
  } else {
    dense_order(solve);
  }
  x.values.swap(solved_.values);  // x was zeroed as it was solved
  x.index.swap(solved_.index);
  solved_.index.clear();
}

void FloatBasisFactor::solve_u(FloatSparseVector& x) const {
  substitute(x, u_columns_, position_of_row_, [&](int r) { return diagonal_[r]; }, [&](auto&& solve) {
    for (auto k = u_order_.rbegin(); k != u_order_.rend(); ++k)
      if (*k >= 0) solve(*k);
  });
}

void FloatBasisFactor::solve_ut(FloatSparseVector& x) const {
  substitute(x, u_rows_, row_of_position_, [&](int c) { return diagonal_[row_of_position_[c]]; }, [&](auto&& solve) {
    for (int r : u_order_)
      if (r >= 0) solve(position_of_row_[r]);
  });
}

void FloatBasisFactor::ftran(FloatSparseVector& x) const {
  solve_l(x);
  solve_r(x);
  solve_u(x);
}

void FloatBasisFactor::ftran_entering(FloatSparseVector& x) {
  solve_l(x);
  solve_r(x);
  spike_.clear();
  for (int i : x.index)
    if (x.values[i] != 0) spike_.values[i] = x.values[i], spike_.index.push_back(i);
  solve_u(x);
}

void FloatBasisFactor::btran(FloatSparseVector& x) const {
  solve_ut(x);
  solve_rt(x);
  solve_lt(x);
}

template <class Solve>
void FloatBasisFactor::solve_dense(std::vector<double>& x, Solve&& solve) const {
  dense_.values.swap(x);
  dense_.rebuild_index();
  solve(dense_);
  dense_.values.swap(x);
  dense_.index.clear();
}

void FloatBasisFactor::ftran(std::vector<double>& x) const {
  solve_dense(x, [this](FloatSparseVector& v) { ftran(v); });
}

void FloatBasisFactor::btran(std::vector<double>& x) const {
  solve_dense(x, [this](FloatSparseVector& v) { btran(v); });
}

// Forrest & Tomlin (1972): column p of U becomes the spike; the row paired with p moves to the
// end of the pivot order, and its entries left of the new diagonal are eliminated by the rows
// now before it, in pivot order (that elimination is the new row transformation).  The new
// pivot must equal alpha times the old one, as the determinant changes by the factor alpha.
bool FloatBasisFactor::update(int position, double alpha) {
  const int t = row_of_position_[position];
  const double old_pivot = diagonal_[t];

  // Column p leaves U.
  const int* rows = u_columns_.indices(position);
  for (int s = 0, size = u_columns_.size(position); s < size; ++s) u_rows_.take(rows[s], position);
  u_nonzeros_ -= u_columns_.size(position);
  u_columns_.clear(position);

  // Row t leaves U into row_work_ (by position); its positions queue by the rank of their rows.
  std::priority_queue<int, std::vector<int>, std::greater<int>> queue;
  const int* positions = u_rows_.indices(t);
  const double* values = u_rows_.values(t);
  for (int s = 0, size = u_rows_.size(t); s < size; ++s) {
    const int j = positions[s];
    row_work_[j] = values[s];
    visited_[j] = 1;
    queue.push(u_rank_[row_of_position_[j]]);
    u_columns_.take(j, t);
  }
  u_nonzeros_ -= u_rows_.size(t);
  u_rows_.clear(t);

  double pivot = spike_.values[t];
  while (!queue.empty()) {
    const int r = u_order_[queue.top()];
    queue.pop();
    const int j = position_of_row_[r];
    const double w = row_work_[j];
    row_work_[j] = 0;
    visited_[j] = 0;
    if (std::abs(w) <= drop_tolerance) continue;
    const double multiplier = w / diagonal_[r];
    r_etas_.push(r, multiplier);
    pivot -= multiplier * spike_.values[r];
    const int* row_positions = u_rows_.indices(r);
    const double* row_values = u_rows_.values(r);
    for (int s = 0, size = u_rows_.size(r); s < size; ++s) {
      const int k = row_positions[s];
      if (!visited_[k]) visited_[k] = 1, queue.push(u_rank_[row_of_position_[k]]);
      row_work_[k] -= multiplier * row_values[s];
    }
  }
  if (static_cast<int>(r_etas_.index.size()) > r_etas_.start.back()) {
    r_etas_.close();
    r_row_.push_back(t);
  }

  // The spike becomes column p; row t moves to the end of the order with the new pivot.
  for (int i : spike_.index) {
    const double v = spike_.values[i];
    if (i == t || std::abs(v) <= drop_tolerance) continue;
    u_columns_.append(position, i, v);
    u_rows_.append(i, position, v);
    ++u_nonzeros_;
  }
  diagonal_[t] = pivot;
  u_order_[u_rank_[t]] = -1;
  u_rank_[t] = static_cast<int>(u_order_.size());
  u_order_.push_back(t);
  ++updates_;

  const double expected = alpha * old_pivot;
  if (!(std::abs(pivot) > absolute_tolerance) || std::abs(pivot - expected) > update_tolerance * std::abs(pivot))
    usable_ = false;
  return usable_;
}

}  // namespace plumb::simplex::detail
