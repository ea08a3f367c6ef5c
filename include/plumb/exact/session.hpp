// A solve session: one model solved again and again under edits of its sides and bounds, warm.
#pragma once

#include "plumb/exact/solve.hpp"
#include "plumb/model/model.hpp"

#include <memory>

namespace plumb::exact {

// What a session's solves minimise: the model's own objective, or nothing (a feasibility
// question: any feasible point is optimal, with objective 0).
enum class Goal { model_objective, feasibility };

// Holds one model's scaled float LP (edits are taken into it, not rebuilt), last basis and last
// proof of infeasibility across many solves, for the filters and audits that ask hundreds of
// questions of nearly the same model.  Edits set a row side or a column bound to a value or to
// infinite (std::nullopt) and are undone by the restore functions.  Each solve goes through the
// same float search, exact certification and independent check as certified_solve (which is a
// session of one solve), warm from the last basis found.
//
// A certificate of an edited model (or under Goal::feasibility) names the model's file but carries
// no SHA-256, so it can never pass as a certificate of the file itself; its extra key "changes"
// lists what differs from the file (docs/solving.md).  Without edits and with the model's
// objective, current() is the model as given and certificates are the file's own.
//
// Budget per solve: SolveOptions::budget of that solve (a fresh run::Budget each, with its own
// time limit; run::Budget::abandon() ends one solve from another thread).  A stopped solve
// leaves the session as it was: the next solve starts from the last basis a solve ended at.
class Session {
 public:
  explicit Session(const model::Model& model);  // the model must outlive the session
  ~Session();
  Session(Session&&) noexcept;
  Session& operator=(Session&&) noexcept;

  // Edits: a row side or column bound set to a value or to infinite (std::nullopt).  A lower side
  // above the upper one is allowed: the solve then proves the model infeasible by those two
  // limits (Solution::farkas).  Indices are the model's; out of range throws std::out_of_range.
  void set_row_lower(int row, model::Side value);
  void set_row_upper(int row, model::Side value);
  void set_column_lower(int column, model::Side value);
  void set_column_upper(int column, model::Side value);
  // Back to the model as given: one row's sides, one column's bounds, or everything (goal too).
  void restore_row(int row);
  void restore_column(int column);
  void restore_all();
  void set_goal(Goal goal);
  Goal goal() const;
  bool edited() const;  // some side, bound or the goal differs from the model as given

  // Solves the current (edited) model warm from the last basis, through the float search and
  // exact certification; never returns an unverified result as certified.  When the edits since
  // the last proof of infeasibility leave it standing (no moved limit carries a multiplier), that
  // proof answers after the independent check (stats.proof "earlier proof"; docs/solving.md).  A warm_start
  // in `options` means what it means to certified_solve: the exact engine starts there.
  CertifiedSolution solve(const SolveOptions& options = {});

  // The model with the edits applied (no file SHA-256 once edited); valid until the next edit.
  const model::Model& current() const;

 private:
  struct State;
  std::unique_ptr<State> state_;
};

}  // namespace plumb::exact
