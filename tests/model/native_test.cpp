// The native model format (docs/model-format.md): every construct, its errors and round trips.
#include "model/expect_input_error.hpp"
#include "model/parsers.hpp"
#include "plumb/model/labels.hpp"
#include "plumb/model/read.hpp"
#include "plumb/model/write.hpp"

#include <gtest/gtest.h>

#include <algorithm>
#include <filesystem>
#include <fstream>
#include <sstream>

namespace {

using plumb::model::InputError;
using plumb::model::Model;
using plumb::model::Rational;
using plumb::model::Sense;
using plumb::model::Side;
using plumb::test::BadInput;
using plumb::test::expect_error_at;

Model parse(const std::string& text) { return plumb::model::detail::parse_native(text, "test.plumb"); }

std::string written(const Model& model) {
  std::ostringstream out;
  plumb::model::write_native(model, out);
  return out.str();
}

// The model read back from what the writer made of it.
Model round_trip(const Model& model) { return parse(written(model)); }

int column(const Model& model, const std::string& name) { return model.find_column(name).value(); }
int row(const Model& model, const std::string& name) { return model.find_row(name).value(); }

Rational entry(const Model& model, const std::string& row_name, const std::string& column_name) {
  return model.matrix.at(row(model, row_name), column(model, column_name));
}

InputError error_of(const std::string& text) {
  try {
    parse(text);
  } catch (const InputError& e) {
    return e;
  }
  ADD_FAILURE() << "no error for:\n" << text;
  return InputError({}, "", "");
}

TEST(NativeFormat, VariablesBoundsAndIntegerMarks) {
  Model m = parse(
      "variable a\n"
      "variable b [t] between 2 and 7.5\n"
      "variable c at least -3 at most 3/8\n"
      "variable d free\n"
      "variable e fixed at 4\n"
      "variable f at least -infinity at most 9\n"
      "variable g at most infinity integer\n");
  ASSERT_EQ(m.column_count(), 7);
  EXPECT_EQ(m.columns[0].lower, Side(Rational(0)));  // the default: at least 0, no upper bound
  EXPECT_EQ(m.columns[0].upper, Side());
  EXPECT_EQ(m.columns[1].lower, Side(Rational(2)));
  EXPECT_EQ(m.columns[1].upper, Side(Rational(15, 2)));
  EXPECT_EQ(m.columns[1].label.unit, "t");
  EXPECT_EQ(m.columns[2].lower, Side(Rational(-3)));
  EXPECT_EQ(m.columns[2].upper, Side(Rational(3, 8)));
  EXPECT_EQ(m.columns[3].lower, Side());
  EXPECT_EQ(m.columns[3].upper, Side());
  EXPECT_EQ(m.columns[4].lower, Side(Rational(4)));
  EXPECT_EQ(m.columns[4].upper, Side(Rational(4)));
  EXPECT_EQ(m.columns[5].lower, Side());
  EXPECT_EQ(m.columns[5].upper, Side(Rational(9)));
  EXPECT_EQ(m.columns[6].upper, Side());
  EXPECT_TRUE(m.columns[6].integer);
  EXPECT_FALSE(m.columns[5].integer);
  EXPECT_TRUE(m.has_integers());
  EXPECT_EQ(m.source.format, "plumb");
  EXPECT_TRUE(m.warnings.empty());
}

TEST(NativeFormat, LabelsOnVariablesBoundsConstraintsAndObjective) {
  Model m = parse(
      "title \"Depot \\\"North\\\" plan\"\n"
      "variable x [bbl] \"what we ship\" group 'day shift' soft\n"
      "bound x at most 900 \"the sphere holds 900 bbl\" [bbl] group equipment hard\n"
      "bound x at least 10 \"we promised ten\" group \"sales desk\"\n"
      "maximise margin [USD] \"what we earn\" group money: 5 x\n"
      "constraint cap [bbl] \"line one\\nline two\" group regulatory hard: x <= 800\n");
  EXPECT_EQ(m.title, "Depot \"North\" plan");
  const auto& x = m.columns[0];
  EXPECT_EQ(x.label.statement, "what we ship");
  EXPECT_EQ(x.label.unit, "bbl");
  EXPECT_EQ(x.label.group, "day shift");
  EXPECT_EQ(x.label.hard, false);
  EXPECT_EQ(x.upper, Side(Rational(900)));
  EXPECT_EQ(x.upper_label.statement, "the sphere holds 900 bbl");
  EXPECT_EQ(x.upper_label.unit, "bbl");
  EXPECT_EQ(x.upper_label.group, "equipment");
  EXPECT_EQ(x.upper_label.hard, true);
  EXPECT_EQ(x.lower, Side(Rational(10)));
  EXPECT_EQ(x.lower_label.statement, "we promised ten");
  EXPECT_EQ(x.lower_label.group, "sales desk");
  EXPECT_FALSE(x.lower_label.hard.has_value());
  EXPECT_EQ(m.objective.name, "margin");
  EXPECT_EQ(m.objective.sense, Sense::maximise);
  EXPECT_EQ(m.objective.label.statement, "what we earn");
  EXPECT_EQ(m.objective.label.unit, "USD");
  EXPECT_EQ(m.objective.label.group, "money");
  const auto& cap = m.rows[0];
  EXPECT_EQ(cap.label.statement, "line one\nline two");
  EXPECT_EQ(cap.label.group, "regulatory");
  EXPECT_EQ(cap.label.hard, true);
}

TEST(NativeFormat, BetweenAndFreeAndFixedBoundStatementsLabelBothSides) {
  Model m = parse(
      "variable x\nvariable y\nvariable z\n"
      "bound x between 1 and 2 \"the window\"\n"
      "bound y free \"may run either way\"\n"
      "bound z fixed at 5 \"set by the plant\"\n");
  EXPECT_EQ(m.columns[0].lower_label.statement, "the window");
  EXPECT_EQ(m.columns[0].upper_label.statement, "the window");
  EXPECT_EQ(m.columns[1].lower, Side());
  EXPECT_EQ(m.columns[1].upper_label.statement, "may run either way");
  EXPECT_EQ(m.columns[2].lower, Side(Rational(5)));
  EXPECT_EQ(m.columns[2].upper, Side(Rational(5)));
  EXPECT_TRUE(m.columns[2].label.empty());
}

TEST(NativeFormat, ConstraintForms) {
  Model m = parse(
      "variable a\nvariable b\n"
      "constraint le: a + b <= 20\n"
      "constraint ge: a - b >= -4\n"
      "constraint eq: 2 a = 6\n"
      "constraint window: 10 <= a + b <= 20\n"
      "constraint window_down: 20 >= a + b >= 10\n"
      "constraint moved: a + 3 <= b + 10\n"
      "constraint moved_two_sided: 1 <= a + 2 <= 5\n"
      "constraint both_sides: 3 a >= 2 a + b\n"
      "constraint no_limits: a + b <= infinity\n"
      "constraint half_open: -infinity <= a <= 7\n"
      "constraint constant_only: 0 <= 5\n");
  auto sides = [&](const std::string& name) { return std::pair(m.rows[row(m, name)].lower, m.rows[row(m, name)].upper); };
  EXPECT_EQ(sides("le"), std::pair(Side(), Side(Rational(20))));
  EXPECT_EQ(sides("ge"), std::pair(Side(Rational(-4)), Side()));
  EXPECT_EQ(sides("eq"), std::pair(Side(Rational(6)), Side(Rational(6))));
  EXPECT_EQ(sides("window"), std::pair(Side(Rational(10)), Side(Rational(20))));
  EXPECT_EQ(sides("window_down"), std::pair(Side(Rational(10)), Side(Rational(20))));
  EXPECT_EQ(sides("moved"), std::pair(Side(), Side(Rational(7))));
  EXPECT_EQ(entry(m, "moved", "b"), -1);
  EXPECT_EQ(sides("moved_two_sided"), std::pair(Side(Rational(-1)), Side(Rational(3))));
  EXPECT_EQ(sides("both_sides"), std::pair(Side(Rational(0)), Side()));
  EXPECT_EQ(entry(m, "both_sides", "a"), 1);
  EXPECT_EQ(entry(m, "both_sides", "b"), -1);
  EXPECT_EQ(sides("no_limits"), std::pair(Side(), Side()));
  EXPECT_EQ(sides("half_open"), std::pair(Side(), Side(Rational(7))));
  EXPECT_EQ(sides("constant_only"), std::pair(Side(), Side(Rational(5))));
  EXPECT_EQ(m.matrix.row_columns(row(m, "constant_only")).size(), 0u);
}

TEST(NativeFormat, ExactCoefficientsAndConstantArithmetic) {
  Model m = parse(
      "variable x\nvariable y\n"
      "constraint c: (1/3)*x + 2*1.5 y <= 1e-3\n"
      "constraint d: 3/8 x - (2 - 1/2) * y + 0.1 x >= (1 + 2) * 4 / 6\n"
      "constraint e: .5 x + 1. y = 12345678901234567890.123456789\n");
  EXPECT_EQ(entry(m, "c", "x"), Rational(1, 3));
  EXPECT_EQ(entry(m, "c", "y"), 3);
  EXPECT_EQ(*m.rows[0].upper, Rational(1, 1000));
  EXPECT_EQ(entry(m, "d", "x"), Rational(3, 8) + Rational(1, 10));  // repeated: summed exactly
  EXPECT_EQ(entry(m, "d", "y"), Rational(-3, 2));
  EXPECT_EQ(*m.rows[1].lower, 2);
  EXPECT_EQ(entry(m, "e", "x"), Rational(1, 2));
  EXPECT_EQ(*m.rows[2].upper, Rational(plumb::numeric::Integer("12345678901234567890123456789"),
                                       plumb::numeric::Integer("1000000000")));
  ASSERT_EQ(m.warnings.size(), 1u);  // x twice on one side of d
  EXPECT_EQ(m.warnings[0].where.line, 4);
}

TEST(NativeFormat, ObjectiveWithConstantAndDefaults) {
  Model m = parse("variable x\nvariable y\nminimize: 2 x - y + 7 - 1/2\n");
  EXPECT_EQ(m.objective.name, "objective");
  EXPECT_EQ(m.objective.sense, Sense::minimise);
  EXPECT_EQ(m.objective.constant, Rational(13, 2));
  EXPECT_EQ(m.objective.coefficients, (std::vector<Rational>{2, -1}));

  Model zero = parse("variable x\nconstraint c: x <= 1\n");  // no objective: zero, minimised
  EXPECT_EQ(zero.objective.coefficients, std::vector<Rational>{0});
  EXPECT_EQ(zero.objective.sense, Sense::minimise);
}

TEST(NativeFormat, CommentsContinuationLinesAndQuotedNames) {
  Model m = parse(
      "\xEF\xBB\xBF# a byte-order mark and a comment first\n"
      "\n"
      "variable 'R 07/a' [m3] \"a name with a space # not a comment\"  # a comment\n"
      "variable 'back\\\\slash\\'quote'\n"
      "constraint long \"split over\"\n"
      "    # a comment inside the statement\n"
      "\n"
      "    group split:\n"
      "\t'R 07/a' + 'back\\\\slash\\'quote'\n"
      "        <= 4\n");
  ASSERT_EQ(m.column_count(), 2);
  EXPECT_EQ(m.columns[0].name, "R 07/a");
  EXPECT_EQ(m.columns[0].label.statement, "a name with a space # not a comment");
  EXPECT_EQ(m.columns[1].name, "back\\slash'quote");
  EXPECT_EQ(m.rows[0].label.group, "split");
  EXPECT_EQ(entry(m, "long", "back\\slash'quote"), 1);
  EXPECT_EQ(*m.rows[0].upper, 4);
}

TEST(NativeFormat, WarnsWhenLimitsCannotHold) {
  Model m = parse("variable x between 5 and 1\nconstraint c: 3 <= x <= 2\n");
  ASSERT_EQ(m.warnings.size(), 2u);
  EXPECT_EQ(m.warnings[0].where.line, 1);
  EXPECT_EQ(m.warnings[1].where.line, 2);
}

TEST(NativeFormat, RecognisedByContent) {
  using plumb::model::detail::looks_like_native;
  EXPECT_TRUE(looks_like_native("# comment\n\nvariable x\n"));
  EXPECT_TRUE(looks_like_native("title \"t\"\n"));
  EXPECT_FALSE(looks_like_native("NAME  TEST\nROWS\n N  COST\n"));
  EXPECT_FALSE(looks_like_native("* comment\nNAME\n"));
  EXPECT_FALSE(looks_like_native("  variable x\n"));
  EXPECT_FALSE(looks_like_native(""));
  EXPECT_FALSE(looks_like_native("variables x\n"));
}

// Each malformed input: one error at the right place, naming what was found and expected.
TEST(NativeFormatErrors, InlineMistakes) {
  const BadInput cases[] = {
      {"variable x\nconstraint c: x <= 1 1\n", 2, 22, "expected '+', '-', a relation"},
      {"variable x\nconstraint c: x\n", 2, 16, "expected '+', '-' or a relation"},
      {"variable x\nconstraint c: x <= 1 <= 2 <= 3\n", 2, 27, "at most two relations"},
      {"variable x\nconstraint c: x = infinity\n", 2, 19, "in an equation"},
      {"variable x\nconstraint c: x <= -infinity\n", 2, 20, "wrong side"},
      {"variable x\nconstraint c: infinity <= x\n", 2, 15, "wrong side"},
      {"variable x\nconstraint c: 1 = x = 1\n", 2, 21, "two '<=' or two '>='"},
      {"variable x\nconstraint c: x / 2 <= 1\n", 2, 17, "found '/', expected '+', '-' or a relation"},
      {"variable x\nconstraint c: 2 / x <= 1\n", 2, 19, "only numbers can be divided"},
      {"variable x\nconstraint c: 2 * <= 1\n", 2, 19, "after '*'"},
      {"variable x\nconstraint c: (1 + 2 x <= 1\n", 2, 22, "')' closing the '(' at column 15"},
      {"variable x\nconstraint c: x <= 1e999999\n", 2, 20, "an exponent of at most"},
      {"variable x\nconstraint c: x @ 1\n", 2, 17, "one of : <= >= = + - * / ( ) #"},
      {"variable x \"one\" \"two\"\n", 1, 18, "one statement here"},
      {"variable x weight 0\n", 1, 19, "a weight above 0"},
      {"variable x weight 1 weight 2\n", 1, 21, "one weight here"},
      {"variable x [a] [b]\n", 1, 16, "one unit here"},
      {"variable x hard soft\n", 1, 17, "one 'hard' or 'soft' here"},
      {"variable x integer integer\n", 1, 20, "'integer' at most once"},
      {"variable x between 1 or 2\n", 1, 22, "'and' between the two bounds"},
      {"variable x at 5\n", 1, 15, "'least' or 'most' after 'at'"},
      {"variable x fixed at infinity\n", 1, 21, "a number"},
      {"variable x at most -infinity\n", 1, 20, "a number or infinity"},
      {"variable x bananas\n", 1, 12, "a bound (between, at least"},
      {"variable x\nbound x \"no bound given\"\n", 2, 9, "a bound: between A and B"},
      {"variable x\nbound x at most 4 integer\n", 2, 19, "the end of the bound"},
      {"variable x\nvariable y free\nbound y at least 0\n", 3, 9, "one lower bound per variable"},
      {"title \"a\"\ntitle \"b\"\nvariable x\n", 2, 1, "one title per model (the first is on line 1)"},
      {"title untitled\n", 1, 7, "the title in double quotes"},
      {"title \"a\" \"b\"\n", 1, 11, "the end of the title"},
      {"variable x\nminimise cost 3 x\n", 2, 15, "':' before the objective's expression"},
      {"variable x\nminimise: infinity\n", 2, 11, "an expression"},
      {"variable x\nconstraint 'between': x <= 1\nconstraint between: x <= 2\n", 3, 12, "in single quotes"},
      {"variable ''\n", 1, 10, "a name of at least one character"},
      {"variable x\nconstraint c: x <= 1\n  <= 2 <= 3\n", 3, 8, "at most two relations"},
      {"variable x\nconstraint c: 1 <= infinity <= 2\n", 2, 20, "an expression"},
      {"variable x\nconstraint c: -infinity <= x <= -infinity\n", 2, 33, "a number or infinity"},
      {"variable x\nconstraint c: 1 + ((((((((((((((((((((((((((((((((((((((((((((((((((((((((((((((((((((1"
       "))))))))))))))))))))))))))))))))))))))))))))))))))))))))))))))))))) x <= 1\n",
       2, 83, "simpler constant arithmetic"},
      {"variable x\nvariable y\nconstraint c: x <= y\nconstraint d: 3 <= 1\n", 0, 0, ""},  // fine
  };
  for (const BadInput& c : cases) {
    if (c.line == 0) {
      EXPECT_NO_THROW(parse(c.input)) << c.input;
    } else {
      expect_error_at(error_of(c.input), "test.plumb", c);
    }
  }
}

// The files under tests/data/bad/: each one genuinely malformed, each with its own message.
TEST(NativeFormatErrors, BadFiles) {
  const BadInput cases[] = {
      {"bad-unterminated-quote.plumb", 2, 16, "unterminated quote"},
      {"bad-unknown-variable.plumb", 3, 21, "the undeclared variable 'z'"},
      {"bad-duplicate-variable.plumb", 3, 10, "declared on line 1"},
      {"bad-duplicate-constraint.plumb", 3, 12, "the constraint name 'cap' a second time"},
      {"bad-number.plumb", 2, 17, "the number '1.2.3'"},
      {"bad-zero-denominator.plumb", 2, 17, "a non-zero denominator"},
      {"bad-two-objectives.plumb", 3, 1, "one objective per model (the first is on line 2)"},
      {"bad-bound-before-variable.plumb", 1, 7, "declared above"},
      {"bad-missing-colon.plumb", 2, 30, "':' before the constraint's relation"},
      {"bad-strict-inequality.plumb", 2, 19, "never strict"},
      {"bad-second-upper-bound.plumb", 2, 9, "one upper bound per variable (the first is on line 1)"},
      {"bad-unknown-keyword.plumb", 2, 1, "found 'rule', expected a statement keyword"},
      {"bad-indented-first-line.plumb", 2, 3, "no statement before it"},
      {"bad-infinite-lower-bound.plumb", 1, 21, "'infinity' as a lower bound"},
      {"bad-two-sided-mixed.plumb", 2, 27, "'<=' followed by '>='"},
      {"bad-no-variables.plumb", 1, 0, "found no variables"},
      {"bad-reserved-name.plumb", 1, 10, "the reserved word 'free'"},
      {"bad-escape.plumb", 1, 25, "the escape '\\q'"},
      {"bad-division-by-zero.plumb", 2, 24, "division by zero"},
      {"bad-arithmetic-beyond-limit.plumb", 2, 22, "constant arithmetic beyond the limit"},
      {"bad-repeated-coefficients-beyond-limit.plumb", 2, 51, "constant arithmetic beyond the limit"},
      {"bad-side-beyond-limit.plumb", 2, 35, "constant arithmetic beyond the limit"},
      {"bad-two-sided-beyond-limit.plumb", 2, 19, "constant arithmetic beyond the limit"},
      {"bad-number-run-into-name.plumb", 2, 17, "found '2x'"},
      {"bad-relation-in-objective.plumb", 2, 20, "an objective has no relation"},
      {"bad-variable-in-outer-part.plumb", 3, 20, "a variable outside the two relations"},
      {"bad-control-byte.plumb", 2, 1, "control byte 0x01"},
  };
  const std::filesystem::path folder = std::filesystem::path(PLUMB_TEST_DATA_DIR) / "bad";
  for (const BadInput& c : cases) {
    std::string path = (folder / c.input).string();
    try {
      plumb::model::read_model(path);
      ADD_FAILURE() << "no error for " << path;
    } catch (const InputError& e) {
      expect_error_at(e, path, c);
    }
  }
}

TEST(NativeFormatErrors, NeverHalfReadsTruncatedText) {
  // Every prefix of a valid model either reads or fails with one InputError; none crashes.
  std::string text =
      "title \"t\"\nvariable 'a b' [u] between -1/2 and 3 \"s\" group g hard integer\nvariable y at least -1\n"
      "bound y at most 4 \"four\"\nmaximise m: (1/3)*'a b' + 2*1.5 y + 1\n"
      "constraint c \"x\": 1 <= 'a b' - y\n    <= 2\n";
  for (std::size_t n = 0; n <= text.size(); ++n) {
    try {
      parse(text.substr(0, n));
    } catch (const InputError&) {
    }
  }
  EXPECT_NO_THROW(parse(text));
}

// Constant arithmetic makes a coefficient of 86 784 digits (1 - 2e-86784) from a short line; its
// text is longer than any line may be.  The native writer writes it as arithmetic over
// continuation lines that reads back to it exactly; MPS cannot hold it, and says so without
// naming the model's own file.  The input is the fuzzer's finding; it is kept here rather than
// among the fuzz regressions, which also seed the fuzzer: its descendants, each a round trip of
// 86 784-digit numbers, would slow the fixed runs of the native target many times over.
TEST(NativeRoundTrip, ValuesLongerThanALineSurviveTheWriter) {
  Model m = parse("variable x\nconstraint cap: x <= 2/(1e+86784)x\n");
  std::string text = plumb::model::write_checked(m, plumb::model::Format::native);
  std::istringstream lines(text);
  std::size_t longest = 0;
  for (std::string line; std::getline(lines, line);) longest = std::max(longest, line.size());
  EXPECT_LE(longest, 1100u);
  EXPECT_TRUE(parse(text).same_content(m));
  // A weight is a single number, never arithmetic: 1/(3 x 10^99999) is written as it can be read.
  Model weighted = parse("variable x\nconstraint c soft weight 1/3e99999: x <= 1\n");
  std::string weighted_text = plumb::model::write_checked(weighted, plumb::model::Format::native);
  EXPECT_NE(weighted_text.find("weight 1/3e99999:"), std::string::npos) << weighted_text.substr(0, 200);
  try {
    plumb::model::write_checked(m, plumb::model::Format::mps);
    FAIL() << "expected a refusal";
  } catch (const plumb::model::RoundTripError& e) {
    EXPECT_NE(std::string(e.what()).find("cannot be written in MPS"), std::string::npos) << e.what();
    EXPECT_NE(std::string(e.what()).find("written MPS:"), std::string::npos) << e.what();
  }
}

TEST(NativeRoundTrip, EveryConstructSurvivesTheWriter) {
  Model m = parse(
      "title \"odd \\\"title\\\"\\twith a tab\"\n"
      "variable x [kg/h] between -1/3 and 1e30 \"x\\\\y\" group 'two words' soft integer\n"
      "variable 'free' free\n"
      "variable '7up' fixed at -0.000000001\n"
      "variable 'a]b' at least -infinity at most 5\n"
      "variable w [we[ird\\]] at least 2\n"
      "bound w at most infinity \"no upper limit, and we say so\" group equipment\n"
      "variable v\n"
      "bound v at least -infinity \"may go negative\" hard\n"
      "bound v at most 3 \"three at most\" soft\n"
      "maximise 'the objective' \"line\\nbreak\": 1/7 x - 'free' + 12.5\n"
      "constraint 'c 1': 10 <= x + 'free' <= 20\n"
      "constraint c2 [t] group \"g, with comma\" weight 2.5: x >= -5\n"
      "constraint c3: '7up' = 1/3\n"
      "constraint c4: x <= infinity\n"
      "constraint c5: 0 <= 4\n"
      "constraint c6: -2 'a]b' + 1e-40 w - 123456789.5 v <= -1e12\n");
  EXPECT_EQ(m.rows[*m.find_row("c2")].label.weight, Rational(5, 2));
  Model back = round_trip(m);
  EXPECT_TRUE(back.same_content(m)) << written(m);
  EXPECT_EQ(written(back), written(m));
}

TEST(NativeRoundTrip, LongRowsWrapOntoContinuationLines) {
  std::string text;
  std::string row = "constraint total:";
  for (int j = 0; j < 300; ++j) {
    text += "variable x" + std::to_string(j) + "\n";
    row += " + " + std::to_string(j + 1) + "/7 x" + std::to_string(j);
  }
  text += row + " <= 1\n";
  Model m = parse(text);
  std::string out = written(m);
  std::istringstream lines(out);
  std::string line;
  while (std::getline(lines, line)) EXPECT_LE(line.size(), 100u) << line;
  EXPECT_TRUE(parse(out).same_content(m));
}

TEST(NativeRoundTrip, ModelsBuiltInCode) {
  Model m = plumb::model::ModelBuilder("built")
                .maximise()
                .objective_constant(Rational(-5, 3))
                .column("x y", 3, Side(), Rational(4))
                .column("min", Rational(-1, 2), Rational(1), Rational(1))
                .column("z", 0, Rational(0), Side())
                .row("r one", {{"x y", Rational(2, 3)}, {"min", 1}}, Rational(-2), Side())
                .row("empty", {}, Side(), Side())
                .build();
  m.columns[2].lower_label.statement = "nothing below zero";
  m.rows[1].label.hard = false;
  EXPECT_TRUE(round_trip(m).same_content(m)) << written(m);
}

// The demo in corpus/: the optimum found by enumerating the vertices by hand (exact fractions).
TEST(NativeCorpus, SummerBlendHoldsAtTheHandComputedOptimum) {
  Model m = plumb::model::read_model(std::string(PLUMB_CORPUS_DIR) + "/summer-blend.plumb");
  EXPECT_EQ(m.column_count(), 5);
  EXPECT_EQ(m.row_count(), 5);
  EXPECT_TRUE(m.warnings.empty());
  for (const auto& r : m.rows) EXPECT_FALSE(r.label.statement.empty()) << r.name;
  std::vector<Rational> x = {Rational(80600, 237), 4000, 5000, Rational(346000, 237), 1200};
  EXPECT_EQ(m.objective_value(x), Rational(218176400, 237));
  for (int j = 0; j < m.column_count(); ++j) {
    if (m.columns[j].lower) {
      EXPECT_GE(x[j], *m.columns[j].lower);
    }
    if (m.columns[j].upper) {
      EXPECT_LE(x[j], *m.columns[j].upper);
    }
  }
  for (int i = 0; i < m.row_count(); ++i) {
    Rational activity = 0;
    auto positions = m.matrix.row_positions(i);
    auto columns = m.matrix.row_columns(i);
    for (std::size_t k = 0; k < columns.size(); ++k) activity += m.matrix.value(positions[k]) * x[columns[k]];
    if (m.rows[i].lower) {
      EXPECT_GE(activity, *m.rows[i].lower) << m.rows[i].name;
    }
    if (m.rows[i].upper) {
      EXPECT_LE(activity, *m.rows[i].upper) << m.rows[i].name;
    }
  }
  EXPECT_TRUE(round_trip(m).same_content(m));
}

}  // namespace

