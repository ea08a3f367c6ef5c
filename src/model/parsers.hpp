// Internal: the format parsers behind read_model_text.
#pragma once

#include "plumb/model/model.hpp"

#include <string>
#include <string_view>

namespace plumb::model::detail {

// Fixed or free MPS, detected from the text.  Sets source.format.
Model parse_mps(std::string_view text, const std::string& file, ObjectiveConstantRule rule);

// The native format of docs/model-format.md.
Model parse_native(std::string_view text, const std::string& file);

// True when the first significant line of text opens with a native-format keyword.
bool looks_like_native(std::string_view text);

}  // namespace plumb::model::detail
