// Certificate JSON: the deterministic writer and the strict reader (schema in docs/certificates.md).
#include "plumb/certificate/certificate.hpp"

#include "plumb/certificate/strict_json.hpp"
#include "plumb/model/error.hpp"

#include <algorithm>
#include <limits>
#include <stdexcept>

namespace plumb::certificate {
namespace {

using detail::count;
using detail::describe;
using detail::required;
using detail::SchemaError;
using Json = nlohmann::ordered_json;

constexpr const char* part_names[] = {"objective", "x", "y", "ray", "farkas", "members", "hard", "witnesses"};
constexpr const char* status_list =
    "one of \"optimal\", \"infeasible\", \"unbounded\", \"feasible\", \"infeasible_subsystem\"";

bool is_schema_key(std::string_view key) {
  if (key == "plumb_certificate" || key == "model" || key == "status") return true;
  for (const char* name : part_names)
    if (key == name) return true;
  return false;
}

bool has_part(const Parts& parts, std::string_view name) {
  if (name == "objective") return parts.objective;
  if (name == "x") return parts.x;
  if (name == "y") return parts.y;
  if (name == "ray") return parts.ray;
  if (name == "farkas") return parts.farkas;
  return parts.subsystem;  // members, hard, witnesses
}

std::string quoted(const std::string& text) {
  try {
    return nlohmann::json(text).dump();
  } catch (const nlohmann::json::type_error&) {
    throw std::invalid_argument(
        "certificate text " +
        nlohmann::json(text).dump(-1, ' ', false, nlohmann::json::error_handler_t::replace) +
        " is not valid UTF-8, which JSON cannot carry exactly");
  }
}
std::string quoted(const Rational& value) { return "\"" + numeric::to_fraction(value) + "\""; }

void write_values(std::string& out, const char* key, const NamedValues& values) {
  out += ",\n  \"" + std::string(key) + "\": {";
  bool first = true;
  for (const auto& [name, value] : values) {
    if (value == 0) continue;
    out += first ? "\n    " : ",\n    ";
    out += quoted(name) + ": " + quoted(value);
    first = false;
  }
  out += first ? "}" : "\n  }";
}

// {"kind": "row", "name": "R1", "side": "lower"}, the fields of an entry in a line.
std::string entry_fields(const Entry& entry) {
  return "\"kind\": \"" + to_string(entry.kind) + "\", \"name\": " + quoted(entry.name) + ", \"side\": \"" +
         to_string(entry.limit) + "\"";
}

// A JSON array written one item per line; `item` gives each item's text.
template <class Item, class Write>
void write_list(std::string& out, const char* key, const std::vector<Item>& items, Write item) {
  out += ",\n  \"" + std::string(key) + "\": [";
  for (std::size_t k = 0; k < items.size(); ++k) out += (k == 0 ? "\n    " : ",\n    ") + item(items[k]);
  out += items.empty() ? "]" : "\n  ]";
}

std::string witness_text(const Witness& w) {
  std::string out = "{\"drop\": [";
  for (std::size_t k = 0; k < w.drop.size(); ++k) out += (k == 0 ? "" : ", ") + std::to_string(w.drop[k]);
  out += "], \"x\": {";
  bool first = true;
  for (const auto& [name, value] : w.x) {
    if (value == 0) continue;
    out += (first ? "" : ", ") + quoted(name) + ": " + quoted(value);
    first = false;
  }
  return out + "}}";
}

class Reader {
 public:
  Reader(const ReadLimits& limits) : limits_(limits) {}

