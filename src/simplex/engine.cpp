#include "engine.hpp"

#include <algorithm>
#include <cmath>
#include <limits>
#include <span>
#include <tuple>

namespace plumb::simplex::detail {
namespace {

// A safety net, not a budget: the simplex method takes a small multiple of the row count in
// iterations on nearly all practical LPs (common practice), so ten per variable plus a floor for
// tiny models is reached only by cycling or stalling; the search then reports failure and the
// exact engine takes over.
constexpr long iterations_per_variable = 10;
constexpr long iteration_floor = 10000;

// The pivot row is computed row-wise over rho's nonzeros when rho is sparser than this share of
// the rows, else column by column over every nonbasic column: row-wise work grows with rho's
// nonzeros times the row lengths, column-wise with all of A.  Common practice puts the switch
// between a tenth and a third; this value is untuned.  (FloatBasisFactor::sparse_density, 0.1, is the
// like switch of the triangular solves, whose dense loops are cheaper than a pass over A.)
constexpr double row_wise_pivot_row_density = 0.2;

// The pivot alpha is computed twice, from the entering column (ftran) and from the pivot row
// (btran): a relative gap above this, or an alpha too small to divide by, means the factors have
// drifted, so they are refreshed and the pivot retried.  1e-7 is the pivot tolerance; 1e-9 is two
// orders below it, where a quotient would magnify rounding beyond the tolerances.
constexpr double pivot_agreement = 1e-7;
constexpr double smallest_pivot = 1e-9;
// Disagreements tolerated over a search before it gives up with NumericalTrouble (the exact
// engine then takes over): the dual loop carries the search and recovers by refactoring or by
// rejecting the row; the primal loop only cleans up a few iterations after it, so fewer there.
constexpr int dual_disagreements_allowed = 1000;
constexpr int primal_disagreements_allowed = 200;

// Dual steepest-edge weights are squared norms of rows of B^-1, positive in exact arithmetic; the
// update formula can drive them to zero or below by rounding, which would make a row look
// infinitely attractive, so they are kept above this floor (common practice).
constexpr double weight_floor = 1e-4;

// Dual phase 1's auxiliary problem boxes a free variable in [-box, box]: wide enough that the
// box is inactive for ordinary scaled data, small enough to keep the auxiliary primal values
// moderate (the value of Koberstein 2005, section 4.3, from memory).
constexpr double free_variable_box = 1000;

// Cost perturbation, relative to (1 + |cost|) and times a random factor in [1, 2): ten times the
// dual tolerance, so perturbed reduced costs clear it, and small enough that removing the
// perturbation at the end costs few primal iterations (common practice).
constexpr double cost_perturbation = 1e-6;

// The crash's pivots: at least this share of their column's largest entry (the LU's threshold).
constexpr double crash_pivot_share = 0.1;

// The (index, value) entries of list k.
std::pair<std::span<const int>, std::span<const double>> entries_of(const SparseVectors& lists, int k) {
  const int begin = lists.start[k], size = lists.start[k + 1] - begin;
  return {std::span(lists.index).subspan(begin, size), std::span(lists.value).subspan(begin, size)};
}

}  // namespace

FloatEngine::FloatEngine(const LpData& lp, const FloatOptions& options, SearchGoal goal)
    : lp_(lp),
      options_(options),
      m_(lp.rows),
      n_(lp.columns),
      inf_(std::numeric_limits<double>::infinity()),
      goal_cost_(goal == SearchGoal::model_costs ? lp.cost : std::vector<double>(lp.cost.size(), 0.0)),
      cost_(goal_cost_),
      lower_(lp.lower),
      upper_(lp.upper) {
  const int total = m_ + n_;
  x_.assign(total, 0);
  d_.assign(total, 0);
  position_.assign(total, -1);
  status_.assign(total, VarStatus::at_lower);
  head_.resize(m_);
  weight_.assign(m_, 1);
  rejected_.assign(m_, 0);
  listed_.assign(m_, 0);
  rho_.reset(m_);
  column_.reset(m_);
  tau_.reset(m_);
  flips_.reset(m_);
  work_.assign(m_, 0);
  alpha_row_.assign(total, 0);
  in_row_.assign(total, 0);
  iteration_limit_ = iterations_per_variable * total + iteration_floor;
  std::vector<VarStatus> slack(total, VarStatus::basic);
  for (int j = 0; j < n_; ++j) slack[j] = default_status(j);
  start_from(slack);
}

VarStatus FloatEngine::default_status(int j) const {
  if (lower_[j] > -inf_) return VarStatus::at_lower;
  if (upper_[j] < inf_) return VarStatus::at_upper;
  return VarStatus::at_zero;
}

// The bound a nonbasic variable should rest at so its reduced cost is dual feasible, if any.
VarStatus FloatEngine::status_for_reduced_cost(int j) const {
  if (fixed(j)) return VarStatus::at_lower;
  if (d_[j] > dual_tolerance && lower_[j] > -inf_) return VarStatus::at_lower;
  if (d_[j] < -dual_tolerance && upper_[j] < inf_) return VarStatus::at_upper;
  if (std::abs(d_[j]) <= dual_tolerance && status_[j] != VarStatus::basic) {
    VarStatus s = status_[j];
    if (s == VarStatus::at_lower && lower_[j] > -inf_) return s;
    if (s == VarStatus::at_upper && upper_[j] < inf_) return s;
  }
  return default_status(j);
}

double FloatEngine::nonbasic_value(int j) const {
  switch (status_[j]) {
    case VarStatus::at_lower: return lower_[j];
    case VarStatus::at_upper: return upper_[j];
    default: return 0;
  }
}

void FloatEngine::set_nonbasic(int j, VarStatus s) {
  if (s == VarStatus::at_lower && lower_[j] == -inf_) s = default_status(j);
  if (s == VarStatus::at_upper && upper_[j] == inf_) s = default_status(j);
  if (s == VarStatus::at_zero && (lower_[j] > -inf_ || upper_[j] < inf_)) s = default_status(j);
  status_[j] = s;
  position_[j] = -1;
  x_[j] = nonbasic_value(j);
}

template <class F>
void FloatEngine::for_column(int j, F&& f) const {
  if (j < n_) {
    for (int p = lp_.by_column.start[j]; p < lp_.by_column.start[j + 1]; ++p) f(lp_.by_column.index[p], lp_.by_column.value[p]);
  } else {
    f(j - n_, -1.0);
  }
}

void FloatEngine::start_from(const std::vector<VarStatus>& statuses, const DualWeights* weights) {
  const int total = m_ + n_;
  int basic = 0;
  for (int j = 0; j < total; ++j) basic += statuses[j] == VarStatus::basic;
  std::vector<VarStatus> use = statuses;
  if (basic != m_) {
    for (int j = 0; j < n_; ++j) use[j] = default_status(j);
    for (int i = 0; i < m_; ++i) use[n_ + i] = VarStatus::basic;
    weights = nullptr;
  }
  int k = 0;
  for (int j = 0; j < total; ++j) {
    if (use[j] == VarStatus::basic) {
      status_[j] = VarStatus::basic;
      head_[k] = j;
      position_[j] = k++;
    } else {
      set_nonbasic(j, use[j]);
    }
  }
  std::fill(weight_.begin(), weight_.end(), 1.0);
  if (!weights || static_cast<int>(weights->size()) != total) return;
  for (int position = 0; position < m_; ++position)
    if ((*weights)[head_[position]] > 0) weight_[position] = (*weights)[head_[position]];
}

DualWeights FloatEngine::dual_weights() const {
  DualWeights weights(m_ + n_, 0.0);
  for (int k = 0; k < m_; ++k) weights[head_[k]] = weight_[k];
  return weights;
}

// The crash (our own, in the spirit of the triangular crash bases of R. E. Bixby, "Implementing
// the simplex method: the initial basis", ORSA J. Computing 4(3), 1992): the dual simplex from
// the all-logical basis spends its first iterations bringing in, one equality row at a time, a
// column to carry the row's right-hand side, and when the cheapest such column reaches back
// through a chain of rows (stock carried between periods), the rows of B^-1 it later prices with
// grow dense.  Here row i takes column j when
//  - j's entry a is at least crash_pivot_share of j's largest (a stable pivot),
//  - j has no entry in a row already crashed (the basis stays triangular: row i holds a as the
//    only entry among basic columns, and j's other rows keep their logicals, closed to the crash),
//  - with y_i = d_j / a every nonbasic column of row i keeps a dual feasible reduced cost (boxed
//    columns rest at whichever bound suits theirs),
// preferring columns that close fewer other equality rows, then those that carry the row's
// right-hand side within their bounds, then the smallest |d_j / a|.  So the
// dual simplex starts dual feasible wherever the all-logical basis was, on rows carried directly.
int FloatEngine::crash_equality_rows() {
  enum RowState : char { open, crashed, closed };
  std::vector<char> row_state(m_, open);
  std::vector<double> d(cost_.begin(), cost_.begin() + n_);  // reduced costs; y is 0 on open rows
  auto column_entries = [&](int j) { return entries_of(lp_.by_column, j); };
  auto row_entries = [&](int i) { return entries_of(lp_.by_row, i); };
  struct Candidate {
    int closes;    // other equality rows the column would close
    bool outside;  // the value that carries the row lies outside the column's bounds
    double ratio;
    int column;
    double entry;
  };
  // Kept per column as rows leave the open state, so that each row's candidates cost O(1) each
  // and the whole crash O(nonzeros): a column's largest entry, whether it has an entry in a
  // crashed row, and how many of its entries lie in open equality rows.
  std::vector<double> largest(n_, 0.0);
  std::vector<char> in_crashed_row(n_, 0);
  std::vector<int> open_equalities(n_, 0);
  for (int i = 0; i < m_; ++i) {
    auto [columns, values] = row_entries(i);
    for (std::size_t t = 0; t < columns.size(); ++t) {
      largest[columns[t]] = std::max(largest[columns[t]], std::abs(values[t]));
      open_equalities[columns[t]] += fixed(n_ + i);
    }
  }
  auto leave_open = [&](int i, RowState state) {
    row_state[i] = state;
    for (int j : row_entries(i).first) {
      open_equalities[j] -= fixed(n_ + i);
      in_crashed_row[j] |= state == crashed;
    }
  };
  std::vector<Candidate> candidates, taken;
  for (int i = 0; i < m_; ++i) {
    const int logical = n_ + i;
    if (row_state[i] != open || !fixed(logical)) continue;
    auto [columns, values] = row_entries(i);
    double activity = 0;
    for (std::size_t t = 0; t < columns.size(); ++t) activity += values[t] * nonbasic_value(columns[t]);
    if (std::abs(activity - lower_[logical]) <= primal_tolerance * (1 + std::abs(lower_[logical]))) continue;
    candidates.clear();
    for (std::size_t t = 0; t < columns.size(); ++t) {
      const int j = columns[t];
      const double a = values[t];
      if (status_[j] == VarStatus::basic || fixed(j) || in_crashed_row[j] ||
          std::abs(a) < crash_pivot_share * largest[j])
        continue;
      const double value = nonbasic_value(j) + (lower_[logical] - activity) / a;
      const bool outside = value < lower_[j] - primal_tolerance || value > upper_[j] + primal_tolerance;
      candidates.push_back({open_equalities[j] - 1, outside, std::abs(d[j] / a), j, a});
    }
    std::sort(candidates.begin(), candidates.end(), [](const Candidate& x, const Candidate& y) {
      return std::tie(x.closes, x.outside, x.ratio, x.column) <
             std::tie(y.closes, y.outside, y.ratio, y.column);
    });
    // The interval of y_i that keeps each nonbasic column of the row dual feasible; a candidate's
    // own y_i = d_j / a meets its own limit, so one interval serves them all.
    double below = -inf_, above = inf_;
    auto limit = [&](bool upper_limit, double y) {
      if (upper_limit)
        above = std::min(above, y);
      else
        below = std::max(below, y);
    };
    const double slack = 0.01 * dual_tolerance;
    for (std::size_t t = 0; t < columns.size(); ++t) {
      const int k = columns[t];
      const double a = values[t];
      if (status_[k] == VarStatus::basic || boxed(k)) continue;
      // d_k - a y >= -slack at a lower bound, <= slack at an upper bound, both when free.
      if (lower_[k] > -inf_ || upper_[k] == inf_) limit(a > 0, (d[k] + slack) / a);
      if (lower_[k] == -inf_) limit(a < 0, (d[k] - slack) / a);
    }
    for (const Candidate& c : candidates) {
      const double y = d[c.column] / c.entry;
      if (y < below || y > above) continue;
      for (std::size_t t = 0; t < columns.size(); ++t) d[columns[t]] -= values[t] * y;
      d[c.column] = 0;
      leave_open(i, crashed);
      for (int r : column_entries(c.column).first)
        if (row_state[r] == open) leave_open(r, closed);
      const int k = position_[logical];
      head_[k] = c.column;
      position_[c.column] = k;
      status_[c.column] = VarStatus::basic;
      set_nonbasic(logical, VarStatus::at_lower);
      taken.push_back(c);
      break;
    }
  }
  // Exact dual steepest-edge weights ||e_k^T B^-1||^2 of the triangular basis: a crashed column's
  // row of B^-1 is e_i / a, a logical's row -e_k plus a_kj / a at each crashed column's row i.
  for (const Candidate& c : taken) {
    weight_[position_[c.column]] = 1 / (c.entry * c.entry);
    auto [rows, values] = column_entries(c.column);
    for (std::size_t t = 0; t < rows.size(); ++t)
      if (row_state[rows[t]] != crashed) weight_[position_[n_ + rows[t]]] += std::pow(values[t] / c.entry, 2);
  }
  return static_cast<int>(taken.size());
}

void FloatEngine::refactor() {
  repaired_ = false;
  for (int attempt = 0; attempt < 4; ++attempt) {
    SparseVectors columns;
    for (int k = 0; k < m_; ++k) {
      for_column(head_[k], [&](int i, double v) { columns.push(i, v); });
      columns.close();
    }
    auto singular = factor_.factorize(m_, columns);
    if (singular.empty()) return;
    for (std::size_t t = 0; t < singular.positions.size(); ++t) {
      int k = singular.positions[t];
      int leaving = head_[k];
      int entering = n_ + singular.rows[t];
      set_nonbasic(leaving, status_for_reduced_cost(leaving));
      head_[k] = entering;
      position_[entering] = k;
      status_[entering] = VarStatus::basic;
      weight_[k] = 1;
    }
    repaired_ = true;
  }
  throw NumericalTrouble{"the basis stays singular after logicals were put in"};
}

bool FloatEngine::refresh() {
  refactor();
  compute_primal();
  compute_dual();
  std::fill(rejected_.begin(), rejected_.end(), 0);
  return repaired_;
}

bool FloatEngine::refresh_dual_feasible() {
  bool repaired = refresh();
  if (remove_dual_infeasibilities(shift_limit) > shift_limit) {
    dual_feasibility_lost_ = true;
    return true;
  }
  return repaired;
}

void FloatEngine::raise_stability() {
  if (stability_level_ >= 3) return;
  ++stability_level_;
  static constexpr double lu_threshold[] = {0.1, 0.3, 0.6, 0.9};
  static constexpr double pivot_size[] = {1e-7, 1e-6, 1e-5, 1e-5};
  factor_.pivot_threshold = lu_threshold[stability_level_];
  pivot_tolerance = pivot_size[stability_level_];
}

void FloatEngine::compute_primal() {
  std::fill(work_.begin(), work_.end(), 0.0);
  for (int j = 0; j < m_ + n_; ++j) {
    if (status_[j] == VarStatus::basic || x_[j] == 0) continue;
    double xj = x_[j];
    for_column(j, [&](int i, double v) { work_[i] -= v * xj; });
  }
  factor_.ftran(work_);
  for (int k = 0; k < m_; ++k) x_[head_[k]] = work_[k];
  for (int k : infeasible_) listed_[k] = 0;
  infeasible_.clear();
  for (int k = 0; k < m_; ++k) note_moved(k);
}

void FloatEngine::note_moved(int k) {
  if (!listed_[k] && primal_infeasibility(head_[k]) > 0) {
    listed_[k] = 1;
    infeasible_.push_back(k);
  }
}

void FloatEngine::move_basics(const FloatSparseVector& change, double factor) {
  for (int k : change.index) {
    x_[head_[k]] -= factor * change[k];
    note_moved(k);
  }
}

void FloatEngine::compute_dual() {
  for (int k = 0; k < m_; ++k) work_[k] = cost_[head_[k]];
  factor_.btran(work_);  // now y, by row
  for (int j = 0; j < n_; ++j) {
    if (status_[j] == VarStatus::basic) {
      d_[j] = 0;
      continue;
    }
    double s = cost_[j];
    for (int p = lp_.by_column.start[j]; p < lp_.by_column.start[j + 1]; ++p) s -= lp_.by_column.value[p] * work_[lp_.by_column.index[p]];
    d_[j] = s;
  }
  // A logical's column is -e_i; its cost is zero unless a shift has moved it.
  for (int i = 0; i < m_; ++i) d_[n_ + i] = status_[n_ + i] == VarStatus::basic ? 0 : cost_[n_ + i] + work_[i];
}

bool FloatEngine::pivot_disagrees(double alpha, double row_alpha, int allowed) {
  if (std::abs(alpha - row_alpha) <= pivot_agreement * (1 + std::abs(alpha)) &&
      std::abs(alpha) >= smallest_pivot)
    return false;
  clear_pivot_row();
  if (++trouble_ > allowed) throw NumericalTrouble{"pivots keep disagreeing between row and column"};
  return true;
}

void FloatEngine::compute_pivot_row() {
  // Row-wise through the nonzeros of rho when it is sparse, else column by column.
  const int nonzeros = rho_.count();
  auto touch = [&](int j, double v) {
    if (!in_row_[j]) {
      in_row_[j] = 1;
      row_touched_.push_back(j);
    }
    alpha_row_[j] += v;
  };
  if (nonzeros < row_wise_pivot_row_density * m_) {
    for (int i : rho_.index) {
      double r = rho_[i];
      if (r == 0) continue;
      for (int p = lp_.by_row.start[i]; p < lp_.by_row.start[i + 1]; ++p) {
        int j = lp_.by_row.index[p];
        if (position_[j] < 0) touch(j, r * lp_.by_row.value[p]);
      }
    }
  } else {
    for (int j = 0; j < n_; ++j) {
      if (position_[j] >= 0) continue;
      double s = 0;
      for (int p = lp_.by_column.start[j]; p < lp_.by_column.start[j + 1]; ++p) s += lp_.by_column.value[p] * rho_[lp_.by_column.index[p]];
      if (s != 0) touch(j, s);
    }
  }
  for (int i : rho_.index)
    if (rho_[i] != 0 && position_[n_ + i] < 0) touch(n_ + i, -rho_[i]);
}

void FloatEngine::clear_pivot_row() {
  for (int j : row_touched_) {
    alpha_row_[j] = 0;
    in_row_[j] = 0;
  }
  row_touched_.clear();
}

double FloatEngine::primal_infeasibility(int j) const {
  if (x_[j] < lower_[j] - primal_tolerance) return lower_[j] - x_[j];
  if (x_[j] > upper_[j] + primal_tolerance) return x_[j] - upper_[j];
  return 0;
}

int FloatEngine::count_primal_infeasible() const {
  int count = 0;
  for (int k = 0; k < m_; ++k) count += primal_infeasibility(head_[k]) > 0;
  return count;
}

double FloatEngine::dual_infeasibility(int j) const {
  if (status_[j] == VarStatus::basic || fixed(j)) return 0;
  switch (status_[j]) {
    case VarStatus::at_lower: return std::max(-d_[j], 0.0);
    case VarStatus::at_upper: return std::max(d_[j], 0.0);
    default: return std::abs(d_[j]);
  }
}

int FloatEngine::count_dual_infeasible(bool boxed_too) const {
  int count = 0;
  for (int j = 0; j < m_ + n_; ++j)
    if (boxed_too || !boxed(j)) count += dual_infeasibility(j) > dual_tolerance;
  return count;
}

double FloatEngine::objective() const {
  double v = 0;
  for (int j = 0; j < n_ + m_; ++j) v += lp_.cost[j] * x_[j];  // logicals cost only in a correction problem
  return v;
}

bool FloatEngine::polls_say_stop(const char* phase) {
  if (options_.budget && options_.budget->exhausted()) return true;
  if (stop_flag_ && stop_flag_->load(std::memory_order_relaxed)) return true;
  if (options_.progress) {
    auto now = std::chrono::steady_clock::now();
    if (iterations_ - last_report_iteration_ >= 100 || now - last_report_ >= std::chrono::milliseconds(250)) {
      last_report_ = now;
      last_report_iteration_ = iterations_;
      double infeasibility = 0;
      for (int k = 0; k < m_; ++k) infeasibility += primal_infeasibility(head_[k]);
      options_.progress(FloatProgress{phase, iterations_, lp_.model_objective(objective()), infeasibility});
    }
  }
  return false;
}

// Basis change: the variable at position r leaves (its status and value already set by the
// caller), `entering` takes its place; column_ holds B^-1 a_entering.
void FloatEngine::pivot(int r, int entering, double primal_step) {
  move_basics(column_, primal_step);
  int leaving = head_[r];
  double entering_value = x_[entering] + primal_step;
  position_[leaving] = -1;
  head_[r] = entering;
  position_[entering] = r;
  status_[entering] = VarStatus::basic;
  x_[entering] = entering_value;
  note_moved(r);
  d_[entering] = 0;
  factor_.update(r, column_[r]);  // a failed update makes refactor_due() true
  ++iterations_;
}

// Pricing of the dual simplex: dual steepest edge (Forrest & Goldfarb, "Steepest-edge simplex
// algorithms for linear programming", Math. Programming 57, 1992): the largest infeasibility^2 /
// weight.  Only the listed positions can be infeasible; those found feasible leave the list.
// Rows whose pivot proved unusable on fresh factors sit out until the next factorization (sets
// any_rejected).  -1 when no position qualifies.
int FloatEngine::choose_leaving_position(bool& any_rejected) {
  int r = -1;
  double best = 0;
  for (std::size_t t = 0; t < infeasible_.size(); ++t) {
    const int k = infeasible_[t];
    double infeasibility = primal_infeasibility(head_[k]);
    if (infeasibility <= 0) {
      listed_[k] = 0;
      infeasible_[t--] = infeasible_.back();
      infeasible_.pop_back();
      continue;
    }
    if (rejected_[k]) {
      any_rejected = true;
      continue;
    }
    double score = infeasibility * infeasibility / weight_[k];
    if (score > best) best = score, r = k;
  }
  return r;
}

// The dual ratio test's breakpoints from the pivot row: reduced costs d_j - t * sign * alpha_j,
// sign = -1 when the leaving variable goes to its lower bound.
void FloatEngine::collect_breakpoints(bool to_lower) {
  candidates_.clear();
  const double sign = to_lower ? -1 : 1;
  for (int j : row_touched_) {
    if (fixed(j)) continue;
    double a = sign * alpha_row_[j];
    if (std::abs(a) <= pivot_tolerance) continue;
    double range = boxed(j) ? upper_[j] - lower_[j] : inf_;
    switch (status_[j]) {
      case VarStatus::at_lower:
        if (a > 0) candidates_.push_back({j, d_[j], a, range});
        break;
      case VarStatus::at_upper:
        if (a < 0) candidates_.push_back({j, -d_[j], -a, range});
        break;
      default:
        candidates_.push_back({j, a > 0 ? d_[j] : -d_[j], std::abs(a), inf_});
        break;
    }
  }
}

// Bound flips of the breakpoints the ratio test passed (the bound-flipping ratio test): each
// boxed variable moves to its other bound and the basic values follow.
void FloatEngine::flip_bounds(const std::vector<int>& flips) {
  flips_.clear();
  for (int j : flips) {
    VarStatus other = status_[j] == VarStatus::at_lower ? VarStatus::at_upper : VarStatus::at_lower;
    double change = (other == VarStatus::at_upper ? upper_[j] : lower_[j]) - x_[j];
    set_nonbasic(j, other);
    for_column(j, [&](int i, double v) { flips_.add(i, v * change); });
  }
  factor_.ftran(flips_);
  move_basics(flips_, 1);
}

// Dual steepest-edge weights after a pivot at position r (Forrest & Goldfarb 1992, update (30)),
// with tau = B^-1 rho and column_ = B^-1 a_entering.
void FloatEngine::update_dual_weights(int r, double alpha) {
  double rho_norm = 0;
  for (int i : rho_.index) rho_norm += rho_[i] * rho_[i];
  tau_.copy_from(rho_);
  factor_.ftran(tau_);
  for (int k : column_.index) {
    if (k == r || column_[k] == 0) continue;
    double kappa = column_[k] / alpha;
    weight_[k] = std::max(weight_[k] + kappa * (kappa * rho_norm - 2 * tau_[k]), weight_floor);
  }
  weight_[r] = std::max(rho_norm / (alpha * alpha), weight_floor);
}

FloatEngine::LoopEnd FloatEngine::dual_loop(const char* phase) {
  bool fresh = false;
  while (true) {
    if (iterations_ >= iteration_limit_) return LoopEnd::limit;
    if (polls_say_stop(phase)) return LoopEnd::stopped;
    if (factor_.refactor_due()) {
      if (refresh_dual_feasible()) return LoopEnd::restart;
      fresh = true;
    }
    bool any_rejected = false;
    const int r = choose_leaving_position(any_rejected);
    if (r < 0 && any_rejected) {
      if (factor_.update_count() == 0) throw NumericalTrouble{"no usable pivot in any infeasible row"};
      if (refresh_dual_feasible()) return LoopEnd::restart;
      fresh = true;
      continue;
    }
    if (r < 0) return LoopEnd::optimal;

    const int leaving = head_[r];
    const bool to_lower = x_[leaving] < lower_[leaving];
    const double delta = to_lower ? x_[leaving] - lower_[leaving] : x_[leaving] - upper_[leaving];
    rho_.clear();
    rho_.add(r, 1.0);
    factor_.btran(rho_);
    compute_pivot_row();

    collect_breakpoints(to_lower);
    DualStep step = dual_ratio_test(candidates_, std::abs(delta), dual_tolerance, primal_tolerance);
    if (step.entering < 0) {
      clear_pivot_row();
      if (!fresh && factor_.update_count() > 0) {
        if (refresh_dual_feasible()) return LoopEnd::restart;
        fresh = true;
        continue;
      }
      ray_variable_ = leaving;
      return LoopEnd::infeasible;
    }
    const int q = step.entering;
    column_.clear();
    for_column(q, [&](int i, double v) { column_.add(i, v); });
    factor_.ftran_entering(column_);
    const double alpha = column_[r];
    if (pivot_disagrees(alpha, alpha_row_[q], dual_disagreements_allowed)) {
      if (factor_.update_count() > 0) {
        if (refresh_dual_feasible()) return LoopEnd::restart;
      } else {
        rejected_[r] = 1;
      }
      fresh = true;
      continue;
    }
    fresh = false;

    // Dual step; a breakpoint taken slightly beyond zero (Harris) is absorbed by shifting the
    // entering cost so its reduced cost is exactly zero (Koberstein 2005, section 6.2.2).
    double theta_dual = d_[q] / alpha;
    if ((to_lower && theta_dual > 0) || (!to_lower && theta_dual < 0)) {
      cost_[q] -= d_[q];
      costs_modified_ = true;
      theta_dual = 0;
    }
    if (theta_dual != 0)
      for (int j : row_touched_) d_[j] -= theta_dual * alpha_row_[j];
    d_[leaving] = -theta_dual;

    if (!step.flips.empty()) flip_bounds(step.flips);
    clear_pivot_row();
    update_dual_weights(r, alpha);

    const double bound = to_lower ? lower_[leaving] : upper_[leaving];
    const double primal_step = (x_[leaving] - bound) / alpha;
    status_[leaving] = to_lower ? VarStatus::at_lower : VarStatus::at_upper;
    pivot(r, q, primal_step);
    x_[leaving] = bound;
  }
}

FloatEngine::LoopEnd FloatEngine::primal_loop() {
  while (true) {
    if (iterations_ >= iteration_limit_) return LoopEnd::limit;
    if (polls_say_stop("primal clean-up")) return LoopEnd::stopped;
    // Small primal infeasibilities that fresh factors show are left to the dual simplex after
    // this loop; the Harris test treats them as zero distance meanwhile.
    if (factor_.refactor_due() && refresh()) return LoopEnd::restart;
    // Pricing: the largest dual infeasibility (Dantzig's rule on the scaled problem).
    int q = -1;
    double best = dual_tolerance;
    for (int j = 0; j < m_ + n_; ++j) {
      double infeasibility = dual_infeasibility(j);
      if (infeasibility > best) best = infeasibility, q = j;
    }
    if (q < 0) return LoopEnd::optimal;
    const double direction = d_[q] < 0 ? 1 : -1;
    column_.clear();
    for_column(q, [&](int i, double v) { column_.add(i, v); });
    factor_.ftran_entering(column_);
    primal_candidates_.clear();
    for (int k : column_.index) {
      double rate = -direction * column_[k];  // change of the basic variable per unit step
      if (std::abs(rate) <= pivot_tolerance) continue;
      int v = head_[k];
      if (rate < 0 && lower_[v] > -inf_) primal_candidates_.push_back({k, x_[v] - lower_[v], -rate});
      if (rate > 0 && upper_[v] < inf_) primal_candidates_.push_back({k, upper_[v] - x_[v], rate});
    }
    PrimalStep step = primal_ratio_test(primal_candidates_, primal_tolerance);
    const double range = boxed(q) ? upper_[q] - lower_[q] : inf_;
    if (step.leaving < 0 && range == inf_) {
      if (options_.correction) {
        // A correction problem is bounded whenever the model's LP is (its costs are reduced
        // costs), so this ray is rounding on costs scaled up to 2^40: the cost is shifted and
        // the search goes on, its basis to be certified exactly in any case.
        cost_[q] -= d_[q];
        d_[q] = 0;
        costs_modified_ = true;
        continue;
      }
      ray_variable_ = q;  // the entering variable spans the ray
      return LoopEnd::unbounded;
    }
    if (step.leaving < 0 || range <= step.step) {
      // The entering variable reaches its other bound first: a bound flip, no basis change.
      VarStatus other = status_[q] == VarStatus::at_lower ? VarStatus::at_upper : VarStatus::at_lower;
      set_nonbasic(q, other);
      move_basics(column_, direction * range);
      ++iterations_;
      continue;
    }
    const int r = step.leaving;
    const int leaving = head_[r];
    const double alpha = column_[r];
    rho_.clear();
    rho_.add(r, 1.0);
    factor_.btran(rho_);
    compute_pivot_row();
    if (pivot_disagrees(alpha, alpha_row_[q], primal_disagreements_allowed)) {
      if (factor_.update_count() > 0) {
        if (refresh()) return LoopEnd::restart;
        continue;
      }
    }
    const double theta_dual = d_[q] / alpha;
    for (int j : row_touched_) d_[j] -= theta_dual * alpha_row_[j];
    d_[leaving] = -theta_dual;
    clear_pivot_row();
    const bool leaves_low = -direction * alpha < 0;
    const double bound = leaves_low ? lower_[leaving] : upper_[leaving];
    const double primal_step = direction * std::max(step.step, 0.0);
    status_[leaving] = leaves_low ? VarStatus::at_lower : VarStatus::at_upper;
    pivot(r, q, primal_step);
    x_[leaving] = bound;
    weight_[r] = 1;
  }
}

// Dual phase 1 by the auxiliary problem (Koberstein 2005, section 4.3, after Fourer 1994): the
// same matrix and costs with every bound replaced by a small box, so that every basis is dual
// feasible once nonbasics sit at the right end; its optimum is a dual feasible basis of the
// original problem exactly when its objective is zero.
FloatEngine::LoopEnd FloatEngine::dual_phase_one() {
  const int total = m_ + n_;
  std::vector<double> saved_lower = lower_, saved_upper = upper_;
  for (int j = 0; j < total; ++j) {
    bool has_lower = lower_[j] > -inf_, has_upper = upper_[j] < inf_;
    if (has_lower && has_upper) lower_[j] = upper_[j] = 0;
    else if (has_lower) lower_[j] = 0, upper_[j] = 1;
    else if (has_upper) lower_[j] = -1, upper_[j] = 0;
    else
      lower_[j] = -free_variable_box, upper_[j] = free_variable_box;
  }
  for (int j = 0; j < total; ++j)
    if (status_[j] != VarStatus::basic) set_nonbasic(j, d_[j] >= 0 ? VarStatus::at_lower : VarStatus::at_upper);
  compute_primal();
  LoopEnd end = dual_loop("dual phase 1");
  lower_ = saved_lower;
  upper_ = saved_upper;
  for (int j = 0; j < total; ++j)
    if (status_[j] != VarStatus::basic) set_nonbasic(j, status_for_reduced_cost(j));
  compute_primal();
  return end;
}

void FloatEngine::perturb_costs() {
  // Random perturbation in the direction that keeps each reduced cost feasible (Koberstein
  // 2005, section 6.2.2; Maros 2003, section 9.6.2), removed before the answer is given.
  std::uniform_real_distribution<double> unit(0.0, 1.0);
  // Only nonbasic costs move: a basic cost would change every reduced cost through the duals.
  for (int j = 0; j < n_; ++j) {
    if (status_[j] == VarStatus::basic || fixed(j) || (lower_[j] == -inf_ && upper_[j] == inf_)) continue;
    double size = cost_perturbation * (1 + std::abs(cost_[j])) * (1 + unit(random_));
    cost_[j] += status_[j] == VarStatus::at_upper ? -size : size;
  }
  costs_modified_ = true;
}

// Small dual infeasibilities left by tolerances are removed (Koberstein 2005, section 6.2.2):
// boxed variables move to their other bound, the others' costs are shifted, to be undone with
// the perturbation.  Returns the largest infeasibility and changes nothing when it exceeds `limit`.
double FloatEngine::remove_dual_infeasibilities(double limit) {
  double largest = 0;
  for (int j = 0; j < m_ + n_; ++j) largest = std::max(largest, dual_infeasibility(j));
  if (largest > limit) return largest;
  bool flipped = false;
  for (int j = 0; j < m_ + n_; ++j) {
    if (dual_infeasibility(j) <= dual_tolerance) continue;
    if (boxed(j)) {
      set_nonbasic(j, status_[j] == VarStatus::at_lower ? VarStatus::at_upper : VarStatus::at_lower);
      flipped = true;
    } else {
      cost_[j] -= d_[j];
      d_[j] = 0;
      costs_modified_ = true;
    }
  }
  if (flipped) compute_primal();
  return largest;
}

void FloatEngine::restore_costs() {
  cost_ = goal_cost_;
  costs_modified_ = false;
}

FloatStatus FloatEngine::solve() {
  try {
    refactor();
    compute_primal();
    compute_dual();
    bool perturbed_once = false;
    for (int round = 0; round < 20; ++round) {
      int primal_bad = count_primal_infeasible();
      // A correction problem only guides the next exact certification, which judges its basis on
      // the true costs: optimal on perturbed or shifted ones is enough.
      if (primal_bad == 0 && costs_modified_ && options_.correction && count_dual_infeasible(true) == 0)
        return FloatStatus::optimal;
      // Primal feasible on perturbed or shifted costs: back to the model's costs, where the
      // primal loop removes what dual infeasibility is left without losing primal feasibility
      // (a dual phase 1 from here had lost it again and again: greenbea's least-infeasibility LP
      // ended 20 rounds later without a basis).
      if (primal_bad == 0 && costs_modified_) {
        restore_costs();
        compute_dual();
        continue;
      }
      int dual_bad = count_dual_infeasible(true);
      if (primal_bad == 0 && dual_bad == 0) return FloatStatus::optimal;
      LoopEnd end;
      // The primal clean-up prices by Dantzig's rule and only pays where the dual would need
      // its phase 1; dual infeasibilities of boxed variables alone vanish by moving them to
      // their other bound, which leaves the dual simplex (fit2d: 135 iterations, not 31399).
      if (primal_bad == 0 && !costs_modified_ && count_dual_infeasible(false) > 0) {
        end = primal_loop();
      } else {
        for (int j = 0; j < m_ + n_; ++j)
          if (status_[j] != VarStatus::basic) set_nonbasic(j, status_for_reduced_cost(j));
        compute_primal();
        if (count_dual_infeasible(false) > 0) {
          end = dual_phase_one();
          // No dual feasible basis exists: the model is unbounded unless it is infeasible.  With
          // every dual infeasibility shifted away the dual simplex finds a feasible basis (or a
          // dual ray); back on the model's costs, the primal loop then names the ray's edge.
          if (end == LoopEnd::optimal && remove_dual_infeasibilities(shift_limit) > shift_limit)
            remove_dual_infeasibilities(inf_);
        } else {
          end = LoopEnd::optimal;
        }
        if (end == LoopEnd::optimal) {
          if (!perturbed_once) {
            perturb_costs();
            compute_dual();
            perturbed_once = true;
          }
          end = dual_loop("dual");
        }
      }
      switch (end) {
        case LoopEnd::optimal:
        case LoopEnd::restart:
          if (dual_feasibility_lost_) {
            // The shifts made so far may be what the lost accuracy fed on: start again from the
            // model's costs with stricter pivoting.
            dual_feasibility_lost_ = false;
            raise_stability();
            restore_costs();
            perturbed_once = false;
          }
          refresh();
          break;
        case LoopEnd::infeasible: note_ = "dual ray found"; return FloatStatus::infeasible;
        case LoopEnd::unbounded: note_ = "primal ray found"; return FloatStatus::unbounded;
        case LoopEnd::stopped: note_ = "budget exhausted"; return FloatStatus::stopped;
        case LoopEnd::limit: note_ = "iteration limit reached"; return FloatStatus::failed;
      }
    }
    note_ = "no stable optimal basis after repeated clean-up";
    return FloatStatus::failed;
  } catch (const NumericalTrouble& trouble) {
    note_ = trouble.what;
    return FloatStatus::failed;
  }
}

}  // namespace plumb::simplex::detail
