// Input errors and warnings that point at a file, a line and what was expected there.
#pragma once

#include <stdexcept>
#include <string>
#include <vector>

namespace plumb::model {

// Where in an input something was found; line and column count from 1, 0 means unknown.
struct Location {
  std::string file;
  long line = 0;
  long column = 0;
};

// "FILE:LINE:COLUMN: found F, expected E" - the single message a bad input gets.
class InputError : public std::runtime_error {
 public:
  InputError(Location where, std::string found, std::string expected);
  const Location& where() const { return where_; }
  const std::string& found() const { return found_; }
  const std::string& expected() const { return expected_; }

 private:
  Location where_;
  std::string found_;
  std::string expected_;
};

// Something the reader accepted but the user should hear about.
struct Warning {
  Location where;
  std::string message;
};

std::string format_location(const Location& where);
std::string format_warning(const Warning& warning);

}  // namespace plumb::model
