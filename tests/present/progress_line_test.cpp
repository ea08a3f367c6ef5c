// The live progress line's text (present::progress_line): its estimates in the numbers' one text
// form (numeric::to_display), its cells padded so that redrawn lines keep their columns.
#include "plumb/present/solve.hpp"

#include <gtest/gtest.h>

#include <limits>

namespace plumb::present {
namespace {

TEST(ProgressLine, EstimatesInTheOneNumberFormAtFixedColumns) {
  // Constructed: 0.25 and 1.5 are exact in binary, 1/3 is not.
  exact::Progress exact_halves{"float dual", 42, 1.5, 0.25, 3.0};
  std::string line = progress_line(exact_halves);
  EXPECT_EQ(
      line,
      "  float dual                  42 it  objective 1.5             infeasibility 0.25           3.0 s");
  exact::Progress third{"float dual", 1042, 1.0 / 3, 0, 12.25};
  std::string other = progress_line(third);
  EXPECT_NE(other.find("objective ~0.33333333 "), std::string::npos) << other;
  EXPECT_EQ(other.size(), line.size());
}

TEST(ProgressLine, NoEstimatesBeforeTheFirstPivot) {
  double nothing_yet = std::numeric_limits<double>::quiet_NaN();
  std::string line = progress_line({"exact certify", 0, nothing_yet, nothing_yet, 0.5});
  EXPECT_EQ(line.find("objective"), std::string::npos) << line;
  EXPECT_EQ(line.size(), progress_line({"exact certify", 0, 1, 1, 0.5}).size());
}

}  // namespace
}  // namespace plumb::present
