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

enum class Status { optimal, infeasible, unbounded, feasible, infeasible_subsystem };
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

// One row side or one column bound of a model: "a_i x >= lower_i", "x_j <= upper_j", ...
enum class EntryKind { row, column };
enum class Limit { lower, upper };
struct Entry {
  EntryKind kind = EntryKind::row;
  std::string name;
  Limit limit = Limit::lower;
  friend bool operator==(const Entry&, const Entry&) = default;
};

// A non-negative multiplier on one entry.  Farkas in explicit form: with each entry written as
// "g(x) >= value" (a lower side/bound as is; an upper side/bound negated), a set of terms proves
// infeasibility iff every multiplier >= 0, the weighted sum of the entries' left-hand sides is
// identically zero in x (every column's coefficient sums to 0 exactly), and the weighted sum of
// the right-hand sides is > 0.  A crossed row: 1 x lower + 1 x upper of the same row.
struct FarkasTerm {
  Entry entry;
  Rational multiplier;
  friend bool operator==(const FarkasTerm&, const FarkasTerm&) = default;
};

// A point that satisfies every entry of a subsystem except those its drop set names.
struct Witness {
  std::vector<std::size_t> drop;  // indices into members: one member, or one group's members
  NamedValues x;                  // column values; absent columns are 0
  friend bool operator==(const Witness&, const Witness&) = default;
};

struct Certificate {
  ModelIdentity model;
  Status status = Status::optimal;
  std::optional<Rational> objective;  // optimal only
  NamedValues x;                      // optimal, unbounded, feasible
  NamedValues y;                      // optimal: row multipliers; infeasible: Farkas multipliers
  NamedValues ray;                    // unbounded only
  // infeasible (instead of y) and infeasible_subsystem: Farkas multipliers on sides and bounds.
  std::vector<FarkasTerm> farkas;
  std::vector<Entry> members;      // infeasible_subsystem: the entries that may be relaxed
  std::vector<Entry> hard;         // infeasible_subsystem: entries kept as given
  std::vector<Witness> witnesses;  // infeasible_subsystem: each member dropped, the rest hold
  // Further keys (e.g. "basis"), written last in sorted order, their own members in the order held;
  // checkers ignore them.
  nlohmann::ordered_json extra = nlohmann::ordered_json::object();
};

// Which of "objective", "x", "y", "ray", "farkas", and "members", "hard" and "witnesses" (the
// subsystem) a certificate of this status carries.  An infeasible certificate carries "y" or, in
// the explicit form, "farkas": parts_of gives "y", parts_of_held whichever it holds.
struct Parts {
  bool objective = false, x = false, y = false, ray = false, farkas = false, subsystem = false;
};
Parts parts_of(Status status);
Parts parts_of_held(const Certificate& certificate);

std::string to_string(EntryKind kind);  // "row", "column"
std::string to_string(Limit limit);     // "lower", "upper"

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