  Certificate read(const Json& root) {
    if (!root.is_object()) throw SchemaError{"", describe(root), "a JSON object holding a certificate"};
    Certificate c;
    const Json& version =
        required(root, "", "plumb_certificate", "the version mark \"plumb_certificate\": 1");
    if (!version.is_number_integer() || version.get<long long>() != 1)
      throw SchemaError{"/plumb_certificate", describe(version),
                        "1, the only certificate version this reader knows"};
    const Json& status = required(root, "", "status", "a \"status\"");
    auto parsed_status = status.is_string() ? status_from_string(status.get<std::string>()) : std::nullopt;
    if (!parsed_status) throw SchemaError{"/status", describe(status), status_list};
    c.status = *parsed_status;
    c.model = identity(required(root, "", "model", "a \"model\" object"));
    Parts parts = parts_of(c.status);
    if (c.status == Status::infeasible && root.contains("farkas")) {
      if (root.contains("y"))
        throw SchemaError{
            "/farkas", "both \"y\" and \"farkas\"",
            "one of them: an infeasible certificate proves it by row multipliers or by entries"};
      parts.y = false;
      parts.farkas = true;
    }
    for (const char* name : part_names) {
      bool present = root.contains(name);
      if (present && !has_part(parts, name))
        throw SchemaError{detail::pointer_step(name),
                          "a \"" + std::string(name) + "\" in a " + to_string(c.status) + " certificate",
                          "no \"" + std::string(name) + "\": the schema gives it no meaning there"};
      if (!present && has_part(parts, name))
        throw SchemaError{
            "/status", "no \"" + std::string(name) + "\"",
            "a \"" + std::string(name) + "\", which a " + to_string(c.status) + " certificate needs"};
    }
    if (parts.objective) c.objective = rational(root.at("objective"), "/objective");
    if (parts.x) c.x = values(root.at("x"), "/x");
    if (parts.y) c.y = values(root.at("y"), "/y");
    if (parts.ray) c.ray = values(root.at("ray"), "/ray");
    if (parts.farkas) c.farkas = farkas(root.at("farkas"));
    if (parts.subsystem) {
      c.members = entries(root.at("members"), "/members");
      c.hard = entries(root.at("hard"), "/hard");
      c.witnesses = witnesses(root.at("witnesses"));
    }
    for (const auto& [key, value] : root.items()) {
      if (!is_schema_key(key)) c.extra[key] = value;
    }
    return c;
  }

 private:
  static std::string text(const Json& value, const std::string& pointer) {
    if (!value.is_string()) throw SchemaError{pointer, describe(value), "a JSON string"};
    return value.get<std::string>();
  }

  Rational rational(const Json& value, const std::string& pointer) const {
    if (!value.is_string())
      throw SchemaError{pointer, describe(value),
                        "a rational written as a string, e.g. \"-3/2\" (never a JSON number)"};
    numeric::ParseFailure why;
    auto parsed =
        numeric::parse_canonical_fraction(value.get_ref<const std::string&>(), limits_.max_digits, &why);
    if (!parsed) throw SchemaError{pointer, describe(value), why.reason};
    return *parsed;
  }

  ModelIdentity identity(const Json& model) const {
    if (!model.is_object()) throw SchemaError{"/model", describe(model), "an object describing the model"};
    ModelIdentity id;
    id.file = text(required(model, "/model", "file", "the model's \"file\""), "/model/file");
    id.sha256 = text(required(model, "/model", "sha256", "the model's \"sha256\""), "/model/sha256");
    id.rows = count(required(model, "/model", "rows", "the model's \"rows\""), "/model/rows");
    id.columns = count(required(model, "/model", "columns", "the model's \"columns\""), "/model/columns");
    auto constant = model.find("objective_constant");
    id.objective_constant.reset();
    if (constant != model.end()) id.objective_constant = rational(*constant, "/model/objective_constant");
    return id;
  }

  NamedValues values(const Json& object, const std::string& pointer) const {
    if (!object.is_object())
      throw SchemaError{pointer, describe(object),
                        "an object of names and rationals, e.g. {\"x1\": \"3/2\"}"};
    NamedValues out;
    out.reserve(object.size());
    for (const auto& [name, value] : object.items())
      out.emplace_back(name, rational(value, pointer + detail::pointer_step(name)));
    return out;
  }

  static const Json& array(const Json& value, const std::string& pointer, const char* what) {
    if (!value.is_array()) throw SchemaError{pointer, describe(value), std::string("an array of ") + what};
    return value;
  }

