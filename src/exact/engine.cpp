#include "engine.hpp"

#include "refine.hpp"

#include <algorithm>
#include <chrono>
#include <cmath>
#include <iterator>
#include <limits>
#include <stdexcept>
#include <thread>

namespace plumb::exact::detail {
namespace {

// Refactorize once the eta file holds more limbs than the LU (plus one per row): exact eta
// vectors are dense and their fractions long, so applying them soon costs more than a fresh
// factorization (measured on Netlib: a fixed 64 updates was 3-4 times slower).
constexpr std::size_t refactor_limbs_per_row = 1;
// Degenerate pivots in a row before Bland's rule takes over.
constexpr int degenerate_run_limit = 24;
// Pricing candidates whose estimated reduced cost is below this are left to the exact scan.
constexpr double pricing_tolerance = 1e-9;
// How many of the best-estimated candidates are tried exactly before a full exact scan.
constexpr int pricing_tries = 3;
// Largest scale of a correction problem, 2^40: the rest of the problem must stay within double
// range, and a violation smaller than 2^-40 gets a further round.
constexpr int max_correction_scale_bits = 40;

// a / (b c) in double, for integers too long for a double each.
double quotient(const Integer& a, const Integer& b, const Integer& c) {
  if (mpz_sgn(a.backend().data()) == 0) return 0;
  long ea, eb, ec;
  double ma = mpz_get_d_2exp(&ea, a.backend().data()), mb = mpz_get_d_2exp(&eb, b.backend().data()),
         mc = mpz_get_d_2exp(&ec, c.backend().data());
  long exponent = std::clamp(ea - eb - ec, -2000L, 2000L);
  return std::ldexp(ma / (mb * mc), static_cast<int>(exponent));
}

}  // namespace

RationalEngine::RationalEngine(const model::Model& model, run::Budget* budget,
                               const std::function<void(const Progress&)>* progress)
    : model_(model), budget_(budget), progress_(progress), n_(model.column_count()), m_(model.row_count()) {
  factor_.budget = budget;
  lower_.resize(static_cast<std::size_t>(total()));
  upper_.resize(static_cast<std::size_t>(total()));
  fixed_.assign(static_cast<std::size_t>(total()), 0);
  for (int j = 0; j < n_; ++j) {
    const auto& column = model.columns[j];
    lower_[j] = column.lower ? &*column.lower : nullptr;
    upper_[j] = column.upper ? &*column.upper : nullptr;
  }
  for (int i = 0; i < m_; ++i) {
    const auto& row = model.rows[i];
    lower_[n_ + i] = row.lower ? &*row.lower : nullptr;
    upper_[n_ + i] = row.upper ? &*row.upper : nullptr;
  }
  for (int k = 0; k < total(); ++k) {
    if (lower_[k] && upper_[k]) {
      if (*lower_[k] > *upper_[k]) {
        std::string what = k < n_ ? "column " + model.columns[k].name : "row " + model.rows[k - n_].name;
        throw std::invalid_argument(what + " has its lower bound above its upper bound");
      }
      fixed_[k] = *lower_[k] == *upper_[k];
    }
  }
  bool maximise = model.objective.sense == model::Sense::maximise;
  cost_.resize(static_cast<std::size_t>(total()));
  cost_estimate_.assign(static_cast<std::size_t>(total()), 0.0);
  for (int j = 0; j < n_; ++j) {
    cost_[j] = maximise ? Rational(-model.objective.coefficients[j]) : model.objective.coefficients[j];
    cost_estimate_[j] = numeric::to_double(cost_[j]);
  }
  matrix_estimate_.reserve(model.matrix.nonzeros());
  for (int j = 0; j < n_; ++j)
    for (const Rational& a : model.matrix.column_values(j)) matrix_estimate_.push_back(numeric::to_double(a));
  value_.assign(static_cast<std::size_t>(total()), Rational(0));
  status_.assign(static_cast<std::size_t>(total()), VarStatus::at_zero);
  position_.assign(static_cast<std::size_t>(total()), -1);
  rows_.resize(m_);
  positions_.resize(m_);
  duals_.resize(m_);
  dual_estimate_.assign(static_cast<std::size_t>(m_), 0.0);
  cost_estimate_of_basis_.assign(static_cast<std::size_t>(m_), 0.0);
}

void RationalEngine::scatter_column(int k, RationalSparseVector& target) const {
  if (k >= n_) {
    target.at(k - n_) = -1;
    return;
  }
  auto rows = model_.matrix.column_rows(k);
  auto values = model_.matrix.column_values(k);
  for (std::size_t e = 0; e < rows.size(); ++e) target.at(rows[e]) = values[e];
}

// Puts a nonbasic variable at the bound asked for when it exists, else at the other, else zero.
void RationalEngine::rest_nonbasic(int k, VarStatus wanted) {
  position_[k] = -1;
  if (wanted == VarStatus::at_upper && !upper_[k]) wanted = VarStatus::at_lower;
  if ((wanted == VarStatus::at_lower || wanted == VarStatus::at_zero || wanted == VarStatus::basic) && !lower_[k])
    wanted = upper_[k] ? VarStatus::at_upper : VarStatus::at_zero;
  else if (wanted == VarStatus::at_zero || wanted == VarStatus::basic)
    wanted = VarStatus::at_lower;
  status_[k] = wanted;
  if (wanted == VarStatus::at_lower) value_[k] = *lower_[k];
  else if (wanted == VarStatus::at_upper) value_[k] = *upper_[k];
  else value_[k] = 0;
}

// Column k of [A | -I]: a model column, or the logical of row k - n.
SparseColumn RationalEngine::constraint_column(int k) const {
  SparseColumn column;
  if (k >= n_) {
    column.rows = {k - n_};
    column.values = {Rational(-1)};
    return column;
  }
  auto rows = model_.matrix.column_rows(k);
  auto values = model_.matrix.column_values(k);
  column.rows.assign(rows.begin(), rows.end());
  column.values.assign(values.begin(), values.end());
  return column;
}

void RationalEngine::refactor() {
  std::vector<SparseColumn> columns(static_cast<std::size_t>(m_));
  for (int p = 0; p < m_; ++p) columns[p] = constraint_column(head_[p]);
  factor_.factorize(m_, columns);
  if (!factor_.nonsingular()) throw std::logic_error("exact simplex: basis became singular");
}

// Factorizes the given basic variables; dependent ones leave, logicals of uncovered rows enter.
bool RationalEngine::install_basis(std::vector<int> basic_variables) {
  // Storage for pivots, which a basis certified by refinement never needs.
  if (alpha_.size() != m_) alpha_.resize(m_);
  if (pivot_row_.size() != total()) pivot_row_.resize(total());
  bool repaired = static_cast<int>(basic_variables.size()) != m_;
  for (int attempt = 0;; ++attempt) {
    std::vector<SparseColumn> columns(basic_variables.size());
    for (std::size_t p = 0; p < basic_variables.size(); ++p) columns[p] = constraint_column(basic_variables[p]);
    factor_.factorize(m_, columns);
    if (factor_.nonsingular() && static_cast<int>(basic_variables.size()) == m_) break;
    if (attempt > 2) throw std::logic_error("exact simplex: basis repair did not converge");
    repaired = true;
    std::vector<char> drop(basic_variables.size(), 0);
    for (int p : factor_.dependent_columns()) drop[p] = 1;
    std::vector<int> kept;
    for (std::size_t p = 0; p < basic_variables.size(); ++p) {
      if (drop[p]) rest_nonbasic(basic_variables[p], VarStatus::at_lower);
      else kept.push_back(basic_variables[p]);
    }
    for (int r : factor_.uncovered_rows()) kept.push_back(n_ + r);
    std::sort(kept.begin(), kept.end());
    basic_variables = std::move(kept);
  }
  head_ = std::move(basic_variables);
  for (int p = 0; p < m_; ++p) {
    position_[head_[p]] = p;
    status_[head_[p]] = VarStatus::basic;
  }
  compute_basic_values();
  return repaired;
}

void RationalEngine::start_from_logicals() {
  std::fill(position_.begin(), position_.end(), -1);
  for (int j = 0; j < n_; ++j) rest_nonbasic(j, VarStatus::at_lower);
  std::vector<int> logicals(static_cast<std::size_t>(m_));
  for (int i = 0; i < m_; ++i) logicals[i] = n_ + i;
  install_basis(std::move(logicals));
}

bool RationalEngine::fits(const simplex::Basis& basis) const {
  return basis.columns.size() == static_cast<std::size_t>(n_) && basis.rows.size() == static_cast<std::size_t>(m_);
}

std::vector<int> RationalEngine::rest_as_in(const simplex::Basis& basis) {
  std::fill(position_.begin(), position_.end(), -1);
  std::vector<int> basic_variables;
  for (int k = 0; k < total(); ++k) {
    VarStatus wanted = k < n_ ? basis.columns[k] : basis.rows[k - n_];
    if (wanted == VarStatus::basic) basic_variables.push_back(k);
    else rest_nonbasic(k, wanted);
  }
  return basic_variables;
}

bool RationalEngine::start_from(const simplex::Basis& basis) {
  settled_.reset();
  if (!fits(basis)) {
    start_from_logicals();
    repaired_ = true;
    return true;
  }
  repaired_ = install_basis(rest_as_in(basis));
  return repaired_;
}

RefineLimits RationalEngine::refine_limits() const {
  RefineLimits limits;
  limits.budget = budget_;
  return limits;
}

// Rests the variables as `basis` says and factorizes its basic columns in float for refinement;
// false when the basis does not fit or its float LU finds it singular.
bool RationalEngine::rest_for_refinement(const simplex::Basis& basis, RefinedSolver& solver) {
  settled_.reset();
  if (!fits(basis)) return false;
  head_ = rest_as_in(basis);
  if (static_cast<int>(head_.size()) != m_) return false;
  for (int p = 0; p < m_; ++p) {
    position_[head_[p]] = p;
    status_[head_[p]] = VarStatus::basic;
  }
  return solver.factorize(m_, basic_columns());
}

std::vector<SparseColumn> RationalEngine::basic_columns() const {
  std::vector<SparseColumn> columns(static_cast<std::size_t>(m_));
  for (int p = 0; p < m_; ++p) columns[p] = constraint_column(head_[p]);
  return columns;
}

// When x_B takes longer than this, y is solved on a second core beside it (TransposedSolveBeside);
// not on the smallest models, whose sessions' re-solves take a millisecond or so in all.
constexpr std::chrono::milliseconds second_core_delay{20};
constexpr int rows_for_second_core = 300;

bool RationalEngine::certify_by_refinement(const simplex::Basis& basis,
                                           simplex::CorrectionProblem* correction) {
  RefinedSolver solver(refine_limits());
  if (!rest_for_refinement(basis, solver)) return false;

  nonbasic_activity(rows_);
  std::vector<Rational> rhs(static_cast<std::size_t>(m_), Rational(0));
  for (int i : rows_.pattern()) rhs[i] = rows_[i];
  rows_.clear();
  correction_was_approximate_ = correction && clearly_not_optimal(solver, rhs, *correction);
  if (correction_was_approximate_) return false;
  // head_ and the costs stay as they are until the solve beside is taken or cancelled.
  std::optional<TransposedSolveBeside> beside;
  if (m_ >= rows_for_second_core && std::thread::hardware_concurrency() >= 2)
    beside.emplace(
        refine_limits(), m_,
        [this] {
          return TransposedSolveBeside::System{basic_columns(), basic_costs()};
        },
        second_core_delay);
  auto x_basic = solver.solve(rhs);
  if (!x_basic) return false;
  for (int p = 0; p < m_; ++p) value_[head_[p]].backend().swap((*x_basic)[p].backend());
  bool optimal = !infeasible_basis();
  if (!optimal && !correction) return false;

  if (beside && beside->cancel_if_waiting()) beside.reset();
  auto y = beside ? beside->take(budget_) : solver.solve_transposed(basic_costs());
  if (!y) return false;
  const RefinedSolver& dual_solver = beside ? beside->solver() : solver;
  // Signs of the reduced costs d_j = c'_j - a_j^T y for y = P / Q (y's fractions are long:
  // thousands of bits on some Netlib bases).  A double estimate decides a sign when it exceeds a
  // bound on its own rounding error, a floating-point filter in the manner of S. Fortune and
  // C. J. Van Wyk ("Efficient exact arithmetic for computational geometry", SoCG 1993); the few
  // others, zero or nearly so, are computed exactly.  The independent checker proves the result.
  const std::vector<Integer>& numerators = dual_solver.common_numerators();
  const Integer& denominator = dual_solver.common_denominator();
  // A column meeting no nonzero y_i has d_j = c'_j exactly.  Under a feasibility goal (y = 0) that
  // is every column, and the filter cannot decide them (an estimate 0 is never above its bound):
  // explain's sub-solves had computed every reduced cost exactly.
  enum : char { unusable, usable_estimate, zero_dual };
  std::vector<double> dual_estimate(static_cast<std::size_t>(m_));
  std::vector<char> dual_kind(static_cast<std::size_t>(m_));
  for (int i = 0; i < m_; ++i) {
    dual_estimate[i] = quotient(numerators[i], Integer(1), denominator);
    dual_kind[i] = mpz_sgn(numerators[i].backend().data()) == 0 ? zero_dual
                   : std::isnormal(dual_estimate[i])            ? usable_estimate
                                                                : unusable;
  }
  std::vector<double> reduced_costs;  // of the nonbasic variables, for the correction problem
  if (correction) reduced_costs.assign(static_cast<std::size_t>(total()), 0.0);
  Integer sum;
  for_each_priced_column([&](int j, std::span<const int> rows, std::size_t entry) {
    if (!optimal && !correction) return;
    char least = zero_dual;
    for (int r : rows) least = std::min(least, dual_kind[r]);
    const ReducedCostEstimate estimate = estimate_reduced_cost(j, rows, entry, dual_estimate);
    double d = estimate.value;
    int sign;
    if (least == zero_dual) {
      sign = cost_[j].sign();  // d is c'_j's double already
    } else if (least == usable_estimate && std::abs(d) > estimate.rounding) {
      sign = d > 0 ? 1 : -1;
    } else {
      exact_reduced_cost(j, cost_[j], numerators, denominator, sum);
      sign = mpz_sgn(sum.backend().data());
      d = quotient(sum, scale_, denominator);
    }
    if (eligible_sign(j, sign)) optimal = false;
    if (correction) reduced_costs[j] = d;
  });
  for (int i = 0; i < m_; ++i) {  // d = y_i for the logical r_i, whose column is -e_i
    if (basic(n_ + i) || fixed_[n_ + i]) continue;
    if (eligible_sign(n_ + i, mpz_sgn(numerators[i].backend().data()))) optimal = false;
    if (correction) reduced_costs[n_ + i] = quotient(numerators[i], Integer(1), denominator);
  }
  if (!optimal) {
    if (correction) *correction = correction_problem(reduced_costs);
    return false;
  }
  duals_.clear();
  for (int i = 0; i < m_; ++i)
    if (!is_zero((*y)[i])) duals_.swap_in(i, (*y)[i]);
  settled_ = Step::done;
  phase_ = "exact certification";
  return true;
}

// Before the exact solutions, whose reconstruction is most of a certification on long fractions:
// y to about 2^-96 by a few refinement steps and the reduced costs from it by the filter above,
// its error bound widened by y's.  A reduced cost of the wrong sign clear of every error means
// the basis is not optimal: basic values likewise approximated (those within their error of a
// bound set to it), the correction problem is built from these and no exact solution is paid for.
// pilot87's float basis had reduced costs wrong by 5e-6, found only after exact x_B and y (1.5 s
// of its 3.3 s certification); pilot and d2q06c alike.
bool RationalEngine::clearly_not_optimal(RefinedSolver& solver, const std::vector<Rational>& rhs,
                                         simplex::CorrectionProblem& correction) {
  constexpr long accuracy_bits = 96;
  constexpr double safety = 0x1p16;  // the approximations' errors are estimates, not bounds
  auto y = solver.approximate_transposed(basic_costs(), accuracy_bits);
  if (!y) return false;
  std::vector<double> reduced_costs(static_cast<std::size_t>(total()), 0.0);
  bool wrong = false;
  // `rounding` bounds the double arithmetic's error (as above), `spread` * y->error y's.
  auto decide = [&](int k, double d, double rounding, double spread) {
    if (!(std::abs(d) > rounding + safety * spread * y->error)) return;
    reduced_costs[k] = d;
    wrong = wrong || eligible_sign(k, d > 0 ? 1 : -1);
  };
  for_each_priced_column([&](int j, std::span<const int> rows, std::size_t entry) {
    const ReducedCostEstimate estimate = estimate_reduced_cost(j, rows, entry, y->values);
    decide(j, estimate.value, estimate.rounding, estimate.spread);
  });
  for (int i = 0; i < m_; ++i)  // d = y_i for the logical r_i
    if (!basic(n_ + i) && !fixed_[n_ + i]) decide(n_ + i, y->values[i], 0x1p-50 * std::abs(y->values[i]), 1);
  if (!wrong) return false;
  auto x = solver.approximate(rhs, accuracy_bits);
  if (!x) return false;
  for (int p = 0; p < m_; ++p) {
    const int k = head_[p];
    const double v = x->values[p], margin = safety * (x->error + 0x1p-50 * std::abs(v));
    if (!std::isfinite(v)) return false;  // beyond double range: leave it to the exact solution
    if (lower_[k] && std::abs(v - numeric::to_double(*lower_[k])) <= margin)
      value_[k] = *lower_[k];
    else if (upper_[k] && std::abs(v - numeric::to_double(*upper_[k])) <= margin)
      value_[k] = *upper_[k];
    else
      value_[k] = v;
  }
  correction = correction_problem(reduced_costs);
  return true;
}

std::vector<Rational> RationalEngine::basic_costs() const {
  std::vector<Rational> costs(static_cast<std::size_t>(m_));
  for (int p = 0; p < m_; ++p) costs[p] = cost_[head_[p]];
  return costs;
}

RationalEngine::ReducedCostEstimate RationalEngine::estimate_reduced_cost(
    int j, std::span<const int> rows, std::size_t entry, const std::vector<double>& dual_estimate) const {
  double d = cost_estimate_[j], size = std::abs(d), spread = 0;
  for (int r : rows) {
    const double a = matrix_estimate_[entry++], term = a * dual_estimate[r];
    d -= term;
    size += std::abs(term);
    spread += std::abs(a);
  }
  // Each input is within 2^-52 (relative) of its exact value, dual estimates within 2^-50, and
  // each of the k operations adds 2^-53: (k + 32) 2^-50 of the sum of magnitudes is ample; the
  // last term covers products that underflow.
  const double k = static_cast<double>(rows.size());
  const double rounding = std::isfinite(size) ? (k + 32) * 0x1p-50 * size + (k + 1) * 0x1p-1020
                                              : std::numeric_limits<double>::infinity();
  return {d, rounding, spread};
}

// The correction problem at the current basis (its basic values exact, or approximated as in
// clearly_not_optimal): variables measure the step from the current point, scaled by 2^p so
// that the largest bound violation of a basic variable is about one, and costs are the reduced
// costs scaled by 2^d so that the largest wrong sign is about one (Gleixner, Steffy & Wolter
// 2016).  The scales are capped so that the rest of the problem stays within double range.
simplex::CorrectionProblem RationalEngine::correction_problem(
    const std::vector<double>& reduced_costs) const {
  double primal_violation = 0, dual_violation = 0;
  for (int k : head_) {
    if (below(k)) primal_violation = std::max(primal_violation, numeric::to_double(Rational(*lower_[k] - value_[k])));
    if (above(k)) primal_violation = std::max(primal_violation, numeric::to_double(Rational(value_[k] - *upper_[k])));
  }
  for (int k = 0; k < total(); ++k)
    if (eligible_sign(k, reduced_costs[k] > 0 ? 1 : reduced_costs[k] < 0 ? -1 : 0))
      dual_violation = std::max(dual_violation, std::abs(reduced_costs[k]));
  auto scale_for = [](double violation) {
    if (violation <= 0 || !std::isfinite(violation)) return 1.0;
    return std::ldexp(1.0, std::clamp(-std::ilogb(violation), 0, max_correction_scale_bits));
  };
  const double primal_scale = scale_for(primal_violation), dual_scale = scale_for(dual_violation);
  const double infinity = std::numeric_limits<double>::infinity();
  simplex::CorrectionProblem problem;
  problem.lower.resize(static_cast<std::size_t>(total()));
  problem.upper.resize(static_cast<std::size_t>(total()));
  problem.cost.resize(static_cast<std::size_t>(total()));
  for (int k = 0; k < total(); ++k) {
    problem.lower[k] = lower_[k] ? primal_scale * numeric::to_double(Rational(*lower_[k] - value_[k])) : -infinity;
    problem.upper[k] = upper_[k] ? primal_scale * numeric::to_double(Rational(*upper_[k] - value_[k])) : infinity;
    problem.cost[k] = dual_scale * reduced_costs[k];
  }
  return problem;
}

// target = -N x_N, the right-hand side of B x_B = -N x_N for the system A x - r = 0.
void RationalEngine::nonbasic_activity(RationalSparseVector& target) {
  target.clear();
  for (int k = 0; k < total(); ++k) {
    if (basic(k) || is_zero(value_[k])) continue;
    if (k >= n_) {
      target.at(k - n_) += value_[k];
      continue;
    }
    auto rows = model_.matrix.column_rows(k);
    auto values = model_.matrix.column_values(k);
    for (std::size_t e = 0; e < rows.size(); ++e) subtract_product(target.at(rows[e]), values[e], value_[k], scratch_);
  }
}

void RationalEngine::compute_basic_values() {
  nonbasic_activity(rows_);
  factor_.ftran(rows_, positions_);
  for (int p = 0; p < m_; ++p) value_[head_[p]] = positions_[p];
  positions_.clear();
}

bool RationalEngine::infeasible_basis() const {
  for (int k : head_)
    if (below(k) || above(k)) return true;
  return false;
}

// y solves B^T y = c_B, with the phase-1 costs (-1 below a bound, +1 above) or c'.
void RationalEngine::compute_duals(bool phase_one) {
  positions_.clear();
  for (int p = 0; p < m_; ++p) {
    int k = head_[p];
    if (phase_one) {
      if (below(k)) positions_.at(p) = -1;
      else if (above(k)) positions_.at(p) = 1;
    } else if (!is_zero(cost_[k])) {
      positions_.at(p) = cost_[k];
    }
  }
  factor_.btran(positions_, duals_);
}

// d_k = c_k - M_k^T y (phase-1 costs of nonbasic variables are zero).
void RationalEngine::reduced_cost(int k, bool phase_one, Rational& out) {
  if (k >= n_) {
    out = duals_[k - n_];
    return;
  }
  if (phase_one) out = 0;
  else out = cost_[k];
  auto rows = model_.matrix.column_rows(k);
  auto values = model_.matrix.column_values(k);
  for (std::size_t e = 0; e < rows.size(); ++e) {
    const Rational& y = duals_[rows[e]];
    if (!is_zero(y)) subtract_product(out, values[e], y, scratch_);
  }
}

bool RationalEngine::eligible(int k, const Rational& d) const { return eligible_sign(k, sign_of(d)); }

bool RationalEngine::eligible_sign(int k, int sign) const {
  if (fixed_[k]) return false;
  switch (status_[k]) {
    case VarStatus::at_lower: return sign < 0;
    case VarStatus::at_upper: return sign > 0;
    case VarStatus::at_zero: return sign != 0;
    case VarStatus::basic: return false;
  }
  return false;
}

// Calls visit(j, rows, entry) for every column j that may enter (nonbasic, not fixed), with its
// row indices and the position of its first entry in column order (in matrix_estimate_).
template <class Visit>
void RationalEngine::for_each_priced_column(Visit&& visit) const {
  std::size_t entry = 0;
  for (int j = 0; j < n_; ++j) {
    auto rows = model_.matrix.column_rows(j);
    if (!basic(j) && !fixed_[j]) visit(j, rows, entry);
    entry += rows.size();
  }
}

// sum = D_j (cost Q - sum_i a_ij P_i) for y = P / Q (D_j Q d_j when cost is c'_j), with scale_ = D_j
// the least common denominator of column j and the cost: integer products without a gcd each.
void RationalEngine::exact_reduced_cost(int j, const Rational& cost, const std::vector<Integer>& numerators,
                                        const Integer& denominator, Integer& sum) {
  auto rows = model_.matrix.column_rows(j);
  auto values = model_.matrix.column_values(j);
  mpz_ptr scale = scale_.backend().data();
  mpz_ptr term = term_.backend().data();
  mpz_set(scale, mpq_denref(cost.backend().data()));
  for (const Rational& a : values) mpz_lcm(scale, scale, mpq_denref(a.backend().data()));
  auto times_scale = [scale, term](const Rational& q) {
    mpz_divexact(term, scale, mpq_denref(q.backend().data()));
    mpz_mul(term, term, mpq_numref(q.backend().data()));
  };
  times_scale(cost);
  mpz_mul(sum.backend().data(), term, denominator.backend().data());
  for (std::size_t e = 0; e < rows.size(); ++e) {
    times_scale(values[e]);
    mpz_submul(sum.backend().data(), term, numerators[rows[e]].backend().data());
  }
}

bool RationalEngine::poll(const char* phase) {
  phase_ = phase;
  if (budget_ && budget_->exhausted()) return false;
  if (progress_ && *progress_ && iterations_ % 50 == 0) {
    Progress progress;
    progress.phase = phase;
    progress.iterations = iterations_;
    for (int j = 0; j < n_; ++j)
      if (cost_estimate_[j] != 0) progress.objective += cost_estimate_[j] * numeric::to_double(value_[j]);
    if (model_.objective.sense == model::Sense::maximise) progress.objective = -progress.objective;
    progress.objective += numeric::to_double(model_.objective.constant);
    for (int k : head_) {
      if (below(k)) progress.infeasibility += numeric::to_double(*lower_[k] - value_[k]);
      else if (above(k)) progress.infeasibility += numeric::to_double(value_[k] - *upper_[k]);
    }
    if (budget_) progress.elapsed_seconds = budget_->elapsed_seconds();
    (*progress_)(progress);
  }
  if (factor_.updates() > 0 &&
      factor_.eta_limbs() > factor_.factor_limbs() + refactor_limbs_per_row * static_cast<std::size_t>(m_))
    refactor();
  return true;
}

// The basic variable at leaving_position leaves at the given bound; `entering` takes its place.
// alpha_ must hold B^{-1} times the entering column.
void RationalEngine::exchange(int entering, int leaving_position, VarStatus leaving_status) {
  int leaving = head_[leaving_position];
  status_[leaving] = leaving_status;
  position_[leaving] = -1;
  value_[leaving] = leaving_status == VarStatus::at_lower ? *lower_[leaving] : *upper_[leaving];
  head_[leaving_position] = entering;
  position_[entering] = leaving_position;
  status_[entering] = VarStatus::basic;
  factor_.update(leaving_position, alpha_);
}

// Counts a pivot.  After degenerate_run_limit degenerate pivots in a row the choices follow
// Bland's rule until one makes progress.
void RationalEngine::count_pivot(bool degenerate) {
  ++iterations_;
  if (!degenerate) {
    degenerate_run_ = 0;
    bland_ = false;
  } else if (++degenerate_run_ > degenerate_run_limit) {
    bland_ = true;
  }
}

// Pricing by Dantzig's rule on double estimates of the duals; each candidate's reduced cost is
// then computed exactly from its column, d_q = c_q - c_B^T (B^{-1} a_q).  The first of the
// best estimates whose exact reduced cost is eligible enters (its column in alpha_, its reduced
// cost in d_); -1 when none of them is.
int RationalEngine::price_by_estimates(bool phase_one, std::vector<std::pair<double, int>>& candidates) {
  for (int p = 0; p < m_; ++p) {
    int k = head_[p];
    cost_estimate_of_basis_[p] = phase_one ? (below(k) ? -1.0 : above(k) ? 1.0 : 0.0) : cost_estimate_[k];
  }
  factor_.estimate_btran(cost_estimate_of_basis_, dual_estimate_);
  candidates.clear();
  for_each_priced_column([&](int j, std::span<const int> rows, std::size_t entry) {
    double d = phase_one ? 0.0 : cost_estimate_[j];
    for (int r : rows) d -= matrix_estimate_[entry++] * dual_estimate_[r];
    if (improving_estimate(j, d)) candidates.emplace_back(-std::abs(d), j);
  });
  for (int i = 0; i < m_; ++i)
    if (!basic(n_ + i) && !fixed_[n_ + i] && improving_estimate(n_ + i, dual_estimate_[i]))
      candidates.emplace_back(-std::abs(dual_estimate_[i]), n_ + i);
  std::size_t tries = std::min<std::size_t>(candidates.size(), pricing_tries);
  std::partial_sort(candidates.begin(), candidates.begin() + static_cast<long>(tries), candidates.end());
  for (std::size_t c = 0; c < tries; ++c) {
    int k = candidates[c].second;
    entering_column(k);
    reduced_cost_from_column(k, phase_one, d_);
    if (eligible(k, d_)) return k;
  }
  return -1;
}

// Exact pricing over every nonbasic variable: the lowest eligible index under Bland's rule, else
// the largest |d|; its reduced cost in d_.  -1 when none is eligible (the duals are then in duals_).
int RationalEngine::price_exactly(bool phase_one) {
  compute_duals(phase_one);
  int entering = -1;
  double best = -1;
  for (int k = 0; k < total(); ++k) {
    if (basic(k) || fixed_[k]) continue;
    reduced_cost(k, phase_one, ratio_);
    if (!eligible(k, ratio_)) continue;
    if (bland_) {
      d_ = ratio_;
      return k;
    }
    double size = std::abs(numeric::to_double(ratio_));
    if (size > best) best = size, entering = k, d_ = ratio_;
  }
  return entering;
}

// Ratio test, exact, for `entering` moving in `direction`: the basic variable at position p moves
// by -direction * alpha_p per unit.  A feasible one blocks at the bound it moves towards; an
// infeasible one blocks where it becomes feasible (the first breakpoint of the phase-1 objective)
// and never while moving away.  The step length is left in best_ratio_ (unsigned).
RationalEngine::PrimalBlock RationalEngine::primal_ratio_test(int entering, int direction) {
  PrimalBlock block;
  double leaving_size = 0;
  int leaving_index = 0;
  if (lower_[entering] && upper_[entering]) {
    best_ratio_ = *upper_[entering] - *lower_[entering];
    block.bounded = block.flip = true;
    leaving_index = entering;
  }
  for (int p : alpha_.pattern()) {
    const Rational& a = alpha_[p];
    int s = sign_of(a);
    if (s == 0) continue;
    int k = head_[p];
    bool increasing = (s < 0) == (direction > 0);
    const Rational* bound = nullptr;
    VarStatus side;
    if (increasing) {
      if (below(k))
        bound = lower_[k], side = VarStatus::at_lower;
      else if (!above(k) && upper_[k])
        bound = upper_[k], side = VarStatus::at_upper;
      if (!bound) continue;
      ratio_ = *bound - value_[k];
    } else {
      if (above(k))
        bound = upper_[k], side = VarStatus::at_upper;
      else if (!below(k) && lower_[k])
        bound = lower_[k], side = VarStatus::at_lower;
      if (!bound) continue;
      ratio_ = value_[k] - *bound;
    }
    mpq_div(ratio_.backend().data(), ratio_.backend().data(), a.backend().data());
    if (s < 0) ratio_ = -ratio_;
    int compare = block.bounded ? ratio_.compare(best_ratio_) : -1;
    bool take = compare < 0;
    if (compare == 0) {
      if (bland_)
        take = k < leaving_index;
      else
        take = !block.flip && std::abs(numeric::to_double(a)) > leaving_size;
    }
    if (take) {
      best_ratio_.backend().swap(ratio_.backend());
      block.bounded = true;
      block.flip = false;
      block.position = p;
      block.status = side;
      leaving_size = std::abs(numeric::to_double(a));
      leaving_index = k;
    }
  }
  return block;
}

RationalEngine::Step RationalEngine::primal() {
  std::vector<std::pair<double, int>> candidates;
  for (;;) {
    bool phase_one = infeasible_basis();
    if (!poll(phase_one ? "exact primal phase 1" : "exact primal")) return Step::stopped;
    int entering = bland_ ? -1 : price_by_estimates(phase_one, candidates);
    if (entering < 0) {
      entering = price_exactly(phase_one);
      if (entering < 0) {
        if (phase_one) {
          farkas_.assign(static_cast<std::size_t>(m_), Rational(0));
          for (int i : duals_.pattern()) farkas_[i] = duals_[i];
          return Step::infeasible;
        }
        return Step::done;
      }
      entering_column(entering);
    }
    const int direction = status_[entering] == VarStatus::at_lower   ? 1
                          : status_[entering] == VarStatus::at_upper ? -1
                          : sign_of(d_) < 0                          ? 1
                                                                     : -1;
    PrimalBlock block = primal_ratio_test(entering, direction);
    if (!block.bounded) {
      if (phase_one) throw std::logic_error("exact simplex: phase 1 ray without a blocking variable");
      set_ray(entering, direction);
      return Step::unbounded;
    }
    count_pivot(is_zero(best_ratio_));
    if (!is_zero(best_ratio_)) {
      if (direction < 0) best_ratio_ = -best_ratio_;  // signed step of the entering variable
      value_[entering] += best_ratio_;
      for (int p : alpha_.pattern())
        if (!is_zero(alpha_[p])) subtract_product(value_[head_[p]], alpha_[p], best_ratio_, scratch_);
    }
    if (block.flip) {
      status_[entering] = direction > 0 ? VarStatus::at_upper : VarStatus::at_lower;
      value_[entering] = direction > 0 ? *upper_[entering] : *lower_[entering];
    } else {
      exchange(entering, block.position, block.status);
    }
  }
}

bool RationalEngine::improving_estimate(int k, double d) const {
  switch (status_[k]) {
    case VarStatus::at_lower: return d < -pricing_tolerance;
    case VarStatus::at_upper: return d > pricing_tolerance;
    default: return std::abs(d) > pricing_tolerance;
  }
}

void RationalEngine::entering_column(int k) {
  rows_.clear();
  scatter_column(k, rows_);
  factor_.ftran(rows_, alpha_);
}

void RationalEngine::reduced_cost_from_column(int k, bool phase_one, Rational& out) {
  if (phase_one) out = 0;
  else out = cost_[k];
  for (int p : alpha_.pattern()) {
    const Rational& a = alpha_[p];
    if (is_zero(a)) continue;
    int basic_variable = head_[p];
    if (!phase_one) {
      if (!is_zero(cost_[basic_variable])) subtract_product(out, cost_[basic_variable], a, scratch_);
    } else if (below(basic_variable)) {
      out += a;
    } else if (above(basic_variable)) {
      out -= a;
    }
  }
}

// Flips boxed nonbasic variables whose reduced cost has the wrong sign; false when some other
// nonbasic variable keeps a wrong sign (then the basis is not dual feasible).
bool RationalEngine::make_dual_feasible() {
  compute_duals(false);
  std::vector<int> flips;
  for (int k = 0; k < total(); ++k) {
    if (basic(k) || fixed_[k]) continue;
    reduced_cost(k, false, d_);
    if (!eligible(k, d_)) continue;
    if (!lower_[k] || !upper_[k]) return false;
    flips.push_back(k);
  }
  for (int k : flips) rest_nonbasic(k, status_[k] == VarStatus::at_lower ? VarStatus::at_upper : VarStatus::at_lower);
  if (!flips.empty()) compute_basic_values();
  return true;
}

// duals_ = rho, row `position` of B^{-1}; pivot_row_ = rho^T M_k for the variables that may
// enter (nonbasic, not fixed), zeros dropped.
void RationalEngine::compute_pivot_row(int position) {
  positions_.clear();
  positions_.at(position) = 1;
  const RationalSparseVector& rho = duals_;
  factor_.btran(positions_, duals_);
  pivot_row_.clear();
  for (int i : rho.pattern()) {
    const Rational& r = rho[i];
    if (is_zero(r)) continue;
    if (!basic(n_ + i) && !fixed_[n_ + i]) pivot_row_.at(n_ + i) = -r;
    auto columns = model_.matrix.row_columns(i);
    auto where = model_.matrix.row_positions(i);
    for (std::size_t e = 0; e < columns.size(); ++e) {
      int j = columns[e];
      if (basic(j) || fixed_[j]) continue;
      add_product(pivot_row_.at(j), r, model_.matrix.value(where[e]), scratch_);
    }
  }
  pivot_row_.tidy();
}

// Whether nonbasic k, moving off its bound, would move the basic variable of the pivot row
// towards the bound it violates (below it when to_lower).
bool RationalEngine::dual_candidate(int k, bool to_lower) const {
  int s = sign_of(pivot_row_[k]);
  return status_[k] == VarStatus::at_zero ||
         (status_[k] == VarStatus::at_lower ? (s < 0) == to_lower : (s > 0) == to_lower);
}

bool RationalEngine::certify_infeasible_row(int variable) {
  if (variable < 0 || variable >= total() || !basic(variable) || (!below(variable) && !above(variable))) return false;
  const bool to_lower = below(variable);
  compute_pivot_row(position_[variable]);
  for (int k : pivot_row_.pattern())
    if (dual_candidate(k, to_lower)) return false;
  farkas_.assign(static_cast<std::size_t>(m_), Rational(0));
  for (int i : duals_.pattern()) farkas_[i] = to_lower ? Rational(-duals_[i]) : duals_[i];
  settled_ = Step::infeasible;
  phase_ = "exact certification";
  return true;
}

bool RationalEngine::certify_infeasible_row_by_refinement(const simplex::Basis& basis, int variable) {
  RefinedSolver solver(refine_limits());
  if (variable < 0 || variable >= total() || !rest_for_refinement(basis, solver) || !basic(variable))
    return false;
  std::vector<Rational> unit(static_cast<std::size_t>(m_), Rational(0));
  unit[position_[variable]] = 1;
  auto rho = solver.solve_transposed(unit);
  if (!rho) return false;
  for (int sign : {1, -1}) {
    if (!farkas_holds(solver.common_numerators(), sign)) continue;
    farkas_ = std::move(*rho);
    if (sign < 0)
      for (Rational& v : farkas_) v = -v;
    settled_ = Step::infeasible;
    phase_ = "exact certification";
    return true;
  }
  return false;
}

// Whether y = sign * N (N the numerators of y over a positive denominator, which changes no sign
// or comparison) proves infeasibility as the checker asks (docs/certificates.md): a positive y_i
// only on a lower side and a negative one only on an upper side, a_j = (A^T y)_j positive only on
// a column with an upper bound and negative only on one with a lower bound, and the sides' force
// sum_i y_i side_i above the bounds' allowance sum_j a_j bound_j.
bool RationalEngine::farkas_holds(const std::vector<Integer>& numerators, int sign) {
  Rational force = 0, allowance = 0;
  for (int i = 0; i < m_; ++i) {
    int s = sign * mpz_sgn(numerators[i].backend().data());
    if (s == 0) continue;
    const Rational* side = s > 0 ? lower_[n_ + i] : upper_[n_ + i];
    if (!side) return false;
    force += Rational(numerators[i]) * *side;
  }
  const Integer one(1);
  const Rational no_cost(0);
  Integer sum;
  for (int j = 0; j < n_; ++j) {
    exact_reduced_cost(j, no_cost, numerators, one, sum);  // sum = -D_j N.a_j for the scale D_j > 0
    int s = -sign * mpz_sgn(sum.backend().data());
    if (s == 0) continue;
    const Rational* bound = s > 0 ? upper_[j] : lower_[j];
    if (!bound) return false;
    allowance -= Rational(sum, scale_) * *bound;
  }
  if (sign < 0) force = -force, allowance = -allowance;
  return force > allowance;
}

bool RationalEngine::certify_ray(int variable) {
  if (variable < 0 || variable >= total() || basic(variable) || fixed_[variable] || infeasible_basis()) return false;
  compute_duals(false);
  reduced_cost(variable, false, d_);
  if (!eligible(variable, d_)) return false;
  const int direction = status_[variable] == VarStatus::at_lower   ? 1
                        : status_[variable] == VarStatus::at_upper ? -1
                        : sign_of(d_) < 0                          ? 1
                                                                   : -1;
  if (direction > 0 ? upper_[variable] != nullptr : lower_[variable] != nullptr) return false;
  entering_column(variable);
  for (int p : alpha_.pattern()) {
    int s = sign_of(alpha_[p]);
    if (s == 0) continue;
    bool increasing = (s < 0) == (direction > 0);  // basic variables move by -direction * alpha_p
    if (increasing ? upper_[head_[p]] != nullptr : lower_[head_[p]] != nullptr) return false;
  }
  set_ray(variable, direction);
  settled_ = Step::unbounded;
  phase_ = "exact certification";
  return true;
}

// ray_ = the edge along which `entering` moves in `direction`: +-(e_q - B^{-1} a_q) on the columns.
void RationalEngine::set_ray(int entering, int direction) {
  ray_.assign(static_cast<std::size_t>(n_), Rational(0));
  if (entering < n_) ray_[entering] = direction;
  for (int p : alpha_.pattern())
    if (head_[p] < n_ && !is_zero(alpha_[p])) ray_[head_[p]] = direction > 0 ? Rational(-alpha_[p]) : alpha_[p];
}

RationalEngine::Step RationalEngine::dual() {
  for (;;) {
    if (!poll("exact dual")) return Step::stopped;
    // Leaving: the basic variable with the largest violation (Bland: the lowest index).
    int leaving_position = -1;
    double worst = 0;
    for (int p = 0; p < m_; ++p) {
      int k = head_[p];
      if (!below(k) && !above(k)) continue;
      if (bland_) {
        if (leaving_position < 0 || k < head_[leaving_position]) leaving_position = p;
        continue;
      }
      double violation = numeric::to_double(below(k) ? *lower_[k] - value_[k] : value_[k] - *upper_[k]);
      if (leaving_position < 0 || violation > worst) worst = violation, leaving_position = p;
    }
    if (leaving_position < 0) return Step::done;
    const int leaving = head_[leaving_position];
    const bool to_lower = below(leaving);

    compute_pivot_row(leaving_position);
    std::vector<Rational> row_of_inverse(static_cast<std::size_t>(m_), Rational(0));
    for (int i : duals_.pattern()) row_of_inverse[i] = duals_[i];

    // Dual ratio test, exact: the entering variable keeps every reduced cost's sign.
    compute_duals(false);
    int entering = -1;
    double entering_size = 0;
    for (int k : pivot_row_.pattern()) {
      const Rational& a = pivot_row_[k];
      if (!dual_candidate(k, to_lower)) continue;
      reduced_cost(k, false, ratio_);
      mpq_div(ratio_.backend().data(), ratio_.backend().data(), a.backend().data());
      if (sign_of(ratio_) < 0) ratio_ = -ratio_;
      int compare = entering < 0 ? -1 : ratio_.compare(best_ratio_);
      bool take = compare < 0;
      if (compare == 0 && !bland_) take = std::abs(numeric::to_double(a)) > entering_size;
      if (take) {
        best_ratio_.backend().swap(ratio_.backend());
        entering = k;
        entering_size = std::abs(numeric::to_double(a));
      }
    }
    if (entering < 0) {
      // No entering variable: rho (or -rho) is a Farkas vector.
      farkas_ = std::move(row_of_inverse);
      if (to_lower)
        for (Rational& v : farkas_) v = -v;
      return Step::infeasible;
    }
    count_pivot(is_zero(best_ratio_));
    entering_column(entering);
    // Primal step: theta moves the leaving variable exactly onto its violated bound.
    const Rational& bound = to_lower ? *lower_[leaving] : *upper_[leaving];
    Rational theta = value_[leaving] - bound;
    theta /= alpha_[leaving_position];
    value_[entering] += theta;
    for (int p : alpha_.pattern())
      if (!is_zero(alpha_[p])) subtract_product(value_[head_[p]], alpha_[p], theta, scratch_);
    exchange(entering, leaving_position, to_lower ? VarStatus::at_lower : VarStatus::at_upper);
  }
}

void RationalEngine::fill_result(EngineResult& result, Step step) {
  result.iterations = iterations_;
  result.repaired = repaired_;
  result.phase = phase_;
  // The values move out: run() is the engine's last use (long fractions are costly to copy).
  result.x.assign(std::make_move_iterator(value_.begin()), std::make_move_iterator(value_.begin() + n_));
  result.basis.columns.assign(status_.begin(), status_.begin() + n_);
  result.basis.rows.assign(status_.begin() + n_, status_.end());
  switch (step) {
    case Step::done:
      result.outcome = Outcome::optimal;
      result.y.assign(static_cast<std::size_t>(m_), Rational(0));
      for (int i : duals_.pattern()) duals_.swap_out(i, result.y[i]);
      break;
    case Step::infeasible:
      result.outcome = Outcome::infeasible;
      result.y = std::move(farkas_);
      break;
    case Step::unbounded:
      result.outcome = Outcome::unbounded;
      result.ray = std::move(ray_);
      break;
    case Step::stopped:
      result.outcome = Outcome::stopped;
      result.stop_reason = budget_ ? budget_->reason() : run::StopReason::interrupted;
      break;
  }
}

EngineResult RationalEngine::run() {
  EngineResult result;
  Step step = Step::done;
  if (settled_) {
    fill_result(result, *settled_);
    return result;
  }
  if (infeasible_basis() && make_dual_feasible()) step = dual();
  if (step == Step::done) step = primal();
  fill_result(result, step);
  return result;
}

}  // namespace plumb::exact::detail
