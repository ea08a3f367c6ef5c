// The readable model-health report.  Layout: an identity block, what needs attention, then one
// section per aspect; docs/inspect.md shows an example.
#include "format.hpp"
#include "plumb/present/health.hpp"

#include <ostream>

namespace plumb::present::detail {

using health::HealthReport;
using health::rules::names_shown;

std::string group_list(const std::vector<std::vector<std::string>>& groups) {
  std::vector<std::string> shown;
  for (const auto& group : groups) shown.push_back("{" + name_list(group, names_shown) + "}");
  return name_list(shown, names_shown);
}

// One line per finding: what it means, then where.
std::string finding_text(const health::Finding& finding, const HealthReport& r) {
  const std::string& code = finding.code;
  std::size_t n = finding.count;
  if (code == "sense-comment") return "objective sense: " + r.sense_comment;
  if (code == "crossed-rows")
    return count_of(n, "row has", "rows have") + " lower side above upper side: INFEASIBLE AS WRITTEN (" +
           name_list(r.crossed_rows, names_shown) + ")";
  if (code == "crossed-columns")
    return count_of(n, "column has", "columns have") + " lower bound above upper bound: INFEASIBLE AS WRITTEN (" +
           name_list(r.crossed_columns, names_shown) + ")";
  if (code == "infeasible-empty-rows")
    return count_of(n, "empty row excludes", "empty rows exclude") + " zero: INFEASIBLE AS WRITTEN (" +
           name_list(r.infeasible_empty_rows, names_shown) + ")";
  if (code == "unbounded-empty-columns")
    return count_of(n, "empty column improves", "empty columns improve") +
           " the objective without limit: unbounded if the rest is feasible (" +
           name_list(r.unbounded_empty_columns, names_shown) + ")";
  if (code == "duplicate-rows")
    return count_of(n, "group", "groups") + " of identical rows " + group_list(r.duplicate_rows);
  if (code == "duplicate-columns")
    return count_of(n, "group", "groups") + " of identical columns " + group_list(r.duplicate_columns);
  if (code == "big-numbers") return count_of(n, "number looks", "numbers look") + " like a big-M (see Numbers)";
  if (code.starts_with("wide-range-")) return "wide range of " + code.substr(11) + " magnitudes (see Numbers)";
  if (code == "empty-rows") return count_of(n, "empty row", "empty rows") + " (" + name_list(r.empty_rows, names_shown) + ")";
  if (code == "empty-columns")
    return count_of(n, "empty column", "empty columns") + " (" + name_list(r.empty_columns, names_shown) + ")";
  if (code == "singleton-rows") return count_of(n, "row is", "rows are") + " a bound written as a row (see Structure)";
  if (code == "free-rows")
    return count_of(n, "row has", "rows have") + " no finite side (" + name_list(r.free_rows, names_shown) + ")";
  if (code == "integer-columns")
    return count_of(n, "column is", "columns are") + " marked integer; plumb analyses the LP relaxation";
  return code + ": " + std::to_string(n);
}

}  // namespace plumb::present::detail

