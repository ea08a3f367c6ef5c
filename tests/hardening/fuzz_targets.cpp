#include "hardening/fuzz_targets.hpp"

#include "plumb/certificate/basis.hpp"
#include "plumb/certificate/certificate.hpp"
#include "plumb/check/check.hpp"
#include "plumb/model/labels.hpp"
#include "plumb/model/read.hpp"
#include "plumb/model/write.hpp"
#include "plumb/numeric/rational.hpp"

#include <zlib.h>

#include <algorithm>
#include <filesystem>
#include <fstream>
#include <map>
#include <optional>
#include <sstream>
#include <unistd.h>

namespace plumb::hardening {
namespace {

using model::Format;
using model::InputError;
using model::Model;
using numeric::Rational;

void require(bool condition, const std::string& what) {
  if (!condition) throw FuzzFinding(what);
}

// What every model a reader accepts must satisfy, whatever the text was.
void check_model_shape(const Model& m) {
  require(m.matrix.rows() == m.row_count(), "matrix rows differ from the row list");
  require(m.matrix.columns() == m.column_count(), "matrix columns differ from the column list");
  require(static_cast<int>(m.objective.coefficients.size()) == m.column_count(),
          "objective has not one coefficient per column");
  for (int i = 0; i < m.row_count(); ++i)
    require(m.find_row(m.rows[i].name) == i, "find_row does not find row " + m.rows[i].name);
  for (int j = 0; j < m.column_count(); ++j)
    require(m.find_column(m.columns[j].name) == j, "find_column does not find column " + m.columns[j].name);
  std::size_t by_rows = 0;
  for (int i = 0; i < m.row_count(); ++i) {
    auto columns = m.matrix.row_columns(i);
    auto positions = m.matrix.row_positions(i);
    require(columns.size() == positions.size(), "row index and positions differ in length");
    for (std::size_t k = 0; k < columns.size(); ++k) {
      require(columns[k] >= 0 && columns[k] < m.column_count(), "row index names a column out of range");
      require(k == 0 || columns[k - 1] < columns[k], "row index not strictly ascending");
      require(m.matrix.value(positions[k]) != 0, "an explicit zero is stored");
      require(m.matrix.at(i, columns[k]) == m.matrix.value(positions[k]), "row and column views disagree");
    }
    by_rows += columns.size();
  }
  std::size_t by_columns = 0;
  for (int j = 0; j < m.column_count(); ++j) {
    auto rows = m.matrix.column_rows(j);
    require(rows.size() == m.matrix.column_values(j).size(), "column rows and values differ in length");
    for (std::size_t k = 0; k < rows.size(); ++k) {
      require(rows[k] >= 0 && rows[k] < m.row_count(), "column names a row out of range");
      require(k == 0 || rows[k - 1] < rows[k], "column rows not strictly ascending");
    }
    by_columns += rows.size();
  }
  require(by_rows == m.matrix.nonzeros() && by_columns == m.matrix.nonzeros(),
          "row and column views count different nonzeros");
}

model::ReadOptions options_for(Format format) {
  model::ReadOptions options;
  options.format = format;
  options.find_labels_beside = false;
  return options;
}

// The outcome of reading: a model, or the InputError message.
struct Outcome {
  std::optional<Model> model;
  std::string error;
};

template <class Read>
Outcome attempt(Read read) {
  try {
    return {read(), {}};
  } catch (const InputError& e) {
    return {std::nullopt, e.what()};
  }
}

std::string gzip(std::string_view bytes) {
  z_stream stream{};
  if (deflateInit2(&stream, Z_BEST_SPEED, Z_DEFLATED, 16 + MAX_WBITS, 8, Z_DEFAULT_STRATEGY) != Z_OK)
    throw std::runtime_error("deflateInit2 failed");
  std::string out(deflateBound(&stream, bytes.size()), '\0');
  stream.next_in = reinterpret_cast<Bytef*>(const_cast<char*>(bytes.data()));
  stream.avail_in = static_cast<uInt>(bytes.size());
  stream.next_out = reinterpret_cast<Bytef*>(out.data());
  stream.avail_out = static_cast<uInt>(out.size());
  int status = deflate(&stream, Z_FINISH);
  out.resize(stream.total_out);
  deflateEnd(&stream);
  if (status != Z_STREAM_END) throw std::runtime_error("deflate did not finish");
  return out;
}

// One scratch file per process, removed when the process ends normally.
struct ScratchFile {
  std::filesystem::path path = std::filesystem::temp_directory_path() /
                               ("plumb-fuzz-" + std::to_string(getpid()) + ".mps");
  ~ScratchFile() {
    std::error_code ignored;
    std::filesystem::remove(path, ignored);
  }
  void write(std::string_view bytes) const {
    std::ofstream out(path, std::ios::binary | std::ios::trunc);
    out.write(bytes.data(), static_cast<std::streamsize>(bytes.size()));
    if (!out) throw std::runtime_error("cannot write " + path.string());
  }
};

// V. Chvatal, Linear Programming (1983), ch. 2, the first worked example, built in code (so no
// file hash to match): the certificates in tests/data/check/ and the bases in tests/data/solve/
// are for it.
const Model& chvatal() {
  static const Model model = model::ModelBuilder("CHVATAL21")
                                 .maximise()
                                 .column("x1", Rational(5)).column("x2", Rational(4)).column("x3", Rational(3))
                                 .row("c1", {{"x1", Rational(2)}, {"x2", Rational(3)}, {"x3", Rational(1)}}, {}, Rational(5))
                                 .row("c2", {{"x1", Rational(4)}, {"x2", Rational(1)}, {"x3", Rational(2)}}, {}, Rational(11))
                                 .row("c3", {{"x1", Rational(3)}, {"x2", Rational(4)}, {"x3", Rational(2)}}, {}, Rational(8))
                                 .build();
  return model;
}

}  // namespace

void fuzz_numbers(std::string_view input) {
  using namespace numeric;
  ParseFailure why;
  auto decimal = parse_decimal(input, &why);
  require(decimal || !why.reason.empty(), "parse_decimal refused without a reason");
  auto number = parse_number(input, &why);
  require(number || !why.reason.empty(), "parse_number refused without a reason");
  if (decimal) require(number && *number == *decimal, "parse_number disagrees with parse_decimal");
  if (number) {
    std::string fraction = to_fraction(*number);
    auto canonical = parse_canonical_fraction(fraction, fraction.size(), &why);
    require(canonical && *canonical == *number, "to_fraction text does not read back canonically");
    auto again = parse_number(fraction);
    require(again && *again == *number, "to_fraction text does not read back through parse_number");
    // Exact display text reads back as the value; rounded text (whose exponent may pass the
    // reader's limit when the value has many digits) is within 12 significant digits of it.
    Decimal shown = to_decimal(*number);
    auto read_back = parse_decimal(shown.text);
    if (!shown.rounded)
      require(read_back && *read_back == *number, "to_decimal text \"" + shown.text + "\" claims exact but is not");
    static const Rational relative_tolerance = *parse_decimal("1e-11");
    if (read_back)
      require(abs(*read_back - *number) <= relative_tolerance * abs(*number),
              "to_decimal text \"" + shown.text + "\" is off by more than 1e-11 relative");
  }
  auto canonical = parse_canonical_fraction(input, 1000, &why);
  if (canonical) require(to_fraction(*canonical) == input, "accepted a non-canonical fraction");
}

void fuzz_mps(std::string_view input) {
  Outcome read = attempt([&] { return model::read_model_text(input, "fuzz.mps", options_for(Format::mps)); });
  if (!read.model) return;
  check_model_shape(*read.model);
  // Whatever the writer can state (free MPS has no blanks in names, for one) must read back.
  std::ostringstream written;
  try {
    model::write_mps(*read.model, written);
  } catch (const std::runtime_error& refused) {
    require(std::string_view(refused.what()).starts_with("cannot write MPS: "), refused.what());
    return;
  }
  Outcome again = attempt([&] { return model::read_model_text(written.str(), "rewritten.mps", options_for(Format::mps)); });
  require(again.model.has_value(), "written MPS does not read back: " + again.error);
  require(again.model->same_content(*read.model), "MPS does not round-trip");
}

void fuzz_mps_file(std::string_view input) {
  if (input.empty()) return;
  static const ScratchFile scratch;
  // The first byte picks how the rest reaches the file: as raw bytes (a corrupt .gz, often),
  // gzip-compressed in one member, in two members, or compressed with trailing bytes.
  std::string_view body = input.substr(1);
  switch (input[0] & 3) {
    case 0: scratch.write(body); break;
    case 1: scratch.write(gzip(body)); break;
    case 2: scratch.write(gzip(body.substr(0, body.size() / 2)) + gzip(body.substr(body.size() / 2))); break;
    default: scratch.write(gzip(body) + std::string(body)); break;
  }
  const std::string path = scratch.path.string();
  Outcome from_file = attempt([&] { return model::read_model(path, options_for(Format::mps)); });
  if (from_file.model) check_model_shape(*from_file.model);
  if ((input[0] & 3) == 1 || (input[0] & 3) == 2) {  // compression must be invisible
    Outcome from_text = attempt([&] { return model::read_model_text(body, path, options_for(Format::mps)); });
    require(from_file.model.has_value() == from_text.model.has_value(), "gzip changed whether the model reads");
    if (from_file.model) require(from_file.model->same_content(*from_text.model), "gzip changed the model read");
    else require(from_file.error == from_text.error, "gzip changed the message: " + from_file.error);
  }
}

void fuzz_native(std::string_view input) {
  Outcome read =
      attempt([&] { return model::read_model_text(input, "fuzz.plumb", options_for(Format::native)); });
  if (!read.model) return;
  check_model_shape(*read.model);
  std::ostringstream written;
  model::write_native(*read.model, written);
  Outcome again = attempt(
      [&] { return model::read_model_text(written.str(), "rewritten.plumb", options_for(Format::native)); });
  require(again.model.has_value(), "written native text does not read back: " + again.error);
  require(again.model->same_content(*read.model), "native text does not round-trip");
}

void fuzz_labels(std::string_view input) {
  // A small fixed model (invented) for the labels to name: two columns, two rows.
  static const Model base = model::ModelBuilder("labels-target")
                                .column("crude", Rational(3))
                                .column("naphtha", Rational(-1), Rational(0), Rational(40))
                                .row("benzene", {{"crude", Rational(1, 100)}, {"naphtha", Rational(2)}}, {}, Rational(5))
                                .row("capacity", {{"crude", Rational(1)}, {"naphtha", Rational(1)}}, Rational(1), Rational(100))
                                .build();
  Model labelled = base;
  try {
    model::apply_labels_text(labelled, input, "fuzz.labels.csv");
  } catch (const InputError&) {
    return;
  }
  require(labelled.row_count() == base.row_count() && labelled.column_count() == base.column_count(),
          "labels changed the model's size");
  require(labelled.matrix == base.matrix && labelled.objective.coefficients == base.objective.coefficients,
          "labels changed the model's numbers");
  check_model_shape(labelled);
}

void fuzz_certificate(std::string_view input) {
  const Model& model = chvatal();
  std::optional<certificate::Certificate> read;
  try {
    read = certificate::parse_certificate(input, "fuzz.certificate.json");
  } catch (const InputError&) {
    return;
  }
  check::Verdict verdict = check::verify(model, *read);
  require(verdict.valid ? !verdict.proven.empty() : !verdict.failure.empty(), "a verdict without its sentence");
  // What the reader accepts, the writer writes back to text that reads as the same certificate.
  std::string text = certificate::to_json_text(*read);
  certificate::Certificate again = certificate::parse_certificate(text, "rewritten.certificate.json");
  require(certificate::to_json_text(again) == text, "certificate text does not round-trip");
  require(check::verify(model, again).valid == verdict.valid, "rewriting changed the verdict");
}

void fuzz_basis(std::string_view input) {
  std::optional<certificate::BasisFile> read;
  try {
    read = certificate::parse_basis(input, "fuzz.basis.json", chvatal());
  } catch (const InputError&) {
    return;
  }
  const Model& m = chvatal();
  require(read->basis.columns.size() == static_cast<std::size_t>(m.column_count()) &&
              read->basis.rows.size() == static_cast<std::size_t>(m.row_count()),
          "a read basis without one status per column and row");
  long basic = 0;
  for (const auto* statuses : {&read->basis.columns, &read->basis.rows})
    basic += std::count(statuses->begin(), statuses->end(), simplex::VarStatus::basic);
  require(basic == read->basic_count, "basic_count differs from the basic statuses");
  // What the reader accepts, the writer writes back to a file that reads as the same basis.
  std::string text = certificate::to_basis_text(m, read->basis);
  certificate::BasisFile again = certificate::parse_basis(text, "rewritten.basis.json", m);
  require(again.basis.columns == read->basis.columns && again.basis.rows == read->basis.rows,
          "basis file does not round-trip");
  require(certificate::to_basis_text(m, again.basis) == text, "basis text does not round-trip");
}

FuzzTarget fuzz_target(const std::string& name) {
  static const std::map<std::string, FuzzTarget> targets{
      {"numbers", fuzz_numbers}, {"mps", fuzz_mps},       {"mps_file", fuzz_mps_file},
      {"native", fuzz_native},   {"labels", fuzz_labels},   {"certificate", fuzz_certificate},
      {"basis", fuzz_basis},
  };
  auto found = targets.find(name);
  return found == targets.end() ? nullptr : found->second;
}

}  // namespace plumb::hardening
