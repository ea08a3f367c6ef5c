#include "plumb/health/health.hpp"

#include "duplicates.hpp"
#include "plumb/model/read.hpp"

#include <algorithm>

namespace plumb::health {
namespace {

using model::Model;
using model::Side;

constexpr int no_index = -1;
enum class SideOf { none, lower, upper, both };

// Where a number sits, as indices; turned into names only for the few places a report shows.
struct Site {
  NumberKind kind;
  int row = no_index;
  int column = no_index;
  SideOf side = SideOf::none;
};

Place place_of(const Model& model, const Site& site) {
  static const char* side_names[] = {"", "lower", "upper", "both"};
  Place place;
  if (site.row != no_index) place.row = model.rows[site.row].name;
  if (site.column != no_index) place.column = model.columns[site.column].name;
  place.side = side_names[static_cast<int>(site.side)];
  return place;
}

// Calls visit(site, value) for every non-zero finite number of the model: matrix entries,
// objective coefficients, row sides and bounds.  A side or bound pair that coincides
// (an equation, a fixed column) is one number, visited once as "both".
template <class Visit>
void for_each_number(const Model& model, Visit&& visit) {
  for (int j = 0; j < model.column_count(); ++j) {
    auto rows = model.matrix.column_rows(j);
    auto values = model.matrix.column_values(j);
    for (std::size_t k = 0; k < rows.size(); ++k) visit(Site{NumberKind::matrix, rows[k], j}, values[k]);
  }
  for (int j = 0; j < model.column_count(); ++j)
    if (model.objective.coefficients[j] != 0) visit(Site{NumberKind::objective, no_index, j}, model.objective.coefficients[j]);
  auto visit_pair = [&](NumberKind kind, int row, int column, const Side& lower, const Side& upper) {
    if (lower && upper && *lower == *upper) {
      if (*lower != 0) visit(Site{kind, row, column, SideOf::both}, *lower);
      return;
    }
    if (lower && *lower != 0) visit(Site{kind, row, column, SideOf::lower}, *lower);
    if (upper && *upper != 0) visit(Site{kind, row, column, SideOf::upper}, *upper);
  };
  for (int i = 0; i < model.row_count(); ++i)
    visit_pair(NumberKind::row_side, i, no_index, model.rows[i].lower, model.rows[i].upper);
  for (int j = 0; j < model.column_count(); ++j)
    visit_pair(NumberKind::bound, no_index, j, model.columns[j].lower, model.columns[j].upper);
}

std::size_t index(NumberKind kind) { return static_cast<std::size_t>(kind); }

void measure_ranges(const Model& model, HealthReport& report) {
  std::array<std::vector<Rational>, number_kind_count> magnitudes;
  std::array<Site, number_kind_count> smallest_at{}, largest_at{};
  for_each_number(model, [&](const Site& site, const Rational& value) {
    Range& range = report.ranges[index(site.kind)];
    Rational magnitude = abs(value);
    if (range.count == 0 || magnitude < range.smallest) range.smallest = magnitude, smallest_at[index(site.kind)] = site;
    if (range.count == 0 || magnitude > range.largest) range.largest = magnitude, largest_at[index(site.kind)] = site;
    ++range.count;
    magnitudes[index(site.kind)].push_back(std::move(magnitude));
  });
  for (std::size_t k = 0; k < number_kind_count; ++k) {
    Range& range = report.ranges[k];
    if (range.count == 0) continue;
    range.smallest_at = place_of(model, smallest_at[k]);
    range.largest_at = place_of(model, largest_at[k]);
    auto& values = magnitudes[k];
    auto middle = values.begin() + static_cast<std::ptrdiff_t>((values.size() - 1) / 2);
    std::nth_element(values.begin(), middle, values.end());
    range.median = *middle;
  }
}

// The documented big-M rule: see rules:: in the header and docs/inspect.md.
void find_big_numbers(const Model& model, HealthReport& report) {
  std::array<Rational, number_kind_count> relative_threshold;
  for (std::size_t k = 0; k < number_kind_count; ++k)
    relative_threshold[k] = rules::big_m_relative * report.ranges[k].median;
  for_each_number(model, [&](const Site& site, const Rational& value) {
    Rational magnitude = abs(value);
    bool absolute = magnitude >= rules::big_m_absolute;
    if (absolute || magnitude >= relative_threshold[index(site.kind)])
      report.big_numbers.push_back(BigNumber{site.kind, place_of(model, site), value, absolute});
  });
}

bool contains_zero(const Side& lower, const Side& upper) {
  return (!lower || *lower <= 0) && (!upper || *upper >= 0);
}

// An empty column with cost c moves the objective without limit when c improves it in a
// direction the column's bounds leave open.
bool improves_without_end(const Model& model, int j) {
  const Rational& cost = model.objective.coefficients[j];
  if (cost == 0) return false;
  bool increase_improves = (cost < 0) == (model.objective.sense == model::Sense::minimise);
  return increase_improves ? !model.columns[j].upper : !model.columns[j].lower;
}

void examine_rows(const Model& model, HealthReport& report) {
  for (int i = 0; i < model.row_count(); ++i) {
    const model::Row& row = model.rows[i];
    RowKind kind = classify_row(row.lower, row.upper);
    ++report.row_kinds[static_cast<std::size_t>(kind)];
    if (kind == RowKind::free) report.free_rows.push_back(row.name);
    if (kind == RowKind::crossed) report.crossed_rows.push_back(row.name);
    if (!row.label.statement.empty()) ++report.labels.rows_with_statement;
    if (kind != RowKind::free && row.label.source.empty()) ++report.labels.rows_without_source;
    if (!row.label.decision.empty()) ++report.labels.decisions;
    auto columns = model.matrix.row_columns(i);
    if (columns.empty()) {
      report.empty_rows.push_back(row.name);
      if (kind != RowKind::crossed && !contains_zero(row.lower, row.upper)) report.infeasible_empty_rows.push_back(row.name);
    } else if (columns.size() == 1) {
      const Rational& a = model.matrix.value(model.matrix.row_positions(i)[0]);
      auto divide = [&](const Side& side) { return side ? Side(Rational(*side / a)) : Side(); };
      SingletonRow singleton{row.name, model.columns[columns[0]].name, a, divide(row.lower), divide(row.upper)};
      if (a < 0) std::swap(singleton.implied_lower, singleton.implied_upper);
      report.singleton_rows.push_back(std::move(singleton));
    }
  }
}

void examine_columns(const Model& model, HealthReport& report) {
  for (int j = 0; j < model.column_count(); ++j) {
    const model::Column& column = model.columns[j];
    BoundKind kind = classify_bounds(column.lower, column.upper);
    ++report.bound_kinds[static_cast<std::size_t>(kind)];
    if (kind == BoundKind::crossed) report.crossed_columns.push_back(column.name);
    if (column.integer) ++report.integer_columns;
    if (!column.label.statement.empty()) ++report.labels.columns_with_statement;
    if (!column.lower_label.statement.empty()) ++report.labels.bounds_with_statement;
    if (!column.upper_label.statement.empty()) ++report.labels.bounds_with_statement;
    // A bound without a label of its own speaks through its variable's label.
    auto source_of = [&](const model::Label& own) { return (own.empty() ? column.label : own).source; };
    if (column.lower && *column.lower != 0 && source_of(column.lower_label).empty()) ++report.labels.bounds_without_source;
    if (column.upper && source_of(column.upper_label).empty()) ++report.labels.bounds_without_source;
    for (const model::Label* label : {&column.label, &column.lower_label, &column.upper_label})
      if (!label->decision.empty()) ++report.labels.decisions;
    if (model.objective.coefficients[j] != 0) ++report.objective_nonzeros;
    if (model.matrix.column_rows(j).empty()) {
      report.empty_columns.push_back(column.name);
      if (improves_without_end(model, j)) report.unbounded_empty_columns.push_back(column.name);
    }
  }
}

std::vector<std::vector<std::string>> names_of(const std::vector<std::vector<int>>& groups,
                                               const auto& items) {
  std::vector<std::vector<std::string>> named;
  named.reserve(groups.size());
  for (const auto& group : groups) {
    auto& names = named.emplace_back();
    for (int k : group) names.push_back(items[k].name);
  }
  return named;
}

void collect_findings(HealthReport& report) {
  auto add = [&](Severity severity, std::string code, std::size_t count) {
    if (count > 0) report.findings.push_back(Finding{severity, std::move(code), count});
  };
  add(Severity::error, "crossed-rows", report.crossed_rows.size());
  add(Severity::error, "crossed-columns", report.crossed_columns.size());
  add(Severity::error, "infeasible-empty-rows", report.infeasible_empty_rows.size());
  if (auto note = model::sense_comment_note(report.source, report.sense)) {
    report.sense_comment = note->text;
    add(note->warn ? Severity::warning : Severity::note, "sense-comment", 1);
  }
  add(Severity::warning, "unbounded-empty-columns", report.unbounded_empty_columns.size());
  add(Severity::warning, "duplicate-rows", report.duplicate_rows.size());
  add(Severity::warning, "duplicate-columns", report.duplicate_columns.size());
  add(Severity::warning, "big-numbers", report.big_numbers.size());
  for (std::size_t k = 0; k < number_kind_count; ++k)
    if (report.ranges[k].wide()) add(Severity::warning, "wide-range-" + to_string(static_cast<NumberKind>(k)), 1);
  add(Severity::note, "empty-rows", report.empty_rows.size());
  add(Severity::note, "empty-columns", report.empty_columns.size());
  add(Severity::note, "singleton-rows", report.singleton_rows.size());
  add(Severity::note, "free-rows", report.free_rows.size());
  add(Severity::note, "integer-columns", static_cast<std::size_t>(report.integer_columns));
}

}  // namespace

std::string to_string(RowKind kind) {
  switch (kind) {
    case RowKind::equal: return "equal";
    case RowKind::at_most: return "at-most";
    case RowKind::at_least: return "at-least";
    case RowKind::ranged: return "ranged";
    case RowKind::free: return "free";
    case RowKind::crossed: return "crossed";
  }
  return "unknown";
}

std::string to_string(BoundKind kind) {
  switch (kind) {
    case BoundKind::non_negative: return "non-negative";
    case BoundKind::non_positive: return "non-positive";
    case BoundKind::lower_only: return "lower-only";
    case BoundKind::upper_only: return "upper-only";
    case BoundKind::boxed: return "boxed";
    case BoundKind::fixed: return "fixed";
    case BoundKind::free: return "free";
    case BoundKind::crossed: return "crossed";
  }
  return "unknown";
}

std::string to_string(NumberKind kind) {
  switch (kind) {
    case NumberKind::matrix: return "matrix";
    case NumberKind::objective: return "objective";
    case NumberKind::row_side: return "row-sides";
    case NumberKind::bound: return "bounds";
  }
  return "unknown";
}

std::string to_string(Severity severity) {
  switch (severity) {
    case Severity::error: return "error";
    case Severity::warning: return "warning";
    case Severity::note: return "note";
  }
  return "unknown";
}

RowKind classify_row(const Side& lower, const Side& upper) {
  if (lower && upper) return *lower == *upper ? RowKind::equal : *lower < *upper ? RowKind::ranged : RowKind::crossed;
  if (upper) return RowKind::at_most;
  if (lower) return RowKind::at_least;
  return RowKind::free;
}

BoundKind classify_bounds(const Side& lower, const Side& upper) {
  if (lower && upper) return *lower == *upper ? BoundKind::fixed : *lower < *upper ? BoundKind::boxed : BoundKind::crossed;
  if (lower) return *lower == 0 ? BoundKind::non_negative : BoundKind::lower_only;
  if (upper) return *upper == 0 ? BoundKind::non_positive : BoundKind::upper_only;
  return BoundKind::free;
}

HealthReport inspect(const Model& model) {
  HealthReport report;
  report.title = model.title;
  report.source = model.source;
  report.objective_name = model.objective.name;
  report.sense = model.objective.sense;
  report.objective_constant = model.objective.constant;
  report.rows = model.row_count();
  report.columns = model.column_count();
  report.nonzeros = model.matrix.nonzeros();
  if (report.rows > 0 && report.columns > 0)
    report.density = Rational(static_cast<long>(report.nonzeros)) / (Rational(report.rows) * report.columns);
  report.labels.objective_has_statement = !model.objective.label.statement.empty();
  report.labels.decisions += static_cast<int>(model.decisions.size()) + (model.objective.label.decision.empty() ? 0 : 1);
  examine_rows(model, report);
  examine_columns(model, report);
  measure_ranges(model, report);
  find_big_numbers(model, report);
  report.duplicate_rows = names_of(detail::duplicate_rows(model), model.rows);
  report.duplicate_columns = names_of(detail::duplicate_columns(model), model.columns);
  collect_findings(report);
  return report;
}

}  // namespace plumb::health
