#include "native_lexer.hpp"

#include <algorithm>
#include <array>

namespace plumb::model::detail {
namespace {

constexpr std::array<std::string_view, 8> statement_keywords = {
    "title", "variable", "bound", "constraint", "minimise", "maximise", "minimize", "maximize"};
constexpr std::array<std::string_view, 12> clause_words = {
    "between", "and", "at", "least", "most", "free", "fixed", "integer", "group", "hard", "soft", "infinity"};

bool is_letter(char c) { return (c >= 'a' && c <= 'z') || (c >= 'A' && c <= 'Z') || c == '_'; }
bool is_digit(char c) { return c >= '0' && c <= '9'; }
bool is_word_char(char c) { return is_letter(c) || is_digit(c) || c == '.'; }

std::string quoted_for_message(std::string_view text) {
  return "'" + std::string(text.substr(0, 40)) + (text.size() > 40 ? "...'" : "'");
}

class LineLexer {
 public:
  LineLexer(std::string_view line, const Location& start, std::vector<Token>& tokens)
      : line_(line), start_(start), tokens_(tokens) {}

  void run() {
    while (position_ < line_.size()) {
      char c = line_[position_];
      if (c == ' ' || c == '\t') {
        ++position_;
      } else if (c == '#') {
        return;
      } else if (is_letter(c)) {
        word();
      } else if (is_digit(c) || (c == '.' && position_ + 1 < line_.size() && is_digit(line_[position_ + 1]))) {
        number();
      } else if (c == '"') {
        delimited(TokenKind::text, '"', "a closing '\"' before the end of the line");
      } else if (c == '\'') {
        delimited(TokenKind::quoted_name, '\'', "a closing \"'\" before the end of the line");
      } else if (c == '[') {
        delimited(TokenKind::unit, ']', "a closing ']' before the end of the line");
      } else {
        symbol();
      }
    }
  }

 private:
  Location at(std::size_t position) const {
    return {start_.file, start_.line, start_.column + static_cast<long>(position)};
  }

  void push(TokenKind kind, std::string text, std::size_t begin, std::optional<numeric::Rational> value = {}) {
    tokens_.push_back(Token{kind, std::move(text), std::move(value), at(begin)});
  }

  void word() {
    std::size_t begin = position_;
    while (position_ < line_.size() && is_word_char(line_[position_])) ++position_;
    push(TokenKind::word, std::string(line_.substr(begin, position_ - begin)), begin);
  }

  // A decimal, optionally "/decimal" with no space: the literal numeric::parse_number reads.
  void number() {
    std::size_t begin = position_;
    auto decimal = [&] {
      while (position_ < line_.size() && is_digit(line_[position_])) ++position_;
      if (position_ < line_.size() && line_[position_] == '.') ++position_;
      while (position_ < line_.size() && is_digit(line_[position_])) ++position_;
      if (position_ < line_.size() && (line_[position_] == 'e' || line_[position_] == 'E')) {
        std::size_t after = position_ + 1;
        if (after < line_.size() && (line_[after] == '+' || line_[after] == '-')) ++after;
        if (after < line_.size() && is_digit(line_[after])) {
          position_ = after;
          while (position_ < line_.size() && is_digit(line_[position_])) ++position_;
        }
      }
    };
    decimal();
    if (position_ + 1 < line_.size() && line_[position_] == '/' &&
        (is_digit(line_[position_ + 1]) || line_[position_ + 1] == '.')) {
      ++position_;
      decimal();
    }
    std::string_view literal = line_.substr(begin, position_ - begin);
    if (position_ < line_.size() && is_letter(line_[position_])) {
      std::size_t end = position_;
      while (end < line_.size() && is_word_char(line_[end])) ++end;
      throw InputError(at(begin), quoted_for_message(line_.substr(begin, end - begin)),
                       "a number followed by a space or '*' before a name");
    }
    while (position_ < line_.size() && (line_[position_] == '.' || is_digit(line_[position_]))) ++position_;
    literal = line_.substr(begin, position_ - begin);  // "1.2.3" is refused whole
    numeric::ParseFailure why;
    auto value = numeric::parse_number(literal, &why);
    if (!value) throw InputError(at(begin), "the number " + quoted_for_message(literal), why.reason);
    push(TokenKind::number, std::string(literal), begin, std::move(value));
  }

  // Text up to `close`; backslash escapes \\ \n \t and the closing character.
  void delimited(TokenKind kind, char close, const char* expected_close) {
    std::size_t begin = position_++;
    std::string text;
    while (true) {
      if (position_ >= line_.size()) throw InputError(at(begin), "an unterminated quote", expected_close);
      char c = line_[position_];
      if (c == close) break;
      if (c == '\\') {
        if (position_ + 1 >= line_.size()) throw InputError(at(position_), "'\\' at the end of the line", expected_close);
        char escaped = line_[position_ + 1];
        if (escaped == '\\' || escaped == close) text += escaped;
        else if (escaped == 'n') text += '\n';
        else if (escaped == 't') text += '\t';
        else
          throw InputError(at(position_), std::string("the escape '\\") + escaped + "'",
                           std::string("one of \\\\ \\n \\t \\") + close);
        position_ += 2;
        continue;
      }
      text += c;
      ++position_;
    }
    ++position_;
    if (kind == TokenKind::quoted_name && text.empty())
      throw InputError(at(begin), "an empty quoted name ''", "a name of at least one character");
    push(kind, std::move(text), begin);
  }

  void symbol() {
    std::size_t begin = position_;
    char c = line_[position_++];
    if ((c == '<' || c == '>') && position_ < line_.size() && line_[position_] == '=') {
      ++position_;
      push(TokenKind::symbol, std::string(1, c) + "=", begin);
      return;
    }
    if (c == '<' || c == '>')
      throw InputError(at(begin), std::string("'") + c + "'", std::string("'") + c + "=' (constraints are never strict)");
    if (std::string_view(":=+-*/()").find(c) == std::string_view::npos) {
      unsigned char byte = static_cast<unsigned char>(c);
      std::string found = byte < 0x80 ? std::string("'") + c + "'" : "a non-ASCII character";
      throw InputError(at(begin), found, "a name, a number, a quote or one of : <= >= = + - * / ( ) #");
    }
    push(TokenKind::symbol, std::string(1, c), begin);
  }

  std::string_view line_;
  Location start_;
  std::vector<Token>& tokens_;
  std::size_t position_ = 0;
};

}  // namespace

void lex_line(std::string_view line, const Location& line_start, std::vector<Token>& tokens) {
  LineLexer(line, line_start, tokens).run();
}

bool is_statement_keyword(std::string_view word) {
  return std::find(statement_keywords.begin(), statement_keywords.end(), word) != statement_keywords.end();
}

bool is_reserved_word(std::string_view word) {
  return is_statement_keyword(word) || std::find(clause_words.begin(), clause_words.end(), word) != clause_words.end();
}

bool is_plain_name(std::string_view name) {
  if (name.empty() || !is_letter(name[0])) return false;
  if (!std::all_of(name.begin(), name.end(), is_word_char)) return false;
  return !is_reserved_word(name);
}

}  // namespace plumb::model::detail
