// libFuzzer target: the unit-expression parser.
#include <cmath>
#include <cstddef>
#include <cstdint>
#include <cstdlib>
#include <string_view>

#include "units/unit.h"

extern "C" int LLVMFuzzerTestOneInput(const uint8_t* data, size_t size) {
  const std::string_view text(reinterpret_cast<const char*>(data), size);
  heatdeck::units::Unit u;
  heatdeck::units::UnitError e;
  if (heatdeck::units::ParseUnit(text, &u, &e)) {
    // A parsed unit converts both ways without crashing.
    (void)u.FromSi(u.ToSi(1.0));
  } else if (e.offset < 0 || static_cast<size_t>(e.offset) > size) {
    std::abort();  // an error must point inside the text
  }
  return 0;
}
