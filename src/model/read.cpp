#include "plumb/model/read.hpp"

#include "plumb/model/input_file.hpp"
#include "parsers.hpp"
#include "plumb/model/labels.hpp"

namespace plumb::model {
namespace {

bool ends_with(std::string_view text, std::string_view suffix) {
  return text.size() >= suffix.size() && text.substr(text.size() - suffix.size()) == suffix;
}

Format resolve_format(const std::string& path, std::string_view text, Format requested) {
  if (requested != Format::automatic) return requested;
  if (ends_with(path, ".plumb") || ends_with(path, ".plumb.gz")) return Format::native;
  if (ends_with(path, ".mps") || ends_with(path, ".mps.gz")) return Format::mps;
  return detail::looks_like_native(text) ? Format::native : Format::mps;
}

}  // namespace

std::string sha256_hex(std::string_view bytes) { return detail::sha256_hex(bytes); }

Model read_model_text(std::string_view text, const std::string& file, const ReadOptions& options) {
  Model model = resolve_format(file, text, options.format) == Format::native
                    ? detail::parse_native(text, file)
                    : detail::parse_mps(text, file, options.constant_rule);
  model.source.path = file;
  model.source.constant_rule = options.constant_rule;
  return model;
}

Model read_model(const std::string& path, const ReadOptions& options) {
  detail::LoadedFile file = detail::load_file(path);
  Model model = read_model_text(file.text, path, options);
  model.source.sha256 = file.sha256;
  std::string labels = options.labels_path;
  if (labels.empty() && options.find_labels_beside) labels = labels_beside(path);
  if (!labels.empty()) {
    apply_labels(model, labels);
    model.source.labels_path = labels;
  }
  return model;
}

void set_sense_by_option(Model& model, Sense sense) {
  model.objective.sense = sense;
  model.source.sense_origin = SenseOrigin::option;
}

std::optional<SenseCommentNote> sense_comment_note(const Source& source, Sense used) {
  const auto& comment = source.sense_comment;
  if (!comment) return std::nullopt;
  auto verb = [](Sense sense) { return sense == Sense::minimise ? "minimised" : "maximised"; };
  std::string why = source.sense_origin == SenseOrigin::mps_default
                        ? "the MPS convention without an OBJSENSE section"
                        : source.sense_origin == SenseOrigin::option ? "as --objective-sense says"
                                                                     : "as the OBJSENSE section says";
  std::string other = used == Sense::minimise ? "max" : "min";
  bool warn = source.sense_origin == SenseOrigin::mps_default || comment->stated != used;
  std::string text = "line " + std::to_string(comment->line) + " is a comment saying the objective is " + verb(comment->stated) +
         " (\"" + comment->text + "\"); plumb reads it as " + verb(used) + ", " + why +
         "; a comment never sets the sense" + (warn ? ": pass --objective-sense " + other + " if the comment is right" : "");
  return SenseCommentNote{std::move(text), warn};
}

}  // namespace plumb::model
