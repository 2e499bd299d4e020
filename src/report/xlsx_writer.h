// The auditable workbook: XLSX whose cells are live formulas.
#pragma once

#include <string>

#include "eval/results.h"

namespace heatdeck {

// Writes the workbook to path (the caller makes it atomic).
bool WriteXlsx(const Results& results, const std::string& path, std::string* error);

}  // namespace heatdeck
