#include "ratio_test.hpp"

#include <algorithm>
#include <cmath>
#include <limits>

namespace plumb::simplex::detail {

namespace {

double ratio(const DualCandidate& c) { return c.slack / c.rate; }

double relaxed_ratio(const DualCandidate& c, double dual_tolerance) {
  return (std::max(c.slack, 0.0) + dual_tolerance) / c.rate;
}

}  // namespace

DualStep dual_ratio_test(std::vector<DualCandidate>& candidates, double slope, double dual_tolerance,
                         double primal_tolerance) {
  DualStep result;
  // The Harris group [first, last) leaves `slope_after`: the step is unbounded when every
  // breakpoint is passed with the slope still positive, else the largest rate in it enters.
  auto last_group = [&](auto first, auto last, double slope_after) {
    if (slope_after > primal_tolerance) return DualStep{};
    auto best = std::max_element(
        first, last, [](const DualCandidate& a, const DualCandidate& b) { return a.rate < b.rate; });
    result.entering = best->variable;
    result.step = ratio(*best);
    return std::move(result);
  };
  auto passed = [&](auto first, auto last) {
    double slope_after = slope;
    for (auto it = first; it != last; ++it) slope_after -= it->rate * it->range;
    return slope_after;
  };
  // A ratio that is not a number (rounding run wild upstream) has no place in the order: it would
  // leave the sort's order undefined and the walk below stuck at an empty group.
  std::erase_if(candidates, [](const DualCandidate& c) { return std::isnan(ratio(c)); });
  // The first group in two passes over the candidates: the step usually ends in it.
  double bound = std::numeric_limits<double>::infinity();
  for (const auto& c : candidates) bound = std::min(bound, relaxed_ratio(c, dual_tolerance));
  auto group_end = std::partition(candidates.begin(), candidates.end(),
                                  [&](const DualCandidate& c) { return ratio(c) <= bound; });
  double slope_after = passed(candidates.begin(), group_end);
  if (!(slope_after > 0 && group_end != candidates.end()))
    return last_group(candidates.begin(), group_end, slope_after);
  // Groups are passed in ratio order.  A relaxed ratio exceeds its ratio, so each later group is
  // the next run of that order up to the least relaxed ratio still ahead: one pass in all, where
  // recomputing the bound per group was quadratic in the number of groups (thousands on models
  // with many boxed columns).  The step usually ends a few groups on, so the order is built a
  // batch at a time (the batch's members by selection, then sorted), not over every candidate:
  // sorting all of them had been two fifths of fit2d's search (10 000 columns in each pivot row).
  for (auto it = candidates.begin(); it != group_end; ++it) result.flips.push_back(it->variable);
  slope = slope_after;
  const auto end = candidates.end();
  auto by_ratio = [](const DualCandidate& a, const DualCandidate& b) { return ratio(a) < ratio(b); };
  auto ordered_end = group_end;  // [group_end, ordered_end) in ratio order, none above those after
  // Per ordered candidate: the least relaxed ratio over it and every candidate after it.
  std::vector<double> least_relaxed_ahead;
  std::ptrdiff_t batch = 64;
  auto order_next_batch = [&] {
    const auto batch_end = end - ordered_end > batch ? ordered_end + batch : end;
    if (batch_end != end) std::nth_element(ordered_end, batch_end, end, by_ratio);
    std::sort(ordered_end, batch_end, by_ratio);
    double least = std::numeric_limits<double>::infinity();
    for (auto it = batch_end; it != end; ++it) least = std::min(least, relaxed_ratio(*it, dual_tolerance));
    least_relaxed_ahead.resize(static_cast<std::size_t>(batch_end - group_end));
    for (auto it = batch_end; it-- != ordered_end;)
      least_relaxed_ahead[static_cast<std::size_t>(it - group_end)] = least =
          std::min(least, relaxed_ratio(*it, dual_tolerance));
    ordered_end = batch_end;
    batch *= 2;
  };
  for (auto first = group_end;;) {
    if (first == ordered_end) order_next_batch();
    bound = least_relaxed_ahead[static_cast<std::size_t>(first - group_end)];
    auto last = first;
    while (true) {
      if (last == ordered_end) {
        if (last == end) break;
        order_next_batch();
      }
      if (!(ratio(*last) <= bound)) break;
      ++last;
    }
    slope_after = passed(first, last);
    if (!(slope_after > 0 && last != end)) return last_group(first, last, slope_after);
    for (auto it = first; it != last; ++it) result.flips.push_back(it->variable);
    slope = slope_after;
    first = last;
  }
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
