// Labels sidecar reader (docs/labels.md): RFC 4180 CSV (model/csv.hpp), one line per row, column or bound.
#include "plumb/model/labels.hpp"

#include "plumb/model/input_file.hpp"
#include "plumb/model/csv.hpp"

#include <array>
#include <filesystem>
#include <map>
#include <ostream>

namespace plumb::model {
namespace {

constexpr std::array<std::string_view, 6> header = {"name", "kind", "statement", "unit", "group", "hard"};
// The optional columns after the six above: why a limit is written so (docs/labels.md), then what
// relaxing it by one unit weighs in plumb explain's least total change.
constexpr std::array<std::string_view, 4> decision_header = {"decision", "source", "owner", "weight"};
constexpr std::size_t decision_columns = 3;
constexpr std::string_view model_kind = "model";  // a line about the model as a whole

std::string quoted(const std::string& text) {
  return "'" + (text.size() > 40 ? text.substr(0, 40) + "...'" : text + "'");
}

// The label a (name, kind) line addresses; kind "row" also reaches the objective, an MPS row too.
Label& label_for(Model& model, const CsvField& name, const CsvField& kind) {
  if (kind.text == "row") {
    if (auto i = model.find_row(name.text)) return model.rows[static_cast<std::size_t>(*i)].label;
    if (name.text == model.objective.name) return model.objective.label;
    throw InputError(name.where, "the unknown row " + quoted(name.text), "the name of a row of the model");
  }
  if (kind.text != "column" && kind.text != "lower" && kind.text != "upper")
    throw InputError(kind.where, "the kind " + quoted(kind.text), "row, column, lower, upper or model");
  auto j = model.find_column(name.text);
  if (!j) throw InputError(name.where, "the unknown column " + quoted(name.text), "the name of a column of the model");
  Column& column = model.columns[static_cast<std::size_t>(*j)];
  if (kind.text == "column") return column.label;
  return kind.text == "lower" ? column.lower_label : column.upper_label;
}

// A "model" line: a decision about the whole model, in the decision columns; the rest stay empty.
void apply_model_decision(Model& model, const std::vector<CsvField>& f) {
  if (f.size() <= header.size())
    throw InputError(f[1].where, "the kind 'model' in a file without decision columns",
                     "the header name,kind,statement,unit,group,hard,decision,source,owner");
  for (std::size_t k : {0, 2, 3, 4, 5, 9})
    if (k < f.size() && !f[k].text.empty())
      throw InputError(f[k].where, "the " + std::string(header[k]) + " " + quoted(f[k].text) + " on a model line",
                       "an empty field: a model line fills only decision, source and owner");
  if (f[6].text.empty()) throw InputError(f[6].where, "an empty decision on a model line", "the decision's text");
  model.decisions.push_back({f[6].text, f[7].text, f[8].text});
}

}  // namespace

void apply_labels_text(Model& model, std::string_view text, const std::string& file) {
  std::vector<CsvRecord> records = read_csv(text, file);
  if (records.empty()) throw InputError({file, 1, 0}, "an empty file", "the header line name,kind,statement,unit,group,hard");
  const CsvRecord& first = records.front();
  const std::size_t width = first.fields.size();
  bool header_ok = width == header.size() || width == header.size() + decision_columns ||
                   width == header.size() + decision_header.size();
  for (std::size_t k = 0; header_ok && k < width; ++k)
    header_ok = first.fields[k].text == (k < header.size() ? header[k] : decision_header[k - header.size()]);
  if (!header_ok)
    throw InputError(
        first.where, "a first line that is not the header",
        "name,kind,statement,unit,group,hard (and optionally ,decision,source,owner and then ,weight)");
  std::map<std::pair<std::string, std::string>, long> seen;  // (name, kind) -> line
  for (std::size_t r = 1; r < records.size(); ++r) {
    const CsvRecord& record = records[r];
    if (record.fields.size() != width)
      throw InputError(record.where, std::to_string(record.fields.size()) + " fields",
                       std::to_string(width) + " fields, as in the header");
    const auto& f = record.fields;
    if (f[1].text == model_kind) {
      apply_model_decision(model, f);
      continue;
    }
    Label& label = label_for(model, f[0], f[1]);
    auto [first, fresh] = seen.emplace(std::pair(f[0].text, f[1].text), record.where.line);
    if (!fresh)
      throw InputError(record.where, "a second line for " + f[1].text + " " + quoted(f[0].text),
                       "one line per name and kind (the first is line " + std::to_string(first->second) + ")");
    std::optional<bool> hard;
    if (f[5].text == "yes") hard = true;
    else if (f[5].text == "no") hard = false;
    else if (!f[5].text.empty()) throw InputError(f[5].where, "hard = " + quoted(f[5].text), "yes, no or nothing");
    // Empty fields leave what the model itself says.
    if (!f[2].text.empty()) label.statement = f[2].text;
    if (!f[3].text.empty()) label.unit = f[3].text;
    if (!f[4].text.empty()) label.group = f[4].text;
    if (hard) label.hard = hard;
    if (width > header.size()) {
      if (!f[6].text.empty()) label.decision = f[6].text;
      if (!f[7].text.empty()) label.source = f[7].text;
      if (!f[8].text.empty()) label.owner = f[8].text;
    }
    if (width == header.size() + decision_header.size() && !f[9].text.empty()) {
      numeric::ParseFailure why;
      auto weight = numeric::parse_decimal(f[9].text, &why);
      if (!weight || *weight <= 0)
        throw InputError(f[9].where, "the weight " + quoted(f[9].text),
                         "a decimal above 0: what relaxing one unit of this limit weighs");
      label.weight = *weight;
    }
  }
}

void apply_labels(Model& model, const std::string& path) {
  detail::LoadedFile file = detail::load_file(path);
  apply_labels_text(model, file.text, path);
}

std::string labels_path_beside(const std::string& model_path) {
  std::filesystem::path path(model_path);
  if (path.extension() == ".gz") path.replace_extension();
  return path.replace_extension(".labels.csv").string();
}

// Native models carry their labels inline, so only other models look for a sidecar of their own:
// blend.plumb may sit beside blend.mps and blend.labels.csv, which are meant for the MPS names.
std::string labels_beside(const std::string& model_path) {
  std::filesystem::path path(model_path);
  if (path.extension() == ".gz") path.replace_extension();
  if (path.extension() == ".plumb") return {};
  std::string beside = labels_path_beside(model_path);
  std::error_code ignored;
  if (beside == model_path || !std::filesystem::is_regular_file(beside, ignored)) return {};
  return beside;
}

void write_labels(const Model& model, std::ostream& out) {
  auto field = [](const std::string& text) {
    if (text.find_first_of(",\"\r\n") == std::string::npos) return text;
    std::string quoted = "\"";
    for (char c : text) quoted += c == '"' ? std::string("\"\"") : std::string(1, c);
    return quoted + "\"";
  };
  // The decision columns only when something fills them, so older readers keep reading the rest.
  bool with_decisions = !model.decisions.empty() || model.objective.label.recorded();
  for (const Row& row : model.rows) with_decisions = with_decisions || row.label.recorded();
  for (const Column& column : model.columns)
    with_decisions = with_decisions || column.label.recorded() || column.lower_label.recorded() ||
                     column.upper_label.recorded();
  bool with_weights = model.objective.label.weight.has_value();
  for (const Row& row : model.rows) with_weights = with_weights || row.label.weight;
  for (const Column& column : model.columns)
    with_weights =
        with_weights || column.label.weight || column.lower_label.weight || column.upper_label.weight;
  with_decisions = with_decisions || with_weights;
  auto decision_fields = [&](const std::string& decision, const std::string& source, const std::string& owner,
                             const std::optional<Rational>& weight) {
    if (with_decisions) out << ',' << field(decision) << ',' << field(source) << ',' << field(owner);
    if (with_weights) out << ',' << (weight ? numeric::to_decimal(*weight, 100000).text : "");
    out << '\n';
  };
  auto line = [&](const std::string& name, const char* kind, const Label& label) {
    if (label.empty()) return;
    out << field(name) << ',' << kind << ',' << field(label.statement) << ',' << field(label.unit) << ','
        << field(label.group) << ',' << (label.hard ? (*label.hard ? "yes" : "no") : "");
    decision_fields(label.decision, label.source, label.owner, label.weight);
  };
  out << "name,kind,statement,unit,group,hard";
  if (with_decisions) out << ",decision,source,owner";
  if (with_weights) out << ",weight";
  out << '\n';
  for (const ModelDecision& decision : model.decisions) {
    out << ",model,,,,";
    decision_fields(decision.decision, decision.source, decision.owner, std::nullopt);
  }
  line(model.objective.name, "row", model.objective.label);
  for (const Row& row : model.rows) line(row.name, "row", row.label);
  for (const Column& column : model.columns) {
    line(column.name, "column", column.label);
    line(column.name, "lower", column.lower_label);
    line(column.name, "upper", column.upper_label);
  }
}

}  // namespace plumb::model
