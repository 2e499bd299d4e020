// Tests of the effectiveness–NTU family (src/library/entu.h).
#include "library/entu.h"

#include <gtest/gtest.h>

#include <cmath>
#include <numbers>
#include <string>
#include <vector>

#include "library/reference_rows.h"
#include "library/registry.h"
#include "library/roots.h"
#include "library/spreadsheet_eval.h"

namespace heatdeck::library {
namespace {

using testing::RunCheckRows;
using testing::RunErrorRows;
using testing::RunSpreadsheetRows;

constexpr double kLn2 = std::numbers::ln2;

const FunctionInfo& Fn(const char* name) {
  const FunctionInfo* f = FindFunction(name);
  EXPECT_NE(f, nullptr) << name << " is not registered";
  static const FunctionInfo kNone{};
  return f == nullptr ? kNone : *f;
}

// Calls a registered function; fails the test on an unexpected error.
double Eval(const char* name, std::vector<double> args) {
  RecordingSink sink;
  const FunctionInfo& f = Fn(name);
  if (f.fn == nullptr) return std::nan("");
  const double v = Call(f, args, sink);
  EXPECT_TRUE(sink.errors.empty()) << name << ": " << (sink.errors.empty() ? "" : sink.errors[0]);
  return v;
}

// Calls a registered function that must fail; returns its error message.
std::string ErrorOf(const char* name, std::vector<double> args) {
  RecordingSink sink;
  const FunctionInfo& f = Fn(name);
  if (f.fn == nullptr) return {};
  const double v = Call(f, args, sink);
  EXPECT_TRUE(std::isnan(v)) << name << " returned " << v;
  EXPECT_EQ(sink.errors.size(), 1u) << name;
  return sink.errors.empty() ? std::string() : sink.errors[0];
}

const char* const kEffFunctions[] = {
    "eff_parallel",         "eff_counter",          "eff_cross_unmixed", "eff_cross_unmixed_approx",
    "eff_cross_cmax_mixed", "eff_cross_cmin_mixed", "eff_cross_mixed",
};

// ---------------------------------------------------------------------------
// Shared reference CSVs (../shared/reference), rows of this family.

TEST(EntuReference, CheckRowsPass) {
  const testing::RowTally tally = RunCheckRows("entu");
  EXPECT_GT(tally.run, 50);
  EXPECT_EQ(tally.failed, 0);
}

TEST(EntuReference, ErrorRowsPass) {
  const testing::RowTally tally = RunErrorRows("entu");
  EXPECT_GT(tally.run, 10);
  EXPECT_EQ(tally.failed, 0);
}

TEST(EntuReference, SpreadsheetFormulasReproduceCheckRows) {
  const testing::RowTally tally = RunSpreadsheetRows("entu");
  EXPECT_GT(tally.run, 40);
  EXPECT_EQ(tally.failed, 0);
}

// ---------------------------------------------------------------------------
// Hand-derived values.

TEST(EntuHand, Counter) {
  // Cr = 1: NTU/(1 + NTU) = 1/2 at NTU = 1.
  EXPECT_DOUBLE_EQ(Eval("eff_counter", {1.0, 1.0}), 0.5);
  // NTU = 2 ln 2, Cr = 1/2: e^(-NTU(1-Cr)) = e^(-ln 2) = 1/2, so
  // eff = (1 - 1/2)/(1 - 1/4) = 2/3.
  EXPECT_NEAR(Eval("eff_counter", {2 * kLn2, 0.5}), 2.0 / 3.0, 1e-15);
  // Inverse of the same point: ln((1 - 1/3)/(1 - 2/3))/(1/2) = 2 ln 2.
  EXPECT_NEAR(Eval("ntu_counter", {2.0 / 3.0, 0.5}), 2 * kLn2, 1e-14);
  // Cr = 1: eff/(1 - eff) = 3 at eff = 3/4.
  EXPECT_NEAR(Eval("ntu_counter", {0.75, 1.0}), 3.0, 1e-14);
}

TEST(EntuHand, Parallel) {
  // Cr = 1, NTU = ln(2)/2: (1 - e^(-ln 2))/2 = 1/4.
  EXPECT_NEAR(Eval("eff_parallel", {kLn2 / 2, 1.0}), 0.25, 1e-16);
  EXPECT_NEAR(Eval("ntu_parallel", {0.25, 1.0}), kLn2 / 2, 1e-15);
}

TEST(EntuHand, Shell) {
  // Cr = 3/4: S = sqrt(1 + 9/16) = 5/4.  Choose N with tanh(N S/2) = 1/2,
  // i.e. N = 2 artanh(1/2)/S = ln(3)/1.25.  Then
  // eff1 = 2t/((1+Cr)t + S) = 1/(0.875 + 1.25) = 8/17.
  const double n1 = std::log(3.0) / 1.25;
  EXPECT_NEAR(Eval("eff_shell", {n1, 0.75, 1}), 8.0 / 17.0, 1e-15);
  // Two such shells: X = (1 - 6/17)/(1 - 8/17) = 11/9, X^2 = 121/81,
  // eff = (121/81 - 1)/(121/81 - 3/4) = 160/241.
  EXPECT_NEAR(Eval("eff_shell", {2 * n1, 0.75, 2}), 160.0 / 241.0, 1e-15);
  EXPECT_NEAR(Eval("ntu_shell", {160.0 / 241.0, 0.75, 2}), 2 * n1, 1e-13);
  // Cr = 1: S = sqrt(2); tanh(h) = 1/sqrt(2) gives eff1 = 1/2, at
  // h = artanh(1/sqrt(2)) = ln(1 + sqrt(2)), N = 2h/S = sqrt(2) ln(1 + sqrt(2)).
  // Three shells: 3 eff1/(1 + 2 eff1) = 3/4.
  const double n_eq = std::numbers::sqrt2 * std::log(1 + std::numbers::sqrt2);
  EXPECT_NEAR(Eval("eff_shell", {3 * n_eq, 1.0, 3}), 0.75, 1e-15);
  EXPECT_NEAR(Eval("ntu_shell", {0.75, 1.0, 3}), 3 * n_eq, 1e-13);
  // One shell at Cr = 1 approaches 2/(2 + sqrt(2)) as NTU -> infinity.
  EXPECT_NEAR(Eval("eff_shell", {60.0, 1.0, 1}), 2 / (2 + std::numbers::sqrt2), 1e-15);
}

TEST(EntuHand, CrossflowWithMixedStreams) {
  // C_min mixed, Cr = 1, NTU = ln 2: 1 - exp(-(1 - 1/2)) = 1 - e^(-1/2).
  EXPECT_NEAR(Eval("eff_cross_cmin_mixed", {kLn2, 1.0}), 1 - std::exp(-0.5), 1e-16);
  // C_max mixed, Cr = 1/2, NTU = ln 2: 2(1 - exp(-(1/2)(1/2))) = 2(1 - e^(-1/4)).
  EXPECT_NEAR(Eval("eff_cross_cmax_mixed", {kLn2, 0.5}), 2 * (1 - std::exp(-0.25)), 1e-16);
  // Both mixed, Cr = 1, NTU = ln 2: [1/(1/2) + 1/(1/2) - 1/ln 2]^-1 = 1/(4 - 1/ln 2).
  EXPECT_NEAR(Eval("eff_cross_mixed", {kLn2, 1.0}), 1 / (4 - 1 / kLn2), 1e-15);
  // Inverses of the two one-mixed points.
  EXPECT_NEAR(Eval("ntu_cross_cmin_mixed", {1 - std::exp(-0.5), 1.0}), kLn2, 1e-14);
  EXPECT_NEAR(Eval("ntu_cross_cmax_mixed", {2 * (1 - std::exp(-0.25)), 0.5}), kLn2, 1e-14);
}

TEST(EntuHand, UnmixedApproxAtNtuOne) {
  // At NTU = 1 both powers of NTU are 1: 1 - exp((e^(-Cr) - 1)/Cr).
  EXPECT_NEAR(Eval("eff_cross_unmixed_approx", {1.0, 1.0}), 1 - std::exp(std::exp(-1.0) - 1),
              1e-16);
  EXPECT_NEAR(Eval("eff_cross_unmixed_approx", {1.0, 0.5}),
              1 - std::exp((std::exp(-0.5) - 1) / 0.5), 1e-16);
}

TEST(EntuHand, UnmixedSeriesAtSmallNtu) {
  // Expanding Mason's series to third order (P(N>0) = a - a^2/2 + a^3/6,
  // P(N>1) = a^2/2 - a^3/3, a = NTU, b = Cr NTU, eff = S/b):
  //   eff = NTU - (1+Cr) NTU^2/2 + (1 + 3Cr + Cr^2) NTU^3/6 + O(NTU^4).
  // At NTU = 1e-5 the O(NTU^4) remainder is below 1e-20, i.e. 1e-15 relative.
  for (double cr : {0.25, 0.5, 1.0}) {
    const double ntu = 1e-5;
    const double expected =
        ntu - (1 + cr) * ntu * ntu / 2 + (1 + 3 * cr + cr * cr) * ntu * ntu * ntu / 6;
    EXPECT_NEAR(Eval("eff_cross_unmixed", {ntu, cr}), expected, 3e-15 * ntu) << cr;
  }
}

// ---------------------------------------------------------------------------
// The exact unmixed series.

// Values of Mason's series evaluated independently with mpmath 1.2.1 at 60
// digits (each bracket as the regularized lower incomplete gamma function,
// mpmath.gammainc(n+1, 0, x, regularized=True), summed to 1e-40).
TEST(EntuUnmixed, MatchesMpmathSeries) {
  struct Case {
    double ntu, cr, eff;
  };
  const Case cases[] = {
      {0.25, 1.0, 0.19854392636597823475}, {2.0, 0.5, 0.73240925248214757054},
      {10.0, 0.8, 0.89197175839403045102}, {50.0, 1.0, 0.92031146767577306468},
      {50.0, 0.3, 0.99999969563628027454},
  };
  for (const Case& c : cases) {
    EXPECT_NEAR(entu::CrossUnmixed(c.ntu, c.cr), c.eff, 2e-15 * c.eff) << c.ntu << " " << c.cr;
  }
  // The NTU at which eff = 0.8 for Cr = 0.6 (mpmath.findroot on the same
  // series): 3.1407370166351041918.
  EXPECT_NEAR(Eval("ntu_cross_unmixed", {0.8, 0.6}), 3.1407370166351041918, 1e-11);
}

// 10-point Gauss–Legendre nodes and weights on [-1, 1], by Newton's method
// on the Legendre polynomial (long double).
struct GaussLegendre10 {
  long double x[10], w[10];
  GaussLegendre10() {
    constexpr int n = 10;
    for (int i = 0; i < n; ++i) {
      long double z = std::cos(std::numbers::pi_v<long double> * (i + 0.75L) / (n + 0.5L));
      long double dp = 0;
      for (int it = 0; it < 100; ++it) {
        long double p0 = 1, p1 = z;
        for (int k = 2; k <= n; ++k) {
          const long double p2 = ((2 * k - 1) * z * p1 - (k - 1) * p0) / k;
          p0 = p1;
          p1 = p2;
        }
        dp = n * (z * p1 - p0) / (z * z - 1);
        const long double dz = p1 / dp;
        z -= dz;
        if (std::fabs(dz) < 1e-19L) break;
      }
      x[i] = z;
      w[i] = 2 / ((1 - z * z) * dp * dp);
    }
  }
};

// e^(-s-t) I0(2 sqrt(st)), with I0(2 sqrt(z)) = sum z^k/(k!)^2 summed in long
// double (all terms positive).
long double Kernel(long double s, long double t) {
  const long double z = s * t;
  long double term = 1, sum = 1;
  for (int k = 1; k < 2000 && term > 1e-22L * sum; ++k) {
    term *= z / (static_cast<long double>(k) * k);
    sum += term;
  }
  return std::exp(-s - t) * sum;
}

// Independent route to the unmixed effectiveness: the Poisson tail is a
// gamma integral, P(N > n) = int_0^a s^n e^-s/n! ds, so Mason's sum becomes
//   S = sum_n int_0^a int_0^b e^(-s-t) (st)^n/(n!)^2 dt ds
//     = int_0^a int_0^b e^(-s-t) I0(2 sqrt(st)) dt ds,   eff = S/b,
// integrated here by composite Gauss–Legendre on unit-width panels.
double EffUnmixedByQuadrature(double ntu, double cr) {
  static const GaussLegendre10 gl;
  const long double a = ntu, b = cr * ntu;
  const int na = static_cast<int>(std::ceil(a)), nb = static_cast<int>(std::ceil(b));
  long double total = 0;
  for (int i = 0; i < na; ++i) {
    const long double s0 = a * i / na, hs = a / na / 2;
    for (int j = 0; j < nb; ++j) {
      const long double t0 = b * j / nb, ht = b / nb / 2;
      long double panel = 0;
      for (int p = 0; p < 10; ++p) {
        for (int q = 0; q < 10; ++q) {
          panel += gl.w[p] * gl.w[q] * Kernel(s0 + hs * (1 + gl.x[p]), t0 + ht * (1 + gl.x[q]));
        }
      }
      total += panel * hs * ht;
    }
  }
  return static_cast<double>(total / b);
}

TEST(EntuUnmixed, MatchesDoubleIntegralUpToNtu50) {
  const double cases[][2] = {{0.5, 0.3}, {2, 1}, {5, 0.25}, {10, 0.8}, {50, 1}, {50, 0.3}};
  for (const auto& c : cases) {
    const double quad = EffUnmixedByQuadrature(c[0], c[1]);
    EXPECT_NEAR(entu::CrossUnmixed(c[0], c[1]), quad, 1e-13 * quad) << c[0] << " " << c[1];
  }
}

TEST(EntuUnmixed, ApproximationIsCloseButNotExact) {
  // The bound stated in entu.h, over NTU in (0, 10] and Cr in [0, 1].
  double worst_rel = 0, worst_abs = 0;
  for (int i = 1; i <= 200; ++i) {
    for (int j = 0; j <= 20; ++j) {
      const double ntu = i * 0.05, cr = j * 0.05;
      const double exact = entu::CrossUnmixed(ntu, cr), approx = entu::CrossUnmixedApprox(ntu, cr);
      worst_rel = std::fmax(worst_rel, std::fabs(approx - exact) / exact);
      worst_abs = std::fmax(worst_abs, std::fabs(approx - exact));
    }
  }
  EXPECT_LT(worst_rel, 0.04);
  EXPECT_LT(worst_abs, 0.02);
  EXPECT_GT(worst_abs, 0.01);  // a different formula, not the series
}

TEST(EntuUnmixed, LargeNtuAndTinyCr) {
  // Far beyond any exchanger, the series stays finite and below 1, and at
  // Cr = 1 still short of it: 1 - eff ~ 1/sqrt(pi NTU) for large NTU.
  const double e = entu::CrossUnmixed(1e4, 1.0);
  EXPECT_LT(e, 1.0);
  EXPECT_NEAR(1 - e, 1 / std::sqrt(std::numbers::pi * 1e4), 2e-4);
  // Below Cr NTU = 1e-10 the kernel uses the first-order expansion
  // eff = P(N > 0) - (Cr NTU/2) P(N = 1) (remainder O((Cr NTU)^2)); just
  // above, the summed series must agree with the same expansion.
  const double ntu = 3.0;
  for (double b : {0.99e-10, 1.01e-10, 1e-9}) {
    const double expansion = -std::expm1(-ntu) - 0.5 * b * ntu * std::exp(-ntu);
    EXPECT_NEAR(entu::CrossUnmixed(ntu, b / ntu), expansion, 2e-16) << b;
  }
}

// ---------------------------------------------------------------------------
// Limits: Cr = 0 exactly, Cr -> 0, Cr -> 1.

TEST(EntuLimits, EveryEffIsExactAtCrZero) {
  for (double ntu : {0.0, 1e-9, 0.3, 1.0, 7.0, 40.0}) {
    const double expected = -std::expm1(-ntu);
    for (const char* name : kEffFunctions) {
      EXPECT_EQ(Eval(name, {ntu, 0.0}), expected) << name << " NTU = " << ntu;
    }
    for (double n : {1.0, 2.0, 5.0}) {
      EXPECT_EQ(Eval("eff_shell", {ntu, 0.0, n}), expected) << "eff_shell n = " << n;
    }
  }
}

TEST(EntuLimits, ContinuousAsCrTendsToZero) {
  // dEff/dCr is bounded, so Cr = 1e-12 moves eff by O(1e-12); Cr = 1e-300
  // would give 0/0 or overflow in the 1/Cr forms.
  for (double ntu : {0.1, 1.0, 5.0}) {
    const double limit = -std::expm1(-ntu);
    for (const char* name : kEffFunctions) {
      EXPECT_NEAR(Eval(name, {ntu, 1e-12}), limit, 1e-11) << name;
      EXPECT_NEAR(Eval(name, {ntu, 1e-300}), limit, 1e-15) << name;
    }
    EXPECT_NEAR(Eval("eff_shell", {ntu, 1e-12, 2}), limit, 1e-11);
    EXPECT_NEAR(Eval("eff_shell", {ntu, 1e-300, 2}), limit, 1e-15);
  }
}

TEST(EntuLimits, CounterContinuousThroughCrOne) {
  for (double ntu : {1e-6, 0.5, 2.0, 20.0}) {
    const double limit = ntu / (1 + ntu);
    EXPECT_NEAR(Eval("eff_counter", {ntu, 1.0}), limit, 1e-16 * limit);
    // |d eff/d Cr| <= NTU^2/2 near Cr = 1.
    EXPECT_NEAR(Eval("eff_counter", {ntu, 1 - 1e-9}), limit, 1e-9 * (1 + ntu * ntu));
    // Where the textbook quotient is 0/0 to within rounding.
    EXPECT_NEAR(Eval("eff_counter", {ntu, 1 - 1e-15}), limit, 1e-14 * (1 + ntu * ntu));
    // The inverse likewise.
    EXPECT_NEAR(Eval("ntu_counter", {limit, 1 - 1e-15}), ntu, 1e-12 * (1 + ntu * ntu));
    // A rounding above 1 (a balanced exchanger's C_min/C_max) reads as 1.
    EXPECT_EQ(Eval("eff_counter", {ntu, 1 + 1e-15}), Eval("eff_counter", {ntu, 1.0}));
  }
  // Beyond rounding it is an error that shows the value.
  EXPECT_NE(ErrorOf("eff_counter", {1.0, 1 + 1e-9}).find("Cr = 1.000000001"), std::string::npos);
}

TEST(EntuLimits, ShellContinuousThroughCrOne) {
  for (double n : {1.0, 2.0, 3.0}) {
    for (double ntu : {0.2, 1.5, 6.0}) {
      const double at_one = Eval("eff_shell", {ntu, 1.0, n});
      EXPECT_NEAR(Eval("eff_shell", {ntu, 1 - 1e-9, n}), at_one, 1e-8) << n << " " << ntu;
      EXPECT_NEAR(Eval("eff_shell", {ntu, 1 - 1e-15, n}), at_one, 1e-14) << n << " " << ntu;
      EXPECT_NEAR(Eval("ntu_shell", {at_one, 1 - 1e-15, n}), ntu, 1e-12 * ntu);
    }
  }
}

// ---------------------------------------------------------------------------
// Round trips: eff(NTU(eff)) = eff and NTU(eff(NTU)) = NTU.

struct Pair {
  const char* eff;
  const char* ntu;
  bool shells;
  double (*max)(double cr, double n);
};

const Pair kPairs[] = {
    {"eff_counter", "ntu_counter", false, [](double cr, double) { return entu::MaxCounter(cr); }},
    {"eff_parallel", "ntu_parallel", false,
     [](double cr, double) { return entu::MaxParallel(cr); }},
    {"eff_shell", "ntu_shell", true, [](double cr, double n) { return entu::MaxShell(cr, n); }},
    {"eff_cross_cmax_mixed", "ntu_cross_cmax_mixed", false,
     [](double cr, double) { return entu::MaxCrossCmaxMixed(cr); }},
    {"eff_cross_cmin_mixed", "ntu_cross_cmin_mixed", false,
     [](double cr, double) { return entu::MaxCrossCminMixed(cr); }},
    {"eff_cross_unmixed", "ntu_cross_unmixed", false,
     [](double cr, double) { return entu::MaxCrossUnmixed(cr); }},
};

std::vector<double> Args(const Pair& p, double x, double cr, double n) {
  if (p.shells) return {x, cr, n};
  return {x, cr};
}

TEST(EntuRoundTrip, EffOfNtuOfEff) {
  for (const Pair& p : kPairs) {
    for (double n : {1.0, 2.0, 4.0}) {
      if (!p.shells && n != 1) continue;
      for (double cr : {0.0, 0.2, 0.5, 0.8, 1.0}) {
        const double max = p.max(cr, n);
        // The unmixed inverse at Cr = 1 needs NTU ~ 1/(pi (1-eff)^2): keep it
        // within reach of the series.
        const double top = std::string(p.eff) == "eff_cross_unmixed" ? 0.99 : 0.999;
        for (double frac : {1e-6, 0.05, 0.3, 0.6, 0.9, top}) {
          const double eff = frac * max;
          const double ntu = Eval(p.ntu, Args(p, eff, cr, n));
          EXPECT_NEAR(Eval(p.eff, Args(p, ntu, cr, n)), eff, 1e-12 * eff)
              << p.ntu << " eff = " << eff << " Cr = " << cr << " n = " << n;
        }
      }
    }
  }
}

TEST(EntuRoundTrip, NtuOfEffOfNtu) {
  for (const Pair& p : kPairs) {
    for (double n : {1.0, 3.0}) {
      if (!p.shells && n != 1) continue;
      for (double cr : {0.0, 0.3, 0.9, 1.0}) {
        for (double ntu : {1e-7, 0.1, 0.7, 2.0, 4.0}) {
          const double eff = Eval(p.eff, Args(p, ntu, cr, n));
          // Conditioning: d NTU/d eff grows as eff approaches the maximum.
          EXPECT_NEAR(Eval(p.ntu, Args(p, eff, cr, n)), ntu, 1e-10 * ntu * (1 + ntu * ntu))
              << p.eff << " NTU = " << ntu << " Cr = " << cr << " n = " << n;
        }
      }
    }
  }
}

// ---------------------------------------------------------------------------
// Errors name the offending value.

TEST(EntuErrors, ArgumentsOutOfRange) {
  for (const char* name : kEffFunctions) {
    EXPECT_NE(ErrorOf(name, {-1.0, 0.5}).find("NTU = -1"), std::string::npos) << name;
    EXPECT_NE(ErrorOf(name, {1.0, 1.5}).find("Cr = 1.5"), std::string::npos) << name;
    EXPECT_NE(ErrorOf(name, {1.0, -0.1}).find("Cr = -0.1"), std::string::npos) << name;
    EXPECT_FALSE(ErrorOf(name, {std::nan(""), 0.5}).empty()) << name;
  }
  EXPECT_NE(ErrorOf("eff_shell", {1.0, 0.5, 2.5}).find("n = 2.5"), std::string::npos);
  EXPECT_NE(ErrorOf("eff_shell", {1.0, 0.5, 0.0}).find("n = 0"), std::string::npos);
  EXPECT_NE(ErrorOf("ntu_shell", {0.5, 0.5, -1.0}).find("n = -1"), std::string::npos);
  EXPECT_NE(ErrorOf("ntu_counter", {-0.2, 0.5}).find("eff = -0.2"), std::string::npos);
  EXPECT_NE(ErrorOf("ntu_counter", {0.5, 1.2}).find("Cr = 1.2"), std::string::npos);
  EXPECT_NE(ErrorOf("eff_cross_unmixed", {2e6, 0.5}).find("NTU = 2e+06"), std::string::npos);
}

TEST(EntuErrors, UnreachableEffNamesTheMaximum) {
  // Parallel: 1/(1 + 0.5) = 0.666667.
  EXPECT_NE(ErrorOf("ntu_parallel", {0.7, 0.5}).find("0.666667"), std::string::npos);
  EXPECT_NE(ErrorOf("ntu_parallel", {2.0 / 3.0, 0.5}).find("1/(1+Cr)"), std::string::npos);
  // One 1-2 shell at Cr = 1: 2/(2 + sqrt 2) = 0.585786.
  EXPECT_NE(ErrorOf("ntu_shell", {0.6, 1.0, 1}).find("0.585786"), std::string::npos);
  // Two shells at Cr = 1: 2 e1/(1 + e1) with e1 = 0.585786 -> 0.738796.
  EXPECT_NE(ErrorOf("ntu_shell", {0.75, 1.0, 2}).find("0.738796"), std::string::npos);
  // One-mixed crossflow at Cr = 1: 1 - 1/e = 0.632121.
  EXPECT_NE(ErrorOf("ntu_cross_cmin_mixed", {0.7, 1.0}).find("0.632121"), std::string::npos);
  EXPECT_NE(ErrorOf("ntu_cross_cmax_mixed", {0.7, 1.0}).find("0.632121"), std::string::npos);
  EXPECT_NE(ErrorOf("ntu_counter", {1.0, 0.5}).find("maximum effectiveness 1"), std::string::npos);
  EXPECT_NE(ErrorOf("ntu_cross_unmixed", {1.0, 0.5}).find("maximum effectiveness 1"),
            std::string::npos);
  // Reachable in principle, but only at NTU ~ 1/(pi 1e-8) > 1e6.
  EXPECT_NE(ErrorOf("ntu_cross_unmixed", {0.9999, 1.0}).find("needs NTU > 1e+06"),
            std::string::npos);
}

// ---------------------------------------------------------------------------
// Registry entries and spreadsheet forms.

TEST(EntuRegistry, EntriesAreComplete) {
  const char* const names[] = {"eff_parallel",
                               "eff_counter",
                               "eff_shell",
                               "eff_cross_unmixed",
                               "eff_cross_unmixed_approx",
                               "eff_cross_cmax_mixed",
                               "eff_cross_cmin_mixed",
                               "eff_cross_mixed",
                               "ntu_counter",
                               "ntu_parallel",
                               "ntu_shell",
                               "ntu_cross_cmax_mixed",
                               "ntu_cross_cmin_mixed",
                               "ntu_cross_unmixed"};
  for (const char* name : names) {
    const FunctionInfo& f = Fn(name);
    if (f.fn == nullptr) continue;
    EXPECT_STREQ(f.family, "entu");
    EXPECT_TRUE(f.result.dimensionless()) << name;
    EXPECT_EQ(f.result_kind, units::TempKind::kNone) << name;
    const bool shells = std::string(name).ends_with("shell");
    ASSERT_EQ(f.args.size(), shells ? 3u : 2u) << name;
    EXPECT_STREQ(f.args[0].name, std::string(name).starts_with("eff") ? "NTU" : "eff");
    EXPECT_STREQ(f.args[1].name, "Cr");
    if (shells) EXPECT_STREQ(f.args[2].name, "n");
    for (const ArgSpec& a : f.args) {
      EXPECT_TRUE(a.dim.dimensionless()) << name;
      EXPECT_EQ(a.kind, units::TempKind::kNone) << name;
    }
    for (const char* text : {f.formula, f.source, f.validity, f.example}) {
      ASSERT_NE(text, nullptr) << name;
      EXPECT_GT(std::string(text).size(), 5u) << name;
    }
    EXPECT_NE(std::string(f.example).find(name), std::string::npos) << name;
    const bool closed =
        std::string(name) != "eff_cross_unmixed" && std::string(name) != "ntu_cross_unmixed";
    EXPECT_EQ(f.spreadsheet != nullptr, closed) << name;
    if (f.spreadsheet != nullptr) EXPECT_LT(std::string(f.spreadsheet).size(), 8192u) << name;
  }
}

// The spreadsheet forms over a grid wider than the reference rows, against
// the library's own values.
TEST(EntuRegistry, SpreadsheetFormsMatchLibrary) {
  int checked = 0;
  for (const FunctionInfo& f : Functions()) {
    if (std::string(f.family) != "entu" || f.spreadsheet == nullptr) continue;
    const bool inverse = std::string(f.name).starts_with("ntu");
    const bool shells = f.args.size() == 3;
    for (double n : {1.0, 2.0, 3.0}) {
      if (!shells && n != 1) continue;
      for (double cr : {0.0, 1e-6, 0.3, 0.75, 1 - 1e-7, 1.0}) {
        for (double x : {1e-6, 0.01, 0.4, 1.0, 3.0, 10.0}) {
          std::vector<double> args = {x, cr};
          if (inverse) {
            // eff as a fraction of the arrangement's maximum.
            const double frac = x / 10.5;
            const char* eff_name = f.name + 4;  // "counter", "shell", ...
            double max = 1;
            if (std::string(eff_name) == "parallel") max = entu::MaxParallel(cr);
            if (std::string(eff_name) == "shell") max = entu::MaxShell(cr, n);
            if (std::string(eff_name) == "cross_cmax_mixed") max = entu::MaxCrossCmaxMixed(cr);
            if (std::string(eff_name) == "cross_cmin_mixed") max = entu::MaxCrossCminMixed(cr);
            args[0] = frac * max;
          }
          if (shells) args.push_back(n);
          RecordingSink sink;
          const double lib = Call(f, args, sink);
          double sheet = 0;
          std::string error;
          ASSERT_TRUE(testing::SpreadsheetEval::Evaluate(f.spreadsheet, args, &sheet, &error))
              << f.name << ": " << error;
          // The n-shell series rule in the sheet is the textbook form, which
          // loses about eps/(x (1 - Cr)) relative (x = NTU or eff); exactly
          // Cr = 1 takes its own branch.
          double tol = 2e-12;
          if (shells && n > 1 && cr < 1) tol += 1e-15 / (args[0] * (1 - cr));
          EXPECT_NEAR(sheet, lib, tol * std::fabs(lib))
              << f.name << " x = " << args[0] << " Cr = " << cr << " n = " << n;
          ++checked;
        }
      }
    }
  }
  EXPECT_GT(checked, 300);
}

// ---------------------------------------------------------------------------
// The bracketed solver.

TEST(BrentRoot, FindsRootsToTolerance) {
  // cos x = x at x = 0.739085133215160641655 (the Dottie number, from memory;
  // confirmed here by the residual).
  auto f = [](double x) { return std::cos(x) - x; };
  const double r = BrentRoot(f, 0.0, 1.0, f(0.0), f(1.0), 1e-15);
  EXPECT_NEAR(r, 0.739085133215160641655, 1e-15);
  // x^3 = 2 on a wide, lopsided bracket.
  int calls = 0;
  auto g = [&calls](double x) {
    ++calls;
    return x * x * x - 2;
  };
  const double c = BrentRoot(g, 0.0, 100.0, g(0.0), g(100.0), 1e-14);
  EXPECT_NEAR(c, std::cbrt(2.0), 1e-14);
  EXPECT_LT(calls, 60);
  // No sign change: NaN, f never called.
  calls = 0;
  EXPECT_TRUE(std::isnan(BrentRoot(g, 2.0, 3.0, 6.0, 25.0, 1e-12)));
  EXPECT_EQ(calls, 0);
}

}  // namespace
}  // namespace heatdeck::library
