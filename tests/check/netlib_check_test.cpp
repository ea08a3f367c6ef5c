// Certificates the solver wrote for Netlib instances (plumb solve, 2026-12-01), frozen as test data:
// the checker accepts each and rejects every provable mutation of it.
#include "check/mutations.hpp"
#include "plumb/certificate/certificate.hpp"
#include "plumb/model/read.hpp"
#include "shared_data.hpp"

#include <gtest/gtest.h>

#include <string>

namespace {

struct Frozen {
  const char* folder;       // under the shared data folder
  const char* instance;
  const char* status;
};

// afiro and adlittle optima: Netlib's published table (../shared/netlib/published.csv) gives
// -4.6475314286E+02 and 2.2549496316E+05. galenet and bgprtr are in Netlib's infeasible collection.
constexpr Frozen frozen[] = {
    {"netlib", "afiro", "optimal"},
    {"netlib", "adlittle", "optimal"},
    {"netlib-infeas", "galenet", "infeasible"},
    {"netlib-infeas", "bgprtr", "infeasible"},
};

TEST(NetlibCheck, SolverMadeCertificatesAndTheirMutations) {
  for (const Frozen& f : frozen) {
    auto folder = plumb::test::shared_dir / f.folder;
    if (!plumb::test::shared_folder_present(folder)) GTEST_SKIP() << "no shared data folder " << folder;
    SCOPED_TRACE(f.instance);
    auto model = plumb::model::read_model((folder / (std::string(f.instance) + ".mps.gz")).string());
    auto certificate = plumb::certificate::read_certificate(std::string(PLUMB_TEST_DATA_DIR) + "/check/solver-made/" +
                                                            f.instance + ".json");
    EXPECT_EQ(plumb::certificate::to_string(certificate.status), f.status);
    plumb::testing::expect_valid(model, certificate);
    auto mutations = plumb::testing::provable_mutations(model, certificate);
    EXPECT_GE(mutations.size(), 3u);
    for (const auto& mutation : mutations) plumb::testing::expect_rejected(model, mutation);
  }
}

TEST(NetlibCheck, AfiroObjectiveMatchesThePublishedOptimum) {
  auto folder = plumb::test::shared_dir / "netlib";
  if (!plumb::test::shared_folder_present(folder)) GTEST_SKIP() << "no shared data folder " << folder;
  auto certificate = plumb::certificate::read_certificate(std::string(PLUMB_TEST_DATA_DIR) + "/check/solver-made/afiro.json");
  ASSERT_TRUE(certificate.objective);
  // Published to 11 significant digits: -4.6475314286E+02 (Netlib readme, via published.csv).
  plumb::numeric::Rational published = *plumb::numeric::parse_decimal("-4.6475314286E+02");
  plumb::numeric::Rational tolerance = *plumb::numeric::parse_decimal("1E-8");
  EXPECT_LE(abs(*certificate.objective - published), tolerance) << plumb::numeric::to_fraction(*certificate.objective);
}

}  // namespace
