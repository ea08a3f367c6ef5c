#include "refine.hpp"

#include <algorithm>
#include <chrono>
#include <cmath>
#include <limits>

namespace plumb::exact::detail {
namespace {

__extension__ using UnsignedWide = unsigned __int128;  // a GCC extension, as RefinedSolver::Wide

mpz_ptr z(Integer& value) { return value.backend().data(); }
mpz_srcptr z(const Integer& value) { return value.backend().data(); }

// Bits of the largest |entry|; 0 when every entry is zero.
long max_bits(const std::vector<Integer>& values) {
  long bits = 0;
  for (const Integer& v : values)
    if (mpz_sgn(z(v)) != 0) bits = std::max(bits, static_cast<long>(mpz_sizeinbase(z(v), 2)));
  return bits;
}

bool all_zero(const std::vector<Integer>& values) {
  return std::all_of(values.begin(), values.end(), [](const Integer& v) { return mpz_sgn(z(v)) == 0; });
}

// The last continued-fraction convergent p/q of a/b (b > 0) with q <= bound.  a and b are consumed.
void best_convergent(Integer& a, Integer& b, const Integer& bound, Integer& p, Integer& q) {
  Integer p_before = 0, q_before = 1, quotient, remainder, next;
  p = 1, q = 0;
  while (mpz_sgn(z(b)) != 0) {
    mpz_fdiv_qr(z(quotient), z(remainder), z(a), z(b));
    mpz_mul(z(next), z(quotient), z(q));
    mpz_add(z(next), z(next), z(q_before));
    if (mpz_cmp(z(next), z(bound)) > 0) break;
    mpz_swap(z(q_before), z(q));
    mpz_swap(z(q), z(next));
    mpz_mul(z(next), z(quotient), z(p));
    mpz_add(z(next), z(next), z(p_before));
    mpz_swap(z(p_before), z(p));
    mpz_swap(z(p), z(next));
    mpz_swap(z(a), z(b));
    mpz_swap(z(b), z(remainder));
  }
}

}  // namespace

RefinedSolver::IntegerMatrix RefinedSolver::scaled(int m, const std::vector<SparseColumn>& columns, bool transposed) {
  IntegerMatrix matrix;
  matrix.scale.assign(static_cast<std::size_t>(m), Integer(1));
  // Row i of M is row i of B, or column i of B when transposed.
  for (int j = 0; j < m; ++j)
    for (std::size_t e = 0; e < columns[j].rows.size(); ++e) {
      mpz_srcptr denominator = mpq_denref(columns[j].values[e].backend().data());
      if (mpz_cmp_ui(denominator, 1) == 0) continue;  // most entries are integers: nothing to do
      Integer& d = matrix.scale[transposed ? j : columns[j].rows[e]];
      mpz_lcm(z(d), z(d), denominator);
    }
  std::vector<int> count(static_cast<std::size_t>(m) + 1, 0);
  for (int j = 0; j < m; ++j)
    for (int r : columns[j].rows) ++count[(transposed ? r : j) + 1];
  matrix.start.assign(static_cast<std::size_t>(m) + 1, 0);
  for (int c = 0; c < m; ++c) matrix.start[c + 1] = matrix.start[c] + count[c + 1];
  matrix.index.resize(static_cast<std::size_t>(matrix.start[m]));
  matrix.small.resize(static_cast<std::size_t>(matrix.start[m]));
  std::vector<int> fill(matrix.start.begin(), matrix.start.end() - 1);
  Integer entry;
  for (int j = 0; j < m; ++j)
    for (std::size_t e = 0; e < columns[j].rows.size(); ++e) {
      int r = columns[j].rows[e];
      int row = transposed ? j : r, column = transposed ? r : j;
      int slot = fill[column]++;
      matrix.index[slot] = row;
      const mpq_t& q = columns[j].values[e].backend().data();
      if (mpz_cmp(z(matrix.scale[row]), mpq_denref(q)) == 0) {
        mpz_set(z(entry), mpq_numref(q));
      } else {
        mpz_divexact(z(entry), z(matrix.scale[row]), mpq_denref(q));
        mpz_mul(z(entry), z(entry), mpq_numref(q));
      }
      if (mpz_fits_slong_p(z(entry))) {
        matrix.small[slot] = mpz_get_si(z(entry));
      } else {
        if (matrix.large.empty()) matrix.large.resize(matrix.small.size());
        matrix.small[slot] = 0;
        matrix.large[slot] = entry;
      }
    }
  matrix.scale_mantissa.resize(static_cast<std::size_t>(m));
  matrix.scale_exponent.resize(static_cast<std::size_t>(m));
  for (int i = 0; i < m; ++i) matrix.scale_mantissa[i] = mpz_get_d_2exp(&matrix.scale_exponent[i], z(matrix.scale[i]));
  return matrix;
}

bool RefinedSolver::factorize(int m, const std::vector<SparseColumn>& columns) {
  m_ = m;
  usable_ = false;
  seed_ = 0;
  simplex::FloatColumns values;
  for (int j = 0; j < m; ++j) {
    for (std::size_t e = 0; e < columns[j].rows.size(); ++e) {
      double v = numeric::to_double(columns[j].values[e]);
      if (!std::isfinite(v)) return false;
      if (v != 0) values.push(columns[j].rows[e], v);
    }
    values.close();
  }
  // Tiny pivots are acceptable here: a poor factor only slows the refinement, which then gives
  // up, and the exact check stands behind every answer.
  constexpr double pivot_floor = 1e-14;
  if (!lu_.factorize(m, std::move(values), pivot_floor)) return false;
  primal_ = scaled(m, columns, false);
  dual_ = scaled(m, columns, true);
  usable_ = true;
  return true;
}

std::optional<std::vector<Rational>> RefinedSolver::solve(const std::vector<Rational>& b) {
  return refine(primal_, b, false);
}

std::optional<std::vector<Rational>> RefinedSolver::solve_transposed(const std::vector<Rational>& c) {
  return refine(dual_, c, true);
}

std::optional<RefinedSolver::Approximation> RefinedSolver::approximate(const std::vector<Rational>& b,
                                                                       long bits) {
  return approximate_with(primal_, b, false, bits);
}

std::optional<RefinedSolver::Approximation> RefinedSolver::approximate_transposed(
    const std::vector<Rational>& c, long bits) {
  return approximate_with(dual_, c, true, bits);
}

// refine() up to the asked accuracy: it then leaves its answer empty and approximation_ set.
std::optional<RefinedSolver::Approximation> RefinedSolver::approximate_with(const IntegerMatrix& matrix,
                                                                            const std::vector<Rational>& rhs,
                                                                            bool transposed, long bits) {
  approximate_bits_ = bits;
  approximation_ = {};
  auto exact = refine(matrix, rhs, transposed);
  approximate_bits_ = 0;
  if (!exact) return std::nullopt;
  if (exact->size() != static_cast<std::size_t>(m_)) return approximation_;
  Approximation ended_exact;
  for (const Rational& v : *exact) ended_exact.values.push_back(numeric::to_double(v));
  return ended_exact;
}

// N / (2^E L) in double, each within about 2^(error_bits - E) / L of the solution.
RefinedSolver::Approximation RefinedSolver::approximation(long error_bits) {
  fold_recent();
  auto power_of_two = [](long exponent) { return static_cast<int>(std::clamp(exponent, -100000L, 100000L)); };
  long l_exponent = 0;
  const double l_mantissa = mpz_get_d_2exp(&l_exponent, z(rhs_denominator_));
  Approximation result;
  result.values.resize(static_cast<std::size_t>(m_));
  for (int j = 0; j < m_; ++j) {
    long n_exponent = 0;
    const double n_mantissa = mpz_get_d_2exp(&n_exponent, z(numerator_[j]));
    result.values[j] = std::ldexp(n_mantissa / l_mantissa, power_of_two(n_exponent - l_exponent - exponent_));
  }
  result.error = std::ldexp(1 / l_mantissa, power_of_two(error_bits - exponent_ - l_exponent));
  return result;
}

// work_ = M^-1 (r / 2^shift) in double, with shift chosen so that r / (D 2^shift) is of order one.
void RefinedSolver::float_solve(const IntegerMatrix& matrix, bool transposed, long& shift) {
  shift = std::numeric_limits<long>::min();
  std::vector<long>& exponents = exponents_;
  exponents.assign(static_cast<std::size_t>(m_), 0);
  work_.assign(static_cast<std::size_t>(m_), 0.0);
  for (int i = 0; i < m_; ++i) {
    if (mpz_sgn(z(residual_[i])) == 0) continue;
    long e;
    work_[i] = mpz_get_d_2exp(&e, z(residual_[i])) / matrix.scale_mantissa[i];
    exponents[i] = e - matrix.scale_exponent[i];
    shift = std::max(shift, exponents[i]);
  }
  for (int i = 0; i < m_; ++i)
    if (work_[i] != 0) work_[i] = std::ldexp(work_[i], static_cast<int>(std::max(exponents[i] - shift, -2000L)));
  if (transposed)
    lu_.solve_transposed(work_);
  else
    lu_.solve(work_);
}

// target -= M z.
void RefinedSolver::subtract_product(const IntegerMatrix& matrix, const std::vector<Integer>& values,
                                     std::vector<Integer>& target) {
  for (int j = 0; j < m_; ++j) {
    mpz_srcptr factor = z(values[j]);
    if (mpz_sgn(factor) == 0) continue;
    for (int p = matrix.start[j]; p < matrix.start[j + 1]; ++p) {
      mpz_ptr row = z(target[matrix.index[p]]);
      const long entry = matrix.small[p];
      if (entry > 0) mpz_submul_ui(row, factor, static_cast<unsigned long>(entry));
      else if (entry < 0) mpz_addmul_ui(row, factor, 0UL - static_cast<unsigned long>(entry));
      else mpz_submul(row, z(matrix.large[p]), factor);
    }
  }
}

// value <- v when |v| < 2^127.
bool RefinedSolver::to_wide(mpz_srcptr v, Wide& value) {
  if (mpz_sizeinbase(v, 2) > 127) return false;
  UnsignedWide magnitude = mpz_getlimbn(v, 1);
  magnitude = (magnitude << 64) | mpz_getlimbn(v, 0);
  value = mpz_sgn(v) < 0 ? -static_cast<Wide>(magnitude) : static_cast<Wide>(magnitude);
  return true;
}

// The residual stays near the size of the integer right-hand side (each step scales it up by
// 2^depth and takes away about as much), and the matrix's entries are short: the sums of a step
// mostly fit 128 bits, where GMP spent a call per product (most of refinement's time on
// maros-r7; on pilot87, whose corrections reach 110 bits, 72 % of the steps fit).  Overflow is
// detected, not assumed away, and the answer is proven exactly at the end whichever path computed
// the residual.
bool RefinedSolver::step_in_machine_integers(const IntegerMatrix& matrix, long depth) {
  if (!matrix.large.empty() || depth > 125) return false;
  wide_.resize(static_cast<std::size_t>(m_));
  Wide value;
  for (int i = 0; i < m_; ++i)
    if (!to_wide(z(residual_[i]), value) || __builtin_mul_overflow(value, Wide{1} << depth, &wide_[i]))
      return false;
  for (int j = 0; j < m_; ++j) {
    Wide c;
    if (!to_wide(z(correction_[j]), c)) return false;
    if (c == 0) continue;
    for (int p = matrix.start[j]; p < matrix.start[j + 1]; ++p) {
      Wide product;
      Wide& row = wide_[matrix.index[p]];
      if (__builtin_mul_overflow(c, static_cast<Wide>(matrix.small[p]), &product) ||
          __builtin_sub_overflow(row, product, &row))
        return false;
    }
  }
  for (int i = 0; i < m_; ++i) {
    const Wide v = wide_[i];
    const bool negative = v < 0;
    const UnsignedWide magnitude = negative ? -static_cast<UnsignedWide>(v) : static_cast<UnsignedWide>(v);
    mpz_ptr r = z(residual_[i]);
    mpz_set_ui(r, static_cast<unsigned long>(magnitude >> 64));
    mpz_mul_2exp(r, r, 64);
    mpz_add_ui(r, r, static_cast<unsigned long>(magnitude));
    if (negative) mpz_neg(r, r);
  }
  return true;
}

std::optional<std::vector<Rational>> RefinedSolver::refine(const IntegerMatrix& matrix, const std::vector<Rational>& rhs,
                                                           bool transposed) {
  stats_ = {};
  if (!usable_ || static_cast<int>(rhs.size()) != m_) return std::nullopt;
  // rhs_ = L D rhs with L the least common denominator of D rhs.
  rhs_denominator_ = 1;
  std::vector<Rational> scaled_rhs(static_cast<std::size_t>(m_));
  for (int i = 0; i < m_; ++i) {
    mpq_ptr q = scaled_rhs[i].backend().data();
    mpq_set(q, rhs[i].backend().data());
    mpz_mul(mpq_numref(q), mpq_numref(q), z(matrix.scale[i]));
    mpq_canonicalize(q);
    mpz_lcm(z(rhs_denominator_), z(rhs_denominator_), mpq_denref(q));
  }
  rhs_.resize(static_cast<std::size_t>(m_));
  for (int i = 0; i < m_; ++i) {
    mpq_srcptr q = scaled_rhs[i].backend().data();
    mpz_divexact(z(rhs_[i]), z(rhs_denominator_), mpq_denref(q));
    mpz_mul(z(rhs_[i]), z(rhs_[i]), mpq_numref(q));
  }
  residual_ = rhs_;
  numerator_.assign(static_cast<std::size_t>(m_), Integer(0));
  recent_.assign(static_cast<std::size_t>(m_), Integer(0));
  recent_bits_ = 0;
  correction_.assign(static_cast<std::size_t>(m_), Integer(0));
  exponent_ = 0;
  std::vector<Rational> answer;
  if (all_zero(residual_)) {
    candidate_.assign(static_cast<std::size_t>(m_), Integer(0));
    common_denominator_ = 1;
    return std::vector<Rational>(static_cast<std::size_t>(m_), Rational(0));
  }

  constexpr int max_step = 50;  // bits per step: a double holds 53
  constexpr long min_gain = 4;
  int step = max_step;
  int stalls = 0;
  long target = 64;
  long seed_margin = 16;  // bits beyond bits(seed) at which a seeded reconstruction is next tried
  long residual_bits = max_bits(residual_);
  for (;;) {
    run::stop_if_exhausted(limits_.budget, [] { return std::string("refining the basic solution"); });
    long shift;
    float_solve(matrix, transposed, shift);
    double largest = 0;
    for (double w : work_) {
      if (!std::isfinite(w)) return std::nullopt;
      largest = std::max(largest, std::abs(w));
    }
    if (largest == 0) return std::nullopt;
    // |M^-1 r| is about 2^error_bits, so N / 2^E is within 2^(error_bits - E) of the solution.
    const long error_bits = shift + std::ilogb(largest) + 1;
    if (approximate_bits_ > 0 && exponent_ - error_bits >= approximate_bits_) {
      approximation_ = approximation(error_bits);
      return std::vector<Rational>{};
    }
    // The denominator of the previous verified answer often serves this one too (the primal and
    // dual solutions at one basis share det B): with a known denominator Q, rounding N Q / 2^E
    // needs only bits(Q) bits beyond the error, and a further factor q of the denominator
    // 2 bits(q) more, not the 2 bits(Q q) of a reconstruction from nothing.  Tried with margins
    // of 16, 64, 256... bits for such factors while that is cheaper than starting from nothing.
    const long seed_bits = mpz_sgn(z(seed_)) > 0 ? static_cast<long>(mpz_sizeinbase(z(seed_), 2)) : 0;
    if (seed_bits > 0 && seed_margin < seed_bits &&
        exponent_ - error_bits - limits_.guard_bits > seed_bits + seed_margin) {
      seed_margin *= 4;
      if (reconstruct(matrix, error_bits, &seed_, answer)) return answer;
    }
    if (exponent_ - error_bits >= target) {
      if (reconstruct(matrix, error_bits, nullptr, answer)) return answer;
      target = (exponent_ - error_bits) * 5 / 4 + 32;
    }
    if (exponent_ > limits_.max_bits) return std::nullopt;

    // One step: c = round(2^(depth + shift) w), N <- 2^depth N + c, r <- 2^depth r - M c.  The
    // step takes `step` bits of M^-1 r below its leading one; when the solution lies far below
    // one (huge matrix entries), those bits start 2^-error_bits further down, and so does depth.
    ++stats_.iterations;
    const long depth = step + std::max(0L, -error_bits);
    const long scale = depth + shift;
    const int direct = static_cast<int>(std::min(scale, 900L));
    for (int j = 0; j < m_; ++j) {
      mpz_set_d(z(correction_[j]), std::nearbyint(std::ldexp(work_[j], direct)));
      if (scale > direct) mpz_mul_2exp(z(correction_[j]), z(correction_[j]), static_cast<mp_bitcnt_t>(scale - direct));
      mpz_mul_2exp(z(recent_[j]), z(recent_[j]), static_cast<mp_bitcnt_t>(depth));
      mpz_add(z(recent_[j]), z(recent_[j]), z(correction_[j]));
    }
    recent_bits_ += depth;
    if (recent_bits_ >= recent_limit_bits) fold_recent();
    if (!step_in_machine_integers(matrix, depth)) {
      for (Integer& r : residual_) mpz_mul_2exp(z(r), z(r), static_cast<mp_bitcnt_t>(depth));
      subtract_product(matrix, correction_, residual_);
    }
    exponent_ += depth;
    stats_.bits = exponent_;
    if (all_zero(residual_)) {
      // N / 2^E is the exact solution.
      fold_recent();
      candidate_ = numerator_;
      Integer power = 1;
      mpz_mul_2exp(z(power), z(power), static_cast<mp_bitcnt_t>(exponent_));
      if (prove(matrix, power, answer)) return answer;
      return std::nullopt;
    }
    // Bits of accuracy this step gained; the next step asks for as many (Wan 2006 picks the
    // scale from the residual norm to the same end: the integer residual must not grow).
    long new_bits = max_bits(residual_);
    long gain = depth - (new_bits - residual_bits);
    residual_bits = new_bits;
    // A few bits a step means the float LU is too inaccurate for B: the rational LU will do better.
    stalls = gain < min_gain ? stalls + 1 : 0;
    if (stalls > 3) return std::nullopt;
    step = static_cast<int>(std::clamp(gain, 1L, static_cast<long>(max_step)));
  }
}

// N <- 2^b N + R for the b bits of the recent steps' sum R: shifting the long N once per block of
// steps instead of once per step keeps the work linear in E (it was the largest cost on maros-r7).
void RefinedSolver::fold_recent() {
  if (recent_bits_ == 0) return;
  for (int j = 0; j < m_; ++j) {
    mpz_mul_2exp(z(numerator_[j]), z(numerator_[j]), static_cast<mp_bitcnt_t>(recent_bits_));
    mpz_add(z(numerator_[j]), z(numerator_[j]), z(recent_[j]));
    mpz_set_ui(z(recent_[j]), 0);
  }
  recent_bits_ = 0;
}

// Tries to recover every component as p_j / (Q L) with a common Q and to prove M p = Q rhs_.
// Q starts at *seed when given, else at 1, and grows by each component's further factor.
bool RefinedSolver::reconstruct(const IntegerMatrix& matrix, long error_bits, const Integer* seed,
                                std::vector<Rational>& answer) {
  ++stats_.reconstructions;
  fold_recent();
  const long slack_bits = std::max(0L, error_bits + limits_.guard_bits);
  if (exponent_ - slack_bits < 3 && !seed) return false;
  const mp_bitcnt_t e = static_cast<mp_bitcnt_t>(exponent_);
  Integer common = seed ? *seed : Integer(1), bound, a, b, p, q, difference, allowed;
  std::vector<std::pair<int, Integer>> factors;  // (component, factor of Q introduced there)
  candidate_.resize(static_cast<std::size_t>(m_));
  auto close_enough = [&](const Integer& scaled_numerator, const Integer& guess, const Integer& denominator) {
    // |N_j Q q - p 2^E| <= Q q 2^slack, i.e. p / (Q q) lies within the error bound of N_j / 2^E.
    mpz_mul_2exp(z(difference), z(guess), e);
    mpz_sub(z(difference), z(scaled_numerator), z(difference));
    mpz_mul_2exp(z(allowed), z(denominator), static_cast<mp_bitcnt_t>(slack_bits));
    return mpz_cmpabs(z(difference), z(allowed)) <= 0;
  };
  // The first guess tried for every component, with its half unit 2^(E-1) and its allowance
  // Q 2^slack kept from one component to the next.
  Integer half, allowance, rest;
  if (e > 0) mpz_setbit(z(half), e - 1);
  mpz_mul_2exp(z(allowance), z(common), static_cast<mp_bitcnt_t>(slack_bits));
  for (int j = 0; j < m_; ++j) {
    // First guess: the denominator found so far (Wan 2006; Cook and Steffy 2011),
    // p = floor((N_j Q + 2^(E-1)) / 2^E), within the error bound when |N_j Q - p 2^E| <= Q 2^slack.
    mpz_mul(z(a), z(numerator_[j]), z(common));
    mpz_add(z(rest), z(a), z(half));
    mpz_fdiv_q_2exp(z(p), z(rest), e);
    mpz_fdiv_r_2exp(z(rest), z(rest), e);
    mpz_sub(z(rest), z(rest), z(half));
    if (mpz_cmpabs(z(rest), z(allowance)) <= 0) {
      candidate_[j] = p;
      continue;
    }
    // Otherwise the best continued-fraction approximation of N_j Q / 2^E whose denominator q is
    // small enough to be the only candidate: N_j Q / 2^E lies within Q 2^(slack - E) of
    // x_j Q = p / q, and when 2 q^2 Q 2^(slack - E) < 1 such a p / q is a convergent of it
    // (Legendre) and no other fraction with a denominator up to q is as close.
    const long extra_bits = (exponent_ - slack_bits - static_cast<long>(mpz_sizeinbase(z(common), 2)) - 1) / 2;
    if (extra_bits < 1) return false;
    mpz_set_ui(z(bound), 1);
    mpz_mul_2exp(z(bound), z(bound), static_cast<mp_bitcnt_t>(extra_bits));
    Integer scaled_numerator = a;
    mpz_set_ui(z(b), 1);
    mpz_mul_2exp(z(b), z(b), e);
    best_convergent(a, b, bound, p, q);
    if (mpz_sgn(z(q)) == 0) return false;
    mpz_mul(z(scaled_numerator), z(scaled_numerator), z(q));
    mpz_mul(z(allowed), z(common), z(q));
    Integer denominator = allowed;
    if (!close_enough(scaled_numerator, p, denominator)) return false;
    candidate_[j] = p;
    mpz_mul(z(common), z(common), z(q));
    mpz_mul_2exp(z(allowance), z(common), static_cast<mp_bitcnt_t>(slack_bits));
    factors.emplace_back(j, std::move(q));
  }
  // Bring every numerator to the final common denominator: component j still needs the factors
  // introduced after it.
  Integer later = 1;
  std::size_t f = factors.size();
  for (int j = m_ - 1; j >= 0; --j) {
    while (f > 0 && factors[f - 1].first > j) mpz_mul(z(later), z(later), z(factors[--f].second));
    mpz_mul(z(candidate_[j]), z(candidate_[j]), z(later));
  }
  return prove(matrix, common, answer);
}

// The proof: M p == Q rhs_ in exact integers, for p = candidate_ and Q = common; then
// answer = p / (Q L).
bool RefinedSolver::prove(const IntegerMatrix& matrix, Integer common, std::vector<Rational>& answer) {
  check_.resize(static_cast<std::size_t>(m_));
  for (int i = 0; i < m_; ++i) mpz_mul(z(check_[i]), z(rhs_[i]), z(common));
  subtract_product(matrix, candidate_, check_);
  if (!all_zero(check_)) return false;
  stats_.denominator_bits = static_cast<long>(mpz_sizeinbase(z(common), 2));
  mpz_mul(z(common), z(common), z(rhs_denominator_));
  common_denominator_ = common;
  answer.resize(static_cast<std::size_t>(m_));
  // The seed, the least common denominator of the answer, is C / gcd(C, p_1, ..., p_m) for the
  // common denominator C: the running gcd soon reaches a short number, unlike a running lcm.
  Integer shared = common;
  for (int j = 0; j < m_; ++j) {
    mpq_ptr x = answer[j].backend().data();
    mpz_set(mpq_numref(x), z(candidate_[j]));
    mpz_set(mpq_denref(x), z(common));
    mpq_canonicalize(x);
    if (mpz_cmp_ui(z(shared), 1) != 0) mpz_gcd(z(shared), z(shared), z(candidate_[j]));
  }
  mpz_divexact(z(seed_), z(common), z(shared));
  return true;
}

TransposedSolveBeside::TransposedSolveBeside(RefineLimits limits, int m, std::function<System()> system,
                                             std::chrono::milliseconds delay)
    : solver_([&] {
        limits.budget = &own_budget_;
        return limits;
      }()) {
  answer_ =
      std::async(std::launch::async,
                 [this, m, system = std::move(system), delay]() -> std::optional<std::vector<Rational>> {
                   {
                     std::unique_lock lock(mutex_);
                     if (cancelled_signal_.wait_for(lock, delay, [this] { return cancelled_; }))
                       return std::nullopt;
                     started_ = true;
                   }
                   try {
                     System inputs = system();
                     if (!solver_.factorize(m, inputs.columns)) return std::nullopt;
                     return solver_.solve_transposed(inputs.c);
                   } catch (const run::Stopped&) {
                     return std::nullopt;  // abandoned, or interrupted (which the caller sees too)
                   }
                 });
}

TransposedSolveBeside::~TransposedSolveBeside() {
  cancel_if_waiting();
  own_budget_.abandon();
  if (answer_.valid()) answer_.wait();
}

bool TransposedSolveBeside::cancel_if_waiting() {
  {
    std::lock_guard lock(mutex_);
    if (started_) return false;
    cancelled_ = true;
  }
  cancelled_signal_.notify_one();
  return true;
}

std::optional<std::vector<Rational>> TransposedSolveBeside::take(run::Budget* budget) {
  while (answer_.wait_for(std::chrono::milliseconds(1)) != std::future_status::ready)
    run::stop_if_exhausted(budget, [] { return std::string("solving for the duals"); });
  return answer_.get();
}

}  // namespace plumb::exact::detail
