// Runs the real heatdeck executable as a child process, the way a user or a
// CI script does, and captures what it printed and how it exited.
#pragma once

#include <string>
#include <vector>

namespace heatdeck::testing {

struct ProcessResult {
  // The exit status; 128 + the signal number when the process was killed
  // by a signal (a crash shows as 134 or 139, never as 0..3).
  int status = -1;
  bool signalled = false;
  // True when the child ran past the time limit given to RunHeatdeck and
  // was killed (then signalled is true and status is 128 + SIGKILL).
  bool timed_out = false;
  std::string out;  // standard output, bytes as written
  std::string err;  // standard error
};

// Runs HD_BINARY with args (without the program name) in the folder cwd, with
// NO_COLOR set and standard input closed.  Output goes to temporary files,
// so a child that writes megabytes cannot block on a full pipe.  With a
// timeout_seconds above 0, a child still running after that long is killed
// and reported with timed_out set; a test treats that as a failure.
ProcessResult RunHeatdeck(const std::vector<std::string>& args, const std::string& cwd,
                          double timeout_seconds = 0);

// A fresh empty folder under the system's temporary folder; removed, with
// what is in it, when the object goes.
class TempDir {
 public:
  TempDir();
  ~TempDir();
  TempDir(const TempDir&) = delete;
  TempDir& operator=(const TempDir&) = delete;
  const std::string& path() const { return path_; }
  // The names of the entries in the folder, sorted (empty when none).
  std::vector<std::string> Entries() const;

 private:
  std::string path_;
};

}  // namespace heatdeck::testing