  // An object with exactly the keys named, in any order.
  static void require_keys(const Json& object, const std::string& pointer, std::vector<std::string_view> keys,
                           const char* what) {
    if (!object.is_object()) throw SchemaError{pointer, describe(object), what};
    for (std::string_view key : keys) required(object, pointer, std::string(key), what);
    for (const auto& item : object.items())
      if (std::find(keys.begin(), keys.end(), item.key()) == keys.end())
        throw SchemaError{pointer + detail::pointer_step(item.key()), "the key \"" + item.key() + "\"", what};
  }

  static Entry entry(const Json& object, const std::string& pointer, bool with_multiplier) {
    const char* what =
        with_multiplier
            ? "{\"kind\": \"row\" or \"column\", \"name\": ..., \"side\": \"lower\" or \"upper\", "
              "\"multiplier\": a rational}"
            : "{\"kind\": \"row\" or \"column\", \"name\": ..., \"side\": \"lower\" or \"upper\"}";
    if (with_multiplier)
      require_keys(object, pointer, {"kind", "name", "side", "multiplier"}, what);
    else
      require_keys(object, pointer, {"kind", "name", "side"}, what);
    Entry e;
    std::string kind = text(object.at("kind"), pointer + "/kind");
    if (kind != "row" && kind != "column")
      throw SchemaError{pointer + "/kind", describe(object.at("kind")), "\"row\" or \"column\""};
    e.kind = kind == "row" ? EntryKind::row : EntryKind::column;
    e.name = text(object.at("name"), pointer + "/name");
    std::string side = text(object.at("side"), pointer + "/side");
    if (side != "lower" && side != "upper")
      throw SchemaError{pointer + "/side", describe(object.at("side")), "\"lower\" or \"upper\""};
    e.limit = side == "lower" ? Limit::lower : Limit::upper;
    return e;
  }

  std::vector<FarkasTerm> farkas(const Json& list) const {
    std::vector<FarkasTerm> out;
    for (std::size_t k = 0; k < array(list, "/farkas", "entries with multipliers").size(); ++k) {
      std::string pointer = "/farkas/" + std::to_string(k);
      out.push_back(
          {entry(list[k], pointer, true), rational(list[k].at("multiplier"), pointer + "/multiplier")});
    }
    return out;
  }

  static std::vector<Entry> entries(const Json& list, const std::string& pointer) {
    std::vector<Entry> out;
    for (std::size_t k = 0; k < array(list, pointer, "entries").size(); ++k)
      out.push_back(entry(list[k], pointer + "/" + std::to_string(k), false));
    return out;
  }

  std::vector<Witness> witnesses(const Json& list) const {
    std::vector<Witness> out;
    for (std::size_t k = 0; k < array(list, "/witnesses", "witnesses").size(); ++k) {
      std::string pointer = "/witnesses/" + std::to_string(k);
      require_keys(list[k], pointer, {"drop", "x"}, "{\"drop\": [member indices], \"x\": {column values}}");
      Witness w;
      const Json& drop = array(list[k].at("drop"), pointer + "/drop", "member indices");
      for (std::size_t d = 0; d < drop.size(); ++d)
        w.drop.push_back(static_cast<std::size_t>(count(drop[d], pointer + "/drop/" + std::to_string(d))));
      w.x = values(list[k].at("x"), pointer + "/x");
      out.push_back(std::move(w));
    }
    return out;
  }

