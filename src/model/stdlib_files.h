// The stdlib templates embedded in the binary at build time.
#pragma once

#include <string>
#include <vector>

namespace heatdeck {

struct EmbeddedFile {
  std::string name;  // file name, e.g. "double_pipe.deck"
  std::string text;  // the file's bytes
};

// Every template under stdlib/, in file-name order.
const std::vector<EmbeddedFile>& StdlibFiles();

}  // namespace heatdeck
