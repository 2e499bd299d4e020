#include "process_runner.h"

#include <fcntl.h>
#include <sys/wait.h>
#include <unistd.h>

#include <algorithm>
#include <cerrno>
#include <chrono>
#include <csignal>
#include <cstdio>
#include <cstdlib>
#include <filesystem>
#include <fstream>
#include <sstream>
#include <stdexcept>
#include <thread>

extern char** environ;

namespace heatdeck::testing {

namespace fs = std::filesystem;

namespace {

std::string Slurp(const std::string& path) {
  std::ifstream in(path, std::ios::binary);
  std::ostringstream ss;
  ss << in.rdbuf();
  return ss.str();
}

// mkstemp needs a writable buffer ending in XXXXXX.
std::string MakeTemp(const std::string& pattern, int* fd) {
  std::string name = (fs::temp_directory_path() / pattern).string();
  *fd = mkstemp(name.data());
  if (*fd < 0) throw std::runtime_error("mkstemp failed for " + name);
  return name;
}

}  // namespace

ProcessResult RunHeatdeck(const std::vector<std::string>& args, const std::string& cwd,
                          double timeout_seconds) {
  int out_fd = -1, err_fd = -1;
  const std::string out_path = MakeTemp("hd-out-XXXXXX", &out_fd);
  const std::string err_path = MakeTemp("hd-err-XXXXXX", &err_fd);

  // Everything the child needs is prepared before fork: after it, only
  // async-signal-safe calls are allowed.
  std::vector<std::string> argv_store;
  argv_store.emplace_back(HD_BINARY);
  argv_store.insert(argv_store.end(), args.begin(), args.end());
  std::vector<char*> argv;
  for (std::string& a : argv_store) argv.push_back(a.data());
  argv.push_back(nullptr);
  std::string no_colour = "NO_COLOR=1";
  std::vector<char*> envp;
  for (char** e = environ; *e != nullptr; ++e) {
    if (std::string_view(*e).substr(0, 9) != "NO_COLOR=") envp.push_back(*e);
  }
  envp.push_back(no_colour.data());
  envp.push_back(nullptr);

  const pid_t pid = fork();
  if (pid < 0) throw std::runtime_error("fork failed");
  if (pid == 0) {
    const int null_fd = open("/dev/null", O_RDONLY);
    if (null_fd < 0 || dup2(null_fd, 0) < 0 || dup2(out_fd, 1) < 0 || dup2(err_fd, 2) < 0 ||
        chdir(cwd.c_str()) != 0) {
      _exit(127);
    }
    execve(argv[0], argv.data(), envp.data());
    _exit(127);
  }
  close(out_fd);
  close(err_fd);
  ProcessResult r;
  int wstatus = 0;
  if (timeout_seconds > 0) {
    // Poll, so that a child past its time can be killed; the poll interval
    // grows to 20 ms, short against any time limit a test would set.
    const auto deadline = std::chrono::steady_clock::now() +
                          std::chrono::duration_cast<std::chrono::steady_clock::duration>(
                              std::chrono::duration<double>(timeout_seconds));
    auto pause = std::chrono::microseconds(200);
    for (;;) {
      const pid_t done = waitpid(pid, &wstatus, WNOHANG);
      if (done == pid) break;
      if (done < 0 && errno != EINTR) throw std::runtime_error("waitpid failed");
      if (std::chrono::steady_clock::now() >= deadline) {
        kill(pid, SIGKILL);
        while (waitpid(pid, &wstatus, 0) < 0) {
          if (errno != EINTR) throw std::runtime_error("waitpid failed");
        }
        // It may have ended by itself just before the kill.
        r.timed_out = WIFSIGNALED(wstatus) && WTERMSIG(wstatus) == SIGKILL;
        break;
      }
      std::this_thread::sleep_for(pause);
      pause = std::min(pause * 2, std::chrono::microseconds(20000));
    }
  } else {
    while (waitpid(pid, &wstatus, 0) < 0) {
      if (errno != EINTR) throw std::runtime_error("waitpid failed");
    }
  }
  if (WIFEXITED(wstatus)) {
    r.status = WEXITSTATUS(wstatus);
  } else if (WIFSIGNALED(wstatus)) {
    r.signalled = true;
    r.status = 128 + WTERMSIG(wstatus);
  }
  r.out = Slurp(out_path);
  r.err = Slurp(err_path);
  std::remove(out_path.c_str());
  std::remove(err_path.c_str());
  return r;
}

TempDir::TempDir() {
  std::string name = (fs::temp_directory_path() / "hd-golden-XXXXXX").string();
  if (mkdtemp(name.data()) == nullptr) throw std::runtime_error("mkdtemp failed for " + name);
  path_ = name;
}

TempDir::~TempDir() {
  std::error_code ec;
  fs::remove_all(path_, ec);
}

std::vector<std::string> TempDir::Entries() const {
  std::vector<std::string> names;
  for (const auto& e : fs::directory_iterator(path_)) names.push_back(e.path().filename().string());
  std::sort(names.begin(), names.end());
  return names;
}

}  // namespace heatdeck::testing
