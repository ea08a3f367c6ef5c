// Plan and dual files (docs/formats.md): every form is first turned into entries (name, value
// text, where each stands), then one routine checks names and converts values exactly.
#include "plumb/audit/values.hpp"

#include "plumb/certificate/strict_json.hpp"
#include "plumb/model/input_file.hpp"
#include "plumb/model/csv.hpp"

#include <nlohmann/json.hpp>

#include <algorithm>
#include <cctype>
#include <optional>

namespace plumb::audit {
namespace {

using model::InputError;
using model::Location;

struct Entry {
  std::string name;
  std::string value;
  Location name_at;
  Location value_at;
};

std::string quoted(const std::string& text) {
  return "'" + (text.size() > 40 ? text.substr(0, 40) + "...'" : text + "'");
}

const char* noun(NamesOf names) { return names == NamesOf::columns ? "column" : "row"; }

// A first line is a header when its value is not a number: "name,value", "column level".
bool is_header(const std::string& value) { return !numeric::parse_number(value) && !value.empty(); }

// Two fields a record, or three under the header name,value,decimal that --repaired writes (the
// decimal is a reading aid and is ignored).
std::vector<Entry> csv_entries(std::string_view text, const std::string& file) {
  std::vector<Entry> entries;
  std::vector<model::CsvRecord> records = model::read_csv(text, file);
  if (records.empty()) return entries;
  const auto& head = records.front().fields;
  bool repaired = head.size() == 3 && head[0].text == "name" && head[1].text == "value" && head[2].text == "decimal";
  std::size_t width = repaired ? 3 : 2;
  for (std::size_t r = repaired ? 1 : 0; r < records.size(); ++r) {
    auto& fields = records[r].fields;
    if (fields.size() != width)
      throw InputError(records[r].where, std::to_string(fields.size()) + (fields.size() == 1 ? " field" : " fields"),
                       repaired ? "3 fields: name,value,decimal" : "2 fields: name,value");
    if (r == 0 && is_header(fields[1].text)) continue;
    entries.push_back({std::move(fields[0].text), std::move(fields[1].text), fields[0].where, fields[1].where});
  }
  return entries;
}

// Two words a line, separated by spaces or tabs; blank lines skipped.
std::vector<Entry> list_entries(std::string_view text, const std::string& file) {
  std::vector<Entry> entries;
  model::detail::LineCursor cursor(text, file);
  std::string_view line;
  bool first = true;
  while (cursor.next(line)) {
    std::vector<std::pair<std::string, long>> words;
    for (std::size_t i = 0; i < line.size();) {
      if (line[i] == ' ' || line[i] == '\t') {
        ++i;
        continue;
      }
      std::size_t end = line.find_first_of(" \t", i);
      if (end == std::string_view::npos) end = line.size();
      words.emplace_back(std::string(line.substr(i, end - i)), static_cast<long>(i) + 1);
      i = end;
    }
    if (words.empty()) continue;
    if (words.size() != 2)
      throw InputError(cursor.here(words[0].second), std::to_string(words.size()) + (words.size() == 1 ? " word" : " words"),
                       "a name and a value, separated by spaces or tabs");
    bool header = first && is_header(words[1].first);
    first = false;
    if (header) continue;
    entries.push_back({words[0].first, words[1].first, cursor.here(words[0].second), cursor.here(words[1].second)});
  }
  return entries;
}

using Json = nlohmann::json;

// A flat JSON object of names to numbers or number strings.  Numbers keep their text: nlohmann
// hands it to number_float, and whole numbers arrive exact as 64-bit integers.
class FlatObjectHandler {
 public:
  FlatObjectHandler(std::string_view text, const std::string& file, const std::size_t& consumed)
      : text_(text), file_(file), consumed_(consumed) {}

