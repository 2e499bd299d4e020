// Every row of the shared reference CSVs, run through the library registry.
// Rows of functions that are not registered yet are counted and listed as
// skipped; a failing row of a registered function fails the test.
#include "library/reference_rows.h"

#include <gtest/gtest.h>

#include <algorithm>
#include <cmath>
#include <cstdio>
#include <cstring>
#include <string>
#include <vector>

#include "library/registry.h"
#include "library/spreadsheet_eval.h"
#include "reference_csv.h"

namespace heatdeck::testing {
namespace {

using library::FindFunction;
using library::FunctionInfo;
using library::RecordingSink;

std::string Cell(const CsvRow& row, const char* column) {
  auto it = row.find(column);
  return it == row.end() ? std::string() : it->second;
}

std::string Join(const std::vector<std::string>& v) {
  std::string out;
  for (const auto& s : v) out += (out.empty() ? "" : " | ") + s;
  return out;
}

std::string JoinSet(const std::set<std::string>& v) {
  std::string out;
  for (const auto& s : v) out += (out.empty() ? "" : ", ") + s;
  return out;
}

// The registered function of a row if it belongs to family (any family when
// empty); counts the row as skipped when the function is not registered.
const FunctionInfo* Select(const CsvRow& row, std::string_view family, RowTally* tally) {
  const std::string name = Cell(row, "function");
  const FunctionInfo* f = FindFunction(name);
  if (f == nullptr) {
    if (family.empty()) {
      ++tally->skipped;
      tally->unregistered.insert(name);
    }
    return nullptr;
  }
  if (!family.empty() && family != f->family) return nullptr;
  return f;
}

bool ArgsFit(const FunctionInfo& f, const std::vector<double>& args, const CsvRow& row) {
  if (args.size() == f.args.size()) return true;
  ADD_FAILURE() << f.name << "(" << Cell(row, "args") << "): the row has " << args.size()
                << " arguments, the function takes " << f.args.size();
  return false;
}

bool Within(double got, double expected, double rel_tol) {
  const double bound = expected == 0 ? rel_tol : rel_tol * std::abs(expected);
  return std::abs(got - expected) <= bound;
}

}  // namespace

RowTally RunCheckRows(std::string_view family) {
  RowTally tally;
  for (const CsvRow& row : LoadReference("library_checks.csv")) {
    const FunctionInfo* f = Select(row, family, &tally);
    if (f == nullptr) continue;
    ++tally.run;
    tally.functions_run.insert(f->name);
    const std::vector<double> args = SplitArgs(Cell(row, "args"));
    if (!ArgsFit(*f, args, row)) {
      ++tally.failed;
      continue;
    }
    const double expected = std::stod(Cell(row, "expected"));
    const double rel_tol = std::stod(Cell(row, "rel_tol"));
    RecordingSink sink;
    const double got = library::Call(*f, args, sink);
    const bool edge = Cell(row, "note").find("validity edge") != std::string::npos;
    if (!Within(got, expected, rel_tol) || !sink.errors.empty() ||
        (edge && !sink.warnings.empty())) {
      ++tally.failed;
      char values[160];
      std::snprintf(values, sizeof values, "got %.17g, expected %.17g (rel_tol %g, rel err %.3g)",
                    got, expected, rel_tol, std::abs(got - expected) / std::abs(expected));
      ADD_FAILURE() << f->name << "(" << Cell(row, "args") << "): " << values
                    << "\n  errors: " << Join(sink.errors) << "\n  warnings"
                    << (edge ? " (validity edge, none expected)" : "") << ": "
                    << Join(sink.warnings) << "\n  source: " << Cell(row, "source")
                    << "\n  note: " << Cell(row, "note");
    }
  }
  return tally;
}

RowTally RunErrorRows(std::string_view family) {
  RowTally tally;
  for (const CsvRow& row : LoadReference("library_errors.csv")) {
    const FunctionInfo* f = Select(row, family, &tally);
    if (f == nullptr) continue;
    ++tally.run;
    tally.functions_run.insert(f->name);
    const std::vector<double> args = SplitArgs(Cell(row, "args"));
    if (!ArgsFit(*f, args, row)) {
      ++tally.failed;
      continue;
    }
    const std::string expect = Cell(row, "expect");
    RecordingSink sink;
    const double got = library::Call(*f, args, sink);
    bool ok = false;
    if (expect == "error") {
      ok = !sink.errors.empty() && std::isnan(got);
    } else if (expect == "warning") {
      ok = sink.errors.empty() && !sink.warnings.empty() && std::isfinite(got);
    } else {
      ADD_FAILURE() << "library_errors.csv: unknown expect '" << expect << "'";
    }
    if (!ok) {
      ++tally.failed;
      ADD_FAILURE() << f->name << "(" << Cell(row, "args") << "): expected " << expect
                    << ", got value " << got << "\n  errors: " << Join(sink.errors)
                    << "\n  warnings: " << Join(sink.warnings) << "\n  why: " << Cell(row, "why");
    }
  }
  return tally;
}

RowTally RunSpreadsheetRows(std::string_view family) {
  RowTally tally;
  for (const CsvRow& row : LoadReference("library_checks.csv")) {
    const FunctionInfo* f = Select(row, family, &tally);
    if (f == nullptr || f->spreadsheet == nullptr) continue;
    ++tally.run;
    tally.functions_run.insert(f->name);
    const std::vector<double> args = SplitArgs(Cell(row, "args"));
    if (!ArgsFit(*f, args, row)) {
      ++tally.failed;
      continue;
    }
    RecordingSink sink;
    const double library_value = library::Call(*f, args, sink);
    double sheet = 0;
    std::string error;
    const bool parsed = SpreadsheetEval::Evaluate(f->spreadsheet, args, &sheet, &error);
    const double expected = std::stod(Cell(row, "expected"));
    // A spreadsheet formula is the plain closed form, without the library's
    // care for cancellation (e.g. the log mean of nearly equal ends), so it
    // is held to the row's tolerance, not to the last digits.
    const double rel_tol = std::max(std::stod(Cell(row, "rel_tol")), 1e-9);
    if (!parsed || !Within(sheet, library_value, rel_tol) || !Within(sheet, expected, rel_tol)) {
      ++tally.failed;
      char values[160];
      std::snprintf(values, sizeof values, "spreadsheet %.17g, library %.17g, expected %.17g",
                    sheet, library_value, expected);
      ADD_FAILURE() << f->name << "(" << Cell(row, "args") << "): " << f->spreadsheet << "\n  "
                    << (parsed ? values : error) << "\n  source: " << Cell(row, "source");
    }
  }
  return tally;
}

namespace {

void ReportSkipped(const char* file, const RowTally& tally) {
  if (tally.skipped == 0) return;
  std::printf("[  SKIPPED ] %s: %d rows of functions not registered yet: %s\n", file, tally.skipped,
              JoinSet(tally.unregistered).c_str());
}

TEST(ReferenceRows, LibraryChecksCsv) {
  const RowTally tally = RunCheckRows("");
  ReportSkipped("library_checks.csv", tally);
  EXPECT_GT(tally.run, 0);
  EXPECT_EQ(tally.failed, 0) << tally.failed << " of " << tally.run
                             << " rows of registered functions failed";
}

TEST(ReferenceRows, LibraryErrorsCsv) {
  const RowTally tally = RunErrorRows("");
  ReportSkipped("library_errors.csv", tally);
  EXPECT_GT(tally.run, 0);
  EXPECT_EQ(tally.failed, 0) << tally.failed << " of " << tally.run
                             << " rows of registered functions failed";
}

TEST(ReferenceRows, SpreadsheetFormulasReproduceChecks) {
  const RowTally tally = RunSpreadsheetRows("");
  EXPECT_GT(tally.run, 0);
  EXPECT_EQ(tally.failed, 0) << tally.failed << " of " << tally.run
                             << " spreadsheet evaluations failed";
}

// The registry contract (registry.h) for every function, whoever wrote it.
TEST(Registry, EveryFunctionIsDocumented) {
  const std::set<std::string> families = {"groups",     "resistance", "fins",  "mtd", "entu",
                                          "convection", "friction",   "water", "air"};
  std::set<std::string> names;
  for (const FunctionInfo& f : library::Functions()) {
    SCOPED_TRACE(f.name);
    ASSERT_NE(f.name, nullptr);
    EXPECT_TRUE(names.insert(f.name).second) << "registered twice";
    ASSERT_NE(f.family, nullptr);
    EXPECT_TRUE(families.count(f.family)) << f.family;
    EXPECT_FALSE(f.args.empty());
    for (const auto& a : f.args) {
      ASSERT_NE(a.name, nullptr);
      EXPECT_GT(std::strlen(a.name), 0u);
      // A temperature kind only on a temperature.
      if (a.kind != units::TempKind::kNone) EXPECT_TRUE(a.dim.IsTemperature()) << a.name;
    }
    for (const char* text : {f.formula, f.source, f.validity, f.example}) {
      ASSERT_NE(text, nullptr);
      EXPECT_GT(std::strlen(text), 0u);
    }
    // The example calls the function it documents.
    EXPECT_NE(std::string(f.example).find(std::string(f.name) + "("), std::string::npos)
        << f.example;
    EXPECT_NE(f.fn, nullptr);
    EXPECT_EQ(FindFunction(f.name), &f);
    if (f.spreadsheet != nullptr) {
      // Every placeholder names an argument and every argument is used.
      const std::string sheet = f.spreadsheet;
      for (size_t i = 0; i < f.args.size(); ++i) {
        EXPECT_NE(sheet.find("{" + std::to_string(i) + "}"), std::string::npos)
            << sheet << " does not use argument " << i;
      }
      std::string error;
      SpreadsheetEval::Substitute(sheet, std::vector<double>(f.args.size(), 1.0), &error);
      EXPECT_TRUE(error.empty()) << sheet << ": " << error;
    }
  }
  EXPECT_EQ(FindFunction("no_such_function"), nullptr);
}

}  // namespace
}  // namespace heatdeck::testing
