// The labels sidecar (docs/labels.md): CSV after RFC 4180, applied to rows, columns and bounds.
#include "model/expect_input_error.hpp"
#include "plumb/model/labels.hpp"
#include "plumb/model/read.hpp"

#include <gtest/gtest.h>

#include <filesystem>
#include <fstream>
#include <sstream>

namespace {

using plumb::model::InputError;
using plumb::model::Model;
using plumb::model::Rational;
using plumb::model::Side;

const std::string corpus = PLUMB_CORPUS_DIR;
const std::string bad = std::string(PLUMB_TEST_DATA_DIR) + "/bad/";

// The demo MPS model without its sidecar: the model the bad labels files are written against.
Model bare_summer_blend() {
  plumb::model::ReadOptions options;
  options.find_labels_beside = false;
  return plumb::model::read_model(corpus + "/summer-blend.mps", options);
}

Model small_model() {
  return plumb::model::ModelBuilder("small")
      .column("x", 1, Rational(0), Rational(4))
      .column("y z", 2)
      .row("cap", {{"x", 1}, {"y z", 1}}, Side(), Rational(10))
      .build();
}

const char* header = "name,kind,statement,unit,group,hard\n";

TEST(Labels, EveryKindAndField) {
  Model m = small_model();
  plumb::model::apply_labels_text(m,
                                  std::string(header) +
                                      "cap,row,at most ten,t,contract,yes\n"
                                      "x,column,what we ship,t,,\n"
                                      "x,lower,never negative,,physics,yes\n"
                                      "x,upper,the truck holds four,t,equipment,no\n"
                                      "y z,column,a name with a space,,,\n"
                                      "objective,row,what it costs,USD,,\n",
                                  "small.labels.csv");
  EXPECT_EQ(m.rows[0].label, (plumb::model::Label{"at most ten", "t", "contract", true}));
  EXPECT_EQ(m.columns[0].label, (plumb::model::Label{"what we ship", "t", "", std::nullopt}));
  EXPECT_EQ(m.columns[0].lower_label, (plumb::model::Label{"never negative", "", "physics", true}));
  EXPECT_EQ(m.columns[0].upper_label, (plumb::model::Label{"the truck holds four", "t", "equipment", false}));
  EXPECT_EQ(m.columns[1].label.statement, "a name with a space");
  EXPECT_EQ(m.objective.label.statement, "what it costs");  // the objective is a row in MPS
}

// The optional weight column after the decision columns: what relaxing one unit weighs in
// plumb explain's least total change; it survives the writer.
TEST(Labels, WeightColumn) {
  Model m = small_model();
  plumb::model::apply_labels_text(m,
                                  "name,kind,statement,unit,group,hard,decision,source,owner,weight\n"
                                  "cap,row,at most ten,t,,,,,,2.5\n"
                                  "x,upper,,,,,,,,1e-3\n"
                                  "y z,column,,,,,,,,\n",
                                  "small.labels.csv");
  EXPECT_EQ(m.rows[0].label.weight, Rational(5, 2));
  EXPECT_EQ(m.columns[0].upper_label.weight, Rational(1, 1000));
  EXPECT_FALSE(m.columns[1].label.weight);
  std::ostringstream written;
  plumb::model::write_labels(m, written);
  Model back = small_model();
  plumb::model::apply_labels_text(back, written.str(), "back.labels.csv");
  EXPECT_EQ(back.rows[0].label, m.rows[0].label) << written.str();
  EXPECT_EQ(back.columns[0].upper_label, m.columns[0].upper_label) << written.str();
  for (const char* weight : {"0", "-1", "heavy", "1/2"})
    EXPECT_THROW(
        plumb::model::apply_labels_text(
            m,
            std::string("name,kind,statement,unit,group,hard,decision,source,owner,weight\ncap,row,,,,,,,,") +
                weight + "\n",
            "small.labels.csv"),
        InputError)
        << weight;
}

// RFC 4180: quoted fields hold commas, doubled quotes and line breaks; CRLF line ends.
TEST(Labels, QuotedFields) {
  Model m = small_model();
  plumb::model::apply_labels_text(m,
                                  "\xEF\xBB\xBFname,kind,statement,unit,group,hard\r\n"
                                  "cap,row,\"at most ten, say \"\"ten\"\"\r\nand no more\",\"t, metric\",,\r\n"
                                  "\r\n"
                                  "\"x\",\"column\",\"\",\"\",\"\",\"\"\r\n",
                                  "quoted.labels.csv");
  EXPECT_EQ(m.rows[0].label.statement, "at most ten, say \"ten\"\nand no more");
  EXPECT_EQ(m.rows[0].label.unit, "t, metric");
  EXPECT_TRUE(m.columns[0].label.empty());
}

TEST(Labels, EmptyFieldsKeepWhatTheModelSays) {
  Model m = plumb::model::read_model_text("variable x [t] \"from the model\" group g hard\n", "keep.plumb");
  plumb::model::apply_labels_text(m, std::string(header) + "x,column,,kg,,\n", "keep.labels.csv");
  EXPECT_EQ(m.columns[0].label, (plumb::model::Label{"from the model", "kg", "g", true}));
}

TEST(Labels, FoundBesideTheModel) {
  using plumb::model::labels_beside;
  EXPECT_EQ(labels_beside(corpus + "/summer-blend.mps"), corpus + "/summer-blend.labels.csv");
  EXPECT_EQ(labels_beside(corpus + "/summer-blend.plumb"), "");  // native models carry their own labels
  EXPECT_EQ(labels_beside(corpus + "/summer-blend-tight.plumb"), "");  // no such file
  EXPECT_EQ(labels_beside(corpus + "/summer-blend.labels.csv"), "");   // no summer-blend.labels.labels.csv
  // The .gz suffix goes first: blend.mps.gz -> blend.labels.csv.
  auto folder = std::filesystem::temp_directory_path() / "plumb-labels-beside";
  std::filesystem::create_directories(folder);
  std::ofstream((folder / "blend.labels.csv").string()) << header;
  EXPECT_EQ(labels_beside((folder / "blend.mps.gz").string()), (folder / "blend.labels.csv").string());
  EXPECT_EQ(labels_beside((folder / "blend").string()), (folder / "blend.labels.csv").string());
  EXPECT_EQ(labels_beside((folder / "blend.lp.mps").string()), "");
  std::filesystem::remove_all(folder);
}

// The corpus sidecar gives the terse MPS model exactly the labels of the native model.
TEST(Labels, CorpusSidecarMatchesTheNativeModel) {
  Model mps = plumb::model::read_model(corpus + "/summer-blend.mps");
  Model native = plumb::model::read_model(corpus + "/summer-blend.plumb");
  EXPECT_EQ(mps.source.labels_path, corpus + "/summer-blend.labels.csv");
  ASSERT_EQ(mps.row_count(), native.row_count());
  ASSERT_EQ(mps.column_count(), native.column_count());
  for (int i = 0; i < mps.row_count(); ++i) {
    EXPECT_EQ(mps.rows[i].label, native.rows[i].label) << mps.rows[i].name;
    EXPECT_EQ(mps.rows[i].lower, native.rows[i].lower) << mps.rows[i].name;
    EXPECT_EQ(mps.rows[i].upper, native.rows[i].upper) << mps.rows[i].name;
  }
  for (int j = 0; j < mps.column_count(); ++j) {
    const auto& a = mps.columns[j];
    const auto& b = native.columns[j];
    EXPECT_EQ(a.label, b.label) << a.name;
    EXPECT_EQ(a.lower_label, b.lower_label) << a.name;
    EXPECT_EQ(a.upper_label, b.upper_label) << a.name;
    EXPECT_EQ(a.lower, b.lower) << a.name;
    EXPECT_EQ(a.upper, b.upper) << a.name;
  }
  EXPECT_EQ(mps.objective.label, native.objective.label);
  EXPECT_EQ(mps.objective.coefficients, native.objective.coefficients);
  EXPECT_TRUE(mps.matrix == native.matrix);
}

TEST(LabelsErrors, BadFiles) {
  const plumb::test::BadInput cases[] = {
      {"bad-labels-unknown-name.labels.csv", 3, 1, "the unknown column 'BUTANE'"},
      {"bad-labels-unknown-kind.labels.csv", 2, 5, "expected row, column, lower, upper or model"},
      {"bad-labels-column-count.labels.csv", 2, 1, "found 5 fields, expected 6 fields"},
      {"bad-labels-duplicate-line.labels.csv", 4, 1, "the first is line 2"},
      {"bad-labels-hard-flag.labels.csv", 2, 60, "expected yes, no or nothing"},
      {"bad-labels-unclosed-quote.labels.csv", 2, 9, "a quoted field that is never closed"},
      {"bad-labels-missing-header.labels.csv", 1, 1, "expected name,kind,statement,unit,group,hard"},
      {"bad-labels-stray-quote.labels.csv", 2, 13, "a '\"' inside an unquoted field"},
  };
  for (const auto& c : cases) {
    Model m = bare_summer_blend();  // the model these labels files are meant for
    std::string path = bad + c.input;
    try {
      plumb::model::apply_labels(m, path);
      ADD_FAILURE() << "no error for " << path;
    } catch (const InputError& e) {
      plumb::test::expect_error_at(e, path, c);
    }
  }
}

TEST(LabelsErrors, InlineMistakes) {
  Model m = small_model();
  auto error = [&](const std::string& text) -> std::string {
    try {
      plumb::model::apply_labels_text(m, text, "t.labels.csv");
    } catch (const InputError& e) {
      return e.what();
    }
    return "no error";
  };
  EXPECT_EQ(error(""), "t.labels.csv:1: found an empty file, expected the header line name,kind,statement,unit,group,hard");
  EXPECT_EQ(error(std::string(header) + "nope,row,,,,\n"),
            "t.labels.csv:2:1: found the unknown row 'nope', expected the name of a row of the model");
  EXPECT_EQ(error(std::string(header) + "x,lower,,,,\nx,lower,,,,\n"),
            "t.labels.csv:3:1: found a second line for lower 'x', expected one line per name and kind (the first is line 2)");
  EXPECT_EQ(error(std::string(header) + "x,column,\"a\"b,,,\n"),
            "t.labels.csv:2:13: found 'b' after a closing quote, expected ',' or the end of the line");
  EXPECT_EQ(error(std::string(header) + "x,column,a,b,c,d,e\n"),
            "t.labels.csv:2:1: found 7 fields, expected 6 fields, as in the header");
  EXPECT_EQ(error(std::string(header) + "x,column,\x01,,,\n"),
            "t.labels.csv:2:10: found a control byte 0x01 (binary data?), expected text");
}

}  // namespace
