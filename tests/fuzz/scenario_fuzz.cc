// libFuzzer target: any bytes given as a scenario file must end in a Scenario or an
// InputError (the one-line message), never a crash, a hang, an undefined
// behaviour or any other exception. Built with clang's -fsanitize=fuzzer,address,
// undefined by tests/fuzz/fuzz.sh, outside the main (GCC) build.
#include "settlewell/core/errors.h"
#include "settlewell/scenario/parse.h"

#include <cstddef>
#include <cstdint>
#include <string>

extern "C" int LLVMFuzzerTestOneInput(const std::uint8_t* data, std::size_t size) {
  const std::string text(reinterpret_cast<const char*>(data), size);
  try {
    settlewell::scenario::parse_scenario(text, "fuzz.toml");
  } catch (const settlewell::InputError&) {
    // The expected answer to a malformed scenario.
  }
  return 0;
}
