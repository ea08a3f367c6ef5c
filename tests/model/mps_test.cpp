// The MPS reader and writer on small invented models, one convention at a time.
#include "expect_input_error.hpp"
#include "plumb/model/read.hpp"
#include "plumb/model/write.hpp"

#include <gtest/gtest.h>

#include <sstream>

using plumb::model::Column;
using plumb::model::InputError;
using plumb::model::Model;
using plumb::model::ModelBuilder;
using plumb::model::ObjectiveConstantRule;
using plumb::model::ReadOptions;
using plumb::model::Row;
using plumb::model::Sense;
using plumb::model::Side;
using plumb::numeric::Rational;

namespace {

Model read_text(const std::string& text, ObjectiveConstantRule rule = ObjectiveConstantRule::negated_rhs) {
  ReadOptions options;
  options.constant_rule = rule;
  return plumb::model::read_model_text(text, "test.mps", options);
}

std::string write_text(const Model& model) {
  std::ostringstream out;
  plumb::model::write_mps(model, out);
  return out.str();
}

const Row& row(const Model& model, std::string_view name) { return model.rows.at(*model.find_row(name)); }
const Column& column(const Model& model, std::string_view name) {
  return model.columns.at(*model.find_column(name));
}
Rational coefficient(const Model& model, std::string_view row_name, std::string_view column_name) {
  return model.matrix.at(*model.find_row(row_name), *model.find_column(column_name));
}
Rational cost(const Model& model, std::string_view column_name) {
  return model.objective.coefficients.at(*model.find_column(column_name));
}
bool any_warning_contains(const Model& model, std::string_view phrase) {
  for (const auto& warning : model.warnings)
    if (warning.message.find(phrase) != std::string::npos) return true;
  return false;
}
Side value(long numerator, long denominator = 1) { return Rational(numerator, denominator); }

// Reading `text` must fail with the located error `bad` describes (its `input` names the case).
void expect_read_error(const std::string& text, const plumb::test::BadInput& bad) {
  try {
    read_text(text);
    ADD_FAILURE() << bad.input << ": read without error";
  } catch (const InputError& e) {
    plumb::test::expect_error_at(e, "test.mps", bad);
  }
}

// One fixed-form line: each field padded into its columns 2-3, 5-12, 15-22, 25-36, 40-47, 50-61.
std::string fixed_line(std::initializer_list<std::string> fields) {
  static constexpr int starts[] = {2, 5, 15, 25, 40, 50};
  std::string line;
  int k = 0;
  for (const std::string& field : fields) {
    line.resize(starts[k++] - 1, ' ');
    line += field;
  }
  return line + "\n";
}

// An invented two-product workshop plan, free form, every section present.
const char* const workshop = R"(* invented example: a workshop making chairs and tables
NAME          WORKSHOP PLAN
ROWS
 N  PROFIT
 L  WOOD
 G  ORDERS
 E  BALANCE
 L  LABOUR
COLUMNS
    CHAIRS    PROFIT    -45   WOOD      2.5
    CHAIRS    ORDERS    1     BALANCE   1
    TABLES    PROFIT    -80.25 WOOD     6
    TABLES    LABOUR    3
RHS
    RHS       WOOD      120   ORDERS    4
    RHS       LABOUR    30
RANGES
    RNG       LABOUR    10
BOUNDS
 UP BND       CHAIRS    40
ENDATA
)";

}  // namespace

