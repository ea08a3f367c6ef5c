#include "ratio_test.hpp"

#include <algorithm>
#include <cmath>
#include <limits>

namespace plumb::simplex::detail {

DualStep dual_ratio_test(std::vector<DualCandidate>& candidates, double slope, double dual_tolerance,
                         double primal_tolerance) {
  constexpr double infinity = std::numeric_limits<double>::infinity();
  DualStep result;
  auto remaining_begin = candidates.begin();
  while (remaining_begin != candidates.end()) {
    // Harris bound over the remaining breakpoints.
    double bound = infinity;
    for (auto it = remaining_begin; it != candidates.end(); ++it)
      bound = std::min(bound, (std::max(it->slack, 0.0) + dual_tolerance) / it->rate);
    // The group of breakpoints at or below it goes to the front of the remaining range.
    auto group_end = std::partition(remaining_begin, candidates.end(),
                                    [&](const DualCandidate& c) { return c.slack / c.rate <= bound; });
    double slope_after = slope;
    for (auto it = remaining_begin; it != group_end; ++it) slope_after -= it->rate * it->range;
    if (slope_after > 0 && group_end != candidates.end()) {
      for (auto it = remaining_begin; it != group_end; ++it) result.flips.push_back(it->variable);
      slope = slope_after;
      remaining_begin = group_end;
      continue;
    }
    if (slope_after > primal_tolerance) {
      // Every breakpoint can be passed and the slope stays positive: the dual is unbounded.
      return DualStep{};
    }
    auto best = std::max_element(remaining_begin, group_end,
                                 [](const DualCandidate& a, const DualCandidate& b) { return a.rate < b.rate; });
    result.entering = best->variable;
    result.step = best->slack / best->rate;
    return result;
  }
  return DualStep{};
}

PrimalStep primal_ratio_test(const std::vector<PrimalCandidate>& candidates, double primal_tolerance) {
  double bound = std::numeric_limits<double>::infinity();
  for (const auto& c : candidates) bound = std::min(bound, (std::max(c.distance, 0.0) + primal_tolerance) / c.rate);
  PrimalStep result;
  double best_rate = 0;
  for (const auto& c : candidates) {
    if (c.distance / c.rate <= bound && c.rate > best_rate) {
      best_rate = c.rate;
      result.leaving = c.position;
      result.step = c.distance / c.rate;
    }
  }
  return result;
}

}  // namespace plumb::simplex::detail
