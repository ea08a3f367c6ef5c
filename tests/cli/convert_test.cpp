// plumb convert, end to end: the executable, its exit statuses and the files it writes.
#include "plumb/model/read.hpp"

#include <gtest/gtest.h>
#include <sys/wait.h>
#include <unistd.h>

#include <cstdio>
#include <cstdlib>
#include <filesystem>
#include <fstream>
#include <sstream>

namespace {

namespace fs = std::filesystem;
const std::string corpus = PLUMB_CORPUS_DIR;

struct Outcome {
  int status;
  std::string out;
  std::string err;
};

class Convert : public ::testing::Test {
 protected:
  void SetUp() override {
    folder_ = fs::temp_directory_path() / ("plumb-convert-" + std::to_string(::getpid()) + "-" +
                                           ::testing::UnitTest::GetInstance()->current_test_info()->name());
    fs::remove_all(folder_);
    fs::create_directories(folder_);
  }
  void TearDown() override { fs::remove_all(folder_); }

  std::string path(const std::string& name) const { return (folder_ / name).string(); }

  static std::string slurp(const std::string& file) {
    std::ifstream in(file, std::ios::binary);
    std::ostringstream text;
    text << in.rdbuf();
    return text.str();
  }

  Outcome plumb(const std::string& arguments) const {
    std::string out = path("stdout.txt"), err = path("stderr.txt");
    std::string command = std::string("'") + PLUMB_EXECUTABLE + "' convert " + arguments + " >'" + out + "' 2>'" + err + "'";
    int status = std::system(command.c_str());
    return {WIFEXITED(status) ? WEXITSTATUS(status) : -1, slurp(out), slurp(err)};
  }

  fs::path folder_;
};

TEST_F(Convert, MpsWithLabelsToNativeAndBack) {
  Outcome to_native = plumb("'" + corpus + "/summer-blend.mps' '" + path("blend.plumb") + "'");
  ASSERT_EQ(to_native.status, 0) << to_native.err;
  plumb::model::Model mps = plumb::model::read_model(corpus + "/summer-blend.mps");  // with its sidecar
  plumb::model::Model native = plumb::model::read_model(path("blend.plumb"));
  EXPECT_TRUE(native.same_content(mps));
  EXPECT_NE(slurp(path("blend.plumb")).find("\"the storage sphere holds 900 bbl of butane this morning\""),
            std::string::npos);

  Outcome to_mps = plumb("'" + path("blend.plumb") + "' '" + path("again.mps") + "'");
  ASSERT_EQ(to_mps.status, 0) << to_mps.err;
  EXPECT_NE(to_mps.err.find("again.labels.csv"), std::string::npos) << to_mps.err;
  plumb::model::Model again = plumb::model::read_model(path("again.mps"));  // finds again.labels.csv
  EXPECT_TRUE(again.same_content(mps));
}

TEST_F(Convert, StdoutNeedsAFormat) {
  Outcome to_stdout = plumb("'" + corpus + "/summer-blend.plumb' - --to plumb");
  ASSERT_EQ(to_stdout.status, 0) << to_stdout.err;
  plumb::model::Model back = plumb::model::read_model_text(to_stdout.out, "stdout.plumb");
  EXPECT_TRUE(back.same_content(plumb::model::read_model(corpus + "/summer-blend.plumb")));

  Outcome no_format = plumb("'" + corpus + "/summer-blend.plumb' -");
  EXPECT_EQ(no_format.status, 1);
  EXPECT_NE(no_format.err.find("expected --to mps or --to plumb"), std::string::npos) << no_format.err;
  EXPECT_TRUE(no_format.out.empty());

  Outcome odd_extension = plumb("'" + corpus + "/summer-blend.plumb' '" + path("blend.txt") + "'");
  EXPECT_EQ(odd_extension.status, 1);
  EXPECT_FALSE(fs::exists(path("blend.txt")));

  Outcome bad_choice = plumb("'" + corpus + "/summer-blend.plumb' - --to lp");
  EXPECT_EQ(bad_choice.status, 1);
}

TEST_F(Convert, BadInputWritesNothing) {
  Outcome bad = plumb("'" + std::string(PLUMB_TEST_DATA_DIR) + "/bad/bad-unknown-variable.plumb' '" + path("out.plumb") + "'");
  EXPECT_EQ(bad.status, 1);
  EXPECT_NE(bad.err.find("bad-unknown-variable.plumb:3:21: found the undeclared variable 'z'"), std::string::npos)
      << bad.err;
  EXPECT_FALSE(fs::exists(path("out.plumb")));
}

// One way to write a file for every command (present::write_file): a path that cannot be written
// is one message naming what and where, exit 1, for convert's model and solve's certificate alike.
TEST_F(Convert, UnwritableOutputIsOneMessageAndExitOne) {
  std::string nowhere = path("no-such-folder/blend.plumb");
  Outcome convert = plumb("'" + corpus + "/summer-blend.mps' '" + nowhere + "'");
  EXPECT_EQ(convert.status, 1);
  EXPECT_EQ(convert.err, "plumb: cannot write the model to " + nowhere + "\n");

  std::string certificate = path("no-such-folder/blend.json");
  std::string command = std::string("'") + PLUMB_EXECUTABLE + "' solve '" + corpus +
                        "/summer-blend.plumb' --quiet --certificate '" + certificate + "' >'" +
                        path("stdout.txt") + "' 2>'" + path("stderr.txt") + "'";
  int status = std::system(command.c_str());
  EXPECT_EQ(WIFEXITED(status) ? WEXITSTATUS(status) : -1, 1);
  EXPECT_EQ(slurp(path("stderr.txt")), "plumb: cannot write the certificate to " + certificate + "\n");
  EXPECT_EQ(slurp(path("stdout.txt")), "");
}

}  // namespace
