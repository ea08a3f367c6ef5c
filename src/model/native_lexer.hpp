// Internal: tokens of the native model format (docs/model-format.md), shared by reader and writer.
#pragma once

#include "plumb/model/error.hpp"
#include "plumb/numeric/rational.hpp"

#include <optional>
#include <string>
#include <string_view>
#include <vector>

namespace plumb::model::detail {

enum class TokenKind {
  word,         // plain identifier or keyword: [A-Za-z_][A-Za-z0-9_.]*
  quoted_name,  // 'any name'
  text,         // "a plain-language statement"
  unit,         // [bbl]
  number,       // 12, 0.5, 1e-3, 3/8  (exact, through numeric::parse_number)
  symbol,       // : <= >= = + - * / ( )
  end,          // end of the statement
};

struct Token {
  TokenKind kind;
  std::string text;        // word, name, statement or unit with escapes resolved; symbol spelled out
  std::optional<numeric::Rational> value;  // numbers only
  Location where;
};

// Appends the tokens of one physical line; stops at '#' outside quotes.
void lex_line(std::string_view line, const Location& line_start, std::vector<Token>& tokens);

// The words of the format; a name spelled like one of them must be quoted.
bool is_reserved_word(std::string_view word);

// A name that can stand unquoted: a plain identifier that is not a reserved word.
bool is_plain_name(std::string_view name);

// The keywords that open a statement.
bool is_statement_keyword(std::string_view word);

}  // namespace plumb::model::detail