// MPS format convention (common practice): sections, N row as objective, default column bounds.
TEST(MpsRead, EverySectionOfAFreeFormFile) {
  Model m = read_text(workshop);
  EXPECT_EQ(m.source.format, "mps-free");
  EXPECT_EQ(m.title, "WORKSHOP PLAN");
  EXPECT_EQ(m.objective.name, "PROFIT");
  EXPECT_EQ(m.objective.sense, Sense::minimise);
  ASSERT_EQ(m.row_count(), 4);
  ASSERT_EQ(m.column_count(), 2);
  EXPECT_EQ(m.rows[0].name, "WOOD");
  EXPECT_EQ(cost(m, "CHAIRS"), -45);
  EXPECT_EQ(cost(m, "TABLES"), Rational(-321, 4));
  EXPECT_EQ(coefficient(m, "WOOD", "CHAIRS"), Rational(5, 2));
  EXPECT_EQ(coefficient(m, "LABOUR", "CHAIRS"), 0);
  EXPECT_EQ(m.matrix.nonzeros(), 5u);
  EXPECT_EQ(row(m, "WOOD").lower, std::nullopt);
  EXPECT_EQ(row(m, "WOOD").upper, value(120));
  EXPECT_EQ(row(m, "ORDERS").lower, value(4));
  EXPECT_EQ(row(m, "ORDERS").upper, std::nullopt);
  EXPECT_EQ(row(m, "BALANCE").lower, value(0));  // rhs defaults to 0
  EXPECT_EQ(row(m, "BALANCE").upper, value(0));
  EXPECT_EQ(row(m, "LABOUR").lower, value(20));  // L row, range 10: [rhs - |R|, rhs]
  EXPECT_EQ(row(m, "LABOUR").upper, value(30));
  EXPECT_EQ(column(m, "CHAIRS").lower, value(0));
  EXPECT_EQ(column(m, "CHAIRS").upper, value(40));
  EXPECT_EQ(column(m, "TABLES").lower, value(0));  // default [0, inf)
  EXPECT_EQ(column(m, "TABLES").upper, std::nullopt);
  EXPECT_TRUE(m.warnings.empty());
}

// MPS format convention (common practice): default row sides L (-inf, rhs], G [rhs, inf), E [rhs, rhs].
TEST(MpsRead, DefaultRowSides) {
  Model m = read_text("NAME\nROWS\n N obj\n L a\n G b\n E c\nCOLUMNS\n x a 1 b 1\n x c 1\nENDATA\n");
  EXPECT_EQ(m.title, "");
  EXPECT_EQ(row(m, "a").lower, std::nullopt);
  EXPECT_EQ(row(m, "a").upper, value(0));
  EXPECT_EQ(row(m, "b").lower, value(0));
  EXPECT_EQ(row(m, "b").upper, std::nullopt);
  EXPECT_EQ(row(m, "c").lower, value(0));
  EXPECT_EQ(row(m, "c").upper, value(0));
}

// MPS RANGES sign rules (common practice): L [rhs-|R|, rhs], G [rhs, rhs+|R|], E by the sign of R.
TEST(MpsRead, RangesSignRules) {
  Model m = read_text(R"(NAME ranges
ROWS
 N obj
 L l
 G g
 E ep
 E en
 L lneg
 G gneg
COLUMNS
 x l 1 g 1
 x ep 1 en 1
 x lneg 1 gneg 1
RHS
 RHS l 10 g 10
 RHS ep 10 en 10
 RHS lneg 10 gneg 10
RANGES
 R l 4 g 4
 R ep 4 en -4
 R lneg -4 gneg -4
 R obj 3
ENDATA
)");
  EXPECT_EQ(row(m, "l").lower, value(6));
  EXPECT_EQ(row(m, "l").upper, value(10));
  EXPECT_EQ(row(m, "g").lower, value(10));
  EXPECT_EQ(row(m, "g").upper, value(14));
  EXPECT_EQ(row(m, "ep").lower, value(10));
  EXPECT_EQ(row(m, "ep").upper, value(14));
  EXPECT_EQ(row(m, "en").lower, value(6));
  EXPECT_EQ(row(m, "en").upper, value(10));
  EXPECT_EQ(row(m, "lneg").lower, value(6));  // |R| on L and G rows
  EXPECT_EQ(row(m, "lneg").upper, value(10));
  EXPECT_EQ(row(m, "gneg").lower, value(10));
  EXPECT_EQ(row(m, "gneg").upper, value(14));
  EXPECT_TRUE(any_warning_contains(m, "RANGES entry on N row \"obj\" ignored"));
}

