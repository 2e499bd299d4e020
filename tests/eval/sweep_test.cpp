// Sweeps through the public Session: the grid's values against a hand
// derivation, every point against a fresh evaluation of its inputs, and the
// same rows, errors and streamed bytes whatever the number of worker threads.  tools/tsan.sh runs
// these under ThreadSanitizer to show that the workers share nothing they write.
#include <cmath>
#include <string>
#include <vector>

#include <gtest/gtest.h>

#include "eval/evaluator.h"
#include "eval/program.h"
#include "eval/results.h"
#include "eval/sweep.h"
#include "heatdeck/session.h"
#include "model/model.h"
#include "test_paths.h"

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

// Three sweep lines and quantities at every level of the grid: r0 and the
// p_i read only the outer line a, s1 and u1 also b, t2 and w2 all three, k
// none.  Forty p_i put the level-0 quantities in more than one compiled
// chunk.  Points fail at each level: sqrt(a) for a < 0, ln(b) at b = 0,
// sqrt(c) for c < 0.
std::string LevelsDeck() {
  std::string d = "title \"Grid levels\"\ngiven a = 1\ngiven b = 1\ngiven c = 1\nr0 = sqrt(a)\n";
  for (int i = 1; i <= 40; ++i)
    d += "p_" + std::to_string(i) + " = r0 + " + std::to_string(i) + "\n";
  d += "s1 = r0 * b + p_40\nu1 = ln(b)\nt2 = s1 + sqrt(c)\nw2 = p_39 * c + u1\nk = 2 * 3\n";
  d += "sweep a from -1 to 2 step 1\nsweep b from 0 to 3 step 1\nsweep c from -2 to 2 step 1\n";
  return d;
}

bool SameOrBothNaN(double x, double y) { return x == y || (std::isnan(x) && std::isnan(y)); }

// A point re-evaluates only the quantities that read a sweep line that
// changed since the last point (the inner line changes at every point, the
// outer ones rarely).  Whatever it skips, each point's row must be what a
// fresh evaluation of the deck at that point's inputs gives, failing points
// included: NaN for what failed or was not evaluated, never the previous
// point's values.
TEST(Sweep, EachPointEqualsAFreshEvaluationOfItsInputs) {
  for (int jobs : {1, 3}) {
    SessionOptions o;
    o.jobs = jobs;
    Session s;
    ASSERT_TRUE(s.LoadText("levels.deck", LevelsDeck(), o));
    s.Evaluate();
    const Model& m = s.model();
    const Plan plan = MakePlan(m);
    ASSERT_EQ(s.results().sweeps.size(), 1u);
    const SweepResult& sw = s.results().sweeps[0];
    ASSERT_EQ(sw.points, 4u * 4u * 5u);
    ASSERT_EQ(sw.rows.size(), sw.points);
    const int a = m.Find("a"), b = m.Find("b"), c = m.Find("c");
    size_t failed = 0;
    for (size_t p = 0; p < sw.points; ++p) {
      const double va = -1.0 + static_cast<double>(p / 20);
      const double vb = static_cast<double>(p / 5 % 4);
      const double vc = -2.0 + static_cast<double>(p % 5);
      Evaluator fresh(m, plan);
      fresh.LoadInputs({{a, va}, {b, vb}, {c, vc}});
      CaseResult cr;
      fresh.EvaluateCase(&cr);
      bool any_failed = false;
      for (size_t q = 0; q < m.quantities.size(); ++q) any_failed = any_failed || !cr.ok[q];
      // By hand: a = -1 fails everywhere, then b = 0, then c < 0.
      const bool expect_fail = va < 0 || vb == 0 || vc < 0;
      EXPECT_EQ(any_failed, expect_fail) << "point " << p;
      EXPECT_EQ(!sw.row_errors[p].empty(), expect_fail)
          << "point " << p << ": " << sw.row_errors[p];
      failed += expect_fail;
      for (size_t col = 0; col < sw.columns.size(); ++col) {
        const auto q = static_cast<size_t>(sw.columns[col]);
        const double got = sw.rows[p][col];
        if (!cr.ok[q]) {
          EXPECT_TRUE(std::isnan(got))
              << "point " << p << " " << m.quantities[q].name << " = " << got;
        } else if (!sw.row_errors[p].empty()) {
          // After the first failure a point stops: a value is either not
          // evaluated (NaN) or this point's own.
          EXPECT_TRUE(std::isnan(got) || got == cr.values[q])
              << "point " << p << " " << m.quantities[q].name << " = " << got;
        } else {
          EXPECT_TRUE(SameOrBothNaN(got, cr.values[q]))
              << "point " << p << " " << m.quantities[q].name << " = " << got << " vs "
              << cr.values[q];
        }
      }
      if (p == 21) {  // a = 0, b = 0, c = -1: ln(0) is the first failure
        EXPECT_NE(sw.row_errors[p].find("'u1'"), std::string::npos) << sw.row_errors[p];
      }
    }
    // 20 points with a = -1; 3 x 5 with b = 0; 3 x 3 x 2 with c < 0.
    EXPECT_EQ(failed, 20u + 15u + 18u);
  }
}

