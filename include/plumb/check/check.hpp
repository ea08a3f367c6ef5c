// The independent checker: a model and a certificate in, valid or the first failing condition out.
#pragma once

#include "plumb/certificate/certificate.hpp"
#include "plumb/model/model.hpp"

#include <string>

namespace plumb::check {

struct Verdict {
  bool valid = false;
  std::string proven;   // valid: what the certificate proves, in one sentence
  std::string failure;  // invalid: the first condition that fails, with names and amounts
};

Verdict verify(const model::Model& model, const certificate::Certificate& certificate);

}  // namespace plumb::check
