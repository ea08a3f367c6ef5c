// Renderings of plumb explain: the conflicting requirements in words, JSON, the progress line.
#pragma once

#include "plumb/explain/explain.hpp"
#include "plumb/explain/ways_out.hpp"
#include "plumb/model/model.hpp"
#include "plumb/present/caution.hpp"
#include "plumb/present/report.hpp"
#include "plumb/present/solve.hpp"

#include <nlohmann/json.hpp>

#include <iosfwd>
#include <string>

namespace plumb::present {

// The model, the verdict in words, each member with its statement (or name), its algebraic form
// with the side taking part and hard or soft; the hard requirements it runs against; why they
// conflict (the Farkas combination as a derivation); the ways out when given; the search's
// figures; what the checker proved; the caution.  Layout in docs/explaining.md.
void write_explain_text(const model::Model& model, const explain::Explanation& result,
                        const explain::WaysOut* ways, const std::string& certificate_path, std::ostream& out);

// The keys of docs/explaining.md: status, members and hard entries with names, sides, values,
// labels and multipliers (exact fractions), the derivation, the ways out when given, sizes,
// sub-solves, seconds, peak memory.
nlohmann::ordered_json explain_json(const model::Model& model, const explain::Explanation& result,
                                    const explain::WaysOut* ways, const RunFigures& figures);

// The report's conflict section from a proven subsystem: its members and the hard entries the proof
// uses, the derivation, and the ways out when given.
ConflictSection conflict_from_explanation(const model::Model& model, const explain::Explanation& result,
                                          const explain::WaysOut* ways);

// One state of the live progress line: phase, candidates left, sub-solves, elapsed seconds.
std::string explain_progress_line(const explain::Progress& progress);

}  // namespace plumb::present
