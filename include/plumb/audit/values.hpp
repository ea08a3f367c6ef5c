// Plan and dual files: names with exact values, as CSV, a whitespace list or a JSON object.
#pragma once

#include "plumb/model/model.hpp"

#include <string>
#include <string_view>
#include <vector>

namespace plumb::audit {

using numeric::Rational;

enum class NamesOf { columns, rows };  // a plan names columns; a dual file names rows

struct Values {
  std::vector<Rational> values;  // one per column (or row) in model order; zero where none is given
  std::vector<bool> given;       // which the file named
  std::size_t missing = 0;       // how many it did not name
  std::string format;            // "csv", "list" or "json"
};

// A file of more bytes than this is refused before it is read: 1 MiB, plus 1 KiB per name the
// model has (no honest plan or dual file comes near it).
std::size_t max_values_bytes(const model::Model& model);

// Reads a plan (NamesOf::columns) or a dual file (NamesOf::rows), docs/formats.md.  Every value is
// converted from its decimal text exactly.  Throws model::InputError, located at the line and
// column, for an unknown name (all of them counted, the first few listed), a name given twice, a
// value that is not a finite number, an empty file, a JSON array or a file over the size limit.
Values read_values(const std::string& path, const model::Model& model, NamesOf names);
Values read_values_text(std::string_view text, const std::string& file, const model::Model& model, NamesOf names);

}  // namespace plumb::audit
