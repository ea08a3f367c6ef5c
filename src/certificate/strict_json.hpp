// Internal: JSON parsing that refuses duplicate keys and deep nesting, and finds a value's line again.
#pragma once

#include "plumb/model/error.hpp"

#include <nlohmann/json.hpp>

#include <string>
#include <string_view>

namespace plumb::certificate::detail {

// Parses text into an order-keeping document.  Throws model::InputError with line and column for
// invalid JSON, a key given twice in one object, or nesting deeper than max_depth.
nlohmann::ordered_json parse_strict_json(std::string_view text, const std::string& file, int max_depth);

// Where the value at JSON pointer `pointer` (e.g. "/x/c1") starts in text, which must have parsed
// before; the start of the text when the pointer names nothing.
model::Location locate(std::string_view text, const std::string& file, const std::string& pointer);

// "/" + key with '~' and '/' escaped, as JSON pointers (RFC 6901) write them.
std::string pointer_step(const std::string& key);

}  // namespace plumb::certificate::detail
