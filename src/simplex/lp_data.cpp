#include "lp_data.hpp"

#include <algorithm>
#include <cmath>
#include <limits>

namespace plumb::simplex::detail {
namespace {

constexpr double infinity = std::numeric_limits<double>::infinity();

double side(const model::Side& s, double missing) { return s ? numeric::to_double(*s) : missing; }

// The power of two nearest to v (v > 0), so scaling adds no rounding error.
double power_of_two(double v) { return std::ldexp(1.0, static_cast<int>(std::lround(std::log2(v)))); }

}  // namespace

LpData lp_from_model(const model::Model& model) {
  LpData lp;
  lp.rows = model.row_count();
  lp.columns = model.column_count();
  const auto& a = model.matrix;
  for (int j = 0; j < lp.columns; ++j) {
    auto rows = a.column_rows(j);
    auto values = a.column_values(j);
    for (std::size_t k = 0; k < rows.size(); ++k) lp.by_column.push(rows[k], numeric::to_double(values[k]));
    lp.by_column.close();
  }
  lp.column_scale.assign(lp.columns, 1);
  lp.row_scale.assign(lp.rows, 1);
  lp.lower.resize(lp.variables());
  lp.upper.resize(lp.variables());
  for (int j = 0; j < lp.columns; ++j) take_column_limits(lp, j, model.columns[j]);
  for (int i = 0; i < lp.rows; ++i) take_row_limits(lp, i, model.rows[i]);
  take_objective(lp, model.objective);
  build_rows(lp);
  return lp;
}

void take_column_limits(LpData& lp, int column, const model::Column& from) {
  lp.lower[column] = side(from.lower, -infinity) / lp.column_scale[column];
  lp.upper[column] = side(from.upper, infinity) / lp.column_scale[column];
}

void take_row_limits(LpData& lp, int row, const model::Row& from) {
  lp.lower[lp.columns + row] = side(from.lower, -infinity) * lp.row_scale[row];
  lp.upper[lp.columns + row] = side(from.upper, infinity) * lp.row_scale[row];
}

void take_objective(LpData& lp, const model::Objective& from) {
  lp.sense = from.sense == model::Sense::maximise ? -1 : 1;
  lp.constant = numeric::to_double(from.constant);
  lp.cost.assign(lp.variables(), 0);
  for (int j = 0; j < lp.columns; ++j)
    lp.cost[j] = lp.sense * numeric::to_double(from.coefficients[j]) * lp.column_scale[j];
}

void build_rows(LpData& lp) {
  std::vector<int> counts(lp.rows + 1, 0);
  for (int i : lp.by_column.index) ++counts[i + 1];
  lp.by_row.start.assign(lp.rows + 1, 0);
  for (int i = 0; i < lp.rows; ++i) lp.by_row.start[i + 1] = lp.by_row.start[i] + counts[i + 1];
  lp.by_row.index.resize(lp.by_column.index.size());
  lp.by_row.value.resize(lp.by_column.index.size());
  std::vector<int> fill(lp.by_row.start.begin(), lp.by_row.start.end() - 1);
  for (int j = 0; j < lp.columns; ++j)
    for (int p = lp.by_column.start[j]; p < lp.by_column.start[j + 1]; ++p) {
      int slot = fill[lp.by_column.index[p]]++;
      lp.by_row.index[slot] = j;
      lp.by_row.value[slot] = lp.by_column.value[p];
    }
}

void scale(LpData& lp) {
  const int m = lp.rows, n = lp.columns;
  std::vector<double> r(m, 1), c(n, 1);
  auto& col = lp.by_column;
  std::vector<double> row_min(m), row_max(m);
  auto spread = [&]() {
    double worst = 1;
    for (int j = 0; j < n; ++j)
      for (int p = col.start[j]; p < col.start[j + 1]; ++p) {
        double v = std::abs(col.value[p]) * r[col.index[p]] * c[j];
        worst = std::max(worst, std::max(v, 1 / v));
      }
    return worst;
  };
  double previous = spread();
  for (int pass = 0; pass < 8 && previous > 1; ++pass) {
    std::fill(row_min.begin(), row_min.end(), infinity);
    std::fill(row_max.begin(), row_max.end(), 0);
    for (int j = 0; j < n; ++j)
      for (int p = col.start[j]; p < col.start[j + 1]; ++p) {
        int i = col.index[p];
        double v = std::abs(col.value[p]) * c[j];
        row_min[i] = std::min(row_min[i], v);
        row_max[i] = std::max(row_max[i], v);
      }
    for (int i = 0; i < m; ++i)
      if (row_max[i] > 0) r[i] = 1 / std::sqrt(row_min[i] * row_max[i]);
    for (int j = 0; j < n; ++j) {
      double lo = infinity, hi = 0;
      for (int p = col.start[j]; p < col.start[j + 1]; ++p) {
        double v = std::abs(col.value[p]) * r[col.index[p]];
        lo = std::min(lo, v);
        hi = std::max(hi, v);
      }
      if (hi > 0) c[j] = 1 / std::sqrt(lo * hi);
    }
    double now = spread();
    if (now > 0.9 * previous) break;
    previous = now;
  }
  // Equilibrate: each column's largest entry becomes about 1.
  for (int j = 0; j < n; ++j) {
    double hi = 0;
    for (int p = col.start[j]; p < col.start[j + 1]; ++p) hi = std::max(hi, std::abs(col.value[p]) * r[col.index[p]] * c[j]);
    if (hi > 0) c[j] /= hi;
  }
  for (int i = 0; i < m; ++i) r[i] = power_of_two(r[i]);
  for (int j = 0; j < n; ++j) c[j] = power_of_two(c[j]);

  for (int j = 0; j < n; ++j) {
    for (int p = col.start[j]; p < col.start[j + 1]; ++p) col.value[p] *= r[col.index[p]] * c[j];
    lp.column_scale[j] = c[j];
  }
  lp.row_scale = r;
  scale_limits_and_costs(lp);
  build_rows(lp);
}

void scale_limits_and_costs(LpData& lp) {
  const int n = lp.columns;
  for (int j = 0; j < n; ++j) {
    const double c = lp.column_scale[j];
    lp.cost[j] *= c;
    lp.lower[j] /= c;
    lp.upper[j] /= c;
  }
  for (int i = 0; i < lp.rows; ++i) {
    const double r = lp.row_scale[i];
    lp.lower[n + i] *= r;
    lp.upper[n + i] *= r;
    lp.cost[n + i] /= r;  // nonzero only in a correction problem
  }
}

}  // namespace plumb::simplex::detail
