// Times a command run many times, for the whole-process comparisons of
// tools/bench.sh (hyperfine is not assumed).
//
//   proc_time [-n RUNS] [-w WARMUP] [-o OUT] [-c CPU] -- COMMAND [ARGS…]
//
// Each run is forked and exec'd directly (no shell); its standard output goes
// to OUT (default /dev/null), standard error is kept; with -c it runs on that
// CPU only (set in the child before exec, so no pinning tool's start-up is
// counted).  Wall time comes from
// CLOCK_MONOTONIC, user + system time and peak RSS from wait4()'s rusage,
// all per run.  Prints one line of key=value pairs:
//
//   runs=200 wall_median=0.00312 wall_min=… cpu_median=… cpu_min=… maxrss_kb=… status=0
//
// (seconds; maxrss_kb the largest over the runs; status the last non-zero
// exit status, or 0).  Exits 0 unless the command could not be started.
#include <fcntl.h>
#include <sched.h>
#include <sys/resource.h>
#include <sys/wait.h>
#include <unistd.h>

#include <algorithm>
#include <cstdio>
#include <cstdlib>
#include <cstring>
#include <ctime>
#include <string>
#include <vector>

namespace {

double Now() {
  timespec ts{};
  clock_gettime(CLOCK_MONOTONIC, &ts);
  return static_cast<double>(ts.tv_sec) + static_cast<double>(ts.tv_nsec) * 1e-9;
}

double Seconds(const timeval& tv) {
  return static_cast<double>(tv.tv_sec) + static_cast<double>(tv.tv_usec) * 1e-6;
}

double Median(std::vector<double> v) {
  std::sort(v.begin(), v.end());
  const size_t n = v.size();
  return n % 2 == 1 ? v[n / 2] : (v[n / 2 - 1] + v[n / 2]) / 2;
}

struct Run {
  double wall = 0, cpu = 0;
  long maxrss_kb = 0;
  int status = 0;
};

bool RunOnce(char** argv, const char* out, int cpu, Run* r) {
  const double t0 = Now();
  const pid_t pid = fork();
  if (pid < 0) return false;
  if (pid == 0) {
    if (cpu >= 0) {
      cpu_set_t set;
      CPU_ZERO(&set);
      CPU_SET(cpu, &set);
      if (sched_setaffinity(0, sizeof set, &set) != 0) {
        std::fprintf(stderr, "proc_time: cannot pin to CPU %d: %s\n", cpu, std::strerror(errno));
        _exit(127);
      }
    }
    const int fd = open(out, O_WRONLY | O_CREAT | O_TRUNC, 0644);
    if (fd >= 0) {
      dup2(fd, 1);
      close(fd);
    }
    execvp(argv[0], argv);
    std::fprintf(stderr, "proc_time: cannot run %s: %s\n", argv[0], std::strerror(errno));
    _exit(127);
  }
  int status = 0;
  rusage ru{};
  if (wait4(pid, &status, 0, &ru) != pid) return false;
  r->wall = Now() - t0;
  r->cpu = Seconds(ru.ru_utime) + Seconds(ru.ru_stime);
  r->maxrss_kb = ru.ru_maxrss;
  r->status = WIFEXITED(status) ? WEXITSTATUS(status) : 128 + WTERMSIG(status);
  return r->status != 127;
}

}  // namespace

int main(int argc, char** argv) {
  int runs = 1, warmup = 0, pin_cpu = -1;
  const char* out = "/dev/null";
  int i = 1;
  for (; i < argc; ++i) {
    const std::string a = argv[i];
    if (a == "--") {
      ++i;
      break;
    }
    if (i + 1 >= argc) break;
    if (a == "-n") {
      runs = std::max(1, std::atoi(argv[++i]));
    } else if (a == "-w") {
      warmup = std::max(0, std::atoi(argv[++i]));
    } else if (a == "-o") {
      out = argv[++i];
    } else if (a == "-c") {
      pin_cpu = std::atoi(argv[++i]);
    } else {
      break;
    }
  }
  if (i >= argc) {
    std::fprintf(stderr,
                 "usage: proc_time [-n RUNS] [-w WARMUP] [-o OUT] [-c CPU] -- COMMAND [ARGS...]\n");
    return 2;
  }
  char** cmd = argv + i;
  Run r;
  for (int k = 0; k < warmup; ++k) {
    if (!RunOnce(cmd, out, pin_cpu, &r)) return 2;
  }
  std::vector<double> wall, cpu;
  long maxrss = 0;
  int last_bad = 0;
  for (int k = 0; k < runs; ++k) {
    if (!RunOnce(cmd, out, pin_cpu, &r)) return 2;
    wall.push_back(r.wall);
    cpu.push_back(r.cpu);
    maxrss = std::max(maxrss, r.maxrss_kb);
    if (r.status != 0) last_bad = r.status;
  }
  std::printf(
      "runs=%d wall_median=%.6f wall_min=%.6f cpu_median=%.6f cpu_min=%.6f maxrss_kb=%ld "
      "status=%d\n",
      runs, Median(wall), *std::min_element(wall.begin(), wall.end()), Median(cpu),
      *std::min_element(cpu.begin(), cpu.end()), maxrss, last_bad);
  return 0;
}
