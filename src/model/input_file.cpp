#include "plumb/model/input_file.hpp"

#include "plumb/run/budget.hpp"

#include <openssl/evp.h>
#include <zlib.h>

#include <cstdint>
#include <cstdio>
#include <fstream>
#include <iterator>
#include <memory>

namespace plumb::model::detail {
namespace {

constexpr uInt buffer_bytes = 1 << 18;
// Lines between two looks at the interrupt flag (from line 1 on, so a signal that came before
// reading began stops it at once).
constexpr long interrupt_poll_lines = 4096;

// Inflates every gzip member of `stored` in turn, handing each decompressed chunk to `sink`, and
// returns the total size.  Throws InputError for corrupt or truncated data and as soon as the
// total passes max_input_bytes, so a small bomb costs one bounded buffer, not its expansion.
template <class Sink>
std::size_t inflate_gzip(const std::string& stored, const std::string& path, Sink sink) {
  z_stream stream{};
  // 16 + MAX_WBITS: gzip wrapper only; concatenated members are handled below.
  if (inflateInit2(&stream, 16 + MAX_WBITS) != Z_OK) throw InputError({path}, "a gzip stream zlib cannot open", "a readable .gz file");
  stream.next_in = reinterpret_cast<Bytef*>(const_cast<char*>(stored.data()));
  stream.avail_in = static_cast<uInt>(stored.size());
  std::unique_ptr<char[]> buffer(new char[buffer_bytes]);
  std::size_t total = 0;
  int status = Z_OK;
  while (true) {
    if (run::interrupt_flag().load(std::memory_order_relaxed)) {
      inflateEnd(&stream);
      throw run::Stopped{run::StopReason::interrupted,
                         "decompressing " + path + ", after " + std::to_string(total >> 20) + " MiB"};
    }
    stream.next_out = reinterpret_cast<Bytef*>(buffer.get());
    stream.avail_out = buffer_bytes;
    status = inflate(&stream, Z_NO_FLUSH);
    if (status != Z_OK && status != Z_STREAM_END) break;
    std::size_t produced = buffer_bytes - stream.avail_out;
    total += produced;
    if (total > max_input_bytes) {
      inflateEnd(&stream);
      throw InputError({path}, "more than 2 GiB after decompression", "a model of at most 2 GiB");
    }
    sink(std::string_view(buffer.get(), produced));
    if (status == Z_STREAM_END) {
      if (stream.avail_in == 0) break;
      inflateReset(&stream);  // another gzip member follows
    }
  }
  inflateEnd(&stream);
  if (status != Z_STREAM_END)
    throw InputError({path}, "a truncated or corrupt gzip stream", "a complete .gz file");
  return total;
}

// Two passes: the first only measures (refusing bombs and corrupt data without keeping anything),
// the second fills a string reserved to the exact size, so peak memory is the model itself.
std::string decompress(const std::string& stored, const std::string& path) {
  // The last member's trailer states its size modulo 2^32: beyond the limit the file is either
  // that large or corrupt, and is refused at once.  (A trailer that lies is caught by pass one.)
  if (stored.size() >= 18) {
    std::uint32_t stated = 0;
    for (int k = 1; k <= 4; ++k) stated = stated << 8 | static_cast<unsigned char>(stored[stored.size() - k]);
    if (stated > max_input_bytes)
      throw InputError({path},
                       "a gzip trailer stating " + std::to_string(stated) +
                           " bytes after decompression (more than 2 GiB, or a corrupt gzip stream)",
                       "a model of at most 2 GiB");
  }
  std::size_t size = inflate_gzip(stored, path, [](std::string_view) {});
  std::string out;
  out.reserve(size);
  inflate_gzip(stored, path, [&out](std::string_view chunk) { out.append(chunk); });
  return out;
}

}  // namespace

std::string sha256_hex(std::string_view bytes) {
  unsigned char digest[EVP_MAX_MD_SIZE];
  unsigned int length = 0;
  EVP_Digest(bytes.data(), bytes.size(), digest, &length, EVP_sha256(), nullptr);
  static const char* hex = "0123456789abcdef";
  std::string out;
  for (unsigned int i = 0; i < length; ++i) out += hex[digest[i] >> 4], out += hex[digest[i] & 15];
  return out;
}

LoadedFile load_file(const std::string& path) {
  std::ifstream in(path, std::ios::binary);
  if (!in) throw InputError({path}, "a file that cannot be opened", "a readable file");
  in.seekg(0, std::ios::end);
  std::streamoff size = in.tellg();
  if (size < 0) throw InputError({path}, "something that is not a regular file", "a readable file");
  if (static_cast<std::size_t>(size) > max_input_bytes)
    throw InputError({path}, "a file larger than 2 GiB", "a model of at most 2 GiB");
  in.seekg(0);
  LoadedFile file;
  file.path = path;
  std::string stored(static_cast<std::size_t>(size), '\0');
  in.read(stored.data(), size);
  if (!in) throw InputError({path}, "a read error", "a readable file");
  file.sha256 = sha256_hex(stored);
  file.compressed = stored.size() >= 2 && static_cast<unsigned char>(stored[0]) == 0x1f &&
                    static_cast<unsigned char>(stored[1]) == 0x8b;
  file.text = file.compressed ? decompress(stored, path) : std::move(stored);
  return file;
}

LineCursor::LineCursor(std::string_view text, std::string file) : text_(text), file_(std::move(file)) {}

bool LineCursor::next(std::string_view& line) {
  if (offset_ >= text_.size()) return false;
  std::size_t end = text_.find('\n', offset_);
  if (end == std::string_view::npos) end = text_.size();
  line = text_.substr(offset_, end - offset_);
  offset_ = end + 1;
  ++line_number_;
  if ((line_number_ & (interrupt_poll_lines - 1)) == 1) {
    if (before_interrupt_poll) before_interrupt_poll(line_number_);
    run::stop_if_interrupted([&] { return "reading " + file_ + ", at line " + std::to_string(line_number_); });
  }
  if (!line.empty() && line.back() == '\r') line.remove_suffix(1);
  if (line.size() > max_line_length)
    throw InputError(here(), "a line of " + std::to_string(line.size()) + " characters",
                     "lines of at most " + std::to_string(max_line_length) + " characters");
  for (std::size_t i = 0; i < line.size(); ++i) {
    unsigned char c = static_cast<unsigned char>(line[i]);
    if ((c < 0x20 && c != '\t') || c == 0x7f) {
      char code[8];
      std::snprintf(code, sizeof code, "0x%02x", c);
      throw InputError(here(static_cast<long>(i) + 1), std::string("a control byte ") + code + " (binary data?)",
                       "text");
    }
  }
  return true;
}

}  // namespace plumb::model::detail
