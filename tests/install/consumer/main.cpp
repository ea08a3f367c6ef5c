// Uses the installed library the way another program would: reads a model from text, solves it
// with a checked certificate, and prints the proven optimum as an exact fraction.
#include <plumb/exact/solve.hpp>
#include <plumb/model/read.hpp>
#include <plumb/numeric/rational.hpp>

#include <iostream>

int main() {
  // Invented: a workshop cuts two shelf kinds from 7 m of board and 9 hours of work.
  const char* text =
      "variable short_shelves\n"
      "variable long_shelves\n"
      "maximise shelves: short_shelves + long_shelves\n"
      "constraint board: 2 short_shelves + long_shelves <= 7\n"
      "constraint hours: short_shelves + 3 long_shelves <= 9\n";
  plumb::model::ReadOptions options;
  options.format = plumb::model::Format::native;
  plumb::model::Model model = plumb::model::read_model_text(text, "workshop.plumb", options);
  plumb::exact::CertifiedSolution result = plumb::exact::certified_solve(model);
  if (!result.certified()) return 1;
  std::cout << plumb::numeric::to_fraction(result.solution.objective) << "\n";
  return 0;
}
