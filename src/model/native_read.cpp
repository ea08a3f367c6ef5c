// Native model format reader: the grammar of docs/model-format.md, one statement at a time.
#include "plumb/model/input_file.hpp"
#include "native_lexer.hpp"
#include "parsers.hpp"

#include <unordered_map>

namespace plumb::model::detail {
namespace {

constexpr int max_parenthesis_depth = 64;  // keeps "((((..." from exhausting the stack
// Opens a model-level decision and, with 'source' and 'owner', names a label part; none of the
// three is reserved, so names spelled like them keep reading as before.
constexpr std::string_view decision_keyword = "decision";

std::string shorten(const std::string& text) { return text.size() > 40 ? text.substr(0, 40) + "..." : text; }

std::string describe(const Token& token) {
  switch (token.kind) {
    case TokenKind::word:
      return "'" + shorten(token.text) + "'";
    case TokenKind::quoted_name:
      return "the quoted name '" + shorten(token.text) + "'";
    case TokenKind::text:
      return "the quoted text \"" + shorten(token.text) + "\"";
    case TokenKind::unit:
      return "the unit [" + shorten(token.text) + "]";
    case TokenKind::number:
      return "the number " + token.text;
    case TokenKind::symbol:
      return "'" + token.text + "'";
    case TokenKind::end:
      break;
  }
  return "the end of the statement";
}

// One side of a relation: variables with summed coefficients and a constant, or an infinity.
struct LinearForm {
  std::vector<std::pair<int, Rational>> terms;  // in order of first appearance
  std::unordered_map<int, std::size_t> position_of;
  Rational constant = 0;
  int infinity = 0;  // +1 or -1 when the side is "infinity" or "-infinity" on its own
  Location where;
};

// The value of a bound: a number, or an infinity with its sign.
struct BoundValue {
  int infinity = 0;
  Rational value = 0;
  Location where;
};

// What one bound clause (between, at least, at most, free, fixed at) says.
struct BoundClause {
  bool sets_lower = false;
  bool sets_upper = false;
  Side lower;
  Side upper;
  Location where;
};

// Which label parts a statement has given, so each comes at most once.
struct LabelParts {
  bool statement = false, unit = false, group = false, hard = false;
  bool decision = false, source = false, owner = false, weight = false;
};

class Reader {
 public:
  Reader(std::string_view text, const std::string& file) : text_(text), file_(file) {}

  Model run() {
    if (text_.starts_with("\xEF\xBB\xBF")) text_.remove_prefix(3);  // a UTF-8 byte-order mark
    LineCursor cursor(text_, file_);
    std::string_view line;
    while (cursor.next(line)) {
      std::vector<Token> line_tokens;
      lex_line(line, cursor.here(1), line_tokens);
      if (line_tokens.empty()) continue;
      bool continues = line.front() == ' ' || line.front() == '\t';
      if (continues && tokens_.empty())
        throw InputError(
            line_tokens.front().where, "an indented line with no statement before it",
            "a statement keyword at the start of the line (indented lines continue the one above)");
      if (!continues) finish_statement();
      tokens_.insert(tokens_.end(), std::make_move_iterator(line_tokens.begin()),
                     std::make_move_iterator(line_tokens.end()));
      statement_end_ = cursor.here(static_cast<long>(line.size()) + 1);
    }
    finish_statement();
    if (model_.columns.empty())
      throw InputError(cursor.here(), statements_ == 0 ? "no statements" : "no variables",
                       "a model with at least one 'variable' statement");
    return build();
  }

 private:
  // ----- statements -----

