// The readable result of plumb solve: the model, the status in words, the objective and values,
// what the checker proved.  docs/solving.md shows the layout.
#include "format.hpp"
#include "plumb/present/solve.hpp"

#include <algorithm>
#include <cmath>
#include <cstdio>
#include <ostream>

namespace plumb::present {
namespace {

using numeric::Rational;

// Rows listed for an infeasibility proof unless --all.
constexpr std::size_t listed_rows_by_default = 20;
constexpr std::size_t no_limit = static_cast<std::size_t>(-1);

std::string status_words(exact::Outcome outcome) {
  switch (outcome) {
    case exact::Outcome::optimal: return "optimal: the best objective value is proven";
    case exact::Outcome::infeasible: return "infeasible: no point satisfies every row and bound";
    case exact::Outcome::unbounded: return "unbounded: the objective improves without limit";
    case exact::Outcome::stopped: return "stopped before a result";
  }
  return "unknown";
}

// Names with non-zero values (or all, when every index is wanted), in model order.
std::vector<int> listed(const std::vector<Rational>& values, bool all) {
  std::vector<int> indices;
  for (std::size_t k = 0; k < values.size(); ++k)
    if (all || values[k] != 0) indices.push_back(static_cast<int>(k));
  return indices;
}

bool shortened(const Rational& value) { return numeric::to_fraction(value).size() > numeric::readable_fraction_length; }

// One line per index: name, value, the unit when the values are in the labelled quantity's own
// unit, and the label statement; a note at the end when some value was shown rounded only.
void write_values(std::ostream& out, const std::vector<int>& indices, const std::vector<Rational>& values,
                  auto name_of, auto label_of, bool own_unit, std::size_t limit) {
  std::size_t width = 0;
  for (int k : indices) width = std::max(width, name_of(k).size());
  std::size_t shown = 0;
  bool any_shortened = false;
  for (int k : indices) {
    if (shown++ == limit) {
      out << "    ... and " << indices.size() - limit << " more (--all lists every one)\n";
      break;
    }
    const model::Label& label = label_of(k);
    any_shortened = any_shortened || shortened(values[k]);
    out << "    " << name_of(k) << std::string(width - name_of(k).size() + 2, ' ')
        << numeric::exact_and_decimal(values[k]);
    if (own_unit && !label.unit.empty()) out << " " << label.unit;
    if (!label.statement.empty()) out << "  -- " << label.statement;
    out << "\n";
  }
  if (any_shortened)
    out << "    (fractions too long to read are shown rounded, marked ~, with their length; the certificate "
           "and --json "
           "hold them exactly)\n";
}

}  // namespace

void write_solve_text(const model::Model& model, const exact::CertifiedSolution& result,
                      const SolveTextOptions& options, std::ostream& out) {
  const exact::Solution& s = result.solution;
  out << "model      " << model.source.path << "\n";
  out << "           sha256 " << model.source.sha256.substr(0, 16) << "...  " << model.row_count() << " rows, "
      << model.column_count() << " columns, " << model.matrix.nonzeros() << " non-zeros\n";
  if (int integers = detail::integer_columns(model))
    out << "note       " << integers << " columns are marked integer: plumb solved the LP relaxation\n";
  out << "status     " << status_words(s.outcome) << "\n";
  auto column_name = [&model](int j) { return model.columns[j].name; };
  auto column_label = [&model](int j) -> const model::Label& { return model.columns[j].label; };
  auto row_name = [&model](int i) { return model.rows[i].name; };
  auto row_label = [&model](int i) -> const model::Label& { return model.rows[i].label; };
  if (s.outcome == exact::Outcome::optimal) {
    bool maximise = model.objective.sense == model::Sense::maximise;
    out << "objective  " << numeric::exact_and_decimal(s.objective) << ", "
        << (maximise ? "maximised" : "minimised") << "\n";
    out << "           includes the objective constant " << numeric::exact_and_decimal(model.objective.constant)
        << ": " << detail::constant_rule_text(model.source) << "\n";
    auto indices = listed(s.x, options.all);
    out << "solution   " << (options.all ? "all " : "") << indices.size() << " of " << model.column_count()
        << " columns" << (options.all ? "" : " non-zero")
        << (options.all || static_cast<int>(indices.size()) == model.column_count() ? "" : "; the rest are 0") << "\n";
    write_values(out, indices, s.x, column_name, column_label, true, no_limit);
  } else if (s.outcome == exact::Outcome::infeasible && !s.farkas.empty()) {
    out << "proof      " << s.farkas.size()
        << " sides and bounds that cannot hold together, each with its multiplier:\n";
    for (const certificate::FarkasTerm& t : s.farkas)
      out << "             " << certificate::to_string(t.entry.kind) << " " << t.entry.name << ", "
          << certificate::to_string(t.entry.limit)
          << (t.entry.kind == certificate::EntryKind::row ? " side" : " bound") << "  x "
          << numeric::exact_and_decimal(t.multiplier) << "\n";
  } else if (s.outcome == exact::Outcome::infeasible) {
    auto indices = listed(s.y, false);
    out << "proof      Farkas multipliers on " << indices.size()
        << " rows: their weighted sum is a row no point within the bounds can satisfy\n";
    write_values(out, indices, s.y, row_name, row_label, false, options.all ? no_limit : listed_rows_by_default);
  } else if (s.outcome == exact::Outcome::unbounded) {
    auto indices = listed(s.ray, false);
    out << "proof      a feasible point and a direction along which the objective keeps improving\n";
    out << "direction  " << indices.size() << " columns move:\n";
    write_values(out, indices, s.ray, column_name, column_label, true, no_limit);
  }
  out << "checked    " << result.verdict.proven << "\n";
  if (!options.certificate_path.empty()) out << "certificate written to " << options.certificate_path << "\n";
  if (!options.basis_path.empty()) out << "basis written to " << options.basis_path << "\n";
  out << "caution    " << caution_line << "\n";
}

std::string progress_line(const exact::Progress& p) {
  std::string line = "  ";
  auto cell = [&line](const std::string& text, std::size_t width) {
    line += text;
    if (text.size() < width) line.append(width - text.size(), ' ');
  };
  // The estimates are doubles from the float search, shown like every other number read by people.
  auto estimate = [](double value, int significant) {
    return numeric::to_display(Rational(value), significant);
  };
  char counts[64];
  std::snprintf(counts, sizeof counts, " %8ld it  ", p.iterations);
  cell(p.phase, 21);
  line += counts;
  if (std::isnan(p.objective) || std::isnan(p.infeasibility)) {
    cell("", 50);
  } else {
    line += "objective ";
    cell(estimate(p.objective, 8), 15);
    line += " infeasibility ";
    cell(estimate(p.infeasibility, 3), 10);
  }
  char seconds[32];
  std::snprintf(seconds, sizeof seconds, " %7.1f s", p.elapsed_seconds);
  return line + seconds;
}

}  // namespace plumb::present
