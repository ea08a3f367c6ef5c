#include "plumb/numeric/rational.hpp"

#include <gtest/gtest.h>

#include <string>
#include <utility>
#include <vector>

using plumb::numeric::Rational;
using plumb::numeric::parse_decimal;
using plumb::numeric::parse_number;

// Decimal semantics: common practice (the value a decimal literal denotes, exactly).
TEST(ParseDecimal, ExactValues) {
  EXPECT_EQ(*parse_decimal("1.1"), Rational(11, 10));
  EXPECT_EQ(*parse_decimal("2.5E-3"), Rational(1, 400));
  EXPECT_EQ(*parse_decimal("-0"), Rational(0));
  EXPECT_EQ(*parse_decimal(".5"), Rational(1, 2));
  EXPECT_EQ(*parse_decimal("1."), Rational(1));
  EXPECT_EQ(*parse_decimal("1e+05"), Rational(100000));
  EXPECT_EQ(*parse_decimal("+7"), Rational(7));
  EXPECT_EQ(*parse_decimal("1234567890123456789012345678901234567890"),
            Rational(plumb::numeric::Integer("1234567890123456789012345678901234567890")));
  EXPECT_EQ(*parse_decimal("0.1234567890123456789012345678901234567891"),
            Rational(plumb::numeric::Integer("1234567890123456789012345678901234567891"),
                     plumb::numeric::Integer("10000000000000000000000000000000000000000")));
}

// Around the edge of the machine-integer reading (18 significant digits, powers of ten up to 18
// either way), each value in lowest terms, as GMP prints it (the value alone would compare equal
// even when not reduced).
TEST(ParseDecimal, ShortAndLongReadingsAgreeAtTheirBoundary) {
  const std::vector<std::pair<const char*, const char*>> cases = {
      {"999999999999999999", "999999999999999999"},
      {"9999999999999999999", "9999999999999999999"},
      {"1e18", "1000000000000000000"},
      {"1e19", "10000000000000000000"},
      {"-12.5e17", "-1250000000000000000"},
      {"0.000000000000000001", "1/1000000000000000000"},
      {"1e-19", "1/10000000000000000000"},
      {"-0.062500", "-1/16"},
      {"123456789.123456789", "123456789123456789/1000000000"},
      {"00000000000000000000000.75", "3/4"}};
  for (const auto& [text, fraction] : cases)
    EXPECT_EQ(plumb::numeric::to_fraction(*parse_decimal(text)), fraction) << text;
}

TEST(ProductSum, EqualsTheSumOfProductsInLowestTerms) {
  const Rational long_integer(plumb::numeric::Integer("123456789012345678901234567890123456789"));
  const std::vector<std::pair<Rational, Rational>> terms = {
      {Rational(3), Rational(7)},         {Rational(1, 10), long_integer}, {Rational(-7, 6), Rational(5, 4)},
      {Rational(0), Rational(9, 11)},     {Rational(2, 3), Rational(0)},   {Rational(1, 6), Rational(-1, 3)},
      {Rational(-3, 1000), long_integer}, {Rational(5, 2), Rational(2, 5)}};
  plumb::numeric::ProductSum sum;
  Rational expected = 0;
  for (const auto& [a, b] : terms) {
    sum.add(a, b);
    expected += a * b;
    EXPECT_EQ(plumb::numeric::to_fraction(sum.value()), plumb::numeric::to_fraction(expected));
  }
  EXPECT_EQ(plumb::numeric::ProductSum().value(), Rational(0));
}

TEST(ParseDecimal, RefusesWhatIsNotANumber) {
  for (const char* bad : {"", "-", ".", "e5", "1e", "1e+", "1.2.3", "0x10", "1,5", " 1", "1 ", "inf", "nan", "1e100001"})
    EXPECT_FALSE(parse_decimal(bad)) << bad;
}

TEST(ParseNumber, Fractions) {
  EXPECT_EQ(*parse_number("3/8"), Rational(3, 8));
  EXPECT_EQ(*parse_number("-6/4"), Rational(-3, 2));
  EXPECT_EQ(*parse_number("1.5/3"), Rational(1, 2));
  EXPECT_FALSE(parse_number("1/0"));
  EXPECT_FALSE(parse_number("1/"));
}

TEST(Printing, FractionAndDecimal) {
  EXPECT_EQ(plumb::numeric::to_fraction(Rational(-6, 4)), "-3/2");
  EXPECT_EQ(plumb::numeric::to_fraction(Rational(5)), "5");
  auto third = plumb::numeric::to_decimal(Rational(1, 3), 6);
  EXPECT_EQ(third.text, "0.333333");
  EXPECT_TRUE(third.rounded);
  auto exact = plumb::numeric::to_decimal(Rational(-464753142857, 1000000000), 12);
  EXPECT_EQ(exact.text, "-464.753142857");
  EXPECT_FALSE(exact.rounded);
  EXPECT_EQ(plumb::numeric::to_decimal(Rational(2, 3), 3).text, "0.667");
  EXPECT_EQ(plumb::numeric::to_decimal(Rational(999999, 1000000), 3).text, "1");
  EXPECT_EQ(plumb::numeric::to_decimal(*parse_decimal("1e30"), 12).text, "1e+30");
  EXPECT_EQ(plumb::numeric::to_decimal(*parse_decimal("-2.5e-9"), 12).text, "-2.5e-9");
  EXPECT_EQ(plumb::numeric::to_display(Rational(1, 3), 4), "~0.3333");
}

// Text shows an exact value only up to 24 characters; beyond, the rounded decimal marked "~" and the
// length of the exact fraction (issue 15's rule for numbers people read).
TEST(ExactAndDecimal, ShortExactLongRoundedWithItsLength) {
  using plumb::numeric::exact_and_decimal;
  EXPECT_EQ(exact_and_decimal(Rational(13)), "13");
  EXPECT_EQ(exact_and_decimal(Rational(1, 8)), "1/8 (0.125)");
  EXPECT_EQ(exact_and_decimal(Rational(218176400, 237)), "218176400/237 (~920575.527426)");
  // 24 characters: shown in full; 25: rounded, with the 24 digits of the fraction counted.
  Rational at_limit = 1 / *parse_decimal("1000000000000000000001");
  EXPECT_EQ(exact_and_decimal(at_limit), "1/1000000000000000000001 (~1e-21)");
  Rational over_limit = 1 / *parse_decimal("10000000000000000000001");
  EXPECT_EQ(exact_and_decimal(over_limit), "~1e-22 (a fraction of 24 digits)");
}

TEST(CanonicalFraction, StrictForm) {
  using plumb::numeric::parse_canonical_fraction;
  EXPECT_EQ(*parse_canonical_fraction("-3/2", 100), Rational(-3, 2));
  EXPECT_EQ(*parse_canonical_fraction("0", 100), Rational(0));
  EXPECT_EQ(*parse_canonical_fraction("10/3", 100), Rational(10, 3));
  EXPECT_EQ(*parse_canonical_fraction("-100", 100), Rational(-100));
  for (const char* bad : {"6/4", "-0", "01", "3/-2", "3/0", "+3", "1.5", "3/1", "", "1/2/3", "3/02", "0/5",
                          "-0/5", "-4/6", "00", "-01/2"})
    EXPECT_FALSE(parse_canonical_fraction(bad, 100)) << bad;
  EXPECT_FALSE(parse_canonical_fraction("123456", 5));
}
