// Certificates: the proof of a result (optimal, infeasible, unbounded, feasible) and its JSON form.
#pragma once

#include "plumb/numeric/rational.hpp"

#include <nlohmann/json.hpp>

#include <optional>
#include <string>
#include <string_view>
#include <utility>
#include <vector>

namespace plumb::certificate {

using numeric::Rational;

enum class Status { optimal, infeasible, unbounded, feasible };
std::string to_string(Status status);

struct ModelIdentity {
  std::string file;    // as given
  std::string sha256;  // hex of the file's bytes as stored
  long rows = 0;
  long columns = 0;
  Rational objective_constant = 0;  // the constant that "objective" includes
};

// Named values, in the model's order; only non-zero entries are kept.
using NamedValues = std::vector<std::pair<std::string, Rational>>;

struct Certificate {
  ModelIdentity model;
  Status status = Status::optimal;
  std::optional<Rational> objective;  // optimal only
  NamedValues x;                      // optimal, unbounded, feasible
  NamedValues y;                      // optimal: row multipliers; infeasible: Farkas multipliers
  NamedValues ray;                    // unbounded only
  nlohmann::json extra = nlohmann::json::object();  // further keys (e.g. "basis"); checkers ignore them
};

// Deterministic JSON text (schema in docs/certificates.md): same certificate, same bytes.
std::string to_json_text(const Certificate& certificate);

}  // namespace plumb::certificate
