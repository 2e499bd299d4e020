#include "report/markdown_writer.h"

namespace heatdeck {

// Not written yet: reports that the format is unavailable.
bool WriteMarkdown(const Results& /*results*/, std::string* /*out*/, std::string* error) {
  *error = "the Markdown report is not available in this build yet";
  return false;
}

}  // namespace heatdeck
