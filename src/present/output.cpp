#include "plumb/present/output.hpp"

#include <fstream>

namespace plumb::present {

void write_file(const std::string& path, std::string_view text, const std::string& what) {
  std::ofstream file(path, std::ios::binary);
  file.write(text.data(), static_cast<std::streamsize>(text.size()));
  file.close();
  if (!file) throw OutputError("cannot write the " + what + " to " + path);
}

}  // namespace plumb::present
