#include "check/mutations.hpp"

#include "plumb/check/check.hpp"

#include <gtest/gtest.h>

namespace plumb::testing {

using certificate::Certificate;
using certificate::Status;
using numeric::Rational;

std::optional<Mutation> raise_objective(const Certificate& c) {
  if (!c.objective) return std::nullopt;
  Mutation m{"objective raised by 1", c, "objective: the certificate states"};
  *m.certificate.objective += 1;
  return m;
}

std::optional<Mutation> rename_to_unknown(const Certificate& c) {
  Mutation m{"an entry renamed to a name not in the model", c, "which the model does not have"};
  for (auto* values : {&m.certificate.x, &m.certificate.y, &m.certificate.ray}) {
    if (values->empty()) continue;
    values->front().first = "no such name in any model (mutation)";
    return m;
  }
  return std::nullopt;
}

std::optional<Mutation> miscount_rows(const Certificate& c) {
  Mutation m{"row count off by one", c, "model: the certificate describes"};
  m.certificate.model.rows += 1;
  return m;
}

std::optional<Mutation> push_across_tight_row(const model::Model& m, const Certificate& c) {
  if (c.status == Status::infeasible) return std::nullopt;
  std::vector<Rational> x(static_cast<std::size_t>(m.column_count()));
  for (const auto& [name, value] : c.x)
    if (auto j = m.find_column(name)) x[*j] = value;
  for (int i = 0; i < m.row_count(); ++i) {
    Rational ax = 0;
    for (std::size_t k = 0; k < m.matrix.row_columns(i).size(); ++k)
      ax += m.matrix.value(m.matrix.row_positions(i)[k]) * x[m.matrix.row_columns(i)[k]];
    const model::Row& row = m.rows[i];
    int direction = row.upper && ax == *row.upper ? 1 : row.lower && ax == *row.lower ? -1 : 0;
    if (direction == 0 || m.matrix.row_columns(i).empty()) continue;
    int j = m.matrix.row_columns(i)[0];
    x[j] += Rational(direction) / m.matrix.value(m.matrix.row_positions(i)[0]);
    Mutation mutation{"x moved across the tight row " + row.name, c, "x is not feasible"};
    mutation.certificate.x.clear();
    for (int k = 0; k < m.column_count(); ++k)
      if (x[k] != 0) mutation.certificate.x.emplace_back(m.columns[k].name, x[k]);
    return mutation;
  }
  return std::nullopt;
}

std::optional<Mutation> flip_one_sided_multiplier(const model::Model& m, const Certificate& c) {
  for (std::size_t k = 0; k < c.y.size(); ++k) {
    auto i = m.find_row(c.y[k].first);
    if (!i || c.y[k].second == 0 || m.rows[*i].lower.has_value() == m.rows[*i].upper.has_value()) continue;
    Mutation mutation{"multiplier of the one-sided row " + c.y[k].first + " negated", c, "multiplier y"};
    mutation.certificate.y[k].second = -mutation.certificate.y[k].second;
    return mutation;
  }
  return std::nullopt;
}

std::optional<Mutation> drop_all_multipliers(const Certificate& c) {
  if (c.status != Status::infeasible) return std::nullopt;
  Mutation m{"every Farkas multiplier dropped", c, "no contradiction"};
  m.certificate.y.clear();
  return m;
}

std::optional<Mutation> reverse_ray(const Certificate& c) {
  if (c.status != Status::unbounded) return std::nullopt;
  Mutation m{"ray reversed", c, "ray: "};
  for (auto& entry : m.certificate.ray) entry.second = -entry.second;
  return m;
}

std::vector<Mutation> provable_mutations(const model::Model& m, const Certificate& c) {
  std::vector<Mutation> out;
  for (auto mutation : {raise_objective(c), rename_to_unknown(c), miscount_rows(c), push_across_tight_row(m, c),
                        flip_one_sided_multiplier(m, c), drop_all_multipliers(c), reverse_ray(c)})
    if (mutation) out.push_back(std::move(*mutation));
  return out;
}

Mutation drop_multiplier(const Certificate& c, const std::string& row) {
  Mutation m{"multiplier of row " + row + " dropped", c, ""};
  std::erase_if(m.certificate.y, [&](const auto& entry) { return entry.first == row; });
  return m;
}

void expect_valid(const model::Model& m, const Certificate& c) {
  check::Verdict verdict = check::verify(m, c);
  EXPECT_TRUE(verdict.valid) << verdict.failure;
  EXPECT_EQ(verdict.failure, "");
}

void expect_rejected(const model::Model& m, const Mutation& mutation) {
  check::Verdict verdict = check::verify(m, mutation.certificate);
  EXPECT_FALSE(verdict.valid) << mutation.what << " was accepted: " << verdict.proven;
  EXPECT_NE(verdict.failure.find(mutation.expected), std::string::npos)
      << mutation.what << ": expected \"" << mutation.expected << "\" in: " << verdict.failure;
}

}  // namespace plumb::testing
