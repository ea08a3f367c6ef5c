// The model-health report as JSON; the keys are documented in docs/inspect.md.
#include "format.hpp"
#include "plumb/present/health.hpp"

#include <ostream>

namespace plumb::present {
namespace {

using detail::exact_json;
using detail::side_json;
using health::HealthReport;
using nlohmann::json;

json place_json(const health::Place& at) {
  json place = json::object();
  if (!at.row.empty()) place["row"] = at.row;
  if (!at.column.empty()) place["column"] = at.column;
  if (!at.side.empty()) place["side"] = at.side;
  return place;
}

json range_json(const health::Range& range) {
  json out = {{"count", range.count}};
  if (range.count == 0) return out;
  out["smallest"] = exact_json(range.smallest);
  out["smallest_at"] = place_json(range.smallest_at);
  out["largest"] = exact_json(range.largest);
  out["largest_at"] = place_json(range.largest_at);
  out["median"] = exact_json(range.median);
  out["ratio"] = exact_json(range.ratio());
  out["ratio_decimal"] = detail::scientific(range.ratio());
  out["wide"] = range.wide();
  return out;
}

template <class Kind, std::size_t N>
json counts_json(const std::array<int, N>& counts) {
  json out = json::object();
  for (std::size_t k = 0; k < N; ++k) out[to_string(static_cast<Kind>(k))] = counts[k];
  return out;
}

}  // namespace

json health_json(const HealthReport& r) {
  json out;
  out["report"] = "model-health";
  out["version"] = 1;
  out["model"] = {
      {"title", r.title},
      {"file", r.source.path},
      {"format", r.source.format},
      {"sha256", r.source.sha256},
      {"labels_file", r.source.labels_path.empty() ? json(nullptr) : json(r.source.labels_path)},
  };
  out["objective"] = {
      {"name", r.objective_name},
      {"sense", r.sense == model::Sense::minimise ? "minimise" : "maximise"},
      {"constant", exact_json(r.objective_constant)},
      {"constant_rule", r.source.constant_rule == model::ObjectiveConstantRule::negated_rhs ? "negated-rhs" : "ignored"},
      {"nonzeros", r.objective_nonzeros},
  };
  out["size"] = {
      {"rows", r.rows},
      {"columns", r.columns},
      {"nonzeros", r.nonzeros},
      {"density", exact_json(r.density)},
      {"density_decimal", numeric::to_decimal(r.density, 6).text},
  };
  out["row_kinds"] = counts_json<health::RowKind>(r.row_kinds);
  out["bound_kinds"] = counts_json<health::BoundKind>(r.bound_kinds);
  out["integer_columns"] = r.integer_columns;
  json ranges = json::object();
  for (std::size_t k = 0; k < health::number_kind_count; ++k)
    ranges[to_string(static_cast<health::NumberKind>(k))] = range_json(r.ranges[k]);
  out["ranges"] = ranges;
  json big = json::array();
  for (const auto& b : r.big_numbers) {
    json entry = place_json(b.at);
    entry["kind"] = to_string(b.kind);
    entry["value"] = exact_json(b.value);
    entry["absolute"] = b.absolute;
    big.push_back(entry);
  }
  out["big_numbers"] = big;
  out["empty_rows"] = r.empty_rows;
  out["infeasible_empty_rows"] = r.infeasible_empty_rows;
  out["empty_columns"] = r.empty_columns;
  out["unbounded_empty_columns"] = r.unbounded_empty_columns;
  out["free_rows"] = r.free_rows;
  out["crossed_rows"] = r.crossed_rows;
  out["crossed_columns"] = r.crossed_columns;
  json singletons = json::array();
  for (const auto& s : r.singleton_rows)
    singletons.push_back({{"row", s.row},
                          {"column", s.column},
                          {"coefficient", exact_json(s.coefficient)},
                          {"implied_lower", side_json(s.implied_lower)},
                          {"implied_upper", side_json(s.implied_upper)}});
  out["singleton_rows"] = singletons;
  out["duplicate_rows"] = r.duplicate_rows;
  out["duplicate_columns"] = r.duplicate_columns;
  out["labels"] = {
      {"rows_with_statement", r.labels.rows_with_statement},
      {"columns_with_statement", r.labels.columns_with_statement},
      {"bounds_with_statement", r.labels.bounds_with_statement},
      {"objective_has_statement", r.labels.objective_has_statement},
      {"rows_without_source", r.labels.rows_without_source},
      {"bounds_without_source", r.labels.bounds_without_source},
      {"decisions", r.labels.decisions},
  };
  json findings = json::array();
  for (const auto& f : r.findings)
    findings.push_back({{"severity", to_string(f.severity)}, {"code", f.code}, {"count", f.count}});
  out["findings"] = findings;
  if (!r.sense_comment.empty()) out["sense_comment"] = r.sense_comment;
  out["caution"] = caution_line;
  return out;
}

void write_health_json(const HealthReport& report, std::ostream& out) { 
  // Names come from the user's files and may not be UTF-8: replace bad bytes rather than fail.
  out << health_json(report).dump(2, ' ', false, nlohmann::json::error_handler_t::replace) << "\n";
 }

}  // namespace plumb::present
