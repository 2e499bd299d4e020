// Reading the files a deck names, inside the folders it may read.
#pragma once

#include <string>
#include <vector>

namespace heatdeck {

// Reads a whole file of at most max_bytes.  Returns false and sets *why
// ("no such file", "larger than the 64 MiB limit") on failure.
bool ReadWholeFile(const std::string& path, size_t max_bytes, std::string* out, std::string* why);

// Lower-case hex SHA-256 of data.
std::string Sha256Hex(const std::string& data);

// Resolves `path` as written in a deck against `base_dir`; the result is
// canonical (symbolic links resolved).  Returns false and sets *why when the
// file does not exist or lies outside every folder in `allowed` (canonical
// folders).  Absolute paths are allowed only inside those folders too.
bool ResolveContained(const std::string& base_dir, const std::string& path,
                      const std::vector<std::string>& allowed, std::string* resolved,
                      std::string* why);

// Canonical form of an existing folder, "" when it does not exist.
std::string CanonicalDir(const std::string& dir);

}  // namespace heatdeck
