// Formulation decisions (docs/model-format.md "Recording decisions", docs/labels.md): decision,
// source and owner in the native format and in the labels sidecar, both ways, and inspect's count.
#include "model/expect_input_error.hpp"
#include "model/parsers.hpp"
#include "plumb/health/health.hpp"
#include "plumb/model/labels.hpp"
#include "plumb/model/read.hpp"
#include "plumb/model/write.hpp"

#include <gtest/gtest.h>

#include <sstream>

namespace {

using plumb::model::InputError;
using plumb::model::Model;
using plumb::model::ModelDecision;
using plumb::test::BadInput;
using plumb::test::expect_error_at;

Model parse(const std::string& text) { return plumb::model::detail::parse_native(text, "test.plumb"); }

std::string written(const Model& model) {
  std::ostringstream out;
  plumb::model::write_native(model, out);
  return out.str();
}

std::string labels_of(const Model& model) {
  std::ostringstream out;
  plumb::model::write_labels(model, out);
  return out.str();
}

// Invented example: a two-tank water transfer with its reasons recorded.
const char* recorded_model = R"model(title "transfer"
decision "evaporation is left out over one day" source "site survey 2025 (invented)" owner "process engineer"
decision "pumps run at rated flow"
variable a [m3] "water from tank A" between 0 and 80 source "tank A gauge" owner "operator"
variable b [m3]
bound b at most 50 "tank B holds 50 m3" decision "the overflow margin is ignored" source "tank B datasheet, section 2"
minimise cost: 3 a + 2 b
constraint need "the site needs 100 m3" source "supply agreement, clause 4" owner "site manager" hard:
    a + b >= 100
constraint spare: a - b <= 30
)model";

TEST(Decisions, NativeFormatRecordsThemOnTheModelAndOnEachLabel) {
  Model m = parse(recorded_model);
  ASSERT_EQ(m.decisions.size(), 2u);
  EXPECT_EQ(m.decisions[0], (ModelDecision{"evaporation is left out over one day", "site survey 2025 (invented)",
                                           "process engineer"}));
  EXPECT_EQ(m.decisions[1], (ModelDecision{"pumps run at rated flow", "", ""}));
  EXPECT_EQ(m.columns[0].label.source, "tank A gauge");
  EXPECT_EQ(m.columns[0].label.owner, "operator");
  EXPECT_EQ(m.columns[1].upper_label.decision, "the overflow margin is ignored");
  EXPECT_EQ(m.columns[1].upper_label.source, "tank B datasheet, section 2");
  EXPECT_EQ(m.rows[0].label.source, "supply agreement, clause 4");
  EXPECT_EQ(m.rows[0].label.owner, "site manager");
  EXPECT_TRUE(m.rows[0].label.hard.value());
  EXPECT_FALSE(m.rows[1].label.recorded());
}

TEST(Decisions, NativeWriterKeepsThem) {
  Model m = parse(recorded_model);
  std::string text = written(m);
  EXPECT_NE(text.find("decision \"pumps run at rated flow\""), std::string::npos) << text;
  Model back = parse(text);
  EXPECT_TRUE(back.same_content(m)) << text;
  // A changed decision is a changed model.
  back.decisions[1].owner = "someone";
  EXPECT_FALSE(back.same_content(m));
}

// The three words are keywords only where a label part may stand: names spelled like them still read.
TEST(Decisions, NamesSpelledLikeTheKeywordsStillRead) {
  Model m = parse("variable source\nvariable owner\nvariable decision\n"
                  "maximise decision source \"the owner's books\": source + owner + decision\n"
                  "constraint owner: source + owner + decision <= 5\n");
  EXPECT_EQ(m.objective.name, "decision");
  EXPECT_EQ(m.objective.label.source, "the owner's books");
  EXPECT_EQ(m.rows[0].name, "owner");
  EXPECT_TRUE(parse(written(m)).same_content(m)) << written(m);
}

TEST(Decisions, NativeMistakesGiveOneLocatedError) {
  const BadInput cases[] = {
      {"variable x source \"a\" source \"b\"\n", 1, 23, "a second 'source'"},
      {"variable x owner 7\n", 1, 18, "the owner in double quotes"},
      {"variable x\ndecision\n", 2, 9, "the decision in double quotes"},
      {"variable x\ndecision \"d\" hard\n", 2, 14, "source \"text\", owner \"text\" or the end of the decision"},
      {"variable x\ndecision \"d\" owner \"a\" owner \"b\"\n", 2, 24, "a second 'owner'"},
  };
  for (const BadInput& c : cases) {
    try {
      parse(c.input);
      ADD_FAILURE() << "accepted: " << c.input;
    } catch (const InputError& e) {
      expect_error_at(e, "test.plumb", c);
    }
  }
}

