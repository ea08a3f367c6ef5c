// Certificate JSON: the deterministic writer and the strict reader (schema in docs/certificates.md).
#include "plumb/certificate/certificate.hpp"

#include "plumb/model/error.hpp"
#include "plumb/certificate/strict_json.hpp"

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

constexpr const char* part_names[] = {"objective", "x", "y", "ray"};
constexpr const char* status_list = "one of \"optimal\", \"infeasible\", \"unbounded\", \"feasible\"";

bool is_schema_key(std::string_view key) {
  if (key == "plumb_certificate" || key == "model" || key == "status" || key == "farkas") return true;
  for (const char* name : part_names)
    if (key == name) return true;
  return false;
}

bool has_part(const Parts& parts, std::string_view name) {
  return name == "objective" ? parts.objective : name == "x" ? parts.x : name == "y" ? parts.y : parts.ray;
}

std::string quoted(const std::string& text) {
  try {
    return nlohmann::json(text).dump();
  } catch (const nlohmann::json::type_error&) {
    throw std::invalid_argument("certificate text " + nlohmann::json(text).dump(-1, ' ', false, nlohmann::json::error_handler_t::replace) +
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

void write_farkas(std::string& out, const std::vector<FarkasTerm>& terms) {
  out += ",\n  \"farkas\": [";
  for (std::size_t k = 0; k < terms.size(); ++k) {
    const FarkasTerm& t = terms[k];
    out += (k == 0 ? "\n    " : ",\n    ");
    out += "{\"kind\": \"" + to_string(t.entry.kind) + "\", \"name\": " + quoted(t.entry.name) +
           ", \"side\": \"" + to_string(t.entry.limit) + "\", \"multiplier\": " + quoted(t.multiplier) + "}";
  }
  out += terms.empty() ? "]" : "\n  ]";
}

class Reader {
 public:
  Reader(const ReadLimits& limits) : limits_(limits) {}

  Certificate read(const Json& root) {
    if (!root.is_object()) throw SchemaError{"", describe(root), "a JSON object holding a certificate"};
    Certificate c;
    const Json& version = required(root, "", "plumb_certificate", "the version mark \"plumb_certificate\": 1");
    if (!version.is_number_integer() || version.get<long long>() != 1)
      throw SchemaError{"/plumb_certificate", describe(version), "1, the only certificate version this reader knows"};
    const Json& status = required(root, "", "status", "a \"status\"");
    auto parsed_status = status.is_string() ? status_from_string(status.get<std::string>()) : std::nullopt;
    if (!parsed_status) throw SchemaError{"/status", describe(status), status_list};
    c.status = *parsed_status;
    c.model = identity(required(root, "", "model", "a \"model\" object"));
    Parts parts = parts_of(c.status);
    // An infeasible certificate proves with "y" or with "farkas", one of the two.
    bool explicit_farkas = c.status == Status::infeasible && root.contains("farkas");
    if (root.contains("farkas") && c.status != Status::infeasible)
      throw SchemaError{"/farkas", "a \"farkas\" in a " + to_string(c.status) + " certificate",
                        "no \"farkas\": only an infeasible certificate has one"};
    if (explicit_farkas) {
      if (root.contains("y"))
        throw SchemaError{"/y", "both \"y\" and \"farkas\"", "one proof: \"y\" or \"farkas\""};
      parts.y = false;
      c.farkas = farkas_terms(root.at("farkas"));
    }
    for (const char* name : part_names) {
      bool present = root.contains(name);
      if (present && !has_part(parts, name))
        throw SchemaError{detail::pointer_step(name), "a \"" + std::string(name) + "\" in a " + to_string(c.status) +
                                                          " certificate",
                          "no \"" + std::string(name) + "\": the schema gives it no meaning there"};
      if (!present && has_part(parts, name))
        throw SchemaError{"/status", "no \"" + std::string(name) + "\"",
                          "a \"" + std::string(name) + "\", which a " + to_string(c.status) + " certificate needs"};
    }
    if (parts.objective) c.objective = rational(root.at("objective"), "/objective");
    if (parts.x) c.x = values(root.at("x"), "/x");
    if (parts.y) c.y = values(root.at("y"), "/y");
    if (parts.ray) c.ray = values(root.at("ray"), "/ray");
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
      throw SchemaError{pointer, describe(value), "a rational written as a string, e.g. \"-3/2\" (never a JSON number)"};
    numeric::ParseFailure why;
    auto parsed = numeric::parse_canonical_fraction(value.get_ref<const std::string&>(), limits_.max_digits, &why);
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

  std::vector<FarkasTerm> farkas_terms(const Json& array) const {
    if (!array.is_array())
      throw SchemaError{"/farkas", describe(array),
                        "an array of {\"kind\", \"name\", \"side\", \"multiplier\"} objects"};
    std::vector<FarkasTerm> terms;
    terms.reserve(array.size());
    for (std::size_t k = 0; k < array.size(); ++k) {
      const Json& item = array[k];
      std::string at = "/farkas/" + std::to_string(k);
      if (!item.is_object() || item.size() != 4)
        throw SchemaError{at, describe(item),
                          "an object of exactly \"kind\", \"name\", \"side\" and \"multiplier\""};
      std::string kind = text(required(item, at, "kind", "a \"kind\""), at + "/kind");
      std::string side = text(required(item, at, "side", "a \"side\""), at + "/side");
      if (kind != "row" && kind != "column")
        throw SchemaError{at + "/kind", describe(item.at("kind")), "\"row\" or \"column\""};
      if (side != "lower" && side != "upper")
        throw SchemaError{at + "/side", describe(item.at("side")), "\"lower\" or \"upper\""};
      terms.push_back({{kind == "row" ? EntryKind::row : EntryKind::column,
                        text(required(item, at, "name", "a \"name\""), at + "/name"),
                        side == "lower" ? Limit::lower : Limit::upper},
                       rational(required(item, at, "multiplier", "a \"multiplier\""), at + "/multiplier")});
    }
    return terms;
  }

  NamedValues values(const Json& object, const std::string& pointer) const {
    if (!object.is_object())
      throw SchemaError{pointer, describe(object), "an object of names and rationals, e.g. {\"x1\": \"3/2\"}"};
    NamedValues out;
    out.reserve(object.size());
    for (const auto& [name, value] : object.items())
      out.emplace_back(name, rational(value, pointer + detail::pointer_step(name)));
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
    case Status::optimal: return "optimal";
    case Status::infeasible: return "infeasible";
    case Status::unbounded: return "unbounded";
    case Status::feasible: return "feasible";
  }
  return "unknown";
}

std::string to_string(EntryKind kind) { return kind == EntryKind::row ? "row" : "column"; }
std::string to_string(Limit limit) { return limit == Limit::lower ? "lower" : "upper"; }

std::optional<Status> status_from_string(std::string_view text) {
  for (Status s : {Status::optimal, Status::infeasible, Status::unbounded, Status::feasible})
    if (text == to_string(s)) return s;
  return std::nullopt;
}

Parts parts_of(Status status) {
  switch (status) {
    case Status::optimal: return {true, true, true, false};
    case Status::infeasible: return {false, false, true, false};
    case Status::unbounded: return {false, true, false, true};
    case Status::feasible: return {false, true, false, false};
  }
  return {};
}

std::string to_json_text(const Certificate& c) {
  Parts parts = parts_of(c.status);
  bool explicit_farkas = !c.farkas.empty();
  if (explicit_farkas) parts.y = false;
  if (parts.objective != c.objective.has_value() || (!parts.x && !c.x.empty()) ||
      (!parts.y && !c.y.empty()) || (!parts.ray && !c.ray.empty()) ||
      (explicit_farkas && c.status != Status::infeasible))
    throw std::invalid_argument("a " + to_string(c.status) + " certificate holds parts its schema does not give it");
  std::string out = "{\n  \"plumb_certificate\": 1,\n  \"model\": {\n";
  out += "    \"file\": " + quoted(c.model.file) + ",\n";
  out += "    \"sha256\": " + quoted(c.model.sha256) + ",\n";
  out += "    \"rows\": " + std::to_string(c.model.rows) + ",\n";
  out += "    \"columns\": " + std::to_string(c.model.columns);
  if (c.model.objective_constant) out += ",\n    \"objective_constant\": " + quoted(*c.model.objective_constant);
  out += "\n  },\n  \"status\": \"" + to_string(c.status) + "\"";
  if (c.objective) out += ",\n  \"objective\": " + quoted(*c.objective);
  if (parts.x) write_values(out, "x", c.x);
  if (parts.y) write_values(out, "y", c.y);
  if (parts.ray) write_values(out, "ray", c.ray);
  if (explicit_farkas) write_farkas(out, c.farkas);
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
  return detail::read_document(text, file, limits.max_depth, [&](const Json& root) { return Reader(limits).read(root); });
}

Certificate read_certificate(const std::string& path, const ReadLimits& limits) {
  return parse_certificate(detail::read_limited_file(path, limits.max_bytes, "certificate"), path, limits);
}

}  // namespace plumb::certificate
