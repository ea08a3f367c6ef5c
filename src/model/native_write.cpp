// Native model format writer: output that parse_native reads back to the same model.
#include "native_lexer.hpp"
#include "number_text.hpp"
#include "plumb/model/write.hpp"

#include <algorithm>
#include <ostream>

namespace plumb::model {
namespace {

using numeric::Integer;
constexpr std::size_t line_width = 100;  // long statements wrap onto indented continuation lines

std::string escaped(std::string_view text, char close) {
  std::string out;
  for (char c : text) {
    if (c == '\\' || c == close)
      out += '\\', out += c;
    else if (c == '\n')
      out += "\\n";
    else if (c == '\t')
      out += "\\t";
    else
      out += c;
  }
  return out;
}

std::string name_text(const std::string& name) {
  return detail::is_plain_name(name) ? name : "'" + escaped(name, '\'') + "'";
}

// A non-negative value as an exact decimal when it has one (58.1, 1e-30), else as p/q (1/3e99999).
// As long as the number that was read, whatever its value: a single number of the file fits its
// line, and so does this.
std::string short_magnitude_text(const Rational& value) {
  if (auto decimal = detail::decimal_text(value, true)) return *decimal;
  return detail::integer_text(abs(boost::multiprecision::numerator(value))) + "/" +
         detail::integer_text(boost::multiprecision::denominator(value));
}

// A positive integer as a parenthesised sum of chunks of its digits, c1e+K1 + c2e+K2 + ..., one
// chunk to a continuation line.
std::string chunked_integer(const Integer& value) {
  constexpr std::size_t chunk_digits = 1000;
  const std::string digits = value.str();
  std::string text = "(";
  for (std::size_t begin = 0; begin < digits.size();) {  // the leading chunk takes the odd digits
    const std::size_t remaining = digits.size() - begin;
    std::size_t end = begin + (remaining % chunk_digits == 0 ? chunk_digits : remaining % chunk_digits);
    std::size_t first = digits.find_first_not_of('0', begin);
    if (first < end) {
      if (text.size() > 1) text += "\n    + ";
      text += digits.substr(first, end - first) + "e" + std::to_string(digits.size() - end);
    }
    begin = end;
  }
  return text + ")";
}

// A non-negative value, exactly.  Constant arithmetic makes values whose exact text has no bound
// (1 - 2e-86784 has 86 784 digits) while the format's lines hold at most 65 536 characters: such a
// value is written as arithmetic the reader evaluates back to it, (numerator chunks) / (denominator
// chunks), over continuation lines.
std::string magnitude_text(const Rational& value) {
  constexpr std::size_t longest_on_one_line = 4096;
  std::string text = short_magnitude_text(value);
  if (text.size() <= longest_on_one_line) return text;
  Integer numerator = abs(boost::multiprecision::numerator(value));
  Integer denominator = boost::multiprecision::denominator(value);
  text = "(" + chunked_integer(numerator);
  if (denominator != 1) text += "\n    / " + chunked_integer(denominator);
  return text + ")";
}

std::string number_text(const Rational& value) { return (value < 0 ? "-" : "") + magnitude_text(value); }

// Writes a statement on one line when it fits; else the head wrapped, and the body (an
// expression) from a fresh indented continuation line, wrapping between pieces.
void write_statement(std::ostream& out, const std::vector<std::string>& head,
                     const std::vector<std::string>& body = {}) {
  std::size_t total = 0;
  for (const auto* part : {&head, &body})
    for (const std::string& piece : *part) total += piece.size() + 1;
  std::string line;
  auto add = [&](const std::string& piece) {
    if (line.empty() || line == "    ") {
      line += piece;
    } else if (line.size() + 1 + piece.size() > line_width) {
      out << line << "\n";
      line = "    " + piece;
    } else {
      line += " " + piece;
    }
  };
  for (const std::string& piece : head) add(piece);
  if (total > line_width + 1 && !body.empty()) {
    out << line << "\n";
    line = "    ";
  }
  for (const std::string& piece : body) add(piece);
  out << line << "\n";
}

void add_decision(std::vector<std::string>& pieces, const std::string& decision, const std::string& source,
                  const std::string& owner) {
  if (!decision.empty()) pieces.push_back("decision \"" + escaped(decision, '"') + "\"");
  if (!source.empty()) pieces.push_back("source \"" + escaped(source, '"') + "\"");
  if (!owner.empty()) pieces.push_back("owner \"" + escaped(owner, '"') + "\"");
}

void add_label(std::vector<std::string>& pieces, const Label& label) {
  if (!label.unit.empty()) pieces.push_back("[" + escaped(label.unit, ']') + "]");
  if (!label.statement.empty()) pieces.push_back("\"" + escaped(label.statement, '"') + "\"");
  if (!label.group.empty())
    pieces.push_back("group " + (detail::is_plain_name(label.group)
                                     ? label.group
                                     : "\"" + escaped(label.group, '"') + "\""));
  if (label.hard) pieces.push_back(*label.hard ? "hard" : "soft");
  if (label.weight)
    pieces.push_back("weight " + short_magnitude_text(*label.weight));  // a number, never arithmetic
  add_decision(pieces, label.decision, label.source, label.owner);
}

void add_terms(std::vector<std::string>& pieces, const Model& model, std::span<const int> columns,
               auto value_of) {
  bool first = true;
  for (std::size_t k = 0; k < columns.size(); ++k) {
    const Rational& value = value_of(k);
    if (value == 0) continue;
    std::string piece = value < 0 ? (first ? "-" : "- ") : (first ? "" : "+ ");
    if (abs(value) != 1) piece += magnitude_text(value) + " ";
    pieces.push_back(piece + name_text(model.columns[columns[k]].name));
    first = false;
  }
  if (first) pieces.push_back("0");
}

void write_variable(std::ostream& out, const Column& column) {
  std::vector<std::string> pieces{"variable", name_text(column.name)};
  if (!column.label.unit.empty()) pieces.push_back("[" + escaped(column.label.unit, ']') + "]");
  // Sides with a label of their own go into 'bound' statements below; the rest stay on this line.
  bool inline_lower = column.lower_label.empty();
  bool inline_upper = column.upper_label.empty();
  auto side_text = [](const Side& side, const char* infinity) {
    return side ? number_text(*side) : infinity;
  };
  if (inline_lower && inline_upper && !column.lower && !column.upper) {
    pieces.push_back("free");
  } else if (inline_lower && inline_upper && column.lower && column.upper && *column.lower == *column.upper) {
    pieces.push_back("fixed at " + number_text(*column.lower));
  } else if (inline_lower && inline_upper && column.lower && column.upper) {
    pieces.push_back("between " + number_text(*column.lower) + " and " + number_text(*column.upper));
  } else {
    if (inline_lower && column.lower != Side(Rational(0)))
      pieces.push_back("at least " + side_text(column.lower, "-infinity"));
    if (inline_upper && column.upper) pieces.push_back("at most " + number_text(*column.upper));
  }
  if (column.integer) pieces.push_back("integer");
  Label rest = column.label;
  rest.unit.clear();
  add_label(pieces, rest);
  write_statement(out, pieces);
  if (!inline_lower) {
    std::vector<std::string> bound{"bound", name_text(column.name),
                                   "at least " + side_text(column.lower, "-infinity")};
    add_label(bound, column.lower_label);
    write_statement(out, bound);
  }
  if (!inline_upper) {
    std::vector<std::string> bound{"bound", name_text(column.name),
                                   "at most " + side_text(column.upper, "infinity")};
    add_label(bound, column.upper_label);
    write_statement(out, bound);
  }
}

void write_objective(std::ostream& out, const Model& model) {
  const Objective& objective = model.objective;
  std::vector<std::string> pieces{objective.sense == Sense::minimise ? "minimise" : "maximise"};
  if (!objective.name.empty()) pieces.push_back(name_text(objective.name));
  add_label(pieces, objective.label);
  pieces.back() += ":";
  std::vector<int> columns(static_cast<std::size_t>(model.column_count()));
  for (int j = 0; j < model.column_count(); ++j) columns[static_cast<std::size_t>(j)] = j;
  std::vector<std::string> body;
  add_terms(body, model, columns,
            [&](std::size_t k) -> const Rational& { return objective.coefficients[k]; });
  if (objective.constant != 0) {
    if (body.back() == "0") body.pop_back();
    body.push_back((objective.constant < 0 ? (body.empty() ? "-" : "- ") : (body.empty() ? "" : "+ ")) +
                   magnitude_text(objective.constant));
  }
  write_statement(out, pieces, body);
}

void write_constraint(std::ostream& out, const Model& model, int i) {
  const Row& row = model.rows[static_cast<std::size_t>(i)];
  std::vector<std::string> pieces{"constraint", name_text(row.name)};
  add_label(pieces, row.label);
  pieces.back() += ":";
  bool two_sided = row.lower && row.upper && *row.lower != *row.upper;
  std::vector<std::string> body;
  if (two_sided) body.push_back(number_text(*row.lower) + " <=");
  auto positions = model.matrix.row_positions(i);
  add_terms(body, model, model.matrix.row_columns(i),
            [&](std::size_t k) -> const Rational& { return model.matrix.value(positions[k]); });
  if (two_sided)
    body.push_back("<= " + number_text(*row.upper));
  else if (row.lower && row.upper)
    body.push_back("= " + number_text(*row.upper));
  else if (row.upper)
    body.push_back("<= " + number_text(*row.upper));
  else if (row.lower)
    body.push_back(">= " + number_text(*row.lower));
  else
    body.push_back("<= infinity");
  write_statement(out, pieces, body);
}

}  // namespace

void write_native(const Model& model, std::ostream& out) {
  if (!model.title.empty()) out << "title \"" << escaped(model.title, '"') << "\"\n\n";
  for (const ModelDecision& decision : model.decisions) {
    std::vector<std::string> pieces;
    add_decision(pieces, decision.decision, decision.source, decision.owner);
    write_statement(out, pieces);
  }
  if (!model.decisions.empty()) out << "\n";
  for (const Column& column : model.columns) write_variable(out, column);
  out << "\n";
  write_objective(out, model);
  if (!model.rows.empty()) out << "\n";
  for (int i = 0; i < model.row_count(); ++i) write_constraint(out, model, i);
}

}  // namespace plumb::model