namespace {

// Farkas' lemma (J. Farkas, "Theorie der einfachen Ungleichungen", J. reine angew. Math. 124,
// 1902): multipliers y on the rows, >= 0 on '<=' rows, give y.A x <= y.b for every x that meets
// them; when even the least value of y.A x over the bounds exceeds y.b, nothing meets them all.
TEST(NativeCorpus, TightBlendIsInfeasibleByAHandDerivedCombination) {
  Model m = plumb::model::read_model(std::string(PLUMB_CORPUS_DIR) + "/summer-blend-tight.plumb");
  // Worked by hand: vapour pressure once, the batch size -12.15 times, the ethanol share -6.5 times.
  std::vector<std::pair<std::string, Rational>> multipliers = {
      {"vapour_pressure", 1}, {"batch", Rational(-1215, 100)}, {"ethanol_share", Rational(-13, 2)}};
  std::vector<Rational> combined(static_cast<std::size_t>(m.column_count()), Rational(0));
  Rational limit = 0;
  for (const auto& [name, y] : multipliers) {
    int i = row(m, name);
    const auto& r = m.rows[i];
    ASSERT_TRUE(y >= 0 ? r.upper.has_value() : r.lower == r.upper) << name;  // '<=' rows or equations
    limit += y * *r.upper;
    auto positions = m.matrix.row_positions(i);
    auto columns = m.matrix.row_columns(i);
    for (std::size_t k = 0; k < columns.size(); ++k) combined[columns[k]] += y * m.matrix.value(positions[k]);
  }
  Rational least = 0;  // of combined.x over the bounds
  for (int j = 0; j < m.column_count(); ++j) {
    const Side& bound = combined[j] > 0 ? m.columns[j].lower : m.columns[j].upper;
    if (combined[j] == 0) continue;
    ASSERT_TRUE(bound.has_value()) << m.columns[j].name;
    least += combined[j] * *bound;
  }
  EXPECT_EQ(least, -62200);
  EXPECT_EQ(limit, -67800);
  EXPECT_GT(least, limit);
}

}  // namespace

