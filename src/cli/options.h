// Options shared by the commands that read decks.
#pragma once

#include <string>
#include <vector>

#include "heatdeck/session.h"

namespace heatdeck::cli {

struct GlobalOptions {
  SessionOptions session;
  int jobs = 0;  // 0: all cores
  bool quiet = false;
};

}  // namespace heatdeck::cli
