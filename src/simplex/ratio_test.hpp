// Ratio tests of the dual and primal simplex, as free functions so small cases can be tested.
#pragma once

#include <vector>

namespace plumb::simplex::detail {

// A nonbasic variable that limits the dual step t >= 0: its reduced cost, signed so that
// `slack` >= 0 means dual feasible, falls as slack - t * rate with rate > 0.  A boxed variable
// may pass its breakpoint slack / rate by moving to its other bound, which lowers the slope of
// the dual objective by rate * range; range is infinite when it cannot.
struct DualCandidate {
  int variable;
  double slack;
  double rate;
  double range;
};

struct DualStep {
  int entering = -1;          // -1: no breakpoint ends the step, the dual is unbounded
  std::vector<int> flips;     // variables passed on the way, to move to their other bound
  double step = 0;            // slack / rate of the entering variable (may be slightly negative)
};

// Bound-flipping ("long step") dual ratio test with Harris tolerances, in the form of Koberstein,
// "The dual simplex method, techniques for a fast and stable implementation" (thesis, Paderborn
// 2005, section 3.2.1 and algorithm 7) and Maros (2003, section 10.3): breakpoints are passed in
// Harris groups while the slope (starting at the primal infeasibility of the leaving variable)
// stays positive; in the last group the candidate with the largest rate enters.  The dual is
// unbounded only when the slope left after every breakpoint exceeds primal_tolerance (the
// primal infeasibility that would remain).  Reorders `candidates`, dropping any whose ratio is
// not a number.
DualStep dual_ratio_test(std::vector<DualCandidate>& candidates, double slope, double dual_tolerance,
                         double primal_tolerance);

// A basic variable that limits the primal step t >= 0: its distance to the bound it moves
// towards (>= 0 when feasible) shrinks as distance - t * rate with rate > 0.
struct PrimalCandidate {
  int position;
  double distance;
  double rate;
};

struct PrimalStep {
  int leaving = -1;  // the position of the blocking basic variable, -1 when none blocks
  double step = 0;
};

// Harris's two-pass ratio test (Harris, "Pivot selection methods of the Devex LP code",
// Math. Programming 5, 1973): the largest rate among the candidates whose exact ratio fits
// under the smallest ratio with tolerance-relaxed distances.
PrimalStep primal_ratio_test(const std::vector<PrimalCandidate>& candidates, double primal_tolerance);

}  // namespace plumb::simplex::detail