namespace {

// MPS with its sidecar -> native -> MPS with a written sidecar: the same labelled model.
TEST(NativeRoundTrip, CorpusMpsThroughNativeAndBack) {
  Model mps = plumb::model::read_model(std::string(PLUMB_CORPUS_DIR) + "/summer-blend.mps");
  ASSERT_FALSE(mps.source.labels_path.empty());
  Model native = round_trip(mps);
  EXPECT_TRUE(native.same_content(mps));
  std::ostringstream text, labels;
  plumb::model::write_mps(native, text);
  plumb::model::write_labels(native, labels);
  Model again = plumb::model::read_model_text(text.str(), "again.mps");
  plumb::model::apply_labels_text(again, labels.str(), "again.labels.csv");
  EXPECT_TRUE(again.same_content(mps));
}

}  // namespace

namespace {

// Single-character damage anywhere in a real model: each result reads or gives one InputError,
// never another exception, a crash or a hang (common practice for hand-rolled parsers).
TEST(NativeFormatErrors, DamagedCorpusFileNeverCrashes) {
  std::ifstream in(std::string(PLUMB_CORPUS_DIR) + "/summer-blend.plumb", std::ios::binary);
  std::string text((std::istreambuf_iterator<char>(in)), std::istreambuf_iterator<char>());
  ASSERT_GT(text.size(), 1000u);
  int refused = 0;
  // Every third character of the statements (comments are skipped), to keep the run short.
  for (std::size_t i = text.find("\ntitle"); i < text.size(); i += 3) {
    if (text[i] == '#') i = text.find('\n', i);
    if (i == std::string::npos) break;
    for (char damage : {'"', '[', ':', '-', '(', '\n', '7'}) {
      std::string damaged = text;
      damaged[i] = damage;
      try {
        parse(damaged);
      } catch (const InputError&) {
        ++refused;
      }
    }
  }
  EXPECT_GT(refused, 0);
}

}  // namespace