TEST(Decisions, LabelsSidecarCarriesThemBothWays) {
  Model native = parse(recorded_model);
  std::string csv = labels_of(native);
  EXPECT_EQ(csv.substr(0, csv.find('\n')), "name,kind,statement,unit,group,hard,decision,source,owner");
  EXPECT_NE(csv.find(",model,,,,,evaporation is left out over one day,site survey 2025 (invented),process engineer\n"),
            std::string::npos)
      << csv;
  // The same model without any label, then the sidecar: the labelled model again.
  Model bare = parse(recorded_model);
  bare.decisions.clear();
  bare.objective.label = {};
  for (auto& row : bare.rows) row.label = {};
  for (auto& column : bare.columns) column.label = column.lower_label = column.upper_label = {};
  plumb::model::apply_labels_text(bare, csv, "t.labels.csv");
  EXPECT_TRUE(bare.same_content(native)) << csv;
}

TEST(Decisions, SixColumnSidecarsStillReadAndAreStillWritten) {
  Model m = parse("variable x \"x\"\nconstraint c \"c\": x <= 1\n");
  std::string csv = labels_of(m);
  EXPECT_EQ(csv.substr(0, csv.find('\n')), "name,kind,statement,unit,group,hard");
  plumb::model::apply_labels_text(m, "name,kind,statement,unit,group,hard\nc,row,the cap,,,yes\n", "six.csv");
  EXPECT_EQ(m.rows[0].label.statement, "the cap");
}

TEST(Decisions, SidecarMistakesGiveOneLocatedError) {
  const std::string nine = "name,kind,statement,unit,group,hard,decision,source,owner\n";
  const BadInput cases[] = {
      {"name,kind,statement,unit,group,hard\n,model,,,,\n", 2, 2, "the kind 'model' in a file without decision columns"},
      {",model,,,,,,a,b\n", 2, 12, "an empty decision on a model line"},
      {"x,model,,,,,d,,\n", 2, 1, "the name 'x' on a model line"},
      {",model,text,,,,d,,\n", 2, 8, "the statement 'text' on a model line"},
      {"c,row,,,,,d,s\n", 2, 1, "8 fields"},
      {"name,kind,statement,unit,group,hard,decision,source\n", 1, 1, "a first line that is not the header"},
  };
  for (const BadInput& c : cases) {
    std::string text = std::string(c.input).starts_with("name,") ? c.input : nine + c.input;
    Model m = parse("variable x\nconstraint c: x <= 1\n");
    try {
      plumb::model::apply_labels_text(m, text, "bad.csv");
      ADD_FAILURE() << "accepted: " << text;
    } catch (const InputError& e) {
      expect_error_at(e, "bad.csv", c);
    }
  }
}

// The corpus's MPS sidecar records the same decisions as the native demo model.
TEST(Decisions, CorpusSidecarAndNativeModelRecordTheSame) {
  const std::string corpus = PLUMB_CORPUS_DIR;
  Model mps = plumb::model::read_model(corpus + "/summer-blend.mps");
  Model native = plumb::model::read_model(corpus + "/summer-blend.plumb");
  EXPECT_EQ(mps.decisions, native.decisions);
  EXPECT_EQ(native.decisions.size(), 2u);
}

// inspect counts requirements without a source: rows with a finite side, finite bounds other than
// the default 0; a bound without a label of its own speaks through its variable's label.  The
// example by hand: rows need (sourced) and spare (not); bounds a <= 80 (sourced on the variable
// line), b <= 50 (sourced on its bound statement); so 1 row and 0 bounds.
TEST(Decisions, InspectCountsRequirementsWithoutASource) {
  Model m = parse(recorded_model);
  plumb::health::HealthReport report = plumb::health::inspect(m);
  EXPECT_EQ(report.labels.rows_without_source, 1);
  EXPECT_EQ(report.labels.bounds_without_source, 0);
  EXPECT_EQ(report.labels.decisions, 3);  // two for the model, one on b's upper bound
}

}  // namespace
