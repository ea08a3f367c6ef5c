// Why a model is infeasible: a proven irreducible infeasible subsystem of its sides and bounds.
#pragma once

#include "plumb/certificate/certificate.hpp"
#include "plumb/check/check.hpp"
#include "plumb/model/model.hpp"
#include "plumb/run/budget.hpp"

#include <functional>
#include <string>
#include <vector>

namespace plumb::explain {

using numeric::Rational;

// A snapshot for the live progress line.
struct Progress {
  std::string phase;    // e.g. "first solve", "deletion, rows first"
  long candidates = 0;  // members (or groups) still in question
  long sub_solves = 0;  // solves of the session so far
  double elapsed_seconds = 0;
};

struct Options {
  bool by_group = false;          // members are whole groups (Label::group); ungrouped entries alone
  std::string within;             // by_group: this group's entries stand alone (--within GROUP)
  bool all = false;               // after each conflict set one member aside and search again
  run::Budget* budget = nullptr;  // one budget for the whole search; no limits when null
  std::function<void(const Progress&)> progress;
};

enum class Outcome {
  feasible,              // the model has a feasible point: certificate of status feasible
  infeasible_subsystem,  // an IIS of soft entries against the hard ones: proven irreducible
  inconsistent,          // the hard entries alone conflict: the model itself is inconsistent
  stopped,               // a limit was reached; nothing is reported
};

// One side or bound of the model as it takes part in the answer.
struct Member {
  certificate::Entry entry;
  int index = 0;                        // the row's or column's index in the model
  Rational value;                       // the side's or bound's value
  bool hard = false;                    // hard by its label (a bound inherits its column's when silent)
  std::string group;                    // its label's group, the column's when the bound's is silent
  std::string unit;                     // likewise its unit
  const model::Label* label = nullptr;  // the label that speaks for it (a bound's own, else the column's)
  Rational multiplier;                  // in the certificate's Farkas combination; 0 when not used
  Rational weight = 1;                  // per unit relaxed, in the least total change: its label's, else 1
};

// One member order tried, with what it found.
struct OrderTried {
  std::string name;  // "bounds first" or "rows first"
  std::size_t members = 0;
  long sub_solves = 0;
  long earlier_proofs = 0;  // sub-solves the session answered with its earlier proof
};

struct Explanation {
  Outcome outcome = Outcome::stopped;
  // infeasible_subsystem or inconsistent: the certificate's members (empty when inconsistent) and
  // the hard entries, each with its multiplier; under --by-group, members of one group are adjacent.
  std::vector<Member> members;
  std::vector<Member> hard;
  std::vector<std::string> groups;  // by_group: per unit of the subsystem its group ("" for a single entry)
  certificate::Certificate certificate;  // feasible or infeasible_subsystem; empty when stopped
  check::Verdict verdict;                // the independent checker on `certificate`
  std::vector<OrderTried> orders;        // the orders tried; the first smallest one is kept
  long support_size = 0;                 // entries in the first Farkas certificate's support
  long sub_solves = 0;
  double float_seconds = 0, exact_seconds = 0, seconds = 0;
  run::StopReason stop_reason = run::StopReason::none;  // also set when a limit cut --all short
  std::string stopped_during;                           // the phase a stopped search was in
  // --all: the further conflicts found with the members in `set_aside` left out, each proven on its
  // own; `set_aside` relaxed together removes every conflict found (a heuristic cover, not minimal).
  std::vector<Explanation> further;
  std::vector<Member> set_aside;
};

// Finds and certifies an IIS of an infeasible model (docs/explaining.md), or certifies that it is
// feasible.  Every sub-solve runs on one exact::Session under Goal::feasibility, each result
// certified; the returned certificate has passed check::verify unless `verdict` says otherwise.
Explanation explain(const model::Model& model, const Options& options = {});

}  // namespace plumb::explain
