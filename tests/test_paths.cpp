#include "test_paths.h"

#include <cstdlib>
#include <fstream>
#include <sstream>

#include <gtest/gtest.h>

namespace heatdeck::testing {

std::string RepoDir() { return HD_REPO_DIR; }

std::string SharedDir() {
  if (const char* env = std::getenv("HEATDECK_SHARED"); env != nullptr && *env != '\0') {
    return env;
  }
  return HD_SHARED_DIR;
}

std::string ReadFile(const std::string& path) {
  std::ifstream in(path, std::ios::binary);
  EXPECT_TRUE(in.good()) << "cannot open " << path;
  std::ostringstream ss;
  ss << in.rdbuf();
  return ss.str();
}

}  // namespace heatdeck::testing