  void finish_statement() {
    if (tokens_.empty()) return;
    tokens_.push_back(Token{TokenKind::end, "", std::nullopt, statement_end_});
    next_ = 0;
    ++statements_;
    const Token& keyword = take();
    bool decision = keyword.kind == TokenKind::word && keyword.text == decision_keyword;
    if (!decision && (keyword.kind != TokenKind::word || !is_statement_keyword(keyword.text)))
      fail(keyword, "a statement keyword: title, decision, variable, bound, minimise, maximise or constraint");
    if (decision)
      decision_statement();
    else if (keyword.text == "title")
      title_statement(keyword);
    else if (keyword.text == "variable")
      variable_statement();
    else if (keyword.text == "bound")
      bound_statement();
    else if (keyword.text == "constraint")
      constraint_statement();
    else
      objective_statement(keyword);
    tokens_.clear();
  }

  void title_statement(const Token& keyword) {
    if (title_line_ != 0)
      throw InputError(keyword.where, "a second title",
                       "one title per model (the first is on line " + std::to_string(title_line_) + ")");
    title_line_ = keyword.where.line;
    const Token& text = take();
    if (text.kind != TokenKind::text) fail(text, "the title in double quotes");
    model_.title = text.text;
    expect_end("the end of the title statement");
  }

  // decision "text" {source "text" | owner "text"}: about the model as a whole.
  void decision_statement() {
    --next_;  // the keyword opens the decision's own text, read like the label part of that name
    const Token& keyword = peek();
    Label label;
    LabelParts parts;
    while (peek().kind != TokenKind::end) {
      if (!at_word(decision_keyword) && !at_word("source") && !at_word("owner"))
        fail(peek(), "source \"text\", owner \"text\" or the end of the decision");
      label_clause(label, parts);
    }
    // An empty one would say nothing, and could not be written back (found by the native fuzzer).
    if (label.decision.empty())
      throw InputError(keyword.where, "a decision with empty text", "what was decided, in double quotes");
    model_.decisions.push_back({std::move(label.decision), std::move(label.source), std::move(label.owner)});
  }

  void variable_statement() {
    const Token& name_token = peek();
    std::string name = take_new_name("variable", column_by_name_, column_declared_at_);
    int j = model_.column_count();
    column_by_name_.emplace(name, j);
    column_declared_at_.push_back(name_token.where.line);
    lower_set_at_.push_back(0);
    upper_set_at_.push_back(0);
    model_.columns.push_back(Column{});
    model_.columns[j].name = std::move(name);
    LabelParts parts;
    bool integer_seen = false;
    while (peek().kind != TokenKind::end) {
      if (label_clause(model_.columns[j].label, parts)) continue;
      if (auto clause = bound_clause()) {
        apply_bound(j, *clause, nullptr);
        continue;
      }
      if (at_word("integer")) {
        if (integer_seen) fail(peek(), "'integer' at most once");
        integer_seen = true;
        model_.columns[j].integer = true;
        take();
        continue;
      }
      fail(peek(),
           "a bound (between, at least, at most, free, fixed at), 'integer', a \"statement\", a [unit], "
           "'group', 'hard', 'soft' or the end of the variable");
    }
  }

  void bound_statement() {
    int j = take_variable();
    auto clause = bound_clause();
    if (!clause) fail(peek(), "a bound: between A and B, at least A, at most B, free or fixed at V");
    Label label;
    LabelParts parts;
    while (label_clause(label, parts)) {
    }
    expect_end("a \"statement\", a [unit], 'group', 'hard', 'soft' or the end of the bound");
    apply_bound(j, *clause, &label);
  }

  void objective_statement(const Token& keyword) {
    if (objective_line_ != 0)
      throw InputError(
          keyword.where, "a second objective",
          "one objective per model (the first is on line " + std::to_string(objective_line_) + ")");
    objective_line_ = keyword.where.line;
    model_.objective.sense = keyword.text.starts_with("min") ? Sense::minimise : Sense::maximise;
    if (at_name()) model_.objective.name = take_name("an objective name");
    LabelParts parts;
    while (label_clause(model_.objective.label, parts)) {
    }
    expect_symbol(
        ":", "':' before the objective's expression, or a \"statement\", [unit], 'group', 'hard', 'soft'");
    LinearForm form = side();
    if (form.infinity != 0) throw InputError(form.where, "an infinite objective", "an expression");
    expect_end("'+', '-' or the end of the objective (an objective has no relation)");
    objective_terms_ = std::move(form.terms);
    model_.objective.constant = std::move(form.constant);
  }

