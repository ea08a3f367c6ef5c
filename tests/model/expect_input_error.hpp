// Test helper: a malformed input and the one located InputError it must give.
#pragma once

#include "plumb/model/error.hpp"

#include <gtest/gtest.h>

#include <string>

namespace plumb::test {

struct BadInput {
  const char* input;  // text, or a file name under tests/data/bad/
  long line, column;
  const char* phrase;  // part of the message
};

inline void expect_error_at(const model::InputError& e, const std::string& file, const BadInput& c) {
  EXPECT_EQ(e.where().file, file) << c.input;
  EXPECT_EQ(e.where().line, c.line) << c.input << "\n" << e.what();
  EXPECT_EQ(e.where().column, c.column) << c.input << "\n" << e.what();
  EXPECT_NE(std::string(e.what()).find(c.phrase), std::string::npos) << c.input << "\n" << e.what();
}

}  // namespace plumb::test
