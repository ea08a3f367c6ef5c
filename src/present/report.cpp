// plumb report: builds the document of docs/report.md from the model, its health, the certified
// solve and the certificate, then hands it to the HTML or the Markdown writer.
#include "plumb/present/report.hpp"

#include "format.hpp"
#include "report_document.hpp"
#include "svg.hpp"

#include <algorithm>
#include <map>
#include <ostream>

namespace plumb::present {
namespace {

using detail::coefficient_text;
using detail::expression_text;

using report::Block;
using report::Table;

// ----- numbers: every number in the report goes through value_text or coefficient_text (format.hpp),
// both built on the one text form -----

// A value in prose and tables: exact when short, else a rounded decimal marked "~".
std::string value_text(const Rational& value) { return numeric::exact_and_decimal(value); }

// ----- the model in words -----

constexpr std::size_t appendix_terms = 12;       // terms of one row shown in the appendix
constexpr std::size_t names_listed = 20;         // names listed before "and N more"
constexpr std::size_t usage_bars_shown = 24;     // bars in the usage picture
constexpr std::size_t values_listed = 60;        // plan values listed before the rest go to an appendix
constexpr std::size_t conflict_drawn_rows = 10;  // the conflict graph is drawn up to this size
constexpr std::size_t conflict_drawn_columns = 14;
const Rational near_limit_share{1, 10};          // slack within a tenth of the limit counts as near

std::string relation_text(const std::string& expression, const model::Side& lower, const model::Side& upper) {
  if (lower && upper && *lower == *upper) return expression + " = " + coefficient_text(*upper);
  if (lower && upper) return coefficient_text(*lower) + " <= " + expression + " <= " + coefficient_text(*upper);
  if (upper) return expression + " <= " + coefficient_text(*upper);
  if (lower) return expression + " >= " + coefficient_text(*lower);
  return expression + " (no limit)";
}

std::string hard_text(const model::Label& label) {
  if (!label.hard) return "";
  return *label.hard ? "hard" : "soft";
}

// One requirement (a row) or a bound, with the label that speaks for it.
struct Requirement {
  std::string kind;  // "row", "lower bound", "upper bound", "bounds"
  std::string name;
  std::string form;
  const model::Label* label;
};

std::vector<Requirement> requirements(const model::Model& model, std::size_t terms) {
  std::vector<Requirement> list;
  for (int i = 0; i < model.row_count(); ++i) {
    const model::Row& row = model.rows[static_cast<std::size_t>(i)];
    list.push_back({"row", row.name, relation_text(expression_text(model, i, terms), row.lower, row.upper), &row.label});
  }
  for (const model::Column& column : model.columns) {
    bool own_lower = !column.lower_label.empty(), own_upper = !column.upper_label.empty();
    bool default_lower = column.lower && *column.lower == 0;
    if (column.lower && !default_lower && !own_lower && column.upper && !own_upper)
      list.push_back({"bounds", column.name, relation_text(column.name, column.lower, column.upper), &column.label});
    else {
      if (column.lower && (own_lower || !default_lower))
        list.push_back({"lower bound", column.name, column.name + " >= " + coefficient_text(*column.lower),
                        own_lower ? &column.lower_label : &column.label});
      if (column.upper)
        list.push_back({"upper bound", column.name, column.name + " <= " + coefficient_text(*column.upper),
                        own_upper ? &column.upper_label : &column.label});
    }
  }
  return list;
}

// Requirements grouped by their label's group, groups in order of first appearance.
std::vector<Block> requirement_tables(const std::vector<Requirement>& list) {
  std::vector<std::string> order;
  std::map<std::string, Table> by_group;
  for (const Requirement& r : list) {
    const std::string& group = r.label->group;
    auto [it, fresh] = by_group.try_emplace(group);
    if (fresh) {
      order.push_back(group);
      it->second.header = {"name", "kind", "plain statement", "algebraic form", "unit", "hard or soft"};
      it->second.code = {true, false, false, true, false, false};
    }
    it->second.rows.push_back({r.name, r.kind, r.label->statement, r.form, r.label->unit, hard_text(*r.label)});
  }
  std::stable_partition(order.begin(), order.end(), [](const std::string& g) { return !g.empty(); });
  std::vector<Block> blocks;
  for (const std::string& group : order) {
    blocks.push_back(report::subheading(group.empty() ? "No group given" : "Group: " + group));
    blocks.push_back(report::table(std::move(by_group[group])));
  }
  return blocks;
}

std::string bounds_text(const model::Column& column) {
  return detail::side_text(column.lower, true) + " <= " + column.name + " <= " + detail::side_text(column.upper, false);
}

Table variables_table(const model::Model& model, std::size_t limit) {
  Table table{{"name", "plain statement", "unit", "bounds"}, {}, {true, false, false, true}};
  for (const model::Column& column : model.columns) {
    if (table.rows.size() == limit) break;
    table.rows.push_back({column.name, column.label.statement, column.label.unit, bounds_text(column)});
  }
  return table;
}

std::string objective_text(const model::Model& model, std::size_t limit) {
  const model::Objective& objective = model.objective;
  std::string text;
  std::size_t shown = 0, nonzero = 0;
  for (std::size_t j = 0; j < objective.coefficients.size(); ++j) {
    const Rational& value = objective.coefficients[j];
    if (value == 0) continue;
    if (++nonzero > limit) continue;
    ++shown;
    text += value < 0 ? (text.empty() ? "-" : " - ") : (text.empty() ? "" : " + ");
    if (abs(value) != 1) text += coefficient_text(abs(value)) + " ";
    text += model.columns[j].name;
  }
  if (nonzero > shown) text += " + ... (" + std::to_string(nonzero - shown) + " more terms)";
  if (objective.constant != 0)
    text += (objective.constant < 0 ? " - " : " + ") + coefficient_text(abs(objective.constant));
  return text.empty() ? "0" : text;
}

// ----- sections -----

std::string size_text(const model::Model& model) {
  return std::to_string(model.row_count()) + " rows, " + std::to_string(model.column_count()) + " columns, " +
         std::to_string(model.matrix.nonzeros()) + " non-zeros";
}

report::Section identity_section(const ReportInput& input) {
  const model::Model& model = *input.model;
  const ReportRun& run = input.run;
  Table table{{"", ""}, {}, {false, false}};
  table.header.clear();
  table.rows.push_back({"model file", "`" + run.model_file.path + "`"});
  table.rows.push_back({"SHA-256 of the model file", "`" + run.model_file.sha256 + "`"});
  table.rows.push_back({"size", std::to_string(run.model_file.bytes) + " bytes; " + size_text(model)});
  if (run.labels_file) {
    table.rows.push_back({"labels sidecar", "`" + run.labels_file->path + "`"});
    table.rows.push_back({"SHA-256 of the sidecar", "`" + run.labels_file->sha256 + "`"});
    table.rows.push_back({"sidecar size", std::to_string(run.labels_file->bytes) + " bytes"});
  }
  for (const auto& [what, file] :
       {std::pair{"plan audited", &run.plan_file}, std::pair{"duals given", &run.duals_file}})
    if (*file) {
      table.rows.push_back({what, "`" + (*file)->path + "`"});
      table.rows.push_back({std::string("SHA-256 of the ") + (what[0] == 'p' ? "plan" : "duals"),
                            "`" + (*file)->sha256 + "`"});
    }
  table.rows.push_back({"title", model.title.empty() ? "(untitled)" : model.title});
  table.rows.push_back({"time of the run (UTC)", run.utc_time});
  table.rows.push_back({"plumb version", run.version});
  return {"identity", "What was analysed",
          {report::table(std::move(table)), report::paragraph("The exact command that produced this report:"),
           report::code(run.command, "command")}};
}

report::Section formulation_section(const ReportInput& input) {
  const model::Model& model = *input.model;
  const health::HealthReport& health = *input.health;
  bool long_model = model.row_count() > report_listed_rows;
  std::vector<Block> blocks;
  blocks.push_back(report::paragraph(
      std::string("Objective: ") + (model.objective.sense == model::Sense::minimise ? "minimise" : "maximise") + " `" +
      model.objective.name + "`" + (model.objective.label.unit.empty() ? "" : " [" + model.objective.label.unit + "]") +
      (model.objective.label.statement.empty() ? "" : ", " + model.objective.label.statement) + ":"));
  blocks.push_back(report::code(model.objective.name + " = " + objective_text(model, long_model ? appendix_terms : 1000)));

  // What inspect found, in every report: the short list is what a reviewer looks at first.
  std::vector<std::string> findings;
  for (const health::Finding& finding : health.findings)
    findings.push_back(to_string(finding.severity) + ": " + detail::finding_text(finding, health));
  if (findings.empty()) findings.push_back("nothing stands out");

  if (!long_model) {
    blocks.push_back(report::subheading("Quantities (columns)"));
    blocks.push_back(report::table(variables_table(model, static_cast<std::size_t>(-1))));
    for (Block& block : requirement_tables(requirements(model, static_cast<std::size_t>(-1))))
      blocks.push_back(std::move(block));
    blocks.push_back(report::subheading("Health findings of `plumb inspect`"));
    blocks.push_back(report::list(std::move(findings)));
    return {"formulation", "The formulation", std::move(blocks)};
  }
  blocks.push_back(report::paragraph("The model has " + size_text(model) + "; this section summarises it and the "
                                     "appendix at its end lists every requirement (each with at most " +
                                     std::to_string(appendix_terms) + " terms shown)."));
  Table kinds{{"rows by kind", "count"}, {}, {}};
  for (std::size_t k = 0; k < health::row_kind_count; ++k)
    if (health.row_kinds[k] != 0)
      kinds.rows.push_back({health::to_string(static_cast<health::RowKind>(k)), std::to_string(health.row_kinds[k])});
  Table bounds{{"columns by bounds", "count"}, {}, {}};
  for (std::size_t k = 0; k < health::bound_kind_count; ++k)
    if (health.bound_kinds[k] != 0)
      bounds.rows.push_back(
          {health::to_string(static_cast<health::BoundKind>(k)), std::to_string(health.bound_kinds[k])});
  blocks.push_back(report::table(std::move(kinds)));
  blocks.push_back(report::table(std::move(bounds)));
  blocks.push_back(report::subheading("Health findings of `plumb inspect`"));
  blocks.push_back(report::list(std::move(findings)));
  std::vector<Block> appendix;
  appendix.push_back(report::subheading("Quantities (columns)"));
  appendix.push_back(report::table(variables_table(model, static_cast<std::size_t>(-1))));
  for (Block& block : requirement_tables(requirements(model, appendix_terms))) appendix.push_back(std::move(block));
  blocks.push_back(report::collapsible("Appendix: every quantity and requirement (" + size_text(model) + ")",
                                       std::move(appendix), false));
  return {"formulation", "The formulation", std::move(blocks)};
}

report::Section decisions_section(const ReportInput& input) {
  const model::Model& model = *input.model;
  std::vector<Block> blocks;
  if (model.decisions.empty()) {
    blocks.push_back(report::paragraph("No decision about the model as a whole is recorded."));
  } else {
    Table table{{"decision or assumption", "source", "owner"}, {}, {}};
    for (const model::ModelDecision& d : model.decisions) table.rows.push_back({d.decision, d.source, d.owner});
    blocks.push_back(report::subheading("About the model as a whole"));
    blocks.push_back(report::table(std::move(table)));
  }
  Table recorded{{"requirement", "kind", "plain statement", "decision or assumption", "source", "owner"},
                 {},
                 {true, false, false, false, false, false}};
  std::vector<std::string> unsourced;
  std::size_t unsourced_count = 0;
  auto note = [&](const std::string& name, const std::string& kind, const model::Label& label) {
    if (label.recorded()) recorded.rows.push_back({name, kind, label.statement, label.decision, label.source, label.owner});
  };
  auto check_source = [&](const std::string& name, const model::Label& label) {
    if (label.source.empty() && unsourced_count++ < names_listed) unsourced.push_back("`" + name + "`");
  };
  note(model.objective.name, "objective", model.objective.label);
  for (const model::Row& row : model.rows) {
    note(row.name, "row", row.label);
    if (row.lower || row.upper) check_source(row.name, row.label);
  }
  for (const model::Column& column : model.columns) {
    note(column.name, "quantity", column.label);
    note(column.name, "lower bound", column.lower_label);
    note(column.name, "upper bound", column.upper_label);
    // A bound without a label of its own speaks through its variable's label, as inspect counts it.
    auto own = [&](const model::Label& label) -> const model::Label& { return label.empty() ? column.label : label; };
    if (column.lower && *column.lower != 0) check_source(column.name + " (lower bound)", own(column.lower_label));
    if (column.upper) check_source(column.name + " (upper bound)", own(column.upper_label));
  }
  blocks.push_back(report::subheading("About single requirements and bounds"));
  if (recorded.rows.empty()) blocks.push_back(report::paragraph("None is recorded."));
  else blocks.push_back(report::table(std::move(recorded)));
  const health::LabelCoverage& labels = input.health->labels;
  std::string missing = "Requirements without a recorded source: " + std::to_string(labels.rows_without_source) +
                        " rows and " + std::to_string(labels.bounds_without_source) + " bounds.";
  if (unsourced_count > 0) {
    std::string names;
    for (const std::string& name : unsourced) names += (names.empty() ? "" : ", ") + name;
    if (unsourced_count > unsourced.size()) names += " and " + std::to_string(unsourced_count - unsourced.size()) + " more";
    missing += " They are: " + names + ".";
  }
  blocks.push_back(report::callout(missing));
  blocks.push_back(report::paragraph("docs/model-format.md and docs/labels.md say how to record them: `decision`, "
                                     "`source` and `owner` in the model, or the same columns of the labels sidecar."));
  return {"decisions", "Formulation decisions", std::move(blocks)};
}

std::string status_text(exact::Outcome outcome) {
  switch (outcome) {
    case exact::Outcome::optimal: return "OPTIMAL: the best objective value is proven";
    case exact::Outcome::infeasible: return "INFEASIBLE: no plan meets every requirement and bound";
    case exact::Outcome::unbounded: return "UNBOUNDED: the objective improves without limit";
    case exact::Outcome::stopped: return "STOPPED before a result: nothing is certified";
  }
  return "unknown";
}

// One limit of a solved model and how close the plan is to it.
struct Usage {
  std::string name;
  std::string statement;
  std::string unit;
  Rational limit;
  Rational value;
  Rational slack;  // >= 0
};

// Rows and bounds at or within near_limit_share of a finite side, those at the limit first.
std::vector<Usage> usages(const model::Model& model, const std::vector<Rational>& x) {
  std::vector<Usage> found;
  auto consider = [&](const std::string& name, const model::Label& label, const Rational& value,
                      const model::Side& side, bool upper) {
    if (!side) return;
    Rational slack = upper ? Rational(*side - value) : Rational(value - *side);
    if (slack != 0 && (*side == 0 || slack > near_limit_share * abs(*side))) return;
    found.push_back({name, label.statement, label.unit, *side, value, slack});
  };
  for (int i = 0; i < model.row_count(); ++i) {
    const model::Row& row = model.rows[static_cast<std::size_t>(i)];
    Rational activity = 0;
    auto columns = model.matrix.row_columns(i);
    auto positions = model.matrix.row_positions(i);
    for (std::size_t k = 0; k < columns.size(); ++k)
      activity += model.matrix.value(positions[k]) * x[static_cast<std::size_t>(columns[k])];
    consider(row.name, row.label, activity, row.lower, false);
    if (!(row.lower && row.upper && *row.lower == *row.upper)) consider(row.name, row.label, activity, row.upper, true);
  }
  for (int j = 0; j < model.column_count(); ++j) {
    const model::Column& column = model.columns[static_cast<std::size_t>(j)];
    const Rational& value = x[static_cast<std::size_t>(j)];
    const model::Label& lower_label = column.lower_label.empty() ? column.label : column.lower_label;
    const model::Label& upper_label = column.upper_label.empty() ? column.label : column.upper_label;
    if (column.lower && *column.lower != 0) consider(column.name + " (lower bound)", lower_label, value, column.lower, false);
    consider(column.name + " (upper bound)", upper_label, value, column.upper, true);
  }
  std::stable_sort(found.begin(), found.end(), [](const Usage& a, const Usage& b) {
    return (a.slack == 0) > (b.slack == 0);
  });
  return found;
}

Block usage_figure(const std::vector<Usage>& list) {
  std::vector<svg::UsageBar> bars;
  Table text{{"requirement", "limit", "the plan", "slack", "plain statement"}, {}, {true, false, false, false, false}};
  for (const Usage& u : list) {
    std::string unit = u.unit.empty() ? "" : " " + u.unit;
    std::string slack = value_text(u.slack) + unit;
    if (bars.size() < usage_bars_shown) {
      // Drawn as how close the plan is to the limit: a full bar is at the limit.
      double share = u.limit == 0 ? 1.0 : 1.0 - numeric::to_double(u.slack / abs(u.limit));
      bars.push_back({u.name, share, "slack " + slack + (u.slack == 0 ? " (at the limit)" : ""), u.slack == 0});
    }
    text.rows.push_back({u.name, value_text(u.limit) + unit, value_text(u.value) + unit,
                         slack + (u.slack == 0 ? " (at the limit)" : ""), u.statement});
  }
  std::string caption = "How close the plan comes to each limit it reaches or nearly reaches (within a tenth)";
  if (list.size() > bars.size())
    caption += "; the picture shows the first " + std::to_string(bars.size()) + " of " + std::to_string(list.size());
  return report::figure(caption, svg::usage_chart(bars, caption), std::move(text));
}


report::Section result_section(const ReportInput& input) {
  const model::Model& model = *input.model;
  const exact::CertifiedSolution& result = *input.result;
  const exact::Solution& s = result.solution;
  std::vector<Block> blocks;
  blocks.push_back(report::callout(status_text(s.outcome)));
  if (s.outcome == exact::Outcome::stopped) {
    blocks.push_back(report::paragraph("The solve stopped (" + run::describe(s.stop_reason) + ") during " +
                                       s.stats.phase + ". No result and no certificate exist for this run."));
    return {"result", "The result and its proof", std::move(blocks)};
  }
  Table facts{{}, {}, {false, false}};
  if (s.outcome == exact::Outcome::optimal) {
    facts.rows.push_back({"objective", value_text(s.objective) + (model.objective.label.unit.empty() ? "" : " " + model.objective.label.unit) +
                                           (model.objective.sense == model::Sense::minimise ? ", minimised" : ", maximised")});
    facts.rows.push_back({"objective, exactly", "`" + numeric::to_fraction(s.objective) + "`"});
  }
  facts.rows.push_back({"SHA-256 of the certificate", "`" + input.certificate.sha256 + "`"});
  facts.rows.push_back({"the independent checker", result.verdict.valid ? "valid: " + result.verdict.proven
                                                                          : "REFUSED: " + result.verdict.failure});
  blocks.push_back(report::table(std::move(facts)));

  if (s.outcome == exact::Outcome::optimal) {
    std::vector<Usage> list = usages(model, s.x);
    if (!list.empty()) blocks.push_back(usage_figure(list));
    Table values{{"quantity", "value", "unit", "plain statement"}, {}, {true, false, false, false}};
    std::size_t nonzero = 0;
    for (std::size_t j = 0; j < s.x.size(); ++j) {
      if (s.x[j] == 0) continue;
      ++nonzero;
      const model::Column& column = model.columns[j];
      values.rows.push_back({column.name, value_text(s.x[j]), column.label.unit, column.label.statement});
    }
    std::string summary = "The plan: " + std::to_string(nonzero) + " of " + std::to_string(model.column_count()) +
                          " quantities are non-zero; the rest are 0";
    bool few = nonzero <= values_listed;
    if (few) blocks.push_back(report::subheading(summary));
    std::vector<Block> inner{report::table(std::move(values))};
    blocks.push_back(few ? inner.front() : report::collapsible(summary, std::move(inner), false));
  } else if (s.outcome == exact::Outcome::unbounded) {
    Table ray{{"quantity", "moves by", "plain statement"}, {}, {true, false, false}};
    for (std::size_t j = 0; j < s.ray.size(); ++j)
      if (s.ray[j] != 0) ray.rows.push_back({model.columns[j].name, value_text(s.ray[j]), model.columns[j].label.statement});
    blocks.push_back(report::subheading("The direction along which the objective keeps improving"));
    blocks.push_back(report::table(std::move(ray)));
  } else {
    blocks.push_back(report::paragraph("The proof is a set of Farkas multipliers; the next section reads it."));
  }

  blocks.push_back(report::subheading("The certificate"));
  if (input.certificate.sibling_path.empty()) {
    std::size_t lines = static_cast<std::size_t>(std::count(input.certificate.text.begin(), input.certificate.text.end(), '\n'));
    blocks.push_back(report::paragraph("The certificate follows in full (" + std::to_string(input.certificate.text.size()) +
                                       " bytes). Its SHA-256 above is of exactly this text, ending in a line break; "
                                       "save it as a file to check it again."));
    blocks.push_back(report::collapsible("certificate (JSON, " + std::to_string(lines) + " lines)",
                                         {report::code(input.certificate.text, "certificate")}, lines <= 80));
  } else {
    blocks.push_back(report::paragraph("The certificate is the file `" + input.certificate.sibling_path +
                                       "` beside this report (" + std::to_string(input.certificate.text.size()) +
                                       " bytes, the SHA-256 above)."));
  }
  return {"result", "The result and its proof", std::move(blocks)};
}

Block conflict_figure(const ConflictSection& conflict) {
  std::vector<svg::GraphNode> left, right;
  std::vector<svg::GraphEdge> edges;
  std::map<std::string, std::size_t> quantity_index;
  std::size_t rows_with_terms = 0;
  for (const ConflictMember& member : conflict.members) {
    if (member.terms.empty()) continue;
    ++rows_with_terms;
    std::size_t l = left.size();
    left.push_back({member.name, "x " + numeric::to_display(member.multiplier, 6)});
    for (const ConflictTerm& term : member.terms) {
      auto [it, fresh] = quantity_index.try_emplace(term.quantity, right.size());
      if (fresh) right.push_back({term.quantity, ""});
      edges.push_back({l, it->second, coefficient_text(term.coefficient)});
    }
  }
  // Bounds in play are notes on their quantity.
  for (const ConflictMember& member : conflict.members)
    if (member.terms.empty())
      if (auto it = quantity_index.find(member.name); it != quantity_index.end())
        right[it->second].note = member.inequality + " x " + numeric::to_display(member.multiplier, 6);
  Table text{{"requirement", "in play", "multiplier", "plain statement"}, {}, {true, true, false, false}};
  for (const ConflictMember& member : conflict.members)
    text.rows.push_back({member.name, member.inequality, value_text(member.multiplier), member.statement});
  std::string caption = "The requirements in conflict (left), the quantities they share (right), coefficients on "
                        "the lines and each requirement's multiplier";
  if (rows_with_terms == 0 || left.size() > conflict_drawn_rows || right.size() > conflict_drawn_columns)
    return report::table(std::move(text));
  return report::figure(caption, svg::bipartite_graph(left, right, edges, caption), std::move(text));
}

report::Section conflict_section(const ConflictSection& conflict) {
  std::vector<Block> blocks;
  blocks.push_back(report::paragraph("Found from " + conflict.source + ". These " +
                                     std::to_string(conflict.members.size()) +
                                     " rows and bounds cannot all hold at once: weighted by their multipliers, they "
                                     "add up to an inequality that no plan can satisfy."));
  blocks.push_back(conflict_figure(conflict));
  if (!conflict.derivation.empty()) {
    blocks.push_back(report::subheading("The derivation"));
    std::string lines;
    for (const std::string& line : conflict.derivation) lines += line + "\n";
    blocks.push_back(report::code(lines));
  }
  blocks.push_back(report::subheading("Ways out"));
  if (conflict.ways_out.empty())
    blocks.push_back(report::paragraph("At least one of the rows or bounds above has to change for any plan to "
                                       "exist; which one is a decision for the owners of those limits."));
  else
    blocks.push_back(report::list(conflict.ways_out));
  return {"conflict", "Why no plan exists", std::move(blocks)};
}

report::Section audit_section(const AuditSection& audit) {
  std::vector<Block> blocks;
  if (!audit.plan.empty()) blocks.push_back(report::paragraph("The plan: " + audit.plan + "."));
  blocks.push_back(report::callout("Verdict: " + audit.verdict));
  if (!audit.gap.empty()) blocks.push_back(report::paragraph("Objective gap: " + audit.gap));
  if (!audit.violations.empty()) {
    std::vector<svg::LogBar> bars;
    Table text{{"requirement", "missed by", "plain statement"}, {}, {true, false, false}};
    for (const AuditViolation& v : audit.violations) {
      std::string amount = value_text(v.amount) + (v.unit.empty() ? "" : " " + v.unit);
      bars.push_back({v.name, numeric::to_double(v.amount), amount});
      text.rows.push_back({v.name, amount, v.statement});
    }
    std::string caption = "By how much the plan misses each requirement (log scale), the tolerance dashed";
    blocks.push_back(report::figure(caption,
                                    svg::log_bar_chart(bars, numeric::to_double(audit.tolerance),
                                                       numeric::to_display(audit.tolerance, 6), caption),
                                    std::move(text)));
  }
  return {"audit", "The plan audit", std::move(blocks)};
}

// The conditions of docs/certificates.md, short, for someone checking without plumb.
std::vector<std::string> conditions(exact::Outcome outcome, bool explicit_farkas) {
  std::vector<std::string> common = {
      "Work in exact fractions throughout; never round. Read every number of the model file as the exact "
      "decimal it is written as.",
      "Rows are `L <= a.x <= U`, columns `l <= x <= u`; a maximised objective is negated (c' = -c).",
  };
  switch (outcome) {
    case exact::Outcome::optimal:
      common.insert(common.end(),
                    {"`x` meets every row and bound.", "`y_i > 0` only where `L_i` is finite, `y_i < 0` only where `U_i` is.",
                     "With `d = c' - A^T y`: `d_j > 0` only where `l_j` is finite, `d_j < 0` only where `u_j` is.",
                     "`sum y_i L_i (y_i>0) + sum y_i U_i (y_i<0) + sum d_j l_j (d_j>0) + sum d_j u_j (d_j<0)` "
                     "equals `c'.x`: then no feasible plan does better (weak duality).",
                     "The stated objective equals `c.x` plus the objective constant."});
      break;
    case exact::Outcome::infeasible:
      if (explicit_farkas) {
        common.insert(
            common.end(),
            {"Each entry of `farkas` names a finite row side or column bound, once, with a multiplier of at "
             "least 0.",
             "Write each entry as `g(x) >= limit` (a lower side or bound as it is, an upper one negated) and "
             "add them up weighted by their multipliers: every column's coefficient in the sum is 0, and "
             "the sum of the weighted limits is above 0. Any plan would then give `0 >= ` a positive "
             "number, which is impossible (Farkas' lemma)."});
        break;
      }
      common.insert(common.end(),
                    {"`y_i > 0` only where `L_i` is finite, `y_i < 0` only where `U_i` is.",
                     "With `a = A^T y`: `a_j > 0` only where `u_j` is finite, `a_j < 0` only where `l_j` is.",
                     "`R = sum y_i L_i (y_i>0) + sum y_i U_i (y_i<0)` exceeds `C = sum a_j u_j (a_j>0) + sum a_j l_j "
                     "(a_j<0)`: any plan would give `R <= a.x <= C`, which is impossible (Farkas' lemma)."});
      break;
    case exact::Outcome::unbounded:
      common.insert(common.end(),
                    {"`x` meets every row and bound.",
                     "The ray `r` leaves every finite side alone: `(A r)_i < 0` only where `L_i` is infinite, "
                     "`(A r)_i > 0` only where `U_i` is; `r_j < 0` only where `l_j` is, `r_j > 0` only where `u_j` is.",
                     "`c'.r < 0`: moving along `r` improves the objective without end."});
      break;
    case exact::Outcome::stopped: break;
  }
  common.push_back("The certificate's model SHA-256, row and column counts match the model file; every name it "
                   "uses is a row (in `y`) or a column (in `x`, `ray`) of the model, once.");
  return common;
}

report::Section recheck_section(const ReportInput& input) {
  const model::Model& model = *input.model;
  const exact::Solution& s = input.result->solution;
  std::string model_path = shell_quoted(input.run.model_file.path);
  std::string labels = input.run.labels_file ? " --labels " + shell_quoted(input.run.labels_file->path) : "";
  std::string certificate =
      input.certificate.sibling_path.empty() ? "certificate.json" : shell_quoted(input.certificate.sibling_path);
  std::vector<Block> blocks;
  if (s.outcome == exact::Outcome::stopped) {
    blocks.push_back(report::paragraph("Nothing was certified; run the command again with a longer time limit."));
    return {"recheck", "How to check it again", std::move(blocks)};
  }
  std::string expect = s.outcome == exact::Outcome::optimal      ? "optimal"
                       : s.outcome == exact::Outcome::infeasible ? "infeasible"
                                                                 : "unbounded";
  std::string commands = "# the model file is the one analysed: this prints " + model.source.sha256 + "\n";
  commands += "sha256sum " + model_path + "\n";
  if (input.certificate.sibling_path.empty())
    commands += "# save the certificate of section 4 as certificate.json; this prints " + input.certificate.sha256 + "\n";
  else
    commands += "# the certificate is the one reported: this prints " + input.certificate.sha256 + "\n";
  commands += "sha256sum " + certificate + "\n";
  commands += "# the independent checker, with nothing of the solver in it\n";
  commands += "plumb check " + model_path + " " + certificate + labels + " --expect " + expect + "\n";
  commands += "# solve again from scratch and compare\n";
  commands += "plumb solve " + model_path + labels + " --certificate again.certificate.json\n";
  blocks.push_back(report::paragraph("With plumb:"));
  blocks.push_back(report::code(commands, "recheck"));
  blocks.push_back(report::paragraph("Without plumb, anyone can check the certificate by hand or with any exact-"
                                     "fraction arithmetic. It proves its status when all of these hold (in full "
                                     "in docs/certificates.md):"));
  blocks.push_back(report::list(conditions(s.outcome, !s.farkas.empty())));
  return {"recheck", "How to check it again", std::move(blocks)};
}

report::Section caution_section() {
  return {"cautions",
          "Cautions",
          {report::callout("plumb verifies the mathematics of the model as written. Whether the model captures the "
                           "law, the specification, the physics or the safety limit is for qualified people under "
                           "local codes and licensed practice."),
           report::paragraph("The pictures are drawn to rounded scales; the tables and the certificate hold the exact "
                             "numbers. A proof covers this model file (its SHA-256 above) and nothing else: a changed "
                             "number is a different model.")}};
}

}  // namespace

std::string shell_quoted(const std::string& word) {
  if (!word.empty() && word.find_first_not_of("abcdefghijklmnopqrstuvwxyzABCDEFGHIJKLMNOPQRSTUVWXYZ0123456789-_./=:,+@") ==
                           std::string::npos)
    return word;
  std::string quoted = "'";
  for (char c : word) quoted += c == '\'' ? std::string("'\\''") : std::string(1, c);
  return quoted + "'";
}

AuditSection audit_section_from(const model::Model& model, const audit::Audit& audit,
                                const AuditRequest& request, const exact::CertifiedSolution& result) {
  AuditSection section;
  section.plan = "`" + request.plan_path + "` (" + request.plan_format + ", " +
                 std::to_string(static_cast<std::size_t>(model.column_count()) - audit.plan_missing) +
                 " of " + std::to_string(model.column_count()) + " columns named; the rest count as 0)";
  for (const std::string& line : audit_verdict_lines(model, audit, request))
    section.verdict += (section.verdict.empty() ? "" : "; ") + line;
  const std::string unit = model.objective.label.unit.empty() ? "" : " " + model.objective.label.unit;
  const bool minimise = model.objective.sense == model::Sense::minimise;
  const exact::Solution& s = result.solution;
  section.gap = "the plan's objective is " + value_text(audit.evaluation.objective) + unit;
  if (result.certified() && s.outcome == exact::Outcome::optimal) {
    audit::Gap gap = audit::gap_between(model, audit.evaluation.objective, s.objective);
    if (gap.absolute == 0)
      section.gap += ", exactly the certified optimum";
    else if (gap.absolute > 0)
      section.gap += std::string(", ") + (minimise ? "costing " : "earning ") + value_text(gap.absolute) +
                     unit + (minimise ? " more" : " less") + " than the certified optimum " +
                     value_text(s.objective) + unit + " (" + detail::scientific(gap.relative) + " relative)";
    else
      section.gap += ", better than the certified optimum " + value_text(s.objective) + unit + " by " +
                     value_text(-gap.absolute) + unit + ": possible only because the plan misses limits";
  }
  if (audit.dual_bound && audit.dual_bound->bound)
    section.gap += "; the given duals prove no plan " +
                   std::string(minimise ? "costs less than " : "earns more than ") +
                   value_text(*audit.dual_bound->bound) + unit + " (a safe bound, computed exactly)";
  section.tolerance = request.options.tolerance;
  for (const audit::Violation& v : audit.evaluation.violations) {
    const model::Label& label = detail::violation_label(model, v);
    bool lower = v.side == audit::Violation::Side::lower;
    std::string name =
        detail::violation_name(model, v) + (v.kind == audit::Violation::Kind::row
                                                ? (lower ? " (>=)" : " (<=)")
                                                : (lower ? " (lower bound)" : " (upper bound)"));
    section.violations.push_back(
        {name, (label.hard.value_or(false) ? "HARD: " : "") + label.statement, v.amount, label.unit});
  }
  return section;
}

namespace {

// The conflict of Farkas multipliers on single sides and bounds (the certificate's `farkas`):
// each entry with its multiplier; weighted, the entries cancel and their limits add up to a
// positive number.
ConflictSection conflict_from_terms(const model::Model& model,
                                    const std::vector<certificate::FarkasTerm>& terms) {
  ConflictSection conflict;
  conflict.source = "the solve's Farkas multipliers on single sides and bounds (the certificate's `farkas`)";
  Rational force = 0;
  for (const certificate::FarkasTerm& t : terms) {
    bool lower = t.entry.limit == certificate::Limit::lower;
    const char* relation = lower ? " >= " : " <= ";
    if (t.entry.kind == certificate::EntryKind::row) {
      int i = *model.find_row(t.entry.name);
      const model::Row& row = model.rows[static_cast<std::size_t>(i)];
      const Rational& side = lower ? *row.lower : *row.upper;
      ConflictMember member{row.name,
                            row.label.statement,
                            expression_text(model, i, appendix_terms) + relation + coefficient_text(side),
                            t.multiplier,
                            {}};
      auto columns = model.matrix.row_columns(i);
      auto positions = model.matrix.row_positions(i);
      for (std::size_t k = 0; k < columns.size(); ++k)
        member.terms.push_back(
            {model.columns[static_cast<std::size_t>(columns[k])].name, model.matrix.value(positions[k])});
      force += (lower ? t.multiplier : Rational(-t.multiplier)) * side;
      conflict.members.push_back(std::move(member));
    } else {
      const model::Column& column = model.columns[static_cast<std::size_t>(*model.find_column(t.entry.name))];
      const Rational& bound = lower ? *column.lower : *column.upper;
      const model::Label& label = lower ? column.lower_label : column.upper_label;
      conflict.members.push_back({column.name,
                                  (label.empty() ? column.label : label).statement,
                                  column.name + relation + coefficient_text(bound),
                                  t.multiplier,
                                  {}});
      force += (lower ? t.multiplier : Rational(-t.multiplier)) * bound;
    }
  }
  conflict.derivation = {
      "Write each limit as (its left side) >= (its limit), an upper one negated, weight it by its multiplier",
      "and add them up: the left sides cancel, and the limits give 0 >= " + value_text(force) +
          ": no plan can meet them all.",
  };
  return conflict;
}

}  // namespace

std::optional<ConflictSection> conflict_from_farkas(const model::Model& model, const exact::CertifiedSolution& result) {
  const exact::Solution& s = result.solution;
  if (s.outcome != exact::Outcome::infeasible) return std::nullopt;
  ConflictSection conflict;
  if (!s.farkas.empty()) return conflict_from_terms(model, s.farkas);
  conflict.source = "the solve's Farkas multipliers (the certificate's `y`)";
  std::vector<Rational> combined(static_cast<std::size_t>(model.column_count()), Rational(0));
  Rational lower_sum = 0, upper_sum = 0;
  for (int i = 0; i < model.row_count(); ++i) {
    const Rational& y = s.y[static_cast<std::size_t>(i)];
    if (y == 0) continue;
    const model::Row& row = model.rows[static_cast<std::size_t>(i)];
    bool from_below = y > 0;
    const Rational& side = from_below ? *row.lower : *row.upper;
    std::string expression = expression_text(model, i, appendix_terms);
    ConflictMember member{row.name, row.label.statement,
                          expression + (from_below ? " >= " : " <= ") + coefficient_text(side), abs(y), {}};
    auto columns = model.matrix.row_columns(i);
    auto positions = model.matrix.row_positions(i);
    for (std::size_t k = 0; k < columns.size(); ++k) {
      const Rational& a = model.matrix.value(positions[k]);
      member.terms.push_back({model.columns[static_cast<std::size_t>(columns[k])].name, a});
      combined[static_cast<std::size_t>(columns[k])] += y * a;
    }
    lower_sum += y * side;
    conflict.members.push_back(std::move(member));
  }
  for (int j = 0; j < model.column_count(); ++j) {
    const Rational& a = combined[static_cast<std::size_t>(j)];
    if (a == 0) continue;
    const model::Column& column = model.columns[static_cast<std::size_t>(j)];
    bool upper = a > 0;
    const Rational& bound = upper ? *column.upper : *column.lower;
    const model::Label& label = upper ? column.upper_label : column.lower_label;
    conflict.members.push_back({column.name, (label.empty() ? column.label : label).statement,
                                column.name + (upper ? " <= " : " >= ") + coefficient_text(bound), abs(a), {}});
    upper_sum += a * bound;
  }
  conflict.derivation = {
      "Weight each row by its multiplier (a row held from above counts negated) and add them up:",
      "  the rows give        sum y_i a_i.x >= " + value_text(lower_sum),
      "  the bounds give      the same sum   <= " + value_text(upper_sum),
      "  and " + value_text(lower_sum) + " > " + value_text(upper_sum) + ": no plan can meet both.",
  };
  return conflict;
}

void write_report(const ReportInput& input, ReportFormat format, std::ostream& out) {
  const model::Model& model = *input.model;
  report::Document document;
  document.title = model.title.empty() ? "Report on " + input.run.model_file.path : model.title;
  document.subtitle = "An exact analysis by plumb " + input.run.version + " of `" + input.run.model_file.path +
                      "`, " + input.run.utc_time + ". Status: " + status_text(input.result->solution.outcome) + ".";
  document.sections.push_back(identity_section(input));
  document.sections.push_back(formulation_section(input));
  document.sections.push_back(decisions_section(input));
  document.sections.push_back(result_section(input));
  if (input.conflict) document.sections.push_back(conflict_section(*input.conflict));
  if (input.audit) document.sections.push_back(audit_section(*input.audit));
  document.sections.push_back(recheck_section(input));
  document.sections.push_back(caution_section());
  if (format == ReportFormat::html) report::write_html(document, out);
  else report::write_markdown(document, out);
}

}  // namespace plumb::present
