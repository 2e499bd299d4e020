// Internal to the library: reporting a call with no meaningful result.
#pragma once

#include <limits>
#include <string>
#include <utility>

#include <fmt/format.h>

#include "library/registry.h"

namespace heatdeck::library::detail {

inline constexpr double kNaN = std::numeric_limits<double>::quiet_NaN();

// Reports the error to the sink and returns NaN.  Error path only (it
// formats, so it allocates).
template <typename... Args>
double Fail(Sink& sink, fmt::format_string<Args...> f, Args&&... args) {
  sink.Error(fmt::format(f, std::forward<Args>(args)...));
  return kNaN;
}

}  // namespace heatdeck::library::detail
