// The exact evaluator (include/plumb/audit/evaluate.hpp).
#include "plumb/audit/evaluate.hpp"

#include <algorithm>

namespace plumb::audit {
namespace {

using model::Side;

// Adds the violations of value against [lower, upper].
void check_range(std::vector<Violation>& out, Violation::Kind kind, int index, const Rational& value,
                 const Side& lower, const Side& upper) {
  if (lower && value < *lower) {
    Rational amount = *lower - value;
    out.push_back({kind, index, Violation::Side::lower, *lower, value, amount, relative_to(amount, *lower)});
  }
  if (upper && value > *upper) {
    Rational amount = value - *upper;
    out.push_back({kind, index, Violation::Side::upper, *upper, value, amount, relative_to(amount, *upper)});
  }
}

// The term's smallest value over [lower, upper] when it is multiplied by a non-zero factor, or
// empty when that end is infinite.
std::optional<Rational> least_product(const Rational& factor, const Side& lower, const Side& upper) {
  const Side& end = factor > 0 ? lower : upper;
  if (!end) return std::nullopt;
  return factor * *end;
}

// The least and greatest activity of each row over the column bounds: a finite part and the count
// of infinite terms, from which the activity of a row less one column follows.
struct ActivityRange {
  Rational least, greatest;
  int least_infinite = 0, greatest_infinite = 0;
};

class ImpliedBounds {
 public:
  explicit ImpliedBounds(const model::Model& model) : model_(model) {}

  // A bound on column j that every feasible point respects, from one row and the other columns'
  // bounds (the tightest over its rows), or empty.  upper: x_j <= it; else x_j >= it.
  std::optional<Rational> of(int j, bool upper) {
    if (ranges_.empty()) compute_ranges();
    std::optional<Rational> best;
    auto rows = model_.matrix.column_rows(j);
    auto values = model_.matrix.column_values(j);
    const model::Column& column = model_.columns[static_cast<std::size_t>(j)];
    for (std::size_t k = 0; k < rows.size(); ++k) {
      const model::Row& row = model_.rows[static_cast<std::size_t>(rows[k])];
      const ActivityRange& range = ranges_[static_cast<std::size_t>(rows[k])];
      const Rational& a = values[k];
      // a x_j = activity - rest: bounded above by U - least(rest), below by L - greatest(rest).
      bool use_upper_side = upper == (a > 0);
      const Side& side = use_upper_side ? row.upper : row.lower;
      if (!side) continue;
      std::optional<Rational> rest = use_upper_side ? rest_of(range.least, range.least_infinite, least_product(a, column.lower, column.upper))
                                                    : rest_of(range.greatest, range.greatest_infinite, greatest_product(a, column.lower, column.upper));
      if (!rest) continue;
      Rational bound = (*side - *rest) / a;
      if (!best || (upper ? bound < *best : bound > *best)) best = bound;
    }
    return best;
  }

 private:
  static std::optional<Rational> greatest_product(const Rational& factor, const Side& lower, const Side& upper) {
    auto least = least_product(-factor, lower, upper);
    if (!least) return std::nullopt;
    return Rational(-*least);
  }
  // The row's range less column j's own term.
  static std::optional<Rational> rest_of(const Rational& finite, int infinite, const std::optional<Rational>& own) {
    if (own) {
      if (infinite > 0) return std::nullopt;
      return Rational(finite - *own);
    }
    if (infinite > 1) return std::nullopt;
    return finite;
  }
  void compute_ranges() {
    ranges_.resize(model_.rows.size());
    for (int j = 0; j < model_.column_count(); ++j) {
      const model::Column& column = model_.columns[static_cast<std::size_t>(j)];
      auto rows = model_.matrix.column_rows(j);
      auto values = model_.matrix.column_values(j);
      for (std::size_t k = 0; k < rows.size(); ++k) {
        ActivityRange& range = ranges_[static_cast<std::size_t>(rows[k])];
        if (auto least = least_product(values[k], column.lower, column.upper)) range.least += *least;
        else ++range.least_infinite;
        if (auto greatest = greatest_product(values[k], column.lower, column.upper)) range.greatest += *greatest;
        else ++range.greatest_infinite;
      }
    }
  }

