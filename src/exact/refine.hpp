// Internal to the exact engine: exact basis solves by float LU, iterative refinement on exact
// integer residuals, rational reconstruction and an exact check of the answer.
#pragma once

#include "factor.hpp"
#include "plumb/simplex/float_lu.hpp"

#include <chrono>
#include <condition_variable>
#include <functional>
#include <future>
#include <mutex>
#include <optional>
#include <vector>

namespace plumb::exact::detail {

using numeric::Integer;

struct RefineLimits {
  long max_bits = 1L << 16;  // give up once the accumulated denominator 2^E exceeds this many bits
  int guard_bits = 8;        // reconstruction keeps this margin below the estimated accuracy
  run::Budget* budget = nullptr;  // polled every step: a solve throws run::Stopped when exhausted
};

// What the last solve did, for benchmarks and tests.
struct RefineStats {
  int iterations = 0;        // refinement steps (one float solve and one exact residual each)
  int reconstructions = 0;   // reconstruction attempts (each followed by an exact check when complete)
  long bits = 0;             // E at the end: the solution was accumulated over 2^E
  long denominator_bits = 0; // bits of the common denominator of the verified answer
};

// Solves B x = b and B^T y = c exactly for a square basis B given by its columns, by the
// numeric-symbolic scheme of Z. Wan ("An algorithm to solve integer linear systems exactly using
// numerical methods", J. Symbolic Computation 41, 2006): the system is scaled to integers; each
// step solves for a correction in double with the float LU of B, scales it by 2^k and rounds it to
// integers, and updates the integer residual r <- 2^k r - M c exactly, so that the accumulated
// N / 2^E satisfies M N / 2^E = rhs - r / 2^E.  Each component is then recovered as the best
// continued-fraction approximation with a bounded denominator (rational reconstruction, P. S. Wang,
// "A p-adic algorithm for univariate partial fractions", SYMSAC 1981), trying the common
// denominator found so far first (Wan 2006; W. Cook and D. E. Steffy, "Solving very sparse rational
// systems of equations", ACM TOMS 37, 2011).  The candidate is accepted only after M x = rhs holds
// in exact integer arithmetic: the float work guides, the multiplication proves.  Iterative
// refinement for LP in this spirit: A. M. Gleixner, D. E. Steffy and K. Wolter, "Iterative
// refinement for linear programming", INFORMS J. Computing 28, 2016; D. L. Applegate, W. Cook,
// S. Dash and D. G. Espinoza, "Exact solutions to linear programming problems", Oper. Res.
// Letters 35, 2007.
class RefinedSolver {
 public:
  explicit RefinedSolver(RefineLimits limits = {}) : limits_(limits) {}

  // Float LU of the m x m matrix with these columns; false when it finds the matrix singular (or
  // a value does not fit a double), in which case every solve returns nullopt.
  bool factorize(int m, const std::vector<SparseColumn>& columns);

  // x with B x = b (b indexed by row, x by basis position), or nullopt when refinement stalls or
  // no candidate passes the exact check within the limits.  Never a wrong answer.
  std::optional<std::vector<Rational>> solve(const std::vector<Rational>& b);
  // y with B^T y = c (c indexed by basis position, y by row), likewise.
  std::optional<std::vector<Rational>> solve_transposed(const std::vector<Rational>& c);

  // x or y to about 2^-bits of their largest entry, with neither reconstruction nor proof: to see
  // a basis is clearly not optimal before paying for its exact solutions.  Each value lies within
  // about `error` of the solution (0 when refinement happened to end exact); nullopt as above.
  struct Approximation {
    std::vector<double> values;
    double error = 0;
  };
  std::optional<Approximation> approximate(const std::vector<Rational>& b, long bits);
  std::optional<Approximation> approximate_transposed(const std::vector<Rational>& c, long bits);

  const RefineStats& stats() const { return stats_; }
  // The last answer returned, as integer numerators over one positive common denominator: exact
  // arithmetic on it needs no gcd per operation.  Valid until the next solve.
  const std::vector<Integer>& common_numerators() const { return candidate_; }
  const Integer& common_denominator() const { return common_denominator_; }

  // M = D B (or D B^T), scaled to integers by the positive diagonal D of each row's least common
  // denominator, column-wise.
  struct IntegerMatrix {
    std::vector<int> start, index;
    // Entries (never zero) in `small` when they fit a long, nearly always: decimal data scale to
    // short integers, and GMP's single-limb multiply then serves.  Otherwise `small` holds 0 and
    // `large`, empty while no entry needs it, holds the entry.
    std::vector<long> small;
    std::vector<Integer> large;
    std::vector<double> scale_mantissa;  // D_i = scale_mantissa_i * 2^scale_exponent_i, roughly
    std::vector<long> scale_exponent;
    std::vector<Integer> scale;          // D_i exactly
  };

