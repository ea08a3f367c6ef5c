// Loading a model-side file whole (gz or plain) with its fingerprint, and walking it line by line: shared by every reader of user files.
#pragma once

#include "plumb/model/error.hpp"

#include <cstddef>
#include <string>
#include <string_view>

namespace plumb::model::detail {

constexpr std::size_t max_input_bytes = std::size_t(2) << 30;  // 2 GiB after decompression
constexpr std::size_t max_line_length = 1 << 16;

struct LoadedFile {
  std::string path;
  std::string text;    // decompressed content
  std::string sha256;  // of the bytes as stored on disk
  bool compressed = false;
};

// Throws InputError when the file cannot be opened, is corrupt gzip, or is too large.
LoadedFile load_file(const std::string& path);

// Lower-case hex SHA-256 of bytes.
std::string sha256_hex(std::string_view bytes);

// Walks text line by line, counting lines from 1; strips a trailing '\r'.
// Throws InputError for NUL or other control bytes and over-long lines.
class LineCursor {
 public:
  LineCursor(std::string_view text, std::string file);
  bool next(std::string_view& line);
  long line_number() const { return line_number_; }
  Location here(long column = 0) const { return {file_, line_number_, column}; }
  const std::string& file() const { return file_; }

  // Test seam, null in the program: called with the line number just before each look at the
  // interrupt flag, so that a test can raise a signal at a known point of a read.
  static inline void (*before_interrupt_poll)(long line) = nullptr;

 private:
  std::string_view text_;
  std::size_t offset_ = 0;
  std::string file_;
  long line_number_ = 0;
};

}  // namespace plumb::model::detail