  const model::Model& model_;
  std::vector<ActivityRange> ranges_;
};

}  // namespace

Rational relative_to(const Rational& amount, const Rational& limit) {
  Rational scale = abs(limit);
  return scale > 1 ? Rational(amount / scale) : amount;
}

Evaluation evaluate(const model::Model& model, const std::vector<Rational>& x) {
  Evaluation result;
  result.activity.assign(model.rows.size(), Rational(0));
  for (int j = 0; j < model.column_count(); ++j) {
    const Rational& value = x[static_cast<std::size_t>(j)];
    if (value == 0) continue;
    auto rows = model.matrix.column_rows(j);
    auto values = model.matrix.column_values(j);
    for (std::size_t k = 0; k < rows.size(); ++k) result.activity[static_cast<std::size_t>(rows[k])] += values[k] * value;
  }
  for (int i = 0; i < model.row_count(); ++i) {
    const model::Row& row = model.rows[static_cast<std::size_t>(i)];
    check_range(result.violations, Violation::Kind::row, i, result.activity[static_cast<std::size_t>(i)], row.lower, row.upper);
  }
  for (int j = 0; j < model.column_count(); ++j) {
    const model::Column& column = model.columns[static_cast<std::size_t>(j)];
    check_range(result.violations, Violation::Kind::column, j, x[static_cast<std::size_t>(j)], column.lower, column.upper);
  }
  std::stable_sort(result.violations.begin(), result.violations.end(), [](const Violation& a, const Violation& b) {
    if (a.relative != b.relative) return a.relative > b.relative;
    return a.amount > b.amount;
  });
  result.objective = model.objective_value(x);
  return result;
}

DualBound safe_dual_bound(const model::Model& model, const std::vector<Rational>& y) {
  // In the minimisation form (c' = c, or -c when maximising, and y' likewise) the bound is a
  // lower one; it is turned back at the end.
  bool maximise = model.objective.sense == model::Sense::maximise;
  DualBound result;
  Rational bound = 0;
  std::vector<Rational> used(y.size());
  for (int i = 0; i < model.row_count(); ++i) {
    Rational dual = maximise ? Rational(-y[static_cast<std::size_t>(i)]) : y[static_cast<std::size_t>(i)];
    if (dual == 0) continue;
    const model::Row& row = model.rows[static_cast<std::size_t>(i)];
    std::optional<Rational> term = least_product(dual, row.lower, row.upper);
    if (!term) {
      result.rows_zeroed.push_back(i);
      continue;
    }
    bound += *term;
    used[static_cast<std::size_t>(i)] = dual;
  }
  ImpliedBounds implied(model);
  for (int j = 0; j < model.column_count(); ++j) {
    Rational reduced = model.objective.coefficients[static_cast<std::size_t>(j)];
    if (maximise) reduced = -reduced;
    auto rows = model.matrix.column_rows(j);
    auto values = model.matrix.column_values(j);
    for (std::size_t k = 0; k < rows.size(); ++k) {
      const Rational& dual = used[static_cast<std::size_t>(rows[k])];
      if (dual != 0) reduced -= values[k] * dual;
    }
    if (reduced == 0) continue;
    const model::Column& column = model.columns[static_cast<std::size_t>(j)];
    std::optional<Rational> term = least_product(reduced, column.lower, column.upper);
    if (!term) {  // the column's own bound is infinite: one a row implies may serve
      if (std::optional<Rational> end = implied.of(j, reduced < 0)) {
        term = reduced * *end;
        ++result.implied_bounds_used;
      }
    }
    if (!term) {
      result.unbounded_by = column.name;
      return result;
    }
    bound += *term;
  }
  Rational constant = model.objective.constant;
  result.bound = maximise ? Rational(constant - bound) : Rational(constant + bound);
  return result;
}

}  // namespace plumb::audit
