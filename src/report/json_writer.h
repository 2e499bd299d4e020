// The JSON results document (LANGUAGE.md "Results as data"; schema in
// docs/json-schema.md).  Numbers are written so that they read back exactly;
// a value that could not be evaluated is null.
#pragma once

#include <string>

#include "eval/results.h"
#include "lang/diagnostics.h"

namespace heatdeck {

// diags may be null; its warnings go to "diagnostics".
std::string WriteJson(const Results& results, const Diagnostics* diags);

}  // namespace heatdeck
