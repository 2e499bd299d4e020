// Chunked<T>, the syntax tree's arena: elements keep their address as it
// grows across chunk boundaries, indexing reaches each one, and resize only
// grows.  Expected values hand-derived (element i holds i).
#include "lang/chunked.h"

#include <string>
#include <vector>

#include <gtest/gtest.h>

namespace heatdeck {
namespace {

TEST(Chunked, ElementsNeverMoveAsItGrows) {
  Chunked<std::string> a;
  EXPECT_TRUE(a.empty());
  std::vector<const std::string*> where;
  constexpr size_t kN = 3 * Chunked<std::string>::kChunk + 5;  // into a fourth chunk
  for (size_t i = 0; i < kN; ++i) {
    std::string& s = a.emplace_back();
    EXPECT_TRUE(s.empty()) << "element " << i << " is default-constructed";
    s = std::to_string(i);
    where.push_back(&s);
  }
  ASSERT_EQ(a.size(), kN);
  for (size_t i = 0; i < kN; ++i) {
    EXPECT_EQ(&a[i], where[i]) << "element " << i << " moved";
    EXPECT_EQ(a[i], std::to_string(i));
  }
}

TEST(Chunked, ResizeGrowsAndNeverShrinks) {
  Chunked<int> a;
  a.resize(300);
  EXPECT_EQ(a.size(), 300u);
  EXPECT_EQ(a[0], 0);
  EXPECT_EQ(a[299], 0);
  a[299] = 7;
  a.resize(10);
  EXPECT_EQ(a.size(), 300u);
  EXPECT_EQ(a[299], 7);
  a.emplace_back() = 8;
  EXPECT_EQ(a.size(), 301u);
  EXPECT_EQ(a[300], 8);
  const Chunked<int>& c = a;
  EXPECT_EQ(c[299], 7);
}

}  // namespace
}  // namespace heatdeck