 private:
  static IntegerMatrix scaled(int m, const std::vector<SparseColumn>& columns, bool transposed);
  std::optional<std::vector<Rational>> refine(const IntegerMatrix& matrix, const std::vector<Rational>& rhs,
                                              bool transposed);
  void float_solve(const IntegerMatrix& matrix, bool transposed, long& shift);
  void subtract_product(const IntegerMatrix& matrix, const std::vector<Integer>& z, std::vector<Integer>& target);
  // residual_ <- 2^depth residual_ - M correction_ in 128-bit integers; false (residual_ untouched)
  // when a value does not fit, for the GMP path to do it.
  bool step_in_machine_integers(const IntegerMatrix& matrix, long depth);
  __extension__ using Wide = __int128;  // a GCC extension: -Wpedantic knows no 128-bit type
  static bool to_wide(mpz_srcptr v, Wide& value);
  bool reconstruct(const IntegerMatrix& matrix, long error_bits, const Integer* seed, std::vector<Rational>& answer);
  bool prove(const IntegerMatrix& matrix, Integer common, std::vector<Rational>& answer);
  void fold_recent();
  std::optional<Approximation> approximate_with(const IntegerMatrix& matrix, const std::vector<Rational>& rhs,
                                                bool transposed, long bits);
  Approximation approximation(long error_bits);

  RefineLimits limits_;
  RefineStats stats_;
  int m_ = 0;
  bool usable_ = false;
  simplex::FloatLu lu_;
  IntegerMatrix primal_, dual_;
  // Working storage reused across steps: rhs scaled to integers, N, r, corrections, checks.
  std::vector<Integer> rhs_, numerator_, residual_, correction_, check_, candidate_;
  Integer rhs_denominator_;  // the integer rhs is L * D * b
  Integer common_denominator_;
  long exponent_ = 0;        // E
  // The corrections of the last steps, summed apart from N: N / 2^E is (2^b N + R) / 2^E.
  static constexpr long recent_limit_bits = 2048;
  std::vector<Integer> recent_;
  long recent_bits_ = 0;     // b
  Integer seed_ = 0;         // least common denominator of the last verified answer, 0 before one
  long approximate_bits_ = 0;  // while positive, refine() stops at this accuracy (approximation_)
  Approximation approximation_;
  std::vector<double> work_;
  std::vector<long> exponents_;  // float_solve(): binary exponents of the residual over D
  std::vector<Wide> wide_;       // step_in_machine_integers(): the new residual
};

// B^T y = c solved on a second thread by a solver of its own while the caller solves B x = b:
// the two systems share only B, and on long fractions each takes seconds (maros-r7: 1.9 s for
// x_B, then 0.9 s for y seeded with x_B's denominator).  On short ones a second factorization
// costs more than it saves (degen3: 15 -> 24 ms), so the thread waits `delay` first: the caller
// cancels it when x_B came sooner and solves for y itself, seeded.  Dropped, it is abandoned
// and joined.
class TransposedSolveBeside {
 public:
  struct System {
    std::vector<SparseColumn> columns;  // B, by position
    std::vector<Rational> c;
  };
  // `system` is called on the second thread once the delay has passed: what it reads must not
  // change until cancel_if_waiting() or take() returns.
  TransposedSolveBeside(RefineLimits limits, int m, std::function<System()> system,
                        std::chrono::milliseconds delay);
  ~TransposedSolveBeside();
  TransposedSolveBeside(const TransposedSolveBeside&) = delete;
  TransposedSolveBeside& operator=(const TransposedSolveBeside&) = delete;
  // True when the thread was still waiting: then it never starts, and y is the caller's to solve.
  bool cancel_if_waiting();
  // Waits for y, polling the caller's `budget` (run::Stopped when it is exhausted); nullopt as
  // RefinedSolver::solve_transposed.  Once only, and not after a cancellation.
  std::optional<std::vector<Rational>> take(run::Budget* budget);
  // Its numerators and common denominator, once taken.
  const RefinedSolver& solver() const { return solver_; }

 private:
  run::Budget own_budget_;  // no limits: abandoned by the destructor
  RefinedSolver solver_;
  std::mutex mutex_;
  std::condition_variable cancelled_signal_;
  bool cancelled_ = false, started_ = false;  // guarded by mutex_
  std::future<std::optional<std::vector<Rational>>> answer_;
};

}  // namespace plumb::exact::detail
