// The one solve path: floating-point search, exact certification and repair, exact fallback.
#pragma once

#include "plumb/certificate/certificate.hpp"
#include "plumb/check/check.hpp"
#include "plumb/model/model.hpp"
#include "plumb/run/budget.hpp"
#include "plumb/simplex/basis.hpp"

#include <functional>
#include <string>
#include <vector>

namespace plumb::exact {

using numeric::Rational;

enum class Method {
  hybrid,  // float simplex finds a basis, exact arithmetic certifies and repairs it (default)
  exact,   // rational simplex from the start
};

enum class Outcome { optimal, infeasible, unbounded, stopped };

// A snapshot for the live progress line.
struct Progress {
  std::string phase;  // e.g. "float dual", "exact repair"
  long iterations = 0;
  double objective = 0;      // NaN when not known yet (before the first pivot of a phase)
  double infeasibility = 0;  // likewise
  double elapsed_seconds = 0;
};

// Faults injected on purpose, so that tests can drive the branches a sound run rarely takes
// (docs/solving.md).  Never set outside tests.
enum class Fault {
  none,
  float_search_fails,      // the float search reports failure where it stopped: the exact engine
                           // certifies or pivots from there
  result_corrupted,        // the solve path's result is spoiled before the check: the checker rejects
                           // it and the pure exact engine solves again
  auxiliary_not_refined,   // refinement does not certify an auxiliary LP's float basis: the exact
                           // engine pivots on the auxiliary LP from that basis (and row_not_refined
                           // holds too, so that the least-infeasibility LP is reached)
  row_not_refined,         // the float search's infeasible row is not proven by refinement: the
                           // least-infeasibility LP proves infeasibility instead
  first_row_not_refined,   // the first float search's infeasible row is not proven by refinement:
                           // a second search from another start is tried before the
                           // least-infeasibility LP
  auxiliary_search_fails,  // the float search on an auxiliary LP reports failure where it stopped:
                           // its basis is certified or pivoted from all the same (and
                           // row_not_refined holds too)
};

struct SolveOptions {
  Method method = Method::hybrid;
  run::Budget* budget = nullptr;                 // no limits when null
  const simplex::Basis* warm_start = nullptr;    // start from this basis when given
  // The float search starts from this basis (a hint: search and certification run as from a cold
  // start), for a model much like one solved before; a session's own last basis comes first.
  const simplex::Basis* search_start = nullptr;
  std::function<void(const Progress&)> progress;  // called now and then when set
  // Infeasibility proven by the least-infeasibility LP, whose multipliers are few (its duals are
  // bounded by one), rather than by the float search's row of B^-1 (faster, often denser).
  bool few_multipliers = false;
  // On a session: answer with its last proof of infeasibility when the edits since leave it
  // standing (docs/solving.md); false asks for a new search, for a proof that may differ.
  bool earlier_proof = true;
  // The certificate's extra keys for its readers, which the checker ignores: "basis" (for warm
  // starts) and, on an edited session, "changes".  Sub-solves whose certificates are never
  // written leave them out: naming every basic variable and change was an eighth of the time
  // plumb explain took on bgindy.
  bool certificate_extras = true;
  Fault fault = Fault::none;
};

struct SolveStats {
  double float_seconds = 0;
  double certify_seconds = 0;
  double exact_seconds = 0;
  long float_iterations = 0;
  long exact_iterations = 0;
  int correction_rounds = 0;       // float re-solves of a correction problem before certification
  long correction_iterations = 0;  // their float iterations
  int approximate_corrections = 0;  // of those rounds, the ones decided before any exact solution
  long auxiliary_iterations = 0;   // float iterations on the least-infeasibility, feasible-point and ray LPs
  bool repaired = false;       // the starting basis was not optimal exactly: corrected or pivoted
  bool fell_back = false;      // the float phase failed; the exact engine took over from its last basis
  bool zero_cost_search = false;  // the float result came from the search on zero costs (docs/solving.md)
  std::string float_note;  // why the float phase (or a float search on an auxiliary LP) failed, when it did
  std::string phase;           // the exact phase last run (how far a stopped solve got)
  // How the outcome was proven (docs/solving.md): "refined basis", "refined row of the inverse"
  // ("refined row of the inverse, second search" when the search from another start gave the row),
  // "least infeasibility", "feasible point and ray", "row of the inverse", "edge of the basis",
  // "exact pivots", ...;
  // "earlier proof" when a session's last proof of infeasibility still holds under its edits.
  std::string proof;
};

// Values are in the minimisation form of docs/certificates.md (c' = c, or -c when maximising).
struct Solution {
  Outcome outcome = Outcome::stopped;
  std::vector<Rational> x;    // optimal, unbounded: a feasible point (one per column)
  std::vector<Rational> y;    // optimal: row multipliers; infeasible: Farkas multipliers (one per row)
  std::vector<Rational> ray;  // unbounded: an improving ray (one per column)
  // infeasible, when set: the proof on single sides and bounds (a crossed row or column), in
  // place of y (which is then all zero)
  std::vector<certificate::FarkasTerm> farkas;
  Rational objective = 0;     // optimal: the model's objective at x, its sense and constant
  simplex::Basis basis;       // the final basis, for warm starts
  SolveStats stats;
  run::StopReason stop_reason = run::StopReason::none;
};

// Solves the LP relaxation exactly (integer markers are ignored).  A row or column whose lower
// limit is above its upper one makes the model infeasible at once, proven by those two limits.
Solution solve(const model::Model& model, const SolveOptions& options = {});

// The certificate proving a solution's outcome (not for Outcome::stopped): model identity from
// model.source, names in model order, only non-zero values; the final basis as the extra key
// "basis" when `with_basis`.
certificate::Certificate make_certificate(const model::Model& model, const Solution& solution,
                                          bool with_basis = true);

// A solve whose result has passed the independent checker.
struct CertifiedSolution {
  Solution solution;
  certificate::Certificate certificate;  // empty when stopped
  check::Verdict verdict;                // valid unless stopped or even the pure engine failed
  // Checker rejections of a solver result: each is a bug, reported loudly by the caller.  After
  // one, the pure exact engine solved again from scratch.
  std::vector<std::string> rejections;
  bool certified() const { return verdict.valid; }
};

// The one path every command uses: solve, build the certificate, verify it independently, and
// fall back to the pure exact engine when verification fails.  Never yields an unverified result
// as certified.  A session of one solve (session.hpp).
CertifiedSolution certified_solve(const model::Model& model, const SolveOptions& options = {});

}  // namespace plumb::exact
