// Internal: exact number texts shared by the model writers.
#pragma once

#include "plumb/numeric/rational.hpp"

#include <optional>
#include <string>

namespace plumb::model::detail {

// A non-negative integer, its trailing zeros as an exponent when there are more than six (3e99999).
std::string integer_text(const numeric::Integer& value);

// The exact decimal of a non-negative value, trailing zeros as an exponent (58.1, 9e99042, 1e-30):
// as long as the number that was read, so it fits the line it came from.  nullopt when the value
// has no finite decimal, or, with `unless_far_longer`, when the decimal is far longer than the
// fraction (1/2^k has a decimal of 0.7 k digits).
std::optional<std::string> decimal_text(const numeric::Rational& magnitude, bool unless_far_longer);

}  // namespace plumb::model::detail