// MPS format convention (common practice): a RHS value on the objective row is minus the constant;
// the Netlib readme's published optima leave it out (e226), hence the second rule.
TEST(MpsRead, ObjectiveConstantUnderBothRules) {
  const std::string text =
      "NAME\nROWS\n N cost\n L cap\nCOLUMNS\n x cost 2 cap 1\nRHS\n RHS cost -7.113 cap 5\nENDATA\n";
  Model negated = read_text(text);
  EXPECT_EQ(negated.objective.constant, Rational(7113, 1000));
  EXPECT_TRUE(negated.warnings.empty());
  Model ignored = read_text(text, ObjectiveConstantRule::ignored);
  EXPECT_EQ(ignored.objective.constant, 0);
  EXPECT_TRUE(any_warning_contains(ignored, "left out"));
  EXPECT_EQ(row(ignored, "cap").upper, value(5));
}

// OBJSENSE extension (common practice): on the section line or on the line after it.
TEST(MpsRead, ObjsenseBothPlacements) {
  const std::string body = "ROWS\n N obj\nCOLUMNS\n x obj 1\nENDATA\n";
  EXPECT_EQ(read_text("NAME t\nOBJSENSE MAX\n" + body).objective.sense, Sense::maximise);
  EXPECT_EQ(read_text("NAME t\nOBJSENSE\n    MAXIMIZE\n" + body).objective.sense, Sense::maximise);
  EXPECT_EQ(read_text("NAME t\nOBJSENSE\n    MIN\n" + body).objective.sense, Sense::minimise);
  EXPECT_EQ(read_text("NAME t\nOBJSENSE MINIMIZE\n" + body).objective.sense, Sense::minimise);
  expect_read_error("NAME t\nOBJSENSE UPWARDS\n" + body, {"UPWARDS", 2, 10, "objective sense \"UPWARDS\""});
  expect_read_error("NAME t\nOBJSENSE\n" + body, {"no sense", 3, 1, "MIN or MAX on the line after OBJSENSE"});
}

// MPS format convention (common practice): bound types UP LO FX FR MI PL BV LI UI.
TEST(MpsRead, EveryBoundType) {
  Model m = read_text(R"(NAME bounds
ROWS
 N obj
 L c
COLUMNS
 up c 1
 lo c 1
 fx c 1
 fr c 1
 mi c 1
 pl c 1
 bv c 1
 li c 1
 ui c 1
 miup c 1
 nobnd c 1
BOUNDS
 UP B up 4
 LO B lo -2.5
 FX B fx 3
 FR B fr
 MI B mi
 PL B pl
 BV B bv
 LI B li 2
 UI B ui 9
 MI B miup
 UP B miup 7
ENDATA
)");
  auto bounds = [&](std::string_view name) {
    return std::pair(column(m, name).lower, column(m, name).upper);
  };
  EXPECT_EQ(bounds("up"), std::pair(value(0), value(4)));
  EXPECT_EQ(bounds("lo"), std::pair(value(-5, 2), Side{}));
  EXPECT_EQ(bounds("fx"), std::pair(value(3), value(3)));
  EXPECT_EQ(bounds("fr"), std::pair(Side{}, Side{}));
  EXPECT_EQ(bounds("mi"), std::pair(Side{}, Side{}));
  EXPECT_EQ(bounds("pl"), std::pair(value(0), Side{}));
  EXPECT_EQ(bounds("bv"), std::pair(value(0), value(1)));
  EXPECT_EQ(bounds("li"), std::pair(value(2), Side{}));
  EXPECT_EQ(bounds("ui"), std::pair(value(0), value(9)));
  EXPECT_EQ(bounds("miup"), std::pair(Side{}, value(7)));  // MI then UP
  EXPECT_EQ(bounds("nobnd"), std::pair(value(0), Side{}));
  for (const char* name : {"bv", "li", "ui"}) EXPECT_TRUE(column(m, name).integer) << name;
  for (const char* name : {"up", "lo", "fx", "fr", "mi", "pl", "miup"})
    EXPECT_FALSE(column(m, name).integer) << name;
  EXPECT_TRUE(m.warnings.empty());
}

