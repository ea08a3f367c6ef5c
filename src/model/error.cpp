#include "plumb/model/error.hpp"

namespace plumb::model {

std::string format_location(const Location& where) {
  std::string text = where.file.empty() ? "<input>" : where.file;
  if (where.line > 0) text += ":" + std::to_string(where.line);
  if (where.line > 0 && where.column > 0) text += ":" + std::to_string(where.column);
  return text;
}

InputError::InputError(Location where, std::string found, std::string expected)
    : std::runtime_error(format_location(where) + ": found " + found + ", expected " + expected),
      where_(std::move(where)),
      found_(std::move(found)),
      expected_(std::move(expected)) {}

std::string format_warning(const Warning& warning) {
  return format_location(warning.where) + ": warning: " + warning.message;
}

}  // namespace plumb::model
