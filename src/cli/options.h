// Options shared by the commands that read decks.
#pragma once

#include <string>
#include <vector>

#include "heatdeck/session.h"

namespace heatdeck::cli {

struct GlobalOptions {
  SessionOptions session;
  bool quiet = false;
};

}  // namespace heatdeck::cli
