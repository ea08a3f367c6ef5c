// Basis files: a simplex basis by name (docs/basis.md), for warm starts and for the "basis" key of
// certificates.  The checker never reads them.
#pragma once

#include "plumb/certificate/certificate.hpp"
#include "plumb/model/model.hpp"
#include "plumb/simplex/basis.hpp"

#include <nlohmann/json.hpp>

#include <string>
#include <string_view>

namespace plumb::certificate {

// {"columns": {...}, "rows": {...}}: each variable that does not rest where an unlisted one would
// (at its lower bound, else its upper, else zero), by name in model order, with its status word.
// The basis must have one status per column and per row.
nlohmann::ordered_json basis_json(const model::Model& model, const simplex::Basis& basis);

// A whole basis file: version mark, the model's identity, then basis_json.  Deterministic.
std::string to_basis_text(const model::Model& model, const simplex::Basis& basis);

struct BasisFile {
  ModelIdentity model;  // as the file states it (objective_constant unused)
  simplex::Basis basis;  // one status per column and per row of the model it was read against
  long basic_count = 0;  // variables the file makes basic; a basis has as many as the model has rows
};

// Strict reader: the schema exactly, every name one of the model's, a status its bounds allow, no
// duplicate or unknown keys.  Throws model::InputError (file:line:col, found, expected) otherwise.
// Whether the identity and the basic count fit the model is the caller's to judge.
BasisFile parse_basis(std::string_view text, const std::string& file, const model::Model& model);
BasisFile read_basis(const std::string& path, const model::Model& model);

}  // namespace plumb::certificate
