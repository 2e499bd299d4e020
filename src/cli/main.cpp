// heatdeck's executable: hands the command line to cli::Main and turns any
// exception that escaped it into exit status 3.
#include <unistd.h>

#include <cstdlib>
#include <exception>
#include <iostream>

#include "cli/app.h"

int main(int argc, char** argv) {
  std::ios::sync_with_stdio(false);
  const char* no_colour = std::getenv("NO_COLOR");
  const bool colour = isatty(STDERR_FILENO) != 0 && (no_colour == nullptr || *no_colour == '\0');
  std::vector<std::string> args(argv, argv + argc);
  try {
    return heatdeck::cli::Main(args, heatdeck::cli::Streams{std::cout, std::cerr, colour});
  } catch (const std::exception& e) {
    std::cerr << "heatdeck: internal error: " << e.what() << "\n";
    return heatdeck::cli::kUsage;
  }
}
