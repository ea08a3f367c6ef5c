// Writing models: free-form MPS and the native format, each read back by plumb/model/read.hpp to
// the same model (MPS holds no labels or title: those travel in the labels sidecar).
#pragma once

#include "plumb/model/model.hpp"
#include "plumb/model/read.hpp"

#include <iosfwd>
#include <stdexcept>
#include <string>

namespace plumb::model {

// Free-form MPS, every number exact (docs/mps.md); throws std::runtime_error for a model MPS
// cannot hold (names with blanks, for one).
void write_mps(const Model& model, std::ostream& out);
// The native format (docs/model-format.md).
void write_native(const Model& model, std::ostream& out);

// The written text did not read back to the same model: a fault in plumb, never in the input.
struct RoundTripError : std::logic_error {
  using std::logic_error::logic_error;
};

// The model as text in `format` (mps or native), after reading that text back and comparing it
// with the model (for MPS, labels and title aside); throws RoundTripError when they differ, so
// that a faulty writer never reaches a file.
std::string write_checked(const Model& model, Format format);

// True when the model carries a label (statement, unit, group) anywhere, the title aside: what MPS
// output leaves to the labels sidecar.
bool has_labels(const Model& model);

}  // namespace plumb::model
