#include "plumb/model/read.hpp"

#include "input_file.hpp"
#include "parsers.hpp"
#include "plumb/model/labels.hpp"

namespace plumb::model {
namespace {

bool ends_with(std::string_view text, std::string_view suffix) {
  return text.size() >= suffix.size() && text.substr(text.size() - suffix.size()) == suffix;
}

Format resolve_format(const std::string& path, std::string_view text, Format requested) {
  if (requested != Format::automatic) return requested;
  if (ends_with(path, ".plumb") || ends_with(path, ".plumb.gz")) return Format::plumb;
  if (ends_with(path, ".mps") || ends_with(path, ".mps.gz")) return Format::mps;
  return detail::looks_like_plumb(text) ? Format::plumb : Format::mps;
}

}  // namespace

std::string sha256_hex(std::string_view bytes) { return detail::sha256_hex(bytes); }

Model read_model_text(std::string_view text, const std::string& file, const ReadOptions& options) {
  Model model = resolve_format(file, text, options.format) == Format::plumb
                    ? detail::parse_plumb(text, file)
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

}  // namespace plumb::model
