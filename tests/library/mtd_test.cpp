// Tests of the mean-temperature-difference family (src/library/mtd.h).
#include "library/mtd.h"

#include <gtest/gtest.h>

#include <cmath>
#include <numbers>
#include <string>
#include <vector>

#include "library/entu.h"
#include "library/reference_rows.h"
#include "library/registry.h"
#include "library/spreadsheet_eval.h"

namespace heatdeck::library {
namespace {

using testing::RunCheckRows;
using testing::RunErrorRows;
using testing::RunSpreadsheetRows;

const FunctionInfo& Fn(const char* name) {
  const FunctionInfo* f = FindFunction(name);
  EXPECT_NE(f, nullptr) << name << " is not registered";
  static const FunctionInfo kNone{};
  return f == nullptr ? kNone : *f;
}

struct Result {
  double value;
  std::vector<std::string> warnings;
  std::vector<std::string> errors;
};

Result Invoke(const char* name, std::vector<double> args) {
  RecordingSink sink;
  const FunctionInfo& f = Fn(name);
  const double v = f.fn == nullptr ? std::nan("") : Call(f, args, sink);
  return {v, sink.warnings, sink.errors};
}

// A value that must come without error or warning.
double Eval(const char* name, std::vector<double> args) {
  const Result r = Invoke(name, args);
  EXPECT_TRUE(r.errors.empty()) << name << ": " << (r.errors.empty() ? "" : r.errors[0]);
  EXPECT_TRUE(r.warnings.empty()) << name << ": " << (r.warnings.empty() ? "" : r.warnings[0]);
  return r.value;
}

std::string ErrorOf(const char* name, std::vector<double> args) {
  const Result r = Invoke(name, args);
  EXPECT_TRUE(std::isnan(r.value)) << name << " returned " << r.value;
  EXPECT_EQ(r.errors.size(), 1u) << name;
  return r.errors.empty() ? std::string() : r.errors[0];
}

bool Has(const std::string& text, const std::string& part) {
  return text.find(part) != std::string::npos;
}

// Terminal temperatures (K) of a duty with effectiveness eff on the C_min
// stream and capacity ratio cr, inlets 400 K and 300 K; hot_is_cmin says
// which stream has the larger temperature change.
std::vector<double> Duty(double eff, double cr, bool hot_is_cmin) {
  const double big = 100 * eff, small = 100 * eff * cr;
  const double dh = hot_is_cmin ? big : small, dc = hot_is_cmin ? small : big;
  return {400, 400 - dh, 300, 300 + dc};
}

// ---------------------------------------------------------------------------
// Shared reference CSVs (../shared/reference), rows of this family.

TEST(MtdReference, CheckRowsPass) {
  const testing::RowTally tally = RunCheckRows("mtd");
  EXPECT_GT(tally.run, 30);
  EXPECT_EQ(tally.failed, 0);
}

TEST(MtdReference, ErrorRowsPass) {
  const testing::RowTally tally = RunErrorRows("mtd");
  EXPECT_GT(tally.run, 10);
  EXPECT_EQ(tally.failed, 0);
}

TEST(MtdReference, SpreadsheetFormulasReproduceCheckRows) {
  const testing::RowTally tally = RunSpreadsheetRows("mtd");
  EXPECT_GT(tally.run, 20);
  EXPECT_EQ(tally.failed, 0);
}

// ---------------------------------------------------------------------------
// LMTD.

TEST(Lmtd, HandValues) {
  // (2 - 1)/ln 2.
  EXPECT_NEAR(Eval("lmtd", {2.0, 1.0}), 1 / std::numbers::ln2, 1e-15);
  // Ends in the ratio e: (10e - 10)/ln e = 10(e - 1).
  EXPECT_NEAR(Eval("lmtd", {10 * std::numbers::e, 10.0}), 10 * (std::numbers::e - 1), 1e-13);
  // Symmetric in its ends; both negative gives the negative log mean.
  EXPECT_EQ(Eval("lmtd", {7.0, 3.0}), Eval("lmtd", {3.0, 7.0}));
  EXPECT_EQ(Eval("lmtd", {-7.0, -3.0}), -Eval("lmtd", {7.0, 3.0}));
  // Equal ends: exactly that difference.
  EXPECT_EQ(Eval("lmtd", {7.3, 7.3}), 7.3);
  // Counterflow 400 -> 350 K against 300 -> 340 K: ends 60 and 50 K,
  // 10/ln 1.2.  Parallel: ends 100 and 10 K, 90/ln 10.
  EXPECT_NEAR(Eval("lmtd_counter", {400, 350, 300, 340}), 10 / std::log(1.2), 1e-12);
  EXPECT_NEAR(Eval("lmtd_parallel", {400, 350, 300, 340}), 90 / std::log(10.0), 1e-12);
}

TEST(Lmtd, ContinuousAsTheEndsMeet) {
  // h/ln(1 + h) = 1 + h/2 - h^2/12 + h^3/24 - ..., so with ends 1 and 1 + h
  // the log mean is 1 + h/2 - h^2/12 to within h^3/24.  The textbook
  // quotient would lose about eps/h relative (1e-4 at h = 1e-12).
  for (double h : {1e-12, 1e-9, 1e-6, 1e-4}) {
    const double b = 1 + h;
    const double hh = b - 1;  // the h actually represented
    const double expected = 1 + hh / 2 - hh * hh / 12;
    EXPECT_NEAR(Eval("lmtd", {1.0, b}), expected, 4e-16 + hh * hh * hh / 20) << h;
    EXPECT_NEAR(Eval("lmtd", {-b, -1.0}), -expected, 4e-16 + hh * hh * hh / 20) << h;
  }
  // Balanced counterflow at a 1e-9 K imbalance.
  EXPECT_NEAR(Eval("lmtd_counter", {500, 320, 300, 480 - 1e-9}), 20 + 0.5e-9, 1e-12);
}

TEST(Lmtd, ErrorsNameBothEnds) {
  std::string e = ErrorOf("lmtd", {10.0, -5.0});
  EXPECT_TRUE(Has(e, "dT_a = 10 K") && Has(e, "dT_b = -5 K") && Has(e, "differ in sign")) << e;
  e = ErrorOf("lmtd", {0.0, 5.0});
  EXPECT_TRUE(Has(e, "dT_a = 0 K") && Has(e, "dT_b = 5 K") && Has(e, "zero")) << e;
  // Cold outlet 10 K above the hot inlet: ends -10 K and +10 K.
  e = ErrorOf("lmtd_counter", {350, 300, 290, 360});
  EXPECT_TRUE(Has(e, "dT_a = -10 K") && Has(e, "dT_b = 10 K")) << e;
  e = ErrorOf("lmtd_parallel", {400, 330, 300, 340});
  EXPECT_TRUE(Has(e, "dT_a = 100 K") && Has(e, "dT_b = -10 K")) << e;
  e = ErrorOf("lmtd_counter", {400, 350, -5, 340});
  EXPECT_TRUE(Has(e, "T_c_in = -5 K")) << e;
}

// ---------------------------------------------------------------------------
// Shell-and-tube F (Bowman, Mueller & Nagle).

TEST(FcorrShell, HandValues) {
  // P = 1/2, R = 1, one shell: S = sqrt 2, first factor S P/(1-P) = sqrt 2,
  // second log ln[(2 - (2 - sqrt 2)/2)/(2 - (2 + sqrt 2)/2)]
  //   = ln[(1 + sqrt2/2)/(1 - sqrt2/2)] = ln[(sqrt2 + 1)^2] = 2 ln(1 + sqrt 2),
  // so F = sqrt 2/(2 ln(1 + sqrt 2)) = 0.80226.
  const double f_half = std::numbers::sqrt2 / (2 * std::log(1 + std::numbers::sqrt2));
  EXPECT_NEAR(Eval("fcorr_shell", {400, 350, 300, 350, 1}), f_half, 1e-14);
  // Two shells, R = 1, P = 2/3: P1 = P/(2 - P) = 1/2, the same F.
  EXPECT_NEAR(Eval("fcorr_shell", {400, 400 - 200.0 / 3, 300, 300 + 200.0 / 3, 2}), f_half, 1e-13);
  // An isothermal stream (condensing or boiling): F = 1 exactly.
  EXPECT_EQ(Eval("fcorr_shell", {373.15, 373.15, 300, 350, 1}), 1.0);
  EXPECT_EQ(Eval("fcorr_shell", {400, 350, 320, 320, 3}), 1.0);
}

TEST(FcorrShell, SymmetricInTheStreams) {
  // F(P, R) = F(PR, 1/R): (0.3, 2) and (0.6, 0.5) describe one exchanger.
  EXPECT_NEAR(Eval("fcorr_shell", {400, 340, 300, 330, 1}),
              Eval("fcorr_shell", {400, 370, 300, 360, 1}), 1e-15);
  // Labels swapped (the stream called h is the colder one) gives the same F.
  EXPECT_NEAR(Eval("fcorr_shell", {300, 340, 400, 350, 2}),
              Eval("fcorr_shell", {400, 350, 300, 340, 2}), 1e-15);
}

// F from the P-R closed form equals the effectiveness-NTU route:
// F = NTU_counter(eff, Cr)/NTU_shell(eff, Cr, n), each from the entu family.
TEST(FcorrShell, EqualsTheNtuRatio) {
  int checked = 0;
  for (double n : {1.0, 2.0, 3.0}) {
    for (double cr : {0.1, 0.5, 0.9, 1.0}) {
      const double max = entu::MaxShell(cr, n);
      for (double frac : {0.01, 0.3, 0.7, 0.95}) {
        const double eff = frac * max;
        const double ratio = Eval("ntu_counter", {eff, cr}) / Eval("ntu_shell", {eff, cr, n});
        for (bool hot_is_cmin : {true, false}) {
          std::vector<double> t = Duty(eff, cr, hot_is_cmin);
          t.push_back(n);
          const Result r = Invoke("fcorr_shell", t);
          EXPECT_TRUE(r.errors.empty());
          EXPECT_NEAR(r.value, ratio, 1e-12) << "eff " << eff << " Cr " << cr << " n " << n;
          ++checked;
        }
      }
    }
  }
  EXPECT_EQ(checked, 96);
}

TEST(FcorrShell, ContinuousThroughROne) {
  for (double n : {1.0, 2.0, 4.0}) {
    for (double p : {0.1, 0.4, 0.55}) {
      auto f_at = [&](double r) {
        return mtd::FcorrShell(p, r, n);  // the kernel, so that R is exact
      };
      const double at_one = f_at(1.0);
      ASSERT_FALSE(std::isnan(at_one)) << p << " " << n;
      for (double d : {1e-12, 1e-9, 1e-6}) {
        // A smooth function: the symmetric second difference is F'' d^2
        // (|F''| < 10 here, steepest at P = 0.55 near the one-shell limit);
        // a 0/0 form would scatter by eps/d.
        EXPECT_NEAR(f_at(1 + d) + f_at(1 - d), 2 * at_one, 1e-14 + 10 * d * d) << p << " " << n;
        EXPECT_NEAR(f_at(1 + d), at_one, 2 * d) << p << " " << n;
      }
    }
  }
}

TEST(FcorrShell, NoFBeyondTheArrangement) {
  // P = 0.8, R = 1: two shells reach at most 2e1/(1 + e1), e1 = 2/(2 + sqrt2),
  // i.e. 0.738796.
  std::string e = ErrorOf("fcorr_shell", {400, 320, 300, 380, 2});
  EXPECT_TRUE(Has(e, "P = 0.8") && Has(e, "R = 1") && Has(e, "n = 2") && Has(e, "0.738796")) << e;
  // A duty that needs a temperature cross even counterflow cannot reach.
  e = ErrorOf("fcorr_shell", {400, 300, 300, 400, 1});
  EXPECT_TRUE(Has(e, "P = 1") && Has(e, "R = 1")) << e;
  e = ErrorOf("fcorr_shell", {400, 350, 300, 340, 0});
  EXPECT_TRUE(Has(e, "n = 0")) << e;
  e = ErrorOf("fcorr_shell", {400, 350, 300, 340, 1.5});
  EXPECT_TRUE(Has(e, "n = 1.5")) << e;
  e = ErrorOf("fcorr_shell", {350, 340, 350, 345, 1});
  EXPECT_TRUE(Has(e, "T_h_in = T_c_in = 350 K")) << e;
  // The hot stream warming while the cold one warms too.
  e = ErrorOf("fcorr_shell", {400, 410, 300, 340, 1});
  EXPECT_TRUE(Has(e, "T_h_out = 410 K")) << e;
}

TEST(FcorrShell, WarnsBelowPointSevenFive) {
  // P = 0.55, R = 1, one shell: F = 0.6598 (reference row, BMN closed form).
  const Result r = Invoke("fcorr_shell", {400, 345, 300, 355, 1});
  EXPECT_TRUE(r.errors.empty());
  EXPECT_NEAR(r.value, 0.6597936835397978, 1e-12);
  ASSERT_EQ(r.warnings.size(), 1u);
  EXPECT_TRUE(Has(r.warnings[0], "F = 0.6598") && Has(r.warnings[0], "0.75") &&
              Has(r.warnings[0], "rule of thumb") && Has(r.warnings[0], "P = 0.55"))
      << r.warnings[0];
  // Two shells lift the same duty above the threshold: no warning.
  EXPECT_NEAR(Eval("fcorr_shell", {400, 345, 300, 355, 2}), 0.934312228318224, 1e-12);
}

// ---------------------------------------------------------------------------
// Crossflow F from the effectiveness-NTU relations.

TEST(FcorrCross, HandValuesWithOneStreamMixed) {
  // Hot 400 -> 350 K, cold 300 -> 325 K: the hot stream changes more, so it
  // is C_min; eff = 50/100 = 1/2, Cr = 25/50 = 1/2.
  // Counterflow: ln((1 - 1/4)/(1 - 1/2))/(1/2) = 2 ln 1.5.
  // Hot (C_min) mixed: -ln(1 + (1/2) ln(1/2))/(1/2).
  // Cold (C_max) mixed: -ln(1 + ln(3/4)/(1/2)).
  const double ntu_cf = 2 * std::log(1.5);
  const double ntu_cmin = -2 * std::log(1 + 0.5 * std::log(0.5));
  const double ntu_cmax = -std::log(1 + 2 * std::log(0.75));
  EXPECT_NEAR(Eval("fcorr_cross_hot_mixed", {400, 350, 300, 325}), ntu_cf / ntu_cmin, 1e-14);
  EXPECT_NEAR(Eval("fcorr_cross_cold_mixed", {400, 350, 300, 325}), ntu_cf / ntu_cmax, 1e-14);
  // The same eff and Cr with the cold stream as C_min (hot 400 -> 375 K,
  // cold 300 -> 350 K): now the mixed hot stream is C_max and vice versa.
  EXPECT_NEAR(Eval("fcorr_cross_hot_mixed", {400, 375, 300, 350}), ntu_cf / ntu_cmax, 1e-14);
  EXPECT_NEAR(Eval("fcorr_cross_cold_mixed", {400, 375, 300, 350}), ntu_cf / ntu_cmin, 1e-14);
  // Isothermal stream: F = 1 exactly for every arrangement.
  for (const char* name : {"fcorr_cross", "fcorr_cross_hot_mixed", "fcorr_cross_cold_mixed"}) {
    EXPECT_EQ(Eval(name, {373.15, 373.15, 300, 350}), 1.0) << name;
    EXPECT_EQ(Eval(name, {400, 350, 300, 300}), 1.0) << name;
  }
}

TEST(FcorrCross, UnmixedFReproducesTheDuty) {
  // With UA = F times the counterflow UA, the unmixed series must give back
  // the duty's effectiveness.
  for (double eff : {0.2, 0.5, 0.7, 0.85}) {
    for (double cr : {0.25, 0.6, 1.0}) {
      for (bool hot_is_cmin : {true, false}) {
        const Result r = Invoke("fcorr_cross", Duty(eff, cr, hot_is_cmin));
        ASSERT_TRUE(r.errors.empty()) << eff << " " << cr;
        EXPECT_EQ(r.warnings.empty(), r.value >= 0.75);
        const double ntu = entu::NtuCounter(eff, cr) / r.value;
        EXPECT_NEAR(entu::CrossUnmixed(ntu, cr), eff, 1e-12) << eff << " " << cr;
        EXPECT_LE(r.value, 1.0);
      }
    }
  }
}

TEST(FcorrCross, MixedFWithinTheirLimitsOnly) {
  // eff = 0.85, Cr = 100/170: the C_min-mixed maximum 1 - exp(-1.7) = 0.817
  // and the C_max-mixed maximum 1.7(1 - exp(-1/1.7)) = 0.756 are both short.
  std::string e = ErrorOf("fcorr_cross_hot_mixed", {500, 330, 300, 400});
  EXPECT_TRUE(Has(e, "P = 0.5") && Has(e, "R = 1.7") && Has(e, "0.85") && Has(e, "0.817316") &&
              Has(e, "C_min fluid mixed"))
      << e;
  e = ErrorOf("fcorr_cross_cold_mixed", {500, 330, 300, 400});
  EXPECT_TRUE(Has(e, "0.755979") && Has(e, "C_max fluid mixed")) << e;
  // Unmixed reaches it, with F below 0.75: value and warning.
  const Result r = Invoke("fcorr_cross", {500, 330, 300, 400});
  EXPECT_TRUE(r.errors.empty());
  EXPECT_NEAR(r.value, 0.7060022305433475, 1e-9);  // reference row (2-D finite volumes)
  ASSERT_EQ(r.warnings.size(), 1u);
  EXPECT_TRUE(Has(r.warnings[0], "F = 0.706") && Has(r.warnings[0], "0.75")) << r.warnings[0];
}

TEST(FcorrCross, NearlyNoDutyGivesOne) {
  // As eff -> 0 every arrangement needs NTU ~ eff: F -> 1 continuously.
  for (const char* name : {"fcorr_cross", "fcorr_cross_hot_mixed", "fcorr_cross_cold_mixed"}) {
    EXPECT_NEAR(Eval(name, {400, 400 - 1e-7, 300, 300 + 0.5e-7}), 1.0, 1e-9) << name;
  }
  EXPECT_NEAR(Eval("fcorr_shell", {400, 400 - 1e-7, 300, 300 + 0.5e-7, 2}), 1.0, 1e-9);
}

// ---------------------------------------------------------------------------
// Registry entries and spreadsheet forms.

TEST(MtdRegistry, EntriesAreComplete) {
  using units::TempKind;
  struct Want {
    const char* name;
    size_t nargs;
    TempKind arg_kind;
    TempKind result_kind;
    bool sheet;
  };
  const Want wants[] = {
      {"lmtd", 2, TempKind::kInterval, TempKind::kInterval, true},
      {"lmtd_counter", 4, TempKind::kAbsolute, TempKind::kInterval, true},
      {"lmtd_parallel", 4, TempKind::kAbsolute, TempKind::kInterval, true},
      {"fcorr_shell", 5, TempKind::kAbsolute, TempKind::kNone, true},
      {"fcorr_cross", 4, TempKind::kAbsolute, TempKind::kNone, false},
      {"fcorr_cross_hot_mixed", 4, TempKind::kAbsolute, TempKind::kNone, true},
      {"fcorr_cross_cold_mixed", 4, TempKind::kAbsolute, TempKind::kNone, true},
  };
  for (const Want& w : wants) {
    const FunctionInfo& f = Fn(w.name);
    if (f.fn == nullptr) continue;
    EXPECT_STREQ(f.family, "mtd");
    ASSERT_EQ(f.args.size(), w.nargs) << w.name;
    for (size_t i = 0; i < 4 && i < w.nargs; ++i) {
      EXPECT_EQ(f.args[i].dim, units::dim::kTemperature) << w.name << " " << i;
      EXPECT_EQ(f.args[i].kind, w.arg_kind) << w.name << " " << i;
    }
    if (w.nargs == 5) {
      EXPECT_STREQ(f.args[4].name, "n");
      EXPECT_TRUE(f.args[4].dim.dimensionless());
    }
    EXPECT_EQ(f.result_kind, w.result_kind) << w.name;
    EXPECT_EQ(f.result,
              w.result_kind == TempKind::kNone ? units::dim::kOne : units::dim::kTemperature)
        << w.name;
    for (const char* text : {f.formula, f.source, f.validity, f.example}) {
      ASSERT_NE(text, nullptr) << w.name;
      EXPECT_GT(std::string(text).size(), 5u) << w.name;
    }
    EXPECT_TRUE(Has(f.example, std::string(w.name) + "(")) << w.name;
    EXPECT_EQ(f.spreadsheet != nullptr, w.sheet) << w.name;
    if (f.spreadsheet != nullptr) EXPECT_LT(std::string(f.spreadsheet).size(), 8192u) << w.name;
  }
  const FunctionInfo& lmtd = Fn("lmtd");
  if (lmtd.fn != nullptr) {
    EXPECT_STREQ(lmtd.args[0].name, "dT_a");
    EXPECT_STREQ(lmtd.args[1].name, "dT_b");
  }
  const FunctionInfo& shell = Fn("fcorr_shell");
  if (shell.fn != nullptr) {
    const char* names[] = {"T_h_in", "T_h_out", "T_c_in", "T_c_out"};
    for (int i = 0; i < 4; ++i) EXPECT_STREQ(shell.args[i].name, names[i]);
  }
}

double Sheet(const FunctionInfo& f, const std::vector<double>& args) {
  double v = 0;
  std::string error;
  EXPECT_TRUE(testing::SpreadsheetEval::Evaluate(f.spreadsheet, args, &v, &error))
      << f.name << ": " << error;
  return v;
}

TEST(MtdRegistry, SpreadsheetFormsMatchLibrary) {
  const FunctionInfo& lmtd = Fn("lmtd");
  for (double b : {1e-3, 0.5, 0.999, 1 - 1e-9, 1.0, 1 + 1e-12, 1.0001, 3.0, 400.0}) {
    const double lib = Eval("lmtd", {1.0, b});
    EXPECT_NEAR(Sheet(lmtd, {1.0, b}), lib, 1e-12 * lib) << b;
  }
  int checked = 0;
  for (double n : {1.0, 2.0, 3.0}) {
    for (double cr : {0.0, 0.2, 0.7, 1.0}) {
      for (double frac : {1e-4, 0.3, 0.7, 0.95}) {
        for (bool hot_is_cmin : {true, false}) {
          std::vector<double> t = Duty(frac * entu::MaxShell(cr, n), cr, hot_is_cmin);
          const std::vector<double> t4 = t;
          t.push_back(n);
          const Result r = Invoke("fcorr_shell", t);
          // The sheet's textbook P1 and logs lose about eps/P relative at
          // small P (R = 1 exactly takes its own branch).
          EXPECT_NEAR(Sheet(Fn("fcorr_shell"), t), r.value, 1e-12 + 1e-15 / frac)
              << "frac " << frac << " Cr " << cr << " n " << n;
          ++checked;
          if (n != 1) continue;
          for (const char* name : {"fcorr_cross_hot_mixed", "fcorr_cross_cold_mixed"}) {
            const Result m = Invoke(name, t4);
            if (!m.errors.empty()) continue;
            EXPECT_NEAR(Sheet(Fn(name), t4), m.value, 1e-12 + 1e-15 / frac)
                << name << " frac " << frac << " Cr " << cr;
            ++checked;
          }
        }
      }
    }
  }
  EXPECT_GT(checked, 120);
}

}  // namespace
}  // namespace heatdeck::library