  void constraint_statement() {
    const Token& name_token = peek();
    std::string name = take_new_name("constraint", row_by_name_, row_declared_at_);
    Row row;
    row.name = name;
    LabelParts parts;
    while (label_clause(row.label, parts)) {
    }
    expect_symbol(
        ":", "':' before the constraint's relation, or a \"statement\", [unit], 'group', 'hard', 'soft'");
    std::vector<LinearForm> sides;
    std::vector<Token> relations;
    sides.push_back(side());
    while (at_relation()) {
      if (relations.size() == 2)
        fail(peek(), "at most two relations (a two-sided constraint reads L <= expression <= U)");
      relations.push_back(take());
      sides.push_back(side());
    }
    if (relations.empty()) fail(peek(), "'+', '-' or a relation '<=', '>=' or '='");
    expect_end("'+', '-', a relation or the end of the constraint");
    int i = model_.row_count();
    const LinearForm& middle = relations.size() == 1 ? combine_one_sided(sides, relations[0], row)
                                                     : combine_two_sided(sides, relations, row);
    for (const auto& [j, value] : middle.terms) entries_.push_back({i, j, value});
    if (row.lower && row.upper && *row.lower > *row.upper)
      model_.warnings.push_back(
          {name_token.where, "constraint '" + shorten(row.name) +
                                 "' has its lower limit above its upper limit: it cannot hold"});
    row_by_name_.emplace(name, i);
    row_declared_at_.push_back(name_token.where.line);
    model_.rows.push_back(std::move(row));
  }

  // A relation = b: the variables move left and the constants right, exactly.
  const LinearForm& combine_one_sided(std::vector<LinearForm>& sides, const Token& relation, Row& row) {
    LinearForm& left = sides[0];
    LinearForm& right = sides[1];
    if (left.infinity != 0 && right.infinity != 0)
      throw InputError(left.where, "infinity on both sides", "an expression on at least one side");
    bool less = relation.text == "<=";
    if (left.infinity != 0 || right.infinity != 0) {
      // "expression <= infinity" and the like: a constraint without limits.
      const LinearForm& infinite = left.infinity != 0 ? left : right;
      int allowed = (left.infinity != 0) == less ? -1 : +1;
      if (relation.text == "=" || infinite.infinity != allowed)
        throw InputError(infinite.where,
                         std::string(infinite.infinity > 0 ? "'infinity'" : "'-infinity'") + " " +
                             (relation.text == "=" ? "in an equation" : "on the wrong side"),
                         "a finite number, or infinity where it leaves the constraint without that limit");
      return left.infinity != 0 ? right : left;
    }
    for (auto& [j, value] : right.terms) add_term(left, j, -value, right.where, false);
    Rational limit = right.constant - left.constant;
    within_limits(limit, relation.where);  // each side's constant obeys it, their difference need not
    if (relation.text != ">=") row.upper = limit;
    if (relation.text != "<=") row.lower = limit;
    return left;
  }

  // L <= expression <= U, or U >= expression >= L; the outer parts are numbers or infinities.
  const LinearForm& combine_two_sided(std::vector<LinearForm>& sides, const std::vector<Token>& relations,
                                      Row& row) {
    if (relations[0].text != relations[1].text || relations[0].text == "=")
      throw InputError(relations[1].where,
                       "'" + relations[0].text + "' followed by '" + relations[1].text + "'",
                       "two '<=' or two '>=' in a two-sided constraint");
    for (std::size_t k : {std::size_t(0), std::size_t(2)})
      if (!sides[k].terms.empty())
        throw InputError(sides[k].where, "a variable outside the two relations",
                         "numbers only in the outer parts of a two-sided constraint");
    LinearForm& middle = sides[1];
    if (middle.infinity != 0) throw InputError(middle.where, "infinity in the middle", "an expression");
    bool less = relations[0].text == "<=";
    const LinearForm& low = less ? sides[0] : sides[2];
    const LinearForm& high = less ? sides[2] : sides[0];
    if (low.infinity > 0) throw InputError(low.where, "'infinity' as a lower limit", "a number or -infinity");
    if (high.infinity < 0)
      throw InputError(high.where, "'-infinity' as an upper limit", "a number or infinity");
    auto limit = [&](const LinearForm& outer, const Token& relation) {
      Rational value = outer.constant - middle.constant;
      within_limits(value, relation.where);
      return value;
    };
    if (low.infinity == 0) row.lower = limit(low, relations[less ? 0 : 1]);
    if (high.infinity == 0) row.upper = limit(high, relations[less ? 1 : 0]);
    return middle;
  }

