// Key lines of the model-health text and JSON renderings.  Source of every expectation:
// constructed case (a small built model whose findings are known by hand).
#include "plumb/health/health.hpp"
#include "plumb/present/health.hpp"

#include <gtest/gtest.h>

#include <sstream>
#include <string>

using plumb::model::ModelBuilder;
using plumb::numeric::Rational;

namespace {

const plumb::model::Side inf;

plumb::health::HealthReport troubled_report() {
  plumb::model::Model m = ModelBuilder("depot plan (invented example)")
                              .maximise()
                              .objective_constant(Rational(-5, 2))
                              .column("road", 3)
                              .column("rail", 3)
                              .column("barge", 1, Rational(4), Rational(2))
                              .row("supply", {{"road", 1}, {"rail", 1}}, inf, Rational(100000000))
                              .row("supply_copy", {{"road", 1}, {"rail", 1}}, inf, Rational(100000000))
                              .row("barge_cap", {{"barge", Rational(1, 1000)}}, inf, Rational(7))
                              .row("nothing", {}, inf, inf)
                              .build();
  m.source.path = "depot.plumb";
  m.source.format = "plumb";
  m.source.sha256 = "00ff";
  m.rows[0].label.statement = "the depot ships at most 1e8 units";
  return plumb::health::inspect(m);
}

std::string text_of(const plumb::health::HealthReport& report) {
  std::ostringstream out;
  plumb::present::write_health_text(report, out);
  return out.str();
}

bool has_line_with(const std::string& text, const std::string& a, const std::string& b = "") {
  std::istringstream in(text);
  for (std::string line; std::getline(in, line);)
    if (line.find(a) != std::string::npos && line.find(b) != std::string::npos) return true;
  return false;
}

}  // namespace

TEST(PresentHealthText, IdentityAndCounts) {
  std::string text = text_of(troubled_report());
  EXPECT_TRUE(has_line_with(text, "Model health: depot plan (invented example)"));
  EXPECT_TRUE(has_line_with(text, "file", "depot.plumb"));
  EXPECT_TRUE(has_line_with(text, "sha-256", "00ff"));
  EXPECT_TRUE(has_line_with(text, "objective", "maximise objective"));
  EXPECT_TRUE(has_line_with(text, "constant", "-5/2 (-2.5)"));
  EXPECT_TRUE(has_line_with(text, "nonzeros", "density ~41.7 %"));  // 5 of 12, rounded
  EXPECT_TRUE(has_line_with(text, "at-most", "3"));
  EXPECT_TRUE(has_line_with(text, "crossed", "1"));
}

TEST(PresentHealthText, FindingsWorstFirstAndLoud) {
  std::string text = text_of(troubled_report());
  std::size_t error = text.find("ERROR");
  std::size_t warning = text.find("warning");
  ASSERT_NE(error, std::string::npos);
  ASSERT_NE(warning, std::string::npos);
  EXPECT_LT(error, warning);
  EXPECT_TRUE(has_line_with(text, "ERROR", "INFEASIBLE AS WRITTEN (barge)"));
  EXPECT_TRUE(has_line_with(text, "warning", "identical rows {supply, supply_copy}"));
  EXPECT_TRUE(has_line_with(text, "barge_cap", "-inf <= barge <= 7000"));
}

TEST(PresentHealthText, RangesWithRatio) {
  std::string text = text_of(troubled_report());
  EXPECT_TRUE(has_line_with(text, "kind", "ratio"));
  EXPECT_TRUE(has_line_with(text, "matrix", "1/1000 (0.001)  1          1e+3"));
  EXPECT_TRUE(has_line_with(text, "row-sides", "~1.43e+7"));  // 1e8 / 7
  EXPECT_TRUE(has_line_with(text, "row-sides", "WIDE"));
}

TEST(PresentHealthText, EndsWithTheCaution) {
  std::string text = text_of(troubled_report());
  std::string last = "\n" + std::string(plumb::present::caution_line) + "\n";
  ASSERT_GE(text.size(), last.size());
  EXPECT_EQ(text.substr(text.size() - last.size()), last);
}

TEST(PresentHealthJson, KeysAndExactValues) {
  nlohmann::json j = plumb::present::health_json(troubled_report());
  EXPECT_EQ(j["report"], "model-health");
  EXPECT_EQ(j["model"]["file"], "depot.plumb");
  EXPECT_TRUE(j["model"]["labels_file"].is_null());
  EXPECT_EQ(j["objective"]["sense"], "maximise");
  EXPECT_EQ(j["objective"]["constant"], "-5/2");
  EXPECT_EQ(j["size"]["nonzeros"], 5);
  EXPECT_EQ(j["size"]["density"], "5/12");
  EXPECT_EQ(j["row_kinds"]["free"], 1);
  EXPECT_EQ(j["bound_kinds"]["crossed"], 1);
  EXPECT_EQ(j["ranges"]["matrix"]["smallest"], "1/1000");
  EXPECT_EQ(j["ranges"]["matrix"]["ratio"], "1000");
  EXPECT_EQ(j["ranges"]["matrix"]["ratio_decimal"], "1e+3");
  EXPECT_EQ(j["ranges"]["matrix"]["smallest_at"]["row"], "barge_cap");
  EXPECT_EQ(j["crossed_columns"], nlohmann::json::array({"barge"}));
  EXPECT_EQ(j["duplicate_rows"], nlohmann::json::parse(R"([["supply","supply_copy"]])"));
  EXPECT_EQ(j["singleton_rows"][0]["implied_upper"], "7000");
  EXPECT_TRUE(j["singleton_rows"][0]["implied_lower"].is_null());
  EXPECT_EQ(j["labels"]["rows_with_statement"], 1);
  EXPECT_EQ(j["findings"][0]["severity"], "error");
  EXPECT_EQ(j["findings"][0]["code"], "crossed-columns");
}

TEST(PresentHealthJson, NamesThatAreNotUtf8DoNotStopTheOutput) {
  plumb::model::Model m = ModelBuilder("bad \xff name").column("x", 1).build();
  std::ostringstream out;
  EXPECT_NO_THROW(plumb::present::write_health_json(plumb::health::inspect(m), out));
  EXPECT_TRUE(nlohmann::json::accept(out.str()));
}
