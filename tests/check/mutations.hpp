// Certificate mutations that provably break a valid certificate, for the checker's tests and for
// running the same attacks over solver-made certificates.
#pragma once

#include "plumb/certificate/certificate.hpp"
#include "plumb/model/model.hpp"

#include <optional>
#include <string>
#include <vector>

namespace plumb::testing {

struct Mutation {
  std::string what;                      // e.g. "objective raised by 1"
  certificate::Certificate certificate;  // the mutated certificate
  std::string expected;                  // a phrase the checker's failure text must contain
};

// Each returns nothing when it does not apply to this certificate.  Every mutation returned breaks
// any valid certificate of its status; the comment says why.

// optimal: x and y unchanged, so the objective at x is unchanged and "objective" no longer equals it.
std::optional<Mutation> raise_objective(const certificate::Certificate& c);

// any: the first entry of x (else y, else ray) renamed to a name no model has.
std::optional<Mutation> rename_to_unknown(const certificate::Certificate& c);

// any: the stated number of rows off by one.
std::optional<Mutation> miscount_rows(const certificate::Certificate& c);

// optimal, unbounded, feasible: one x value moved by 1/a_ij (a side's worth of 1) across the side
// that a tight row meets exactly, so that row is violated by 1.
std::optional<Mutation> push_across_tight_row(const model::Model& m, const certificate::Certificate& c);

// optimal, infeasible: the multiplier of a row with exactly one finite side negated; its sign then
// needs the side that is infinite.
std::optional<Mutation> flip_one_sided_multiplier(const model::Model& m, const certificate::Certificate& c);

// infeasible: every multiplier dropped; then both sums are 0 and 0 > 0 fails.
std::optional<Mutation> drop_all_multipliers(const certificate::Certificate& c);

// unbounded: the ray reversed; c'.(-r) = -c'.r > 0, so it no longer improves the objective.
std::optional<Mutation> reverse_ray(const certificate::Certificate& c);

// All of the above that apply.
std::vector<Mutation> provable_mutations(const model::Model& m, const certificate::Certificate& c);

// Not provable in general (the caller must know the entry was needed): one y entry removed.
Mutation drop_multiplier(const certificate::Certificate& c, const std::string& row);

// gtest assertions: verify(m, c) is valid; every mutation is rejected with its expected phrase.
void expect_valid(const model::Model& m, const certificate::Certificate& c);
void expect_rejected(const model::Model& m, const Mutation& mutation);

}  // namespace plumb::testing
