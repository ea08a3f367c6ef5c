// plumb audit --json (keys in docs/audit.md): every exact value as a canonical fraction.
#include "format.hpp"
#include "plumb/present/audit.hpp"

namespace plumb::present {
namespace {

using nlohmann::ordered_json;

// An exact value as its canonical fraction text ("-3/2"), as every JSON rendering writes it.
ordered_json exact_json(const numeric::Rational& value) { return numeric::to_fraction(value); }

const char* verdict_key(audit::Verdict verdict) {
  switch (verdict) {
    case audit::Verdict::feasible: return "feasible";
    case audit::Verdict::within_tolerance: return "within_tolerance";
    case audit::Verdict::infeasible: return "infeasible";
  }
  return "unknown";
}

const char* gap_key(audit::GapVerdict verdict) {
  switch (verdict) {
    case audit::GapVerdict::not_asked: return "not_asked";
    case audit::GapVerdict::within: return "within";
    case audit::GapVerdict::outside: return "outside";
    case audit::GapVerdict::unknown: return "unknown";
  }
  return "unknown";
}

ordered_json gap_json(const audit::Gap& gap) { return {{"absolute", exact_json(gap.absolute)}, {"relative", exact_json(gap.relative)}}; }

}  // namespace

ordered_json audit_json(const model::Model& model, const audit::Audit& a, const AuditRequest& request) {
  ordered_json out;
  out["model"] = {{"path", model.source.path}, {"sha256", model.source.sha256}};
  out["plan"] = {{"path", request.plan_path}, {"format", request.plan_format},
                 {"columns_not_named", a.plan_missing}};
  out["tolerance"] = exact_json(request.options.tolerance);
  out["verdict"] = verdict_key(a.verdict);
  ordered_json findings = ordered_json::array();
  for (const audit::Violation& v : a.evaluation.violations) {
    bool row = v.kind == audit::Violation::Kind::row;
    const std::string& name = row ? model.rows[static_cast<std::size_t>(v.index)].name : model.columns[static_cast<std::size_t>(v.index)].name;
    findings.push_back({{"kind", row ? "row" : "column"},
                        {"name", name},
                        {"side", v.side == audit::Violation::Side::lower ? "lower" : "upper"},
                        {"limit", exact_json(v.limit)},
                        {"value", exact_json(v.value)},
                        {"amount", exact_json(v.amount)},
                        {"relative", exact_json(v.relative)}});
  }
  out["findings"] = std::move(findings);
  ordered_json hard = ordered_json::array();
  for (std::size_t k : a.hard_crossed) hard.push_back(k);
  out["hard_crossed"] = std::move(hard);  // indices into findings
  out["objective"] = exact_json(a.evaluation.objective);
  if (request.options.claimed_objective) out["claimed_objective"] = exact_json(*request.options.claimed_objective);
  if (a.optimum) {
    const exact::Solution& s = a.optimum->solution;
    ordered_json optimum = {{"certified", a.optimum->certified()}};
    switch (s.outcome) {
      case exact::Outcome::optimal: optimum["status"] = "optimal"; break;
      case exact::Outcome::infeasible: optimum["status"] = "infeasible"; break;
      case exact::Outcome::unbounded: optimum["status"] = "unbounded"; break;
      case exact::Outcome::stopped: optimum["status"] = "stopped"; break;
    }
    if (s.outcome == exact::Outcome::optimal) optimum["objective"] = exact_json(s.objective);
    optimum["start_basics"] = a.start_basics;
    optimum["warm_start"] = a.optimum_from_warm_start;
    optimum["exact_iterations"] = s.stats.exact_iterations;
    out["optimum"] = std::move(optimum);
  }
  if (a.gap_to_optimum) out["gap"] = gap_json(*a.gap_to_optimum);
  if (a.dual_bound) {
    out["dual_bound"] = a.dual_bound->bound ? exact_json(*a.dual_bound->bound) : ordered_json(nullptr);
    if (!a.dual_bound->unbounded_by.empty()) out["dual_bound_unbounded_by"] = a.dual_bound->unbounded_by;
    out["duals_zeroed"] = a.dual_bound->rows_zeroed.size();
    out["implied_bounds_used"] = a.dual_bound->implied_bounds_used;
    if (a.gap_to_bound) out["gap_at_most"] = gap_json(*a.gap_to_bound);
  }
  if (request.options.gap) out["gap_allowed"] = exact_json(*request.options.gap);
  out["gap_verdict"] = gap_key(a.gap_verdict);
  ordered_json changes = ordered_json::array();
  for (const audit::Change& c : a.changes)
    changes.push_back({{"name", model.columns[static_cast<std::size_t>(c.column)].name},
                       {"plan", exact_json(c.from)},
                       {"optimum", exact_json(c.to)}});
  out["changes"] = std::move(changes);
  if (!request.repaired_path.empty()) out["repaired"] = request.repaired_path;
  out["seconds"] = {{"evaluate", a.evaluate_seconds}, {"dual_bound", a.bound_seconds}, {"optimum", a.optimum_seconds}};
  out["caution"] = caution_line;
  return out;
}

}  // namespace plumb::present
