// Basis files (docs/basis.md): the writer lists only what an unlisted variable would not be, the
// reader gives back the same basis, and refuses anything off the schema with a located message.
// Source for the rules: the project's input-error rule (one message "file:line:col: found X,
// expected Y") and docs/basis.md.
#include "plumb/certificate/basis.hpp"

#include <gtest/gtest.h>

#include <string>

namespace {

using plumb::certificate::basis_json;
using plumb::certificate::parse_basis;
using plumb::certificate::to_basis_text;
using plumb::model::InputError;
using plumb::numeric::Rational;
using plumb::simplex::Basis;
using plumb::simplex::VarStatus;

// Invented: a column of each bound kind and a row of each side kind.
plumb::model::Model kinds() {
  return plumb::model::ModelBuilder("kinds")
      .column("boxed", 1, Rational(0), Rational(4))
      .column("upper_only", 1, std::nullopt, Rational(3))
      .column("free", 1, std::nullopt, std::nullopt)
      .row("at_most", {{"boxed", 1}, {"free", 1}}, std::nullopt, Rational(5))
      .row("range", {{"boxed", 1}, {"upper_only", 1}}, Rational(-1), Rational(1))
      .build();
}

Basis sample() {
  Basis b;
  b.columns = {VarStatus::at_upper, VarStatus::basic, VarStatus::at_zero};
  b.rows = {VarStatus::basic, VarStatus::at_lower};
  return b;
}

std::string file_with(const std::string& columns, const std::string& rows = "{}") {
  return R"({"plumb_basis": 1, "model": {"file": "kinds", "sha256": "", "rows": 2, "columns": 3},
"columns": )" + columns + R"(, "rows": )" + rows + "}";
}

void expect_refused(const std::string& text, long line, const std::string& found, const std::string& expected) {
  try {
    parse_basis(text, "start.basis.json", kinds());
    ADD_FAILURE() << "accepted: " << text;
  } catch (const InputError& e) {
    EXPECT_EQ(e.where().file, "start.basis.json");
    EXPECT_EQ(e.where().line, line) << e.what();
    EXPECT_NE(e.found().find(found), std::string::npos) << e.what();
    EXPECT_NE(e.expected().find(expected), std::string::npos) << e.what();
  }
}

TEST(BasisFile, WriterListsWhatAnUnlistedVariableWouldNotBe) {
  // Unlisted: "boxed" rests at its lower bound 0, "upper_only" at 3, "free" at zero; rows alike.
  auto json = basis_json(kinds(), sample());
  EXPECT_EQ(json.dump(), R"({"columns":{"boxed":"upper","upper_only":"basic"},"rows":{"at_most":"basic"}})");
}

TEST(BasisFile, RoundTripsAndIsDeterministic) {
  std::string text = to_basis_text(kinds(), sample());
  EXPECT_EQ(text, to_basis_text(kinds(), sample()));
  EXPECT_EQ(text.back(), '\n');
  auto read = parse_basis(text, "saved.json", kinds());
  EXPECT_EQ(read.basis.columns, sample().columns);
  EXPECT_EQ(read.basis.rows, sample().rows);
  EXPECT_EQ(read.basic_count, 2);
  EXPECT_EQ(read.model.columns, 3);
  EXPECT_EQ(read.model.rows, 2);
}

TEST(BasisFile, ListingANaturalRestIsAllowed) {
  auto read = parse_basis(file_with(R"({"boxed": "lower", "free": "zero"})"), "start.json", kinds());
  EXPECT_EQ(read.basis.columns[0], VarStatus::at_lower);
  EXPECT_EQ(read.basis.columns[1], VarStatus::at_upper);
  EXPECT_EQ(read.basic_count, 0);
}

TEST(BasisFile, RefusesUnknownNamesWordsAndStatusesTheBoundsForbid) {
  expect_refused(file_with(R"({"nope": "basic"})"), 2, "\"nope\"", "a column of the model");
  expect_refused(file_with("{}", R"({"boxed": "basic"})"), 2, "\"boxed\"", "a row of the model");
  expect_refused(file_with(R"({"boxed": "at bound"})"), 2, "\"at bound\"", "\"basic\", \"lower\"");
  expect_refused(file_with(R"({"free": "upper"})"), 2, "upper bound is +inf", "a status its bounds allow");
  expect_refused(file_with(R"({"upper_only": "lower"})"), 2, "lower bound is -inf", "a status its bounds allow");
  expect_refused(file_with(R"({"boxed": "zero"})"), 2, "finite bound", "a status its bounds allow");
  expect_refused(file_with(R"({"boxed": 1})"), 2, "the number 1", "\"basic\"");
  expect_refused(file_with(R"({"boxed": "basic", "boxed": "lower"})"), 2, "boxed", "");
}

TEST(BasisFile, RefusesWhatIsOffTheSchema) {
  expect_refused("[]", 1, "an array", "a JSON object holding a basis");
  expect_refused(R"({"plumb_basis": 2})", 1, "the number 2", "1, the only basis version");
  expect_refused(R"({"model": {}})", 1, "no \"plumb_basis\"", "version mark");
  expect_refused("{\"plumb_basis\": 1,\n \"model\": {\"file\": \"kinds\"}}", 2, "no \"sha256\"", "\"sha256\"");
  expect_refused(file_with("{}") + " trailing", 2, "", "");
  std::string extra = file_with("{}");
  extra.insert(extra.size() - 1, ",\n \"note\": 1");
  expect_refused(extra, 3, "\"note\"", "only \"plumb_basis\"");
  expect_refused(R"({"plumb_basis": 1, "model": {"file": "kinds", "sha256": "", "rows": -1, "columns": 3}})", 1,
                 "the number -1", "a whole number");
  expect_refused(R"({"plumb_basis": 1, "model": {"file": "kinds", "sha256": "", "rows": 2, "columns": 3}})", 1,
                 "no \"columns\"", "\"columns\" object");
  expect_refused(file_with("[]"), 2, "an array", "column names and status words");
}

}  // namespace
