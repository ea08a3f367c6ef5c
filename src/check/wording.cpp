#include "wording.hpp"

namespace plumb::check::detail {

std::string shown_name(const std::string& name) {
  bool plain = !name.empty() && name.find_first_of(" \t\"") == std::string::npos;
  return plain ? name : "\"" + name + "\"";
}

namespace {
std::string with_statement(std::string text, const model::Label& label) {
  if (!label.statement.empty()) text += " (\"" + label.statement + "\")";
  return text;
}
}  // namespace

std::string row_text(const model::Model& m, int i) {
  return with_statement("row " + shown_name(m.rows[i].name), m.rows[i].label);
}

std::string column_text(const model::Model& m, int j) {
  return with_statement("column " + shown_name(m.columns[j].name), m.columns[j].label);
}

Objective::Objective(const model::Model& m, const std::optional<Rational>& certificate_constant)
    : model_(m), constant_(certificate_constant.value_or(m.objective.constant)) {}

Rational Objective::from_min_form(const Rational& cost) const { return direction(cost) + constant_; }

Rational Objective::direction(const Rational& slope) const {
  return model_.objective.sense == model::Sense::maximise ? Rational(-slope) : slope;
}

std::string Objective::constant_note() const {
  if (constant_ == model_.objective.constant) return "";
  return "the objective includes the certificate's constant " + amount(constant_) + ", the model as read has " +
         amount(model_.objective.constant);
}

}  // namespace plumb::check::detail
