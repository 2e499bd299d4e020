#include "report/xlsx_writer.h"

namespace heatdeck {

// Not written yet: reports that the format is unavailable.
bool WriteXlsx(const Results& /*results*/, const std::string& /*path*/, std::string* error) {
  *error = "the XLSX workbook is not available in this build yet";
  return false;
}

}  // namespace heatdeck
