#include "report/csv_writer.h"

#include <cmath>

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
  // Each number goes to a buffer on the stack, then into the line in one
  // append: a sweep writes millions of them.
  char number[40];
  for (size_t i = 0; i < n; ++i) {
    if (std::isfinite(values[i])) {
      const char* end = fmt::format_to(number, FMT_COMPILE("{}"), values[i]);
      line->append(number, static_cast<size_t>(end - number));
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
