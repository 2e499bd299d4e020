#include "report/csv_writer.h"

#include <cmath>
#include <cstdint>
#include <cstring>

#include <fmt/compile.h>
#include <fmt/format.h>

namespace heatdeck {

std::string CsvCell(const std::string& text) {
  std::string t = text;
  if (!t.empty() &&
      (t[0] == '=' || t[0] == '+' || t[0] == '-' || t[0] == '@' || t[0] == '\t' || t[0] == '\r')) {
    t = "'" + t;
  }
  if (t.find_first_of(",\"\n\r") == std::string::npos && t == text) return t;
  std::string q = "\"";
  for (char c : t) {
    if (c == '"') q += '"';
    q += c;
  }
  return q + "\"";
}

void CsvWriter::Header(const std::vector<std::string>& names,
                       const std::vector<std::string>& units) {
  line_.clear();
  for (size_t i = 0; i < names.size(); ++i) {
    line_ += CsvCell(units[i].empty() ? names[i] : fmt::format("{} [{}]", names[i], units[i]));
    line_ += ',';
  }
  line_ += "error\n";
  std::fwrite(line_.data(), 1, line_.size(), out_);
}

void CsvWriter::AppendRow(std::string* line, const double* values, size_t n,
                          const std::string& error) {
  // The last number written in each column, with its text, per thread: a
  // sweep's outer inputs hold their value for thousands of rows, and
  // formatting is the larger part of writing a row.  The text is a function
  // of the value's bits alone, so the memo is right whatever wrote before.
  struct Last {
    std::uint64_t bits = 0;
    unsigned char size = 0;  // 0: nothing remembered
    char text[39];
  };
  thread_local std::vector<Last> last;
  if (last.size() < n) last.resize(n);
  for (size_t i = 0; i < n; ++i) {
    if (std::isfinite(values[i])) {
      std::uint64_t bits;
      std::memcpy(&bits, &values[i], sizeof bits);
      Last& m = last[i];
      if (m.size == 0 || m.bits != bits) {
        const char* end = fmt::format_to(m.text, FMT_COMPILE("{}"), values[i]);
        m.size = static_cast<unsigned char>(end - m.text);
        m.bits = bits;
      }
      line->append(m.text, m.size);
    }
    *line += ',';
  }
  if (!error.empty()) *line += CsvCell(error);
  *line += '\n';
}

void CsvWriter::Row(const double* values, size_t n, const std::string& error) {
  line_.clear();
  AppendRow(&line_, values, n, error);
  std::fwrite(line_.data(), 1, line_.size(), out_);
}

}  // namespace heatdeck
