// Internal to the checker: how amounts, rows and columns are named in verdicts, and the objective
// as the certificate counts it.
#pragma once

#include "plumb/model/model.hpp"

#include <optional>
#include <string>
#include <vector>

namespace plumb::check::detail {

using numeric::Rational;

// A failing condition, raised where it is found and turned into Verdict::failure.
struct Failure {
  std::string text;
};

// An amount in a verdict, in the form every text rendering shares (numeric::exact_and_decimal):
// "87", "869/10 (86.9)", "12345/7 (~1763.57142857)", or "~5501.84588831" for a fraction too long
// to read (the certificate holds it exactly).
inline std::string amount(const Rational& value) { return numeric::exact_and_decimal(value); }

// The name as written, quoted when blanks or quotes would make it ambiguous in a sentence.
std::string shown_name(const std::string& name);

// "row blend_octane", followed by the owner's statement from the labels when there is one.
std::string row_text(const model::Model& m, int i);
std::string column_text(const model::Model& m, int j);

// The model's objective with the constant the certificate says it includes (else the model's).
class Objective {
 public:
  Objective(const model::Model& m, const std::optional<Rational>& certificate_constant);
  Rational from_min_form(const Rational& cost) const;       // c'.x back to the model's terms
  Rational direction(const Rational& slope) const;          // c'.r back to the model's c.r
  // "the objective includes the certificate's constant K, the model as read has M", or "" when equal.
  std::string constant_note() const;

 private:
  const model::Model& model_;
  Rational constant_;
};

}  // namespace plumb::check::detail
