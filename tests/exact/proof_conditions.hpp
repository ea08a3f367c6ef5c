// Test helper: the certificate conditions of the solve brief, checked directly on a Solution.
// Stands in for check::verify until the checker lands; then tests call both.
#pragma once

#include "plumb/exact/solve.hpp"

#include <string>

namespace plumb::exact::testing {

using model::Model;
using numeric::Rational;

// Empty when the solution proves its outcome; otherwise the first failing condition.
inline std::string proof_failure(const Model& model, const Solution& s) {
  const int n = model.column_count(), m = model.row_count();
  const bool maximise = model.objective.sense == model::Sense::maximise;
  auto cost = [&](int j) { return maximise ? Rational(-model.objective.coefficients[j]) : model.objective.coefficients[j]; };
  auto activity = [&](const std::vector<Rational>& x) {
    std::vector<Rational> ax(static_cast<std::size_t>(m), Rational(0));
    for (int j = 0; j < n; ++j) {
      auto rows = model.matrix.column_rows(j);
      auto values = model.matrix.column_values(j);
      for (std::size_t e = 0; e < rows.size(); ++e) ax[rows[e]] += values[e] * x[j];
    }
    return ax;
  };
  auto feasible = [&](const std::vector<Rational>& x) -> std::string {
    if (static_cast<int>(x.size()) != n) return "x has the wrong size";
    for (int j = 0; j < n; ++j) {
      const auto& c = model.columns[j];
      if ((c.lower && x[j] < *c.lower) || (c.upper && x[j] > *c.upper)) return "column " + c.name + " out of bounds";
    }
    auto ax = activity(x);
    for (int i = 0; i < m; ++i) {
      const auto& r = model.rows[i];
      if ((r.lower && ax[i] < *r.lower) || (r.upper && ax[i] > *r.upper)) return "row " + r.name + " violated";
    }
    return "";
  };
  auto transpose_times = [&](const std::vector<Rational>& y) {
    std::vector<Rational> a(static_cast<std::size_t>(n), Rational(0));
    for (int j = 0; j < n; ++j) {
      auto rows = model.matrix.column_rows(j);
      auto values = model.matrix.column_values(j);
      for (std::size_t e = 0; e < rows.size(); ++e) a[j] += values[e] * y[rows[e]];
    }
    return a;
  };
  switch (s.outcome) {
    case Outcome::optimal: {
      if (auto why = feasible(s.x); !why.empty()) return why;
      if (static_cast<int>(s.y.size()) != m) return "y has the wrong size";
      auto ax = activity(s.x);
      for (int i = 0; i < m; ++i) {
        const auto& r = model.rows[i];
        if (s.y[i] > 0 && !(r.lower && ax[i] == *r.lower)) return "y positive off the lower side of row " + r.name;
        if (s.y[i] < 0 && !(r.upper && ax[i] == *r.upper)) return "y negative off the upper side of row " + r.name;
      }
      auto a = transpose_times(s.y);
      for (int j = 0; j < n; ++j) {
        Rational d = cost(j) - a[j];
        const auto& c = model.columns[j];
        if (d > 0 && !(c.lower && s.x[j] == *c.lower)) return "reduced cost positive off the lower bound of " + c.name;
        if (d < 0 && !(c.upper && s.x[j] == *c.upper)) return "reduced cost negative off the upper bound of " + c.name;
      }
      if (s.objective != model.objective_value(s.x)) return "objective does not match x";
      return "";
    }
    case Outcome::infeasible: {
      if (static_cast<int>(s.y.size()) != m) return "y has the wrong size";
      Rational lhs = 0, rhs = 0;
      for (int i = 0; i < m; ++i) {
        const auto& r = model.rows[i];
        if (s.y[i] > 0) {
          if (!r.lower) return "Farkas y positive on a row without lower side: " + r.name;
          lhs += s.y[i] * *r.lower;
        } else if (s.y[i] < 0) {
          if (!r.upper) return "Farkas y negative on a row without upper side: " + r.name;
          lhs += s.y[i] * *r.upper;
        }
      }
      auto a = transpose_times(s.y);
      for (int j = 0; j < n; ++j) {
        const auto& c = model.columns[j];
        if (a[j] > 0) {
          if (!c.upper) return "Farkas a positive on a column without upper bound: " + c.name;
          rhs += a[j] * *c.upper;
        } else if (a[j] < 0) {
          if (!c.lower) return "Farkas a negative on a column without lower bound: " + c.name;
          rhs += a[j] * *c.lower;
        }
      }
      if (!(lhs > rhs)) return "Farkas R <= C";
      return "";
    }
    case Outcome::unbounded: {
      if (auto why = feasible(s.x); !why.empty()) return why;
      if (static_cast<int>(s.ray.size()) != n) return "ray has the wrong size";
      Rational slope = 0;
      for (int j = 0; j < n; ++j) {
        const auto& c = model.columns[j];
        if (s.ray[j] < 0 && c.lower) return "ray decreases bounded column " + c.name;
        if (s.ray[j] > 0 && c.upper) return "ray increases bounded column " + c.name;
        slope += cost(j) * s.ray[j];
      }
      auto ar = activity(s.ray);
      for (int i = 0; i < m; ++i) {
        const auto& r = model.rows[i];
        if (ar[i] < 0 && r.lower) return "ray decreases row " + r.name + " with a lower side";
        if (ar[i] > 0 && r.upper) return "ray increases row " + r.name + " with an upper side";
      }
      if (!(slope < 0)) return "ray does not improve the objective";
      return "";
    }
    case Outcome::stopped: return "stopped";
  }
  return "unknown outcome";
}

}  // namespace plumb::exact::testing
