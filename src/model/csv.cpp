// CSV through libcsv in strict mode.  libcsv reports no positions, so each line is fed in pieces
// that end at a comma or at the line's end: a field libcsv completes inside a piece ends at that
// piece's last byte, which gives every field its line and column.
#include "plumb/model/csv.hpp"

#include "plumb/model/input_file.hpp"

#include <csv.h>

#include <memory>

namespace plumb::model {
namespace {

class Collector {
 public:
  explicit Collector(const std::string& file) : file_(file) {}

  // A new line: when no record is open, the next field starts at its first column.
  void begin_line(long line) {
    line_ = line;
    if (!record_open_) next_field_ = {file_, line, 1};
  }
  // The byte (0-based column in the current line) of the piece's end, for the next field.
  void piece_ends_at(std::size_t offset) { piece_end_ = offset; }

  static void on_field(void* data, std::size_t length, void* self) {
    static_cast<Collector*>(self)->field(static_cast<const char*>(data), length);
  }
  static void on_record(int, void* self) { static_cast<Collector*>(self)->record(); }

  const Location& field_start() const { return next_field_; }
  std::vector<CsvRecord> take() { return std::move(records_); }

 private:
  void field(const char* data, std::size_t length) {
    if (!record_open_) {
      records_.push_back({{}, next_field_});
      record_open_ = true;
    }
    records_.back().fields.push_back({std::string(data ? data : "", data ? length : 0), next_field_});
    next_field_ = {file_, line_, static_cast<long>(piece_end_) + 2};  // after the comma
  }
  void record() {
    record_open_ = false;
    next_field_ = {file_, line_ + 1, 1};
  }

  const std::string& file_;
  std::vector<CsvRecord> records_;
  bool record_open_ = false;
  long line_ = 0;
  std::size_t piece_end_ = 0;
  Location next_field_;
};

struct ParserDeleter {
  void operator()(csv_parser* parser) const {
    csv_free(parser);
    delete parser;
  }
};

}  // namespace

std::vector<CsvRecord> read_csv(std::string_view text, const std::string& file) {
  if (text.starts_with("\xEF\xBB\xBF")) text.remove_prefix(3);  // a byte-order mark, as spreadsheets write
  std::unique_ptr<csv_parser, ParserDeleter> parser(new csv_parser);
  if (csv_init(parser.get(), CSV_STRICT | CSV_STRICT_FINI) != 0) throw std::bad_alloc();
  Collector collector(file);
  detail::LineCursor cursor(text, file);  // refuses control bytes and over-long lines
  std::string_view line;
  while (cursor.next(line)) {
    collector.begin_line(cursor.line_number());
    std::size_t start = 0;
    while (true) {
      std::size_t comma = line.find(',', start);
      std::size_t end = comma == std::string_view::npos ? line.size() : comma + 1;
      collector.piece_ends_at(end == 0 ? 0 : end - 1);
      std::size_t taken = csv_parse(parser.get(), line.data() + start, end - start, Collector::on_field,
                                    Collector::on_record, &collector);
      if (taken < end - start || csv_error(parser.get()) == CSV_EPARSE) {
        std::size_t bad = start + taken;
        if (bad > 0 && bad <= line.size() && (bad == line.size() || line[bad] != '"') && line[bad - 1] != '"') --bad;
        Location where = cursor.here(static_cast<long>(bad) + 1);
        char c = bad < line.size() ? line[bad] : ' ';
        if (c == '"') throw InputError(where, "a '\"' inside an unquoted field", "the whole field in quotes, with '\"\"' for each quote inside");
        throw InputError(where, std::string("'") + c + "' after a closing quote", "',' or the end of the line");
      }
      if (comma == std::string_view::npos) break;
      start = end;
    }
    collector.piece_ends_at(line.size());
    csv_parse(parser.get(), "\n", 1, Collector::on_field, Collector::on_record, &collector);
  }
  if (csv_fini(parser.get(), Collector::on_field, Collector::on_record, &collector) != 0)
    throw InputError(collector.field_start(), "a quoted field that is never closed", "a closing '\"'");
  return collector.take();
}

}  // namespace plumb::model