// Free-form BOUNDS lines may leave out the set name (common practice); BV may carry a value.
TEST(MpsRead, BoundsWithoutSetName) {
  Model m = read_text(
      "NAME\nROWS\n N obj\nCOLUMNS\n x obj 1\n y obj 1\n z obj 1\nBOUNDS\n UP x 4\n FR y\n BV z 1\nENDATA\n");
  EXPECT_EQ(column(m, "x").upper, value(4));
  EXPECT_EQ(column(m, "y").lower, std::nullopt);
  EXPECT_TRUE(column(m, "z").integer);
  EXPECT_EQ(column(m, "z").upper, value(1));
}

// Negative UP on a column with the default lower bound (common practice): lower becomes -infinity,
// with a warning; after an explicit LO the bounds stay as written.
TEST(MpsRead, NegativeUpperBoundRule) {
  Model m = read_text(R"(NAME
ROWS
 N obj
COLUMNS
 a obj 1
 b obj 1
 c obj 1
BOUNDS
 UP BND a -3
 LO BND b 0
 UP BND b -3
 UP BND c -3
 LO BND c -10
ENDATA
)");
  EXPECT_EQ(column(m, "a").lower, std::nullopt);
  EXPECT_EQ(column(m, "a").upper, value(-3));
  EXPECT_EQ(column(m, "b").lower, value(0));  // explicit, kept: the column is empty and says so
  EXPECT_EQ(column(m, "b").upper, value(-3));
  EXPECT_EQ(column(m, "c").lower, value(-10));  // LO after the rule still sets the lower bound
  ASSERT_EQ(m.warnings.size(), 2u);
  EXPECT_NE(m.warnings[0].message.find("\"a\" has upper bound -3 below zero"), std::string::npos);
  EXPECT_EQ(m.warnings[0].where.line, 9);
}

// Integer markers (common practice): columns between 'INTORG' and 'INTEND' are integer; the
// bounds stay [0, inf) unless BOUNDS says otherwise (plumb analyses the LP relaxation).
TEST(MpsRead, IntegerMarkers) {
  Model m = read_text(R"(NAME
ROWS
 N obj
 L c
COLUMNS
 x obj 1 c 1
 M1 'MARKER' 'INTORG'
 y obj 1 c 1
 z c 1
 M2 'MARKER' 'INTEND'
 w c 1
ENDATA
)");
  EXPECT_FALSE(column(m, "x").integer);
  EXPECT_TRUE(column(m, "y").integer);
  EXPECT_TRUE(column(m, "z").integer);
  EXPECT_FALSE(column(m, "w").integer);
  EXPECT_EQ(column(m, "y").upper, std::nullopt);
  EXPECT_TRUE(m.has_integers());
}

// MPS format convention (common practice): the first N row is the objective; further N rows are
// dropped with their entries, with a warning.
TEST(MpsRead, FurtherNRowsAreDropped) {
  Model m = read_text(
      "NAME\nROWS\n L c\n N first\n N second\nCOLUMNS\n x first 1 second 5\n x c 2\nRHS\n R second "
      "3\nENDATA\n");
  EXPECT_EQ(m.objective.name, "first");
  EXPECT_EQ(m.row_count(), 1);
  EXPECT_FALSE(m.find_row("second"));
  EXPECT_EQ(cost(m, "x"), 1);
  EXPECT_EQ(m.matrix.nonzeros(), 1u);
  ASSERT_EQ(m.warnings.size(), 1u);
  EXPECT_NE(m.warnings[0].message.find("N row \"second\" dropped"), std::string::npos);
  EXPECT_EQ(m.warnings[0].where.line, 5);
}

