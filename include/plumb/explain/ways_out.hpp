// Ways out of an infeasible model: how far one requirement alone must move, and the least total change.
#pragma once

#include "plumb/certificate/certificate.hpp"
#include "plumb/check/check.hpp"
#include "plumb/explain/explain.hpp"
#include "plumb/model/model.hpp"
#include "plumb/run/budget.hpp"

#include <vector>

namespace plumb::explain {

// The least change of one soft side or bound alone that makes the whole model feasible.  With the
// entry g(x) >= v (an upper side negated) left out, an exact LP finds the best t = max g(x) over the
// rest of the model: every value up to t can hold, no value above it can.  Its certificate,
// checked on that changed model, proves both (docs/explaining.md, "Ways out").
struct SingleChange {
  enum class Result { moves, not_enough, stopped };
  Member member;
  Result result = Result::stopped;
  Rational to;  // moves: the value the side or bound has to reach (at most, for a lower side)
  Rational by;  // moves: how far that is from its value, > 0
  certificate::Certificate proof;  // moves: optimal; not_enough: infeasible; of the changed model
  check::Verdict verdict;          // the independent checker on `proof`
};

// The least change of each member alone; entries after an exhausted budget are `stopped`.
std::vector<SingleChange> single_changes(const model::Model& model, const std::vector<Member>& members,
                                         run::Budget* budget = nullptr);

// One side or bound moved by the least total change.
struct Move {
  Member member;
  Rational to;
  Rational by;  // > 0, in the side's or bound's own unit
};

// The smallest total relaxation, summed over every soft side and bound, each weighted per unit of
// its own side or bound by its label's weight (1 when it has none), that makes the model
// feasible: an elastic LP solved exactly.
struct LeastTotalChange {
  enum class Result { found, hard_conflict, stopped };
  Result result = Result::stopped;
  Rational total;                  // found: the weighted sum of the moves
  bool weighted = false;           // some soft entry's label gives a weight other than 1
  std::vector<Move> moves;         // found: the sides and bounds that move, in model order
  certificate::Certificate proof;  // found: optimal certificate of the elastic LP
  check::Verdict verdict;
};

LeastTotalChange least_total_change(const model::Model& model, run::Budget* budget = nullptr);

// Both, for an explanation that found a subsystem: the single changes of its first `max_single`
// members (each is one exact solve of the model), then the least total change.
struct WaysOut {
  std::vector<SingleChange> single;
  std::size_t not_tried = 0;  // members beyond max_single
  LeastTotalChange least;
};
WaysOut find_ways_out(const model::Model& model, const Explanation& explanation, run::Budget* budget,
                      std::size_t max_single);

}  // namespace plumb::explain
