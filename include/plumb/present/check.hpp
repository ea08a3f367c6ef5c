// Renderings of a checker verdict (plumb check): one sentence for people, JSON for programs.
#pragma once

#include "plumb/check/check.hpp"

#include <nlohmann/json.hpp>

#include <iosfwd>
#include <string>

namespace plumb::present {

// What plumb check found: the files, the status the certificate claims, the status demanded with
// --expect ("" when none) and the checker's verdict.
struct CheckReport {
  std::string model_path;
  std::string certificate_path;
  std::string status;    // the certificate's claimed status: optimal, infeasible or unbounded
  std::string expected;  // "" or the status that was demanded
  check::Verdict verdict;

  // A valid certificate of another status than the one demanded.
  bool other_status() const { return verdict.valid && !expected.empty() && status != expected; }
};

// "valid: ..." and the caution, "invalid <status> certificate: ...", or "not the expected status".
void write_check_text(const CheckReport& report, std::ostream& out);

// model, certificate, valid, status, expected and as_expected (with --expect), then proven and
// caution, or failure.
nlohmann::ordered_json check_json(const CheckReport& report);

}  // namespace plumb::present
