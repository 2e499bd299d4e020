#include "report/csv_writer.h"

#include <cmath>

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

void CsvWriter::Row(const double* values, size_t n, const std::string& error) {
  line_.clear();
  for (size_t i = 0; i < n; ++i) {
    if (std::isfinite(values[i])) fmt::format_to(std::back_inserter(line_), "{}", values[i]);
    line_ += ',';
  }
  if (!error.empty()) line_ += CsvCell(error);
  line_ += '\n';
  std::fwrite(line_.data(), 1, line_.size(), out_);
}

}  // namespace heatdeck
