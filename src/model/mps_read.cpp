// MPS reader, fixed and free form (conventions and the detection rule: docs/mps.md).
#include "plumb/model/input_file.hpp"
#include "parsers.hpp"

#include <algorithm>
#include <array>
#include <cctype>
#include <unordered_map>
#include <unordered_set>

namespace plumb::model::detail {
namespace {

enum class Layout { free, fixed };

// Sections in the order a file must give them; the value is the rank.
enum class Section { none = 0, name, objsense, rows, columns, rhs, ranges, bounds, endata };
constexpr std::array<std::string_view, 9> section_names{"",    "NAME",   "OBJSENSE", "ROWS",  "COLUMNS",
                                                        "RHS", "RANGES", "BOUNDS",   "ENDATA"};

constexpr std::string_view expected_order =
    "sections in the order NAME, OBJSENSE, ROWS, COLUMNS, RHS, RANGES, BOUNDS, ENDATA";
constexpr std::string_view fixed_grid_phrase =
    "fixed-form MPS fields in columns 2-3, 5-12, 15-22, 25-36, 40-47 and 50-61";

// Row handles in the name index: >= 0 is a constraint row.
constexpr int objective_row = -1;
constexpr int dropped_row = -2;  // a further N row: its entries are ignored
constexpr int unknown_row = -3;

// A piece of a line and the column (from 1) where it starts; empty text means absent.
struct Token {
  std::string_view text;
  long column = 0;
  bool present() const { return !text.empty(); }
};

std::string quoted(std::string_view text) { return "\"" + std::string(text) + "\""; }

bool is_blank(char c) { return c == ' ' || c == '\t'; }

std::string_view trim(std::string_view text) {
  while (!text.empty() && is_blank(text.front())) text.remove_prefix(1);
  while (!text.empty() && is_blank(text.back())) text.remove_suffix(1);
  return text;
}

// Free tokenisation: fields separated by blanks or tabs.  Only the first max_tokens are kept,
// `count` counts them all so that "too many fields" can be reported.
struct FreeTokens {
  static constexpr int max_tokens = 8;
  std::array<Token, max_tokens> token;
  int count = 0;
};

FreeTokens split_free(std::string_view line) {
  FreeTokens out;
  std::size_t i = 0;
  while (true) {
    while (i < line.size() && is_blank(line[i])) ++i;
    if (i >= line.size()) break;
    std::size_t start = i;
    while (i < line.size() && !is_blank(line[i])) ++i;
    if (out.count < FreeTokens::max_tokens)
      out.token[out.count] = {line.substr(start, i - start), static_cast<long>(start) + 1};
    ++out.count;
  }
  return out;
}

// Where a "wrong number of fields" error points: the first field beyond `most`, else the line's start.
long surplus_column(const FreeTokens& tokens, int most) {
  return tokens.count > most && most < FreeTokens::max_tokens ? tokens.token[most].column
                                                              : tokens.token[0].column;
}

// The six fixed fields, trimmed; empty when blank.
struct FixedFields {
  std::array<Token, 6> field;
};
constexpr std::array<std::pair<long, long>, 6> fixed_columns{
    {{2, 3}, {5, 12}, {15, 22}, {25, 36}, {40, 47}, {50, 61}}};

// A line that does not fit the fixed grid.  Distinguished so that detection can prefer the
// free-form diagnosis over "this is not fixed form" (see parse_mps).
class GridError : public InputError {
 public:
  using InputError::InputError;
};

// Splits a data line at the fixed columns; nullopt with *bad_column set when a character
// lies outside every field or a tab makes columns ambiguous.
std::optional<FixedFields> split_fixed(std::string_view line, long* bad_column) {
  FixedFields out;
  std::size_t next_field = 0;
  for (std::size_t i = 0; i < line.size(); ++i) {
    long column = static_cast<long>(i) + 1;
    while (next_field < fixed_columns.size() && column > fixed_columns[next_field].second) ++next_field;
    bool inside = next_field < fixed_columns.size() && column >= fixed_columns[next_field].first;
    if (line[i] == '\t' || (!inside && line[i] != ' ')) {
      *bad_column = column;
      return std::nullopt;
    }
  }
  for (std::size_t f = 0; f < fixed_columns.size(); ++f) {
    auto [first, last] = fixed_columns[f];
    if (static_cast<long>(line.size()) < first) break;
    std::string_view raw =
        line.substr(static_cast<std::size_t>(first - 1), static_cast<std::size_t>(last - first + 1));
    std::string_view text = trim(raw);
    long column = first + static_cast<long>(text.empty() ? 0 : text.data() - raw.data());
    out.field[f] = {text, column};
  }
  return out;
}

// True when the fixed fields of a line are exactly its free tokens: both readings agree.
bool fixed_agrees_with_free(std::string_view line, const FreeTokens& tokens) {
  long bad = 0;
  auto fixed = split_fixed(line, &bad);
  if (!fixed) return false;
  int k = 0;
  for (const Token& field : fixed->field) {
    if (!field.present()) continue;
    if (k >= tokens.count || k >= FreeTokens::max_tokens || tokens.token[k].text != field.text) return false;
    ++k;
  }
  return k == tokens.count;
}

// A COLUMNS, RHS or RANGES line: a head (column or set name) and one or two (row, value) pairs.
struct PairLine {
  Token head;
  std::array<Token, 2> row;
  std::array<Token, 2> value;
  int pairs = 0;
};

// A BOUNDS line.
struct BoundLine {
  Token type;
  Token set;
  Token column;
  Token value;
};

struct RowState {
  std::string_view name;
  char type = 'E';
  long line = 0;
  Rational rhs = 0;
  long rhs_line = 0;
  std::optional<Rational> range;
  long range_line = 0;
  long range_column = 0;  // of the range's value, for a side it puts beyond the limit
  int last_column = -1;  // the column whose entry this row saw last, for duplicate checks
  long last_entry_line = 0;
};

struct ColumnState {
  long line = 0;
  long lower_line = 0;  // explicit bound lines, 0 when still the default
  long upper_line = 0;
};

// One pass over the text in one layout.  Every malformed line throws; nothing is half-read.
class Reader {
 public:
  Reader(std::string_view text, const std::string& file, ObjectiveConstantRule rule, Layout layout)
      : cursor_(text, file), rule_(rule), layout_(layout) {}

