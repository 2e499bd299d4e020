// Runs the rows of the shared reference CSVs (library_checks.csv,
// library_errors.csv in ../shared/reference) through the registry.  Used by
// reference_rows_test.cpp for every row and by the per-family tests for
// their own family.  Rows whose function is not registered are counted as
// skipped, never as passed.
#pragma once

#include <set>
#include <string>
#include <string_view>

namespace heatdeck::testing {

struct RowTally {
  int run = 0;
  int failed = 0;
  int skipped = 0;                      // function not registered (yet)
  std::set<std::string> functions_run;  // registered functions that had rows
  std::set<std::string> unregistered;   // names of skipped rows
};

// library_checks.csv: for each row whose function is registered and belongs
// to family (every family when empty), calls it with the row's args and
// requires no error and |got - expected| <= rel_tol*|expected| (rel_tol as
// an absolute bound when expected is 0); a row whose note marks a "validity
// edge" must also record no warning (ranges are inclusive).  Each failing
// row is reported with ADD_FAILURE, naming the function, the args, the
// values and the row's source.
RowTally RunCheckRows(std::string_view family);

// library_errors.csv: expect=error requires a recorded error and a NaN
// result; expect=warning requires a finite result, a recorded warning and no
// error.
RowTally RunErrorRows(std::string_view family);

// For each check row of a registered function that has a spreadsheet
// formula: the formula, evaluated with the row's args (spreadsheet_eval.h),
// must reproduce both the library's own result and the row's expected value
// to the row's tolerance, but never tighter than 1e-9 relative.
RowTally RunSpreadsheetRows(std::string_view family);

}  // namespace heatdeck::testing
