// The deck parser: text in, syntax tree out, every error reported with its
// place and parsing resumed at the next statement.
#pragma once

#include <string_view>

#include "lang/diagnostics.h"
#include "lang/syntax.h"

namespace heatdeck {

// Limits that keep hostile input from exhausting the stack or memory.
struct ParseLimits {
  int max_depth = 200;  // nesting of parentheses and operators
  int max_statements = 1000000;
};

// Parses one deck.  file must outlive the Deck (use the name returned by
// SourceFiles::Add); source must too, since tokens point into it.
Deck Parse(std::string_view file, std::string_view source, Diagnostics& diags,
           const ParseLimits& limits = {});

}  // namespace heatdeck
