// Every malformed MPS file in tests/data/bad/ gives one InputError naming the file, the line and
// the defect.  The files are invented, one defect each, named after it.
#include "expect_input_error.hpp"
#include "plumb/model/read.hpp"

#include <gtest/gtest.h>

#include <filesystem>
#include <fstream>
#include <set>

namespace fs = std::filesystem;
using plumb::model::InputError;

namespace {

const fs::path bad_dir = fs::path(PLUMB_TEST_DATA_DIR) / "bad";

// Conventions: MPS format rules as commonly practised, and plumb's own refusals (docs/mps.md).
const plumb::test::BadInput bad_files[] = {
    {"bad-number.mps", 9, 28, "found \"1.2.3\" as a coefficient, expected a number"},
    {"bad-objsense.mps", 4, 5, "objective sense \"UPWARDS\""},
    {"binary-garbage.mps", 4, 1, "control byte 0x00"},
    {"bound-missing-value.mps", 14, 15, "bound UP on column \"X1\" without a value"},
    {"column-not-contiguous.mps", 11, 5,
     "column \"X1\" again after other columns (its entries began on line 8)"},
    {"columns-before-rows.mps", 3, 1, "COLUMNS before any ROWS section"},
    {"comma-decimal.mps", 14, 28, "\"4,5\" as a bound"},
    {"comments-only.mps", 0, 0, "an empty file"},
    {"corrupt-gzip.mps", 0, 0, "corrupt gzip stream"},
    {"data-before-section.mps", 1, 2, "a data line before any section"},
    {"data-in-name-section.mps", 3, 5, "a data line in the NAME section"},
    {"duplicate-entry.mps", 11, 15, "a second entry for column \"X2\" in row \"LIM1\" (first on line 10)"},
    {"duplicate-objective-name.mps", 7, 5, "a second row named \"COST\" (first on line 4)"},
    {"duplicate-range-entry.mps", 15, 15, "a second RANGES entry for row \"LIM2\" (first on line 14)"},
    {"duplicate-rhs-entry.mps", 13, 15, "a second RHS entry for row \"LIM1\" (first on line 12)"},
    {"duplicate-row-name.mps", 7, 5, "a second row named \"LIM1\" (first on line 5)"},
    {"duplicate-upper-bound.mps", 15, 2, "a second upper bound for column \"X1\" (first on line 14)"},
    {"empty-file.mps", 0, 0, "an empty file"},
    {"extra-text-on-section-line.mps", 11, 6, "\"EXTRA\" after RHS"},
    {"hex-number.mps", 14, 28, "\"0x10\" as a range"},
    {"huge-exponent.mps", 14, 28, "\"1e99999999\" as a bound, expected an exponent of at most"},
    {"range-side-beyond-limit.mps", 11, 28,
     "a range that puts a side of row \"LIM\" at 1.8e+100000, expected an exponent of at most"},
    {"infinite-value.mps", 12, 28, "\"Infinity\" as a right-hand side"},
    {"intend-without-intorg.mps", 10, 40, "'INTEND' without an open 'INTORG'"},
    {"marker-not-closed.mps", 12, 1, "'INTORG' marker on line 10 is open"},
    {"missing-rhs-value.mps", 12, 15, "row \"LIM1\" without a value"},
    {"nan-value.mps", 10, 28, "\"nan\" as a coefficient"},
    {"objsense-without-sense.mps", 4, 1, "expected MIN or MAX on the line after OBJSENSE"},
    {"ranges-on-unknown-row.mps", 14, 15, "unknown row \"LIM5\""},
    {"repeated-section.mps", 13, 1, "a second RHS section (first on line 11)"},
    {"rhs-on-unknown-row.mps", 12, 34, "unknown row \"LIM3\""},
    {"sections-out-of-order.mps", 13, 1, "RHS after BOUNDS"},
    {"semi-continuous-bound.mps", 14, 2, "semi-continuous bound (SC)"},
    {"text-after-endata.mps", 16, 1, "text after ENDATA"},
    {"too-few-fields-in-columns.mps", 9, 5, "2 fields in a COLUMNS line"},
    {"too-many-fields-in-rows.mps", 6, 11, "3 fields in a ROWS line"},
    {"truncated-mid-columns.mps", 10, 0,
     "the end of the file in the COLUMNS section, expected an ENDATA line"},
    {"truncated-no-endata.mps", 14, 0, "the end of the file in the BOUNDS section, expected an ENDATA line"},
    {"unknown-bound-type.mps", 14, 2, "bound type \"XX\""},
    {"unknown-column-in-bounds.mps", 14, 15, "unknown column \"X7\""},
    {"unknown-marker.mps", 10, 40, "marker \"'SOS1'\""},
    {"unknown-row-in-columns.mps", 9, 15, "unknown row \"LIM9\""},
    {"unknown-row-type.mps", 6, 2, "row type \"X\""},
    {"unknown-section.mps", 11, 1, "an unknown section \"OBJECTIVE\""},
};

void expect_input_error(const fs::path& path, const plumb::test::BadInput& bad) {
  try {
    plumb::model::read_model(path.string());
    ADD_FAILURE() << path << " was read without error";
  } catch (const InputError& e) {
    plumb::test::expect_error_at(e, path.string(), bad);
    EXPECT_NE(std::string(e.what()).find(path.filename().string()), std::string::npos) << e.what();
  }
}

}  // namespace

TEST(MpsErrors, EveryBadFileGivesOneLocatedError) {
  for (const plumb::test::BadInput& bad : bad_files) expect_input_error(bad_dir / bad.input, bad);
}

// The table and the folder's .mps files agree: no bad MPS file goes untested, none is missing.
TEST(MpsErrors, TableCoversTheFolder) {
  std::set<std::string> listed, present;
  for (const plumb::test::BadInput& bad : bad_files) listed.insert(bad.input);
  for (const auto& entry : fs::directory_iterator(bad_dir))
    if (entry.path().extension() == ".mps") present.insert(entry.path().filename().string());
  EXPECT_EQ(listed, present);
  EXPECT_GE(present.size(), 30u);
}

// Over-long lines are made at test time in a temporary folder: they do not belong in the tree.
TEST(MpsErrors, OverLongLine) {
  fs::path folder = fs::temp_directory_path() /
                    ("plumb-mps-errors-" + std::to_string(::testing::UnitTest::GetInstance()->random_seed()));
  fs::create_directories(folder);
  fs::path file = folder / "over-long-line.mps";
  {
    std::ofstream out(file);
    out << "NAME          LONG\nROWS\n N  COST\n L  " << std::string(100000, 'R') << "\nENDATA\n";
  }
  expect_input_error(file, {"over-long-line.mps", 4, 0, "a line of 100004 characters"});
  fs::remove_all(folder);
}
