// Where tests find the repository and the shared reference data.
#pragma once

#include <string>

namespace heatdeck::testing {

// Absolute path of the repository checkout.
std::string RepoDir();
// Absolute path of ../shared (reference CSVs, benchmark decks); the
// HEATDECK_SHARED environment variable overrides it.
std::string SharedDir();
// Reads a whole file; fails the current test when it cannot.
std::string ReadFile(const std::string& path);

}  // namespace heatdeck::testing
