// The calc report as Markdown, ordered stably so that revisions diff cleanly.
#pragma once

#include <string>

#include "eval/results.h"

namespace heatdeck {

bool WriteMarkdown(const Results& results, std::string* out, std::string* error);

}  // namespace heatdeck