  // ----- clauses -----

  // "statement", [unit], group NAME, hard, soft, weight NUMBER, decision/source/owner "text": true
  // when one was read.
  bool label_clause(Label& label, LabelParts& parts) {
    const Token& token = peek();
    auto once = [&](bool& seen, const char* what) {
      if (seen)
        throw InputError(token.where, std::string("a second ") + what, std::string("one ") + what + " here");
      seen = true;
    };
    if (token.kind == TokenKind::text) {
      once(parts.statement, "statement");
      label.statement = take().text;
    } else if (token.kind == TokenKind::unit) {
      once(parts.unit, "unit");
      label.unit = take().text;
    } else if (at_word("group")) {
      once(parts.group, "group");
      take();
      const Token& group = peek();
      if (group.kind == TokenKind::text || group.kind == TokenKind::quoted_name)
        label.group = take().text;
      else
        label.group = take_name("a group name after 'group'");
    } else if (at_word("hard") || at_word("soft")) {
      once(parts.hard, "'hard' or 'soft'");
      label.hard = take().text == "hard";
    } else if (at_word("weight") && peek(1).kind == TokenKind::number) {
      once(parts.weight, "weight");
      take();
      const Token& number = take();
      if (*number.value <= 0) fail(number, "a weight above 0 (what relaxing one unit costs)");
      label.weight = *number.value;
    } else if (at_word(decision_keyword) || at_word("source") || at_word("owner")) {
      // Keywords only here, where no name can stand, so models naming a variable 'source' still read.
      const std::string& word = take().text;
      bool& seen = word == "source" ? parts.source : word == "owner" ? parts.owner : parts.decision;
      std::string& field = word == "source" ? label.source : word == "owner" ? label.owner : label.decision;
      if (seen) throw InputError(token.where, "a second '" + word + "'", "one '" + word + "' here");
      seen = true;
      const Token& text = take();
      if (text.kind != TokenKind::text) fail(text, "the " + word + " in double quotes after '" + word + "'");
      field = text.text;
    } else {
      return false;
    }
    return true;
  }

  std::optional<BoundClause> bound_clause() {
    BoundClause clause;
    clause.where = peek().where;
    if (at_word("between")) {
      take();
      BoundValue low = bound_value();
      expect_word("and", "'and' between the two bounds");
      BoundValue high = bound_value();
      clause.sets_lower = clause.sets_upper = true;
      clause.lower = lower_side(low);
      clause.upper = upper_side(high);
    } else if (at_word("at")) {
      take();
      if (at_word("least")) {
        take();
        clause.sets_lower = true;
        clause.lower = lower_side(bound_value());
      } else if (at_word("most")) {
        take();
        clause.sets_upper = true;
        clause.upper = upper_side(bound_value());
      } else {
        fail(peek(), "'least' or 'most' after 'at'");
      }
    } else if (at_word("fixed")) {
      take();
      expect_word("at", "'at' after 'fixed'");
      BoundValue value = bound_value();
      if (value.infinity != 0) throw InputError(value.where, "an infinite fixed value", "a number");
      clause.sets_lower = clause.sets_upper = true;
      clause.lower = clause.upper = value.value;
    } else if (at_word("free")) {
      take();
      clause.sets_lower = clause.sets_upper = true;
    } else {
      return std::nullopt;
    }
    return clause;
  }

