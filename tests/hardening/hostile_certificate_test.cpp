// Hostile certificates beyond the reader's own tests: huge JSON numbers where the schema allows
// any JSON (extra keys), counts past every integer type, escapes that make odd names, and a
// million entries.  Each must end in InputError or a verdict, never a crash.  Constructed cases.
#include "plumb/certificate/certificate.hpp"
#include "plumb/check/check.hpp"

#include <gtest/gtest.h>

#include <string>

namespace plumb::certificate {
namespace {

using model::InputError;
using numeric::Rational;

// A feasible-point certificate for a one-column model, with `extra` spliced in as further keys.
std::string feasible_with(const std::string& extra, const std::string& x = R"({"c": "1"})",
                          const std::string& rows = "1", const std::string& columns = "1") {
  return R"({"plumb_certificate": 1, "model": {"file": "m", "sha256": "", "rows": )" + rows + R"(, "columns": )" +
         columns + R"(}, "status": "feasible", "x": )" + x + extra + "}";
}

model::Model one_column() {
  return model::ModelBuilder("one").column("c", Rational(1)).row("r", {{"c", Rational(1)}}, Rational(0), {}).build();
}

// Reads text; returns the InputError message, or "" when it was accepted (then it must also
// verify without throwing and write back to text that reads again).
std::string outcome_of(const std::string& text) {
  Certificate c;
  try {
    c = parse_certificate(text, "hostile.json");
  } catch (const InputError& e) {
    return e.what();
  }
  check::verify(one_column(), c);
  std::string written = to_json_text(c);
  EXPECT_EQ(to_json_text(parse_certificate(written, "rewritten.json")), written);
  return "";
}

TEST(HostileCertificate, MillionDigitJsonNumbersInExtraKeys) {
  std::string digits(1000000, '9');
  for (const std::string& number :
       {digits, "-" + digits, "0." + digits, digits + "e999999999", std::string("1e-999999999")}) {
    SCOPED_TRACE(number.substr(0, 20));
    EXPECT_NO_FATAL_FAILURE(outcome_of(feasible_with(R"(, "note": )" + number)));
  }
}

TEST(HostileCertificate, CountsPastEveryIntegerType) {
  for (const char* count : {"18446744073709551616", "9223372036854775808", "-1", "1e400", "1.5", "2e0"}) {
    SCOPED_TRACE(count);
    EXPECT_NE(outcome_of(feasible_with("", R"({"c": "1"})", count)), "");
  }
}

TEST(HostileCertificate, EscapedNamesAreJustNamesTheModelLacks) {
  for (const char* name : {R"("\u0000")", R"("c\u0000")", R"("\ud83d\ude00")", R"("\"")", R"("")"}) {
    SCOPED_TRACE(name);
    std::string text = feasible_with("", std::string("{") + name + R"(: "1"})");
    if (outcome_of(text).empty()) {
      EXPECT_FALSE(check::verify(one_column(), parse_certificate(text, "hostile.json")).valid);
    }
  }
  EXPECT_NE(outcome_of(feasible_with("", R"({"\ud800": "1"})")), "");  // a lone surrogate is not text
}

// A quarter of a million names the model lacks: read in time linear in the entries (a reader that
// scanned each object's keys for every new key took over 15 minutes on a million, so a minute or
// more here), and refused by the checker with the first wrong name, not all of them.
TEST(HostileCertificate, AQuarterMillionEntriesNamingNothing) {
  std::string x = "{";
  for (int k = 0; k < 250000; ++k) x += (k ? ",\"v" : "\"v") + std::to_string(k) + "\":\"1\"";
  x += "}";
  std::string text = feasible_with("", x);
  ASSERT_EQ(outcome_of(text), "") << "names are the checker's to refuse, not the reader's";
  check::Verdict verdict = check::verify(one_column(), parse_certificate(text, "hostile.json"));
  EXPECT_FALSE(verdict.valid);
  EXPECT_EQ(verdict.failure, "x names column v0, which the model does not have");
}

}  // namespace
}  // namespace plumb::certificate
