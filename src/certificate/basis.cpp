// Basis files (docs/basis.md): the deterministic writer and the strict reader.
#include "plumb/certificate/basis.hpp"

#include "plumb/certificate/strict_json.hpp"

#include <functional>
#include <limits>
#include <optional>
#include <stdexcept>

namespace plumb::certificate {
namespace {

using detail::count;
using detail::describe;
using detail::required;
using detail::SchemaError;
using Json = nlohmann::ordered_json;
using simplex::VarStatus;

constexpr int basis_version = 1;
constexpr std::size_t max_basis_bytes = std::size_t(1) << 30;
constexpr int max_basis_depth = 4;
constexpr const char* status_words = "one of \"basic\", \"lower\", \"upper\", \"zero\"";

const char* word_of(VarStatus status) {
  switch (status) {
    case VarStatus::basic: return "basic";
    case VarStatus::at_lower: return "lower";
    case VarStatus::at_upper: return "upper";
    case VarStatus::at_zero: return "zero";
  }
  return "basic";
}

std::optional<VarStatus> status_of(std::string_view word) {
  for (VarStatus status : {VarStatus::basic, VarStatus::at_lower, VarStatus::at_upper, VarStatus::at_zero})
    if (word == word_of(status)) return status;
  return std::nullopt;
}

// Where a nonbasic variable rests when the file does not name it.
VarStatus natural_rest(const model::Side& lower, const model::Side& upper) {
  if (lower) return VarStatus::at_lower;
  return upper ? VarStatus::at_upper : VarStatus::at_zero;
}

// Why the bounds do not allow a status, or nothing when they do.
std::optional<std::string> refusal(VarStatus status, const model::Side& lower, const model::Side& upper) {
  if (status == VarStatus::at_lower && !lower) return "its lower bound is -inf";
  if (status == VarStatus::at_upper && !upper) return "its upper bound is +inf";
  if (status == VarStatus::at_zero && (lower || upper)) return "it has a finite bound (\"zero\" is for free variables)";
  return std::nullopt;
}

// Columns then rows share this view: a name, two bounds.
struct Variables {
  const char* key;   // "columns" or "rows"
  const char* noun;  // "column" or "row"
  int count;
  std::function<const std::string&(int)> name;
  std::function<const model::Side&(int)> lower, upper;
  std::function<std::optional<int>(std::string_view)> find;
};

Variables columns_of(const model::Model& m) {
  return {"columns", "column", m.column_count(), [&m](int j) -> const std::string& { return m.columns[j].name; },
          [&m](int j) -> const model::Side& { return m.columns[j].lower; },
          [&m](int j) -> const model::Side& { return m.columns[j].upper; },
          [&m](std::string_view name) { return m.find_column(name); }};
}

Variables rows_of(const model::Model& m) {
  return {"rows", "row", m.row_count(), [&m](int i) -> const std::string& { return m.rows[i].name; },
          [&m](int i) -> const model::Side& { return m.rows[i].lower; },
          [&m](int i) -> const model::Side& { return m.rows[i].upper; },
          [&m](std::string_view name) { return m.find_row(name); }};
}

Json listed(const Variables& v, const std::vector<VarStatus>& statuses) {
  if (static_cast<int>(statuses.size()) != v.count)
    throw std::invalid_argument(std::string("basis: not one status per ") + v.noun);
  Json out = Json::object();
  // Appended directly: names are unique in a model, and the object's own insert would search.
  auto& members = static_cast<Json::object_t::Container&>(out.get_ref<Json::object_t&>());
  for (int k = 0; k < v.count; ++k)
    if (statuses[k] != natural_rest(v.lower(k), v.upper(k))) members.emplace_back(v.name(k), word_of(statuses[k]));
  return out;
}

ModelIdentity identity(const Json& model) {
  if (!model.is_object()) throw SchemaError{"/model", describe(model), "an object describing the model"};
  ModelIdentity id;
  id.objective_constant.reset();
  for (const auto& [key, value] : model.items()) {
    std::string pointer = "/model" + detail::pointer_step(key);
    if (key == "file" || key == "sha256") {
      if (!value.is_string()) throw SchemaError{pointer, describe(value), "a JSON string"};
      (key == "file" ? id.file : id.sha256) = value.get<std::string>();
    } else if (key == "rows" || key == "columns") {
      (key == "rows" ? id.rows : id.columns) = count(value, pointer);
    } else {
      throw SchemaError{pointer, "the key \"" + key + "\"", "only \"file\", \"sha256\", \"rows\", \"columns\" in \"model\""};
    }
  }
  for (const char* key : {"file", "sha256", "rows", "columns"})
    required(model, "/model", key, "the model's \"" + std::string(key) + "\"");
  return id;
}

// Reads one of "columns"/"rows" into statuses (already at their natural rest); returns the number
// of basic variables it names.
long read_statuses(const Json& object, const Variables& v, std::vector<VarStatus>& statuses) {
  const std::string pointer = std::string("/") + v.key;
  if (!object.is_object())
    throw SchemaError{pointer, describe(object),
                      std::string("an object of ") + v.noun + " names and status words, e.g. {\"x1\": \"basic\"}"};
  long basic = 0;
  for (const auto& [name, word] : object.items()) {
    const std::string at = pointer + detail::pointer_step(name);
    std::optional<int> index = v.find(name);
    if (!index) throw SchemaError{at, "the name " + Json(name).dump(), std::string("a ") + v.noun + " of the model"};
    std::optional<VarStatus> status = word.is_string() ? status_of(word.get_ref<const std::string&>()) : std::nullopt;
    if (!status) throw SchemaError{at, describe(word), status_words};
    if (auto why = refusal(*status, v.lower(*index), v.upper(*index)))
      throw SchemaError{at, describe(word) + " for " + v.noun + " " + name + ", but " + *why,
                        "a status its bounds allow"};
    statuses[*index] = *status;
    if (*status == VarStatus::basic) ++basic;
  }
  return basic;
}

BasisFile read(const Json& root, const model::Model& m) {
  if (!root.is_object()) throw SchemaError{"", describe(root), "a JSON object holding a basis"};
  for (const auto& item : root.items()) {
    const std::string& key = item.key();
    if (key != "plumb_basis" && key != "model" && key != "columns" && key != "rows")
      throw SchemaError{detail::pointer_step(key), "the key \"" + key + "\"",
                        "only \"plumb_basis\", \"model\", \"columns\", \"rows\" in a basis file"};
  }
  const Json& version = required(root, "", "plumb_basis", "the version mark \"plumb_basis\": 1");
  if (!version.is_number_integer() || version.get<long long>() != basis_version)
    throw SchemaError{"/plumb_basis", describe(version), "1, the only basis version this reader knows"};
  BasisFile file;
  file.model = identity(required(root, "", "model", "a \"model\" object"));
  Variables columns = columns_of(m), rows = rows_of(m);
  for (const Variables* v : {&columns, &rows}) {
    std::vector<VarStatus>& statuses = v == &columns ? file.basis.columns : file.basis.rows;
    for (int k = 0; k < v->count; ++k) statuses.push_back(natural_rest(v->lower(k), v->upper(k)));
    file.basic_count += read_statuses(required(root, "", v->key, "a \"" + std::string(v->key) + "\" object"), *v, statuses);
  }
  return file;
}

}  // namespace

Json basis_json(const model::Model& model, const simplex::Basis& basis) {
  Json out = Json::object();
  out["columns"] = listed(columns_of(model), basis.columns);
  out["rows"] = listed(rows_of(model), basis.rows);
  return out;
}

std::string to_basis_text(const model::Model& model, const simplex::Basis& basis) {
  Json out = Json::object();
  out["plumb_basis"] = basis_version;
  out["model"] = {{"file", model.source.path},
                  {"sha256", model.source.sha256},
                  {"rows", model.row_count()},
                  {"columns", model.column_count()}};
  Json statuses = basis_json(model, basis);
  out["columns"] = std::move(statuses["columns"]);
  out["rows"] = std::move(statuses["rows"]);
  try {
    return out.dump(2) + "\n";
  } catch (const nlohmann::json::type_error&) {
    throw std::invalid_argument("a basis names a column or row that is not valid UTF-8, which JSON cannot carry exactly");
  }
}

BasisFile parse_basis(std::string_view text, const std::string& file, const model::Model& model) {
  if (text.size() > max_basis_bytes)
    throw model::InputError({file}, std::to_string(text.size()) + " bytes",
                            "a basis file of at most " + std::to_string(max_basis_bytes) + " bytes");
  return detail::read_document(text, file, max_basis_depth, [&](const Json& root) { return read(root, model); });
}

BasisFile read_basis(const std::string& path, const model::Model& model) {
  return parse_basis(detail::read_limited_file(path, max_basis_bytes, "basis"), path, model);
}

}  // namespace plumb::certificate