  BoundValue bound_value() {
    BoundValue bound;
    bound.where = peek().where;
    std::size_t ahead = at_symbol("+") || at_symbol("-") ? 1 : 0;
    const Token& after = peek(ahead);
    if (after.kind == TokenKind::word && after.text == "infinity") {
      bound.infinity = ahead == 1 && peek().text == "-" ? -1 : +1;
      next_ += ahead + 1;
      return bound;
    }
    bound.value = signed_constant();
    return bound;
  }

  Side lower_side(const BoundValue& bound) {
    if (bound.infinity > 0)
      throw InputError(bound.where, "'infinity' as a lower bound", "a number or -infinity");
    return bound.infinity < 0 ? Side{} : Side{bound.value};
  }
  Side upper_side(const BoundValue& bound) {
    if (bound.infinity < 0)
      throw InputError(bound.where, "'-infinity' as an upper bound", "a number or infinity");
    return bound.infinity > 0 ? Side{} : Side{bound.value};
  }

  // Sets the sides a clause names; each side of a variable is set at most once in the file.
  void apply_bound(int j, const BoundClause& clause, const Label* label) {
    Column& column = model_.columns[j];
    auto claim = [&](long& set_at, const char* side) {
      if (set_at != 0)
        throw InputError(
            clause.where,
            std::string("a second ") + side + " bound for variable '" + shorten(column.name) + "'",
            std::string("one ") + side + " bound per variable (the first is on line " +
                std::to_string(set_at) + ")");
      set_at = clause.where.line;
    };
    if (clause.sets_lower) {
      claim(lower_set_at_[j], "lower");
      column.lower = clause.lower;
      if (label) column.lower_label = *label;
    }
    if (clause.sets_upper) {
      claim(upper_set_at_[j], "upper");
      column.upper = clause.upper;
      if (label) column.upper_label = *label;
    }
    if (column.lower && column.upper && *column.lower > *column.upper)
      model_.warnings.push_back(
          {clause.where, "variable '" + shorten(column.name) +
                             "' has its lower bound above its upper bound: the model cannot hold"});
  }

  // ----- expressions -----

  // [+|-] term { (+|-) term }, or [+|-] infinity on its own.
  LinearForm side() {
    LinearForm form;
    form.where = peek().where;
    std::size_t ahead = at_symbol("+") || at_symbol("-") ? 1 : 0;
    if (peek(ahead).kind == TokenKind::word && peek(ahead).text == "infinity") {
      form.infinity = ahead == 1 && peek().text == "-" ? -1 : +1;
      next_ += ahead + 1;
      return form;
    }
    bool first = true;
    while (true) {
      Rational sign = 1;
      if (at_symbol("+") || at_symbol("-"))
        sign = take().text == "-" ? -1 : 1;
      else if (!first)
        break;
      term(form, sign);
      first = false;
    }
    return form;
  }

  // coefficient [*] variable | coefficient | variable
  void term(LinearForm& form, const Rational& sign) {
    if (peek().kind == TokenKind::number || at_symbol("(")) {
      Rational coefficient = sign * product(0);
      bool times = at_symbol("*");
      if (times) take();
      if (at_name()) {
        const Token& where = peek();
        add_term(form, take_variable(), coefficient, where.where);
      } else if (times) {
        fail(peek(), "a variable or a number after '*'");
      } else {
        const Location where = peek().where;
        form.constant += coefficient;
        within_limits(form.constant, where);
      }
      return;
    }
    if (!at_name()) fail(peek(), "a variable, a number or '('");
    const Token& where = peek();
    add_term(form, take_variable(), sign, where.where);
  }

