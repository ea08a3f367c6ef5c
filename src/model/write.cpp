// The checked writer behind plumb convert: writers promise a lossless round trip, and this holds
// them to it before anything is written.
#include "plumb/model/write.hpp"

#include <sstream>

namespace plumb::model {
namespace {

// MPS holds no labels, decisions or title of ours: those travel in the sidecar, so compare the rest.
Model without_labels(Model m) {
  m.title.clear();
  m.decisions.clear();
  m.objective.label = {};
  for (auto& row : m.rows) row.label = {};
  for (auto& column : m.columns) column.label = column.lower_label = column.upper_label = {};
  return m;
}

}  // namespace

bool has_labels(const Model& m) {
  if (!m.objective.label.empty() || !m.decisions.empty()) return true;
  for (const auto& row : m.rows)
    if (!row.label.empty()) return true;
  for (const auto& column : m.columns)
    if (!column.label.empty() || !column.lower_label.empty() || !column.upper_label.empty()) return true;
  return false;
}

std::string write_checked(const Model& model, Format format) {
  std::ostringstream text;
  if (format == Format::mps)
    write_mps(model, text);
  else
    write_native(model, text);
  ReadOptions read;
  read.format = format;
  // A value can be too long for any line of the format (constant arithmetic in the native format
  // makes numbers of any length; MPS has no way to write them): refused, naming the written text,
  // not the model's own file.
  const std::string format_name = format == Format::mps ? "MPS" : "the native format";
  Model back;
  try {
    back = read_model_text(text.str(), format == Format::mps ? "written MPS" : "written native text", read);
  } catch (const InputError& error) {
    throw RoundTripError("the model cannot be written in " + format_name + " so that it reads back (" +
                         error.what() + "); nothing was written");
  }
  bool same = format == Format::native ? back.same_content(model)
                                       : without_labels(back).same_content(without_labels(model));
  if (!same)
    throw RoundTripError(
        "the written model does not read back the same; nothing was written (a fault in plumb: "
        "please report it with the input)");
  return text.str();
}

}  // namespace plumb::model
