#include "library/table.h"

#include <algorithm>
#include <charconv>
#include <cmath>
#include <system_error>

#include <fmt/format.h>

namespace heatdeck::library {
namespace {

// One cell of a CSV line: its text (quotes removed, "" unescaped) and the
// 1-based column where that text starts.
struct Cell {
  std::string text;
  int column = 1;
};

bool IsSpace(char c) { return c == ' ' || c == '\t'; }

std::string_view Trim(std::string_view s) {
  while (!s.empty() && IsSpace(s.front())) s.remove_prefix(1);
  while (!s.empty() && IsSpace(s.back())) s.remove_suffix(1);
  return s;
}

void AddError(std::vector<TableError>* errors, int line, int column, std::string message) {
  errors->push_back({line, column, std::move(message)});
}

// Splits one line into cells.  Unquoted cells are trimmed; a quoted cell may
// hold commas and "" for a quote.  An unterminated quote is reported and
// makes *ok false: the line's cells then mean nothing, and the caller skips it
// rather than report errors that follow from the quote.
std::vector<Cell> SplitLine(std::string_view line, int line_no, std::vector<TableError>* errors,
                            bool* ok) {
  *ok = true;
  std::vector<Cell> cells;
  size_t i = 0;
  const size_t n = line.size();
  while (true) {
    while (i < n && IsSpace(line[i])) ++i;
    Cell cell;
    if (i < n && line[i] == '"') {
      const size_t open = i;
      cell.column = static_cast<int>(open) + 2;
      ++i;
      bool closed = false;
      while (i < n) {
        if (line[i] == '"') {
          if (i + 1 < n && line[i + 1] == '"') {
            cell.text += '"';
            i += 2;
            continue;
          }
          closed = true;
          ++i;
          break;
        }
        cell.text += line[i++];
      }
      if (!closed) {
        AddError(errors, line_no, static_cast<int>(open) + 1, "unterminated quoted cell");
        *ok = false;
        cells.push_back(std::move(cell));
        return cells;
      }
      while (i < n && IsSpace(line[i])) ++i;
      if (i < n && line[i] != ',') {
        AddError(errors, line_no, static_cast<int>(i) + 1,
                 "unexpected text after the closing quote of a cell");
        while (i < n && line[i] != ',') ++i;
      }
    } else {
      const size_t start = i;
      while (i < n && line[i] != ',') ++i;
      const std::string_view raw = Trim(line.substr(start, i - start));
      cell.text = std::string(raw);
      cell.column = static_cast<int>(start) + 1;
    }
    cells.push_back(std::move(cell));
    if (i >= n) break;
    ++i;  // the comma
  }
  return cells;
}

bool IsName(std::string_view s) {
  if (s.empty()) return false;
  const auto alpha = [](char c) {
    return (c >= 'a' && c <= 'z') || (c >= 'A' && c <= 'Z') || c == '_';
  };
  if (!alpha(s[0])) return false;
  return std::all_of(s.begin() + 1, s.end(),
                     [&](char c) { return alpha(c) || (c >= '0' && c <= '9'); });
}

// Parses a header cell "name [unit]" into *col.  False (with errors added)
// when the cell is malformed.
bool ParseHeaderCell(const Cell& cell, int line_no, TableColumn* col,
                     std::vector<TableError>* errors) {
  const std::string_view text = cell.text;
  const size_t open = text.find('[');
  if (open == std::string_view::npos) {
    AddError(errors, line_no, cell.column,
             fmt::format("header cell '{}' has no unit: write 'name [unit]' ('[]' for a plain "
                         "number)",
                         text));
    return false;
  }
  const std::string_view name = Trim(text.substr(0, open));
  const size_t close = text.find(']', open);
  if (close == std::string_view::npos) {
    AddError(errors, line_no, cell.column + static_cast<int>(open),
             fmt::format("header cell '{}': '[' without a closing ']'", text));
    return false;
  }
  size_t after = close + 1;
  while (after < text.size() && IsSpace(text[after])) ++after;
  if (after < text.size()) {
    AddError(errors, line_no, cell.column + static_cast<int>(after),
             fmt::format("header cell '{}': unexpected text after ']'", text));
    return false;
  }
  if (name.empty()) {
    AddError(errors, line_no, cell.column,
             fmt::format("header cell '{}' has no column name before '['", text));
    return false;
  }
  if (!IsName(name)) {
    AddError(errors, line_no, cell.column,
             fmt::format("column name '{}' is not a name (ASCII letters, digits and '_', not "
                         "starting with a digit)",
                         name));
    return false;
  }
  col->name = std::string(name);

  // The unit text and where it starts, for locating a unit error.
  std::string_view unit_text = text.substr(open + 1, close - open - 1);
  size_t lead = 0;
  while (lead < unit_text.size() && IsSpace(unit_text[lead])) ++lead;
  unit_text = Trim(unit_text);
  const int unit_column = cell.column + static_cast<int>(open + 1 + lead);

  // "[]" and "[1]" mark a plain number; decided here so that the table's
  // meaning does not depend on how the unit parser reads a bare "1".
  if (unit_text.empty() || unit_text == "1") {
    col->unit = units::Unit{};
    col->unit.text = "";
    return true;
  }
  units::UnitError unit_error;
  if (!units::ParseUnit(unit_text, &col->unit, &unit_error)) {
    AddError(errors, line_no, unit_column + unit_error.offset,
             fmt::format("column '{}': {}", col->name, unit_error.message));
    return false;
  }
  return true;
}

// Reads a number cell: optional sign, decimal or exponent form, finite.
bool ParseNumber(std::string_view s, double* out) {
  if (!s.empty() && s.front() == '+') s.remove_prefix(1);
  if (s.empty() || s.front() == '+') return false;
  const auto [ptr, ec] = std::from_chars(s.data(), s.data() + s.size(), *out);
  return ec == std::errc() && ptr == s.data() + s.size() && std::isfinite(*out);
}

}  // namespace

int Table::Find(std::string_view name) const {
  for (size_t i = 0; i < columns.size(); ++i) {
    if (columns[i].name == name) return static_cast<int>(i);
  }
  return -1;
}

bool Table::Interpolate(int c, double x, double* out) const {
  if (c < 1 || static_cast<size_t>(c) >= columns.size()) return false;
  const std::vector<double>& xs = columns[0].si;
  const std::vector<double>& ys = columns[static_cast<size_t>(c)].si;
  if (xs.empty() || ys.size() != xs.size()) return false;
  if (!(x >= xs.front() && x <= xs.back())) return false;
  // The first node above x; the one before it is <= x.  x == back() lands on
  // the last node and returns it exactly.
  const auto it = std::upper_bound(xs.begin(), xs.end(), x);
  const size_t i = static_cast<size_t>(it - xs.begin()) - 1;
  if (xs[i] == x) {
    *out = ys[i];
    return true;
  }
  const double t = (x - xs[i]) / (xs[i + 1] - xs[i]);
  *out = ys[i] + t * (ys[i + 1] - ys[i]);
  return true;
}

bool ParseTableCsv(std::string_view text, Table* out, std::vector<TableError>* errors) {
  std::vector<TableError> local_errors;
  if (errors == nullptr) errors = &local_errors;
  const size_t errors_before = errors->size();

  if (text.starts_with("\xEF\xBB\xBF")) text.remove_prefix(3);  // UTF-8 byte-order mark

  Table table;
  std::vector<bool> column_ok;  // header cell parsed
  bool have_header = false;
  bool header_split = false;
  int header_line = 0;
  int data_rows = 0;
  // The previous accepted argument value, for the strictly-increasing check.
  bool have_prev = false;
  double prev_arg = 0;
  std::string prev_arg_text;
  int prev_arg_line = 0;

  int line_no = 0;
  size_t pos = 0;
  while (pos <= text.size()) {
    const size_t end = std::min(text.find('\n', pos), text.size());
    std::string_view line = text.substr(pos, end - pos);
    pos = end + 1;
    ++line_no;
    if (!line.empty() && line.back() == '\r') line.remove_suffix(1);
    const std::string_view trimmed = Trim(line);
    if (end == text.size() && trimmed.empty()) break;  // text ends with a newline or is empty
    if (trimmed.empty() || trimmed.front() == '#') continue;

    bool split_ok = true;
    std::vector<Cell> cells = SplitLine(line, line_no, errors, &split_ok);
    if (!have_header) {
      have_header = true;
      header_line = line_no;
      // A header that cannot be split leaves no columns to check rows against.
      header_split = split_ok;
      if (!split_ok) continue;
      if (cells.size() < 2) {
        AddError(errors, line_no, cells.empty() ? 1 : cells[0].column,
                 "the header needs an argument column and at least one value column");
      }
      for (const Cell& cell : cells) {
        TableColumn col;
        const bool ok = ParseHeaderCell(cell, line_no, &col, errors);
        if (ok) {
          const int previous = table.Find(col.name);
          if (previous >= 0) {
            AddError(errors, line_no, cell.column,
                     fmt::format("duplicate column name '{}'", col.name));
          }
        }
        table.columns.push_back(std::move(col));
        column_ok.push_back(ok);
      }
      continue;
    }

    ++data_rows;
    if (!split_ok || !header_split) continue;
    const size_t ncols = table.columns.size();
    if (cells.size() != ncols) {
      const int column =
          cells.size() > ncols ? cells[ncols].column : static_cast<int>(line.size()) + 1;
      AddError(errors, line_no, column,
               fmt::format("row has {} cell{} but the header has {} columns", cells.size(),
                           cells.size() == 1 ? "" : "s", ncols));
    }
    std::vector<double> values(ncols, 0.0);
    bool row_ok = cells.size() == ncols;
    for (size_t c = 0; c < std::min(cells.size(), ncols); ++c) {
      const Cell& cell = cells[c];
      const std::string& name = table.columns[c].name;
      double v = 0;
      if (Trim(cell.text).empty()) {
        AddError(errors, line_no, cell.column,
                 name.empty() ? std::string("empty cell")
                              : fmt::format("empty cell in column '{}'", name));
        row_ok = false;
        continue;
      }
      if (!ParseNumber(Trim(cell.text), &v)) {
        AddError(errors, line_no, cell.column,
                 name.empty() ? fmt::format("'{}' is not a number", cell.text)
                              : fmt::format("'{}' is not a number (column '{}')", cell.text, name));
        row_ok = false;
        continue;
      }
      values[c] = column_ok[c] ? table.columns[c].unit.ToSi(v) : v;
      if (c == 0) {
        if (have_prev && !(values[0] > prev_arg)) {
          AddError(errors, line_no, cell.column,
                   fmt::format("the argument column '{}' must increase strictly: {} follows {} "
                               "on line {}",
                               name, Trim(cell.text), prev_arg_text, prev_arg_line));
          row_ok = false;
        }
        have_prev = true;
        prev_arg = values[0];
        prev_arg_text = std::string(Trim(cell.text));
        prev_arg_line = line_no;
      }
    }
    if (!row_ok) continue;
    for (size_t c = 0; c < ncols; ++c) table.columns[c].si.push_back(values[c]);
  }

  if (!have_header) {
    AddError(errors, 1, 1, "no header row: the table is empty");
  } else if (data_rows < 2) {
    AddError(errors, header_line, 1,
             fmt::format("the table has {} data row{}; at least 2 are needed", data_rows,
                         data_rows == 1 ? "" : "s"));
  }
  if (errors->size() != errors_before) return false;
  *out = std::move(table);
  return true;
}

}  // namespace heatdeck::library
