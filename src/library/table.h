// User property tables (LANGUAGE.md "Tables"): a CSV whose header cells are
// "name [unit]", first column the argument, strictly increasing; columns are
// interpolated linearly.  Plain C++ on SI doubles.
#pragma once

#include <string>
#include <string_view>
#include <vector>

#include "units/unit.h"

namespace heatdeck::library {

struct TableColumn {
  std::string name;        // "cp"
  units::Unit unit;        // parsed from the header's [unit]
  std::vector<double> si;  // values converted to SI, one per data row
};

struct Table {
  std::vector<TableColumn> columns;  // columns[0] is the argument
  // Index of the column called name, or -1.
  int Find(std::string_view name) const;
  // Interpolates column c (>= 1) at the SI argument x.  Returns false when x
  // lies outside [first, last] of the argument column (no extrapolation).
  bool Interpolate(int c, double x, double* out) const;
};

// A problem in the CSV text, 1-based line and column.
struct TableError {
  int line = 0;
  int column = 0;
  std::string message;
};

// Parses CSV text: header row of "name [unit]" cells, then numeric rows;
// blank lines and lines starting with '#' are skipped; quoted cells allowed.
// Errors: missing or malformed header, unknown unit, ragged row, a cell that
// is not a number, fewer than 2 data rows, first column not strictly
// increasing, duplicate column names.  Collects every error it finds.
// Returns true when it added no error (errors may already hold some from
// earlier files); *out is written only then.
bool ParseTableCsv(std::string_view text, Table* out, std::vector<TableError>* errors);

}  // namespace heatdeck::library
