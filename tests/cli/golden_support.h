// Helpers shared by the CLI tests: reading expected files and checking that
// standard error holds a located diagnostic.
#pragma once

#include <string>

namespace heatdeck::testing {

// The exit status written in a .status file (one integer).
int ReadStatus(const std::string& path);

// True when err holds at least one `DECK:LINE:COL: error: …` line, and every
// such line is followed by the deck's source line LINE (quoted after two
// spaces, unless it is longer than the 200 bytes a quote shows) and a caret
// line whose `^` stands under byte COL.  DECK is the deck path as given on
// the command line; source is the deck's text.  On false, *why says what
// was wrong.
bool HasLocatedError(const std::string& err, const std::string& deck, const std::string& source,
                     std::string* why);

}  // namespace heatdeck::testing
