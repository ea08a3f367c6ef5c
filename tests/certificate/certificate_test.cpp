// Certificate JSON: deterministic writing, canonical round trips, and a strict reader that refuses
// hostile input quickly and says where.
#include "plumb/certificate/certificate.hpp"

#include <gtest/gtest.h>

#include <string>

namespace {

using plumb::certificate::Certificate;
using plumb::certificate::Entry;
using plumb::certificate::EntryKind;
using plumb::certificate::Limit;
using plumb::certificate::parse_certificate;
using plumb::certificate::ReadLimits;
using plumb::certificate::Status;
using plumb::certificate::to_json_text;
using plumb::model::InputError;
using plumb::numeric::Rational;

Certificate sample() {
  Certificate c;
  c.model = {"blend.mps", std::string(64, 'c'), 2, 3, Rational(-7, 2)};
  c.status = Status::optimal;
  c.objective = Rational(12345, 7);
  c.x = {{"x1", Rational(3, 2)}, {"NAME WITH SPACES", 0}, {"x \"3\"", -4}};
  c.y = {{"r1", Rational(-1, 3)}};
  c.extra["basis"] = {{"x1", "basic"}};
  return c;
}

const char* sample_text = R"({
  "plumb_certificate": 1,
  "model": {
    "file": "blend.mps",
    "sha256": "cccccccccccccccccccccccccccccccccccccccccccccccccccccccccccccccc",
    "rows": 2,
    "columns": 3,
    "objective_constant": "-7/2"
  },
  "status": "optimal",
  "objective": "12345/7",
  "x": {
    "x1": "3/2",
    "x \"3\"": "-4"
  },
  "y": {
    "r1": "-1/3"
  },
  "basis": {
    "x1": "basic"
  }
}
)";

// Every refusal is an InputError whose message contains `phrase`.
void expect_refused(const std::string& text, const std::string& phrase, const ReadLimits& limits = {}) {
  try {
    parse_certificate(text, "c.json", limits);
    ADD_FAILURE() << "accepted: " << text.substr(0, 200);
  } catch (const InputError& error) {
    EXPECT_NE(std::string(error.what()).find(phrase), std::string::npos) << error.what();
  }
}

// A valid optimal certificate with one rational replaced.
std::string with_value(const std::string& value) {
  return R"({"plumb_certificate": 1, "model": {"file": "m", "sha256": "", "rows": 1, "columns": 1},
 "status": "optimal", "objective": "0", "x": {"c": )" +
         value + R"(}, "y": {}})";
}

TEST(CertificateWriter, DeterministicBytesInAFixedLayout) {
  EXPECT_EQ(to_json_text(sample()), sample_text);
  EXPECT_EQ(to_json_text(sample()), to_json_text(sample()));
}

TEST(CertificateWriter, RefusesPartsTheStatusDoesNotHave) {
  Certificate c = sample();
  c.status = Status::infeasible;
  EXPECT_THROW(to_json_text(c), std::invalid_argument);
  c = sample();
  c.extra["status"] = "feasible";
  EXPECT_THROW(to_json_text(c), std::invalid_argument);
}

TEST(CertificateWriter, RefusesNamesThatAreNotUtf8) {
  Certificate c = sample();
  c.x[0].first = "caf\xe9";  // Latin-1, as an MPS file may hold
  EXPECT_THROW(to_json_text(c), std::invalid_argument);
}

TEST(CertificateReader, CanonicalRoundTrip) {
  Certificate c = parse_certificate(sample_text, "c.json");
  EXPECT_EQ(to_json_text(c), sample_text);
  EXPECT_EQ(c.model.file, "blend.mps");
  EXPECT_EQ(c.model.objective_constant, Rational(-7, 2));
  EXPECT_EQ(c.objective, Rational(12345, 7));
  ASSERT_EQ(c.x.size(), 2u);
  EXPECT_EQ(c.x[1].first, "x \"3\"");
  EXPECT_EQ(c.x[1].second, -4);
  EXPECT_EQ(c.extra["basis"]["x1"], "basic");
}

TEST(CertificateReader, EveryStatusRoundTrips) {
  for (Status status : {Status::infeasible, Status::unbounded, Status::feasible}) {
    Certificate c;
    c.model = {"m", "", 1, 1, std::nullopt};
    c.status = status;
    auto parts = plumb::certificate::parts_of(status);
    if (parts.x) c.x = {{"c", 1}};
    if (parts.y) c.y = {{"r", -1}};
    if (parts.ray) c.ray = {{"c", Rational(1, 2)}};
    std::string text = to_json_text(c);
    Certificate back = parse_certificate(text, "c.json");
    EXPECT_EQ(back.status, status);
    EXPECT_FALSE(back.model.objective_constant);  // absent stays absent: the model's constant applies
    EXPECT_EQ(to_json_text(back), text);
  }
}

