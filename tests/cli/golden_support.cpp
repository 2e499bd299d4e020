#include "golden_support.h"

#include <cstdlib>
#include <string_view>
#include <vector>

#include "test_paths.h"

namespace heatdeck::testing {

namespace {

std::vector<std::string_view> SplitLines(std::string_view text) {
  std::vector<std::string_view> lines;
  size_t start = 0;
  while (start <= text.size()) {
    size_t nl = text.find('\n', start);
    if (nl == std::string_view::npos) nl = text.size();
    lines.push_back(text.substr(start, nl - start));
    start = nl + 1;
  }
  return lines;
}

// Parses "LINE:COL: error: " at the front of rest; false when it is not there.
bool ParseLocation(std::string_view rest, int* line, int* col) {
  size_t i = 0;
  auto number = [&](int* out) {
    const size_t begin = i;
    while (i < rest.size() && rest[i] >= '0' && rest[i] <= '9') ++i;
    if (i == begin || i - begin > 9) return false;
    *out = std::atoi(std::string(rest.substr(begin, i - begin)).c_str());
    return true;
  };
  if (!number(line) || i >= rest.size() || rest[i] != ':') return false;
  ++i;
  if (!number(col)) return false;
  return rest.substr(i, 9) == ": error: ";
}

size_t CodePoints(std::string_view s) {
  size_t n = 0;
  for (char c : s) n += (static_cast<unsigned char>(c) & 0xC0) != 0x80;
  return n;
}

}  // namespace

int ReadStatus(const std::string& path) { return std::atoi(ReadFile(path).c_str()); }

bool HasLocatedError(const std::string& err, const std::string& deck, const std::string& source,
                     std::string* why) {
  const std::vector<std::string_view> lines = SplitLines(err);
  std::vector<std::string_view> src = SplitLines(source);
  for (auto& l : src) {
    if (!l.empty() && l.back() == '\r') l.remove_suffix(1);
  }
  const std::string prefix = deck + ":";
  int located = 0;
  for (size_t i = 0; i < lines.size(); ++i) {
    if (lines[i].substr(0, prefix.size()) != prefix) continue;
    int line = 0, col = 0;
    if (!ParseLocation(lines[i].substr(prefix.size()), &line, &col)) continue;
    const std::string where = std::string(lines[i]);
    if (line < 1 || static_cast<size_t>(line) > src.size()) {
      *why = "line number out of the file: " + where;
      return false;
    }
    if (col < 1 || static_cast<size_t>(col) > src[static_cast<size_t>(line) - 1].size() + 1) {
      *why = "column out of the line: " + where;
      return false;
    }
    if (i + 2 >= lines.size()) {
      *why = "no source line and caret after: " + where;
      return false;
    }
    const std::string_view quoted = lines[i + 1];
    const std::string_view caret = lines[i + 2];
    const std::string_view wanted = src[static_cast<size_t>(line) - 1];
    // The quote shows control bytes other than tab as '?'.
    std::string shown(wanted);
    for (char& c : shown) {
      const auto u = static_cast<unsigned char>(c);
      if ((u < 0x20 && c != '\t') || u == 0x7F) c = '?';
    }
    if (wanted.size() <= 200) {
      if (quoted != "  " + shown) {
        *why = "the quoted line is not source line " + std::to_string(line) + ": " + where;
        return false;
      }
      // The caret stands under byte COL; a renderer that pads by characters
      // instead (so the caret lines up after a multi-byte character like
      // the degree sign) is right too.
      const size_t at = caret.find('^');
      const size_t by_bytes = static_cast<size_t>(col) + 1;
      const size_t by_chars = 2 + CodePoints(wanted.substr(0, static_cast<size_t>(col) - 1));
      if (at == std::string_view::npos || (at != by_bytes && at != by_chars) ||
          caret.find_first_not_of(" \t") != at ||
          caret.find_first_not_of('~', at + 1) != std::string_view::npos) {
        *why = "no caret under column " + std::to_string(col) + ": " + where;
        return false;
      }
    } else if (caret.find('^') == std::string_view::npos) {
      *why = "no caret line: " + where;
      return false;
    }
    ++located;
  }
  if (located == 0) {
    *why = "no '" + prefix + "LINE:COL: error:' line";
    return false;
  }
  return true;
}

}  // namespace heatdeck::testing
