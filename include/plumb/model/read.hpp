// Reading and writing models: the one entry point that every command uses to load a file.
#pragma once

#include "plumb/model/model.hpp"

#include <iosfwd>
#include <string>
#include <string_view>

namespace plumb::model {

enum class Format { automatic, mps, plumb };

struct ReadOptions {
  Format format = Format::automatic;  // automatic: by extension (.plumb), else by content
  ObjectiveConstantRule constant_rule = ObjectiveConstantRule::negated_rhs;
  std::string labels_path;            // explicit --labels FILE
  bool find_labels_beside = true;     // use MODEL.labels.csv when it sits beside the model
};

// Reads a model exactly; .gz is decompressed transparently. Throws InputError on bad input.
Model read_model(const std::string& path, const ReadOptions& options = {});

// Parses model text already in memory; `file` names it in messages.
Model read_model_text(std::string_view text, const std::string& file, const ReadOptions& options = {});

// Lower-case hex SHA-256 of bytes: the fingerprint models, sidecars and certificates are named by.
std::string sha256_hex(std::string_view bytes);

// Writers: free-form MPS and the native format.  Both round-trip through the readers.
void write_mps(const Model& model, std::ostream& out);
void write_plumb(const Model& model, std::ostream& out);

}  // namespace plumb::model
