// Strict JSON: nlohmann's parser driven through a SAX handler that counts bytes, so every refusal
// can say where it happened; the document is built by nlohmann's own DOM builder.
#include "plumb/certificate/strict_json.hpp"

#include <algorithm>
#include <cstddef>
#include <filesystem>
#include <fstream>
#include <iterator>
#include <limits>
#include <optional>
#include <unordered_set>
#include <vector>

namespace plumb::certificate::detail {
namespace {

using Json = nlohmann::ordered_json;

}  // namespace

model::Location location_of(std::string_view text, const std::string& file, std::size_t index) {
  index = std::min(index, text.size());
  std::string_view before = text.substr(0, index);
  std::size_t last_newline = before.rfind('\n');
  long line = 1 + static_cast<long>(std::count(before.begin(), before.end(), '\n'));
  long column = static_cast<long>(last_newline == std::string_view::npos ? index : index - last_newline - 1) + 1;
  return {file, line, column};
}

namespace {

struct Refusal {
  std::size_t index;  // byte where the refused thing starts
  std::string found;
  std::string expected;
};

// Builds the document itself rather than through nlohmann's DOM builder: an ordered object's own
// insert searches its keys, which would make a million-entry "x" quadratic; here duplicates are
// already excluded, so members are appended directly.
class StrictHandler {
 public:
  // root == nullptr: only look for `target`, build nothing.
  StrictHandler(Json* root, std::string_view text, const std::size_t& consumed, int max_depth,
                const std::string* target)
      : root_(root), text_(text), consumed_(consumed), max_depth_(max_depth), target_(target) {}

  bool null() { return leaf(nullptr); }
  bool boolean(bool value) { return leaf(value); }
  bool number_integer(Json::number_integer_t value) { return leaf(value); }
  bool number_unsigned(Json::number_unsigned_t value) { return leaf(value); }
  bool number_float(Json::number_float_t value, const std::string&) { return leaf(value); }
  bool string(std::string& value) { return leaf(std::move(value)); }
  bool binary(Json::binary_t& value) { return leaf(Json::binary(std::move(value))); }

  bool start_object(std::size_t) { return open(true, Json::object()); }
  bool start_array(std::size_t) { return open(false, Json::array()); }
  bool end_object() { return close(); }
  bool end_array() { return close(); }

  bool key(std::string& name) {
    Frame& frame = frames_.back();
    if (!frame.keys.insert(name).second) {
      std::string shown = Json(name).dump();
      refusal_ = Refusal{value_start(), "the key " + shown + " a second time in one object",
                         "each key at most once (a duplicate would silently replace the first)"};
      return false;
    }
    frame.key = name;
    return finish();
  }

  bool parse_error(std::size_t position, const std::string&, const nlohmann::detail::exception& error) {
    // nlohmann's message reads "[json.exception.KIND.ID] parse error at line L, column C: reason";
    // we keep the reason and give the place ourselves.
    std::string reason = error.what();
    if (std::size_t tag = reason.find("] "); tag != std::string::npos) reason = reason.substr(tag + 2);
    if (reason.starts_with("parse error")) {
      if (std::size_t colon = reason.find(": "); colon != std::string::npos) reason = reason.substr(colon + 2);
    }
    refusal_ = Refusal{position > 0 ? position - 1 : 0, "invalid JSON (" + reason + ")", "a JSON document"};
    return false;
  }

  const std::optional<Refusal>& refusal() const { return refusal_; }
  std::optional<std::size_t> target_index() const { return target_index_; }

 private:
  struct Frame {
    bool is_object;
    Json* node;            // the object or array being filled; null when building nothing
    std::string key;       // object: the key whose value comes next
    long index = -1;       // array: the index of the current element
    std::unordered_set<std::string> keys;
  };

  // First byte of the value now starting: past the separators that follow the previous token.
  std::size_t value_start() const {
    std::size_t i = previous_end_;
    while (i < text_.size() && (text_[i] == ' ' || text_[i] == '\t' || text_[i] == '\r' || text_[i] == '\n' ||
                                text_[i] == ':' || text_[i] == ','))
      ++i;
    return i;
  }

  std::string current_pointer() const {
    std::string pointer;
    for (const Frame& frame : frames_)
      pointer += frame.is_object ? pointer_step(frame.key) : "/" + std::to_string(frame.index);
    return pointer;
  }

  void begin_value() {
    if (!frames_.empty() && !frames_.back().is_object) ++frames_.back().index;
    if (target_ && !target_index_ && current_pointer() == *target_) target_index_ = value_start();
  }

  // Puts a value where the parser is: the root, the next array element, or the pending member.
  Json* place(Json value) {
    if (!root_) return nullptr;
    if (frames_.empty()) return &(*root_ = std::move(value));
    Frame& frame = frames_.back();
    if (!frame.is_object) {
      auto& elements = frame.node->get_ref<Json::array_t&>();
      elements.push_back(std::move(value));
      return &elements.back();
    }
    auto& members = static_cast<Json::object_t::Container&>(frame.node->get_ref<Json::object_t&>());
    members.emplace_back(frame.key, std::move(value));
    return &members.back().second;
  }

