// The basis fuzz target's body run over the project's own basis files (its seeds), so the
// round-trip properties it checks hold in the ordinary unit build too.
#include "hardening/fuzz_targets.hpp"

#include <gtest/gtest.h>

#include <filesystem>
#include <fstream>
#include <iterator>

namespace plumb::hardening {
namespace {

namespace fs = std::filesystem;

TEST(BasisSeeds, EveryProjectBasisFileReadsBackOrIsRefusedCleanly) {
  int replayed = 0;
  for (const auto& entry : fs::recursive_directory_iterator(PLUMB_TEST_DATA_DIR)) {
    if (!entry.is_regular_file() || !entry.path().string().ends_with(".basis.json")) continue;
    std::ifstream in(entry.path(), std::ios::binary);
    std::string text{std::istreambuf_iterator<char>(in), std::istreambuf_iterator<char>()};
    EXPECT_NO_THROW(fuzz_basis(text)) << entry.path();
    ++replayed;
  }
  EXPECT_GE(replayed, 9);
}

}  // namespace
}  // namespace plumb::hardening
