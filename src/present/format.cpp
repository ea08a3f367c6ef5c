#include "format.hpp"
#include "plumb/present/caution.hpp"

#include <algorithm>
#include <ostream>

namespace plumb::present {

const char* const caution_line =
    "plumb verifies the mathematics of the model as written; whether the model captures the law or the "
    "specification is for qualified people under local codes.";

}  // namespace plumb::present

namespace plumb::present::detail {
namespace {

Rational power_of_ten(long exponent) {
  numeric::Integer power;
  mpz_ui_pow_ui(power.backend().data(), 10, static_cast<unsigned long>(std::labs(exponent)));
  return exponent >= 0 ? Rational(power) : Rational(numeric::Integer(1), power);
}

// e with 10^e <= magnitude < 10^(e+1), for magnitude > 0.
long decimal_exponent(const Rational& magnitude) {
  long exponent = static_cast<long>(numerator(magnitude).str().size()) -
                  static_cast<long>(denominator(magnitude).str().size());
  while (magnitude < power_of_ten(exponent)) --exponent;
  while (magnitude >= power_of_ten(exponent + 1)) ++exponent;
  return exponent;
}

}  // namespace

Table& Table::add(std::vector<std::string> cells) {
  rows_.push_back(std::move(cells));
  return *this;
}

void Table::write(std::ostream& out, const std::string& indent, std::size_t gap) const {
  std::vector<std::size_t> width;
  for (const auto& row : rows_) {
    if (width.size() < row.size()) width.resize(row.size(), 0);
    for (std::size_t c = 0; c < row.size(); ++c) width[c] = std::max(width[c], row[c].size());
  }
  for (const auto& row : rows_) {
    std::string line = indent;
    for (std::size_t c = 0; c < row.size(); ++c) {
      bool last = c + 1 == row.size();
      std::size_t pad = width[c] - row[c].size();
      bool right = c < alignment_.size() && alignment_[c] == Align::right;
      if (right) line += std::string(pad, ' ');
      line += row[c];
      if (!right && !last) line += std::string(pad, ' ');
      if (!last) line += std::string(gap, ' ');
    }
    while (!line.empty() && line.back() == ' ') line.pop_back();
    out << line << "\n";
  }
}

void write_heading(std::ostream& out, const std::string& heading) {
  out << "\n" << heading << "\n";
}

std::string scientific(const Rational& value, int significant) {
  if (value == 0) return "0";
  Rational magnitude = abs(value);
  long exponent = decimal_exponent(magnitude);
  numeric::Decimal mantissa = numeric::to_decimal(magnitude / power_of_ten(exponent), significant);
  if (mantissa.text == "10") mantissa.text = "1", ++exponent;  // rounding carried over
  return std::string(mantissa.rounded ? "~" : "") + (value < 0 ? "-" : "") + mantissa.text +
         (exponent < 0 ? "e-" : "e+") + std::to_string(std::labs(exponent));
}

std::string percent(const Rational& fraction) {
  return numeric::to_display(fraction * 100, 3) + " %";
}

std::string constant_rule_text(const model::Source& source) {
  if (source.format == "plumb" || source.format == "built") return "stated in the model";
  return source.constant_rule == model::ObjectiveConstantRule::negated_rhs
             ? "an RHS entry on the objective row counts negated (the default)"
             : "an RHS entry on the objective row is ignored (--ignore-objective-rhs)";
}

int integer_columns(const model::Model& model) {
  return static_cast<int>(std::count_if(model.columns.begin(), model.columns.end(),
                                        [](const model::Column& c) { return c.integer; }));
}

std::string side_text(const model::Side& side, bool is_lower) {
  if (!side) return is_lower ? "-inf" : "+inf";
  return numeric::exact_and_decimal(*side);
}

std::string count_of(std::size_t count, const std::string& singular, const std::string& plural) {
  return std::to_string(count) + " " + (count == 1 ? singular : plural);
}

std::string name_list(const std::vector<std::string>& names, std::size_t shown) {
  std::string text;
  std::size_t listed = std::min(shown, names.size());
  for (std::size_t k = 0; k < listed; ++k) text += (k > 0 ? ", " : "") + names[k];
  if (names.size() > listed) text += " and " + std::to_string(names.size() - listed) + " more";
  return text;
}

nlohmann::json exact_json(const Rational& value) { return numeric::to_fraction(value); }

nlohmann::json side_json(const model::Side& side) { return side ? exact_json(*side) : nlohmann::json(nullptr); }

const model::Label& violation_label(const model::Model& model, const audit::Violation& v) {
  if (v.kind == audit::Violation::Kind::row) return model.rows[static_cast<std::size_t>(v.index)].label;
  const model::Column& column = model.columns[static_cast<std::size_t>(v.index)];
  const model::Label& own = v.side == audit::Violation::Side::lower ? column.lower_label : column.upper_label;
  return own.statement.empty() && own.unit.empty() ? column.label : own;
}

const std::string& violation_name(const model::Model& model, const audit::Violation& v) {
  return v.kind == audit::Violation::Kind::row ? model.rows[static_cast<std::size_t>(v.index)].name
                                               : model.columns[static_cast<std::size_t>(v.index)].name;
}

void put_number(nlohmann::ordered_json& target, const Rational& value) {
  numeric::Decimal decimal = numeric::to_decimal(value);
  target["fraction"] = numeric::to_fraction(value);
  target["decimal"] = decimal.text;
  target["rounded"] = decimal.rounded;
}

std::string coefficient_text(const Rational& value) {
  numeric::Decimal decimal = numeric::to_decimal(value, 15);
  return decimal.rounded ? numeric::to_display(value) : decimal.text;
}

std::string expression_text(const model::Model& model, int row, std::size_t limit) {
  auto columns = model.matrix.row_columns(row);
  auto positions = model.matrix.row_positions(row);
  std::string text;
  for (std::size_t k = 0; k < columns.size(); ++k) {
    if (k == limit) {
      text += " + ... (" + std::to_string(columns.size() - limit) + " more terms)";
      break;
    }
    const Rational& value = model.matrix.value(positions[k]);
    Rational magnitude = abs(value);
    text += value < 0 ? (k == 0 ? "-" : " - ") : (k == 0 ? "" : " + ");
    if (magnitude != 1) text += coefficient_text(magnitude) + " ";
    text += model.columns[static_cast<std::size_t>(columns[k])].name;
  }
  return text.empty() ? "0" : text;
}

}  // namespace plumb::present::detail
