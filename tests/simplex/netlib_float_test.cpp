// The float simplex on a CI-sized subset of Netlib, objectives against the published optima
// (../shared/netlib/published.csv, from the Netlib lp/data readme).
#include "plumb/model/read.hpp"
#include "plumb/simplex/float_simplex.hpp"

#include <gtest/gtest.h>

#include <cmath>
#include <cstdlib>
#include <filesystem>
#include <fstream>
#include <map>
#include <sstream>

namespace fs = std::filesystem;

namespace {

const fs::path netlib_dir = fs::path(PLUMB_SHARED_DIR) / "netlib";

std::map<std::string, double> published_optima() {
  std::ifstream in(netlib_dir / "published.csv");
  std::map<std::string, double> optima;
  std::string line;
  std::getline(in, line);
  while (std::getline(in, line)) {
    std::vector<std::string> fields;
    std::stringstream s(line);
    for (std::string f; std::getline(s, f, ',');) fields.push_back(f);
    if (fields.size() < 5 || fields[4].empty()) continue;
    if (auto value = plumb::numeric::parse_decimal(fields[4])) optima[fields[0]] = plumb::numeric::to_double(*value);
  }
  return optima;
}

// Small and medium instances that solve in well under a second each; their published optima
// agree with the float solves to 1e-6.  e226's objective constant is left out, as the readme does.
TEST(NetlibFloat, SubsetMatchesPublishedOptima) {
  if (!fs::is_directory(netlib_dir)) {
    const char* ci = std::getenv("CI");
    if (ci && std::string(ci) == "true") FAIL() << netlib_dir << " is missing (CI=true)";
    GTEST_SKIP() << "shared data folder " << netlib_dir << " is missing";
  }
  auto optima = published_optima();
  for (const char* name : {"afiro", "adlittle", "blend", "sc50a", "sc105", "share2b", "kb2", "israel", "boeing2",
                           "bore3d", "capri", "agg", "scfxm1", "stocfor1", "grow7", "e226", "25fv47", "bandm",
                           "sctap2", "ship04s", "degen2", "czprob"}) {
    plumb::model::ReadOptions read;
    read.constant_rule = plumb::model::ObjectiveConstantRule::ignored;
    auto model = plumb::model::read_model((netlib_dir / (std::string(name) + ".mps.gz")).string(), read);
    auto result = plumb::simplex::solve_float(model);
    ASSERT_EQ(result.status, plumb::simplex::FloatStatus::optimal) << name << ": " << result.note;
    ASSERT_TRUE(optima.count(name)) << name;
    double published = optima[name];
    EXPECT_LE(std::abs(result.objective - published), 1e-6 * std::max(1.0, std::abs(published)))
        << name << ": float " << result.objective << ", published " << published;
  }
}

}  // namespace