// A library function that warns at every point of a sweep: the program
// keeps the messages of its last run only, so a million-point sweep holds
// no more of them than one point does.
TEST(Sweep, WarningsDoNotPileUpOverRuns) {
  Session s;
  ASSERT_TRUE(s.LoadText(
      "warn.deck", "given Re = 3000\ngiven Pr = 0.3\nNu = nu_dittus_boelter(Re, Pr, 0.4)\n", {}));
  ASSERT_TRUE(s.Evaluate());
  const Model& m = s.model();
  Program p(m, m.order);
  p.LoadGivens();
  ASSERT_TRUE(p.Run());
  const size_t once = p.recorded().size();
  // Re = 3000 < 10 000 and Pr = 0.3 < 0.6: outside the correlation's range
  // (LIBRARY.md), so one run records at least one warning.
  ASSERT_GE(once, 1u);
  for (int i = 0; i < 1000; ++i) {
    p.values()[static_cast<size_t>(m.Find("Re"))] = 3000.0 + i;
    ASSERT_TRUE(p.Run());
  }
  EXPECT_EQ(p.recorded().size(), once);
}

// A solve that finds no root at a point: the unknown and everything that
// reads it are NaN in that row, not the values of the search's last probe.
// The message of a dimensionless residual has no space before a missing
// unit.
TEST(Sweep, FailedSolveLeavesItsQuantitiesUnevaluated) {
  Session s;
  ASSERT_TRUE(s.LoadText("solve.deck",
                         "given a = 4\ny = x * x\nz = y + 1\n"
                         "solve x from 0 to 10 so that x * x = a\n"
                         "sweep a from -2 to 4 step 2\n",
                         {}));
  s.Evaluate();
  const Model& m = s.model();
  const SweepResult& sw = s.results().sweeps.at(0);
  ASSERT_EQ(sw.points, 4u);
  for (size_t col = 0; col < sw.columns.size(); ++col) {
    const std::string& name = m.quantities[static_cast<size_t>(sw.columns[col])].name;
    if (name == "a") continue;
    EXPECT_TRUE(std::isnan(sw.rows[0][col])) << name << " = " << sw.rows[0][col];
    // a = 4: x = 2 within the solve's 1e-10 relative tolerance; y = x^2, z = y + 1.
    const double want = name == "x" ? 2.0 : name == "y" ? 4.0 : 5.0;
    EXPECT_NEAR(sw.rows[3][col], want, 1e-8) << name;
  }
  EXPECT_EQ(sw.row_errors[0],
            "solve for 'x': no sign change over the bracket; lhs - rhs = 2.00000 at x = 0 and "
            "102.000 at x = 10.0000");
  EXPECT_EQ(sw.row_errors[3], "");
}

