// Test helper: finding the shared Netlib data, skipping without it (failing when CI=true).
#pragma once

#include <gtest/gtest.h>

#include <algorithm>
#include <cstdlib>
#include <filesystem>
#include <string>
#include <vector>

namespace plumb::test {

inline const std::filesystem::path shared_dir{PLUMB_SHARED_DIR};

// True when the folder is there; otherwise records a failure under CI=true and returns false,
// so the caller skips.
inline bool shared_folder_present(const std::filesystem::path& folder) {
  if (std::filesystem::is_directory(folder)) return true;
  const char* ci = std::getenv("CI");
  if (ci && std::string(ci) == "true") ADD_FAILURE() << "shared data folder " << folder << " is missing (CI=true)";
  return false;
}

// The .mps.gz files of a folder, sorted by name.
inline std::vector<std::filesystem::path> compressed_mps_files(const std::filesystem::path& folder) {
  std::vector<std::filesystem::path> files;
  for (const auto& entry : std::filesystem::directory_iterator(folder))
    if (entry.path().string().ends_with(".mps.gz")) files.push_back(entry.path());
  std::sort(files.begin(), files.end());
  return files;
}

}  // namespace plumb::test
