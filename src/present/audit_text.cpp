// The readable result of plumb audit (docs/audit.md shows the layout).  Every number passes through
// the three helpers at the top, so the house number style is applied in one place.
#include "format.hpp"
#include "plumb/present/audit.hpp"

#include <ostream>

namespace plumb::present {
namespace {

using audit::Violation;
using numeric::Rational;

// An exact amount as people read it: "42", "1/8 (0.125)", "~5501.84588831".
std::string amount(const Rational& value) { return numeric::exact_and_decimal(value); }
// A relative size: "3.1e-9", "~3.33e-10".
std::string relative(const Rational& value) { return detail::scientific(value); }
// A user-given tolerance or gap, as a plain decimal.
std::string setting(const Rational& value) { return numeric::to_display(value); }

constexpr std::size_t changes_shown = 10;
constexpr std::size_t hard_names_shown = 5;

// "row BENZ, at most", "column ETH, at least".
std::string which(const model::Model& model, const Violation& v) {
  bool lower = v.side == Violation::Side::lower;
  if (v.kind == Violation::Kind::row) {
    const model::Row& row = model.rows[static_cast<std::size_t>(v.index)];
    bool equation = row.lower && row.upper && *row.lower == *row.upper;
    return "row " + row.name + (equation ? " (=)" : lower ? " (>=)" : " (<=)");
  }
  return "column " + detail::violation_name(model, v) + (lower ? " lower bound" : " upper bound");
}

}  // namespace

std::vector<std::string> audit_verdict_lines(const model::Model& model, const audit::Audit& a,
                                             const AuditRequest& request) {
  std::size_t missed = a.evaluation.violations.size();
  std::vector<std::string> lines;
  switch (a.verdict) {
    case audit::Verdict::feasible:
      lines.push_back("FEASIBLE exactly: the plan meets every row and bound of the model");
      break;
    case audit::Verdict::within_tolerance:
      lines.push_back(
          "NOT FEASIBLE exactly: " + detail::count_of(missed, "side or bound is", "sides or bounds are") +
          " missed, each within the tolerance " + setting(request.options.tolerance) + " (relative)");
      break;
    case audit::Verdict::infeasible:
      lines.push_back("INFEASIBLE: " + detail::count_of(missed, "side or bound is", "sides or bounds are") +
                      " missed, the worst by " + relative(a.evaluation.violations.front().relative) +
                      " relative, beyond the tolerance " + setting(request.options.tolerance));
      break;
  }
  if (!a.hard_crossed.empty()) {
    std::vector<std::string> names;
    for (std::size_t k : a.hard_crossed)
      names.push_back(detail::violation_name(model, a.evaluation.violations[k]));
    lines.push_back("hard limits crossed, however little: " + detail::name_list(names, hard_names_shown) +
                    " (a hard limit is a law, a contract or physics: a tiny excess is still an excess)");
  }
  switch (a.gap_verdict) {
    case audit::GapVerdict::not_asked: break;
    case audit::GapVerdict::within:
      lines.push_back("within the gap " + setting(*request.options.gap) +
                      " (relative) of the best possible, proven");
      break;
    case audit::GapVerdict::outside:
      lines.push_back("OUTSIDE the gap " + setting(*request.options.gap) +
                      " (relative) of the best possible");
      break;
    case audit::GapVerdict::unknown:
      if (a.verdict == audit::Verdict::feasible)
        lines.push_back("the gap " + setting(*request.options.gap) + " is not proven either way");
      break;
  }
  return lines;
}

namespace {

void write_findings(const model::Model& model, const audit::Audit& a, std::ostream& out) {
  const auto& violations = a.evaluation.violations;
  detail::write_heading(out, "Findings (" + detail::count_of(violations.size(), "miss", "misses") +
                                 (violations.size() > 1 ? ", the largest relative to its limit first)" : ")"));
  if (violations.empty()) {
    out << "  none: every row side and column bound holds exactly\n";
    return;
  }
  detail::Table table({detail::Table::Align::left, detail::Table::Align::right, detail::Table::Align::right,
                       detail::Table::Align::right, detail::Table::Align::right});
  table.add({"where", "limit", "plan", "missed by", "relative", "statement"});
  for (const Violation& v : violations) {
    const model::Label& label = detail::violation_label(model, v);
    std::string unit = label.unit.empty() ? "" : " " + label.unit;
    std::string statement = label.statement;
    if (label.hard.value_or(false)) statement = "HARD: " + statement;
    table.add({which(model, v), amount(v.limit), amount(v.value), amount(v.amount) + unit, relative(v.relative), statement});
  }
  table.write(out);
}

void write_objective(const model::Model& model, const audit::Audit& a, const AuditRequest& request, std::ostream& out) {
  detail::write_heading(out, std::string("Objective (") +
                                 (model.objective.sense == model::Sense::minimise ? "minimised" : "maximised") + ")");
  const Rational& plan = a.evaluation.objective;
  detail::Table table;
  table.add({"plan", amount(plan), "exact, the objective constant " + amount(model.objective.constant) + " included"});
  if (request.options.claimed_objective) {
    Rational difference = *request.options.claimed_objective - plan;
    table.add({"claimed", amount(*request.options.claimed_objective),
               difference == 0 ? "agrees exactly"
                               : "differs from the plan's by " + amount(difference) + " (" +
                                     relative(audit::relative_to(abs(difference), plan)) + " relative)"});
  }
  if (a.optimum) {
    const exact::Solution& s = a.optimum->solution;
    if (!a.optimum->certified()) {
      table.add({"optimum", s.outcome == exact::Outcome::stopped ? "not found: stopped (" + run::describe(s.stop_reason) + ")"
                                                                : "not certified: " + a.optimum->verdict.failure});
    } else if (s.outcome == exact::Outcome::optimal) {
      table.add({"optimum", amount(s.objective), "certified: " + a.optimum->verdict.proven});
    } else {
      table.add({"optimum", s.outcome == exact::Outcome::unbounded ? "none: the objective improves without limit"
                                                                   : "none: the model is infeasible",
                 "certified"});
    }
  }
  auto gap_row = [&](const char* title, const audit::Gap& gap, const char* note) {
    std::string words = gap.absolute < 0 ? std::string("the plan is better by ") + amount(-gap.absolute) +
                                               ", possible only because it misses limits"
                                         : amount(gap.absolute) + " (" + relative(gap.relative) + " relative)";
    table.add({title, words, note});
  };
  if (a.gap_to_optimum) gap_row("gap", *a.gap_to_optimum, "plan against the exact optimum");
  if (a.dual_bound) {
    if (a.dual_bound->bound) {
      table.add({"duals' bound", amount(*a.dual_bound->bound),
                 std::string(model.objective.sense == model::Sense::minimise ? "no plan costs less" : "no plan earns more") +
                     ": a safe bound from the given duals, computed exactly"});
      if (a.gap_to_bound) gap_row("gap at most", *a.gap_to_bound, "plan against the duals' bound");
    } else {
      table.add({"duals' bound", "none", "the reduced cost of " + a.dual_bound->unbounded_by + " meets an infinite bound"});
    }
    if (a.dual_bound->implied_bounds_used > 0)
      table.add({"", "", detail::count_of(static_cast<std::size_t>(a.dual_bound->implied_bounds_used), "column", "columns") +
                             " bounded through a row, their own bound being infinite"});
    if (!a.dual_bound->rows_zeroed.empty())
      table.add({"", "", detail::count_of(a.dual_bound->rows_zeroed.size(), "dual", "duals") +
                             " of the wrong sign for an infinite side counted as zero"});
  }
  table.write(out);
}

void write_changes(const model::Model& model, const audit::Audit& a, const AuditRequest& request, std::ostream& out) {
  if (!a.optimum || !a.optimum->certified() || a.optimum->solution.outcome != exact::Outcome::optimal) return;
  detail::write_heading(out, "To the exact optimum nearest in support (" +
                                 detail::count_of(a.changes.size(), "column changes", "columns change") +
                                 (request.repaired_path.empty() ? "; --repaired FILE writes it)" : ", written to " + request.repaired_path + ")"));
  if (a.changes.empty()) {
    out << "  nothing: the plan is an exact optimum\n";
    return;
  }
  detail::Table table({detail::Table::Align::left, detail::Table::Align::right, detail::Table::Align::right,
                       detail::Table::Align::right});
  table.add({"column", "plan", "optimum", "change"});
  for (std::size_t k = 0; k < a.changes.size() && k < changes_shown; ++k) {
    const audit::Change& c = a.changes[k];
    const model::Column& column = model.columns[static_cast<std::size_t>(c.column)];
    table.add({column.name, amount(c.from), amount(c.to), amount(c.to - c.from) + (column.label.unit.empty() ? "" : " " + column.label.unit)});
  }
  table.write(out);
  if (a.changes.size() > changes_shown) out << "  ... and " << a.changes.size() - changes_shown << " more\n";
}

}  // namespace

void write_audit_text(const model::Model& model, const audit::Audit& a, const AuditRequest& request, std::ostream& out) {
  out << "model      " << model.source.path << "  (sha256 " << model.source.sha256.substr(0, 16) << "..., "
      << model.row_count() << " rows, " << model.column_count() << " columns)\n";
  out << "plan       " << request.plan_path << "  (" << request.plan_format << ", "
      << model.column_count() - static_cast<int>(a.plan_missing) << " of " << model.column_count() << " columns named"
      << (a.plan_missing ? "; the " + std::to_string(a.plan_missing) + " not named count as zero" : "") << ")\n";
  if (!request.duals_path.empty()) out << "duals      " << request.duals_path << "\n";
  std::vector<std::string> verdict = audit_verdict_lines(model, a, request);
  for (std::size_t k = 0; k < verdict.size(); ++k)
    out << (k == 0 ? "verdict    " : "           ") << verdict[k] << "\n";
  write_findings(model, a, out);
  write_objective(model, a, request, out);
  write_changes(model, a, request, out);
  out << "\ncaution    " << caution_line << "\n";
}

void write_repaired_csv(const model::Model& model, const std::vector<Rational>& x, std::ostream& out) {
  out << "name,value,decimal\n";
  for (std::size_t j = 0; j < x.size(); ++j) {
    numeric::Decimal decimal = numeric::to_decimal(x[j], 17);
    out << model.columns[j].name << ',' << numeric::to_fraction(x[j]) << ',' << (decimal.rounded ? "~" : "") << decimal.text
        << '\n';
  }
}

}  // namespace plumb::present
