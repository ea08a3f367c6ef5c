// Every Netlib LP solved by the default path, its certificate accepted by the independent checker,
// and every certified optimum equal to the exact optimum published by T. Koch, "The final
// NETLIB-LP results", Operations Research Letters 32 (2004) 138-142, to every digit listed in
// ../shared/netlib/exact-optima.csv (values computed there in exact rational arithmetic).
#include "plumb/exact/solve.hpp"
#include "plumb/model/read.hpp"
#include "shared_data.hpp"

#include <gtest/gtest.h>

#include <algorithm>
#include <fstream>
#include <map>
#include <sstream>

namespace plumb::exact {
namespace {

namespace fs = std::filesystem;
using numeric::Rational;

struct ExactOptimum {
  std::string rounded;  // the exact optimum rounded to `digits` significant digits
  int digits = 0;
};

// instance -> its listed optimum; the file leaves every objective constant out.
std::map<std::string, ExactOptimum> exact_optima() {
  std::map<std::string, ExactOptimum> optima;
  std::ifstream in(test::shared_dir / "netlib" / "exact-optima.csv");
  std::string line;
  std::getline(in, line);  // instance,exact_optimum_rounded,digits,objective_constant_included
  while (std::getline(in, line)) {
    if (!line.empty() && line.back() == '\r') line.pop_back();
    std::istringstream fields(line);
    std::string instance, rounded, digits, constant_included;
    std::getline(fields, instance, ',');
    std::getline(fields, rounded, ',');
    std::getline(fields, digits, ',');
    std::getline(fields, constant_included, ',');
    EXPECT_EQ(constant_included, "no") << instance;
    optima[instance] = {rounded, std::stoi(digits)};
  }
  return optima;
}

// The 91 feasible Netlib LPs of ../shared/netlib; all but standgub are in exact-optima.csv.
const std::vector<std::string> netlib_instances = {
    "25fv47",   "80bau3b",  "adlittle", "afiro",    "agg",      "agg2",     "agg3",     "bandm",
    "beaconfd", "blend",    "bnl1",     "bnl2",     "boeing1",  "boeing2",  "bore3d",   "brandy",
    "capri",    "cycle",    "czprob",   "d2q06c",   "d6cube",   "degen2",   "degen3",   "dfl001",
    "e226",     "etamacro", "fffff800", "finnis",   "fit1d",    "fit1p",    "fit2d",    "fit2p",
    "forplan",  "ganges",   "gfrd-pnc", "greenbea", "greenbeb", "grow15",   "grow22",   "grow7",
    "israel",   "kb2",      "lotfi",    "maros",    "maros-r7", "modszk1",  "nesm",     "perold",
    "pilot",    "pilot4",   "pilot87",  "pilotnov", "recipe",   "sc105",    "sc205",    "sc50a",
    "sc50b",    "scagr25",  "scagr7",   "scfxm1",   "scfxm2",   "scfxm3",   "scorpion", "scrs8",
    "scsd1",    "scsd6",    "scsd8",    "sctap1",   "sctap2",   "sctap3",   "seba",     "share1b",
    "share2b",  "shell",    "ship04l",  "ship04s",  "ship08l",  "ship08s",  "ship12l",  "ship12s",
    "sierra",   "stair",    "standata", "standgub", "standmps", "stocfor1", "stocfor2", "tuff",
    "vtpbase",  "wood1p",   "woodw"};

class NetlibExactOptima : public ::testing::TestWithParam<std::string> {};

TEST_P(NetlibExactOptima, CertifiedOptimumAgreesWithEveryPublishedDigit) {
  if (!test::shared_folder_present(test::shared_dir / "netlib")) GTEST_SKIP() << "no shared Netlib data";
  const std::string& instance = GetParam();
  model::Model model = model::read_model((test::shared_dir / "netlib" / (instance + ".mps.gz")).string());
  CertifiedSolution result = certified_solve(model);
  ASSERT_TRUE(result.certified()) << instance << ": " << result.verdict.failure;
  ASSERT_EQ(result.solution.outcome, Outcome::optimal) << instance;

  auto optima = exact_optima();
  auto listed = optima.find(instance);
  if (listed == optima.end()) {
    EXPECT_EQ(instance, "standgub") << "only standgub is missing from exact-optima.csv";
    return;
  }
  const ExactOptimum& published = listed->second;
  Rational without_constant = result.solution.objective - model.objective.constant;
  std::string ours = numeric::to_decimal(without_constant, published.digits).text;
  // Compared as numbers: the file writes trailing zeros ("1412.25" to 6 digits), we drop them.
  EXPECT_EQ(numeric::parse_decimal(ours), numeric::parse_decimal(published.rounded))
      << instance << ": certified " << ours << " (to " << published.digits << " digits), published "
      << published.rounded;
}

INSTANTIATE_TEST_SUITE_P(Netlib, NetlibExactOptima, ::testing::ValuesIn(netlib_instances),
                         [](const auto& info) {  // gfrd-pnc, maros-r7: test names take no '-'
                           std::string name = info.param;
                           std::replace(name.begin(), name.end(), '-', '_');
                           return name;
                         });

// The list above is the whole of exact-optima.csv, so that no listed value goes unchecked.
TEST(NetlibExactOptimaList, CoversEveryListedInstance) {
  if (!test::shared_folder_present(test::shared_dir / "netlib")) GTEST_SKIP() << "no shared Netlib data";
  auto optima = exact_optima();
  EXPECT_EQ(optima.size(), 90u);
  for (const auto& [instance, optimum] : optima)
    EXPECT_NE(std::find(std::begin(netlib_instances), std::end(netlib_instances), instance),
              std::end(netlib_instances))
        << instance;
  EXPECT_EQ(test::compressed_mps_files(test::shared_dir / "netlib").size(), std::size(netlib_instances));
}

}  // namespace
}  // namespace plumb::exact
