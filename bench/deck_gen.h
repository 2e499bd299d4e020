// Generated decks for the scale benchmarks (tools/bench.sh, target P3, and
// pipeline_bench): a chain of pipe segments, each cooling a water stream
// towards its surroundings, with givens, unit literals, library calls
// (reynolds_tube, prandtl, nu_gnielinski), display units and a check.
#pragma once

#include <string>

namespace heatdeck::bench {

// A deck of exactly `statements` statements (a title, six givens, then
// segments of ten statements; the remainder padded with givens).  Fewer
// than seven statements give a deck with the title only.
std::string ChainDeck(int statements);

}  // namespace heatdeck::bench