TEST(CertificateReader, KeepsZeroEntriesSoTheirNamesAreChecked) {
  Certificate c = parse_certificate(with_value("\"0\""), "c.json");
  ASSERT_EQ(c.x.size(), 1u);
  EXPECT_EQ(c.x[0].second, 0);
}

TEST(CertificateReader, RefusesNonCanonicalRationals) {
  // Canonical form: common practice for exact rationals (lowest terms, positive denominator).
  expect_refused(with_value("\"6/4\""), "expected the canonical form \"3/2\"");
  expect_refused(with_value("\"-0\""), "expected the canonical form \"0\"");
  expect_refused(with_value("\"+1\""), "found the string \"+1\"");
  expect_refused(with_value("\"01\""), "expected the canonical form \"1\"");
  expect_refused(with_value("\"1.5\""), "found the string \"1.5\"");
  expect_refused(with_value("\"3/1\""), "expected the canonical form \"3\"");
  expect_refused(with_value("\"1/0\""), "expected a non-zero denominator");
  expect_refused(with_value("\"1/-2\""), "found the string \"1/-2\"");
  expect_refused(with_value("\"-1/-2\""), "found the string \"-1/-2\"");
  expect_refused(with_value("\"\""), "found the string \"\"");
  expect_refused(with_value("\" 1\""), "found the string \" 1\"");
}

TEST(CertificateReader, QuotesALongStringWithoutCuttingACharacter) {
  // Found by the certificate fuzzer (tests/data/fuzz-regressions/certificate/): the excerpt of a long
  // string was cut at byte 24, inside a three-byte character, and quoting it threw.
  std::string text = std::string(23, 'a') + "\xe4\x84\x81" + std::string(20, 'b');  // U+4101 at bytes 23-25
  expect_refused(with_value("\"" + text + "\""),
                 "found the string \"" + std::string(23, 'a') + "\"... (46 bytes)");
}

TEST(CertificateReader, RefusesNumbersWhereRationalsBelong) {
  expect_refused(with_value("1"), "found the number 1, expected a rational written as a string");
  expect_refused(with_value("0.1"), "found the number 0.1");
  expect_refused(with_value("1e400"), "c.json:2:56: found invalid JSON (number overflow parsing '1e400')");
  expect_refused(with_value("null"), "found null");
  expect_refused(with_value("[\"1\"]"), "found an array");
  expect_refused(with_value("true"), "found the value true");
}

TEST(CertificateReader, RefusesAMillionDigitNumeratorBeforeArithmetic) {
  std::string huge(1000000, '7');
  expect_refused(with_value("\"" + huge + "\""), "expected at most 100000 digits");
  expect_refused(with_value("\"1/" + huge + "\""), "expected at most 100000 digits");
  std::string just_enough(100000, '7');
  EXPECT_NO_THROW(parse_certificate(with_value("\"" + just_enough + "\""), "c.json"));
}

TEST(CertificateReader, RefusesDuplicateKeysWithTheirLine) {
  std::string text =
      "{\"plumb_certificate\": 1,\n \"model\": {\"file\": \"m\", \"sha256\": \"\", \"rows\": 1, \"columns\": "
      "1},\n"
      " \"status\": \"feasible\",\n \"x\": {\"c\": \"1\",\n   \"c\": \"2\"}}";
  expect_refused(text, "c.json:5:4: found the key \"c\" a second time in one object");
  expect_refused(R"({"plumb_certificate": 1, "plumb_certificate": 1})",
                 "c.json:1:26: found the key \"plumb_certificate\" a second time");
  expect_refused(R"({"plumb_certificate": 1, "status": "feasible", "status": "optimal"})", "a second time");
  expect_refused(with_value(R"("1", "\u0063": "2")"),
                 "found the key \"c\" a second time");  // same name once decoded
}

TEST(CertificateReader, RefusesDeepNestingWithoutRecursion) {
  std::string deep(100000, '[');
  expect_refused(deep, "nested deeper than 16 levels");
  std::string deep_objects;
  for (int i = 0; i < 100000; ++i) deep_objects += "{\"a\":";
  expect_refused(deep_objects, "c.json:1:81: found objects and arrays nested deeper than 16 levels");
  std::string extra_nested = R"({"plumb_certificate": 1, "status": "feasible", "basis": )" +
                             std::string(20, '[') + std::string(20, ']') + "}";
  expect_refused(extra_nested, "nested deeper than 16 levels");
}

