#include "number_text.hpp"

#include <algorithm>

namespace plumb::model::detail {

using numeric::Integer;

std::string integer_text(const Integer& value) {
  std::string digits = value.str();
  std::size_t zeros = 0;
  while (zeros + 1 < digits.size() && digits[digits.size() - 1 - zeros] == '0') ++zeros;
  if (zeros <= 6) return digits;
  return digits.substr(0, digits.size() - zeros) + "e" + std::to_string(zeros);
}

std::optional<std::string> decimal_text(const numeric::Rational& magnitude, bool unless_far_longer) {
  Integer numerator = abs(boost::multiprecision::numerator(magnitude));
  Integer denominator = boost::multiprecision::denominator(magnitude);
  // The powers of 2 and 5 in the denominator, by GMP's bit scan and factor removal: dividing by 2
  // and 5 one at a time took seconds on a denominator of 86 784 digits.
  Integer rest;
  const long twos = static_cast<long>(mpz_scan1(denominator.backend().data(), 0));
  mpz_tdiv_q_2exp(rest.backend().data(), denominator.backend().data(), static_cast<mp_bitcnt_t>(twos));
  const Integer five = 5;
  const long fives =
      static_cast<long>(mpz_remove(rest.backend().data(), rest.backend().data(), five.backend().data()));
  if (rest != 1 || (unless_far_longer && twos > 3 * fives + 64)) return std::nullopt;
  long places = std::max(twos, fives);
  Integer ten_power;
  mpz_ui_pow_ui(ten_power.backend().data(), 10, static_cast<unsigned long>(places));
  std::string digits = Integer(numerator * ten_power / denominator).str();
  long exponent = -places;
  while (digits.size() > 1 && digits.back() == '0') digits.pop_back(), ++exponent;
  if (exponent >= 0)
    return exponent <= 6 ? digits + std::string(static_cast<std::size_t>(exponent), '0')
                         : digits + "e" + std::to_string(exponent);
  long before_point = static_cast<long>(digits.size()) + exponent;
  if (before_point > 0)
    return digits.substr(0, static_cast<std::size_t>(before_point)) + "." +
           digits.substr(static_cast<std::size_t>(before_point));
  if (before_point >= -6) return "0." + std::string(static_cast<std::size_t>(-before_point), '0') + digits;
  return digits + "e" + std::to_string(exponent);
}

}  // namespace plumb::model::detail
