#include <ostream>

#include "cli/app.h"
#include "cli/deck_runner.h"

namespace heatdeck::cli {

int RunCheck(const std::vector<std::string>& decks, const GlobalOptions& g, Streams io) {
  int status = kOk;
  for (const std::string& path : decks) {
    Session session;
    const int s = LoadAndEvaluate(path, g, io, &session);
    io.out << Summary(path, session) << "\n";
    status = std::max(status, s);
  }
  return status;
}

}  // namespace heatdeck::cli
