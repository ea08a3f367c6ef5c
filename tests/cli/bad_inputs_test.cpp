// Every malformed file in tests/data/bad/ is refused cleanly by `plumb inspect`: exit status 1,
// nothing on stdout, one line on stderr naming the file and what was expected.  Source: the
// project's input-error rule (one message "file:line:col: found X, expected Y", exit 1).
#include "support/run.hpp"

#include <gtest/gtest.h>

#include <algorithm>
#include <filesystem>

namespace fs = std::filesystem;
using plumb::test::lines_of;
using plumb::test::run;

namespace {

// Labels sidecars need a model beside them; their own tests cover them.
bool is_labels_file(const fs::path& path) { return path.filename().string().ends_with(".labels.csv"); }

}  // namespace

TEST(CliBadInputs, InspectRefusesEachWithOneLine) {
  const fs::path folder = fs::path(PLUMB_TEST_DATA_DIR) / "bad";
  if (!fs::is_directory(folder)) GTEST_SKIP() << "no folder " << folder << " of malformed inputs yet";
  std::vector<fs::path> files;
  for (const auto& entry : fs::directory_iterator(folder))
    if (entry.is_regular_file() && !is_labels_file(entry.path())) files.push_back(entry.path());
  std::sort(files.begin(), files.end());
  if (files.empty()) GTEST_SKIP() << "no malformed inputs in " << folder << " yet";
  for (const auto& file : files) {
    SCOPED_TRACE(file.string());
    auto result = run(PLUMB_EXECUTABLE, {"inspect", file.string()});
    EXPECT_FALSE(result.timed_out);
    EXPECT_EQ(result.status, 1);
    EXPECT_TRUE(result.out.empty()) << result.out.substr(0, 200);
    auto lines = lines_of(result.err);
    ASSERT_EQ(lines.size(), 1u) << result.err.substr(0, 400);
    EXPECT_NE(lines[0].find(file.filename().string()), std::string::npos) << lines[0];
    EXPECT_NE(lines[0].find("expected"), std::string::npos) << lines[0];
  }
}
