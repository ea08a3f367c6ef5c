// The verdict of plumb check as text and JSON (include/plumb/present/check.hpp).
#include "plumb/present/caution.hpp"
#include "plumb/present/check.hpp"

#include <ostream>

namespace plumb::present {

void write_check_text(const CheckReport& report, std::ostream& out) {
  const check::Verdict& verdict = report.verdict;
  if (report.other_status()) {
    out << "not the expected status: " << report.expected
        << " was expected, but this valid certificate proves " << verdict.proven << "\n";
  } else if (verdict.valid) {
    out << "valid: " << verdict.proven << "\n" << caution_line << "\n";
  } else {
    out << "invalid " << report.status << " certificate: " << verdict.failure << "\n";
  }
}

nlohmann::ordered_json check_json(const CheckReport& report) {
  const check::Verdict& verdict = report.verdict;
  nlohmann::ordered_json out;
  out["model"] = report.model_path;
  out["certificate"] = report.certificate_path;
  out["valid"] = verdict.valid;
  out["status"] = report.status;
  if (!report.expected.empty()) {
    out["expected"] = report.expected;
    out["as_expected"] = verdict.valid && !report.other_status();
  }
  if (verdict.valid) {
    out["proven"] = verdict.proven;
    out["caution"] = caution_line;
  } else {
    out["failure"] = verdict.failure;
  }
  return out;
}

}  // namespace plumb::present
