// The checker: each status's conditions, in the order docs/certificates.md gives them, in exact
// arithmetic.  Depends only on the model, the rational type and the certificate types.
#include "plumb/check/check.hpp"

#include "wording.hpp"

#include <algorithm>
#include <tuple>

namespace plumb::check {
namespace {

using certificate::Certificate;
using certificate::NamedValues;
using certificate::Status;
using detail::amount;
using detail::Failure;
using model::Model;
using model::Side;
using numeric::Integer;
using numeric::Rational;

enum class Kind { row, column };

// Deferred wording of a column or row, for the require_ functions.
auto column_text(const Model& m, int j) {
  return [&m, j] { return detail::column_text(m, j); };
}
auto row_text(const Model& m, int i) {
  return [&m, i] { return detail::row_text(m, i); };
}

std::string in_parentheses(const std::string& note) { return note.empty() ? "" : " (" + note + ")"; }

// Names resolved to a dense vector; an unknown or repeated name fails.
std::vector<Rational> dense(const Model& m, const NamedValues& values, Kind kind, const char* part) {
  const char* noun = kind == Kind::row ? "row" : "column";
  std::vector<Rational> out(static_cast<std::size_t>(kind == Kind::row ? m.row_count() : m.column_count()));
  std::vector<bool> seen(out.size(), false);
  for (const auto& [name, value] : values) {
    auto index = kind == Kind::row ? m.find_row(name) : m.find_column(name);
    if (!index)
      throw Failure{std::string(part) + " names " + noun + " " + detail::shown_name(name) +
                    ", which the model does not have"};
    if (seen[*index]) throw Failure{std::string(part) + " lists " + noun + " " + detail::shown_name(name) + " twice"};
    seen[*index] = true;
    out[*index] = value;
  }
  return out;
}

// Sums over a certificate vector v are kept scaled: with v = N / L (numeric::over_common_denominator)
// the checker sums products with N, whose terms carry only the matrix's and the sides' short
// denominators, and compares w = (the quantity) * L with each side times L.  The quantity itself,
// w / L, is formed only for a verdict's wording.  (Summing v directly cost a gcd of long numbers
// per term: thousands of digits each at bases with long determinants.)
using numeric::CommonDenominator;
using numeric::over_common_denominator;
using numeric::ProductSum;

const Integer unscaled = 1;

std::vector<Rational> times(const Model& m, const std::vector<Rational>& x) {  // A x
  std::vector<ProductSum> sums(static_cast<std::size_t>(m.row_count()));
  for (int j = 0; j < m.column_count(); ++j) {
    if (x[j].is_zero()) continue;
    auto rows = m.matrix.column_rows(j);
    auto values = m.matrix.column_values(j);
    for (std::size_t k = 0; k < rows.size(); ++k) sums[rows[k]].add(values[k], x[j]);
  }
  std::vector<Rational> out;
  out.reserve(sums.size());
  for (const auto& sum : sums) out.push_back(sum.value());
  return out;
}

std::vector<Rational> transpose_times(const Model& m, const std::vector<Rational>& y) {  // A^T y
  std::vector<Rational> out(static_cast<std::size_t>(m.column_count()));
  for (int j = 0; j < m.column_count(); ++j) {
    auto rows = m.matrix.column_rows(j);
    auto values = m.matrix.column_values(j);
    // A Farkas y is mostly zeros: a column meeting none of its rows needs no sum.
    if (std::all_of(rows.begin(), rows.end(), [&](int i) { return y[i].is_zero(); })) continue;
    ProductSum sum;
    for (std::size_t k = 0; k < rows.size(); ++k) sum.add(values[k], y[rows[k]]);
    out[j] = sum.value();
  }
  return out;
}

// c' of the minimisation form: c when minimising, -c when maximising.
Rational min_cost(const Model& m, int j) {
  const Rational& c = m.objective.coefficients[j];
  return m.objective.sense == model::Sense::maximise ? Rational(-c) : c;
}

// c'.v for v held as N / L.
Rational min_cost_dot(const Model& m, const CommonDenominator& v) {
  ProductSum sum;
  for (int j = 0; j < m.column_count(); ++j) sum.add(m.objective.coefficients[j], v.numerators[j]);
  Rational dot = sum.value() / v.denominator;
  return m.objective.sense == model::Sense::maximise ? Rational(-dot) : dot;
}

// Adds w times the side its sign presses on; the sign rules have made sure that side is finite.
// Signs are read with sign(): boost compares a rational with the literal 0 through a temporary
// rational, an allocation per test, and these tests run once per row and column.
void add_pressed(ProductSum& sum, const Rational& w, const Side& when_positive, const Side& when_negative) {
  if (w.sign() > 0) sum.add(w, *when_positive);
  if (w.sign() < 0) sum.add(w, *when_negative);
}

// In the require_ functions the quantity is w / scale.  `what` names the row or column; it is
// called only to word a failure (the checks run per row and column, and wording each in advance
// cost more than checking it).
void require_within(const auto& what, const char* quantity, const Rational& w, const Integer& scale, const Side& lower,
                    const Side& upper, const char* noun) {
  auto head = [&] { return "x is not feasible: " + what() + ": " + quantity + " = " + amount(w / scale); };
  if (lower && w < *lower * scale)
    throw Failure{head() + " is below its lower " + noun + " " + amount(*lower) + " by " + amount(*lower - w / scale)};
  if (upper && w > *upper * scale)
    throw Failure{head() + " is above its upper " + noun + " " + amount(*upper) + " by " + amount(w / scale - *upper)};
}

// Returns x over its common denominator, for the sums that follow.
CommonDenominator require_feasible(const Model& m, const std::vector<Rational>& x) {
  for (int j = 0; j < m.column_count(); ++j)
    require_within(column_text(m, j), "x", x[j], unscaled, m.columns[j].lower, m.columns[j].upper, "bound");
  CommonDenominator scaled = over_common_denominator(x);
  std::vector<Rational> ax = times(m, scaled.numerators);
  for (int i = 0; i < m.row_count(); ++i)
    require_within(row_text(m, i), "a.x", ax[i], scaled.denominator, m.rows[i].lower, m.rows[i].upper, "side");
  return scaled;
}

// A multiplier may be positive only against a finite limit it presses on, negative likewise.
void require_sign(const auto& what, const char* quantity, const Rational& w, const Integer& scale,
                  const Side& when_positive, const char* positive_limit, const Side& when_negative,
                  const char* negative_limit) {
  if (w.sign() > 0 && !when_positive)
    throw Failure{what() + ": " + quantity + " = " + amount(w / scale) + " is positive, which needs a finite " +
                  positive_limit + ", and there is none"};
  if (w.sign() < 0 && !when_negative)
    throw Failure{what() + ": " + quantity + " = " + amount(w / scale) + " is negative, which needs a finite " +
                  negative_limit + ", and there is none"};
}

// Along a ray a quantity may fall only where nothing is below it, and rise only where nothing is above.
void require_unlimited(const auto& what, const char* quantity, const Rational& w, const Integer& scale,
                       const Side& lower, const Side& upper, const char* noun) {
  auto head = [&] { return "ray: " + what() + ": " + quantity + " = " + amount(w / scale); };
  if (w.sign() < 0 && lower)
    throw Failure{head() + " is negative, but the lower " + noun + " " + amount(*lower) +
                  " is finite, so the ray leaves the model"};
  if (w.sign() > 0 && upper)
    throw Failure{head() + " is positive, but the upper " + noun + " " + amount(*upper) +
                  " is finite, so the ray leaves the model"};
}

void require_identity(const Model& m, const Certificate& c) {
  if (!m.source.sha256.empty() && c.model.sha256 != m.source.sha256)
    throw Failure{"model: the certificate is for another model: it names sha256 " +
                  (c.model.sha256.empty() ? std::string("(none)") : c.model.sha256) + ", while " +
                  detail::shown_name(m.source.path) + " has sha256 " + m.source.sha256};
  if (c.model.rows != m.row_count() || c.model.columns != m.column_count())
    throw Failure{"model: the certificate describes " + std::to_string(c.model.rows) + " rows and " +
                  std::to_string(c.model.columns) + " columns, the model has " + std::to_string(m.row_count()) +
                  " rows and " + std::to_string(m.column_count()) + " columns"};
}

Verdict verify_optimal(const Model& m, const Certificate& c, const detail::Objective& objective) {
  std::vector<Rational> x = dense(m, c.x, Kind::column, "x");
  std::vector<Rational> y = dense(m, c.y, Kind::row, "y");
  CommonDenominator scaled_x = require_feasible(m, x);
  CommonDenominator scaled_y = over_common_denominator(y);
  const Integer& scale = scaled_y.denominator;
  ProductSum scaled_bound;  // weak duality: c'.x >= bound = scaled_bound / scale for every feasible x
  for (int i = 0; i < m.row_count(); ++i) {
    const model::Row& row = m.rows[i];
    require_sign(row_text(m, i), "multiplier y", y[i], unscaled, row.lower, "lower side", row.upper, "upper side");
    add_pressed(scaled_bound, scaled_y.numerators[i], row.lower, row.upper);
  }
  std::vector<Rational> aty = transpose_times(m, scaled_y.numerators);
  for (int j = 0; j < m.column_count(); ++j) {
    const model::Column& column = m.columns[j];
    Rational d = min_cost(m, j) * scale - aty[j];
    require_sign(column_text(m, j), "reduced cost d = c' - A^T y", d, scale, column.lower, "lower bound",
                 column.upper, "upper bound");
    add_pressed(scaled_bound, d, column.lower, column.upper);
  }
  Rational bound = scaled_bound.value() / scale;
  Rational cost = min_cost_dot(m, scaled_x);
  if (bound != cost)
    throw Failure{"x is not proven optimal: the dual bound " + amount(objective.from_min_form(bound)) +
                  " differs from the objective at x, " + amount(objective.from_min_form(cost)) + ", by " +
                  amount(cost - bound)};
  Rational value = objective.from_min_form(cost);
  if (!c.objective) throw Failure{"objective: an optimal certificate must state it"};
  if (*c.objective != value)
    throw Failure{"objective: the certificate states " + amount(*c.objective) + ", but the objective at x is " +
                  amount(value) + in_parentheses(objective.constant_note())};
  std::string note = objective.constant_note();
  return {true, "optimal: objective " + amount(value) + " is attained by x and no feasible point is better " +
                    "(the dual bound equals it" + (note.empty() ? "" : "; " + note) + ")", ""};
}

Verdict verify_infeasible(const Model& m, const Certificate& c) {
  std::vector<Rational> y = dense(m, c.y, Kind::row, "y");
  CommonDenominator scaled_y = over_common_denominator(y);
  const Integer& scale = scaled_y.denominator;
  ProductSum scaled_rows_force;  // every x meeting the rows has y.Ax >= rows_force
  for (int i = 0; i < m.row_count(); ++i) {
    const model::Row& row = m.rows[i];
    require_sign(row_text(m, i), "Farkas multiplier y", y[i], unscaled, row.lower, "lower side", row.upper,
                 "upper side");
    add_pressed(scaled_rows_force, scaled_y.numerators[i], row.lower, row.upper);
  }
  std::vector<Rational> a = transpose_times(m, scaled_y.numerators);
  ProductSum scaled_bounds_allow;  // every x within its bounds has y.Ax = a.x <= bounds_allow
  for (int j = 0; j < m.column_count(); ++j) {
    const model::Column& column = m.columns[j];
    require_sign(column_text(m, j), "(A^T y)", a[j], scale, column.upper, "upper bound", column.lower, "lower bound");
    add_pressed(scaled_bounds_allow, a[j], column.upper, column.lower);
  }
  Rational rows_force = scaled_rows_force.value() / scale;
  Rational bounds_allow = scaled_bounds_allow.value() / scale;
  if (rows_force <= bounds_allow)
    throw Failure{"no contradiction: the rows weighted by y force y.Ax >= " + amount(rows_force) +
                  ", but the bounds let y.Ax reach " + amount(bounds_allow) +
                  "; infeasibility needs the first to exceed the second"};
  return {true, "infeasible: no x meets every row and bound (Farkas: the rows weighted by y force y.Ax >= " +
                    amount(rows_force) + ", while the bounds keep y.Ax <= " + amount(bounds_allow) + ")", ""};
}

// One entry of a certificate resolved against the model: which row or column, its finite limit,
// and a slot unique to the entry (for repeats).
struct Resolved {
  bool row = true;
  int index = 0;
  Rational limit;
  std::size_t slot = 0;
};

std::string entry_text(const Model& m, const Resolved& r, certificate::Limit limit) {
  return "the " + certificate::to_string(limit) + (r.row ? " side of " : " bound of ") +
         (r.row ? row_text(m, r.index)() : column_text(m, r.index)());
}

// The entry's row or column must exist and its side or bound be finite: an infinite limit neither
// proves nor constrains anything.
Resolved resolve(const Model& m, const certificate::Entry& e, const std::string& part) {
  bool row = e.kind == certificate::EntryKind::row;
  auto index = row ? m.find_row(e.name) : m.find_column(e.name);
  if (!index)
    throw Failure{part + " names " + (row ? "row " : "column ") + detail::shown_name(e.name) +
                  ", which the model does not have"};
  bool lower = e.limit == certificate::Limit::lower;
  const Side& side = row ? (lower ? m.rows[*index].lower : m.rows[*index].upper)
                         : (lower ? m.columns[*index].lower : m.columns[*index].upper);
  Resolved r{row, *index, 0, 2 * static_cast<std::size_t>(row ? *index : m.row_count() + *index) + !lower};
  if (!side)
    throw Failure{part + ": " + entry_text(m, r, e.limit) + " is infinite, so " +
                  (part == "farkas" ? "a multiplier on it proves nothing" : "it constrains nothing")};
  r.limit = *side;
  return r;
}

// Farkas in explicit form: each entry written as g(x) >= value (an upper one negated), multipliers
// >= 0; if the weighted g sum to zero in every column and the weighted values to more than zero,
// then every x meeting the entries would give 0 >= a positive number.  `allowed`, when given, is
// the set of slots the terms may use (a subsystem's own entries).
Rational require_farkas(const Model& m, const std::vector<certificate::FarkasTerm>& terms,
                        const std::vector<bool>* allowed) {
  std::vector<Rational> combined(static_cast<std::size_t>(m.column_count()));
  Rational force = 0;
  std::vector<bool> seen(static_cast<std::size_t>(2 * (m.row_count() + m.column_count())), false);
  for (const certificate::FarkasTerm& t : terms) {
    const certificate::Entry& e = t.entry;
    Resolved r = resolve(m, e, "farkas");
    if (seen[r.slot])
      throw Failure{"farkas lists the " + certificate::to_string(e.limit) + " limit of " +
                    detail::shown_name(e.name) + " twice"};
    seen[r.slot] = true;
    if (allowed && !(*allowed)[r.slot])
      throw Failure{"farkas uses " + entry_text(m, r, e.limit) +
                    ", which is neither a member nor a hard entry of the subsystem"};
    if (t.multiplier < 0)
      throw Failure{"farkas: the multiplier on the " + certificate::to_string(e.limit) + " limit of " +
                    detail::shown_name(e.name) + " is " + amount(t.multiplier) +
                    ", and multipliers must be at least 0"};
    Rational weight = e.limit == certificate::Limit::lower ? t.multiplier : Rational(-t.multiplier);
    force += weight * r.limit;
    if (!r.row) {
      combined[static_cast<std::size_t>(r.index)] += weight;
      continue;
    }
    auto columns = m.matrix.row_columns(r.index);
    auto positions = m.matrix.row_positions(r.index);
    for (std::size_t k = 0; k < columns.size(); ++k)
      combined[static_cast<std::size_t>(columns[k])] += weight * m.matrix.value(positions[k]);
  }
  for (int j = 0; j < m.column_count(); ++j)
    if (combined[static_cast<std::size_t>(j)] != 0)
      throw Failure{"farkas: the weighted entries do not cancel: " + column_text(m, j)() +
                    " keeps the coefficient " + amount(combined[static_cast<std::size_t>(j)]) +
                    ", so their sum still depends on x"};
  if (force <= 0)
    throw Failure{"no contradiction: the weighted entries sum to 0 >= " + amount(force) +
                  ", which holds; infeasibility needs the right-hand side above 0"};
  return force;
}

Verdict verify_explicit_farkas(const Model& m, const Certificate& c) {
  Rational force = require_farkas(m, c.farkas, nullptr);
  return {true,
          "infeasible: no x meets every row and bound (Farkas: " + std::to_string(c.farkas.size()) +
              " weighted sides and bounds add up to 0 >= " + amount(force) + ")",
          ""};
}

// What the labels say of an entry (docs/labels.md): a row's label, a bound's own label, falling
// back to its column's where the bound's is silent.
struct EntryLabel {
  bool hard = false;
  std::string group;
};
EntryLabel label_of(const Model& m, const Resolved& r, certificate::Limit limit) {
  if (r.row) return {m.rows[r.index].label.hard.value_or(false), m.rows[r.index].label.group};
  const model::Column& column = m.columns[r.index];
  const model::Label& own = limit == certificate::Limit::lower ? column.lower_label : column.upper_label;
  return {own.hard ? *own.hard : column.label.hard.value_or(false),
          own.group.empty() ? column.label.group : own.group};
}

// An irreducible infeasible subsystem: the Farkas terms prove its members and hard entries
// infeasible using only them; each witness drops one member (or one group's members) and meets
// every other entry of the subsystem exactly, so no member can be left out.
Verdict verify_subsystem(const Model& m, const Certificate& c) {
  std::vector<bool> in_subsystem(static_cast<std::size_t>(2 * (m.row_count() + m.column_count())), false);
  std::vector<Resolved> members, hard;
  for (auto [list, out, part] :
       {std::tuple{&c.members, &members, "members"}, std::tuple{&c.hard, &hard, "hard"}})
    for (const certificate::Entry& e : *list) {
      Resolved r = resolve(m, e, part);
      if (in_subsystem[r.slot])
        throw Failure{std::string(part) + ": " + entry_text(m, r, e.limit) +
                      " is listed twice in the subsystem"};
      in_subsystem[r.slot] = true;
      if (out == &members && label_of(m, r, e.limit).hard)
        throw Failure{"members: " + entry_text(m, r, e.limit) +
                      " is hard by its label, so it may not be offered for relaxing"};
      out->push_back(r);
    }
  Rational force = require_farkas(m, c.farkas, &in_subsystem);
  std::vector<int> dropped_by(members.size(), -1);
  for (std::size_t w = 0; w < c.witnesses.size(); ++w) {
    const certificate::Witness& witness = c.witnesses[w];
    std::string at = "witness " + std::to_string(w);
    if (witness.drop.empty()) throw Failure{at + " drops no member"};
    for (std::size_t k : witness.drop) {
      if (k >= members.size())
        throw Failure{at + " drops member " + std::to_string(k) + ", and there are " +
                      std::to_string(members.size())};
      if (dropped_by[k] >= 0)
        throw Failure{at + " drops member " + std::to_string(k) + ", which witness " +
                      std::to_string(dropped_by[k]) + " drops already"};
      dropped_by[k] = static_cast<int>(w);
    }
    std::string group = label_of(m, members[witness.drop[0]], c.members[witness.drop[0]].limit).group;
    for (std::size_t k : witness.drop)
      if (witness.drop.size() > 1 &&
          (group.empty() || label_of(m, members[k], c.members[k].limit).group != group))
        throw Failure{at + " drops several members that do not share one group"};
    std::vector<Rational> x =
        dense(m, witness.x, Kind::column, ("witnesses[" + std::to_string(w) + "].x").c_str());
    auto require_met = [&](const Resolved& r, const certificate::Entry& e) {
      Rational value = r.row ? Rational(0) : x[static_cast<std::size_t>(r.index)];
      if (r.row) {
        auto columns = m.matrix.row_columns(r.index);
        auto positions = m.matrix.row_positions(r.index);
        for (std::size_t k = 0; k < columns.size(); ++k)
          value += m.matrix.value(positions[k]) * x[static_cast<std::size_t>(columns[k])];
      }
      bool met = e.limit == certificate::Limit::lower ? value >= r.limit : value <= r.limit;
      if (!met)
        throw Failure{at + " breaks " + entry_text(m, r, e.limit) + ": " + (r.row ? "a.x" : "x") + " = " +
                      amount(value) + " against " + amount(r.limit) +
                      ", so it does not show that member needed"};
    };
    for (std::size_t k = 0; k < members.size(); ++k)
      if (std::find(witness.drop.begin(), witness.drop.end(), k) == witness.drop.end())
        require_met(members[k], c.members[k]);
    for (std::size_t k = 0; k < hard.size(); ++k) require_met(hard[k], c.hard[k]);
  }
  for (std::size_t k = 0; k < members.size(); ++k)
    if (dropped_by[k] < 0)
      throw Failure{"members: " + entry_text(m, members[k], c.members[k].limit) +
                    " has no witness, so nothing shows it is needed"};
  std::string what = members.empty() ? "the hard entries alone conflict: " + std::to_string(hard.size()) +
                                           " of them admit no x"
                                     : std::to_string(members.size()) + " members and " +
                                           std::to_string(hard.size()) + " hard entries admit no x, and " +
                                           "dropping any one member (or group) leaves them satisfiable";
  return {true, "infeasible subsystem: " + what + " (Farkas: they add up to 0 >= " + amount(force) + ")", ""};
}

Verdict verify_unbounded(const Model& m, const Certificate& c, const detail::Objective& objective) {
  std::vector<Rational> x = dense(m, c.x, Kind::column, "x");
  std::vector<Rational> r = dense(m, c.ray, Kind::column, "ray");
  require_feasible(m, x);
  for (int j = 0; j < m.column_count(); ++j)
    require_unlimited(column_text(m, j), "r", r[j], unscaled, m.columns[j].lower, m.columns[j].upper, "bound");
  CommonDenominator scaled_r = over_common_denominator(r);
  std::vector<Rational> ar = times(m, scaled_r.numerators);
  for (int i = 0; i < m.row_count(); ++i)
    require_unlimited(row_text(m, i), "(A r)", ar[i], scaled_r.denominator, m.rows[i].lower, m.rows[i].upper, "side");
  Rational slope = min_cost_dot(m, scaled_r);
  if (slope >= 0)
    throw Failure{"ray: the objective does not improve along the ray: c.r = " + amount(objective.direction(slope)) +
                  (m.objective.sense == model::Sense::maximise ? ", and maximising needs it positive"
                                                               : ", and minimising needs it negative")};
  return {true, "unbounded: x is feasible, so is x + t r for every t >= 0, and the objective improves by " +
                    amount(-slope) + " per unit of t, so no optimum exists", ""};
}

Verdict verify_feasible(const Model& m, const Certificate& c, const detail::Objective& objective) {
  std::vector<Rational> x = dense(m, c.x, Kind::column, "x");
  CommonDenominator scaled_x = require_feasible(m, x);
  return {true, "feasible: x meets every row and bound, with objective " +
                    amount(objective.from_min_form(min_cost_dot(m, scaled_x))) +
                    in_parentheses(objective.constant_note()), ""};
}

}  // namespace

Verdict verify(const model::Model& m, const certificate::Certificate& c) {
  try {
    require_identity(m, c);
    detail::Objective objective(m, c.model.objective_constant);
    switch (c.status) {
      case Status::optimal: return verify_optimal(m, c, objective);
      case Status::infeasible:
        return c.farkas.empty() ? verify_infeasible(m, c) : verify_explicit_farkas(m, c);
      case Status::unbounded: return verify_unbounded(m, c, objective);
      case Status::feasible: return verify_feasible(m, c, objective);
      case Status::infeasible_subsystem:
        return verify_subsystem(m, c);
    }
    return {false, "", "status: not one the checker knows"};
  } catch (const Failure& failure) {
    return {false, "", failure.text};
  }
}

}  // namespace plumb::check
