// plumb explain's renderings: the members of the proven subsystem in the owner's words and in
// algebra, as text and as JSON, and the live progress line.  docs/explaining.md shows the layout.
#include "plumb/present/explain.hpp"

#include "format.hpp"

#include <algorithm>

#include <cstdio>
#include <ostream>
#include <sstream>

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

std::string statement_of(const explain::Member& m) {
  return m.label && !m.label->statement.empty() ? m.label->statement : m.entry.name;
}

std::string hardness(const explain::Member& m) { return m.hard ? "hard" : "soft"; }

void write_members(std::ostream& out, const model::Model& model,
                   const std::vector<const explain::Member*>& list, bool numbered) {
  std::size_t k = 0;
  for (const explain::Member* m : list) {
    out << "  " << (numbered ? std::to_string(++k) + ". " : "- ") << statement_of(*m) << "\n";
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

// Multipliers scaled to the smallest integers with the same ratios, while those stay readable
// (at most a million); else the multipliers as they are.
constexpr long readable_weight = 1000000;
std::vector<Rational> small_weights(const std::vector<Rational>& multipliers) {
  numeric::Integer common = 1;
  for (const Rational& m : multipliers) common = lcm(common, numeric::Integer(denominator(m)));
  numeric::Integer divisor = 0;
  for (const Rational& m : multipliers)
    divisor = gcd(divisor, numeric::Integer(numerator(m) * (common / denominator(m))));
  if (divisor == 0) return multipliers;
  std::vector<Rational> scaled;
  for (const Rational& m : multipliers) {
    scaled.push_back(m * common / divisor);
    if (scaled.back() > readable_weight) return multipliers;
  }
  return scaled;
}

// The Farkas combination as a derivation: each term with its weight, a lower side added and an
// upper one subtracted; everything in x cancels and what is left, 0 >= total, is false.
struct Derivation {
  struct Term {
    const explain::Member* member;
    Rational weight;
    Rational contribution;  // weight times the limit, signed as it enters the total
  };
  std::vector<Term> terms;             // the largest contributions first
  Rational total;                      // > 0
  std::vector<std::string> cancelled;  // the columns that drop out
};

Derivation derivation_of(const model::Model& model, const explain::Explanation& result) {
  std::vector<const explain::Member*> taking_part = used(result.members);
  for (const explain::Member* m : used(result.hard)) taking_part.push_back(m);
  std::vector<Rational> multipliers;
  for (const explain::Member* m : taking_part) multipliers.push_back(m->multiplier);
  std::vector<Rational> weights = small_weights(multipliers);
  Derivation d;
  std::vector<bool> touched(static_cast<std::size_t>(model.column_count()), false);
  for (std::size_t k = 0; k < taking_part.size(); ++k) {
    const explain::Member* m = taking_part[k];
    Rational contribution = is_lower(*m) ? Rational(weights[k] * m->value) : Rational(-weights[k] * m->value);
    d.total += contribution;
    d.terms.push_back({m, weights[k], contribution});
    if (!is_row(*m)) {
      touched[static_cast<std::size_t>(m->index)] = true;
      continue;
    }
    for (int j : model.matrix.row_columns(m->index)) touched[static_cast<std::size_t>(j)] = true;
  }
  for (int j = 0; j < model.column_count(); ++j)
    if (touched[static_cast<std::size_t>(j)])
      d.cancelled.push_back(model.columns[static_cast<std::size_t>(j)].name);
  std::stable_sort(d.terms.begin(), d.terms.end(), [](const Derivation::Term& a, const Derivation::Term& b) {
    return abs(a.contribution) > abs(b.contribution);
  });
  return d;
}

constexpr std::size_t derivation_lines = 8;  // terms of a long derivation shown before "and N more"

void write_derivation(std::ostream& out, const model::Model& model, const explain::Explanation& result) {
  Derivation d = derivation_of(model, result);
  out << "\nWhy: weigh these requirements and add them up (a lower limit added, an upper one subtracted):\n";
  std::size_t shown = std::min(d.terms.size(), derivation_lines);
  for (std::size_t k = 0; k < shown; ++k) {
    const Derivation::Term& t = d.terms[k];
    out << "  " << (is_lower(*t.member) ? "+ " : "- ") << numeric::to_display(t.weight, 8) << " x "
        << statement_of(*t.member) << "\n";
    out << "       " << form(model, *t.member) << "\n";
  }
  if (shown < d.terms.size()) {
    Rational rest = 0;
    for (std::size_t k = shown; k < d.terms.size(); ++k) rest += d.terms[k].contribution;
    out << "  and " << detail::count_of(d.terms.size() - shown, "more requirement", "more requirements")
        << " (--json lists them), whose weighted limits add " << numeric::to_display(rest, 8) << "\n";
  }
  out << "  Every quantity cancels (" << detail::name_list(d.cancelled, 6) << "), and what is left says\n"
      << "  0 >= " << numeric::to_display(d.total, 8) << ", which is false: no plan meets all of them.\n";
}

// "lower it from 12000 to at most 11530 bbl (by 470)"
std::string move_words(const explain::Member& m, const Rational& to, const Rational& by) {
  std::string unit = m.unit.empty() ? "" : " " + m.unit;
  return std::string(is_lower(m) ? "lower it from " : "raise it from ") + numeric::to_display(m.value, 8) +
         (is_lower(m) ? " to at most " : " to at least ") + numeric::to_display(to, 8) + unit + " (by " +
         numeric::to_display(by, 8) + unit + ")";
}

void write_ways_out(std::ostream& out, const explain::WaysOut& ways) {
  out << "\nWays out, each requirement alone (the least change that makes the whole model feasible):\n";
  std::size_t k = 0;
  for (const explain::SingleChange& c : ways.single) {
    out << "  " << ++k << ". " << statement_of(c.member) << ":\n     ";
    switch (c.result) {
      case explain::SingleChange::Result::moves:
        out << move_words(c.member, c.to, c.by);
        break;
      case explain::SingleChange::Result::not_enough:
        out << "changing this alone is not enough: another conflict remains";
        break;
      case explain::SingleChange::Result::stopped:
        out << "not worked out: a limit was reached";
        break;
    }
    out << "\n";
  }
  if (ways.not_tried)
    out << "  (" << detail::count_of(ways.not_tried, "more member was", "more members were")
        << " not tried: --json and --ways-out N)\n";
  const explain::LeastTotalChange& least = ways.least;
  out << "\nLeast total change";
  switch (least.result) {
    case explain::LeastTotalChange::Result::found:
      out << " (every soft side and bound may move; "
          << (least.weighted ? "each weighs its label's weight per unit of its own, 1 where none is given"
                             : "each weighs 1 per unit of its own, as no label gives a weight")
          << "): " << numeric::to_display(least.total, 8) << " in all\n";
      for (const explain::Move& move : least.moves)
        out << "  - " << statement_of(move.member) << ": " << move_words(move.member, move.to, move.by)
            << "\n";
      break;
    case explain::LeastTotalChange::Result::hard_conflict:
      out << ": none; the hard requirements conflict whatever the soft ones do\n";
      break;
    case explain::LeastTotalChange::Result::stopped:
      out << ": not worked out, a limit was reached\n";
      break;
  }
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

nlohmann::ordered_json derivation_json(const model::Model& model, const explain::Explanation& result) {
  Derivation d = derivation_of(model, result);
  nlohmann::ordered_json terms = nlohmann::ordered_json::array();
  for (const Derivation::Term& t : d.terms) {
    nlohmann::ordered_json term;
    term["kind"] = certificate::to_string(t.member->entry.kind);
    term["name"] = t.member->entry.name;
    term["side"] = certificate::to_string(t.member->entry.limit);
    put_number(term["weight"], t.weight);
    put_number(term["contribution"], t.contribution);
    terms.push_back(std::move(term));
  }
  nlohmann::ordered_json out;
  out["terms"] = std::move(terms);
  put_number(out["total"], d.total);
  out["cancelled"] = d.cancelled;
  return out;
}

nlohmann::ordered_json move_json(const explain::Member& m, const Rational& to, const Rational& by) {
  nlohmann::ordered_json item;
  item["kind"] = certificate::to_string(m.entry.kind);
  item["name"] = m.entry.name;
  item["side"] = certificate::to_string(m.entry.limit);
  put_number(item["from"], m.value);
  put_number(item["to"], to);
  put_number(item["by"], by);
  return item;
}

nlohmann::ordered_json ways_out_json(const explain::WaysOut& ways) {
  nlohmann::ordered_json single = nlohmann::ordered_json::array();
  for (const explain::SingleChange& c : ways.single) {
    nlohmann::ordered_json item = move_json(c.member, c.to, c.by);
    const char* result = c.result == explain::SingleChange::Result::moves        ? "moves"
                         : c.result == explain::SingleChange::Result::not_enough ? "not_enough"
                                                                                 : "stopped";
    if (c.result != explain::SingleChange::Result::moves) {
      item.erase("to");
      item.erase("by");
    }
    item["result"] = result;
    item["checked"] = c.verdict.valid;
    single.push_back(std::move(item));
  }
  nlohmann::ordered_json least;
  const explain::LeastTotalChange& l = ways.least;
  least["result"] = l.result == explain::LeastTotalChange::Result::found           ? "found"
                    : l.result == explain::LeastTotalChange::Result::hard_conflict ? "hard_conflict"
                                                                                   : "stopped";
  least["weights"] = l.weighted ? "the labels' weight per unit of each side or bound, 1 where none is given"
                                : "1 per unit of each side or bound (no label gives a weight)";
  if (l.result == explain::LeastTotalChange::Result::found) {
    put_number(least["total"], l.total);
    nlohmann::ordered_json moves = nlohmann::ordered_json::array();
    for (const explain::Move& m : l.moves) moves.push_back(move_json(m.member, m.to, m.by));
    least["moves"] = std::move(moves);
  }
  least["checked"] = l.verdict.valid;
  nlohmann::ordered_json out;
  out["single"] = std::move(single);
  out["not_tried"] = ways.not_tried;
  out["least_total_change"] = std::move(least);
  return out;
}

// --all: each further conflict with its members, the hard entries it uses and its derivation, then
// the requirements set aside on the way, which relaxed together remove every conflict found.
void write_further(std::ostream& out, const model::Model& model, const explain::Explanation& result) {
  if (result.set_aside.empty()) return;
  std::size_t count = 1 + result.further.size();
  for (std::size_t k = 0; k < result.further.size(); ++k) {
    const explain::Explanation& more = result.further[k];
    out << "\nConflict " << k + 2 << " of " << count
        << " (found with the requirements set aside below left out):\n";
    write_members(out, model, all_of(more.members), true);
    auto against = used(more.hard);
    if (!against.empty()) {
      out << "\nagainst these hard requirements, kept as given:\n";
      write_members(out, model, against, false);
    }
    write_derivation(out, model, more);
    out << "  checked: " << more.verdict.proven << "\n";
  }
  out << "\n"
      << (result.stop_reason == run::StopReason::none
              ? "All " + std::to_string(count) + " conflicts found (--all). "
              : "The search for further conflicts stopped (" + run::describe(result.stop_reason) +
                    "): these " + std::to_string(count) + " are the ones found so far. ")
      << "Relaxing these together removes every one of them\n(a heuristic cover: one requirement set aside "
         "per conflict, not the smallest such set):\n";
  write_members(out, model, all_of(result.set_aside), false);
}

// --by-group, in a sentence: "the contract requirements conflict with the hard regulatory
// requirements, kept as given".  A unit is a group, or a single entry (ungrouped, or opened by
// --within) named by its statement.
std::string group_sentence(const explain::Explanation& result) {
  std::vector<std::string> units;
  for (std::size_t k = 0; k < result.groups.size() && k < result.certificate.witnesses.size(); ++k)
    units.push_back(result.groups[k].empty()
                        ? "\"" + statement_of(result.members[result.certificate.witnesses[k].drop.front()]) +
                              "\""
                        : "the " + result.groups[k] + " requirements");
  std::vector<std::string> hard_groups;
  for (const explain::Member* m : used(result.hard))
    if (!m->group.empty() && std::find(hard_groups.begin(), hard_groups.end(), m->group) == hard_groups.end())
      hard_groups.push_back(m->group);
  auto joined = [](const std::vector<std::string>& words) {
    std::string text;
    for (std::size_t k = 0; k < words.size(); ++k)
      text += (k == 0 ? "" : k + 1 == words.size() ? " and " : ", ") + words[k];
    return text;
  };
  bool plural = units.size() > 1 || !result.groups.front().empty();
  std::string text = "In groups: " + joined(units);
  if (hard_groups.empty()) return text + (plural ? " cannot all hold together" : " cannot hold");
  return text + (plural ? " conflict" : " conflicts") + " with the hard " + joined(hard_groups) +
         " requirements, kept as given";
}

}  // namespace

void write_explain_text(const model::Model& model, const explain::Explanation& result,
                        const explain::WaysOut* ways, const std::string& certificate_path,
                        std::ostream& out) {
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
      if (result.groups.empty())
        out << "status     infeasible: " << result.members.size()
            << " soft requirements cannot all hold together with the hard ones ("
            << detail::count_of(rows, "row side", "row sides") << ", "
            << detail::count_of(result.members.size() - rows, "bound", "bounds")
            << "); drop any one of them and the rest can hold\n\n";
      else
        out << "status     infeasible: "
            << (result.groups.size() == 1 ? std::string("one requirement")
                                          : std::to_string(result.groups.size()) + " requirements")
            << " taken group by group (" << detail::count_of(rows, "row side", "row sides") << ", "
            << detail::count_of(result.members.size() - rows, "bound", "bounds") << ") "
            << (result.groups.size() == 1
                    ? "cannot hold with the hard ones; without it the rest can"
                    : "cannot all hold together with the hard ones; drop any one and the rest can hold")
            << "\n\n";
      if (!result.groups.empty()) out << group_sentence(result) << "\n\n";
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
  if (result.outcome != explain::Outcome::feasible) write_derivation(out, model, result);
  if (ways) write_ways_out(out, *ways);
  write_further(out, model, result);
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
                                    const explain::WaysOut* ways, const RunFigures& figures) {
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
  if (result.outcome == explain::Outcome::infeasible_subsystem ||
      result.outcome == explain::Outcome::inconsistent)
    out["derivation"] = derivation_json(model, result);
  if (ways) out["ways_out"] = ways_out_json(*ways);
  if (!result.set_aside.empty()) {
    nlohmann::ordered_json further = nlohmann::ordered_json::array(), aside = nlohmann::ordered_json::array();
    for (const explain::Explanation& more : result.further) {
      nlohmann::ordered_json conflict, members = nlohmann::ordered_json::array(),
                                       hard = nlohmann::ordered_json::array();
      for (const auto& m : more.members) members.push_back(member_json(model, m));
      for (const explain::Member* m : used(more.hard)) hard.push_back(member_json(model, *m));
      conflict["members"] = std::move(members);
      conflict["groups"] = more.groups;
      conflict["hard"] = std::move(hard);
      conflict["derivation"] = derivation_json(model, more);
      conflict["checked"] = more.verdict.valid;
      conflict["proven"] = more.verdict.proven;
      further.push_back(std::move(conflict));
    }
    for (const auto& m : result.set_aside) aside.push_back(member_json(model, m));
    out["further"] = std::move(further);
    out["set_aside"] = std::move(aside);
    out["all_complete"] = result.stop_reason == run::StopReason::none;
  }
  std::size_t rows = 0;
  for (const auto& m : result.members) rows += is_row(m);
  out["sizes"] = {{"members", result.members.size()},       {"row_sides", rows},
                  {"bounds", result.members.size() - rows}, {"hard_entries", result.hard.size()},
                  {"hard_used", used(result.hard).size()},  {"first_support", result.support_size}};
  nlohmann::ordered_json orders = nlohmann::ordered_json::array();
  for (const auto& order : result.orders)
    orders.push_back({{"order", order.name},
                      {"members", order.members},
                      {"sub_solves", order.sub_solves},
                      {"earlier_proofs", order.earlier_proofs}});
  out["search"] = {{"orders", std::move(orders)},           {"sub_solves", result.sub_solves},
                   {"float_seconds", result.float_seconds}, {"exact_seconds", result.exact_seconds},
                   {"seconds", figures.solve_seconds},      {"peak_memory_mib", figures.peak_memory_mib}};
  out["checked"] = result.verdict.valid;
  out["proven"] = result.verdict.proven;
  out["caution"] = caution_line;
  return out;
}

ConflictSection conflict_from_explanation(const model::Model& model, const explain::Explanation& result,
                                          const explain::WaysOut* ways) {
  ConflictSection conflict;
  conflict.source =
      result.outcome == explain::Outcome::inconsistent
          ? "plumb explain: the hard requirements alone conflict (the model itself is inconsistent)"
          : "plumb explain: an irreducible infeasible subsystem, proven (drop any one requirement "
            "and the rest can hold)";
  // The derivation's whole-number weights, so the table and the derivation agree.
  Derivation d = derivation_of(model, result);
  for (const Derivation::Term& t : d.terms) {
    const explain::Member* m = t.member;
    ConflictMember member{
        m->entry.name, statement_of(*m) + (m->hard ? " (hard)" : ""), form(model, *m), t.weight, {}};
    if (is_row(*m)) {
      auto columns = model.matrix.row_columns(m->index);
      auto positions = model.matrix.row_positions(m->index);
      for (std::size_t k = 0; k < columns.size(); ++k)
        member.terms.push_back(
            {model.columns[static_cast<std::size_t>(columns[k])].name, model.matrix.value(positions[k])});
    }
    conflict.members.push_back(std::move(member));
  }
  auto lines_of = [](const std::string& text) {
    std::vector<std::string> lines;
    std::istringstream in(text);
    for (std::string line; std::getline(in, line);)
      if (!line.empty()) lines.push_back(line);
    return lines;
  };
  std::ostringstream derivation;
  write_derivation(derivation, model, result);
  conflict.derivation = lines_of(derivation.str());
  if (ways) {
    for (const explain::SingleChange& c : ways->single)
      if (c.result == explain::SingleChange::Result::moves)
        conflict.ways_out.push_back(statement_of(c.member) + " alone: " + move_words(c.member, c.to, c.by));
      else if (c.result == explain::SingleChange::Result::not_enough)
        conflict.ways_out.push_back(statement_of(c.member) + " alone: not enough, another conflict remains");
    if (ways->least.result == explain::LeastTotalChange::Result::found) {
      std::string least = std::string("The least total change (each side and bound weighed ") +
                          (ways->least.weighted ? "by its label's weight, else 1," : "1") +
                          " per unit of its own, " + numeric::to_display(ways->least.total, 8) + " in all): ";
      for (std::size_t k = 0; k < ways->least.moves.size(); ++k) {
        const explain::Move& move = ways->least.moves[k];
        least +=
            (k ? "; " : "") + statement_of(move.member) + ": " + move_words(move.member, move.to, move.by);
      }
      conflict.ways_out.push_back(least);
    }
  }
  return conflict;
}

std::string explain_progress_line(const explain::Progress& p) {
  char line[160];
  std::snprintf(line, sizeof line, "  %-28s %6ld left  %6ld sub-solves  %7.1f s", p.phase.c_str(),
                p.candidates, p.sub_solves, p.elapsed_seconds);
  return line;
}

}  // namespace plumb::present
