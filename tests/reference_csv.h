// Loads the reference CSVs in ../shared/reference (never copies of them).
#pragma once

#include <map>
#include <string>
#include <vector>

namespace heatdeck::testing {

// One CSV row as column name -> cell text (RFC 4180 quoting handled).
using CsvRow = std::map<std::string, std::string>;

// Parses a CSV file with a header row; fails the current test if unreadable.
std::vector<CsvRow> LoadCsv(const std::string& path);
// SharedDir() + "/reference/" + name.
std::vector<CsvRow> LoadReference(const std::string& name);
// Splits "1.0;2.5;3" into doubles.
std::vector<double> SplitArgs(const std::string& cell);

}  // namespace heatdeck::testing
