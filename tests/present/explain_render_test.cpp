// plumb explain's renderings on small crafted models (invented, worked by hand): the members in
// words when labels speak and by name when they do not, the inconsistent model, the progress line.
#include "plumb/explain/explain.hpp"
#include "plumb/present/explain.hpp"

#include <gtest/gtest.h>

#include <sstream>

namespace plumb::present {
namespace {

using model::ModelBuilder;
using numeric::Rational;
using Terms = std::vector<std::pair<std::string, Rational>>;

bool has(const std::string& text, const std::string& part) { return text.find(part) != std::string::npos; }

std::string text_of(const model::Model& m) {
  std::ostringstream out;
  write_explain_text(m, explain::explain(m), nullptr, "", out);
  return out.str();
}

// Worked by hand: 2 x >= 10 with x <= 3 (bound) cannot hold.
model::Model small_conflict() {
  return ModelBuilder("small")
      .column("x", 1, Rational(0), Rational(3))
      .row("demand", Terms{{"x", 2}}, Rational(10), {})
      .build();
}

TEST(ExplainRender, MembersWithoutLabelsAreNamedWithTheirAlgebra) {
  std::string text = text_of(small_conflict());
  EXPECT_TRUE(has(text, "  1. demand\n     2 x >= 10\n     soft; the lower side of row demand\n")) << text;
  EXPECT_TRUE(has(text, "  2. x\n     x <= 3\n     soft; the upper bound of column x\n")) << text;
  EXPECT_TRUE(has(text, "(1 row side, 1 bound)")) << text;
}

// Worked by hand: 2 x >= 10 and x <= 3, weighted 1 and 2, give 0 >= 10 - 6 = 4.
TEST(ExplainRender, DerivationInWholeNumbers) {
  std::string text = text_of(small_conflict());
  EXPECT_TRUE(has(text, "  + 1 x demand\n       2 x >= 10\n  - 2 x x\n       x <= 3\n")) << text;
  EXPECT_TRUE(has(text, "Every quantity cancels (x), and what is left says\n  0 >= 4, which is false"))
      << text;
}

// Invented chain: x0 >= 1 (a row), each x(k+1) - x(k) >= 1 for k < 11, and x11 <= 5 (a bound): all
// thirteen entries are needed (x11 would have to reach 12), every weight is 1, and they add up to
// 0 >= 1 + 11 - 5 = 7.  The derivation shows eight lines (the largest contribution, -5, first) and
// counts the five others, each adding 1.
TEST(ExplainRender, LongDerivationIsSummarised) {
  ModelBuilder builder("chain");
  for (int k = 0; k <= 11; ++k)
    builder.column("x" + std::to_string(k), 0, Rational(0), k == 11 ? model::Side(5) : model::Side());
  builder.row("start", Terms{{"x0", 1}}, Rational(1), {});
  for (int k = 0; k < 11; ++k)
    builder.row("step" + std::to_string(k),
                Terms{{"x" + std::to_string(k + 1), 1}, {"x" + std::to_string(k), -1}}, Rational(1), {});
  std::string text = text_of(builder.build());
  EXPECT_TRUE(has(text, "  and 5 more requirements (--json lists them), whose weighted limits add 5\n"))
      << text;
  EXPECT_TRUE(has(text, "0 >= 7, which is false")) << text;
}

// Worked by hand: x >= 4 and y >= 4 (group contract) cannot hold under the hard x + y <= 6 (group
// plant).  By group, the contract conflicts with the plant; opened, its two rows are named.
TEST(ExplainRender, GroupsAreSaidInASentence) {
  model::Model m = ModelBuilder("groups")
                       .column("x", 1)
                       .column("y", 1)
                       .row("x_order", Terms{{"x", 1}}, Rational(4), {})
                       .row("y_order", Terms{{"y", 1}}, Rational(4), {})
                       .row("capacity", Terms{{"x", 1}, {"y", 1}}, {}, Rational(6))
                       .build();
  for (auto& row : m.rows) row.label.group = "contract";
  m.rows[2].label.group = "plant";
  m.rows[2].label.hard = true;
  for (auto& column : m.columns) column.label.hard = true;
  explain::Options options;
  options.by_group = true;
  std::ostringstream grouped;
  write_explain_text(m, explain::explain(m, options), nullptr, "", grouped);
  EXPECT_TRUE(
      has(grouped.str(),
          "In groups: the contract requirements conflict with the hard plant requirements, kept as given"))
      << grouped.str();
  options.within = "contract";
  std::ostringstream opened;
  write_explain_text(m, explain::explain(m, options), nullptr, "", opened);
  EXPECT_TRUE(
      has(opened.str(), "In groups: \"x_order\" and \"y_order\" conflict with the hard plant requirements"))
      << opened.str();
}

TEST(ExplainRender, LabelsGiveStatementsUnitsAndHardness) {
  model::Model m = small_conflict();
  m.rows[0].label = {
      .statement = "ship at least 10 crates", .unit = "crates", .group = "orders", .hard = true};
  m.columns[0].upper_label.statement = "the van takes 3 loads";
  std::string text = text_of(m);
  EXPECT_TRUE(has(text, "  1. the van takes 3 loads\n     x <= 3\n     soft; the upper bound of column x\n"))
      << text;
  EXPECT_TRUE(has(text,
                  "against these hard requirements, kept as given:\n  - ship at least 10 crates\n"
                  "     2 x >= 10 crates\n     hard; the lower side of row demand; group orders\n"))
      << text;
}

TEST(ExplainRender, IntegerMarkersAreNotedAsTheLpRelaxation) {
  model::Model m = small_conflict();
  m.columns[0].integer = true;
  EXPECT_TRUE(
      has(text_of(m), "note       1 columns are marked integer: plumb explained the LP relaxation\n"));
}

TEST(ExplainRender, HardAloneIsTheModelInconsistent) {
  model::Model m = small_conflict();
  m.rows[0].label.hard = true;
  m.columns[0].label.hard = true;
  std::string text = text_of(m);
  EXPECT_TRUE(has(text, "the model itself is inconsistent")) << text;
  EXPECT_TRUE(has(text, "These 2 hard requirements cannot all hold together:")) << text;
}

TEST(ExplainRender, ProgressLineShowsPhaseCandidatesSubSolvesAndSeconds) {
  std::string line = explain_progress_line({"deletion, rows first", 12, 40, 2.5});
  EXPECT_EQ(line, "  deletion, rows first             12 left      40 sub-solves      2.5 s");
}

}  // namespace
}  // namespace plumb::present
