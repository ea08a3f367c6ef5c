// Labels sidecar: plain-language statements, units, groups and hard/soft flags for MPS models.
#pragma once

#include "plumb/model/model.hpp"

#include <iosfwd>
#include <string>
#include <string_view>

namespace plumb::model {

// Reads a labels CSV (columns: name, kind, statement, unit, group, hard; see docs/labels.md)
// and attaches each line to the row, column or bound it names. Throws InputError.
void apply_labels(Model& model, const std::string& path);
void apply_labels_text(Model& model, std::string_view text, const std::string& file);

// MODEL.labels.csv beside the model file (the .gz suffix dropped first), if that file exists.
// Native (.plumb) models carry their labels inline and get no sidecar here.
std::string labels_beside(const std::string& model_path);

// The path labels_beside looks at, whether or not the file exists (e.g. to write one).
std::string labels_path_beside(const std::string& model_path);

// Writes every non-empty label of the model as a labels CSV that apply_labels reads back.
void write_labels(const Model& model, std::ostream& out);

}  // namespace plumb::model
