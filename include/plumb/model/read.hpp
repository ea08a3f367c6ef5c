// Reading models: the one entry point that every command uses to load a file (writing:
// plumb/model/write.hpp).
#pragma once

#include "plumb/model/model.hpp"

#include <optional>
#include <string>
#include <string_view>

namespace plumb::model {

enum class Format { automatic, mps, native };  // native: the format of docs/model-format.md, files .plumb

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

// Sets the objective sense as the user chose it (--objective-sense), recording that it came so.
void set_sense_by_option(Model& model, Sense sense);

// What to say about a comment stating an objective sense (nothing when there is none): what it
// states, which sense plumb uses and why, and how to choose the other.  `warn` unless an explicit
// statement (OBJSENSE, --objective-sense) agrees with the comment.
struct SenseCommentNote {
  std::string text;
  bool warn = true;
};
std::optional<SenseCommentNote> sense_comment_note(const Source& source, Sense used);

// Lower-case hex SHA-256 of bytes: the fingerprint models, sidecars and certificates are named by.
std::string sha256_hex(std::string_view bytes);

}  // namespace plumb::model
