#include "reference_csv.h"

#include <cstdlib>
#include <sstream>

#include <gtest/gtest.h>

#include "test_paths.h"

namespace heatdeck::testing {
namespace {

std::vector<std::vector<std::string>> ParseCsv(const std::string& text) {
  std::vector<std::vector<std::string>> rows;
  std::vector<std::string> row;
  std::string cell;
  bool quoted = false;
  for (size_t i = 0; i < text.size(); ++i) {
    const char c = text[i];
    if (quoted) {
      if (c == '"' && i + 1 < text.size() && text[i + 1] == '"') {
        cell += '"';
        ++i;
      } else if (c == '"') {
        quoted = false;
      } else {
        cell += c;
      }
    } else if (c == '"') {
      quoted = true;
    } else if (c == ',') {
      row.push_back(cell);
      cell.clear();
    } else if (c == '\n' || c == '\r') {
      if (c == '\r' && i + 1 < text.size() && text[i + 1] == '\n') ++i;
      row.push_back(cell);
      cell.clear();
      if (!(row.size() == 1 && row[0].empty())) rows.push_back(row);
      row.clear();
    } else {
      cell += c;
    }
  }
  if (!cell.empty() || !row.empty()) {
    row.push_back(cell);
    rows.push_back(row);
  }
  return rows;
}

}  // namespace

std::vector<CsvRow> LoadCsv(const std::string& path) {
  const auto table = ParseCsv(ReadFile(path));
  std::vector<CsvRow> out;
  if (table.empty()) {
    ADD_FAILURE() << "empty CSV " << path;
    return out;
  }
  const auto& header = table[0];
  for (size_t r = 1; r < table.size(); ++r) {
    CsvRow row;
    for (size_t c = 0; c < header.size() && c < table[r].size(); ++c) {
      row[header[c]] = table[r][c];
    }
    out.push_back(std::move(row));
  }
  return out;
}

std::vector<CsvRow> LoadReference(const std::string& name) {
  return LoadCsv(SharedDir() + "/reference/" + name);
}

std::vector<double> SplitArgs(const std::string& cell) {
  std::vector<double> v;
  std::stringstream ss(cell);
  std::string part;
  while (std::getline(ss, part, ';')) v.push_back(std::strtod(part.c_str(), nullptr));
  return v;
}

}  // namespace heatdeck::testing
