// Heap set-up for large decks.
#pragma once

#include <cstdint>

namespace heatdeck::cli {

// Before loading a deck of `deck_bytes`: for a deck of 32 KB and more,
// reserves heap for its syntax tree and model and asks the kernel to back
// it with huge pages.  Does nothing for smaller decks, on a second call, or
// where the C library or kernel offers no such thing.
void PrepareHeapFor(std::uintmax_t deck_bytes);

}  // namespace heatdeck::cli
