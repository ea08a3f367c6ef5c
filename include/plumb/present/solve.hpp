// Renderings of a certified solve: readable text for people, JSON for programs.
#pragma once

#include "plumb/exact/solve.hpp"
#include "plumb/model/model.hpp"
#include "plumb/present/caution.hpp"

#include <nlohmann/json.hpp>

#include <iosfwd>
#include <string>

namespace plumb::present {

struct SolveTextOptions {
  bool all = false;              // every column, zero or not; every Farkas row
  std::string certificate_path;  // where the certificate was written, when it was
  std::string basis_path;        // where the final basis was written, when it was
};

// The model, the status in words, the objective and the values (exact, or a rounded decimal for
// fractions too long to read), what the checker proved, the caution.  Layout in docs/solving.md.
void write_solve_text(const model::Model& model, const exact::CertifiedSolution& result,
                      const SolveTextOptions& options, std::ostream& out);

// One state of the live progress line: phase, iterations, the float search's objective and
// infeasibility estimates (rounded, marked ~, in the numbers' one text form), elapsed seconds.
// Cells are padded so that successive lines keep their columns.
std::string progress_line(const exact::Progress& progress);

// Figures of the run that the solution itself does not hold.
struct RunFigures {
  double solve_seconds = 0;    // wall time of the whole certified solve, the check included
  double peak_memory_mib = 0;  // peak resident memory of the process so far
};

// The keys of docs/solving.md: every value in full as a fraction, with its decimal; "stats".  A
// stopped solve gives its status, why and during what it stopped, and the figures so far.
nlohmann::ordered_json solve_json(const model::Model& model, const exact::CertifiedSolution& result,
                                  const RunFigures& figures);

}  // namespace plumb::present
