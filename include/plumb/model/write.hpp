// Writing models: free-form MPS and the native format, each read back by plumb/model/read.hpp to
// the same model (MPS holds no labels or title: those travel in the labels sidecar).
#pragma once

#include "plumb/model/model.hpp"
#include "plumb/model/read.hpp"

#include <iosfwd>

namespace plumb::model {

// Free-form MPS, every number exact (docs/mps.md); throws std::runtime_error for a model MPS
// cannot hold (names with blanks, for one).
void write_mps(const Model& model, std::ostream& out);
// The native format (docs/model-format.md).
void write_native(const Model& model, std::ostream& out);

}  // namespace plumb::model
