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

// Labels sidecars and basis files need a model beside them; their own tests cover them.
bool is_labels_file(const fs::path& path) { return path.filename().string().ends_with(".labels.csv"); }
bool is_basis_file(const fs::path& path) { return path.filename().string().ends_with(".basis.json"); }

void expect_one_located_line(const plumb::test::RunResult& result, const fs::path& file) {
  EXPECT_FALSE(result.timed_out);
  EXPECT_EQ(result.status, 1);
  EXPECT_TRUE(result.out.empty()) << result.out.substr(0, 200);
  auto lines = lines_of(result.err);
  ASSERT_EQ(lines.size(), 1u) << result.err.substr(0, 400);
  EXPECT_NE(lines[0].find(file.filename().string()), std::string::npos) << lines[0];
  EXPECT_NE(lines[0].find("expected"), std::string::npos) << lines[0];
}

std::vector<fs::path> bad_files(bool (*wanted)(const fs::path&)) {
  const fs::path folder = fs::path(PLUMB_TEST_DATA_DIR) / "bad";
  std::vector<fs::path> files;
  if (fs::is_directory(folder))
    for (const auto& entry : fs::directory_iterator(folder))
      if (entry.is_regular_file() && wanted(entry.path())) files.push_back(entry.path());
  std::sort(files.begin(), files.end());
  return files;
}

}  // namespace

TEST(CliBadInputs, InspectRefusesEachWithOneLine) {
  auto files = bad_files([](const fs::path& path) { return !is_labels_file(path) && !is_basis_file(path); });
  if (files.empty()) GTEST_SKIP() << "no malformed inputs in tests/data/bad yet";
  for (const auto& file : files) {
    SCOPED_TRACE(file.string());
    expect_one_located_line(run(PLUMB_EXECUTABLE, {"inspect", file.string()}), file);
  }
}

// The bad basis files are start bases for Chvatal's chapter 2 example (tests/data/check/).
TEST(CliBadInputs, SolveRefusesEachBadStartBasisWithOneLine) {
  auto files = bad_files(is_basis_file);
  ASSERT_FALSE(files.empty());
  const std::string model = std::string(PLUMB_TEST_DATA_DIR) + "/check/chvatal-2.1.mps";
  for (const auto& file : files) {
    SCOPED_TRACE(file.string());
    expect_one_located_line(run(PLUMB_EXECUTABLE, {"solve", model, "--from-basis", file.string()}), file);
  }
  expect_one_located_line(run(PLUMB_EXECUTABLE, {"solve", model, "--from-basis", "/nonexistent/start.basis.json"}),
                          "start.basis.json");
}
