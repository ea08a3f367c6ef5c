// Netlib instances through the native format: MPS -> .plumb -> the same model -> MPS again.
#include "plumb/model/read.hpp"
#include "plumb/model/write.hpp"
#include "shared_data.hpp"

#include <gtest/gtest.h>

#include <sstream>

namespace {

namespace fs = std::filesystem;
using plumb::model::Model;

// Source: the Netlib lp/data and lp/infeas collections (../shared/README.md). Their names and
// numbers are whatever MPS allows, so they test that any MPS model converts losslessly. Files
// above 100 KB compressed are left out to keep the run short; the MPS tests read them all.
TEST(NetlibNativeRoundTrip, InstancesSurviveTheNativeFormat) {
  using plumb::test::shared_dir;
  if (!plumb::test::shared_folder_present(shared_dir / "netlib") ||
      !plumb::test::shared_folder_present(shared_dir / "netlib-infeas"))
    GTEST_SKIP() << "no Netlib folders under " << shared_dir;
  std::vector<fs::path> files = plumb::test::compressed_mps_files(shared_dir / "netlib");
  for (const fs::path& file : plumb::test::compressed_mps_files(shared_dir / "netlib-infeas")) files.push_back(file);
  int tried = 0;
  for (const fs::path& file : files) {
    if (fs::file_size(file) > 100'000) continue;
    SCOPED_TRACE(file.string());
    ++tried;
    Model model = plumb::model::read_model(file.string());
    std::ostringstream native;
    plumb::model::write_native(model, native);
    Model back = plumb::model::read_model_text(native.str(), file.stem().string() + ".plumb");
    ASSERT_TRUE(back.same_content(model));
    std::ostringstream mps;
    try {
      plumb::model::write_mps(back, mps);
    } catch (const std::runtime_error&) {
      continue;  // a name MPS cannot hold (forplan): the native file keeps it
    }
    EXPECT_TRUE(plumb::model::read_model_text(mps.str(), "again.mps").same_content(model));
  }
  EXPECT_GE(tried, 100);
}

}  // namespace
