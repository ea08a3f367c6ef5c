#include "duplicates.hpp"

#include <algorithm>
#include <cstdint>
#include <functional>
#include <utility>

namespace plumb::health::detail {
namespace {

using model::Model;
using model::Side;
using numeric::Rational;

std::uint64_t mix(std::uint64_t seed, std::uint64_t value) {
  // 64-bit variant of the usual hash_combine step: cheap, and spreads small integers well.
  return seed ^ (value + 0x9e3779b97f4a7c15ULL + (seed << 12) + (seed >> 4));
}

std::uint64_t hash_integer(mpz_srcptr z) {
  std::uint64_t h = static_cast<std::uint64_t>(mpz_sgn(z) + 2);
  for (std::size_t limb = 0; limb < mpz_size(z); ++limb) h = mix(h, mpz_getlimbn(z, static_cast<mp_size_t>(limb)));
  return h;
}

// Hash of the exact value: GMP keeps rationals in lowest terms, so equal values hash alike.
std::uint64_t hash_rational(const Rational& value) {
  mpq_srcptr q = value.backend().data();
  return mix(hash_integer(mpq_numref(q)), hash_integer(mpq_denref(q)));
}

std::uint64_t hash_side(std::uint64_t seed, const Side& side) {
  return side ? mix(mix(seed, 1), hash_rational(*side)) : mix(seed, 0);
}

// Sorts the candidates by hash, then splits each run of equal hashes into groups of truly equal
// members; `hash_of` and `same` see indices.  Expected time is linear plus the sort.
template <class HashOf, class Same>
std::vector<std::vector<int>> group_equal(int count, HashOf hash_of, Same same,
                                          const std::function<bool(int)>& candidate) {
  std::vector<std::pair<std::uint64_t, int>> keyed;
  for (int k = 0; k < count; ++k)
    if (candidate(k)) keyed.emplace_back(hash_of(k), k);
  std::sort(keyed.begin(), keyed.end());
  std::vector<std::vector<int>> groups;
  for (std::size_t start = 0; start < keyed.size();) {
    std::size_t end = start;
    while (end < keyed.size() && keyed[end].first == keyed[start].first) ++end;
    if (end - start > 1) {
      std::vector<std::vector<int>> run;
      for (std::size_t p = start; p < end; ++p) {
        int k = keyed[p].second;
        auto home = std::find_if(run.begin(), run.end(), [&](const std::vector<int>& g) { return same(g.front(), k); });
        if (home == run.end())
          run.push_back({k});
        else
          home->push_back(k);
      }
      for (auto& g : run)
        if (g.size() > 1) groups.push_back(std::move(g));
    }
    start = end;
  }
  std::sort(groups.begin(), groups.end(), [](const auto& a, const auto& b) { return a.front() < b.front(); });
  return groups;
}

}  // namespace

std::vector<std::vector<int>> duplicate_rows(const Model& model) {
  const model::Matrix& a = model.matrix;
  auto hash_of = [&](int i) {
    std::uint64_t h = hash_side(hash_side(0, model.rows[i].lower), model.rows[i].upper);
    auto columns = a.row_columns(i);
    auto positions = a.row_positions(i);
    for (std::size_t k = 0; k < columns.size(); ++k)
      h = mix(mix(h, static_cast<std::uint64_t>(columns[k])), hash_rational(a.value(positions[k])));
    return h;
  };
  auto same = [&](int i, int r) {
    if (model.rows[i].lower != model.rows[r].lower || model.rows[i].upper != model.rows[r].upper) return false;
    auto ci = a.row_columns(i), cr = a.row_columns(r);
    if (!std::equal(ci.begin(), ci.end(), cr.begin(), cr.end())) return false;
    auto pi = a.row_positions(i), pr = a.row_positions(r);
    for (std::size_t k = 0; k < pi.size(); ++k)
      if (a.value(pi[k]) != a.value(pr[k])) return false;
    return true;
  };
  return group_equal(model.row_count(), hash_of, same, [&](int i) { return !a.row_columns(i).empty(); });
}

std::vector<std::vector<int>> duplicate_columns(const Model& model) {
  const model::Matrix& a = model.matrix;
  auto hash_of = [&](int j) {
    std::uint64_t h = hash_rational(model.objective.coefficients[j]);
    auto rows = a.column_rows(j);
    auto values = a.column_values(j);
    for (std::size_t k = 0; k < rows.size(); ++k)
      h = mix(mix(h, static_cast<std::uint64_t>(rows[k])), hash_rational(values[k]));
    return h;
  };
  auto same = [&](int j, int c) {
    if (model.objective.coefficients[j] != model.objective.coefficients[c]) return false;
    auto rj = a.column_rows(j), rc = a.column_rows(c);
    auto vj = a.column_values(j), vc = a.column_values(c);
    return std::equal(rj.begin(), rj.end(), rc.begin(), rc.end()) && std::equal(vj.begin(), vj.end(), vc.begin());
  };
  return group_equal(model.column_count(), hash_of, same, [&](int j) { return !a.column_rows(j).empty(); });
}

}  // namespace plumb::health::detail