  Model read();

 private:
  [[noreturn]] void fail(long column, std::string found, std::string expected) const {
    throw InputError(cursor_.here(column), std::move(found), std::move(expected));
  }
  // Records that the current line gives what `describe()` names; a second time is an error naming
  // both lines.  The description is built only then: this runs once per matrix entry.
  template <class Describe>
  void claim(long& first_line, const Token& at, Describe describe, std::string_view expected) const {
    if (first_line != 0)
      fail(at.column, "a second " + describe() + " (first on line " + std::to_string(first_line) + ")",
           std::string(expected));
    first_line = cursor_.line_number();
  }
  void warn(long column, std::string message) {
    model_.warnings.push_back({cursor_.here(column), std::move(message)});
  }

  void start_section(std::string_view line);
  void read_data_line(std::string_view line);
  void finish_columns();

  void read_objsense(const Token& word);
  void note_sense_comment(std::string_view line);
  void read_rows_line(std::string_view line, const FreeTokens& tokens);
  void read_columns_line(std::string_view line, const FreeTokens& tokens);
  void read_marker(const FreeTokens& tokens);
  void read_rhs_or_ranges_line(std::string_view line, const FreeTokens& tokens);
  void read_bounds_line(std::string_view line, const FreeTokens& tokens);

  FixedFields fixed_fields(std::string_view line) const;
  void require_blank(const Token& field, std::string_view what) const;
  PairLine pair_line(std::string_view line, const FreeTokens& tokens, bool head_required);
  BoundLine bound_line(std::string_view line, const FreeTokens& tokens);
  bool accept_set(std::optional<std::string_view>& chosen, const Token& set, std::string_view section);

  int find_row(const Token& name) const;
  int find_column(const Token& name) const;
  Rational number(const Token& text, std::string_view what) const;

  Model build();

  LineCursor cursor_;
  ObjectiveConstantRule rule_;
  Layout layout_;
  bool agrees_with_fixed_ = true;  // free layout: every data line reads the same in fixed form

  Section section_ = Section::none;
  std::array<long, section_names.size()> section_line_{};
  bool sense_pending_ = false;  // OBJSENSE waits for its word on the next line

  Model model_;
  std::string_view objective_name_;
  long objective_line_ = 0;
  long objective_rhs_line_ = 0;
  std::unordered_map<std::string_view, int> row_by_name_;
  std::vector<RowState> rows_;

