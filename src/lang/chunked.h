// A growable array whose elements never move: chunks of 256 elements, so
// that references stay valid as it grows (like std::deque's) while growing
// costs one allocation per 256 elements.  libstdc++'s deque allocates a
// block per 512 bytes, three or four of the syntax tree's nodes, which at
// 100 000 statements was a tenth of checking a deck.
#pragma once

#include <cstddef>
#include <memory>
#include <vector>

namespace heatdeck {

template <typename T>
class Chunked {
 public:
  static constexpr size_t kShift = 8;
  static constexpr size_t kChunk = size_t{1} << kShift;

  size_t size() const { return size_; }
  bool empty() const { return size_ == 0; }

  T& operator[](size_t i) { return chunks_[i >> kShift][i & (kChunk - 1)]; }
  const T& operator[](size_t i) const { return chunks_[i >> kShift][i & (kChunk - 1)]; }

  // A default-constructed element at the end.
  T& emplace_back() {
    if (size_ == chunks_.size() * kChunk) chunks_.push_back(std::make_unique<T[]>(kChunk));
    return (*this)[size_++];
  }

  // Grows to n default-constructed elements (never shrinks).
  void resize(size_t n) {
    while (chunks_.size() * kChunk < n) chunks_.push_back(std::make_unique<T[]>(kChunk));
    if (n > size_) size_ = n;
  }

 private:
  std::vector<std::unique_ptr<T[]>> chunks_;
  size_t size_ = 0;
};

}  // namespace heatdeck
