// Loading, evaluating and reporting on one deck, shared by check and run.
#pragma once

#include <string>

#include "cli/app.h"
#include "cli/options.h"
#include "heatdeck/session.h"

namespace heatdeck::cli {

// Loads and evaluates `path` into *session, printing diagnostics and the
// validity warnings recorded on quantities to io.err.  Returns the exit
// status (0, 1 or 2).
int LoadAndEvaluate(const std::string& path, const GlobalOptions& g, Streams io, Session* session);

// One line: "cooler.deck: 14 quantities, 2 checks: 2 passed, 0 failed; 1 warning".
std::string Summary(const std::string& path, const Session& session);

}  // namespace heatdeck::cli