  // Repeated variables are summed exactly; a repeat within one side is likely a slip, so it is reported.
  void add_term(LinearForm& form, int j, const Rational& coefficient, const Location& where,
                bool report_repeat = true) {
    auto [slot, fresh] = form.position_of.emplace(j, form.terms.size());
    if (fresh) {
      form.terms.emplace_back(j, coefficient);
      return;
    }
    form.terms[slot->second].second += coefficient;
    within_limits(form.terms[slot->second].second, where);
    if (report_repeat)
      model_.warnings.push_back({where, "variable '" + shorten(model_.columns[j].name) +
                                            "' appears twice on one side; its coefficients are added"});
  }

  // Constant arithmetic: factor { (*|/) factor }, stopping before '*' that precedes a variable.
  Rational product(int depth) {
    Rational value = factor(depth);
    while ((at_symbol("*") || at_symbol("/")) && (peek(1).kind == TokenKind::number || peek(1).text == "(")) {
      const Token& operation = take();
      const Token& divisor = peek();
      Rational operand = factor(depth);
      if (operation.text == "*") {
        value *= operand;
      } else {
        if (operand == 0) throw InputError(divisor.where, "a division by zero", "a non-zero divisor");
        value /= operand;
      }
      within_limits(value, operation.where);
    }
    if (at_symbol("/") && peek(1).kind != TokenKind::end && at_name(1))
      fail(peek(1), "a number after '/' (only numbers can be divided)");
    return value;
  }

  // number | ( [+|-] product { (+|-) product } )
  Rational factor(int depth) {
    if (peek().kind == TokenKind::number) return *take().value;
    if (!at_symbol("(")) fail(peek(), "a number or '('");
    const Token& open = take();
    if (depth >= max_parenthesis_depth)
      throw InputError(open.where,
                       "parentheses nested more than " + std::to_string(max_parenthesis_depth) + " deep",
                       "simpler constant arithmetic");
    Rational value = signed_sum(depth + 1);
    expect_symbol(")", "')' closing the '(' at column " + std::to_string(open.where.column));
    return value;
  }

  Rational signed_sum(int depth) {
    Rational value = 0;
    bool first = true;
    while (true) {
      Rational sign = 1;
      if (at_symbol("+") || at_symbol("-"))
        sign = take().text == "-" ? -1 : 1;
      else if (!first)
        break;
      const Token& where = peek();
      value += sign * product(depth);
      within_limits(value, where.where);
      first = false;
    }
    return value;
  }

  // Each result of constant arithmetic is held to the rule every number read obeys: without it a
  // short line of products (1e99999 * 1e99999 * ...) had plumb multiplying for minutes.  Sums of a
  // variable's repeated coefficients and of constants are held to it too (their denominators'
  // least common multiple grows the same way).
  static void within_limits(const Rational& value, const Location& where) {
    if (!numeric::within_limits(value))
      throw InputError(where, "constant arithmetic beyond the limit", numeric::limit_phrase());
  }

  // A bound value: [+|-] constant arithmetic, no variables.
  Rational signed_constant() {
    Rational sign = 1;
    if (at_symbol("+") || at_symbol("-")) sign = take().text == "-" ? -1 : 1;
    if (peek().kind != TokenKind::number && !at_symbol("(")) fail(peek(), "a number, '(' or infinity");
    return sign * product(0);
  }

  // ----- tokens -----

  const Token& peek(std::size_t ahead = 0) const {
    std::size_t k = std::min(next_ + ahead, tokens_.size() - 1);
    return tokens_[k];
  }
  const Token& take() {
    const Token& token = tokens_[next_];
    if (token.kind != TokenKind::end) ++next_;
    return token;
  }
  bool at_word(std::string_view word) const { return peek().kind == TokenKind::word && peek().text == word; }
  bool at_symbol(std::string_view symbol) const {
    return peek().kind == TokenKind::symbol && peek().text == symbol;
  }
  bool at_relation() const { return at_symbol("<=") || at_symbol(">=") || at_symbol("="); }
  bool at_name(std::size_t ahead = 0) const {
    const Token& token = peek(ahead);
    return token.kind == TokenKind::quoted_name ||
           (token.kind == TokenKind::word && !is_reserved_word(token.text));
  }

