// Writing output files so that a failure never leaves a half-written file
// and never touches the previous good output: every writer writes a
// temporary file in the target folder, which is renamed over the target only
// when complete.
#pragma once

#include <functional>
#include <string>

namespace heatdeck {

// Writes `content` to `path` atomically.  Returns false and sets *error.
bool WriteFileAtomic(const std::string& path, const std::string& content, std::string* error);

// For writers that need a file name of their own (libxlsxwriter): calls
// write(temp_path) and renames the temporary over `path` when it returns
// true; removes the temporary otherwise.
bool WriteViaTemp(
    const std::string& path,
    const std::function<bool(const std::string& temp_path, std::string* error)>& write,
    std::string* error);

}  // namespace heatdeck
