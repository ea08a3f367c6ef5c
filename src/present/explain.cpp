// plumb explain's renderings: the members of the proven subsystem in the owner's words and in
// algebra, as text and as JSON, and the live progress line.  docs/explaining.md shows the layout.
#include "plumb/present/explain.hpp"

#include "format.hpp"

#include <cstdio>
#include <ostream>

namespace plumb::present {
namespace {

using certificate::EntryKind;
using certificate::Limit;
using detail::coefficient_text;
using detail::put_number;
using numeric::Rational;

constexpr std::size_t form_terms = 12;  // terms of a row's left-hand side shown before "... (N more)"

bool is_row(const explain::Member& m) { return m.entry.kind == EntryKind::row; }
bool is_lower(const explain::Member& m) { return m.entry.limit == Limit::lower; }

// Which side takes part, in words: "the lower side of row batch (an equation)".
std::string side_words(const model::Model& model, const explain::Member& m) {
  std::string side = is_lower(m) ? "lower" : "upper";
  if (!is_row(m)) return "the " + side + " bound of column " + m.entry.name;
  const model::Row& row = model.rows[static_cast<std::size_t>(m.index)];
  std::string kind;
  if (row.lower && row.upper) kind = *row.lower == *row.upper ? " (an equation)" : " (a ranged row)";
  return "the " + side + " side of row " + m.entry.name + kind;
}

// The side alone in algebra, with the unit: "butane + naphtha + ... >= 12000 bbl".
std::string form(const model::Model& model, const explain::Member& m) {
  std::string left = is_row(m) ? detail::expression_text(model, m.index, form_terms) : m.entry.name;
  std::string text = left + (is_lower(m) ? " >= " : " <= ") + coefficient_text(m.value);
  if (!m.unit.empty()) text += " " + m.unit;
  return text;
}

std::string hardness(const explain::Member& m) { return m.hard ? "hard" : "soft"; }

void write_members(std::ostream& out, const model::Model& model,
                   const std::vector<const explain::Member*>& list, bool numbered) {
  std::size_t k = 0;
  for (const explain::Member* m : list) {
    std::string statement = m->label && !m->label->statement.empty() ? m->label->statement : m->entry.name;
    out << "  " << (numbered ? std::to_string(++k) + ". " : "- ") << statement << "\n";
    out << "     " << form(model, *m) << "\n";
    out << "     " << hardness(*m) << "; " << side_words(model, *m);
    if (!m->group.empty()) out << "; group " << m->group;
    out << "\n";
  }
}

std::vector<const explain::Member*> all_of(const std::vector<explain::Member>& members) {
  std::vector<const explain::Member*> list;
  for (const auto& m : members) list.push_back(&m);
  return list;
}

std::vector<const explain::Member*> used(const std::vector<explain::Member>& members) {
  std::vector<const explain::Member*> list;
  for (const auto& m : members)
    if (m.multiplier != 0) list.push_back(&m);
  return list;
}

std::string status_text(explain::Outcome outcome) {
  switch (outcome) {
    case explain::Outcome::feasible:
      return "feasible";
    case explain::Outcome::infeasible_subsystem:
      return "infeasible_subsystem";
    case explain::Outcome::inconsistent:
      return "inconsistent";
    case explain::Outcome::stopped:
      return "stopped";
  }
  return "unknown";
}

nlohmann::ordered_json member_json(const model::Model& model, const explain::Member& m) {
  nlohmann::ordered_json item;
  item["kind"] = certificate::to_string(m.entry.kind);
  item["name"] = m.entry.name;
  item["side"] = certificate::to_string(m.entry.limit);
  put_number(item["value"], m.value);
  item["form"] = form(model, m);
  item["hard"] = m.hard;
  item["group"] = m.group;
  item["statement"] = m.label ? m.label->statement : "";
  item["unit"] = m.unit;
  put_number(item["multiplier"], m.multiplier);
  return item;
}

}  // namespace

void write_explain_text(const model::Model& model, const explain::Explanation& result,
                        const std::string& certificate_path, std::ostream& out) {
  out << "model      " << model.source.path << "\n";
  out << "           sha256 " << model.source.sha256.substr(0, 16) << "...  " << model.row_count()
      << " rows, " << model.column_count() << " columns, " << model.matrix.nonzeros() << " non-zeros\n";
  if (int integers = detail::integer_columns(model))
    out << "note       " << integers << " columns are marked integer: plumb explained the LP relaxation\n";
  std::size_t rows = 0;
  for (const auto& m : result.members) rows += is_row(m);
  switch (result.outcome) {
    case explain::Outcome::feasible:
      out << "status     feasible: a point meets every row side and column bound, so nothing conflicts\n";
      break;
    case explain::Outcome::infeasible_subsystem:
      out << "status     infeasible: " << result.members.size()
          << " soft requirements cannot all hold together with the hard ones ("
          << detail::count_of(rows, "row side", "row sides") << ", "
          << detail::count_of(result.members.size() - rows, "bound", "bounds")
          << "); drop any one of them and the rest can hold\n\n";
      if (!result.groups.empty())
        out << "These " << result.groups.size()
            << " groups cannot all hold together: " << detail::name_list(result.groups, result.groups.size())
            << "\n";
      out << "These requirements cannot all hold together:\n";
      write_members(out, model, all_of(result.members), true);
      break;
    case explain::Outcome::inconsistent:
      out << "status     inconsistent: the hard requirements alone cannot all hold; the model itself is "
             "inconsistent\n\n";
      out << "These " << result.hard.size() << " hard requirements cannot all hold together:\n";
      write_members(out, model, all_of(result.hard), true);
      break;
    case explain::Outcome::stopped:
      return;
  }
  if (result.outcome == explain::Outcome::infeasible_subsystem) {
    auto against = used(result.hard);
    if (!against.empty()) {
      out << "\nagainst these hard requirements, kept as given:\n";
      write_members(out, model, against, false);
    }
  }
  out << "\n";
  if (result.outcome != explain::Outcome::feasible) {
    out << "search     the first Farkas certificate used " << result.support_size << " sides and bounds; ";
    for (std::size_t k = 0; k < result.orders.size(); ++k)
      out << (k ? "; " : "") << result.orders[k].name << ": "
          << detail::count_of(result.orders[k].members, "member", "members") << " in "
          << result.orders[k].sub_solves << " sub-solves";
    out << "\n           " << result.sub_solves << " exact sub-solves on one session in ";
    char seconds[32];
    std::snprintf(seconds, sizeof seconds, "%.2f s", result.seconds);
    out << seconds << "\n";
  }
  out << "checked    " << result.verdict.proven << "\n";
  if (!certificate_path.empty()) out << "certificate written to " << certificate_path << "\n";
  out << "caution    " << caution_line << "\n";
}

nlohmann::ordered_json explain_json(const model::Model& model, const explain::Explanation& result,
                                    const RunFigures& figures) {
  nlohmann::ordered_json out;
  out["model"] = {{"file", model.source.path},           {"sha256", model.source.sha256},
                  {"rows", model.row_count()},           {"columns", model.column_count()},
                  {"nonzeros", model.matrix.nonzeros()}, {"integer_columns", detail::integer_columns(model)}};
  out["status"] = status_text(result.outcome);
  if (result.outcome == explain::Outcome::stopped) {
    out["stopped_because"] = run::describe(result.stop_reason);
    out["stopped_during"] = result.stopped_during;
  }
  if (result.outcome == explain::Outcome::feasible) {
    nlohmann::ordered_json x = nlohmann::ordered_json::array();
    for (const auto& [name, value] : result.certificate.x) {
      nlohmann::ordered_json item;
      item["name"] = name;
      put_number(item, value);
      x.push_back(std::move(item));
    }
    out["x"] = std::move(x);
  }
  nlohmann::ordered_json members = nlohmann::ordered_json::array(), hard = nlohmann::ordered_json::array();
  for (const auto& m : result.members) members.push_back(member_json(model, m));
  for (const explain::Member* m : used(result.hard)) hard.push_back(member_json(model, *m));
  out["members"] = std::move(members);
  out["groups"] = result.groups;
  out["hard"] = std::move(hard);
  std::size_t rows = 0;
  for (const auto& m : result.members) rows += is_row(m);
  out["sizes"] = {{"members", result.members.size()},       {"row_sides", rows},
                  {"bounds", result.members.size() - rows}, {"hard_entries", result.hard.size()},
                  {"hard_used", used(result.hard).size()},  {"first_support", result.support_size}};
  nlohmann::ordered_json orders = nlohmann::ordered_json::array();
  for (const auto& order : result.orders)
    orders.push_back({{"order", order.name}, {"members", order.members}, {"sub_solves", order.sub_solves}});
  out["search"] = {{"orders", std::move(orders)},           {"sub_solves", result.sub_solves},
                   {"float_seconds", result.float_seconds}, {"exact_seconds", result.exact_seconds},
                   {"seconds", figures.solve_seconds},      {"peak_memory_mib", figures.peak_memory_mib}};
  out["checked"] = result.verdict.valid;
  out["proven"] = result.verdict.proven;
  out["caution"] = caution_line;
  return out;
}

std::string explain_progress_line(const explain::Progress& p) {
  char line[160];
  std::snprintf(line, sizeof line, "  %-28s %6ld left  %6ld sub-solves  %7.1f s", p.phase.c_str(),
                p.candidates, p.sub_solves, p.elapsed_seconds);
  return line;
}

}  // namespace plumb::present
