// plumb report: one self-contained document (HTML or Markdown) of a model, its result and its proof.
#pragma once

#include "plumb/exact/solve.hpp"
#include "plumb/health/health.hpp"
#include "plumb/model/model.hpp"
#include "plumb/present/audit.hpp"
#include "plumb/present/caution.hpp"

#include <cstdint>
#include <iosfwd>
#include <optional>
#include <string>
#include <vector>

namespace plumb::present {

using numeric::Rational;

enum class ReportFormat { html, markdown };

// One input file as the identity section names it.
struct ReportFile {
  std::string path;
  std::string sha256;
  std::uintmax_t bytes = 0;
};

// What the run itself knows and the model does not.
struct ReportRun {
  std::string command;   // the exact command line, shell-quoted
  std::string utc_time;  // "2026-12-02T16:58:38Z"
  std::string version;   // plumb's version
  ReportFile model_file;
  std::optional<ReportFile> labels_file;
  std::optional<ReportFile> plan_file;   // with --plan
  std::optional<ReportFile> duals_file;  // with --duals
};

// The certificate as written: its exact bytes, their SHA-256, and where a sibling copy went.
struct ReportCertificate {
  std::string text;
  std::string sha256;
  std::string sibling_path;  // Markdown: the file beside the report; HTML: empty (embedded)
};

// The conflict behind an infeasible model, drawn as a graph of requirements and the quantities
// they share.  Today it is filled from the solve's Farkas multipliers; plumb explain fills it
// with an irreducible infeasible subsystem and its ways out.
struct ConflictTerm {
  std::string quantity;  // a column name
  Rational coefficient;
};
struct ConflictMember {
  std::string name;       // row or column name
  std::string statement;  // its label, when it has one
  std::string inequality; // the one side in play, e.g. "benzene <= 12000"
  Rational multiplier;    // its weight in the proof (> 0)
  std::vector<ConflictTerm> terms;
};
struct ConflictSection {
  std::string source;                 // what found it, e.g. "the solve's Farkas multipliers"
  std::vector<ConflictMember> members;
  std::vector<std::string> derivation;  // lines of the weighted sum, in words
  std::vector<std::string> ways_out;    // what could give; empty until plumb explain fills it
};

// A plan audit's findings (plumb audit fills it): violations against a tolerance, a gap, a verdict.
struct AuditViolation {
  std::string name;
  std::string statement;
  Rational amount;  // by how much the plan misses, in the requirement's unit (> 0)
  std::string unit;
};
struct AuditSection {
  std::string verdict;
  std::string gap;  // the objective gap in words, exact
  Rational tolerance;
  std::vector<AuditViolation> violations;
  std::string plan;  // what was audited, e.g. "plan.csv (csv, 5 of 5 columns named)"
};

struct ReportInput {
  const model::Model* model = nullptr;
  const health::HealthReport* health = nullptr;
  const exact::CertifiedSolution* result = nullptr;  // the certified solve (possibly stopped)
  ReportCertificate certificate;                     // empty text when nothing was certified
  ReportRun run;
  std::optional<ConflictSection> conflict;
  std::optional<AuditSection> audit;
};

// Models with more rows than this show a summary in the formulation section and list every
// requirement in a collapsed appendix.
constexpr int report_listed_rows = 60;

// The conflict of an infeasible result as the solve proved it: the rows and bounds that carry a
// Farkas multiplier, their terms and the weighted sum in words.  Empty unless infeasible.
std::optional<ConflictSection> conflict_from_farkas(const model::Model& model, const exact::CertifiedSolution& result);

// The audit section of a plan audited beside the report's solve (plumb report --plan): the
// verdict lines, the plan's objective against the certified optimum, the duals' safe bound when
// duals were given, and every miss with its owner's statement and unit.
AuditSection audit_section_from(const model::Model& model, const audit::Audit& audit,
                                const AuditRequest& request, const exact::CertifiedSolution& result);

// A word as a POSIX shell reads it back: unchanged when plain, else in single quotes.
std::string shell_quoted(const std::string& word);

// The whole document: identity, formulation, decisions, result, conflict or audit when given,
// how to check it again, cautions.  HTML carries its CSS and SVG inline and fetches nothing.
void write_report(const ReportInput& input, ReportFormat format, std::ostream& out);

}  // namespace plumb::present
