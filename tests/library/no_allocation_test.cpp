// The library's normal call path allocates nothing (sweeps call it millions
// of times).  Counts global operator new while every function is called with
// each reference row's arguments; a call that records a warning, note or
// error may allocate (its message) and is not counted.
#include <cstddef>
#include <cstdlib>
#include <new>

#include <gtest/gtest.h>

#include "library/registry.h"
#include "reference_csv.h"

namespace {
thread_local bool g_counting = false;
thread_local size_t g_allocations = 0;
}  // namespace

void* operator new(std::size_t n) {
  if (g_counting) ++g_allocations;
  if (void* p = std::malloc(n == 0 ? 1 : n)) return p;
  throw std::bad_alloc();
}
void operator delete(void* p) noexcept { std::free(p); }
void operator delete(void* p, std::size_t) noexcept { std::free(p); }

namespace heatdeck::library {
namespace {

class CountingSink : public Sink {
 public:
  void Warning(std::string) override { ++said; }
  void Error(std::string) override { ++said; }
  void Note(const char*) override {}  // a static text: no allocation
  int said = 0;
};

TEST(Library, NormalCallsAllocateNothing) {
  const auto rows = testing::LoadReference("library_checks.csv");
  int quiet_calls = 0;
  for (const auto& row : rows) {
    const FunctionInfo* f = FindFunction(row.at("function"));
    ASSERT_NE(f, nullptr) << row.at("function");
    const std::vector<double> args = testing::SplitArgs(row.at("args"));
    CountingSink sink;
    g_allocations = 0;
    g_counting = true;
    f->fn(args.data(), sink);
    g_counting = false;
    if (sink.said > 0) continue;
    ++quiet_calls;
    EXPECT_EQ(g_allocations, 0u) << f->name << "(" << row.at("args") << ") allocated";
  }
  EXPECT_GT(quiet_calls, 250);
}

}  // namespace
}  // namespace heatdeck::library