  bool null() { return refuse("null"); }
  bool boolean(bool value) { return refuse(value ? "the value true" : "the value false"); }
  bool number_integer(Json::number_integer_t value) { return leaf(std::to_string(value)); }
  bool number_unsigned(Json::number_unsigned_t value) { return leaf(std::to_string(value)); }
  bool number_float(Json::number_float_t, const std::string& text) { return leaf(text); }
  bool string(std::string& value) { return leaf(value); }
  bool binary(Json::binary_t&) { return refuse("binary data"); }
  bool start_object(std::size_t) {
    if (depth_++ == 0) return finish();
    return refuse("an object");
  }
  bool start_array(std::size_t) {
    if (depth_ == 0) return refuse("a JSON array", "a JSON object of names to values, {\"name\": value, ...}");
    return refuse("an array");
  }
  bool end_object() {
    --depth_;
    return finish();
  }
  bool end_array() { return finish(); }
  bool key(std::string& name) {
    key_at_ = token_start();
    key_ = std::move(name);
    return finish();
  }
  bool parse_error(std::size_t position, const std::string&, const nlohmann::detail::exception& error) {
    std::string reason = error.what();
    if (std::size_t colon = reason.rfind(": "); colon != std::string::npos) reason = reason.substr(colon + 2);
    refusal_ = {position > 0 ? position - 1 : 0, "invalid JSON (" + reason + ")", "a JSON object of names to values"};
    return false;
  }

  struct Refusal {
    std::size_t at;
    std::string found, expected;
  };
  const std::optional<Refusal>& refusal() const { return refusal_; }
  std::vector<Entry> take() { return std::move(entries_); }

 private:
  bool leaf(std::string value) {
    if (depth_ == 0) return refuse("a single value", "a JSON object of names to values");
    std::size_t value_at = token_start();
    entries_.push_back({std::move(key_), std::move(value), where(key_at_), where(value_at)});
    return finish();
  }
  bool refuse(std::string found, std::string expected = "a number, or a number in a string") {
    refusal_ = Refusal{token_start(), std::move(found), std::move(expected)};
    return false;
  }
  bool finish() {
    previous_end_ = consumed_;
    return true;
  }
  std::size_t token_start() const {
    std::size_t i = previous_end_;
    while (i < text_.size() && std::string_view(" \t\r\n:,").find(text_[i]) != std::string_view::npos) ++i;
    return i;
  }
  // Entries arrive in text order, so their places are found by one forward walk.
  Location where(std::size_t index) {
    for (; scanned_ < index; ++scanned_) {
      if (text_[scanned_] == '\n') ++line_, column_ = 1;
      else ++column_;
    }
    return {file_, line_, column_};
  }

