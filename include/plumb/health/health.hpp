// Model health: an exact, solver-free look at a model's structure and numbers before anything is solved.
#pragma once

#include "plumb/model/model.hpp"

#include <array>
#include <cstddef>
#include <optional>
#include <string>
#include <vector>

namespace plumb::health {

using numeric::Rational;

// The thresholds the analysis uses; docs/inspect.md explains each.
namespace rules {
// A range whose largest / smallest magnitude reaches this ratio is called wide.
inline const Rational wide_range_ratio{1000000};
// A number looks like a big-M when |v| >= big_m_relative * (median magnitude of its kind) ...
inline const Rational big_m_relative{1000000};
// ... or when |v| >= big_m_absolute whatever the scale.
inline const Rational big_m_absolute{10000000000LL};
// How many names a list in the text report shows before "and N more".
constexpr std::size_t names_shown = 5;
}  // namespace rules

// How a row's two sides read: lower <= a.x <= upper.
enum class RowKind { equal, at_most, at_least, ranged, free, crossed };
constexpr std::size_t row_kind_count = 6;
std::string to_string(RowKind kind);
RowKind classify_row(const model::Side& lower, const model::Side& upper);

// How a column's bounds read; non_negative is MPS's default [0, +inf).
enum class BoundKind { non_negative, non_positive, lower_only, upper_only, boxed, fixed, free, crossed };
constexpr std::size_t bound_kind_count = 8;
std::string to_string(BoundKind kind);
BoundKind classify_bounds(const model::Side& lower, const model::Side& upper);

// The four kinds of number a model holds, each with its own scale.
enum class NumberKind { matrix, objective, row_side, bound };
constexpr std::size_t number_kind_count = 4;
std::string to_string(NumberKind kind);

// Where a number sits: a matrix entry names both row and column; a side or bound names which one.
struct Place {
  std::string row;     // empty for objective coefficients and bounds
  std::string column;  // empty for row sides
  std::string side;    // "lower", "upper", or "both" where the two coincide; empty for coefficients
  bool operator==(const Place&) const = default;
};

// Smallest and largest non-zero magnitude among the numbers of one kind (infinite sides left out).
struct Range {
  std::size_t count = 0;  // non-zero finite numbers seen
  Rational smallest = 0;  // magnitudes; meaningful when count > 0
  Rational largest = 0;
  Place smallest_at;
  Place largest_at;
  Rational median = 0;    // median magnitude (the lower middle one for an even count)
  Rational ratio() const { return count == 0 ? Rational(1) : Rational(largest / smallest); }
  bool wide() const { return count > 0 && ratio() >= rules::wide_range_ratio; }
};

// A row with one entry: a bound on its column written as a row.
struct SingletonRow {
  std::string row;
  std::string column;
  Rational coefficient;
  model::Side implied_lower;  // the bound on the column the row's sides imply
  model::Side implied_upper;
};

struct BigNumber {
  NumberKind kind;
  Place at;
  Rational value;     // as written, with its sign
  bool absolute;      // true when |value| >= rules::big_m_absolute; else only relative to the median
};

struct LabelCoverage {
  int rows_with_statement = 0;
  int columns_with_statement = 0;
  int bounds_with_statement = 0;  // column lower/upper bound statements
  bool objective_has_statement = false;
  // Requirements whose source (document, contract, measurement) is not recorded: rows with a
  // finite side, and finite bounds other than the default lower bound 0.
  int rows_without_source = 0;
  int bounds_without_source = 0;
  int decisions = 0;  // decisions recorded, for the model as a whole and on any label
};

// The kinds of finding, from worst to mildest; each carries how many places it concerns.
enum class Severity { error, warning, note };
std::string to_string(Severity severity);

struct Finding {
  Severity severity;
  std::string code;  // stable, machine-readable: "crossed-rows", "duplicate-columns", ...
  std::size_t count;
};

struct HealthReport {
  // Identity and provenance.
  std::string title;
  model::Source source;
  std::string objective_name;
  model::Sense sense = model::Sense::minimise;
  Rational objective_constant = 0;
  std::size_t objective_nonzeros = 0;

  // Size.
  int rows = 0;
  int columns = 0;
  std::size_t nonzeros = 0;
  Rational density = 0;  // nonzeros / (rows * columns); 0 for an empty matrix

  std::array<int, row_kind_count> row_kinds{};
  std::array<int, bound_kind_count> bound_kinds{};
  int integer_columns = 0;

  std::array<Range, number_kind_count> ranges;

  std::vector<std::string> empty_rows;
  std::vector<std::string> infeasible_empty_rows;  // empty rows whose sides exclude 0
  std::vector<std::string> empty_columns;
  // Empty columns whose cost improves without end in a direction their bounds leave open:
  // the objective is unbounded as soon as the rest of the model is feasible.
  std::vector<std::string> unbounded_empty_columns;
  std::vector<SingletonRow> singleton_rows;
  std::vector<std::string> free_rows;
  std::vector<std::string> crossed_rows;     // lower > upper: no point satisfies them
  std::vector<std::string> crossed_columns;  // lower > upper: the model is infeasible as written
  std::vector<std::vector<std::string>> duplicate_rows;     // groups, each in model order
  std::vector<std::vector<std::string>> duplicate_columns;  // same matrix column and cost
  std::vector<BigNumber> big_numbers;

  LabelCoverage labels;
  std::string sense_comment;      // what a comment stating an objective sense says, and the sense used
  std::vector<Finding> findings;  // what deserves attention, worst first

  const Range& range(NumberKind kind) const { return ranges[static_cast<std::size_t>(kind)]; }
  int count(RowKind kind) const { return row_kinds[static_cast<std::size_t>(kind)]; }
  int count(BoundKind kind) const { return bound_kinds[static_cast<std::size_t>(kind)]; }
};

// The whole analysis; exact throughout, roughly linear in the model's size.
HealthReport inspect(const model::Model& model);

}  // namespace plumb::health
