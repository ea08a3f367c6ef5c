// Certificate JSON: to be written (see docs/certificates.md).
#include "plumb/certificate/certificate.hpp"

namespace plumb::certificate {
std::string to_string(Status status) {
  switch (status) {
    case Status::optimal: return "optimal";
    case Status::infeasible: return "infeasible";
    case Status::unbounded: return "unbounded";
    case Status::feasible: return "feasible";
  }
  return "unknown";
}
std::string to_json_text(const Certificate&) { return "{}"; }
}  // namespace plumb::certificate
