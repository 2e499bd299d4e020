// Writes a generated chain deck (deck_gen.h) to standard output.
//
//   gen_deck STATEMENTS > chain.deck
#include <cstdio>
#include <cstdlib>

#include "deck_gen.h"

int main(int argc, char** argv) {
  if (argc != 2) {
    std::fprintf(stderr, "usage: gen_deck STATEMENTS\n");
    return 2;
  }
  const std::string deck = heatdeck::bench::ChainDeck(std::atoi(argv[1]));
  return std::fwrite(deck.data(), 1, deck.size(), stdout) == deck.size() ? 0 : 1;
}
