// Renderings of a plan audit: readable text for people, JSON for programs (docs/audit.md).
#pragma once

#include "plumb/audit/audit.hpp"
#include "plumb/model/model.hpp"
#include "plumb/present/caution.hpp"

#include <nlohmann/json.hpp>

#include <iosfwd>
#include <string>
#include <vector>

namespace plumb::present {

// What the audit was asked, as the renderings repeat it.
struct AuditRequest {
  std::string plan_path;
  std::string plan_format;    // "csv", "list", "json"
  std::string duals_path;     // empty when none
  std::string repaired_path;  // empty when none was written
  audit::AuditOptions options;
};

// The verdict in words: feasible or not (and within the tolerance or not), the hard limits crossed,
// the gap verdict when a gap was asked; one line each, the verdict first.
std::vector<std::string> audit_verdict_lines(const model::Model& model, const audit::Audit& result,
                                             const AuditRequest& request);

// The verdict in words, the findings table (largest relative miss first, with the owner's
// statement and unit), the objective against the claimed value, the optimum and the gaps, the
// duals' bound, the changes to the exact optimum, the caution.
void write_audit_text(const model::Model& model, const audit::Audit& result, const AuditRequest& request,
                      std::ostream& out);

nlohmann::ordered_json audit_json(const model::Model& model, const audit::Audit& result, const AuditRequest& request);

// The repaired plan: CSV name,value,decimal with every column's exact value.
void write_repaired_csv(const model::Model& model, const std::vector<numeric::Rational>& x, std::ostream& out);

}  // namespace plumb::present
