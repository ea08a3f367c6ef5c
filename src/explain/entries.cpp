// The finite sides and bounds of a model, with the labels that speak for them.
#include "entries.hpp"

#include <stdexcept>

namespace plumb::explain::detail {

namespace {

using certificate::EntryKind;
using certificate::Limit;

// A bound speaks through its own label when it has one, else through its column's; hard and group
// fall back to the column's when the bound's own label is silent on them.
Member bound_member(const model::Column& column, int index, Limit limit) {
  const model::Label& own = limit == Limit::lower ? column.lower_label : column.upper_label;
  Member m;
  m.entry = {EntryKind::column, column.name, limit};
  m.index = index;
  m.value = *(limit == Limit::lower ? column.lower : column.upper);
  m.label = own.empty() ? &column.label : &own;
  m.hard = own.hard ? *own.hard : column.label.hard.value_or(false);
  m.group = own.group.empty() ? column.label.group : own.group;
  m.unit = own.unit.empty() ? column.label.unit : own.unit;
  m.weight = own.weight ? *own.weight : column.label.weight.value_or(Rational(1));
  return m;
}

Member row_member(const model::Row& row, int index, Limit limit) {
  Member m;
  m.entry = {EntryKind::row, row.name, limit};
  m.index = index;
  m.value = *(limit == Limit::lower ? row.lower : row.upper);
  m.label = &row.label;
  m.hard = row.label.hard.value_or(false);
  m.group = row.label.group;
  m.unit = row.label.unit;
  m.weight = row.label.weight.value_or(Rational(1));
  return m;
}

}  // namespace

Entries::Entries(const model::Model& model)
    : row_lower_(static_cast<std::size_t>(model.row_count()), -1),
      row_upper_(row_lower_),
      column_lower_(static_cast<std::size_t>(model.column_count()), -1),
      column_upper_(column_lower_) {
  auto add = [this](Member member, std::vector<int>& ids, int index) {
    ids[static_cast<std::size_t>(index)] = size();
    all_.push_back(std::move(member));
  };
  for (int i = 0; i < model.row_count(); ++i) {
    const model::Row& row = model.rows[static_cast<std::size_t>(i)];
    if (row.lower) add(row_member(row, i, Limit::lower), row_lower_, i);
    if (row.upper) add(row_member(row, i, Limit::upper), row_upper_, i);
    if (row.lower && row.upper && *row.lower > *row.upper)
      crossed_.emplace_back(row_side(i, Limit::lower), row_side(i, Limit::upper));
  }
  for (int j = 0; j < model.column_count(); ++j) {
    const model::Column& column = model.columns[static_cast<std::size_t>(j)];
    if (column.lower) add(bound_member(column, j, Limit::lower), column_lower_, j);
    if (column.upper) add(bound_member(column, j, Limit::upper), column_upper_, j);
    if (column.lower && column.upper && *column.lower > *column.upper)
      crossed_.emplace_back(column_bound(j, Limit::lower), column_bound(j, Limit::upper));
  }
}

int Entries::row_side(int row, Limit limit) const {
  return (limit == Limit::lower ? row_lower_ : row_upper_)[static_cast<std::size_t>(row)];
}

int Entries::column_bound(int column, Limit limit) const {
  return (limit == Limit::lower ? column_lower_ : column_upper_)[static_cast<std::size_t>(column)];
}

std::vector<std::pair<int, Rational>> Entries::farkas_terms(const model::Model& model,
                                                            const std::vector<Rational>& y) const {
  std::vector<std::pair<int, Rational>> terms;
  auto use = [&terms](int id, Rational multiplier) {
    if (id < 0) throw std::logic_error("explain: a Farkas multiplier on an infinite side or bound");
    terms.emplace_back(id, std::move(multiplier));
  };
  for (int i = 0; i < model.row_count(); ++i) {
    const Rational& yi = y[static_cast<std::size_t>(i)];
    if (yi > 0) use(row_side(i, Limit::lower), yi);
    if (yi < 0) use(row_side(i, Limit::upper), -yi);
  }
  for (int j = 0; j < model.column_count(); ++j) {
    Rational a = 0;
    auto rows = model.matrix.column_rows(j);
    auto values = model.matrix.column_values(j);
    for (std::size_t k = 0; k < rows.size(); ++k) a += y[static_cast<std::size_t>(rows[k])] * values[k];
    if (a > 0) use(column_bound(j, Limit::upper), a);
    if (a < 0) use(column_bound(j, Limit::lower), -a);
  }
  return terms;
}

}  // namespace plumb::explain::detail
