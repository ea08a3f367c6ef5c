// Internal to present: aligned tables and the number and list wording every rendering shares.
#pragma once

#include "plumb/audit/evaluate.hpp"
#include "plumb/health/health.hpp"
#include "plumb/model/model.hpp"
#include "plumb/numeric/rational.hpp"

#include <nlohmann/json.hpp>

#include <cstddef>
#include <iosfwd>
#include <string>
#include <vector>

namespace plumb::present::detail {

using numeric::Rational;

// Rows of cells printed in columns padded to the widest cell; the last column is never padded.
class Table {
 public:
  enum class Align { left, right };
  explicit Table(std::vector<Align> alignment = {}) : alignment_(std::move(alignment)) {}
  Table& add(std::vector<std::string> cells);
  bool empty() const { return rows_.empty(); }
  // Each row on its own line, starting with `indent`, cells separated by `gap` spaces.
  void write(std::ostream& out, const std::string& indent = "  ", std::size_t gap = 2) const;

 private:
  std::vector<Align> alignment_;
  std::vector<std::vector<std::string>> rows_;
};

// A heading line and nothing else: sections of the text renderings start with it.
void write_heading(std::ostream& out, const std::string& heading);

// Scientific form for magnitudes and ratios: "1e+8", "~2.5e-3", "3e+0".
std::string scientific(const Rational& value, int significant = 3);

// A percentage with three significant digits: "9.62 %", "~0.0413 %".
std::string percent(const Rational& fraction);

// Where the objective constant came from: stated in the model, or the MPS rule that made it.
std::string constant_rule_text(const model::Source& source);

// How many columns carry an integer marker (plumb solves and analyses the LP relaxation).
int integer_columns(const model::Model& model);

// A coefficient inside an algebraic form: an exact decimal when it has a short one ("0.1", not
// "1/10"), else the value's short text form.
std::string coefficient_text(const Rational& value);

// Row i's left-hand side in the model's names, "3 butane + 0.1 naphtha - ethanol", terms in column
// order; at most `limit` terms, then "+ ... (N more terms)".
std::string expression_text(const model::Model& model, int row, std::size_t limit);

// A side or bound: the exact value, or "-inf"/"+inf" when it is absent.
std::string side_text(const model::Side& side, bool is_lower);

// "3 rows", "1 row".
std::string count_of(std::size_t count, const std::string& singular, const std::string& plural);

// The first `shown` names, then "and N more": "a, b, c and 12 more".
std::string name_list(const std::vector<std::string>& names, std::size_t shown);

// One finding of inspect in a line: what it means, then where (the health report's own wording).
std::string finding_text(const health::Finding& finding, const health::HealthReport& report);

// The row or column a plan misses, and the label that speaks for that side: a bound's own label
// when it has words, else its column's.
const std::string& violation_name(const model::Model& model, const audit::Violation& v);
const model::Label& violation_label(const model::Model& model, const audit::Violation& v);

// JSON forms: an exact number is its canonical fraction text ("-3/2"); an absent side is null.
nlohmann::json exact_json(const Rational& value);
nlohmann::json side_json(const model::Side& side);
// Sets target's "fraction", "decimal" (rounded to 12 digits when it must be) and "rounded".
void put_number(nlohmann::ordered_json& target, const Rational& value);

}  // namespace plumb::present::detail
