// Internal to health: finding rows and columns that are exact copies of one another.
#pragma once

#include "plumb/model/model.hpp"

#include <vector>

namespace plumb::health::detail {

// Groups of two or more non-empty rows with the same entries and the same sides, in model order.
std::vector<std::vector<int>> duplicate_rows(const model::Model& model);

// Groups of two or more non-empty columns with the same entries and the same objective coefficient.
std::vector<std::vector<int>> duplicate_columns(const model::Model& model);

}  // namespace plumb::health::detail
