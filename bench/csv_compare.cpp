// Compares two sweep CSVs number by number (tools/bench.sh, target P1).
//
//   csv_compare A.csv B.csv [REL_TOL]
//
// The headers must be equal, the files must have the same number of rows and
// cells, empty cells (the error column, failed points) must be empty in both,
// and every number must agree within REL_TOL relative (default 1e-9; two
// zeros agree).  Prints the rows compared, how many lines are byte-identical
// and the largest relative difference; exits 0 when the files agree, 1 when
// they do not, 2 on a usage or read error.
#include <algorithm>
#include <cmath>
#include <cstdio>
#include <cstdlib>
#include <fstream>
#include <string>
#include <string_view>
#include <vector>

namespace {

std::vector<std::string_view> Cells(std::string_view line) {
  std::vector<std::string_view> cells;
  size_t start = 0;
  for (;;) {
    const size_t comma = line.find(',', start);
    if (comma == std::string_view::npos) {
      cells.push_back(line.substr(start));
      return cells;
    }
    cells.push_back(line.substr(start, comma - start));
    start = comma + 1;
  }
}

bool Number(std::string_view cell, double* v) {
  const std::string s(cell);
  char* end = nullptr;
  *v = std::strtod(s.c_str(), &end);
  return end != s.c_str() && *end == '\0';
}

}  // namespace

int main(int argc, char** argv) {
  if (argc != 3 && argc != 4) {
    std::fprintf(stderr, "usage: csv_compare A.csv B.csv [REL_TOL]\n");
    return 2;
  }
  const double tol = argc == 4 ? std::atof(argv[3]) : 1e-9;
  std::ifstream a(argv[1], std::ios::binary), b(argv[2], std::ios::binary);
  if (!a || !b) {
    std::fprintf(stderr, "csv_compare: cannot read %s\n", !a ? argv[1] : argv[2]);
    return 2;
  }
  std::string la, lb;
  size_t line = 0, identical = 0, rows = 0, bad = 0;
  double worst = 0;
  size_t worst_line = 0;
  for (;;) {
    const bool ha = static_cast<bool>(std::getline(a, la));
    const bool hb = static_cast<bool>(std::getline(b, lb));
    if (!ha && !hb) break;
    ++line;
    if (ha != hb) {
      std::printf("csv_compare: %s ends at line %zu, the other goes on\n", ha ? argv[2] : argv[1],
                  line);
      return 1;
    }
    if (la == lb) ++identical;
    if (line == 1) {
      if (la != lb) {
        std::printf("csv_compare: headers differ:\n  %s\n  %s\n", la.c_str(), lb.c_str());
        return 1;
      }
      continue;
    }
    ++rows;
    const auto ca = Cells(la), cb = Cells(lb);
    if (ca.size() != cb.size()) {
      std::printf("csv_compare: line %zu has %zu and %zu cells\n", line, ca.size(), cb.size());
      return 1;
    }
    for (size_t i = 0; i < ca.size(); ++i) {
      if (ca[i].empty() || cb[i].empty()) {
        if (ca[i] != cb[i] && ++bad <= 5) {
          std::printf("csv_compare: line %zu cell %zu: '%.*s' vs '%.*s'\n", line, i + 1,
                      static_cast<int>(ca[i].size()), ca[i].data(), static_cast<int>(cb[i].size()),
                      cb[i].data());
        }
        continue;
      }
      double x = 0, y = 0;
      if (!Number(ca[i], &x) || !Number(cb[i], &y)) {
        if (ca[i] != cb[i] && ++bad <= 5) {
          std::printf("csv_compare: line %zu cell %zu is not a number in both\n", line, i + 1);
        }
        continue;
      }
      const double scale = std::max(std::fabs(x), std::fabs(y));
      const double rel = scale == 0 ? 0 : std::fabs(x - y) / scale;
      if (!(rel <= tol) && ++bad <= 5) {
        std::printf("csv_compare: line %zu cell %zu: %.17g vs %.17g (relative %.3g)\n", line, i + 1,
                    x, y, rel);
      }
      if (rel > worst || std::isnan(rel)) {
        worst = rel;
        worst_line = line;
      }
    }
  }
  std::printf(
      "csv_compare: %zu rows, %zu of %zu lines byte-identical, largest relative "
      "difference %.3g (line %zu), tolerance %.3g: %s\n",
      rows, identical, line, worst, worst_line, tol, bad == 0 ? "agree" : "DIFFER");
  return bad == 0 ? 0 : 1;
}