namespace plumb::present {

namespace {

using detail::count_of;
using detail::group_list;
using numeric::exact_and_decimal;
using detail::name_list;
using detail::Table;
using health::HealthReport;
using health::NumberKind;
using health::rules::names_shown;

std::string format_name(const std::string& format) {
  if (format == "mps-fixed") return "MPS, fixed form";
  if (format == "mps-free") return "MPS, free form";
  if (format == "plumb") return "plumb native";
  if (format == "built") return "built in code";
  return format.empty() ? "unknown" : format;
}

std::string place_text(NumberKind kind, const health::Place& at) {
  switch (kind) {
    case NumberKind::matrix: return "row " + at.row + ", column " + at.column;
    case NumberKind::objective: return "cost of " + at.column;
    case NumberKind::row_side:
      return "row " + at.row + (at.side == "both" ? ", both sides" : ", " + at.side + " side");
    case NumberKind::bound:
      return "column " + at.column + (at.side == "both" ? ", fixed value" : ", " + at.side + " bound");
  }
  return {};
}


void write_identity(const HealthReport& r, std::ostream& out) {
  out << "Model health: " << (r.title.empty() ? "(untitled)" : r.title) << "\n";
  Table table;
  table.add({"file", r.source.path.empty() ? "(none)" : r.source.path});
  table.add({"format", format_name(r.source.format)});
  table.add({"sha-256", r.source.sha256.empty() ? "(none)" : r.source.sha256});
  table.add({"labels", r.source.labels_path.empty() ? "none" : r.source.labels_path});
  table.add({"objective", std::string(r.sense == model::Sense::minimise ? "minimise " : "maximise ") + r.objective_name});
  table.add({"constant", exact_and_decimal(r.objective_constant) + ", " + detail::constant_rule_text(r.source)});
  table.write(out);
}

void write_attention(const HealthReport& r, std::ostream& out) {
  detail::write_heading(out, "Attention");
  if (r.findings.empty()) {
    out << "  nothing stands out\n";
    return;
  }
  Table table;
  for (const auto& finding : r.findings)
    table.add({finding.severity == health::Severity::error ? "ERROR" : to_string(finding.severity), detail::finding_text(finding, r)});
  table.write(out);
}

void write_size(const HealthReport& r, std::ostream& out) {
  detail::write_heading(out, "Size");
  Table table({Table::Align::left, Table::Align::right});
  table.add({"rows", std::to_string(r.rows)});
  table.add({"columns", std::to_string(r.columns)});
  table.add({"nonzeros", std::to_string(r.nonzeros), "density " + detail::percent(r.density)});
  table.add({"costs", std::to_string(r.objective_nonzeros), "non-zero objective coefficients"});
  table.write(out);

  detail::write_heading(out, "Rows by their sides");
  Table rows({Table::Align::left, Table::Align::right});
  static const char* row_forms[] = {"L = a.x = U", "a.x <= U", "a.x >= L", "L <= a.x <= U", "no finite side",
                                    "L > U, no point satisfies it"};
  for (std::size_t k = 0; k < health::row_kind_count; ++k)
    rows.add({to_string(static_cast<health::RowKind>(k)), std::to_string(r.row_kinds[k]), row_forms[k]});
  rows.write(out);

  detail::write_heading(out, "Columns by their bounds");
  Table columns({Table::Align::left, Table::Align::right});
  static const char* bound_forms[] = {"[0, +inf), the default", "(-inf, 0]", "[l, +inf), l not 0", "(-inf, u], u not 0",
                                      "[l, u]", "l = u", "(-inf, +inf)", "l > u, no value fits"};
  for (std::size_t k = 0; k < health::bound_kind_count; ++k)
    columns.add({to_string(static_cast<health::BoundKind>(k)), std::to_string(r.bound_kinds[k]), bound_forms[k]});
  columns.add({"integer", std::to_string(r.integer_columns), "marked integer; plumb analyses the LP relaxation"});
  columns.write(out);
}

void write_numbers(const HealthReport& r, std::ostream& out) {
  detail::write_heading(out, "Numbers (non-zero magnitudes; infinite sides left out)");
  Table table({Table::Align::left, Table::Align::right});
  table.add({"kind", "count", "smallest", "largest", "ratio", ""});
  Table where;
  for (std::size_t k = 0; k < health::number_kind_count; ++k) {
    const health::Range& range = r.ranges[k];
    auto kind = static_cast<NumberKind>(k);
    if (range.count == 0) {
      table.add({to_string(kind), "0", "-", "-", "-", ""});
      continue;
    }
    table.add({to_string(kind), std::to_string(range.count), exact_and_decimal(range.smallest),
               exact_and_decimal(range.largest), detail::scientific(range.ratio()), range.wide() ? "WIDE" : ""});
    where.add({to_string(kind), "smallest at " + place_text(kind, range.smallest_at) + ";",
               "largest at " + place_text(kind, range.largest_at)});
  }
  table.write(out);
  where.write(out);
  out << "  A range is wide when largest / smallest reaches " << detail::scientific(health::rules::wide_range_ratio)
      << ".\n";
  if (r.big_numbers.empty()) return;
  out << "  " << count_of(r.big_numbers.size(), "number looks", "numbers look") << " like a big-M (|v| >= "
      << detail::scientific(health::rules::big_m_absolute) << ", or >= "
      << detail::scientific(health::rules::big_m_relative) << " x the median magnitude of its kind):\n";
  Table big({Table::Align::right});
  for (std::size_t k = 0; k < r.big_numbers.size() && k < names_shown; ++k) {
    const health::BigNumber& b = r.big_numbers[k];
    big.add({exact_and_decimal(b.value), place_text(b.kind, b.at),
             b.absolute ? "absolute" : "median " + exact_and_decimal(r.range(b.kind).median)});
  }
  big.write(out, "    ");
  if (r.big_numbers.size() > names_shown) out << "    and " << r.big_numbers.size() - names_shown << " more\n";
}

void write_structure(const HealthReport& r, std::ostream& out) {
  detail::write_heading(out, "Structure");
  Table table({Table::Align::left, Table::Align::right});
  table.add({"empty rows", std::to_string(r.empty_rows.size()), name_list(r.empty_rows, names_shown)});
  table.add({"empty columns", std::to_string(r.empty_columns.size()), name_list(r.empty_columns, names_shown)});
  table.add({"free rows", std::to_string(r.free_rows.size()), name_list(r.free_rows, names_shown)});
  table.add({"singleton rows", std::to_string(r.singleton_rows.size()), ""});
  table.add({"duplicate rows", std::to_string(r.duplicate_rows.size()), group_list(r.duplicate_rows)});
  table.add({"duplicate columns", std::to_string(r.duplicate_columns.size()), group_list(r.duplicate_columns)});
  table.write(out);
  if (r.singleton_rows.empty()) return;
  out << "  Singleton rows bound one column each:\n";
  Table singletons;
  for (std::size_t k = 0; k < r.singleton_rows.size() && k < names_shown; ++k) {
    const health::SingletonRow& s = r.singleton_rows[k];
    singletons.add({s.row, detail::side_text(s.implied_lower, true) + " <= " + s.column + " <= " +
                               detail::side_text(s.implied_upper, false)});
  }
  singletons.write(out, "    ");
  if (r.singleton_rows.size() > names_shown) out << "    and " << r.singleton_rows.size() - names_shown << " more\n";
}

void write_labels(const HealthReport& r, std::ostream& out) {
  detail::write_heading(out, "Labels (plain-language statements)");
  Table table({Table::Align::left, Table::Align::right});
  table.add({"rows", std::to_string(r.labels.rows_with_statement), "of " + std::to_string(r.rows)});
  table.add({"columns", std::to_string(r.labels.columns_with_statement), "of " + std::to_string(r.columns)});
  table.add({"bounds", std::to_string(r.labels.bounds_with_statement), "lower or upper bounds with their own statement"});
  table.add({"objective", r.labels.objective_has_statement ? "yes" : "no"});
  table.add({"rows without a source", std::to_string(r.labels.rows_without_source),
             "requirements with no recorded document, contract or measurement"});
  table.add({"bounds without a source", std::to_string(r.labels.bounds_without_source),
             "finite bounds other than the default 0, likewise"});
  table.add({"decisions", std::to_string(r.labels.decisions), "recorded decisions and assumptions"});
  table.write(out);
}

}  // namespace

void write_health_text(const HealthReport& report, std::ostream& out) {
  write_identity(report, out);
  write_attention(report, out);
  write_size(report, out);
  write_numbers(report, out);
  write_structure(report, out);
  write_labels(report, out);
  out << "\n" << caution_line << "\n";
}

}  // namespace plumb::present

