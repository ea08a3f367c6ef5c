// Labels sidecar reader.  To be written: see docs/labels.md.
#include "plumb/model/labels.hpp"

namespace plumb::model {
void apply_labels(Model&, const std::string&) {}
void apply_labels_text(Model&, std::string_view, const std::string&) {}
std::string labels_beside(const std::string&) { return {}; }
}  // namespace plumb::model
