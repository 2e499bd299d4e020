// libFuzzer target: the CSV property-table reader and interpolation.
#include <cstddef>
#include <cstdint>
#include <string_view>
#include <vector>

#include "library/table.h"

extern "C" int LLVMFuzzerTestOneInput(const uint8_t* data, size_t size) {
  const std::string_view text(reinterpret_cast<const char*>(data), size);
  heatdeck::library::Table t;
  std::vector<heatdeck::library::TableError> errors;
  if (heatdeck::library::ParseTableCsv(text, &t, &errors) && !t.columns.empty()) {
    double out = 0;
    const auto& x = t.columns[0].si;
    for (int c = 1; c < static_cast<int>(t.columns.size()); ++c) {
      if (!x.empty()) {
        (void)t.Interpolate(c, x.front(), &out);
        (void)t.Interpolate(c, 0.5 * (x.front() + x.back()), &out);
        (void)t.Interpolate(c, x.back() + 1.0, &out);
      }
    }
  }
  return 0;
}
