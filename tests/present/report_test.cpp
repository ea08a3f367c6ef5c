// plumb report's document (docs/report.md): sections, numbers, pictures with text equivalents, the
// embedded certificate, long models collapsed, and the seams the explain and audit results fill.
#include "plumb/certificate/certificate.hpp"
#include "plumb/model/read.hpp"
#include "plumb/present/report.hpp"
#include "present/svg.hpp"
#include "support/run.hpp"

#include <gtest/gtest.h>

#include <filesystem>
#include <fstream>
#include <regex>
#include <sstream>

namespace {

namespace fs = std::filesystem;
using plumb::numeric::Rational;
using plumb::present::ReportFormat;

const std::string corpus = PLUMB_CORPUS_DIR;

// Everything a report needs, owned together.
struct Analysed {
  plumb::model::Model model;
  plumb::health::HealthReport health;
  plumb::exact::CertifiedSolution result;
  plumb::present::ReportInput input;

  explicit Analysed(plumb::model::Model m) : model(std::move(m)) {
    health = plumb::health::inspect(model);
    result = plumb::exact::certified_solve(model);
    input.model = &model;
    input.health = &health;
    input.result = &result;
    input.run = {"plumb report test",
                 "2026-12-02T12:00:00Z",
                 "0.test",
                 {model.source.path, model.source.sha256, 1234},
                 {},
                 {},
                 {}};
    if (result.solution.outcome != plumb::exact::Outcome::stopped) {
      input.certificate.text = plumb::certificate::to_json_text(result.certificate);
      input.certificate.sha256 = plumb::model::sha256_hex(input.certificate.text);
    }
    input.conflict = plumb::present::conflict_from_farkas(model, result);
  }
  std::string write(ReportFormat format) const {
    std::ostringstream out;
    plumb::present::write_report(input, format, out);
    return out.str();
  }
};

bool has(const std::string& text, const std::string& part) { return text.find(part) != std::string::npos; }

// The corpus README works the optimum out by hand: 218 176 400/237 USD, with vapour pressure, batch
// size, ethanol share and the naphtha and reformate availabilities binding.
TEST(Report, OptimalDemoHasEverySectionAndTheWorkedNumbers) {
  Analysed a(plumb::model::read_model(corpus + "/summer-blend.plumb"));
  std::string html = a.write(ReportFormat::html);
  for (const char* id : {"identity", "formulation", "decisions", "result", "recheck", "cautions"})
    EXPECT_TRUE(has(html, std::string("<section id=\"") + id + "\">")) << id;
  EXPECT_FALSE(has(html, "<section id=\"conflict\">"));
  EXPECT_TRUE(has(html, "218176400/237"));
  EXPECT_TRUE(has(html, a.model.source.sha256));
  EXPECT_TRUE(has(html, a.input.certificate.sha256));
  EXPECT_TRUE(has(html, "valid: optimal"));
  for (const char* binding : {"vapour_pressure", "batch", "ethanol_share", "naphtha (upper bound)", "reformate (upper bound)"})
    EXPECT_TRUE(std::regex_search(html, std::regex(std::string("<td class=\"code\">") + std::regex_replace(binding, std::regex("[()]"), "\\$&") +
                                                   "</td><td>[^<]*</td><td>[^<]*</td><td>0[^<]*\\(at the limit\\)")))
        << binding;
  // Butane's sphere (900 bbl) is far from full at 340.08 bbl: no bar for it.
  EXPECT_FALSE(has(html, "butane (upper bound)"));
  // Formulation: grouped, with the algebraic form and unit.
  EXPECT_TRUE(has(html, "Group: regulatory"));
  EXPECT_TRUE(has(html, "52 butane + 11.5 naphtha + 3.2 reformate + 4.6 alkylate + 18 ethanol &lt;= 108000"));
  // Decisions, their sources and owners, and the one limit left without a source on purpose.
  EXPECT_TRUE(has(html, "octane, vapour pressure and benzene blend linearly by volume: a simplification"));
  EXPECT_TRUE(has(html, "compliance officer"));
  EXPECT_TRUE(has(html, "0 rows and 1 bounds"));
  EXPECT_TRUE(has(html, "<code>ethanol (upper bound)</code>"));
  // How to check it again, and the caution of the issue, word for word.
  EXPECT_TRUE(has(html, "plumb check " + a.model.source.path));
  EXPECT_TRUE(has(html, "--expect optimal"));
  EXPECT_TRUE(has(html, "the physics or the safety limit is for qualified people under local codes and licensed practice"));
}

TEST(Report, HtmlIsSelfContainedAndFetchesNothing) {
  Analysed a(plumb::model::read_model(corpus + "/summer-blend.plumb"));
  std::string html = a.write(ReportFormat::html);
  EXPECT_TRUE(has(html, "Content-Security-Policy\" content=\"default-src 'none'"));
  for (const char* fetching : {"<script", "<link", "<img", "<iframe", "@import", "url(", "src=", "https:"})
    EXPECT_FALSE(has(html, fetching)) << fetching;
  // The only http: text is the SVG namespace name, which is an identifier, never fetched.
  std::string rest = std::regex_replace(html, std::regex("xmlns=\"http://www.w3.org/2000/svg\""), "");
  EXPECT_FALSE(has(rest, "http:"));
  EXPECT_TRUE(has(html, "@page"));
}

// The certificate embedded in the page is, unescaped, exactly the certificate the hash names.
TEST(Report, EmbeddedCertificateIsTheCertificate) {
  Analysed a(plumb::model::read_model(corpus + "/summer-blend.plumb"));
  std::string html = a.write(ReportFormat::html);
  std::smatch pre;
  ASSERT_TRUE(std::regex_search(html, pre, std::regex("<pre id=\"certificate\">([^<]*)</pre>")));
  std::string text = pre[1];
  for (auto [escaped, plain] : {std::pair{"&quot;", "\""}, {"&lt;", "<"}, {"&gt;", ">"}, {"&amp;", "&"}})
    text = std::regex_replace(text, std::regex(escaped), plain);
  EXPECT_EQ(text, a.input.certificate.text);
  EXPECT_EQ(plumb::model::sha256_hex(text), a.input.certificate.sha256);
}

TEST(Report, MarkdownSaysTheSameWithoutPictures) {
  Analysed a(plumb::model::read_model(corpus + "/summer-blend.plumb"));
  a.input.certificate.sibling_path = "summer-blend.certificate.json";
  std::string md = a.write(ReportFormat::markdown);
  EXPECT_FALSE(has(md, "<svg"));
  EXPECT_FALSE(has(md, "\"plumb_certificate\""));  // not embedded: beside the report
  EXPECT_TRUE(has(md, "`summer-blend.certificate.json`"));
  EXPECT_TRUE(has(md, "## 4. The result and its proof"));
  EXPECT_TRUE(has(md, "218176400/237"));
  EXPECT_TRUE(has(md, "| `vapour_pressure` |"));
  EXPECT_TRUE(has(md, "(drawn in the HTML form; here its text equivalent)"));
}

// The tight demo's header works it out by hand: with ethanol at 10 %, all reformate and alkylate on
// hand and naphtha for the rest, the least vapour pressure is 83600/12000 psi > 6.5 psi.  The proof
// must therefore involve the cap, the batch, the ethanol share and the two availabilities.
TEST(Report, InfeasibleDemoShowsTheConflictAsAGraphAndInWords) {
  Analysed a(plumb::model::read_model(corpus + "/summer-blend-tight.plumb"));
  ASSERT_TRUE(a.input.conflict.has_value());
  std::vector<std::string> names;
  for (const auto& member : a.input.conflict->members) names.push_back(member.name);
  for (const char* expected : {"vapour_pressure", "batch", "ethanol_share", "reformate", "alkylate"})
    EXPECT_NE(std::find(names.begin(), names.end(), expected), names.end()) << expected;
  for (const auto& member : a.input.conflict->members) EXPECT_GT(member.multiplier, 0) << member.name;
  std::string html = a.write(ReportFormat::html);
  EXPECT_TRUE(has(html, "<section id=\"conflict\">"));
  EXPECT_TRUE(has(html, "INFEASIBLE"));
  EXPECT_TRUE(has(html, "valid: infeasible"));
  EXPECT_TRUE(has(html, "--expect infeasible"));
  EXPECT_TRUE(has(html, "<figure><figcaption>The requirements in conflict"));
  EXPECT_TRUE(has(html, "no plan can meet both"));
}

// A model longer than report_listed_rows: counts and findings in the section, the rest collapsed.
TEST(Report, LongModelsCollapseToASummaryAndAnAppendix) {
  plumb::model::ModelBuilder builder("a long chain (invented)");
  builder.maximise();
  int n = plumb::present::report_listed_rows + 20;
  for (int j = 0; j <= n; ++j) builder.column("x" + std::to_string(j), 1, Rational(0), Rational(10));
  for (int i = 0; i < n; ++i)
    builder.row("r" + std::to_string(i), {{"x" + std::to_string(i), 1}, {"x" + std::to_string(i + 1), 1}}, {}, Rational(15));
  Analysed a(builder.build());
  std::string html = a.write(ReportFormat::html);
  EXPECT_TRUE(has(html, "<details><summary>Appendix: every quantity and requirement"));
  EXPECT_TRUE(has(html, "rows by kind"));
  EXPECT_TRUE(has(html, "<td>at_most</td><td>" + std::to_string(n) + "</td>") || has(html, "<td>" + std::to_string(n) + "</td>"));
}

// The seams: plain structs that plumb explain and plumb audit fill render as their sections.
TEST(Report, AuditSectionRendersFromItsStruct) {
  Analysed a(plumb::model::read_model(corpus + "/summer-blend.plumb"));
  a.input.audit = plumb::present::AuditSection{"not signed off: two requirements missed",
                                               "the plan costs 3/2 USD more than the optimum",
                                               Rational(1, 1000000),
                                               {{"benzene", "benzene at most 1.0 %", Rational(1, 4), "%-bbl"},
                                                {"octane", "", Rational(3, 100000000), ""}},
                                               "plan.csv (csv, 5 of 5 columns named)"};
  std::string html = a.write(ReportFormat::html);
  EXPECT_TRUE(has(html, "<section id=\"audit\">"));
  EXPECT_TRUE(has(html, "not signed off: two requirements missed"));
  EXPECT_TRUE(has(html, "tolerance 1e-6") || has(html, "tolerance 0.000001")) << html.substr(html.find("audit"), 3000);
  EXPECT_TRUE(has(html, "1/4 (0.25) %-bbl"));
}

TEST(ReportSvg, LogChartMarksTheToleranceAndSpansTheDecades) {
  std::string svg = plumb::present::svg::log_bar_chart({{"a", 1e-8, "1e-8"}, {"b", 10, "10"}}, 1e-6, "1e-6", "t");
  EXPECT_TRUE(has(svg, "tolerance 1e-6"));
  EXPECT_TRUE(has(svg, ">1e-8<"));
  EXPECT_TRUE(has(svg, ">1e1<"));
  EXPECT_TRUE(has(svg, "stroke-dasharray"));
}

TEST(ReportSvg, GraphDrawsEveryNodeAndLabelledEdge) {
  using plumb::present::svg::GraphEdge;
  using plumb::present::svg::GraphNode;
  std::string svg = plumb::present::svg::bipartite_graph({{"cap", "x 2"}, {"need", "x 1"}}, {{"flow", ""}},
                                                         {{0, 0, "3"}, {1, 0, "-1/2"}}, "a & b");
  EXPECT_TRUE(has(svg, "<title>a &amp; b</title>"));
  EXPECT_EQ(std::count(svg.begin(), svg.end(), '\n'), 0);
  std::size_t lines = 0;
  for (std::size_t at = svg.find("<line"); at != std::string::npos; at = svg.find("<line", at + 1)) ++lines;
  EXPECT_EQ(lines, 2u);
  EXPECT_TRUE(has(svg, ">-1/2<"));
  EXPECT_TRUE(has(svg, ">need<"));
}

TEST(ReportSvg, ClipNeverCutsACharacterInTwo) {
  EXPECT_EQ(plumb::present::svg::clip("abcdef", 10), "abcdef");
  EXPECT_EQ(plumb::present::svg::clip("abcdef", 4), "abc\u2026");
  EXPECT_EQ(plumb::present::svg::clip("ab\u00e9\u00e9", 4), "ab\u2026");  // é is two bytes
}

// The command: a file, a certificate beside a Markdown report that plumb check accepts, the exact
// command recorded; a plan audited beside the solve, and a bad plan refused before anything is written.
TEST(ReportCommand, WritesTheReportAndTheCertificateBesideMarkdown) {
  fs::path work = fs::path(PLUMB_BUILD_DIR) / "report-command";
  fs::remove_all(work);
  fs::create_directories(work);
  std::string model = corpus + "/summer-blend.plumb";
  auto html = plumb::test::run(PLUMB_EXECUTABLE, {"report", model, "-o", (work / "r.html").string()});
  ASSERT_EQ(html.status, 0) << html.err;
  std::ifstream in(work / "r.html");
  std::string text{std::istreambuf_iterator<char>(in), std::istreambuf_iterator<char>()};
  EXPECT_TRUE(has(text, "plumb report " + model + " -o " + (work / "r.html").string()));
  auto md = plumb::test::run(PLUMB_EXECUTABLE, {"report", model, "-o", (work / "r.md").string()});
  ASSERT_EQ(md.status, 0) << md.err;
  ASSERT_TRUE(fs::exists(work / "r.certificate.json"));
  auto check = plumb::test::run(PLUMB_EXECUTABLE, {"check", model, (work / "r.certificate.json").string(), "--expect", "optimal"});
  EXPECT_EQ(check.status, 0) << check.out << check.err;
  auto missing = plumb::test::run(PLUMB_EXECUTABLE, {"report", model, "--plan", (work / "none.json").string(),
                                                     "-o", (work / "p.html").string()});
  EXPECT_EQ(missing.status, 1);
  EXPECT_TRUE(has(missing.err, "none.json")) << missing.err;
  EXPECT_FALSE(fs::exists(work / "p.html"));
  auto duals_alone = plumb::test::run(
      PLUMB_EXECUTABLE,
      {"report", model, "--duals", corpus + "/summer-blend.plan.txt", "-o", (work / "p.html").string()});
  EXPECT_EQ(duals_alone.status, 1);
  EXPECT_FALSE(fs::exists(work / "p.html"));
  // The demo plan (corpus/summer-blend.plan.txt, invented): rounded by another solver, it exceeds
  // the vapour-pressure cap by 7/12500 psi-bbl, as its audit in the README shows.
  auto audited = plumb::test::run(PLUMB_EXECUTABLE, {"report", corpus + "/summer-blend.mps", "--plan",
                                                     corpus + "/summer-blend.plan.txt", "-o", "-"});
  ASSERT_EQ(audited.status, 0) << audited.err;
  EXPECT_TRUE(has(audited.out, "<section id=\"audit\">"));
  EXPECT_TRUE(has(audited.out, "NOT FEASIBLE exactly"));
  EXPECT_TRUE(has(audited.out, "hard limits crossed, however little: RVP"));
  EXPECT_TRUE(has(audited.out, "7/12500 (0.00056) psi-bbl"));
  EXPECT_TRUE(has(audited.out, "better than the certified optimum 218176400/237"));
  EXPECT_TRUE(has(audited.out, "SHA-256 of the plan"));
  auto infeasible = plumb::test::run(PLUMB_EXECUTABLE, {"report", corpus + "/summer-blend-tight.plumb", "-o", "-"});
  EXPECT_EQ(infeasible.status, 0) << infeasible.err;
  EXPECT_TRUE(has(infeasible.out, "Why no plan exists"));
  // The command's conflict comes from plumb explain: the proven subsystem and its exact ways out
  // (worked by hand in tests/explain/ways_out_test.cpp).
  EXPECT_TRUE(has(infeasible.out, "plumb explain: an irreducible infeasible subsystem, proven"));
  EXPECT_TRUE(has(infeasible.out, "0 &gt;= 112000, which is false"));
  EXPECT_TRUE(has(infeasible.out, "raise it from 5000 to at least ~5674.6988 bbl")) << infeasible.out;
}

}  // namespace