TEST(CertificateReader, RefusesInvalidJsonWithLineAndColumn) {
  expect_refused("{\n  \"plumb_certificate\": 1,\n  \"status\" \"optimal\"\n}",
                 "c.json:3:20: found invalid JSON (syntax error while parsing object separator");
  expect_refused("", "c.json:1:1: found invalid JSON");
  expect_refused("{\"plumb_certificate\": 1} trailing", "found invalid JSON");
  expect_refused("{\"plumb_certificate\": 1, \"status\": \"\xff\"}", "found invalid JSON");
  expect_refused(std::string("{\"a\": \"b\0c\"}", 12), "found invalid JSON");
}

TEST(CertificateReader, RefusesOversizedInput) {
  ReadLimits small;
  small.max_bytes = 100;
  expect_refused(std::string(101, ' '), "found 101 bytes, expected a certificate of at most 100 bytes",
                 small);
}

TEST(CertificateReader, RefusesOtherVersionsAndUnknownStatus) {
  const std::string model = R"("model": {"file": "m", "sha256": "", "rows": 0, "columns": 0})";
  expect_refused(R"({"plumb_certificate": 2, "status": "feasible", "x": {}, )" + model + "}",
                 "c.json:1:23: found the number 2, expected 1, the only certificate version");
  expect_refused(R"({"plumb_certificate": "1", "status": "feasible", "x": {}, )" + model + "}",
                 "found the string \"1\"");
  expect_refused(R"({"plumb_certificate": 1.0, "status": "feasible", "x": {}, )" + model + "}",
                 "found the number 1.0");
  expect_refused(R"({"status": "feasible", "x": {}, )" + model + "}", "found no \"plumb_certificate\"");
  expect_refused(R"({"plumb_certificate": 1, "status": "solved", "x": {}, )" + model + "}",
                 "found the string \"solved\", expected one of \"optimal\"");
  expect_refused("[1]", "found an array, expected a JSON object holding a certificate");
}

TEST(CertificateReader, RefusesMissingOrMisplacedParts) {
  const std::string head =
      R"({"plumb_certificate": 1, "model": {"file": "m", "sha256": "", "rows": 0, "columns": 0}, )";
  expect_refused(head + R"("status": "optimal", "x": {}, "y": {}})",
                 "found no \"objective\", expected a \"objective\", which a optimal");
  expect_refused(head + R"("status": "optimal", "objective": "0", "x": {}})", "found no \"y\"");
  expect_refused(head + R"("status": "infeasible"})", "found no \"y\"");
  expect_refused(head + R"("status": "unbounded", "x": {}})", "found no \"ray\"");
  expect_refused(head + R"("status": "feasible"})", "found no \"x\"");
  expect_refused(head + R"("status": "feasible", "x": {}, "ray": {}})",
                 "found a \"ray\" in a feasible certificate");
  expect_refused(head + R"("status": "infeasible", "y": {}, "objective": "1"})",
                 "found a \"objective\" in a infeasible");
  expect_refused(head + R"("status": "feasible", "x": []})",
                 "found an array, expected an object of names and rationals");
  expect_refused(R"({"plumb_certificate": 1, "status": "feasible", "x": {}})", "found no \"model\"");
}

// Farkas multipliers on single sides and bounds: an infeasible certificate's alternative to "y".
TEST(CertificateReader, RefusesWrongModelFields) {
  auto with_model = [](const std::string& model) {
    return R"({"plumb_certificate": 1, "status": "feasible", "x": {}, "model": )" + model + "}";
  };
  expect_refused(with_model(R"({"file": "m", "sha256": "", "rows": -1, "columns": 0})"),
                 "found the number -1, expected a whole number of at least 0");
  expect_refused(with_model(R"({"file": "m", "sha256": "", "rows": 1.5, "columns": 0})"),
                 "found the number 1.5");
  expect_refused(with_model(R"({"file": "m", "sha256": "", "rows": 99999999999999999999, "columns": 0})"),
                 "expected a whole number");
  expect_refused(with_model(R"({"file": 3, "sha256": "", "rows": 1, "columns": 0})"),
                 "found the number 3, expected a JSON string");
  expect_refused(with_model(R"({"file": "m", "rows": 1, "columns": 0})"), "found no \"sha256\"");
  expect_refused(
      with_model(R"({"file": "m", "sha256": "", "rows": 1, "columns": 0, "objective_constant": 0})"),
      "expected a rational written as a string");
  expect_refused(with_model(R"("m")"), "found the string \"m\", expected an object describing the model");
}

// A crossed row proven by its two sides, in the explicit Farkas form (docs/certificates.md).
const char* explicit_farkas_text = R"({
  "plumb_certificate": 1,
  "model": {
    "file": "m",
    "sha256": "",
    "rows": 1,
    "columns": 1
  },
  "status": "infeasible",
  "farkas": [
    {"kind": "row", "name": "R1", "side": "lower", "multiplier": "1"},
    {"kind": "row", "name": "R1", "side": "upper", "multiplier": "1"}
  ]
}
)";

