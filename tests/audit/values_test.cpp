// Plan and dual files (docs/formats.md): the three forms, exact conversion, and every refusal
// located at its line and column.
#include "model/expect_input_error.hpp"
#include "plumb/audit/values.hpp"

#include <gtest/gtest.h>

#include <filesystem>
#include <fstream>

namespace plumb::audit {
namespace {

using model::InputError;
using model::Side;

model::Model small_model() {
  return model::ModelBuilder("small")
      .column("x", 1, Rational(0), Rational(4))
      .column("y", 2)
      .column("z", 3)
      .row("cap", {{"x", 1}, {"y", 1}}, Side(), Rational(10))
      .row("floor", {{"y", 1}, {"z", 1}}, Rational(1), Side())
      .build();
}

Values read(const std::string& text, NamesOf names = NamesOf::columns) {
  return read_values_text(text, "plan.csv", small_model(), names);
}

// Exact decimal conversion (the numbers are their own outside reference: 1e-3 is 1/1000 exactly).
TEST(AuditValues, ThreeFormsReadExactly) {
  Values csv = read("name,value\nx,1e-3\ny,-0.0\nz,+5\n");
  EXPECT_EQ(csv.format, "csv");
  EXPECT_EQ(csv.values, (std::vector<Rational>{Rational(1, 1000), 0, 5}));
  Values headerless = read("x, 0.1\r\n\r\ny,\"2.5\"\n");
  EXPECT_EQ(headerless.values, (std::vector<Rational>{Rational(1, 10), Rational(5, 2), 0}));
  EXPECT_EQ(headerless.missing, 1u);
  EXPECT_EQ(headerless.given, (std::vector<bool>{true, true, false}));
  Values list = read("# from the other solver\ncolumn value\nx\t0.30000000000000004\n  z   7\n");
  EXPECT_EQ(list.format, "list");
  EXPECT_EQ(list.values[0], Rational(30000000000000004, 100000000000000000));
  EXPECT_EQ(list.values[2], 7);
  Values json = read("{\"x\": 0.1, \"y\": \"1/3e0\", \"z\": 12345678901234567890}");
  EXPECT_EQ(json.format, "json");
  EXPECT_EQ(json.values[0], Rational(1, 10));  // not the double nearest 0.1
  EXPECT_EQ(json.values[1], Rational(1, 3));
  EXPECT_EQ(json.values[2], Rational(numeric::Integer("12345678901234567890")));
  Values duals = read("cap,-1.5\nfloor,2\n", NamesOf::rows);
  EXPECT_EQ(duals.values, (std::vector<Rational>{Rational(-3, 2), 2}));
}

TEST(AuditValues, RepairedCsvReadsBack) {
  Values v = read("name,value,decimal\nx,1/3,~0.33333333333333333\ny,2,2\nz,0,0\n");
  EXPECT_EQ(v.values, (std::vector<Rational>{Rational(1, 3), 2, 0}));
}

TEST(AuditValues, RefusalsAreLocated) {
  const test::BadInput cases[] = {
      {"x,1\nq,2\ny,3\nw,4\n", 2, 1, "found 2 unknown columns: 'q', 'w'"},
      {"x,1\ny,2\nx,3\n", 3, 1, "a second value for column 'x', expected each name once (the first is line 1)"},
      {"x,1\ny,abc\n", 2, 3, "found 'abc' as the value of 'y'"},
      {"x,1\ny,-inf\n", 2, 3, "the infinite value '-inf' for 'y'"},
      {"x,1\ny,2,3\n", 2, 1, "found 3 fields, expected 2 fields: name,value"},
      {"x 1\ny 2 3\n", 2, 1, "found 3 words"},
      {"", 1, 0, "found an empty file"},
      {"  \n\n", 1, 0, "found an empty file"},
      {"[1, 2]", 1, 1, "found a JSON array, expected a JSON object of names to values"},
      {"{\"x\": 1,\n \"y\": [2]}", 2, 7, "found an array"},
      {"{\"x\": 1,\n \"y\": true}", 2, 7, "found the value true"},
      {"{\"x\": 1, \"x\": 2}", 1, 10, "a second value for column 'x'"},
      {"{\"x\": 1,", 1, 9, "invalid JSON"},
      {"x,\"1\n", 1, 3, "a quoted field that is never closed"},
      {"x,1\"2\n", 1, 4, "a '\"' inside an unquoted field"},
      {"name,value\n", 1, 0, "found no names with values"},
  };
  for (const auto& c : cases) {
    try {
      read(c.input);
      ADD_FAILURE() << "no error for " << c.input;
    } catch (const InputError& e) {
      test::expect_error_at(e, "plan.csv", c);
    }
  }
}

TEST(AuditValues, UnknownNamesListedWithACount) {
  std::string text;
  for (int k = 0; k < 12; ++k) text += "ghost" + std::to_string(k) + ",1\n";
  try {
    read(text);
    ADD_FAILURE();
  } catch (const InputError& e) {
    EXPECT_NE(std::string(e.what()).find("12 unknown columns: 'ghost0', 'ghost1', 'ghost2', 'ghost3', 'ghost4' and 7 more"),
              std::string::npos)
        << e.what();
  }
}

// A file past the limit is refused before it is parsed, whatever it holds.
TEST(AuditValues, HugeFileRefused) {
  model::Model m = small_model();
  auto path = std::filesystem::temp_directory_path() / "plumb-huge-plan.csv";
  {
    std::ofstream out(path);
    std::string line = "x,1\n";
    for (std::size_t written = 0; written <= max_values_bytes(m); written += line.size()) out << line;
  }
  try {
    read_values(path.string(), m, NamesOf::columns);
    ADD_FAILURE();
  } catch (const InputError& e) {
    EXPECT_NE(std::string(e.what()).find("expected a plan of at most"), std::string::npos) << e.what();
  }
  std::filesystem::remove(path);
}

}  // namespace
}  // namespace plumb::audit