  std::string take_name(const std::string& expected) {
    const Token& token = peek();
    if (token.kind == TokenKind::word && is_reserved_word(token.text))
      throw InputError(token.where, "the reserved word '" + token.text + "'",
                       expected + " (write '" + token.text + "' in single quotes to use it as a name)");
    if (!at_name()) fail(token, expected);
    return take().text;
  }

  // The name of a new variable or constraint: names are unique within each kind.
  std::string take_new_name(const std::string& kind, const std::unordered_map<std::string, int>& taken,
                            const std::vector<long>& declared_at) {
    const Token& token = peek();
    std::string name = take_name("a " + kind + " name");
    if (auto seen = taken.find(name); seen != taken.end())
      throw InputError(
          token.where, "the " + kind + " name '" + shorten(name) + "' a second time",
          "a new name (it is declared on line " + std::to_string(declared_at[seen->second]) + ")");
    return name;
  }

  int take_variable() {
    const Token& token = peek();
    std::string name = take_name("a variable name");
    auto found = column_by_name_.find(name);
    if (found == column_by_name_.end())
      throw InputError(token.where, "the undeclared variable '" + shorten(name) + "'",
                       "a variable declared above with 'variable'");
    return found->second;
  }

  void expect_symbol(std::string_view symbol, const std::string& expected) {
    if (!at_symbol(symbol)) fail(peek(), expected);
    take();
  }
  void expect_word(std::string_view word, const std::string& expected) {
    if (!at_word(word)) fail(peek(), expected);
    take();
  }
  void expect_end(const std::string& expected) {
    if (peek().kind != TokenKind::end) fail(peek(), expected);
  }
  [[noreturn]] void fail(const Token& token, const std::string& expected) {
    throw InputError(token.where, describe(token), expected);
  }

  // ----- the model -----

  Model build() {
    model_.objective.coefficients.assign(model_.columns.size(), Rational(0));
    for (auto& [j, value] : objective_terms_) model_.objective.coefficients[j] = std::move(value);
    model_.matrix = Matrix::from_entries(model_.row_count(), model_.column_count(), std::move(entries_));
    model_.source.format = "plumb";
    model_.index_names();
    return std::move(model_);
  }

  std::string_view text_;
  const std::string& file_;
  Model model_;
  std::vector<Token> tokens_;  // the statement being read, ending in an end token
  std::size_t next_ = 0;
  long statements_ = 0;
  Location statement_end_;
  long title_line_ = 0;
  long objective_line_ = 0;
  std::vector<std::pair<int, Rational>> objective_terms_;
  std::vector<Entry> entries_;
  // The reader's own symbol table while the model grows; Model::index_names takes over at the end.
  std::unordered_map<std::string, int> column_by_name_;
  std::unordered_map<std::string, int> row_by_name_;
  std::vector<long> column_declared_at_;
  std::vector<long> row_declared_at_;
  std::vector<long> lower_set_at_;  // line that set each bound, 0 while it has its default
  std::vector<long> upper_set_at_;
};

}  // namespace

Model parse_native(std::string_view text, const std::string& file) { return Reader(text, file).run(); }

bool looks_like_native(std::string_view text) {
  std::size_t offset = text.starts_with("\xEF\xBB\xBF") ? 3 : 0;
  while (offset < text.size()) {
    std::size_t end = text.find('\n', offset);
    if (end == std::string_view::npos) end = text.size();
    std::string_view line = text.substr(offset, end - offset);
    offset = end + 1;
    std::size_t first = line.find_first_not_of(" \t\r");
    if (first == std::string_view::npos || line[first] == '#') continue;
    if (first != 0) return false;
    std::size_t word_end = line.find_first_of(" \t\r");
    std::string_view keyword = line.substr(0, word_end);
    return is_statement_keyword(keyword) || keyword == decision_keyword;
  }
  return false;
}

}  // namespace plumb::model::detail