  std::unordered_map<std::string_view, int> column_by_name_;
  std::vector<ColumnState> columns_;
  int current_column_ = -1;
  std::string_view current_column_name_;
  long current_objective_entry_line_ = 0;
  long integer_run_line_ = 0;  // line of the open INTORG marker, 0 when none is open
  std::vector<Entry> entries_;

  std::optional<std::string_view> rhs_set_, range_set_, bound_set_;
  std::unordered_set<std::string> warned_sets_;  // "SECTION name" of each set already warned about
};

Model Reader::read() {
  std::string_view line;
  bool any_content = false;
  while (cursor_.next(line)) {
    if (!line.empty() && line.front() == '*' && section_ == Section::none) note_sense_comment(line);
    if (line.empty() || line.front() == '*') continue;
    if (trim(line).empty()) continue;
    any_content = true;
    if (section_ == Section::endata)
      fail(1, "text after ENDATA", "nothing but blank or comment lines after ENDATA");
    if (!is_blank(line.front()))
      start_section(line);
    else
      read_data_line(line);
  }
  if (!any_content)
    throw InputError({cursor_.file()}, "an empty file", "an MPS model (NAME, ROWS, COLUMNS, ..., ENDATA)");
  if (section_ != Section::endata)
    fail(0,
         "the end of the file in the " + std::string(section_names[static_cast<int>(section_)]) + " section",
         "an ENDATA line (the file looks truncated)");
  return build();
}

void Reader::start_section(std::string_view line) {
  FreeTokens tokens = split_free(line);
  std::string_view keyword = tokens.token[0].text;
  Section next = Section::none;
  for (std::size_t s = 1; s < section_names.size(); ++s)
    if (keyword == section_names[s]) next = static_cast<Section>(s);
  if (next == Section::none)
    fail(1, "an unknown section " + quoted(keyword),
         "a section name (NAME, OBJSENSE, ROWS, COLUMNS, RHS, RANGES, BOUNDS or ENDATA) or a data line "
         "starting with a blank");
  if (sense_pending_) fail(1, quoted(keyword), "MIN or MAX on the line after OBJSENSE");
  int rank = static_cast<int>(next);
  if (section_line_[rank] != 0)
    fail(1,
         "a second " + std::string(keyword) + " section (first on line " +
             std::to_string(section_line_[rank]) + ")",
         "each section at most once");
  if (rank < static_cast<int>(section_))
    fail(1, std::string(keyword) + " after " + std::string(section_names[static_cast<int>(section_)]),
         std::string(expected_order));
  if (next >= Section::columns && section_line_[static_cast<int>(Section::rows)] == 0)
    fail(1, std::string(keyword) + " before any ROWS section", "a ROWS section first");
  if (next >= Section::rhs && section_line_[static_cast<int>(Section::columns)] == 0)
    fail(1, std::string(keyword) + " before any COLUMNS section", "a COLUMNS section first");
  if (section_ == Section::columns) finish_columns();
  section_ = next;
  section_line_[rank] = cursor_.line_number();

  if (next == Section::name) {
    model_.title = std::string(trim(trim(line).substr(keyword.size())));
  } else if (next == Section::objsense) {
    if (tokens.count > 2)
      fail(tokens.token[2].column, "more than one word after OBJSENSE", "OBJSENSE MIN or OBJSENSE MAX");
    if (tokens.count == 2)
      read_objsense(tokens.token[1]);
    else
      sense_pending_ = true;
  } else if (tokens.count > 1) {
    fail(tokens.token[1].column, quoted(tokens.token[1].text) + " after " + std::string(keyword),
         "nothing else on a " + std::string(keyword) + " line");
  }
}

void Reader::read_objsense(const Token& word) {
  if (word.text == "MIN" || word.text == "MINIMIZE" || word.text == "MINIMISE")
    model_.objective.sense = Sense::minimise;
  else if (word.text == "MAX" || word.text == "MAXIMIZE" || word.text == "MAXIMISE")
    model_.objective.sense = Sense::maximise;
  else
    fail(word.column, "objective sense " + quoted(word.text), "MIN, MAX, MINIMIZE or MAXIMIZE");
  sense_pending_ = false;
}

// A comment before NAME that states a sense: a full word (maximize, minimisation, ...) anywhere,
// or MAX/MIN on a line that speaks of the sense or the objective ("*SENSE:Maximize", "* OBJSENSE
// MAX", "* objective: max").  Only the first such line is kept.
void Reader::note_sense_comment(std::string_view line) {
  if (model_.source.sense_comment) return;
  std::vector<std::string> words;
  std::string word;
  for (char c : line) {
    if (std::isalnum(static_cast<unsigned char>(c))) word += static_cast<char>(std::tolower(static_cast<unsigned char>(c)));
    else if (!word.empty()) words.push_back(std::move(word)), word.clear();
  }
  if (!word.empty()) words.push_back(std::move(word));
  auto has = [&words](std::string_view w) { return std::find(words.begin(), words.end(), w) != words.end(); };
  bool about_sense = has("sense") || has("objsense") || has("objective");
  for (const std::string& w : words) {
    bool max = w.starts_with("maximi") || (about_sense && (w == "max" || w == "maximum"));
    bool min = w.starts_with("minimi") || (about_sense && (w == "min" || w == "minimum"));
    if (!max && !min) continue;
    std::string_view text = trim(line.substr(1));
    if (text.size() > 60) text = text.substr(0, 60);
    model_.source.sense_comment = SenseComment{cursor_.line_number(), max ? Sense::maximise : Sense::minimise, std::string(text)};
    return;
  }
}

void Reader::read_data_line(std::string_view line) {
  FreeTokens tokens = split_free(line);
  if (layout_ == Layout::free && agrees_with_fixed_ && section_ != Section::objsense &&
      !(section_ == Section::columns && tokens.count == 3 && tokens.token[1].text == "'MARKER'"))
    agrees_with_fixed_ = fixed_agrees_with_free(line, tokens);
  switch (section_) {
    case Section::none:
      fail(tokens.token[0].column, "a data line before any section",
           "a section line such as NAME or ROWS first");
    case Section::name:
      fail(tokens.token[0].column, "a data line in the NAME section",
           "the model name on the NAME line itself");
    case Section::objsense:
      if (!sense_pending_) fail(tokens.token[0].column, "a second line in OBJSENSE", "a single MIN or MAX");
      if (tokens.count != 1)
        fail(tokens.token[0].column, std::to_string(tokens.count) + " words in OBJSENSE", "MIN or MAX alone");
      read_objsense(tokens.token[0]);
      return;
    case Section::rows:
      read_rows_line(line, tokens);
      return;
    case Section::columns:
      read_columns_line(line, tokens);
      return;
    case Section::rhs:
    case Section::ranges:
      read_rhs_or_ranges_line(line, tokens);
      return;
    case Section::bounds:
      read_bounds_line(line, tokens);
      return;
    case Section::endata:
      return;  // unreachable: read() refuses text after ENDATA
  }
}

FixedFields Reader::fixed_fields(std::string_view line) const {
  long bad = 0;
  auto fields = split_fixed(line, &bad);
  if (!fields) {
    std::string what = line[bad - 1] == '\t' ? "a tab" : quoted(line.substr(bad - 1, 1));
    throw GridError(cursor_.here(bad), what + " in column " + std::to_string(bad),
                    std::string(fixed_grid_phrase));
  }
  return *fields;
}

void Reader::require_blank(const Token& field, std::string_view what) const {
  if (field.present()) fail(field.column, quoted(field.text), std::string(what));
}

void Reader::read_rows_line(std::string_view line, const FreeTokens& tokens) {
  Token type, name;
  if (layout_ == Layout::free) {
    if (tokens.count != 2)
      fail(surplus_column(tokens, 2), std::to_string(tokens.count) + " fields in a ROWS line",
           "2 fields: a row type (N, L, G or E) and a row name");
    type = tokens.token[0];
    name = tokens.token[1];
  } else {
    FixedFields f = fixed_fields(line);
    type = f.field[0];
    name = f.field[1];
    if (!type.present()) fail(name.column, "no row type in columns 2-3", "N, L, G or E");
    if (!name.present()) fail(type.column, "no row name in columns 5-12", "a row name");
    for (int k = 2; k < 6; ++k) require_blank(f.field[k], "nothing after the row name in a ROWS line");
  }
  if (type.text.size() != 1 || std::string_view("NLGE").find(type.text[0]) == std::string_view::npos)
    fail(type.column, "row type " + quoted(type.text), "N, L, G or E");
  long line_number = cursor_.line_number();
  auto [it, inserted] = row_by_name_.try_emplace(name.text, static_cast<int>(rows_.size()));
  if (!inserted) {
    long first = it->second >= 0 ? rows_[it->second].line : objective_line_;
    fail(name.column,
         "a second row named " + quoted(name.text) + " (first on line " + std::to_string(first) + ")",
         "unique row names");
  }
  if (type.text[0] == 'N') {
    if (objective_line_ == 0) {
      it->second = objective_row;
      objective_name_ = name.text;
      objective_line_ = line_number;
    } else {
      it->second = dropped_row;
      warn(name.column, "N row " + quoted(name.text) + " dropped with its entries: the first N row " +
                            quoted(objective_name_) + " (line " + std::to_string(objective_line_) +
                            ") is the objective");
    }
    return;
  }
  RowState row;
  row.name = name.text;
  row.type = type.text[0];
  row.line = line_number;
  rows_.push_back(row);
}

PairLine Reader::pair_line(std::string_view line, const FreeTokens& tokens, bool head_required) {
  PairLine out;
  std::string_view section = section_names[static_cast<int>(section_)];
  if (layout_ == Layout::free) {
    int count = tokens.count;
    bool has_head = head_required || count % 2 == 1;
    int pair_tokens = count - (has_head ? 1 : 0);
    if (count > 5 || pair_tokens < 2 || pair_tokens % 2 != 0) {
      std::string expected = head_required
                                 ? "3 or 5 fields: a column name, then one or two (row name, value) pairs"
                                 : "2 to 5 fields: an optional set name, then one or two (row name, value) "
                                   "pairs";
      fail(surplus_column(tokens, 5),
           std::to_string(count) + " fields in a " + std::string(section) + " line", expected);
    }
    // A set name and a row without a value reads as (row, value) with an unknown row: name the slip.
    if (count == 2 && !head_required && find_row(tokens.token[0]) == unknown_row &&
        find_row(tokens.token[1]) != unknown_row)
      fail(tokens.token[1].column, "a set name and row " + quoted(tokens.token[1].text) + " without a value",
           "a value after the row name");
    int k = 0;
    if (has_head) out.head = tokens.token[k++];
    for (; k + 1 < count; k += 2) {
      out.row[out.pairs] = tokens.token[k];
      out.value[out.pairs] = tokens.token[k + 1];
      ++out.pairs;
    }
    return out;
  }
  FixedFields f = fixed_fields(line);
  require_blank(f.field[0], "columns 2-3 blank in a " + std::string(section) + " line");
  out.head = f.field[1];
  if (head_required && !out.head.present()) fail(2, "no column name in columns 5-12", "a column name");
  for (int p = 0; p < 2; ++p) {
    const Token& row = f.field[2 + 2 * p];
    const Token& value = f.field[3 + 2 * p];
    if (!row.present() && !value.present()) {
      if (p == 0) fail(15, "no row name in columns 15-22", "a row name and a value");
      break;
    }
    if (!row.present()) fail(value.column, "a value without a row name", "a row name before the value");
    if (!value.present())
      fail(row.column, "row " + quoted(row.text) + " without a value",
           p == 0 ? "a value in columns 25-36" : "a value in columns 50-61");
    out.row[p] = row;
    out.value[p] = value;
    out.pairs = p + 1;
  }
  return out;
}

int Reader::find_row(const Token& name) const {
  auto it = row_by_name_.find(name.text);
  return it == row_by_name_.end() ? unknown_row : it->second;
}

int Reader::find_column(const Token& name) const {
  auto it = column_by_name_.find(name.text);
  return it == column_by_name_.end() ? -1 : it->second;
}

Rational Reader::number(const Token& text, std::string_view what) const {
  numeric::ParseFailure why;
  auto value = numeric::parse_decimal(text.text, &why);
  if (!value) fail(text.column, quoted(text.text) + " as " + std::string(what), why.reason);
  return std::move(*value);
}

void Reader::read_columns_line(std::string_view line, const FreeTokens& tokens) {
  if (tokens.count == 3 && tokens.token[1].text == "'MARKER'") {
    read_marker(tokens);
    return;
  }
  PairLine entry = pair_line(line, tokens, true);
  long line_number = cursor_.line_number();
  if (current_column_ < 0 || entry.head.text != current_column_name_) {
    auto [it, inserted] = column_by_name_.try_emplace(entry.head.text, static_cast<int>(columns_.size()));
    if (!inserted)
      fail(entry.head.column,
           "column " + quoted(entry.head.text) + " again after other columns (its entries began on line " +
               std::to_string(columns_[it->second].line) + ")",
           "all entries of a column on consecutive lines");
    current_column_ = it->second;
    current_column_name_ = entry.head.text;
    current_objective_entry_line_ = 0;
    columns_.push_back({line_number, 0, 0});
    Column column;
    column.name = std::string(entry.head.text);
    column.integer = integer_run_line_ != 0;
    model_.columns.push_back(std::move(column));
    model_.objective.coefficients.emplace_back(0);
  }
  for (int p = 0; p < entry.pairs; ++p) {
    const Token& row_name = entry.row[p];
    int row = find_row(row_name);
    if (row == unknown_row)
      fail(row_name.column, "unknown row " + quoted(row_name.text), "a row declared in ROWS");
    Rational value = number(entry.value[p], "a coefficient");
    auto what = [&] {
      return "entry for column " + quoted(entry.head.text) + " in row " + quoted(row_name.text);
    };
    if (row == objective_row) {
      claim(current_objective_entry_line_, row_name, what, "one entry per row and column");
      model_.objective.coefficients[current_column_] = std::move(value);
    } else if (row >= 0) {
      RowState& state = rows_[row];
      if (state.last_column != current_column_) state.last_entry_line = 0;
      claim(state.last_entry_line, row_name, what, "one entry per row and column");
      state.last_column = current_column_;
      entries_.push_back({row, current_column_, std::move(value)});
    }
  }
}

void Reader::read_marker(const FreeTokens& tokens) {
  const Token& kind = tokens.token[2];
  if (kind.text == "'INTORG'") {
    if (integer_run_line_ != 0)
      fail(kind.column, "'INTORG' while the marker on line " + std::to_string(integer_run_line_) + " is open",
           "'INTEND' first");
    integer_run_line_ = cursor_.line_number();
  } else if (kind.text == "'INTEND'") {
    if (integer_run_line_ == 0) fail(kind.column, "'INTEND' without an open 'INTORG'", "'INTORG' before it");
    integer_run_line_ = 0;
  } else {
    fail(kind.column, "marker " + quoted(kind.text), "'INTORG' or 'INTEND'");
  }
  current_column_ = -1;  // a column may not continue across a marker
}

void Reader::finish_columns() {
  if (integer_run_line_ != 0)
    fail(1,
         "the end of COLUMNS while the 'INTORG' marker on line " + std::to_string(integer_run_line_) +
             " is open",
         "an 'INTEND' marker");
}

bool Reader::accept_set(std::optional<std::string_view>& chosen, const Token& set, std::string_view section) {
  if (!chosen) chosen = set.text;
  if (*chosen == set.text) return true;
  if (warned_sets_.insert(std::string(section) + " " + std::string(set.text)).second)
    warn(set.column, std::string(section) + " set " + quoted(set.text) + " ignored: only the first set " +
                         quoted(*chosen) + " is read");
  return false;
}

void Reader::read_rhs_or_ranges_line(std::string_view line, const FreeTokens& tokens) {
  bool is_rhs = section_ == Section::rhs;
  PairLine entry = pair_line(line, tokens, false);
  if (!accept_set(is_rhs ? rhs_set_ : range_set_, entry.head, is_rhs ? "RHS" : "RANGES")) return;
  for (int p = 0; p < entry.pairs; ++p) {
    const Token& row_name = entry.row[p];
    int row = find_row(row_name);
    if (row == unknown_row)
      fail(row_name.column, "unknown row " + quoted(row_name.text), "a row declared in ROWS");
    Rational value = number(entry.value[p], is_rhs ? "a right-hand side" : "a range");
    if (!is_rhs) {
      if (row < 0) {
        warn(row_name.column, "RANGES entry on N row " + quoted(row_name.text) + " ignored");
        continue;
      }
      RowState& state = rows_[row];
      claim(
          state.range_line, row_name, [&] { return "RANGES entry for row " + quoted(row_name.text); },
          "one range per row");
      state.range = std::move(value);
      state.range_column = entry.value[p].column;
      continue;
    }
    if (row == dropped_row) continue;
    if (row == objective_row) {
      claim(
          objective_rhs_line_, row_name, [&] { return "RHS entry for row " + quoted(row_name.text); },
          "one right-hand side per row");
      if (rule_ == ObjectiveConstantRule::negated_rhs)
        model_.objective.constant = -value;
      else
        warn(row_name.column, "RHS entry on the objective row " + quoted(row_name.text) +
                                  " left out (objective constant rule: ignored)");
      continue;
    }
    RowState& state = rows_[row];
    claim(
        state.rhs_line, row_name, [&] { return "RHS entry for row " + quoted(row_name.text); },
        "one right-hand side per row");
    state.rhs = std::move(value);
  }
}

// What a bound type does to each side of a column.
enum class SideEffect { keep, value, infinite, zero, one };
struct BoundType {
  std::string_view code;
  SideEffect lower;
  SideEffect upper;
  bool integer;
  bool needs_value;  // BV may still carry a value, which is checked and not used
};
constexpr std::array<BoundType, 9> bound_types{{
    {"UP", SideEffect::keep, SideEffect::value, false, true},
    {"LO", SideEffect::value, SideEffect::keep, false, true},
    {"FX", SideEffect::value, SideEffect::value, false, true},
    {"FR", SideEffect::infinite, SideEffect::infinite, false, false},
    {"MI", SideEffect::infinite, SideEffect::keep, false, false},
    {"PL", SideEffect::keep, SideEffect::infinite, false, false},
    {"BV", SideEffect::zero, SideEffect::one, true, false},
    {"LI", SideEffect::value, SideEffect::keep, true, true},
    {"UI", SideEffect::keep, SideEffect::value, true, true},
}};

const BoundType* find_bound_type(std::string_view code) {
  for (const BoundType& type : bound_types)
    if (type.code == code) return &type;
  return nullptr;
}

BoundLine Reader::bound_line(std::string_view line, const FreeTokens& tokens) {
  BoundLine out;
  out.type = tokens.token[0];
  if (out.type.text == "SC")
    fail(out.type.column, "a semi-continuous bound (SC)",
         "an LP bound type (UP, LO, FX, FR, MI, PL, BV, LI or UI): plumb reads no semi-continuous columns");
  const BoundType* type = find_bound_type(out.type.text);
  if (!type)
    fail(out.type.column, "bound type " + quoted(out.type.text), "UP, LO, FX, FR, MI, PL, BV, LI or UI");
  if (layout_ == Layout::free) {
    int count = tokens.count;
    // BV may carry a value or not; with three fields the third decides: a known column is a name.
    bool has_value = type->needs_value ||
                     (type->code == "BV" && (count == 4 || (count == 3 && find_column(tokens.token[2]) < 0)));
    int base = has_value ? 3 : 2;  // fields without a set name
    if (count != base && count != base + 1)
      fail(surplus_column(tokens, base + 1),
           std::to_string(count) + " fields in a " + std::string(out.type.text) + " bound line",
           has_value ? "3 or 4 fields: the bound type, an optional set name, a column name and a value"
                     : "2 or 3 fields: the bound type, an optional set name and a column name");
    // Likewise a set name and a column without the value the type needs.
    if (type->needs_value && count == 3 && find_column(tokens.token[1]) < 0 &&
        find_column(tokens.token[2]) >= 0)
      fail(tokens.token[2].column,
           "bound " + std::string(out.type.text) + " on column " + quoted(tokens.token[2].text) +
               " without a value",
           "a value after the column name");
    int k = 1;
    if (count == base + 1) out.set = tokens.token[k++];
    out.column = tokens.token[k++];
    if (has_value) out.value = tokens.token[k];
    return out;
  }
  FixedFields f = fixed_fields(line);
  out.type = f.field[0];
  out.set = f.field[1];
  out.column = f.field[2];
  out.value = f.field[3];
  if (!out.column.present()) fail(15, "no column name in columns 15-22", "the column the bound applies to");
  if (type->needs_value && !out.value.present())
    fail(out.column.column, "bound " + std::string(out.type.text) + " without a value",
         "a value in columns 25-36");
  require_blank(f.field[4], "nothing after the value in a BOUNDS line");
  require_blank(f.field[5], "nothing after the value in a BOUNDS line");
  return out;
}

void Reader::read_bounds_line(std::string_view line, const FreeTokens& tokens) {
  BoundLine bound = bound_line(line, tokens);
  if (!accept_set(bound_set_, bound.set, "BOUNDS")) return;
  int j = find_column(bound.column);
  if (j < 0)
    fail(bound.column.column, "unknown column " + quoted(bound.column.text), "a column declared in COLUMNS");
  std::optional<Rational> value;
  if (bound.value.present()) value = number(bound.value, "a bound");
  Column& column = model_.columns[j];
  ColumnState& state = columns_[j];
  auto set_lower = [&](Side side) {
    claim(
        state.lower_line, bound.type, [&] { return "lower bound for column " + quoted(bound.column.text); },
        "one lower bound per column");
    column.lower = std::move(side);
  };
  auto set_upper = [&](Side side) {
    bool lower_is_default = state.lower_line == 0;
    claim(
        state.upper_line, bound.type, [&] { return "upper bound for column " + quoted(bound.column.text); },
        "one upper bound per column");
    // Common practice: a negative upper bound on a column whose lower bound is still the
    // default zero makes the lower bound minus infinity (docs/mps.md).
    if (side && *side < 0 && lower_is_default) {
      column.lower.reset();
      warn(bound.type.column, "column " + quoted(bound.column.text) + " has upper bound " +
                                  std::string(bound.value.text) +
                                  " below zero and no lower bound: lower bound set to minus infinity");
    }
    column.upper = std::move(side);
  };
  const BoundType& type = *find_bound_type(bound.type.text);
  auto side = [&](SideEffect effect) -> Side {
    if (effect == SideEffect::value) return value;
    if (effect == SideEffect::zero) return Rational(0);
    if (effect == SideEffect::one) return Rational(1);
    return std::nullopt;
  };
  if (type.integer) column.integer = true;
  if (type.lower != SideEffect::keep) set_lower(side(type.lower));
  if (type.upper != SideEffect::keep) set_upper(side(type.upper));
}

Model Reader::build() {
  if (!objective_name_.empty()) model_.objective.name = std::string(objective_name_);
  model_.rows.reserve(rows_.size());
  for (RowState& state : rows_) {
    Row row;
    row.name = std::string(state.name);
    const Rational& rhs = state.rhs;
    switch (state.type) {
      case 'L':
        row.upper = rhs;
        if (state.range) row.lower = rhs - abs(*state.range);
        break;
      case 'G':
        row.lower = rhs;
        if (state.range) row.upper = rhs + abs(*state.range);
        break;
      default:  // 'E'
        if (state.range && *state.range > 0) {
          row.lower = rhs;
          row.upper = rhs + *state.range;
        } else if (state.range && *state.range < 0) {
          row.lower = rhs + *state.range;
          row.upper = rhs;
        } else {
          row.lower = rhs;
          row.upper = rhs;
        }
    }
    // The right-hand side and the range each obey the limit on numbers; the side they add up to
    // must too, or the model could not be written so that it reads back.
    for (const Side* side : {&row.lower, &row.upper})
      if (state.range && *side && !numeric::within_limits(**side))
        throw InputError({cursor_.file(), state.range_line, state.range_column},
                         "a range that puts a side of row " + quoted(state.name) + " at " +
                             numeric::to_decimal(**side, 3).text,
                         numeric::limit_phrase());
    model_.rows.push_back(std::move(row));
  }
  model_.matrix = Matrix::from_entries(model_.row_count(), model_.column_count(), std::move(entries_));
  model_.source.format = layout_ == Layout::fixed || agrees_with_fixed_ ? "mps-fixed" : "mps-free";
  if (section_line_[static_cast<int>(Section::objsense)] == 0) model_.source.sense_origin = SenseOrigin::mps_default;
  model_.index_names();
  return std::move(model_);
}

}  // namespace

// Detection: the file is read in free form first.  When that fails, it is read again in fixed
// form; the fixed reading wins if it succeeds, or if it fails on a later line for a reason other
// than the fixed grid itself.  A free reading whose every data line also fits the fixed grid
// with the same fields is labelled "mps-fixed" (both readings are then the same).
Model parse_mps(std::string_view text, const std::string& file, ObjectiveConstantRule rule) {
  try {
    return Reader(text, file, rule, Layout::free).read();
  } catch (const InputError& free_error) {
    try {
      return Reader(text, file, rule, Layout::fixed).read();
    } catch (const GridError&) {
      throw free_error;
    } catch (const InputError& fixed_error) {
      if (fixed_error.where().line > free_error.where().line) throw;
      throw free_error;
    }
  }
}

}  // namespace plumb::model::detail
