// The model: an LP exactly as written, with names and plain-language labels, stored sparse.
#pragma once

#include "plumb/model/error.hpp"
#include "plumb/numeric/rational.hpp"

#include <optional>
#include <span>
#include <string>
#include <string_view>
#include <unordered_map>
#include <vector>

namespace plumb::model {

using numeric::Rational;

// A side of a row or a bound of a column; empty means infinite in its direction.
using Side = std::optional<Rational>;

// What the model's owner says about a row, column or bound, in their own words.
struct Label {
  std::string statement;      // e.g. "benzene stays at or below 0.62 % by volume"
  std::string unit;           // e.g. "bbl"
  std::string group;          // e.g. "regulatory", "contract"
  std::optional<bool> hard;   // hard limit (law, physics) or soft (a wish); unknown when empty
  // Why it is written so, for whoever signs the model off (docs/model-format.md, "Decisions"):
  std::string decision{};       // what was decided, assumed or simplified, e.g. "octane blends linearly"
  std::string source{};       // where a limit's value comes from: document and clause, contract, measurement
  std::string owner{};        // the role that answers for it, e.g. "blending engineer"
  // What relaxing it by one unit costs in plumb explain's least total change (> 0); 1 when empty.
  std::optional<Rational> weight{};
  bool empty() const {
    return statement.empty() && unit.empty() && group.empty() && !hard && !recorded() && !weight;
  }
  // True when a decision, source or owner is recorded.
  bool recorded() const { return !decision.empty() || !source.empty() || !owner.empty(); }
  bool operator==(const Label&) const = default;
};

// A decision about the model as a whole, with where it comes from and who answers for it.
struct ModelDecision {
  std::string decision;
  std::string source;
  std::string owner;
  bool operator==(const ModelDecision&) const = default;
};

// lower <= a.x <= upper; lower == upper for an equation.
struct Row {
  std::string name;
  Side lower;
  Side upper;
  Label label;
  bool operator==(const Row&) const = default;
};

struct Column {
  std::string name;
  Side lower = Rational(0);
  Side upper;
  bool integer = false;  // recorded from the file; plumb analyses the LP relaxation
  Label label;
  Label lower_label;     // statement attached to the lower bound on its own
  Label upper_label;
  bool operator==(const Column&) const = default;
};

enum class Sense { minimise, maximise };

// How an MPS RHS entry on the objective row was turned into the objective constant.
enum class ObjectiveConstantRule {
  negated_rhs,  // constant = -value: the convention most MPS documentation states (the default)
  ignored,      // the entry is left out, as the Netlib readme's published optima do
};

struct Objective {
  std::string name = "objective";
  Sense sense = Sense::minimise;
  Rational constant = 0;
  std::vector<Rational> coefficients;  // one per column, dense: objectives are short
  Label label;
  bool operator==(const Objective&) const = default;
};

// One matrix entry, as readers collect them.
struct Entry {
  int row;
  int column;
  Rational value;
};

// Sparse matrix held column-wise, with a row-wise index into the same values.
// Explicit zeros are dropped on construction.
class Matrix {
 public:
  Matrix() = default;
  // Entries need not be sorted; a (row, column) pair must appear at most once.
  static Matrix from_entries(int rows, int columns, std::vector<Entry> entries);

  int rows() const { return rows_; }
  int columns() const { return columns_; }
  std::size_t nonzeros() const { return values_.size(); }

  // Column j: rows and values of its entries, rows ascending.
  std::span<const int> column_rows(int j) const;
  std::span<const Rational> column_values(int j) const;
  // Row i: columns ascending, and positions into value(position).
  std::span<const int> row_columns(int i) const;
  std::span<const std::size_t> row_positions(int i) const;
  const Rational& value(std::size_t position) const { return values_[position]; }
  // The entry at (i, j), or zero.
  Rational at(int i, int j) const;

  bool operator==(const Matrix& other) const;

 private:
  int rows_ = 0;
  int columns_ = 0;
  std::vector<std::size_t> column_start_{0};
  std::vector<int> row_index_;
  std::vector<Rational> values_;
  std::vector<std::size_t> row_start_{0};
  std::vector<int> column_index_;
  std::vector<std::size_t> row_position_;
};

// Where the objective sense came from.
enum class SenseOrigin {
  stated,       // an OBJSENSE section, or the native format's minimise/maximise
  mps_default,  // an MPS file without OBJSENSE: minimise, as the format's convention has it
  option,       // --objective-sense on the command line
};

// A comment line before NAME that states an objective sense, as some modelling layers write instead
// of an OBJSENSE section.  Recorded to warn about; it never sets the sense by itself.
struct SenseComment {
  long line = 0;
  Sense stated = Sense::maximise;
  std::string text;
};

// Where the model came from: shown in every output and written into certificates.
struct Source {
  std::string path;    // as the user gave it
  std::string sha256;  // of the file's bytes as stored on disk (compressed if .gz)
  std::string format;  // "mps-fixed", "mps-free", "plumb", or "built" for models made in code
  ObjectiveConstantRule constant_rule = ObjectiveConstantRule::negated_rhs;
  std::string labels_path;  // the labels sidecar applied, if any
  SenseOrigin sense_origin = SenseOrigin::stated;
  std::optional<SenseComment> sense_comment;
};

struct Model {
  std::string title;
  std::vector<Row> rows;
  std::vector<Column> columns;
  Objective objective;
  Matrix matrix;
  std::vector<ModelDecision> decisions;  // in the order written
  Source source;
  std::vector<Warning> warnings;

  int row_count() const { return static_cast<int>(rows.size()); }
  int column_count() const { return static_cast<int>(columns.size()); }
  bool has_integers() const;

  // The one name lookup; call index_names() after changing names.
  void index_names();
  std::optional<int> find_row(std::string_view name) const;
  std::optional<int> find_column(std::string_view name) const;

  // Value of the objective as the model states it (sense as written, constant included).
  Rational objective_value(const std::vector<Rational>& x) const;

  // The same model, content only (names, numbers, labels, decisions, title); source and warnings ignored.
  bool same_content(const Model& other) const;

 private:
  std::unordered_map<std::string, int> row_by_name_;
  std::unordered_map<std::string, int> column_by_name_;
};

// Builds a model in code (tests, examples, sub-models): columns first, then rows by name.
class ModelBuilder {
 public:
  explicit ModelBuilder(std::string title = "");
  ModelBuilder& minimise();
  ModelBuilder& maximise();
  ModelBuilder& objective_constant(Rational constant);
  // Adds a column with its objective coefficient and bounds.
  ModelBuilder& column(std::string name, Rational cost, Side lower = Rational(0), Side upper = {});
  // Adds a row lower <= sum coefficient*column <= upper, terms naming columns already added.
  ModelBuilder& row(std::string name, std::vector<std::pair<std::string, Rational>> terms, Side lower,
                    Side upper);
  Model build();

 private:
  Model model_;
  std::vector<Entry> entries_;
  std::unordered_map<std::string, int> column_by_name_;
};

}  // namespace plumb::model
