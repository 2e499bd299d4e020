// The command line: one entry point, testable without a process.
#pragma once

#include <iosfwd>
#include <string>
#include <vector>

namespace heatdeck::cli {

// Exit statuses (LANGUAGE.md "Diagnostics and exit codes").
inline constexpr int kOk = 0;
inline constexpr int kCheckFailed = 1;
inline constexpr int kDeckErrors = 2;
inline constexpr int kUsage = 3;

struct Streams {
  std::ostream& out;
  std::ostream& err;
  bool colour = false;  // ANSI colours on err
};

// Runs heatdeck with args (args[0] is the program name).
int Main(const std::vector<std::string>& args, Streams io);

// Commands, each in its own file.
struct GlobalOptions;
int RunCheck(const std::vector<std::string>& decks, const GlobalOptions& g, Streams io);
int RunRun(const std::vector<std::string>& decks, const std::string& out_dir,
           const std::vector<std::string>& formats, const GlobalOptions& g, Streams io);
int RunUnits(const std::string& filter, Streams io);
int RunFunctions(const std::string& name, Streams io);
// decks: OLD NEW, or one deck with rev (the old version read through git).
int RunDiff(const std::vector<std::string>& decks, const std::string& rev,
            const std::string& format, const GlobalOptions& g, Streams io);
// The template library (stdlib_dir, or the built-in one when empty).
int RunTemplates(const std::string& stdlib_dir, Streams io);
// Writes a deck using template `name` to `file` (standard output when empty);
// never overwrites an existing file.
int RunNew(const std::string& name, const std::string& file, const std::string& stdlib_dir,
           Streams io);

}  // namespace heatdeck::cli
