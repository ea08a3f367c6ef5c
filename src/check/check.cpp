// The checker: to be written (see docs/certificates.md).
#include "plumb/check/check.hpp"

namespace plumb::check {
Verdict verify(const model::Model&, const certificate::Certificate&) { return {false, "", "checker not yet written"}; }
}  // namespace plumb::check
