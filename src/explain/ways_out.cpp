// Ways out (docs/explaining.md): the least change of one requirement alone, by an exact LP over the
// rest of the model, and the least total change, by an exact elastic LP.  Each answer is a
// certified solve of a changed model, its certificate checked on that model.
#include "plumb/explain/ways_out.hpp"

#include "entries.hpp"
#include "plumb/exact/solve.hpp"

#include <algorithm>
#include <optional>
#include <stdexcept>
#include <string>

namespace plumb::explain {

namespace {

using certificate::EntryKind;
using certificate::Limit;

// The model as a sub-problem: no file hash, so no certificate of it can pass for the file's.
model::Model sub_problem(const model::Model& model) {
  model::Model copy = model;
  copy.source.sha256.clear();
  copy.objective.constant = 0;
  copy.objective.coefficients.assign(static_cast<std::size_t>(model.column_count()), Rational(0));
  return copy;
}

model::Side& limit_of(model::Model& model, const certificate::Entry& entry, int index) {
  bool lower = entry.limit == Limit::lower;
  if (entry.kind == EntryKind::row) {
    model::Row& row = model.rows[static_cast<std::size_t>(index)];
    return lower ? row.lower : row.upper;
  }
  model::Column& column = model.columns[static_cast<std::size_t>(index)];
  return lower ? column.lower : column.upper;
}

// A prefix no row or column name of the model starts with, for the elastic LP's own names.
std::string fresh_prefix(const model::Model& model) {
  std::string prefix = "~relax";
  auto taken = [&] {
    for (const auto& row : model.rows)
      if (row.name.starts_with(prefix)) return true;
    for (const auto& column : model.columns)
      if (column.name.starts_with(prefix)) return true;
    return false;
  };
  while (taken()) prefix += "~";
  return prefix;
}

}  // namespace

std::vector<SingleChange> single_changes(const model::Model& model, const std::vector<Member>& members,
                                         run::Budget* budget) {
  std::vector<SingleChange> changes;
  std::optional<simplex::Basis> last_basis;
  for (const Member& member : members) {
    SingleChange change;
    change.member = member;
    // Left out, the entry g(x) >= v becomes the objective: the best g over the rest is how far it can go.
    model::Model rest = sub_problem(model);
    limit_of(rest, member.entry, member.index).reset();
    if (member.entry.kind == EntryKind::row) {
      auto columns = model.matrix.row_columns(member.index);
      auto positions = model.matrix.row_positions(member.index);
      for (std::size_t k = 0; k < columns.size(); ++k)
        rest.objective.coefficients[static_cast<std::size_t>(columns[k])] = model.matrix.value(positions[k]);
    } else {
      rest.objective.coefficients[static_cast<std::size_t>(member.index)] = 1;
    }
    bool lower = member.entry.limit == Limit::lower;
    rest.objective.sense = lower ? model::Sense::maximise : model::Sense::minimise;
    exact::SolveOptions options;
    options.budget = budget;
    // The changed models differ in one entry and the objective: the last basis is a good start
    // for the float search (not for the exact engine: exact pivots from it took minutes).
    if (last_basis) options.search_start = &*last_basis;
    exact::CertifiedSolution solved = exact::certified_solve(rest, options);
    if (solved.solution.outcome != exact::Outcome::stopped) last_basis = solved.solution.basis;
    change.proof = solved.certificate;
    change.verdict = solved.verdict;
    switch (solved.solution.outcome) {
      case exact::Outcome::optimal:
        change.result = SingleChange::Result::moves;
        change.to = solved.solution.objective;
        change.by = lower ? Rational(member.value - change.to) : Rational(change.to - member.value);
        // The model is infeasible, so the entry cannot hold anywhere on the rest: the best g misses it.
        if (change.by <= 0) throw std::logic_error("a way out that needs no change: the model was feasible");
        break;
      case exact::Outcome::infeasible:
        change.result = SingleChange::Result::not_enough;
        break;
      case exact::Outcome::unbounded:
        throw std::logic_error("a way out without limit: the model was feasible");
      case exact::Outcome::stopped:
        change.result = SingleChange::Result::stopped;
        break;
    }
    changes.push_back(std::move(change));
  }
  return changes;
}

// The elastic LP: every soft side a.x >= L gets a column s >= 0 of its own, a.x + s >= L on the
// row itself (an upper side a.x - s <= U), and every soft bound x >= l one that moves x: x = z - s
// with z keeping the bound, so s takes x's column negated (x = z + s for an upper bound, the column
// as is).  Each s costs its weight per unit (the label's, else 1); hard entries stay as given.  No
// row is added: on greenbea a row per soft side and bound made 12 795 rows of its 2 393.
LeastTotalChange least_total_change(const model::Model& model, run::Budget* budget) {
  detail::Entries entries(model);
  model::Model elastic = sub_problem(model);
  std::string prefix = fresh_prefix(model);
  std::vector<model::Entry> matrix;
  for (int j = 0; j < model.column_count(); ++j) {
    auto rows = model.matrix.column_rows(j);
    auto values = model.matrix.column_values(j);
    for (std::size_t k = 0; k < rows.size(); ++k) matrix.push_back({rows[k], j, values[k]});
  }
  std::vector<int> relaxed;  // per elastic column, the entry it relaxes
  LeastTotalChange out;
  for (int id = 0; id < entries.size(); ++id) {
    const Member& m = entries[id];
    if (m.hard) continue;
    out.weighted = out.weighted || m.weight != 1;
    int column = elastic.column_count();
    elastic.columns.push_back(
        {prefix + std::to_string(relaxed.size()), Rational(0), std::nullopt, false, {}, {}, {}});
    elastic.objective.coefficients.push_back(m.weight);
    const Rational sign = m.entry.limit == Limit::lower ? Rational(1) : Rational(-1);
    if (m.entry.kind == EntryKind::row) {
      matrix.push_back({m.index, column, sign});
    } else {
      auto rows = model.matrix.column_rows(m.index);
      auto values = model.matrix.column_values(m.index);
      for (std::size_t k = 0; k < rows.size(); ++k)
        matrix.push_back({rows[k], column, Rational(-sign * values[k])});
    }
    relaxed.push_back(id);
  }
  elastic.matrix =
      model::Matrix::from_entries(elastic.row_count(), elastic.column_count(), std::move(matrix));
  elastic.index_names();

  exact::SolveOptions options;
  options.budget = budget;
  exact::CertifiedSolution solved = exact::certified_solve(elastic, options);
  out.proof = solved.certificate;
  out.verdict = solved.verdict;
  switch (solved.solution.outcome) {
    case exact::Outcome::optimal:
      out.result = LeastTotalChange::Result::found;
      out.total = solved.solution.objective;
      for (std::size_t k = 0; k < relaxed.size(); ++k) {
        const Rational& s = solved.solution.x[static_cast<std::size_t>(model.column_count()) + k];
        if (s == 0) continue;
        const Member& m = entries[relaxed[k]];
        out.moves.push_back(
            {m, m.entry.limit == Limit::lower ? Rational(m.value - s) : Rational(m.value + s), s});
      }
      break;
    case exact::Outcome::infeasible:
      out.result = LeastTotalChange::Result::hard_conflict;
      break;
    case exact::Outcome::unbounded:
      throw std::logic_error("the elastic LP is bounded below by 0");
    case exact::Outcome::stopped:
      out.result = LeastTotalChange::Result::stopped;
      break;
  }
  return out;
}

WaysOut find_ways_out(const model::Model& model, const Explanation& explanation, run::Budget* budget,
                      std::size_t max_single) {
  WaysOut ways;
  std::size_t tried = std::min(max_single, explanation.members.size());
  std::vector<Member> members(explanation.members.begin(),
                              explanation.members.begin() + static_cast<long>(tried));
  ways.single = single_changes(model, members, budget);
  ways.not_tried = explanation.members.size() - tried;
  ways.least = least_total_change(model, budget);
  return ways;
}

}  // namespace plumb::explain
