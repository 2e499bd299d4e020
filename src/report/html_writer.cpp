#include "report/html_writer.h"

namespace heatdeck {

// Not written yet: reports that the format is unavailable.
bool WriteHtml(const Results& /*results*/, std::string* /*out*/, std::string* error) {
  *error = "the HTML report is not available in this build yet";
  return false;
}

}  // namespace heatdeck
