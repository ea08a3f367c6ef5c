// RFC 4180 CSV records with the line and column of every field, read through Debian's libcsv.
#pragma once

#include "plumb/model/error.hpp"

#include <string>
#include <string_view>
#include <vector>

namespace plumb::model {

struct CsvField {
  std::string text;  // unquoted; spaces and tabs around an unquoted field dropped
  Location where;    // where the field starts
};

struct CsvRecord {
  std::vector<CsvField> fields;
  Location where;  // where the record starts
};

// Every record of text (a byte-order mark first is skipped; blank lines are no records).  Quoted
// fields may hold commas, doubled quotes and line breaks.  Throws InputError at the offending
// byte for a quote inside an unquoted field, text after a closing quote, a quote never closed,
// control bytes and over-long lines.
std::vector<CsvRecord> read_csv(std::string_view text, const std::string& file);

}  // namespace plumb::model
