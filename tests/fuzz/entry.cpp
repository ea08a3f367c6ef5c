// libFuzzer entry point for one target; PLUMB_FUZZ_NAME picks its body in tests/hardening/.
#include "hardening/fuzz_targets.hpp"

#include <cstdint>
#include <cstdio>
#include <cstdlib>
#include <exception>

extern "C" int LLVMFuzzerTestOneInput(const std::uint8_t* data, std::size_t size) {
  static const plumb::hardening::FuzzTarget target = plumb::hardening::fuzz_target(PLUMB_FUZZ_NAME);
  try {
    target(std::string_view(reinterpret_cast<const char*>(data), size));
  } catch (const std::exception& e) {  // anything but InputError escaped the target: a finding
    std::fprintf(stderr, "plumb fuzz finding (%s): %s\n", PLUMB_FUZZ_NAME, e.what());
    std::abort();
  }
  return 0;
}
