// Helpers shared by the evaluation tests: exact comparison of doubles, a
// session's diagnostics as text, and a quantity's value in a case.
#pragma once

#include <bit>
#include <cstdint>
#include <string>

#include <gtest/gtest.h>

#include "heatdeck/session.h"
#include "lang/diagnostics.h"
#include "model/model.h"

namespace heatdeck::test {

// Same bits, so that exactness is not hidden by a tolerance.
inline ::testing::AssertionResult SameBits(double actual, double expected) {
  if (std::bit_cast<std::uint64_t>(actual) == std::bit_cast<std::uint64_t>(expected)) {
    return ::testing::AssertionSuccess();
  }
  return ::testing::AssertionFailure() << std::hexfloat << actual << " is not " << expected;
}

inline std::string RenderAll(const Session& s) {
  std::string out;
  for (const Diagnostic* d : s.diagnostics().Sorted()) out += Render(*d, s.files(), false);
  return out;
}

inline double Value(const Session& s, const std::string& name, size_t case_index = 0) {
  const int i = s.model().Find(name);
  EXPECT_GE(i, 0) << "no quantity " << name;
  return s.results().cases.at(case_index).values.at(static_cast<size_t>(i));
}

}  // namespace heatdeck::test