  ReadLimits limits_;
};

}  // namespace

ModelIdentity identify(const model::Model& m) {
  return {m.source.path, m.source.sha256, m.row_count(), m.column_count(), m.objective.constant};
}

std::string to_string(Status status) {
  switch (status) {
    case Status::optimal:
      return "optimal";
    case Status::infeasible:
      return "infeasible";
    case Status::unbounded:
      return "unbounded";
    case Status::feasible:
      return "feasible";
    case Status::infeasible_subsystem:
      return "infeasible_subsystem";
  }
  return "unknown";
}

std::string to_string(EntryKind kind) { return kind == EntryKind::row ? "row" : "column"; }
std::string to_string(Limit limit) { return limit == Limit::lower ? "lower" : "upper"; }

std::optional<Status> status_from_string(std::string_view text) {
  for (Status s : {Status::optimal, Status::infeasible, Status::unbounded, Status::feasible,
                   Status::infeasible_subsystem})
    if (text == to_string(s)) return s;
  return std::nullopt;
}

Parts parts_of(Status status) {
  switch (status) {
    case Status::optimal:
      return {true, true, true, false};
    case Status::infeasible:
      return {false, false, true, false};
    case Status::unbounded:
      return {false, true, false, true};
    case Status::feasible:
      return {false, true, false, false};
    case Status::infeasible_subsystem:
      return {.farkas = true, .subsystem = true};
  }
  return {};
}

Parts parts_of_held(const Certificate& c) {
  Parts parts = parts_of(c.status);
  if (c.status == Status::infeasible && !c.farkas.empty()) {
    parts.y = false;
    parts.farkas = true;
  }
  return parts;
}

std::string to_json_text(const Certificate& c) {
  Parts parts = parts_of_held(c);
  if (parts.objective != c.objective.has_value() || (!parts.x && !c.x.empty()) ||
      (!parts.y && !c.y.empty()) || (!parts.ray && !c.ray.empty()) || (!parts.farkas && !c.farkas.empty()) ||
      (!parts.subsystem && (!c.members.empty() || !c.hard.empty() || !c.witnesses.empty())))
    throw std::invalid_argument("a " + to_string(c.status) +
                                " certificate holds parts its schema does not give it");
  std::string out = "{\n  \"plumb_certificate\": 1,\n  \"model\": {\n";
  out += "    \"file\": " + quoted(c.model.file) + ",\n";
  out += "    \"sha256\": " + quoted(c.model.sha256) + ",\n";
  out += "    \"rows\": " + std::to_string(c.model.rows) + ",\n";
  out += "    \"columns\": " + std::to_string(c.model.columns);
  if (c.model.objective_constant)
    out += ",\n    \"objective_constant\": " + quoted(*c.model.objective_constant);
  out += "\n  },\n  \"status\": \"" + to_string(c.status) + "\"";
  if (c.objective) out += ",\n  \"objective\": " + quoted(*c.objective);
  if (parts.x) write_values(out, "x", c.x);
  if (parts.y) write_values(out, "y", c.y);
  if (parts.ray) write_values(out, "ray", c.ray);
  if (parts.farkas)
    write_list(out, "farkas", c.farkas, [](const FarkasTerm& term) {
      return "{" + entry_fields(term.entry) + ", \"multiplier\": " + quoted(term.multiplier) + "}";
    });
  if (parts.subsystem) {
    auto entry_text = [](const Entry& entry) { return "{" + entry_fields(entry) + "}"; };
    write_list(out, "members", c.members, entry_text);
    write_list(out, "hard", c.hard, entry_text);
    write_list(out, "witnesses", c.witnesses, witness_text);
  }
  std::vector<std::string> extra_keys;
  for (const auto& item : c.extra.items()) extra_keys.push_back(item.key());
  std::sort(extra_keys.begin(), extra_keys.end());
  for (const std::string& key : extra_keys) {
    const Json& value = c.extra.at(key);
    if (is_schema_key(key))
      throw std::invalid_argument("certificate extra key \"" + key + "\" would hide a schema key");
    std::string nested = value.dump(2);
    std::string indented;
    for (char ch : nested) indented += ch == '\n' ? std::string("\n  ") : std::string(1, ch);
    out += ",\n  " + quoted(key) + ": " + indented;
  }
  out += "\n}\n";
  return out;
}

Certificate parse_certificate(std::string_view text, const std::string& file, const ReadLimits& limits) {
  if (text.size() > limits.max_bytes)
    throw model::InputError({file}, std::to_string(text.size()) + " bytes",
                            "a certificate of at most " + std::to_string(limits.max_bytes) + " bytes");
  return detail::read_document(text, file, limits.max_depth,
                               [&](const Json& root) { return Reader(limits).read(root); });
}

Certificate read_certificate(const std::string& path, const ReadLimits& limits) {
  return parse_certificate(detail::read_limited_file(path, limits.max_bytes, "certificate"), path, limits);
}

}  // namespace plumb::certificate
