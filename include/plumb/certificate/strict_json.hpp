// Strict JSON: refuses duplicate keys and deep nesting, and finds a value's line again; shared by every JSON reader of user files.
#pragma once

#include "plumb/model/error.hpp"

#include <nlohmann/json.hpp>

#include <cstddef>
#include <iterator>
#include <string>
#include <string_view>

namespace plumb::certificate::detail {

// A char iterator that reports how many bytes the parser has taken so far, so that a SAX handler
// driven by nlohmann's parser knows where each token ends.
struct CountingIterator {
  using iterator_category = std::input_iterator_tag;
  using value_type = char;
  using difference_type = std::ptrdiff_t;
  using pointer = const char*;
  using reference = const char&;
  const char* at;
  std::size_t* consumed;
  char operator*() const { return *at; }
  CountingIterator& operator++() {
    ++at;
    ++*consumed;
    return *this;
  }
  bool operator==(const CountingIterator& other) const { return at == other.at; }
};

// Line and column (from 1) of byte `index` of text.
model::Location location_of(std::string_view text, const std::string& file, std::size_t index);

// Parses text into an order-keeping document.  Throws model::InputError with line and column for
// invalid JSON, a key given twice in one object, or nesting deeper than max_depth.
nlohmann::ordered_json parse_strict_json(std::string_view text, const std::string& file, int max_depth);

// Where the value at JSON pointer `pointer` (e.g. "/x/c1") starts in text, which must have parsed
// before; the start of the text when the pointer names nothing.
model::Location locate(std::string_view text, const std::string& file, const std::string& pointer);

// "/" + key with '~' and '/' escaped, as JSON pointers (RFC 6901) write them.
std::string pointer_step(const std::string& key);

// A refusal found after parsing: `pointer` leads back to the line and column.
struct SchemaError {
  std::string pointer;
  std::string found;
  std::string expected;
};

// A value as a refusal's "found" names it: "an object", "the string \"abc\"", "the number 3".
std::string describe(const nlohmann::ordered_json& value);

// The member `key` of object, or a SchemaError at `pointer` saying `what` was expected.
const nlohmann::ordered_json& required(const nlohmann::ordered_json& object, const std::string& pointer,
                                       const std::string& key, const std::string& what);

// A JSON integer from 0 to the largest long, or a SchemaError at `pointer`.
long count(const nlohmann::ordered_json& value, const std::string& pointer);

// Parses text strictly and hands the document to `read`; a SchemaError it throws becomes one
// located model::InputError.
template <class Read>
auto read_document(std::string_view text, const std::string& file, int max_depth, Read read) {
  nlohmann::ordered_json root = parse_strict_json(text, file, max_depth);
  try {
    return read(root);
  } catch (const SchemaError& error) {
    throw model::InputError(locate(text, file, error.pointer), error.found, error.expected);
  }
}

// The whole file, refused (model::InputError) when it cannot be read or passes max_bytes; read in
// chunks rather than by the reported size, so pipes work and a growing file still stops.
// `what` names the kind of file in messages, e.g. "certificate".
std::string read_limited_file(const std::string& path, std::size_t max_bytes, const std::string& what);

}  // namespace plumb::certificate::detail
