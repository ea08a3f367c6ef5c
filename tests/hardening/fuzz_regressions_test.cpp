// Replays every input the fuzzers ever found (tests/data/fuzz-regressions/TARGET/*) through the
// same target body, so a fixed finding stays fixed in the ordinary unit build.
#include "hardening/fuzz_targets.hpp"

#include <gtest/gtest.h>

#include <filesystem>
#include <fstream>
#include <iterator>

namespace plumb::hardening {
namespace {

namespace fs = std::filesystem;

std::string bytes_of(const fs::path& path) {
  std::ifstream in(path, std::ios::binary);
  return {std::istreambuf_iterator<char>(in), std::istreambuf_iterator<char>()};
}

TEST(FuzzRegressions, EveryFoundInputEndsInAModelOrAnInputError) {
  const fs::path root = fs::path(PLUMB_TEST_DATA_DIR) / "fuzz-regressions";
  ASSERT_TRUE(fs::is_directory(root)) << root;
  int replayed = 0;
  for (const auto& folder : fs::directory_iterator(root)) {
    if (!folder.is_directory()) continue;
    const std::string name = folder.path().filename().string();
    FuzzTarget target = fuzz_target(name);
    ASSERT_NE(target, nullptr) << "no fuzz target named " << name;
    for (const auto& file : fs::directory_iterator(folder.path())) {
      try {
        target(bytes_of(file.path()));
      } catch (const std::exception& e) {
        ADD_FAILURE() << file.path() << ": " << e.what();
      }
      ++replayed;
    }
  }
  RecordProperty("replayed", replayed);
}

}  // namespace
}  // namespace plumb::hardening