// Several RHS, RANGES or BOUNDS sets (common practice: a reader takes the first one).
TEST(MpsRead, OnlyTheFirstSetIsRead) {
  Model m = read_text(R"(NAME
ROWS
 N obj
 L c
 L d
COLUMNS
 x c 1 d 1
RHS
 FIRST c 5
 SECOND c 6 d 7
 SECOND d 8
BOUNDS
 UP B1 x 4
 UP B2 x 9
ENDATA
)");
  EXPECT_EQ(row(m, "c").upper, value(5));
  EXPECT_EQ(row(m, "d").upper, value(0));
  EXPECT_EQ(column(m, "x").upper, value(4));
  ASSERT_EQ(m.warnings.size(), 2u);  // one per ignored set, not per line
  EXPECT_NE(m.warnings[0].message.find("RHS set \"SECOND\" ignored"), std::string::npos);
  EXPECT_NE(m.warnings[1].message.find("BOUNDS set \"B2\" ignored"), std::string::npos);
}

// plumb convention (docs/mps.md): big numbers are numbers, never read as infinity; all exact.
TEST(MpsRead, BigNumbersStayFiniteAndExact) {
  Model m = read_text(
      "NAME\nROWS\n N obj\n L c\nCOLUMNS\n x obj 0.1 c 1e30\nRHS\n R c 1E+30\nBOUNDS\n UP B x "
      "1e30\nENDATA\n");
  Rational big = Rational(plumb::numeric::Integer("1000000000000000000000000000000"));
  EXPECT_EQ(cost(m, "x"), Rational(1, 10));
  EXPECT_EQ(coefficient(m, "c", "x"), big);
  EXPECT_EQ(row(m, "c").upper, Side(big));
  EXPECT_EQ(column(m, "x").upper, Side(big));
}

// Fixed-form MPS (field columns 2-3, 5-12, 15-22, 25-36, 40-47, 50-61; common practice): names
// may contain blanks, as in Netlib's forplan ("DEDO3 1R").
TEST(MpsRead, FixedFormNamesWithSpaces) {
  Model m = read_text(
      "NAME          FORPLAN LIKE (INVENTED)\n"
      "ROWS\n" +
      fixed_line({"N", "OB1 PNW"}) + fixed_line({"E", "DEDO3 1R"}) + fixed_line({"L", "BR   1 1"}) +
      "COLUMNS\n" + fixed_line({"", "X 1", "OB1 PNW", "1.5", "DEDO3 1R", "-1."}) +
      fixed_line({"", "X 1", "BR   1 1", "2."}) + fixed_line({"", "Y  2", "DEDO3 1R", "1."}) + "RHS\n" +
      fixed_line({"", "RHS 1", "DEDO3 1R", "10.", "BR   1 1", "20."}) + "RANGES\n" +
      fixed_line({"", "RNG", "BR   1 1", "5."}) + "BOUNDS\n" + fixed_line({"UP", "BND 1", "X 1", "30."}) +
      fixed_line({"MI", "BND 1", "Y  2"}) + "ENDATA\n");
  EXPECT_EQ(m.source.format, "mps-fixed");
  EXPECT_EQ(m.title, "FORPLAN LIKE (INVENTED)");
  EXPECT_EQ(m.objective.name, "OB1 PNW");
  ASSERT_EQ(m.row_count(), 2);
  EXPECT_EQ(m.rows[0].name, "DEDO3 1R");
  EXPECT_EQ(m.rows[1].name, "BR   1 1");
  EXPECT_EQ(cost(m, "X 1"), Rational(3, 2));
  EXPECT_EQ(coefficient(m, "DEDO3 1R", "X 1"), -1);
  EXPECT_EQ(coefficient(m, "DEDO3 1R", "Y  2"), 1);
  EXPECT_EQ(row(m, "DEDO3 1R").lower, value(10));
  EXPECT_EQ(row(m, "BR   1 1").lower, value(15));
  EXPECT_EQ(row(m, "BR   1 1").upper, value(20));
  EXPECT_EQ(column(m, "X 1").upper, value(30));
  EXPECT_EQ(column(m, "Y  2").lower, std::nullopt);
}

