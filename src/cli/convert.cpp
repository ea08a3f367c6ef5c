// plumb convert: writes a model in MPS or the native format, and makes sure it reads back the same.
#include "command.hpp"

#include "plumb/model/labels.hpp"

#include <fstream>
#include <iostream>
#include <sstream>

namespace plumb::cli {
namespace {

struct ConvertOptions {
  ModelOptions model;
  std::string output;
  std::string to;
};

bool ends_with(const std::string& text, const std::string& suffix) {
  return text.size() >= suffix.size() && text.compare(text.size() - suffix.size(), suffix.size(), suffix) == 0;
}

model::Format output_format(const ConvertOptions& options) {
  if (options.to == "mps") return model::Format::mps;
  if (options.to == "plumb") return model::Format::plumb;
  if (ends_with(options.output, ".gz"))
    throw model::InputError({options.output}, "an output ending in .gz",
                            "an uncompressed output (.mps or .plumb); compress it afterwards");
  if (ends_with(options.output, ".mps")) return model::Format::mps;
  if (ends_with(options.output, ".plumb")) return model::Format::plumb;
  throw model::InputError({options.output}, options.output == "-" ? "output '-' without --to" : "an output without .mps or .plumb",
                          "--to mps or --to plumb, or an output file ending in .mps or .plumb");
}

// MPS holds no labels, decisions or title of ours: those travel in the sidecar, so compare the rest.
model::Model without_labels(model::Model m) {
  m.title.clear();
  m.decisions.clear();
  m.objective.label = {};
  for (auto& row : m.rows) row.label = {};
  for (auto& column : m.columns) column.label = column.lower_label = column.upper_label = {};
  return m;
}

bool has_labels(const model::Model& m) {
  if (!m.objective.label.empty() || !m.decisions.empty()) return true;
  for (const auto& row : m.rows)
    if (!row.label.empty()) return true;
  for (const auto& column : m.columns)
    if (!column.label.empty() || !column.lower_label.empty() || !column.upper_label.empty()) return true;
  return false;
}

void write_file(const std::string& path, const std::string& text) {
  std::ofstream out(path, std::ios::binary);
  out << text;
  out.close();
  if (!out) throw model::InputError({path}, "a file that cannot be written", "a writable output path");
}

int convert(const ConvertOptions& options) {
  model::Format format = output_format(options);
  model::Model input = load_model(options.model);
  std::ostringstream text;
  if (format == model::Format::mps) model::write_mps(input, text);
  else model::write_plumb(input, text);

  // The writers promise a lossless round trip; hold them to it before anything is written.
  model::ReadOptions read;
  read.format = format;
  model::Model back = model::read_model_text(text.str(), options.output, read);
  bool same = format == model::Format::plumb ? back.same_content(input)
                                              : without_labels(back).same_content(without_labels(input));
  if (!same) {
    std::cerr << "plumb: the written model does not read back the same; nothing was written (a fault in plumb: "
                 "please report it with the input)\n";
    return exit_bad_input;
  }
  if (options.output == "-") std::cout << text.str();
  else write_file(options.output, text.str());

  if (format == model::Format::mps && has_labels(input)) {
    if (options.output == "-") {
      std::cerr << "plumb: the model's labels are not in MPS output; write to a file to get them beside it\n";
    } else {
      std::ostringstream labels;
      model::write_labels(input, labels);
      std::string path = model::labels_path_beside(options.output);
      write_file(path, labels.str());
      std::cerr << "plumb: labels written to " << path << "\n";
    }
  }
  return exit_ok;
}

}  // namespace

void add_convert(CLI::App& app, Action& action) {
  auto options = std::make_shared<ConvertOptions>();
  auto* command = app.add_subcommand("convert", "Write a model as MPS or in the native format (.plumb)");
  add_model_options(*command, options->model);
  command->add_option("output", options->output, "Where to write: a .mps or .plumb file, or - for stdout")->required();
  command->add_option("--to", options->to, "Output format, instead of the output's extension")
      ->check(CLI::IsMember({"mps", "plumb"}));
  command->callback([&action, options] { action = [options] { return convert(*options); }; });
}

}  // namespace plumb::cli
