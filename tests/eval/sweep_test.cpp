// Sweeps through the public Session: the grid's values against a hand
// derivation, and the same rows, errors and streamed bytes whatever the
// number of worker threads.  tools/tsan.sh runs these under ThreadSanitizer
// to show that the workers share nothing they write.
#include <cmath>
#include <string>
#include <vector>

#include <gtest/gtest.h>

#include "eval/results.h"
#include "heatdeck/session.h"
#include "model/model.h"

namespace heatdeck {
namespace {

// A water heater: Q = m cp (T_out - T_in) over a grid of flows and outlet
// temperatures; dT_ln fails (ln of a negative ratio) where the outlet is
// above the wall temperature, so some points carry an error.
constexpr const char* kDeck = R"(title "Sweep of a water heater"
given m     = 0.1 kg/s
given cp    = 4.18 kJ/(kg*K)
given T_in  = 20 degC
given T_out = 40 degC
given T_w   = 95 degC
Q     = m * cp * (T_out - T_in)                              in kW
dT_ln = ((T_w - T_in) - (T_w - T_out)) / ln((T_w - T_in) / (T_w - T_out))  in K
sweep m     from 0.1 kg/s to 2.0 kg/s step 0.1 kg/s
sweep T_out from 30 degC to 100 degC step 0.5 K
)";

struct Streamed {
  std::string bytes;
  size_t rows = 0;
  size_t q_column = 0;  // where Q is among the kept rows' columns
};

Streamed Stream(int jobs, Results* kept) {
  SessionOptions o;
  o.jobs = jobs;
  Session s;
  EXPECT_TRUE(s.LoadText("heater.deck", kDeck, o));
  s.Evaluate();
  if (kept != nullptr) *kept = s.results();
  Streamed out;
  const std::vector<int>& cols = s.results().sweeps.at(0).columns;
  for (size_t c = 0; c < cols.size(); ++c) {
    if (cols[c] == s.model().Find("Q")) out.q_column = c;
  }
  std::string error;
  const bool ok =
      s.StreamSweep([](const std::vector<Session::SweepColumn>&) {},
                    [](const double* values, const std::string& err, std::string* line) {
                      for (int c = 0; c < 4; ++c) *line += std::to_string(values[c]) + ",";
                      *line += err + "\n";
                    },
                    [&](const std::string& bytes) {
                      out.bytes += bytes;
                      for (char c : bytes) out.rows += c == '\n';
                    },
                    &error);
  EXPECT_TRUE(ok) << error;
  return out;
}

TEST(Sweep, GridValuesMatchTheHandDerivation) {
  Results r;
  const Streamed one = Stream(1, &r);
  ASSERT_EQ(r.sweeps.size(), 1u);
  const SweepResult& sw = r.sweeps[0];
  ASSERT_EQ(sw.points, 20u * 141u);
  ASSERT_EQ(sw.rows.size(), sw.points);
  EXPECT_EQ(one.rows, sw.points);
  // Columns: m, T_out, then the other quantities in deck order.
  size_t bad = 0;
  for (size_t p = 0; p < sw.points; ++p) {
    // First sweep line varies slowest: p = i_m * 141 + i_T.
    const double m = 0.1 * static_cast<double>(p / 141 + 1);
    const double t_out = 30.0 + 0.5 * static_cast<double>(p % 141);
    const std::vector<double>& row = sw.rows[p];
    EXPECT_NEAR(row[0], m, 1e-12);
    EXPECT_NEAR(row[1], t_out + 273.15, 1e-9);
    // Q in W (SI): hand derivation m cp dT.
    EXPECT_NEAR(row[one.q_column], m * 4180.0 * (t_out - 20.0), 1e-9 * m * 4180.0 * 80.0) << p;
    if (t_out > 95.0) {
      EXPECT_FALSE(sw.row_errors[p].empty()) << "T_out " << t_out;
      ++bad;
    } else {
      EXPECT_TRUE(sw.row_errors[p].empty()) << sw.row_errors[p];
    }
  }
  // 95.5 .. 100 degC in 0.5 steps: 10 outlet values per flow fail.  (At
  // 95 degC itself ln(75/0) is infinite and dT_ln = 75/inf = 0 K: finite.)
  EXPECT_EQ(bad, 20u * 10u);
}

TEST(Sweep, SameRowsErrorsAndBytesWhateverTheThreadCount) {
  Results r1, r4;
  const Streamed one = Stream(1, &r1);
  const Streamed two = Stream(2, nullptr);
  const Streamed four = Stream(4, &r4);
  EXPECT_EQ(one.bytes, two.bytes);
  EXPECT_EQ(one.bytes, four.bytes);
  ASSERT_EQ(r1.sweeps.size(), 1u);
  ASSERT_EQ(r4.sweeps.size(), 1u);
  EXPECT_EQ(r1.sweeps[0].row_errors, r4.sweeps[0].row_errors);
  ASSERT_EQ(r1.sweeps[0].rows.size(), r4.sweeps[0].rows.size());
  for (size_t p = 0; p < r1.sweeps[0].rows.size(); ++p) {
    const auto& a = r1.sweeps[0].rows[p];
    const auto& b = r4.sweeps[0].rows[p];
    ASSERT_EQ(a.size(), b.size());
    for (size_t c = 0; c < a.size(); ++c) {
      // Bit for bit (NaN where a point failed).
      EXPECT_TRUE(a[c] == b[c] || (std::isnan(a[c]) && std::isnan(b[c]))) << p << "," << c;
    }
  }
}

}  // namespace
}  // namespace heatdeck
