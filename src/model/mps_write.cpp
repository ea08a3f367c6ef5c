// MPS writer, free form: every number exact, and the reader gets the same model back (docs/mps.md).
#include "number_text.hpp"
#include "plumb/model/write.hpp"

#include <algorithm>
#include <ostream>
#include <stdexcept>
#include <string>

namespace plumb::model {
namespace {

[[noreturn]] void refuse(const std::string& what) {
  throw std::runtime_error("cannot write MPS: " + what + " (the native .plumb format can hold it)");
}

// Free MPS separates fields by blanks, so a name must be one non-empty run of visible characters.
const std::string& checked_name(const std::string& name, const char* kind) {
  if (name.empty()) refuse(std::string("a ") + kind + " has an empty name");
  for (char c : name)
    if (static_cast<unsigned char>(c) <= ' ' || c == 0x7f)
      refuse(std::string(kind) + " name \"" + name + "\" contains a blank or a control character");
  if (name == "'MARKER'") refuse(std::string(kind) + " name 'MARKER' would read as an integer marker");
  return name;
}

// The exact decimal text of a value whose denominator has no prime factors but 2 and 5, trailing
// zeros as an exponent: as long as the number that was read, so the line fits the reader's limit.
std::string exact_decimal(const Rational& value, const std::string& what) {
  auto text = detail::decimal_text(abs(value), false);
  if (!text) refuse(what + " is " + numeric::to_fraction(value) + ", which has no finite decimal form");
  return value < 0 ? "-" + *text : *text;
}

// How the ROWS, RHS and RANGES sections state a row.
struct RowForm {
  char type;   // 'N' for a free row: written, and dropped again on reading (docs/mps.md)
  Side rhs;    // written when non-zero
  Side range;  // a two-sided row is a G row with range upper - lower
};

RowForm row_form(const Row& row) {
  if (!row.lower && !row.upper) return {'N', {}, {}};
  if (!row.lower) return {'L', row.upper, {}};
  if (!row.upper) return {'G', row.lower, {}};
  if (*row.lower == *row.upper) return {'E', row.lower, {}};
  if (*row.lower > *row.upper)
    refuse("row \"" + row.name + "\" has its lower side above its upper side, which MPS cannot state");
  return {'G', row.lower, Rational(*row.upper - *row.lower)};
}

class Writer {
 public:
  Writer(const Model& model, std::ostream& out) : model_(model), out_(out) {}

  void write() {
    const std::string& title = model_.title;
    if (title.find_first_of("\r\n") != std::string::npos ||
        (!title.empty() && (title.front() == ' ' || title.back() == ' ')))
      refuse("the title \"" + title + "\" has a line break or leading or trailing blanks");
    out_ << "NAME" << (title.empty() ? "" : " ") << title << '\n';
    if (model_.objective.sense == Sense::maximise) out_ << "OBJSENSE\n    MAX\n";
    objective_ = &checked_name(model_.objective.name, "objective");
    if (model_.find_row(*objective_))
      refuse("the objective and a row share the name \"" + *objective_ + "\"");
    for (const Row& row : model_.rows) forms_.push_back(row_form(row));
    write_rows();
    write_columns();
    write_rhs_and_ranges();
    write_bounds();
    out_ << "ENDATA\n";
  }

 private:
  void fields(std::initializer_list<std::string_view> items) {
    out_ << "   ";
    for (std::string_view item : items) out_ << ' ' << item;
    out_ << '\n';
  }

  void write_rows() {
    out_ << "ROWS\n";
    fields({"N", *objective_});
    for (int i = 0; i < model_.row_count(); ++i)
      fields({std::string_view(&forms_[i].type, 1), checked_name(model_.rows[i].name, "row")});
  }

  void write_columns() {
    out_ << "COLUMNS\n";
    bool in_integer_run = false;
    int markers = 0;
    auto marker = [&](std::string_view kind) {
      fields({"MARKER" + std::to_string(++markers), "'MARKER'", kind});
      in_integer_run = !in_integer_run;
    };
    for (int j = 0; j < model_.column_count(); ++j) {
      const Column& column = model_.columns[j];
      const std::string& name = checked_name(column.name, "column");
      if (column.integer != in_integer_run) marker(column.integer ? "'INTORG'" : "'INTEND'");
      const Rational& cost = model_.objective.coefficients[j];
      auto rows = model_.matrix.column_rows(j);
      auto values = model_.matrix.column_values(j);
      // A column with no entry at all still needs a line to exist.
      if (cost != 0 || rows.empty())
        fields({name, *objective_, exact_decimal(cost, "the objective coefficient of \"" + name + "\"")});
      for (std::size_t k = 0; k < rows.size(); ++k) {
        const std::string& row = model_.rows[rows[k]].name;
        fields({name, row, exact_decimal(values[k], "the entry of \"" + name + "\" in \"" + row + "\"")});
      }
    }
    if (in_integer_run) marker("'INTEND'");
  }

  void write_rhs_and_ranges() {
    out_ << "RHS\n";
    const Rational& constant = model_.objective.constant;
    if (constant != 0) fields({"RHS", *objective_, exact_decimal(-constant, "the objective constant")});
    for (int i = 0; i < model_.row_count(); ++i)
      if (forms_[i].rhs && *forms_[i].rhs != 0)
        fields({"RHS", model_.rows[i].name,
                exact_decimal(*forms_[i].rhs, "a side of \"" + model_.rows[i].name + "\"")});
    bool any_range =
        std::any_of(forms_.begin(), forms_.end(), [](const RowForm& f) { return f.range.has_value(); });
    if (!any_range) return;
    out_ << "RANGES\n";
    for (int i = 0; i < model_.row_count(); ++i)
      if (forms_[i].range)
        fields({"RNG", model_.rows[i].name,
                exact_decimal(*forms_[i].range, "the range of \"" + model_.rows[i].name + "\"")});
  }

  void write_bounds() {
    bool header = false;
    auto bound = [&](std::string_view type, const std::string& column, const Side& value) {
      if (!header) out_ << "BOUNDS\n", header = true;
      if (value)
        fields({type, "BND", column, exact_decimal(*value, "a bound of \"" + column + "\"")});
      else
        fields({type, "BND", column});
    };
    for (const Column& column : model_.columns) {
      const Side& lower = column.lower;
      const Side& upper = column.upper;
      if (column.integer && lower == Rational(0) && upper == Rational(1)) {
        bound("BV", column.name, {});
      } else if (!lower) {
        bound(upper ? "MI" : "FR", column.name, {});
        if (upper) bound("UP", column.name, upper);
      } else if (upper && *lower == *upper) {
        bound("FX", column.name, lower);
      } else {
        // An explicit lower bound keeps a negative upper bound from meaning "lower is -infinity".
        if (*lower != 0 || (upper && *upper < 0)) bound("LO", column.name, lower);
        if (upper) bound("UP", column.name, upper);
      }
    }
  }

  const Model& model_;
  std::ostream& out_;
  const std::string* objective_ = nullptr;
  std::vector<RowForm> forms_;
};

}  // namespace

void write_mps(const Model& model, std::ostream& out) { Writer(model, out).write(); }

}  // namespace plumb::model
