// Prints figures for plumb report: the time to write the demo reports, and the size of the HTML
// report of a generated 10 000-row model (targets: under 1 s; under 5 MB).  Never run by ctest.
#include "plumb/certificate/certificate.hpp"
#include "plumb/model/read.hpp"
#include "plumb/present/report.hpp"

#include <chrono>
#include <cstdio>
#include <sstream>
#include <string>

namespace {

using plumb::numeric::Rational;
using Clock = std::chrono::steady_clock;

double seconds_since(Clock::time_point start) { return std::chrono::duration<double>(Clock::now() - start).count(); }

// Reads, inspects, solves, certifies and writes one report; returns its bytes.
std::size_t report_of(const plumb::model::Model& model, plumb::present::ReportFormat format, double* write_seconds) {
  plumb::health::HealthReport health = plumb::health::inspect(model);
  plumb::exact::CertifiedSolution result = plumb::exact::certified_solve(model);
  plumb::present::ReportInput input;
  input.model = &model;
  input.health = &health;
  input.result = &result;
  input.run.command = "plumb report (bench)";
  input.run.utc_time = "2026-01-01T00:00:00Z";
  input.run.version = PLUMB_VERSION;
  input.run.model_file = {model.source.path, model.source.sha256, 0};
  input.certificate.text = plumb::certificate::to_json_text(result.certificate);
  input.certificate.sha256 = plumb::model::sha256_hex(input.certificate.text);
  input.conflict = plumb::present::conflict_from_farkas(model, result);
  auto start = Clock::now();
  std::ostringstream out;
  plumb::present::write_report(input, format, out);
  if (write_seconds) *write_seconds = seconds_since(start);
  return out.str().size();
}

// A chain of 10 000 labelled rows, three terms each (invented): big enough to collapse.
plumb::model::Model long_model(int rows) {
  plumb::model::ModelBuilder builder("a generated chain of " + std::to_string(rows) + " limits (invented)");
  builder.maximise();
  for (int j = 0; j < rows + 2; ++j) builder.column("flow_" + std::to_string(j), 1 + j % 3);
  for (int i = 0; i < rows; ++i)
    builder.row("limit_" + std::to_string(i),
                {{"flow_" + std::to_string(i), 1}, {"flow_" + std::to_string(i + 1), 2}, {"flow_" + std::to_string(i + 2), 3}},
                {}, Rational(100 + i % 7));
  plumb::model::Model model = builder.build();
  for (auto& row : model.rows) {
    row.label.statement = "the invented segment " + row.name + " carries at most its rated flow";
    row.label.unit = "m3/h";
    row.label.group = "segments";
  }
  return model;
}

}  // namespace

int main() {
  for (const char* name : {"summer-blend.plumb", "summer-blend-tight.plumb"}) {
    std::string path = std::string(PLUMB_CORPUS_DIR) + "/" + name;
    constexpr int runs = 20;
    double write = 0, total = 0;
    std::size_t html = 0, markdown = 0;
    for (int k = 0; k < runs; ++k) {
      auto start = Clock::now();
      plumb::model::Model model = plumb::model::read_model(path);
      double once = 0;
      html = report_of(model, plumb::present::ReportFormat::html, &once);
      total += seconds_since(start);
      write += once;
      markdown = report_of(model, plumb::present::ReportFormat::markdown, nullptr);
    }
    std::printf("%-26s html %7zu bytes, md %7zu bytes; write %.2f ms, read+inspect+solve+write %.2f ms (mean of %d)\n",
                name, html, markdown, 1000 * write / runs, 1000 * total / runs, runs);
  }
  constexpr int rows = 10000;
  auto start = Clock::now();
  plumb::model::Model model = long_model(rows);
  double write = 0;
  std::size_t html = report_of(model, plumb::present::ReportFormat::html, &write);
  std::printf("generated %d rows          html %zu bytes (%.2f MB); write %.2f s, solve+write %.2f s\n", rows, html,
              static_cast<double>(html) / 1e6, write, seconds_since(start));
}
