// Native model format reader and writer.  To be written: see docs/model-format.md.
#include "parsers.hpp"
#include "plumb/model/read.hpp"

#include <ostream>

namespace plumb::model {
namespace detail {
Model parse_plumb(std::string_view, const std::string& file) {
  throw InputError({file}, "a native model", "a format this build can read (native reader not yet written)");
}
bool looks_like_plumb(std::string_view) { return false; }
}  // namespace detail
void write_plumb(const Model&, std::ostream&) {}
}  // namespace plumb::model
