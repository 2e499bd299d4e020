// The traceable calc report as one self-contained HTML file.
#pragma once

#include <string>

#include "eval/results.h"

namespace heatdeck {

// Returns false and sets *error only on an internal failure.
bool WriteHtml(const Results& results, std::string* out, std::string* error);

}  // namespace heatdeck
