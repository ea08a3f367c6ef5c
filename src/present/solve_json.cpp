// The machine-readable result of plumb solve: every value in full, and the run's figures.
#include "format.hpp"
#include "plumb/present/solve.hpp"

#include <cmath>

namespace plumb::present {
namespace {

using detail::put_number;
using numeric::Rational;

nlohmann::ordered_json named(const certificate::NamedValues& values) {
  nlohmann::ordered_json list = nlohmann::ordered_json::array();
  for (const auto& [name, value] : values) {
    nlohmann::ordered_json item;
    item["name"] = name;
    put_number(item, value);
    list.push_back(std::move(item));
  }
  return list;
}

// Seconds to the millisecond: figures, not measurements to the nanosecond.
// Microseconds: many Netlib solves take a millisecond or two, and the benchmark's ratios need
// more than one digit of them.
double to_microseconds(double seconds) { return std::round(seconds * 1e6) / 1e6; }

}  // namespace

nlohmann::ordered_json solve_json(const model::Model& model, const exact::CertifiedSolution& result,
                                  const RunFigures& figures) {
  const exact::Solution& s = result.solution;
  const certificate::Certificate& proof = result.certificate;
  nlohmann::ordered_json out;
  out["model"] = {{"file", model.source.path},
                  {"sha256", model.source.sha256},
                  {"rows", model.row_count()},
                  {"columns", model.column_count()},
                  {"nonzeros", model.matrix.nonzeros()},
                  {"integer_columns", detail::integer_columns(model)}};
  if (s.outcome == exact::Outcome::stopped) {
    out["status"] = "stopped";
    out["stopped_because"] = run::describe(s.stop_reason);
    out["stopped_during"] = s.stats.phase;
  } else {
    out["status"] = certificate::to_string(proof.status);
  }
  if (s.outcome == exact::Outcome::optimal) {
    put_number(out["objective"], s.objective);
    put_number(out["objective_constant"], model.objective.constant);
    out["objective_constant_rule"] = detail::constant_rule_text(model.source);
    out["x"] = named(proof.x);
    out["y"] = named(proof.y);
  } else if (s.outcome == exact::Outcome::infeasible) {
    if (proof.farkas.empty()) {
      out["farkas_y"] = named(proof.y);
    } else {
      nlohmann::ordered_json terms = nlohmann::ordered_json::array();
      for (const certificate::FarkasTerm& t : proof.farkas)
        terms.push_back({{"kind", certificate::to_string(t.entry.kind)},
                         {"name", t.entry.name},
                         {"side", certificate::to_string(t.entry.limit)},
                         {"multiplier", numeric::to_fraction(t.multiplier)}});
      out["farkas"] = std::move(terms);
    }
  } else if (s.outcome == exact::Outcome::unbounded) {
    out["x"] = named(proof.x);
    out["ray"] = named(proof.ray);
  }
  out["checked"] = result.verdict.valid;
  out["proven"] = result.verdict.proven;
  const exact::SolveStats& stats = s.stats;
  out["stats"] = {{"float_seconds", to_microseconds(stats.float_seconds)},
                  {"certify_seconds", to_microseconds(stats.certify_seconds)},
                  {"exact_seconds", to_microseconds(stats.exact_seconds)},
                  {"solve_seconds", to_microseconds(figures.solve_seconds)},
                  {"float_iterations", stats.float_iterations},
                  {"exact_iterations", stats.exact_iterations},
                  {"correction_rounds", stats.correction_rounds},
                  {"correction_iterations", stats.correction_iterations},
                  {"approximate_corrections", stats.approximate_corrections},
                  {"repaired", stats.repaired},
                  {"fell_back", stats.fell_back},
                  {"zero_cost_search", stats.zero_cost_search},
                  {"auxiliary_iterations", stats.auxiliary_iterations},
                  {"proof", stats.proof},
                  {"peak_memory_mib", std::round(figures.peak_memory_mib * 10) / 10}};
  if (!stats.float_note.empty()) out["stats"]["float_note"] = stats.float_note;
  out["caution"] = caution_line;
  return out;
}

}  // namespace plumb::present
