// Certificates: the proof of a result (optimal, infeasible, unbounded, feasible) and its JSON form.
#pragma once

#include "plumb/model/model.hpp"
#include "plumb/numeric/rational.hpp"

#include <nlohmann/json.hpp>

#include <cstddef>
#include <optional>
#include <string>
#include <string_view>
#include <utility>
#include <vector>

namespace plumb::certificate {

using numeric::Rational;

enum class Status { optimal, infeasible, unbounded, feasible };
std::string to_string(Status status);
std::optional<Status> status_from_string(std::string_view text);

struct ModelIdentity {
  std::string file;    // as given
  std::string sha256;  // hex of the file's bytes as stored; empty for a model built in code
  long rows = 0;
  long columns = 0;
  // The constant that "objective" includes; when empty a checker uses the model's own.
  std::optional<Rational> objective_constant = Rational(0);
};

// The identity a certificate for this model carries: its file, hash, size and objective constant.
ModelIdentity identify(const model::Model& m);

// Named values, in the model's order.  The writer leaves out zero entries; the reader keeps
// whatever the file lists (a zero entry still has to name something in the model).
using NamedValues = std::vector<std::pair<std::string, Rational>>;

// One row side or one column bound of a model: a row's "a.x >= lower" or "a.x <= upper", a
// column's "x_j >= lower" or "x_j <= upper".
enum class EntryKind { row, column };
enum class Limit { lower, upper };
struct Entry {
  EntryKind kind = EntryKind::row;
  std::string name;
  Limit limit = Limit::lower;
  friend bool operator==(const Entry&, const Entry&) = default;
};
std::string to_string(EntryKind kind);
std::string to_string(Limit limit);

// A non-negative multiplier on one entry: Farkas multipliers in explicit form.  With each entry
// written as g(x) >= value (a lower side or bound as it is, an upper one negated), the terms prove
// that no x meets all their entries when the weighted sum of the g is identically zero and the
// weighted sum of the values is positive (docs/certificates.md).  A crossed row or column: its
// lower and its upper entry, each with multiplier 1.
struct FarkasTerm {
  Entry entry;
  Rational multiplier;
};

struct Certificate {
  ModelIdentity model;
  Status status = Status::optimal;
  std::optional<Rational> objective;  // optimal only
  NamedValues x;                      // optimal, unbounded, feasible
  NamedValues y;                      // optimal: row multipliers; infeasible: Farkas multipliers
  NamedValues ray;                    // unbounded only
  std::vector<FarkasTerm> farkas;     // infeasible, instead of y: multipliers on sides and bounds
  // Further keys (e.g. "basis"), written last in sorted order, their own members in the order held;
  // checkers ignore them.
  nlohmann::ordered_json extra = nlohmann::ordered_json::object();
};

// Which of "objective", "x", "y", "ray" a certificate of this status carries (an infeasible one
// carries "farkas" in place of "y" when its multipliers are on single sides and bounds).
struct Parts {
  bool objective = false, x = false, y = false, ray = false;
};
Parts parts_of(Status status);

// Deterministic JSON text (schema in docs/certificates.md): same certificate, same bytes.
// Keys in a fixed order, entries in the order held, one entry per line.
std::string to_json_text(const Certificate& certificate);

// What the strict reader accepts at most; every limit keeps time and memory bounded.
struct ReadLimits {
  std::size_t max_bytes = std::size_t(1) << 30;  // whole certificate text
  int max_depth = 16;                            // nesting of objects and arrays
  std::size_t max_digits = 100000;               // digits in one rational, numerator and denominator
};

// Strict reader: the schema exactly, canonical rationals only, no duplicate keys.
// Throws model::InputError (file:line:col, found, expected) for anything else.
Certificate parse_certificate(std::string_view text, const std::string& file, const ReadLimits& limits = {});
Certificate read_certificate(const std::string& path, const ReadLimits& limits = {});

}  // namespace plumb::certificate
