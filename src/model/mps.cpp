// MPS reader and writer (fixed and free form).  To be written: see docs/model-format.md.
#include "parsers.hpp"
#include "plumb/model/read.hpp"

#include <ostream>

namespace plumb::model {
namespace detail {
Model parse_mps(std::string_view, const std::string& file, ObjectiveConstantRule) {
  throw InputError({file}, "an MPS file", "a format this build can read (MPS reader not yet written)");
}
}  // namespace detail
void write_mps(const Model&, std::ostream&) {}
}  // namespace plumb::model
