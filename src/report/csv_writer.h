// Sweep rows as CSV, streamed: one header row `name [unit]`, then one row a
// point in display units, the last column the point's error ("" when it
// evaluated).  Numbers are the shortest text that reads back exactly.
#pragma once

#include <cstdio>
#include <string>
#include <vector>

namespace heatdeck {

class CsvWriter {
 public:
  explicit CsvWriter(std::FILE* out) : out_(out) {}
  void Header(const std::vector<std::string>& names, const std::vector<std::string>& units);
  void Row(const double* values, size_t n, const std::string& error);
  // Bytes already formatted by AppendRow.
  void Write(const std::string& bytes) { std::fwrite(bytes.data(), 1, bytes.size(), out_); }
  // Appends one row to *line (touches nothing else: safe from many threads).
  static void AppendRow(std::string* line, const double* values, size_t n,
                        const std::string& error);
  bool ok() const { return std::ferror(out_) == 0; }

 private:
  std::FILE* out_;
  std::string line_;
};

// A text cell quoted by the usual CSV practice (RFC 4180), and kept from
// being read as a formula by spreadsheets: a cell beginning with = + - @,
// a tab or a carriage return gets a leading apostrophe inside quotes
// (common practice).  Numbers are not cells of this kind: CsvWriter::Row
// writes them as they are, so -1.5 stays a number.
std::string CsvCell(const std::string& text);

}  // namespace heatdeck
