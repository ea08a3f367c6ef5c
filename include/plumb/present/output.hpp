// Delivering a rendering: the one way every command writes a file.
#pragma once

#include <stdexcept>
#include <string>
#include <string_view>

namespace plumb::present {

// A file that could not be written in full; what() reads "cannot write the <what> to <path>".
struct OutputError : std::runtime_error {
  using std::runtime_error::runtime_error;
};

// Writes text to path (created or replaced), or throws OutputError; `what` names the content in
// the message ("certificate", "model").  Commands let it reach main, which prints it and exits 1.
void write_file(const std::string& path, std::string_view text, const std::string& what);

}  // namespace plumb::present
