// plumb check MODEL CERTIFICATE: verifies a certificate against a model with the independent checker.
#include "command.hpp"

#include "plumb/certificate/certificate.hpp"
#include "plumb/check/check.hpp"
#include "plumb/present/check.hpp"

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
  present::CheckReport report{options.model.path, options.certificate, certificate::to_string(c.status),
                              options.expect, check::verify(m, c)};
  if (options.json)
    std::cout << present::check_json(report).dump(2) << "\n";
  else
    present::write_check_text(report, std::cout);
  if (!report.verdict.valid) return exit_certificate_invalid;
  return report.other_status() ? exit_other_status : exit_ok;
}

}  // namespace

void add_check(CLI::App& app, Action& action) {
  auto options = std::make_shared<CheckOptions>();
  auto* command = app.add_subcommand("check", "Verify a certificate against a model, in exact arithmetic");
  add_model_options(*command, options->model);
  command->add_option("certificate", options->certificate, "Certificate JSON file (docs/certificates.md)")->required();
  command->add_flag("--json", options->json, "Print the verdict as JSON");
  command
      ->add_option("--expect", options->expect,
                   "Demand this status: a valid certificate of another status exits 5")
      ->check(CLI::IsMember({"optimal", "infeasible", "unbounded", "feasible", "infeasible_subsystem"}));
  command->callback([&action, options] { action = [options] { return run_check(*options); }; });
}

}  // namespace plumb::cli
