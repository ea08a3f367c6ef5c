// The narrow door to the basis factorization (include/plumb/simplex/float_lu.hpp).
#include "plumb/simplex/float_lu.hpp"

#include "basis_factor.hpp"

namespace plumb::simplex {

struct FloatLu::Factors {
  detail::FloatBasisFactor lu;
  detail::FloatBasisFactor::Singularity singular;
};

FloatLu::FloatLu() : factors_(std::make_unique<Factors>()) {}
FloatLu::~FloatLu() = default;
FloatLu::FloatLu(FloatLu&&) noexcept = default;
FloatLu& FloatLu::operator=(FloatLu&&) noexcept = default;

bool FloatLu::factorize(int m, FloatColumns columns, double pivot_floor) {
  detail::SparseVectors moved;
  moved.start = std::move(columns.start);
  moved.index = std::move(columns.index);
  moved.value = std::move(columns.value);
  factors_->lu.absolute_tolerance = pivot_floor;
  factors_->singular = factors_->lu.factorize(m, moved);
  return factors_->singular.empty();
}

std::vector<std::pair<int, int>> FloatLu::unpivoted() const {
  const auto& singular = factors_->singular;
  std::vector<std::pair<int, int>> pairs;
  for (std::size_t k = 0; k < singular.positions.size() && k < singular.rows.size(); ++k)
    pairs.emplace_back(singular.positions[k], singular.rows[k]);
  return pairs;
}

void FloatLu::solve(std::vector<double>& x) const { factors_->lu.ftran(x); }

void FloatLu::solve_transposed(std::vector<double>& y) const { factors_->lu.btran(y); }

}  // namespace plumb::simplex