// Detection rule (docs/mps.md): a file whose fields sit in the fixed columns and read the same
// either way is labelled fixed; tabs and free spacing make it free.
TEST(MpsRead, LayoutLabel) {
  Model fixed =
      read_text("NAME          TINY\nROWS\n" + fixed_line({"N", "COST"}) + fixed_line({"L", "LIM1"}) +
                "COLUMNS\n" + fixed_line({"", "X1", "COST", "1.", "LIM1", "1."}) + "RHS\n" +
                fixed_line({"", "RHS", "LIM1", "4."}) + "ENDATA\n");
  EXPECT_EQ(fixed.source.format, "mps-fixed");
  Model free =
      read_text("NAME TINY\nROWS\n\tN COST\n L LIM1\nCOLUMNS\n X1 COST 1 LIM1 1\nRHS\n RHS LIM1 4\nENDATA\n");
  EXPECT_EQ(free.source.format, "mps-free");
  EXPECT_TRUE(fixed.same_content(free));
}

// Detection rule (docs/mps.md): when free reading fails and fixed reading gets further, the error
// is the fixed reading's, so a fixed file with blank-containing names hears about its real defect.
TEST(MpsRead, FixedFormErrorsComeFromTheFixedReading) {
  std::string text = "NAME          SPACED\nROWS\n" + fixed_line({"N", "OB 1"}) + fixed_line({"L", "CAP 1"}) +
                     "COLUMNS\n" + fixed_line({"", "X 1", "OB 1", "1.", "CAP 9", "1."}) + "ENDATA\n";
  expect_read_error(text, {"fixed file, unknown row", 6, 40, "unknown row \"CAP 9\""});
  // A file that fits no fixed grid keeps its free-form diagnosis.
  expect_read_error("NAME\nROWS\n N obj extra\nENDATA\n", {"extra field", 3, 8, "3 fields in a ROWS line"});
}

// A column's entries must be contiguous, and a row and column pair appears once (common practice).
TEST(MpsRead, DuplicateEntryNamesBothLines) {
  expect_read_error("NAME\nROWS\n N obj\n L c\nCOLUMNS\n x obj 1 c 2\n x c 3\nENDATA\n",
                    {"duplicate", 7, 4, "a second entry for column \"x\" in row \"c\" (first on line 6)"});
  expect_read_error("NAME\nROWS\n N obj\n L c\nCOLUMNS\n x c 1\n y c 1\n x obj 1\nENDATA\n",
                    {"resumed column", 8, 2, "its entries began on line 6"});
}

// Round trip (plumb's own contract): write, read back, the same model.
TEST(MpsWrite, RoundTripOfTheWorkshop) {
  Model original = read_text(workshop);
  Model again = read_text(write_text(original));
  EXPECT_TRUE(again.same_content(original)) << write_text(original);
}

