// plumb convert: writes a model in MPS or the native format, and makes sure it reads back the same.
#include "command.hpp"

#include "plumb/model/labels.hpp"
#include "plumb/model/write.hpp"
#include "plumb/present/output.hpp"

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
  if (options.to == "plumb") return model::Format::native;
  if (ends_with(options.output, ".gz"))
    throw model::InputError({options.output}, "an output ending in .gz",
                            "an uncompressed output (.mps or .plumb); compress it afterwards");
  if (ends_with(options.output, ".mps")) return model::Format::mps;
  if (ends_with(options.output, ".plumb")) return model::Format::native;
  throw model::InputError({options.output}, options.output == "-" ? "output '-' without --to" : "an output without .mps or .plumb",
                          "--to mps or --to plumb, or an output file ending in .mps or .plumb");
}

int convert(const ConvertOptions& options) {
  model::Format format = output_format(options);
  model::Model input = load_model(options.model);
  std::string text = model::write_checked(input, format);  // a RoundTripError reaches main: exit 1
  if (options.output == "-")
    std::cout << text;
  else
    present::write_file(options.output, text, "model");

  if (format == model::Format::mps && model::has_labels(input)) {
    if (options.output == "-") {
      std::cerr << "plumb: the model's labels are not in MPS output; write to a file to get them beside it\n";
    } else {
      std::ostringstream labels;
      model::write_labels(input, labels);
      std::string path = model::labels_path_beside(options.output);
      present::write_file(path, labels.str(), "labels");
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
