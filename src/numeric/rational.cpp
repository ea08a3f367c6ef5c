#include "plumb/numeric/rational.hpp"

#include <algorithm>
#include <cmath>
#include <cstdint>
#include <cstdlib>
#include <numeric>

namespace plumb::numeric {
namespace {

bool is_digit(char c) { return c >= '0' && c <= '9'; }

Integer power_of_ten(long exponent) {
  Integer result;
  mpz_ui_pow_ui(result.backend().data(), 10, static_cast<unsigned long>(exponent));
  return result;
}

std::optional<Rational> fail(ParseFailure* why, std::string reason) {
  if (why) why->reason = std::move(reason);
  return std::nullopt;
}

// A decimal of at most 18 significant digits and a power of ten up to 10^18 either way, in
// machine integers: nearly every number of a model file is one, and the text-to-GMP conversion
// and a GMP gcd for each had been most of the time spent reading a model.
Rational machine_decimal(std::string_view digits, std::size_t first, long scale, bool negative) {
  std::uint64_t mantissa = 0;
  for (char c : digits.substr(first)) mantissa = mantissa * 10 + static_cast<std::uint64_t>(c - '0');
  std::uint64_t power = 1;
  for (long k = 0; k < std::abs(scale); ++k) power *= 10;
  std::uint64_t denominator = 1;
  if (scale >= 0) {
    mantissa *= power;
  } else {
    std::uint64_t common = std::gcd(mantissa, power);
    mantissa /= common;
    denominator = power / common;
  }
  Rational value;
  mpq_ptr q = value.backend().data();
  mpz_set_ui(mpq_numref(q), mantissa);
  if (negative) mpz_neg(mpq_numref(q), mpq_numref(q));
  mpz_set_ui(mpq_denref(q), denominator);
  return value;
}

}  // namespace

std::optional<Rational> parse_decimal(std::string_view text, ParseFailure* why) {
  std::size_t i = 0;
  bool negative = false;
  if (i < text.size() && (text[i] == '+' || text[i] == '-')) negative = text[i++] == '-';
  std::string digits;  // integer and fraction digits run together
  long fraction_digits = 0;
  bool any_digit = false;
  while (i < text.size() && is_digit(text[i])) digits += text[i++], any_digit = true;
  if (i < text.size() && text[i] == '.') {
    ++i;
    while (i < text.size() && is_digit(text[i])) digits += text[i++], ++fraction_digits, any_digit = true;
  }
  if (!any_digit) return fail(why, "a number");
  // A cheap bound on the written exponent first, so that no huge power of ten is ever built;
  // the exact rule (within_limits) is checked on the value.  The decimal text of an accepted
  // value can carry an exponent up to log2(10) times the limit, hence the factor 4.
  const long written_limit = 4 * max_decimal_exponent + static_cast<long>(digits.size());
  long exponent = 0;
  if (i < text.size() && (text[i] == 'e' || text[i] == 'E')) {
    ++i;
    bool exponent_negative = false;
    if (i < text.size() && (text[i] == '+' || text[i] == '-')) exponent_negative = text[i++] == '-';
    if (i >= text.size() || !is_digit(text[i])) return fail(why, "digits after the exponent mark");
    while (i < text.size() && is_digit(text[i])) {
      exponent = exponent * 10 + (text[i++] - '0');
      if (exponent > written_limit) return fail(why, limit_phrase());
    }
    if (exponent_negative) exponent = -exponent;
  }
  if (i != text.size()) return fail(why, "a number");
  std::size_t first = digits.find_first_not_of('0');
  if (first == std::string::npos) return Rational(0);
  long significant = static_cast<long>(digits.size() - first);
  long scale = exponent - fraction_digits;
  if (significant + scale > max_decimal_exponent + 1) return fail(why, limit_phrase());  // |value| >= 10^(max+1)
  if (significant <= 18 && scale >= -18 && significant + scale <= 18)
    return machine_decimal(digits, first, scale, negative);
  Integer mantissa(digits.substr(first));
  if (negative) mantissa = -mantissa;
  Rational value = scale >= 0 ? Rational(mantissa * power_of_ten(scale)) : Rational(mantissa, power_of_ten(-scale));
  if (!within_limits(value)) return fail(why, limit_phrase());
  return value;
}

std::optional<Rational> parse_number(std::string_view text, ParseFailure* why) {
  std::size_t slash = text.find('/');
  if (slash == std::string_view::npos) return parse_decimal(text, why);
  auto numerator = parse_decimal(text.substr(0, slash), why);
  if (!numerator) return std::nullopt;
  auto denominator = parse_decimal(text.substr(slash + 1), why);
  if (!denominator) return std::nullopt;
  if (*denominator == 0) return fail(why, "a non-zero denominator");
  Rational value = *numerator / *denominator;
  if (!within_limits(value)) return fail(why, limit_phrase());
  return value;
}

std::string to_fraction(const Rational& value) {
  return value.str();  // GMP keeps mpq canonical: "p" or "p/q", q > 0, lowest terms
}

// It bounds the value itself, not its text, so every accepted number reads back from any exact
// rendering of it (decimal or p/q).
bool within_limits(const Rational& value) {
  static const Integer bound = power_of_ten(max_decimal_exponent);
  return mpz_cmpabs(mpq_numref(value.backend().data()), bound.backend().data()) <= 0 &&
         mpz_cmp(mpq_denref(value.backend().data()), bound.backend().data()) <= 0;
}

std::string limit_phrase() {
  const std::string limit = std::to_string(max_decimal_exponent);
  return "an exponent of at most " + limit + " (numerator and denominator in lowest terms at most 1e" +
         limit + ")";
}

std::optional<Rational> parse_canonical_fraction(std::string_view text, std::size_t max_digits,
                                                 ParseFailure* why) {
  std::size_t i = 0;
  if (i < text.size() && text[i] == '-') ++i;
  std::size_t numerator_start = i;
  while (i < text.size() && is_digit(text[i])) ++i;
  std::size_t numerator_digits = i - numerator_start;
  if (numerator_digits == 0) return fail(why, "a rational \"p\" or \"p/q\" of decimal digits");
  std::size_t denominator_digits = 0;
  if (i < text.size() && text[i] == '/') {
    std::size_t start = ++i;
    while (i < text.size() && is_digit(text[i])) ++i;
    denominator_digits = i - start;
    if (denominator_digits == 0) return fail(why, "digits after '/'");
  }
  if (i != text.size()) return fail(why, "a rational \"p\" or \"p/q\" of decimal digits");
  if (numerator_digits + denominator_digits > max_digits)
    return fail(why, "at most " + std::to_string(max_digits) + " digits");
  Rational value;
  std::string copy(text);
  if (mpq_set_str(value.backend().data(), copy.c_str(), 10) != 0)
    return fail(why, "a rational \"p\" or \"p/q\" of decimal digits");
  if (denominator_digits > 0 && mpz_sgn(mpq_denref(value.backend().data())) == 0)
    return fail(why, "a non-zero denominator");
  // Canonical means GMP would print exactly this text back: no leading zeros, no "-0", no "/1",
  // lowest terms.  Checked on the text and by one gcd: printing the value back (a conversion to
  // decimal of every long fraction of a certificate) had been a third of reading one.
  auto leading_zero = [&](std::size_t start, std::size_t digits) { return digits > 1 && text[start] == '0'; };
  std::size_t denominator_start = numerator_start + numerator_digits + 1;
  mpq_ptr q = value.backend().data();
  bool canonical = !leading_zero(numerator_start, numerator_digits) &&
                   !(mpz_sgn(mpq_numref(q)) == 0 && (numerator_start > 0 || denominator_digits > 0));
  if (canonical && denominator_digits > 0) {
    Integer common;
    mpz_gcd(common.backend().data(), mpq_numref(q), mpq_denref(q));
    canonical = !leading_zero(denominator_start, denominator_digits) && mpz_cmp_ui(mpq_denref(q), 1) != 0 &&
                common == 1;
  }
  if (!canonical) {
    mpq_canonicalize(q);
    return fail(why, "the canonical form \"" + to_fraction(value) + "\"");
  }
  return value;
}

Decimal to_decimal(const Rational& value, int significant) {
  if (significant < 1) significant = 1;
  if (value == 0) return {"0", false};
  Integer numerator = abs(boost::multiprecision::numerator(value));
  Integer denominator = boost::multiprecision::denominator(value);
  // Find the decimal exponent e with 10^e <= |value| < 10^(e+1), from the digit counts (GMP's
  // may be one too many; the loops settle it).  Printing both to count their digits had been two
  // of the three conversions to decimal per long value of a solution's output.
  long exponent = static_cast<long>(mpz_sizeinbase(numerator.backend().data(), 10)) -
                  static_cast<long>(mpz_sizeinbase(denominator.backend().data(), 10));
  auto scaled_compare = [&](long e) {  // |value| >= 10^e ?
    return e >= 0 ? numerator >= denominator * power_of_ten(e) : numerator * power_of_ten(-e) >= denominator;
  };
  while (!scaled_compare(exponent)) --exponent;
  while (scaled_compare(exponent + 1)) ++exponent;
  // digits = round(|value| * 10^(significant-1-exponent)), half away from zero.
  long shift = significant - 1 - exponent;
  Integer top = shift >= 0 ? numerator * power_of_ten(shift) : numerator;
  Integer bottom = shift >= 0 ? denominator : denominator * power_of_ten(-shift);
  Integer quotient = top / bottom;
  Integer remainder = top - quotient * bottom;
  bool rounded = remainder != 0;
  if (2 * remainder >= bottom) ++quotient;
  std::string digits = quotient.str();
  if (static_cast<int>(digits.size()) > significant) {  // rounding carried into a new digit
    digits.pop_back();
    ++exponent;
  }
  while (digits.size() > 1 && digits.back() == '0') digits.pop_back();
  std::string text = value < 0 ? "-" : "";
  long point = exponent + 1;  // digits before the decimal point
  if (exponent >= -5 && exponent < significant + 3) {
    if (point <= 0) {
      text += "0." + std::string(static_cast<std::size_t>(-point), '0') + digits;
    } else if (point >= static_cast<long>(digits.size())) {
      text += digits + std::string(static_cast<std::size_t>(point) - digits.size(), '0');
    } else {
      text += digits.substr(0, static_cast<std::size_t>(point)) + "." + digits.substr(static_cast<std::size_t>(point));
    }
  } else {
    text += digits.substr(0, 1);
    if (digits.size() > 1) text += "." + digits.substr(1);
    text += (exponent < 0 ? "e-" : "e+") + std::to_string(std::labs(exponent));
  }
  return {text, rounded};
}

std::string to_display(const Rational& value, int significant) {
  Decimal decimal = to_decimal(value, significant);
  return decimal.rounded ? "~" + decimal.text : decimal.text;
}

std::string exact_and_decimal(const Rational& value) {
  std::string exact = to_fraction(value);
  Decimal decimal = to_decimal(value);
  if (exact.size() > readable_fraction_length) {
    auto digits = std::count_if(exact.begin(), exact.end(), [](char c) { return c >= '0' && c <= '9'; });
    return "~" + decimal.text + " (a fraction of " + std::to_string(digits) + " digits)";
  }
  if (decimal.text == exact) return exact;
  return exact + " (" + (decimal.rounded ? "~" : "") + decimal.text + ")";
}

CommonDenominator over_common_denominator(const std::vector<Rational>& v) {
  // On GMP's own integers in place: the checker calls this for every certificate vector, mostly
  // zeros, and boost's numerator() and denominator() copy (an allocation per entry).
  CommonDenominator result;
  result.denominator = 1;
  mpz_ptr common = result.denominator.backend().data();
  // Divisibility first: it is cheaper than the lcm it usually makes unnecessary.
  for (const Rational& q : v) {
    mpz_srcptr d = mpq_denref(q.backend().data());
    if (!mpz_divisible_p(common, d)) mpz_lcm(common, common, d);
  }
  result.numerators.resize(v.size());
  Integer factor;
  for (std::size_t k = 0; k < v.size(); ++k) {
    mpq_srcptr q = v[k].backend().data();
    if (mpz_sgn(mpq_numref(q)) == 0) continue;
    mpz_divexact(factor.backend().data(), common, mpq_denref(q));
    mpz_mul(mpq_numref(result.numerators[k].backend().data()), mpq_numref(q), factor.backend().data());
  }
  return result;
}

void ProductSum::add(const Rational& a, const Rational& b) {
  mpq_srcptr x = a.backend().data(), y = b.backend().data();
  if (mpq_sgn(x) == 0 || mpq_sgn(y) == 0) return;
  mpz_ptr n = numerator_.backend().data(), l = denominator_.backend().data();
  mpz_ptr p = product_.backend().data(), q = product_denominator_.backend().data();
  mpz_mul(q, mpq_denref(x), mpq_denref(y));
  if (!mpz_divisible_p(l, q)) {
    mpz_lcm(p, l, q);       // the new common multiple L'
    mpz_divexact(l, p, l);  // L' / L, to rescale N
    mpz_mul(n, n, l);
    mpz_swap(l, p);
  }
  mpz_divexact(q, l, q);  // L / q
  mpz_mul(p, mpq_numref(x), mpq_numref(y));
  mpz_mul(p, p, q);
  mpz_add(n, n, p);
}

Rational ProductSum::value() const { return Rational(numerator_, denominator_); }

double to_double(const Rational& value) {
  // Numerator and denominator below 2^53 are exact doubles, and IEEE division rounds their
  // quotient correctly; that covers nearly every number read from a file, at a fraction of the
  // cost of mpq_get_d (which truncates).
  constexpr mp_limb_t exact_limit = mp_limb_t{1} << 53;
  mpq_srcptr q = value.backend().data();
  mpz_srcptr numerator = mpq_numref(q), denominator = mpq_denref(q);
  if (mpz_size(numerator) <= 1 && mpz_size(denominator) == 1 && mpz_getlimbn(numerator, 0) < exact_limit &&
      mpz_getlimbn(denominator, 0) < exact_limit) {
    double magnitude = static_cast<double>(mpz_getlimbn(numerator, 0)) / static_cast<double>(mpz_getlimbn(denominator, 0));
    return mpz_sgn(numerator) < 0 ? -magnitude : magnitude;
  }
  return mpq_get_d(q);
}

}  // namespace plumb::numeric
