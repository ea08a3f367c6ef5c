// Internal to explain: the finite sides and bounds of a model, and Farkas multipliers on them.
#pragma once

#include "plumb/explain/explain.hpp"

#include <utility>
#include <vector>

namespace plumb::explain::detail {

// Every finite row side and column bound of a model, numbered: rows first in model order (lower,
// then upper), then columns likewise.  `Member::multiplier` is left 0.
class Entries {
 public:
  explicit Entries(const model::Model& model);

  const std::vector<Member>& all() const { return all_; }
  const Member& operator[](int id) const { return all_[static_cast<std::size_t>(id)]; }
  int size() const { return static_cast<int>(all_.size()); }
  // The id of a row's or column's side or bound, or -1 when it is infinite.
  int row_side(int row, certificate::Limit limit) const;
  int column_bound(int column, certificate::Limit limit) const;
  int id_of(const Member& m) const {
    return m.entry.kind == certificate::EntryKind::row ? row_side(m.index, m.entry.limit)
                                                       : column_bound(m.index, m.entry.limit);
  }
  // Pairs of ids (lower, upper) of rows and columns whose lower limit lies above the upper one.
  const std::vector<std::pair<int, int>>& crossed() const { return crossed_; }

  // The entries a Farkas vector y over the rows uses (docs/explaining.md): y_i > 0 the lower side
  // of row i, y_i < 0 its upper side with -y_i; with a = A^T y, a_j > 0 the upper bound of column
  // j with a_j, a_j < 0 its lower bound with -a_j.  Throws std::logic_error when one of them is
  // infinite (a certificate the checker accepted never needs one).
  std::vector<std::pair<int, Rational>> farkas_terms(const model::Model& model,
                                                     const std::vector<Rational>& y) const;

 private:
  std::vector<Member> all_;
  std::vector<int> row_lower_, row_upper_, column_lower_, column_upper_;
  std::vector<std::pair<int, int>> crossed_;
};

}  // namespace plumb::explain::detail
