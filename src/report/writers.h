// Every output format, behind one entry point the CLI calls.
#pragma once

#include <string>
#include <string_view>
#include <vector>

#include "eval/results.h"
#include "lang/diagnostics.h"

namespace heatdeck {

enum class Format { kHtml, kMarkdown, kXlsx, kJson, kCsv };

// "html", "md" (or "markdown"), "xlsx", "json", "csv".
bool ParseFormat(std::string_view name, Format* out);
const char* FormatName(Format f);
const char* Extension(Format f);  // without the dot
bool IsTextFormat(Format f);      // everything but xlsx

// Renders a text format into a string (for `-o -`).  Returns false and sets
// *error when the format cannot be made from these results (csv needs a
// sweep).
bool RenderText(const Results& results, const Diagnostics& diags, Format f, std::string* out,
                std::string* error);

// Writes one format to path, atomically (report/output.h).
bool WriteOutput(const Results& results, const Diagnostics& diags, Format f,
                 const std::string& path, std::string* error);

}  // namespace heatdeck