TEST(MpsWrite, RoundTripOfEveryFeature) {
  Model original =
      ModelBuilder("every feature, invented")
          .maximise()
          .objective_constant(Rational(-5, 4))
          .column("free", 1, Side{}, Side{})
          .column("below", 0, Side{}, value(-3))
          .column("empty", 0, value(0), value(-3))
          .column("fixed", Rational(1, 8), value(2), value(2))
          .column("box", -2, value(-1), value(1, 1000000))
          .column("big", 3, value(0), Rational(plumb::numeric::Integer("1000000000000000000000000000000")))
          .column("lonely", 0)
          .row("le", {{"free", 1}, {"box", 2}}, Side{}, value(7))
          .row("ge", {{"below", Rational(-1, 20)}}, value(-2), Side{})
          .row("eq", {{"fixed", 1}, {"big", 1}}, value(4), value(4))
          .row("range", {{"box", 1}}, value(-1), value(3))
          .build();
  Model with_integers = original;
  with_integers.columns[1].integer = true;  // a run of two integer columns, then one alone
  with_integers.columns[2].integer = true;
  with_integers.columns[4].integer = true;
  with_integers.columns[4].lower = value(0);
  with_integers.columns[4].upper = value(1);
  for (const Model* model : {&original, &with_integers}) {
    std::string text = write_text(*model);
    Model again = read_text(text);
    EXPECT_TRUE(again.same_content(*model)) << text;
    EXPECT_TRUE(again.warnings.empty()) << text;
  }
}

// plumb convention (docs/mps.md): a free row other than the objective is written as an N row,
// which the reader drops: no constraint is lost, the row's name and coefficients are.
TEST(MpsWrite, FreeRowsBecomeNRows) {
  Model model = ModelBuilder("free row")
                    .column("x", 1)
                    .row("watch", {{"x", 1}}, Side{}, Side{})
                    .row("cap", {{"x", 1}}, Side{}, value(3))
                    .build();
  std::string text = write_text(model);
  EXPECT_NE(text.find(" N watch"), std::string::npos) << text;
  Model again = read_text(text);
  EXPECT_FALSE(again.find_row("watch"));
  EXPECT_EQ(row(again, "cap").upper, value(3));
  EXPECT_TRUE(any_warning_contains(again, "N row \"watch\" dropped"));
}

// A value of 99 043 digits is read from the seven characters "9e99042"; written out in full it
// would exceed the reader's line limit, so the writer keeps trailing zeros as an exponent
// (found by the MPS fuzzer).
TEST(MpsWrite, LongValuesAreWrittenAsShortAsTheyWereRead) {
  Model model = read_text(
      "NAME T\nROWS\n N cost\n G need\nCOLUMNS\n x cost -2.5e-40 need 1\nRHS\n rhs need 9e99042\n"
      "RANGES\n rng need 1\nBOUNDS\n UP bnd x 1230000000\nENDATA\n");
  std::string text = write_text(model);
  EXPECT_LT(text.size(), 300u);
  EXPECT_NE(text.find("9e99042"), std::string::npos) << text;
  EXPECT_NE(text.find("123e7"), std::string::npos) << text;
  EXPECT_NE(text.find("-25e-41"), std::string::npos) << text;
  Model again = read_text(text);
  EXPECT_EQ(row(again, "need").lower, row(model, "need").lower);
  EXPECT_EQ(row(again, "need").upper, row(model, "need").upper);
  EXPECT_EQ(column(again, "x").upper, value(1230000000));
  EXPECT_EQ(again.objective.coefficients, model.objective.coefficients);
}

TEST(MpsWrite, RefusesWhatFreeMpsCannotHold) {
  Model spaced = ModelBuilder().column("X 1", 1).build();
  EXPECT_THROW(write_text(spaced), std::runtime_error);
  try {
    write_text(ModelBuilder().column("x", Rational(1, 3)).build());
    FAIL() << "expected a refusal";
  } catch (const std::runtime_error& e) {
    EXPECT_NE(std::string(e.what()).find("1/3"), std::string::npos) << e.what();
    EXPECT_NE(std::string(e.what()).find("\"x\""), std::string::npos) << e.what();
  }
  Model crossed = ModelBuilder().column("x", 1).row("r", {{"x", 1}}, value(2), value(1)).build();
  EXPECT_THROW(write_text(crossed), std::runtime_error);
}
