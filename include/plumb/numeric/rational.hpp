// Exact rational numbers: the one number type every input and result goes through.
#pragma once

#include <boost/multiprecision/gmp.hpp>

#include <optional>
#include <string>
#include <string_view>
#include <vector>

namespace plumb::numeric {

using Rational = boost::multiprecision::mpq_rational;
using Integer = boost::multiprecision::mpz_int;

// Why a number's text was refused; `expected` is a phrase fit for "expected ...".
struct ParseFailure {
  std::string reason;
};

// Decimal text exactly as written: [+-]digits[.digits][(e|E)[+-]digits], ".5" and "1." included.
// Never goes through double.  A value whose numerator or denominator in lowest terms exceeds
// 10^max_decimal_exponent is refused, so a hostile "1e999999999" cannot exhaust memory and every
// accepted value reads back from any exact rendering of it (this rule holds for parse_number too).
constexpr long max_decimal_exponent = 100000;
std::optional<Rational> parse_decimal(std::string_view text, ParseFailure* why = nullptr);

// A decimal as above, or a fraction "p/q" of two decimals (q != 0), as the native format allows.
std::optional<Rational> parse_number(std::string_view text, ParseFailure* why = nullptr);

// The rule of max_decimal_exponent: numerator and denominator in lowest terms at most
// 10^max_decimal_exponent (readers that compute values, such as the native format's constant
// arithmetic, hold each result to it); limit_phrase() words it for "expected ...".
bool within_limits(const Rational& value);
std::string limit_phrase();

// Canonical fraction text "-?[0-9]+(/[0-9]+)?": lowest terms, positive denominator.
std::string to_fraction(const Rational& value);

// Strict inverse of to_fraction: accepts only canonical text, at most max_digits digits in all.
std::optional<Rational> parse_canonical_fraction(std::string_view text, std::size_t max_digits,
                                                 ParseFailure* why = nullptr);

// A decimal rendering with at most `significant` significant digits.
struct Decimal {
  std::string text;  // e.g. "-464.753142857", "1.2e+30"
  bool rounded;      // true when text is not exactly the value
};
Decimal to_decimal(const Rational& value, int significant = 12);

// "text" when exact, "~text" when rounded: the form used in human-readable output.
std::string to_display(const Rational& value, int significant = 12);

// The one human-readable form of an exact value, shared by every text rendering (checker included):
// "42", "1/8 (0.125)", "1/3 (~0.333333333333)".  A fraction too long to read (more than
// readable_fraction_length characters) is shown as its rounded decimal, marked rounded by "~",
// with the count of digits of the exact fraction: "~5501.84588829 (a fraction of 1076 digits)".
// Exact values in full belong in JSON and certificates.
constexpr std::size_t readable_fraction_length = 24;
std::string exact_and_decimal(const Rational& value);

// v as N / L: integer numerators N_k = v_k L over the least common denominator L > 0.  A sum of
// products with v then adds fractions with the other factors' (short) denominators, and one
// division by L at the end is its only gcd of long numbers: at bases with long determinants a
// solution holds thousands of fractions of thousands of digits, all dividing one denominator, and
// adding them directly costs a gcd of long numbers per term.
struct CommonDenominator {
  std::vector<Rational> numerators;  // integers, held as rationals to mix with other fractions
  Integer denominator;
};
CommonDenominator over_common_denominator(const std::vector<Rational>& v);

// A sum of products a * b kept as N / L with L a common multiple of the products' denominators:
// adding a term costs multiplications and a divisibility test, and only value() takes a gcd.
// Summing Rationals directly took two gcds per term, most of a certificate check's sums.
class ProductSum {
 public:
  void add(const Rational& a, const Rational& b);
  Rational value() const;

 private:
  Integer numerator_ = 0;
  Integer denominator_ = 1;
  Integer product_;  // scratch, kept to reuse its allocation
  Integer product_denominator_;
};

// A double within one ulp (rounded to nearest when numerator and denominator are below 2^53, else
// truncated by GMP), for floating-point search and filters only: never for a decision on its own.
double to_double(const Rational& value);

}  // namespace plumb::numeric