const char* subsystem_text = R"({
  "plumb_certificate": 1,
  "model": {
    "file": "m",
    "sha256": "",
    "rows": 2,
    "columns": 2
  },
  "status": "infeasible_subsystem",
  "farkas": [
    {"kind": "row", "name": "R1", "side": "lower", "multiplier": "1/2"},
    {"kind": "column", "name": "c \"1\"", "side": "upper", "multiplier": "3"}
  ],
  "members": [
    {"kind": "row", "name": "R1", "side": "lower"}
  ],
  "hard": [
    {"kind": "column", "name": "c \"1\"", "side": "upper"}
  ],
  "witnesses": [
    {"drop": [0], "x": {"c \"1\"": "-7/2"}}
  ]
}
)";

TEST(CertificateReader, ExplicitFarkasRoundTrips) {
  Certificate c = parse_certificate(explicit_farkas_text, "c.json");
  EXPECT_EQ(c.status, Status::infeasible);
  EXPECT_TRUE(c.y.empty());
  ASSERT_EQ(c.farkas.size(), 2u);
  EXPECT_EQ(c.farkas[1].entry, (Entry{EntryKind::row, "R1", Limit::upper}));
  EXPECT_EQ(c.farkas[1].multiplier, 1);
  EXPECT_EQ(to_json_text(c), explicit_farkas_text);
}

TEST(CertificateReader, SubsystemRoundTrips) {
  Certificate c = parse_certificate(subsystem_text, "c.json");
  EXPECT_EQ(c.status, Status::infeasible_subsystem);
  ASSERT_EQ(c.farkas.size(), 2u);
  EXPECT_EQ(c.farkas[0].multiplier, Rational(1, 2));
  EXPECT_EQ(c.members, (std::vector<Entry>{{EntryKind::row, "R1", Limit::lower}}));
  EXPECT_EQ(c.hard, (std::vector<Entry>{{EntryKind::column, "c \"1\"", Limit::upper}}));
  ASSERT_EQ(c.witnesses.size(), 1u);
  EXPECT_EQ(c.witnesses[0].drop, std::vector<std::size_t>{0});
  EXPECT_EQ(c.witnesses[0].x, (plumb::certificate::NamedValues{{"c \"1\"", Rational(-7, 2)}}));
  EXPECT_EQ(to_json_text(c), subsystem_text);
}

// Replaces the first occurrence of `from` in text.
std::string edited(std::string text, const std::string& from, const std::string& to) {
  auto at = text.find(from);
  EXPECT_NE(at, std::string::npos) << from;
  return text.replace(at, from.size(), to);
}

TEST(CertificateReader, RefusesMalformedEntriesAndWitnesses) {
  expect_refused(
      edited(explicit_farkas_text, "\"status\": \"infeasible\",", "\"status\": \"infeasible\", \"y\": {},"),
      "expected one of them");
  expect_refused(edited(explicit_farkas_text, "\"kind\": \"row\"", "\"kind\": \"rows\""),
                 "expected \"row\" or \"column\"");
  expect_refused(edited(explicit_farkas_text, "\"side\": \"lower\"", "\"side\": \"below\""),
                 "expected \"lower\" or \"upper\"");
  expect_refused(edited(explicit_farkas_text, "\"multiplier\": \"1\"", "\"multiplier\": 1"),
                 "never a JSON number");
  expect_refused(edited(explicit_farkas_text, ", \"multiplier\": \"1\"}", "}"), "\"multiplier\"");
  expect_refused(edited(explicit_farkas_text, "\"side\": \"lower\",", "\"side\": \"lower\", \"note\": 1,"),
                 "found the key \"note\"");
  expect_refused(edited(subsystem_text, "\"hard\": [", "\"hardly\": ["), "a \"hard\"");
  expect_refused(edited(subsystem_text, "\"drop\": [0]", "\"drop\": 0"), "an array of member indices");
  expect_refused(edited(subsystem_text, "\"drop\": [0]", "\"drop\": [-1]"), "c.json:");
  expect_refused(edited(subsystem_text, "\"members\": [", "\"members\": {"), "c.json:");
  expect_refused(edited(explicit_farkas_text, "\"infeasible\"", "\"infeasible_subsystem\""), "a \"members\"");
}

TEST(CertificateWriter, RefusesSubsystemPartsOutsideTheirStatus) {
  Certificate c = parse_certificate(subsystem_text, "c.json");
  c.status = Status::infeasible;
  EXPECT_THROW(to_json_text(c), std::invalid_argument);
  c = parse_certificate(explicit_farkas_text, "c.json");
  c.y = {{"R1", 1}};
  EXPECT_THROW(to_json_text(c), std::invalid_argument);
}

}  // namespace
