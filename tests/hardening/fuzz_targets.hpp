// The bodies of the libFuzzer targets, shared by tests/fuzz/ (fuzzing) and the regression replay.
#pragma once

#include <stdexcept>
#include <string>
#include <string_view>

namespace plumb::hardening {

// A property an accepted input must have was violated: always a bug, never bad input.
struct FuzzFinding : std::logic_error {
  using std::logic_error::logic_error;
};

// Each target feeds one input to one reader.  Bad input must end in model::InputError, which
// the target swallows; any other exception (FuzzFinding included) escapes and is a finding.
void fuzz_numbers(std::string_view input);
void fuzz_mps(std::string_view input);
void fuzz_mps_file(std::string_view input);  // through a file on disk, gzip included
void fuzz_native(std::string_view input);
void fuzz_labels(std::string_view input);
void fuzz_certificate(std::string_view input);  // the strict reader, then check::verify
void fuzz_basis(std::string_view input);        // the basis-file reader, then a written round trip

// A target by the name used for its regression folder (tests/data/fuzz-regressions/NAME/).
using FuzzTarget = void (*)(std::string_view);
FuzzTarget fuzz_target(const std::string& name);

}  // namespace plumb::hardening
