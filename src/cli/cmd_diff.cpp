// `heatdeck diff OLD NEW` and `heatdeck diff --rev REV DECK`: what changed
// between two revisions of a deck (docs/diff.md).
#include <fcntl.h>
#include <poll.h>
#include <spawn.h>
#include <sys/wait.h>
#include <unistd.h>

#include <algorithm>
#include <cerrno>
#include <cstring>
#include <filesystem>
#include <ostream>

#include <fmt/format.h>

#include "cli/app.h"
#include "cli/deck_runner.h"
#include "eval/results.h"
#include "lang/diagnostics.h"
#include "report/diff.h"

extern char** environ;

namespace heatdeck::cli {

namespace fs = std::filesystem;

namespace {

struct ProcessOutput {
  int status = -1;  // exit status; -1 when it could not be started or was killed
  std::string out, err;
  std::string spawn_error;
};

// Runs a program found on PATH with args, without a shell (so that a
// revision or path is never read as shell syntax), and collects what it
// writes.  Standard output beyond max_out bytes is read and dropped, so a
// huge blob cannot exhaust memory; *truncated says it happened.  Neither
// the standard library nor the project's dependencies run a child process,
// hence posix_spawn and poll by hand.
ProcessOutput RunProgram(const std::vector<std::string>& args, size_t max_out, bool* truncated) {
  ProcessOutput r;
  *truncated = false;
  int out_pipe[2], err_pipe[2];
  if (pipe(out_pipe) != 0) {
    r.spawn_error = std::strerror(errno);
    return r;
  }
  if (pipe(err_pipe) != 0) {
    r.spawn_error = std::strerror(errno);
    close(out_pipe[0]);
    close(out_pipe[1]);
    return r;
  }
  posix_spawn_file_actions_t actions;
  posix_spawn_file_actions_init(&actions);
  posix_spawn_file_actions_addopen(&actions, 0, "/dev/null", O_RDONLY, 0);
  posix_spawn_file_actions_adddup2(&actions, out_pipe[1], 1);
  posix_spawn_file_actions_adddup2(&actions, err_pipe[1], 2);
  for (int fd : {out_pipe[0], out_pipe[1], err_pipe[0], err_pipe[1]}) {
    posix_spawn_file_actions_addclose(&actions, fd);
  }
  std::vector<std::string> store = args;
  std::vector<char*> argv;
  for (std::string& a : store) argv.push_back(a.data());
  argv.push_back(nullptr);
  pid_t pid = 0;
  const int rc = posix_spawnp(&pid, argv[0], &actions, nullptr, argv.data(), environ);
  posix_spawn_file_actions_destroy(&actions);
  close(out_pipe[1]);
  close(err_pipe[1]);
  if (rc != 0) {
    r.spawn_error = std::strerror(rc);
    close(out_pipe[0]);
    close(err_pipe[0]);
    return r;
  }
  pollfd fds[2] = {{out_pipe[0], POLLIN, 0}, {err_pipe[0], POLLIN, 0}};
  int open_fds = 2;
  char buf[65536];
  while (open_fds > 0) {
    if (poll(fds, 2, -1) < 0) {
      if (errno == EINTR) continue;
      break;
    }
    for (int i = 0; i < 2; ++i) {
      if (fds[i].fd < 0 || fds[i].revents == 0) continue;
      const ssize_t n = read(fds[i].fd, buf, sizeof buf);
      if (n < 0 && errno == EINTR) continue;
      if (n <= 0) {
        close(fds[i].fd);
        fds[i].fd = -1;
        --open_fds;
        continue;
      }
      std::string& sink = i == 0 ? r.out : r.err;
      const size_t limit = i == 0 ? max_out : 65536;
      const size_t room = limit > sink.size() ? limit - sink.size() : 0;
      const size_t take = std::min(room, static_cast<size_t>(n));
      sink.append(buf, take);
      if (i == 0 && take < static_cast<size_t>(n)) *truncated = true;
    }
  }
  for (const pollfd& p : fds) {
    if (p.fd >= 0) close(p.fd);
  }
  int wstatus = 0;
  while (waitpid(pid, &wstatus, 0) < 0) {
    if (errno != EINTR) return r;
  }
  if (WIFEXITED(wstatus)) r.status = WEXITSTATUS(wstatus);
  return r;
}

std::string TrimEnd(std::string s) {
  while (!s.empty() && (s.back() == '\n' || s.back() == '\r' || s.back() == ' ')) s.pop_back();
  return s;
}

// Reads the version of `deck` at revision `rev` through git, run in the
// deck's folder.  On failure *why says what went wrong.
bool ReadAtRevision(const std::string& deck, const std::string& rev, size_t max_bytes,
                    std::string* text, std::string* label, std::string* why) {
  std::string dir = fs::path(deck).parent_path().string();
  if (dir.empty()) dir = ".";
  bool truncated = false;
  auto git_failed = [&](const ProcessOutput& p) {
    if (!p.spawn_error.empty()) {
      *why = fmt::format("cannot run git: {}", p.spawn_error);
    } else {
      const std::string msg = TrimEnd(p.err);
      *why = msg.empty() ? fmt::format("git failed (status {})", p.status) : "git: " + msg;
    }
    return false;
  };
  const ProcessOutput top =
      RunProgram({"git", "-C", dir, "rev-parse", "--show-toplevel"}, 1 << 16, &truncated);
  if (top.status != 0) return git_failed(top);
  std::error_code ec;
  const fs::path top_dir = fs::weakly_canonical(TrimEnd(top.out), ec);
  const fs::path file = fs::weakly_canonical(deck, ec);
  if (ec) {
    *why = fmt::format("cannot resolve '{}': {}", deck, ec.message());
    return false;
  }
  const std::string rel = file.lexically_relative(top_dir).generic_string();
  if (rel.empty() || rel == "." || rel.rfind("..", 0) == 0) {
    *why = fmt::format("'{}' is not inside the git repository at '{}'", deck, top_dir.string());
    return false;
  }
  const std::string object = rev + ":" + rel;
  ProcessOutput show = RunProgram({"git", "-C", dir, "--no-pager", "show", "--no-textconv", object},
                                  max_bytes + 1, &truncated);
  if (show.status != 0) return git_failed(show);
  if (truncated || show.out.size() > max_bytes) {
    *why = fmt::format("{} is larger than {} bytes", object, max_bytes);
    return false;
  }
  *text = std::move(show.out);
  *label = object;
  return true;
}

// A usable regular file, so that a missing or unreadable deck is usage
// trouble (status 3) rather than a deck error.
bool Readable(const std::string& path, std::string* why) {
  std::error_code ec;
  const fs::file_status st = fs::status(path, ec);
  if (ec || !fs::exists(st)) {
    *why = "no such file";
    return false;
  }
  if (!fs::is_regular_file(st)) {
    *why = "not a file";
    return false;
  }
  if (access(path.c_str(), R_OK) != 0) {
    *why = std::strerror(errno);
    return false;
  }
  return true;
}

void PrintDiagnostics(const Session& s, Streams io) {
  for (const Diagnostic* d : s.diagnostics().Sorted()) io.err << Render(*d, s.files(), io.colour);
}

// Files the old deck read besides itself that are not built into the
// binary: those are today's files, whatever the revision.
bool ReadsFilesOnDisk(const Results& r) {
  for (size_t i = 1; i < r.files.size(); ++i) {
    if (r.files[i].path.rfind("<stdlib>/", 0) != 0) return true;
  }
  return false;
}

}  // namespace

int RunDiff(const std::vector<std::string>& decks, const std::string& rev,
            const std::string& format, const GlobalOptions& g, Streams io) {
  if (rev.empty() ? decks.size() != 2 : decks.size() != 1) {
    io.err << "heatdeck: diff takes two decks (OLD NEW), or one deck with --rev REV\n";
    return kUsage;
  }
  if (format != "text" && format != "md" && format != "json") {
    io.err << fmt::format("heatdeck: unknown diff format '{}' (text, md, json)\n", format);
    return kUsage;
  }
  if (!rev.empty() && (rev.front() == '-' || rev.find('\n') != std::string::npos)) {
    io.err << fmt::format("heatdeck: '{}' is not a revision\n", rev);
    return kUsage;
  }
  for (const std::string& path : decks) {
    std::string why;
    if (!Readable(path, &why)) {
      io.err << fmt::format("heatdeck: cannot read '{}': {}\n", path, why);
      return kUsage;
    }
  }
  const std::string& new_path = decks.back();

  GlobalOptions opts = g;
  opts.session.keep_sweep_points = 0;  // sweeps are not compared; skip running them

  Session old_session;
  std::string old_label = decks.front();
  bool old_ok = false;
  if (rev.empty()) {
    old_ok = old_session.Load(decks.front(), opts.session);
  } else {
    std::string text, why;
    if (!ReadAtRevision(new_path, rev, opts.session.max_file_bytes, &text, &old_label, &why)) {
      io.err << fmt::format("heatdeck: {}\n", why);
      return kUsage;
    }
    // Named as the deck in the working tree, so that its relative `use`
    // and `table` paths resolve in the same folder.
    old_ok = old_session.LoadText(new_path, std::move(text), opts.session);
  }
  old_ok = old_ok && old_session.Evaluate();
  if (!old_session.diagnostics().Sorted().empty()) {
    if (!rev.empty()) {
      io.err << fmt::format("heatdeck: in the old version {} (lines as in that version):\n",
                            old_label);
    }
    PrintDiagnostics(old_session, io);
  }

  Session new_session;
  const int new_status = LoadAndEvaluate(new_path, opts, io, &new_session);
  const int status = std::max(new_status, old_ok ? kOk : kDeckErrors);

  const Results& old_r = old_session.results();
  const Results& new_r = new_session.results();
  if (old_r.model == nullptr || new_r.model == nullptr || old_r.cases.empty() ||
      new_r.cases.empty()) {
    io.err << "heatdeck: no comparison: "
           << (old_r.model == nullptr || old_r.cases.empty() ? "the old" : "the new")
           << " deck could not be evaluated\n";
    return std::max(status, kDeckErrors);
  }
  DiffResult d = Compare(old_r, new_r);
  d.old_label = old_label;
  d.new_label = new_path;
  if (!rev.empty() && ReadsFilesOnDisk(old_r)) {
    d.note = fmt::format(
        "the old version's templates and tables are read from the current files, not from {}", rev);
  }
  if (format == "md") {
    io.out << WriteDiffMarkdown(d);
  } else if (format == "json") {
    io.out << WriteDiffJson(d);
  } else {
    io.out << WriteDiffText(d);
  }
  io.out.flush();
  return status;
}

}  // namespace heatdeck::cli