  std::string_view text_;
  const std::string& file_;
  const std::size_t& consumed_;
  std::size_t previous_end_ = 0;
  int depth_ = 0;
  std::string key_;
  std::size_t key_at_ = 0;
  std::vector<Entry> entries_;
  std::optional<Refusal> refusal_;
  std::size_t scanned_ = 0;
  long line_ = 1, column_ = 1;
};

std::vector<Entry> json_entries(std::string_view text, const std::string& file) {
  std::size_t consumed = 0;
  FlatObjectHandler handler(text, file, consumed);
  certificate::detail::CountingIterator first{text.data(), &consumed}, last{text.data() + text.size(), &consumed};
  if (!Json::sax_parse(first, last, &handler)) {
    auto refusal = handler.refusal().value_or(FlatObjectHandler::Refusal{consumed, "invalid JSON", "a JSON object"});
    throw InputError(certificate::detail::location_of(text, file, refusal.at), refusal.found, refusal.expected);
  }
  return handler.take();
}

Rational exact_value(const Entry& entry) {
  std::string lower;
  for (char c : entry.value) lower += static_cast<char>(std::tolower(static_cast<unsigned char>(c)));
  if (lower.starts_with('+') || lower.starts_with('-')) lower.erase(0, 1);
  if (lower == "inf" || lower == "infinity" || lower == "nan")
    throw InputError(entry.value_at, "the infinite value " + quoted(entry.value) + " for " + quoted(entry.name),
                     "a finite number: a plan or a dual gives every name a finite value");
  numeric::ParseFailure why;
  std::optional<Rational> value = numeric::parse_number(entry.value, &why);
  if (!value)
    throw InputError(entry.value_at, quoted(entry.value) + " as the value of " + quoted(entry.name),
                     "a number such as 12, -0.5, 1.25e-3 or 1/3 (" + why.reason + ")");
  return *value;
}

Values resolve(const std::vector<Entry>& entries, const std::string& file, const model::Model& model, NamesOf names) {
  std::size_t count = names == NamesOf::columns ? model.columns.size() : model.rows.size();
  Values result;
  result.values.assign(count, Rational(0));
  result.given.assign(count, false);
  std::vector<const Entry*> unknown;
  std::vector<const Entry*> first_of(count, nullptr);
  for (const Entry& entry : entries) {
    auto index = names == NamesOf::columns ? model.find_column(entry.name) : model.find_row(entry.name);
    if (!index) {
      unknown.push_back(&entry);
      continue;
    }
    auto k = static_cast<std::size_t>(*index);
    if (first_of[k])
      throw InputError(entry.name_at, "a second value for " + std::string(noun(names)) + " " + quoted(entry.name),
                       "each name once (the first is line " + std::to_string(first_of[k]->name_at.line) + ")");
    first_of[k] = &entry;
    result.values[k] = exact_value(entry);
    result.given[k] = true;
  }
  if (!unknown.empty()) {
    std::string listed;
    for (std::size_t u = 0; u < unknown.size() && u < 5; ++u) listed += (u ? ", " : "") + quoted(unknown[u]->name);
    if (unknown.size() > 5) listed += " and " + std::to_string(unknown.size() - 5) + " more";
    std::string what = std::string(noun(names)) + (unknown.size() == 1 ? "" : "s");
    throw InputError(unknown.front()->name_at,
                     std::to_string(unknown.size()) + " unknown " + what + ": " + listed,
                     "names of " + std::string(noun(names)) + "s of the model (it has " + std::to_string(count) + ")");
  }
  if (entries.empty())
    throw InputError({file, 1, 0}, "no names with values", std::string("lines of ") + noun(names) + " name and value");
  result.missing = static_cast<std::size_t>(std::count(result.given.begin(), result.given.end(), false));
  return result;
}

}  // namespace

std::size_t max_values_bytes(const model::Model& model) {
  return (std::size_t(1) << 20) + 1024 * (model.columns.size() + model.rows.size());
}

Values read_values_text(std::string_view text, const std::string& file, const model::Model& model, NamesOf names) {
  if (text.starts_with("\xEF\xBB\xBF")) text.remove_prefix(3);
  std::size_t first = text.find_first_not_of(" \t\r\n");
  if (first == std::string_view::npos)
    throw InputError({file, 1, 0}, "an empty file", std::string("a ") + (names == NamesOf::columns ? "plan" : "dual") +
                                                        " file (docs/formats.md)");
  std::string format;
  std::vector<Entry> entries;
  if (text[first] == '{' || text[first] == '[') {
    format = "json";
    entries = json_entries(text, file);
  } else {
    // Lines starting with '#' are comments in both other forms; blanked, they keep line numbers.
    std::string uncommented;
    uncommented.reserve(text.size());
    std::string first_line;
    for (std::size_t start = 0; start < text.size();) {
      std::size_t end = std::min(text.find('\n', start), text.size());
      std::string_view line = text.substr(start, end - start);
      if (!line.starts_with('#')) {
        uncommented += line;
        if (first_line.empty() && line.find_first_not_of(" \t\r") != std::string_view::npos) first_line = line;
      }
      if (end < text.size()) uncommented += '\n';
      start = end + 1;
    }
    format = first_line.find(',') != std::string::npos ? "csv" : "list";
    entries = format == "csv" ? csv_entries(uncommented, file) : list_entries(uncommented, file);
  }
  Values values = resolve(entries, file, model, names);
  values.format = format;
  return values;
}

Values read_values(const std::string& path, const model::Model& model, NamesOf names) {
  std::string text = certificate::detail::read_limited_file(path, max_values_bytes(model),
                                                            names == NamesOf::columns ? "plan" : "dual file");
  return read_values_text(text, path, model, names);
}

}  // namespace plumb::audit