  bool leaf(Json value) {
    begin_value();
    place(std::move(value));
    return finish();
  }

  bool open(bool is_object, Json empty) {
    begin_value();
    if (static_cast<int>(frames_.size()) >= max_depth_) {
      refusal_ = Refusal{value_start(), "objects and arrays nested deeper than " + std::to_string(max_depth_) + " levels",
                         "at most " + std::to_string(max_depth_) + " levels of nesting"};
      return false;
    }
    Json* node = place(std::move(empty));
    frames_.push_back(Frame{is_object, node, {}, -1, {}});
    return finish();
  }

  bool close() {
    frames_.pop_back();
    return finish();
  }

  bool finish() {
    previous_end_ = consumed_;
    return true;
  }

  Json* root_;
  std::string_view text_;
  const std::size_t& consumed_;
  int max_depth_;
  const std::string* target_;
  std::vector<Frame> frames_;
  std::size_t previous_end_ = 0;
  std::optional<Refusal> refusal_;
  std::optional<std::size_t> target_index_;
};

}  // namespace

std::string pointer_step(const std::string& key) {
  std::string step = "/";
  for (char c : key) step += c == '~' ? std::string("~0") : c == '/' ? std::string("~1") : std::string(1, c);
  return step;
}

Json parse_strict_json(std::string_view text, const std::string& file, int max_depth) {
  Json root;
  std::size_t consumed = 0;
  StrictHandler handler(&root, text, consumed, max_depth, nullptr);
  CountingIterator first{text.data(), &consumed}, last{text.data() + text.size(), &consumed};
  if (!Json::sax_parse(first, last, &handler)) {
    const Refusal refusal = handler.refusal().value_or(Refusal{consumed, "invalid JSON", "a JSON document"});
    throw model::InputError(location_of(text, file, refusal.index), refusal.found, refusal.expected);
  }
  return root;
}

model::Location locate(std::string_view text, const std::string& file, const std::string& pointer) {
  std::size_t consumed = 0;
  StrictHandler handler(nullptr, text, consumed, std::numeric_limits<int>::max(), &pointer);
  CountingIterator first{text.data(), &consumed}, last{text.data() + text.size(), &consumed};
  Json::sax_parse(first, last, &handler);
  return location_of(text, file, handler.target_index().value_or(0));
}

std::string describe(const Json& value) {
  switch (value.type()) {
    case Json::value_t::object: return "an object";
    case Json::value_t::array: return "an array";
    case Json::value_t::string: {
      const auto& text = value.get_ref<const std::string&>();
      if (text.size() <= 40) return "the string " + value.dump();
      // The excerpt ends before a character, not inside one (the text is valid UTF-8, read so).
      std::size_t cut = 24;
      while (cut > 0 && (static_cast<unsigned char>(text[cut]) & 0xC0) == 0x80) --cut;
      return "the string " + Json(text.substr(0, cut)).dump() + "... (" + std::to_string(text.size()) + " bytes)";
    }
    case Json::value_t::boolean: return std::string("the value ") + (value.get<bool>() ? "true" : "false");
    case Json::value_t::null: return "null";
    default: return "the number " + value.dump();
  }
}

const Json& required(const Json& object, const std::string& pointer, const std::string& key, const std::string& what) {
  auto it = object.find(key);
  if (it == object.end()) throw SchemaError{pointer, "no \"" + key + "\"", what};
  return *it;
}

long count(const Json& value, const std::string& pointer) {
  if (!value.is_number_integer() || value.get<long long>() < 0 ||
      value.get<long long>() > std::numeric_limits<long>::max())
    throw SchemaError{pointer, describe(value), "a whole number of at least 0"};
  return static_cast<long>(value.get<long long>());
}

std::string read_limited_file(const std::string& path, std::size_t max_bytes, const std::string& what) {
  std::ifstream in(path, std::ios::binary);
  if (!in || std::filesystem::is_directory(path))
    throw model::InputError({path}, "a file that cannot be opened", "a readable " + what + " file");
  const std::string too_long = "a " + what + " of at most " + std::to_string(max_bytes) + " bytes";
  std::string text;
  char buffer[1 << 16];
  while (in.read(buffer, sizeof buffer) || in.gcount() > 0) {
    text.append(buffer, static_cast<std::size_t>(in.gcount()));
    if (text.size() > max_bytes) throw model::InputError({path}, "more than " + std::to_string(max_bytes) + " bytes", too_long);
  }
  if (in.bad()) throw model::InputError({path}, "a read error", "a readable " + what + " file");
  return text;
}

}  // namespace plumb::certificate::detail
