// Reading every Netlib instance: sizes against the published table (../shared/netlib/published.csv).
#include "plumb/model/read.hpp"
#include "plumb/model/write.hpp"
#include "shared_data.hpp"

#include <gtest/gtest.h>

#include <algorithm>
#include <filesystem>
#include <fstream>
#include <sstream>

namespace fs = std::filesystem;
using plumb::model::Model;
using plumb::model::read_model;

namespace {

using plumb::test::shared_dir;

struct Published {
  std::string instance;
  long rows_including_objective;
  long columns;
  long nonzeros_including_objective;
};

std::vector<Published> published_table() {
  std::ifstream in(shared_dir / "netlib" / "published.csv");
  std::vector<Published> table;
  std::string line;
  std::getline(in, line);  // header
  while (std::getline(in, line)) {
    if (!line.empty() && line.back() == '\r') line.pop_back();
    if (line.empty()) continue;
    std::stringstream fields(line);
    Published p;
    std::string rows, columns, nonzeros;
    std::getline(fields, p.instance, ',');
    std::getline(fields, rows, ',');
    std::getline(fields, columns, ',');
    std::getline(fields, nonzeros, ',');
    p.rows_including_objective = std::stol(rows);
    p.columns = std::stol(columns);
    p.nonzeros_including_objective = std::stol(nonzeros);
    table.push_back(p);
  }
  return table;
}

long objective_nonzeros(const Model& model) {
  return static_cast<long>(std::count_if(model.objective.coefficients.begin(),
                                         model.objective.coefficients.end(),
                                         [](const auto& c) { return c != 0; }));
}

}  // namespace

// Source: the Netlib lp/data readme's summary table (published.csv); its counts include the
// objective row and the objective coefficients.
TEST(NetlibRead, SizesMatchThePublishedTable) {
  if (!plumb::test::shared_folder_present(shared_dir / "netlib"))
    GTEST_SKIP() << "no " << shared_dir / "netlib";
  std::vector<Published> table = published_table();
  ASSERT_EQ(table.size(), 91u) << "published.csv should list the 91 feasible Netlib instances";
  ASSERT_EQ(plumb::test::compressed_mps_files(shared_dir / "netlib").size(), 91u);
  for (const Published& p : table) {
    SCOPED_TRACE(p.instance);
    Model model = read_model((shared_dir / "netlib" / (p.instance + ".mps.gz")).string());
    long rows = model.row_count() + 1;
    long nonzeros = static_cast<long>(model.matrix.nonzeros()) + objective_nonzeros(model);
    if (p.instance == "boeing1") {
      // The published table says 351 rows; the file declares 352 (351 constraints and the
      // objective).  The file is what plumb reads (docs/mps.md, "Netlib counts").
      EXPECT_EQ(p.rows_including_objective, 351);
      EXPECT_EQ(rows, 352);
    } else {
      EXPECT_EQ(rows, p.rows_including_objective) << "rows including the objective";
    }
    EXPECT_EQ(model.column_count(), p.columns) << "columns";
    if (p.instance == "standgub") {
      // The published 3147 counts one explicit zero (column Z.....99 in row 'ENDX'); plumb's
      // matrix drops explicit zeros, so 3146 entries remain.
      EXPECT_EQ(nonzeros + 1, p.nonzeros_including_objective);
    } else {
      EXPECT_EQ(nonzeros, p.nonzeros_including_objective) << "nonzeros including the objective";
    }
  }
}

// Source: Netlib lp/infeas (27 infeasible instances); every file must read without error.
TEST(NetlibRead, InfeasibleCollectionReads) {
  if (!plumb::test::shared_folder_present(shared_dir / "netlib-infeas"))
    GTEST_SKIP() << "no " << shared_dir / "netlib-infeas";
  std::vector<fs::path> files = plumb::test::compressed_mps_files(shared_dir / "netlib-infeas");
  ASSERT_EQ(files.size(), 27u);
  for (const fs::path& file : files) {
    SCOPED_TRACE(file.filename().string());
    Model model;
    EXPECT_NO_THROW(model = read_model(file.string()));
    EXPECT_GT(model.row_count(), 0);
    EXPECT_GT(model.column_count(), 0);
  }
}

// Round trip (plumb's contract for write_mps): every Netlib model written as free MPS reads back
// the same.  forplan's names contain blanks, which free MPS cannot hold: the writer refuses it.
TEST(NetlibRead, EveryInstanceRoundTripsThroughFreeMps) {
  if (!plumb::test::shared_folder_present(shared_dir / "netlib") ||
      !plumb::test::shared_folder_present(shared_dir / "netlib-infeas"))
    GTEST_SKIP() << "no Netlib folders under " << shared_dir;
  std::vector<fs::path> files = plumb::test::compressed_mps_files(shared_dir / "netlib");
  for (const fs::path& file : plumb::test::compressed_mps_files(shared_dir / "netlib-infeas"))
    files.push_back(file);
  ASSERT_EQ(files.size(), 118u);
  for (const fs::path& file : files) {
    SCOPED_TRACE(file.string());
    Model model = read_model(file.string());
    std::ostringstream out;
    if (file.filename() == "forplan.mps.gz") {
      EXPECT_THROW(plumb::model::write_mps(model, out), std::runtime_error);
      continue;
    }
    plumb::model::write_mps(model, out);
    Model again = plumb::model::read_model_text(out.str(), file.filename().string() + " (rewritten)");
    EXPECT_TRUE(again.same_content(model));
    EXPECT_EQ(again.source.format, "mps-free");
  }
}