// Two example decks (templates, property functions, a root search at every
// point) given more sweep lines, so that their grids have levels: every
// point against a fresh evaluation of the deck at that point's inputs, bit
// for bit where it evaluated.
TEST(Sweep, ExampleGridsEqualFreshEvaluationsPointByPoint) {
  struct Grid {
    const char* deck;
    const char* extra;  // appended: inner sweep lines
    size_t points;
  };
  const Grid grids[] = {
      {"condensate_recovery_length.deck",
       "sweep T_h1 over 70 degC, 90 degC\nsweep Rf_h over 0.00009 m^2*K/W, 0.0005 m^2*K/W\n",
       5u * 2u * 2u},
      {"preheat_coil_sweep.deck", "sweep T_out over -20 degC, -12 degC, 0 degC\n", 12u * 3u},
  };
  for (const Grid& g : grids) {
    const std::string path = heatdeck::testing::RepoDir() + "/examples/" + g.deck;
    const std::string text = heatdeck::testing::ReadFile(path) + g.extra;
    Session s;
    ASSERT_TRUE(s.LoadText(path, text, {})) << g.deck;
    s.Evaluate();
    const Model& m = s.model();
    const Plan plan = MakePlan(m);
    ASSERT_EQ(s.results().sweeps.size(), 1u) << g.deck;
    const SweepResult& sw = s.results().sweeps[0];
    ASSERT_EQ(sw.points, g.points) << g.deck;
    ASSERT_EQ(sw.rows.size(), g.points) << g.deck;
    for (size_t p = 0; p < sw.points; ++p) {
      // The swept inputs lead each row; the first sweep line varies slowest.
      std::vector<std::pair<int, double>> inputs;
      for (size_t k = 0; k < sw.swept.size(); ++k) inputs.emplace_back(sw.swept[k], sw.rows[p][k]);
      Evaluator fresh(m, plan);
      fresh.LoadInputs(inputs);
      CaseResult cr;
      fresh.EvaluateCase(&cr);
      // Every point of these grids evaluates (the root searches bracket).
      EXPECT_EQ(sw.row_errors[p], "") << g.deck << " point " << p;
      for (size_t col = 0; col < sw.columns.size(); ++col) {
        const auto q = static_cast<size_t>(sw.columns[col]);
        const double got = sw.rows[p][col];
        if (!cr.ok[q]) {
          EXPECT_TRUE(std::isnan(got)) << g.deck << " point " << p << " " << m.quantities[q].name;
        } else if (sw.row_errors[p].empty()) {
          EXPECT_TRUE(SameOrBothNaN(got, cr.values[q]))
              << g.deck << " point " << p << " " << m.quantities[q].name << " = " << got << " vs "
              << cr.values[q];
        }
      }
    }
  }
}

// Blocks of one point and more workers than the queue of finished blocks
// holds per worker: blocks finish out of turn all the time, wait in the
// queue or for room in it, and must still reach the sink once each, in grid
// order, with the values of a one-worker run.
TEST(Sweep, BlocksFinishedOutOfTurnReachTheSinkInOrder) {
  Session s;
  ASSERT_TRUE(s.LoadText("heater.deck", kDeck, {}));
  s.Evaluate();
  const Model& m = s.model();
  const Plan plan = MakePlan(m);
  struct Collect : SweepSink {
    std::vector<size_t> order;
    std::vector<double> values;
    std::vector<std::string> errors;
    void Point(size_t index, const double* v, const std::string& error) override {
      order.push_back(index);
      values.insert(values.end(), v, v + 3);
      errors.push_back(error);
    }
  };
  auto run = [&](int jobs, size_t block) {
    SweepOptions o;
    o.jobs = jobs;
    o.block = block;
    o.columns = {m.Find("m"), m.Find("T_out"), m.Find("dT_ln")};
    Collect c;
    RunSweep(m, plan, {}, o, c);
    return c;
  };
  const Collect one = run(1, 512);
  const Collect many = run(4, 1);
  ASSERT_EQ(one.order.size(), 20u * 141u);
  ASSERT_EQ(many.order.size(), one.order.size());
  for (size_t i = 0; i < many.order.size(); ++i) ASSERT_EQ(many.order[i], i);
  EXPECT_EQ(many.errors, one.errors);
  ASSERT_EQ(many.values.size(), one.values.size());
  for (size_t i = 0; i < one.values.size(); ++i) {
    EXPECT_TRUE(SameOrBothNaN(many.values[i], one.values[i])) << i;
  }
}

}  // namespace
}  // namespace heatdeck
