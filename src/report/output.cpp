#include "report/output.h"

#include <cerrno>
#include <cstdio>
#include <cstring>
#include <filesystem>
#include <random>

#include <fcntl.h>
#include <unistd.h>

#include <fmt/format.h>

namespace heatdeck {

namespace fs = std::filesystem;

namespace {

// A fresh name beside `path`, so that the rename stays in one file system.
std::string TempNameFor(const std::string& path) {
  static thread_local std::mt19937_64 rng{std::random_device{}()};
  const fs::path p(path);
  return (p.parent_path() / fmt::format(".{}.{:016x}.tmp", p.filename().string(), rng())).string();
}

}  // namespace

bool WriteViaTemp(
    const std::string& path,
    const std::function<bool(const std::string& temp_path, std::string* error)>& write,
    std::string* error) {
  const std::string tmp = TempNameFor(path);
  if (!write(tmp, error)) {
    std::remove(tmp.c_str());
    return false;
  }
  if (std::rename(tmp.c_str(), path.c_str()) != 0) {
    *error = fmt::format("cannot rename {} to {}: {}", tmp, path, std::strerror(errno));
    std::remove(tmp.c_str());
    return false;
  }
  return true;
}

bool WriteFileAtomic(const std::string& path, const std::string& content, std::string* error) {
  return WriteViaTemp(
      path,
      [&](const std::string& tmp, std::string* err) {
        const int fd = ::open(tmp.c_str(), O_WRONLY | O_CREAT | O_EXCL | O_CLOEXEC, 0644);
        if (fd < 0) {
          *err = fmt::format("cannot create {}: {}", tmp, std::strerror(errno));
          return false;
        }
        size_t done = 0;
        while (done < content.size()) {
          const ssize_t n = ::write(fd, content.data() + done, content.size() - done);
          if (n < 0) {
            if (errno == EINTR) continue;
            *err = fmt::format("cannot write {}: {}", path, std::strerror(errno));
            ::close(fd);
            return false;
          }
          done += static_cast<size_t>(n);
        }
        if (::fsync(fd) != 0 || ::close(fd) != 0) {
          *err = fmt::format("cannot write {}: {}", path, std::strerror(errno));
          return false;
        }
        return true;
      },
      error);
}

}  // namespace heatdeck
