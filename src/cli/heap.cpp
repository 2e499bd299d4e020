#include "cli/heap.h"

#include <algorithm>
#include <cstdlib>

#if defined(__GLIBC__)
#include <malloc.h>
#include <sys/mman.h>
#endif

namespace heatdeck::cli {

// Why: a deck's syntax tree and model are millions of small allocations,
// some 60 to 75 bytes of heap per byte of deck.  On 4 KB pages, checking a
// 100 000-statement deck (4.5 MB, 270 MB of heap) spent more time in page
// faults than in heatdeck (tools/bench.sh, P3).  glibc can back its heap
// with transparent huge pages (the glibc.malloc.hugetlb tunable), but only
// from the environment at start-up; this does the same from inside: grow
// the heap once to the size the deck will need, keep it (no trimming, no
// separate mappings for large blocks), and advise huge pages over it.
// Decks under 32 KB (a few hundred statements) skip it: they need less
// than a huge page, and their start-up time matters more (P2).
void PrepareHeapFor(std::uintmax_t deck_bytes) {
#if defined(__GLIBC__) && defined(MADV_HUGEPAGE)
  constexpr std::uintmax_t kFrom = std::uintmax_t{32} << 10;
  constexpr std::uintmax_t kHuge = std::uintmax_t{2} << 20;  // x86-64 huge page
  // Heap per deck byte: 60 to 75 measured on generated decks; address
  // space reserved and never touched costs nothing, so twice that.
  constexpr std::uintmax_t kPerByte = 128;
  constexpr std::uintmax_t kMax = std::uintmax_t{4} << 30;
  // The heap below the first huge-page boundary, held for the process's
  // life so that the deck's allocations start on the boundary.  Volatile:
  // a pointer that is never read lets the compiler drop the malloc itself.
  [[maybe_unused]] static void* volatile head = nullptr;
  static bool done = false;
  if (done || deck_bytes < kFrom) return;
  done = true;
  const auto want = static_cast<size_t>(std::min(std::max(deck_bytes * kPerByte, 2 * kHuge), kMax));
  const size_t reserve = want + kHuge;
  mallopt(M_MMAP_MAX, 0);  // large blocks from the heap as well
  mallopt(M_TRIM_THRESHOLD, static_cast<int>(std::min<size_t>(2 * reserve, 1u << 30)));
  void* p = std::malloc(reserve);
  if (p == nullptr) {  // no room for it: back to the defaults (mallopt(3))
    mallopt(M_MMAP_MAX, 65536);
    mallopt(M_TRIM_THRESHOLD, 128 * 1024);
    return;
  }
  const auto at = reinterpret_cast<std::uintptr_t>(p);
  const std::uintptr_t begin = (at + kHuge - 1) & ~(kHuge - 1);
  const std::uintptr_t end = (at + reserve) & ~(kHuge - 1);
  std::free(p);  // kept by the heap: below the trim threshold
  if (end <= begin) return;
  madvise(reinterpret_cast<void*>(begin), end - begin, MADV_HUGEPAGE);
  // Freed, the block is the top of the heap again: the next large request
  // is carved from its start, so this one covers the part before the
  // boundary.
  if (begin - at >= 4096) head = std::malloc(begin - at);
#else
  (void)deck_bytes;
#endif
}

}  // namespace heatdeck::cli
