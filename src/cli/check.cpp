// plumb check MODEL CERTIFICATE: verifies a certificate against a model with the independent checker.
#include "command.hpp"

#include "plumb/certificate/certificate.hpp"
#include "plumb/check/check.hpp"
#include "plumb/present/caution.hpp"

#include <nlohmann/json.hpp>

#include <iostream>
#include <memory>

namespace plumb::cli {
namespace {

struct CheckOptions {
  ModelOptions model;
  std::string certificate;
  bool json = false;
  std::string expect;  // "" or the status the certificate must prove
};

int run_check(const CheckOptions& options) {
  model::Model m = load_model(options.model);
  certificate::Certificate c = certificate::read_certificate(options.certificate);
  check::Verdict verdict = check::verify(m, c);
  const std::string status = certificate::to_string(c.status);
  const bool other_status = verdict.valid && !options.expect.empty() && status != options.expect;
  if (options.json) {
    nlohmann::ordered_json out;
    out["model"] = options.model.path;
    out["certificate"] = options.certificate;
    out["valid"] = verdict.valid;
    out["status"] = status;
    if (!options.expect.empty()) out["expected"] = options.expect, out["as_expected"] = verdict.valid && !other_status;
    if (verdict.valid) out["proven"] = verdict.proven, out["caution"] = present::caution_line;
    else out["failure"] = verdict.failure;
    std::cout << out.dump(2) << "\n";
  } else if (other_status) {
    std::cout << "not the expected status: " << options.expect << " was expected, but this valid certificate proves "
              << verdict.proven << "\n";
  } else if (verdict.valid) {
    std::cout << "valid: " << verdict.proven << "\n" << present::caution_line << "\n";
  } else {
    std::cout << "invalid " << status << " certificate: " << verdict.failure << "\n";
  }
  if (!verdict.valid) return exit_certificate_invalid;
  return other_status ? exit_other_status : exit_ok;
}

}  // namespace

void add_check(CLI::App& app, Action& action) {
  auto options = std::make_shared<CheckOptions>();
  auto* command = app.add_subcommand("check", "Verify a certificate against a model, in exact arithmetic");
  add_model_options(*command, options->model);
  command->add_option("certificate", options->certificate, "Certificate JSON file (docs/certificates.md)")->required();
  command->add_flag("--json", options->json, "Print the verdict as JSON");
  command->add_option("--expect", options->expect,
                      "Demand this status: a valid certificate of another status exits 5")
      ->check(CLI::IsMember({"optimal", "infeasible", "unbounded"}));
  command->callback([&action, options] { action = [options] { return run_check(*options); }; });
}

}  // namespace plumb::cli
