// Family 'entu' of the heat-transfer library (LIBRARY.md).
#include "library/entu.h"

#include <fmt/format.h>

#include <cmath>
#include <limits>
#include <string>
#include <utility>

#include "library/registry.h"
#include "library/roots.h"
#include "library/sheet_text.h"

namespace heatdeck::library {
namespace entu {
namespace {

constexpr double kNaN = std::numeric_limits<double>::quiet_NaN();

// phi(z) = (1 - e^-z)/z with phi(0) = 1.  expm1 keeps full relative
// precision for small z, where 1 - exp(-z) would cancel.
double Phi(double z) { return z == 0 ? 1.0 : -std::expm1(-z) / z; }

// psi(z) = ln(1 + z)/z with psi(0) = 1, by log1p for the same reason.
double Psi(double z) { return z == 0 ? 1.0 : std::log1p(z) / z; }

// Per-shell eff1/(1 - eff1) = 2t/(S - (1-Cr)t), t = tanh(N S/2), with the
// denominator written as a sum of non-negative terms: S - 1 = Cr^2/(S+1) and
// 1 - t = 2e^(-2h)/(1 + e^(-2h)).  The direct form loses all digits of
// 1 - eff1 when Cr is small and N large.
double ShellOddsFromTanh(double t, double one_minus_t, double cr, double s) {
  const double m = cr * cr / (s + 1) + cr * t + one_minus_t;
  return 2 * t / m;
}

// Series rule for n equal shells, from the per-shell odds w = eff1/(1-eff1).
// With delta = X - 1 = (1-Cr) w, eff = D/(D + 1 - Cr) where D = X^n - 1; both
// divided by 1 - Cr gives d/(1 + d), d = w (X^n - 1)/delta, which is smooth
// through Cr = 1 (d = n w there).
double CombineShells(double w, double cr, double n) {
  if (n == 1) return w / (1 + w);
  const double delta = (1 - cr) * w;
  const double ratio = delta == 0 ? n : std::expm1(n * std::log1p(delta)) / delta;
  const double d = ratio * w;
  if (std::isinf(d)) return 1.0;
  return d / (1 + d);
}

// First index past which a Poisson(x) tail is negligible (< 1e-20 of the
// sum it enters): mean + 10 standard deviations + a margin for small means.
int TopIndex(double x) { return static_cast<int>(std::ceil(x + 10 * std::sqrt(x) + 40)); }

}  // namespace

double Parallel(double ntu, double cr) {
  if (cr == 0) return -std::expm1(-ntu);
  return -std::expm1(-ntu * (1 + cr)) / (1 + cr);
}

double Counter(double ntu, double cr) {
  if (cr == 0) return -std::expm1(-ntu);
  const double k = ntu * Phi(ntu * (1 - cr));
  return k / (1 + cr * k);
}

double Shell(double ntu, double cr, double n) {
  if (cr == 0) return -std::expm1(-ntu);
  const double s = std::sqrt(1 + cr * cr);
  const double h = 0.5 * (ntu / n) * s;
  const double e2 = std::exp(-2 * h);
  const double w = ShellOddsFromTanh(std::tanh(h), 2 * e2 / (1 + e2), cr, s);
  return CombineShells(w, cr, n);
}

double CrossUnmixed(double ntu, double cr) {
  const double a = ntu, b = cr * ntu;
  if (b == 0) return -std::expm1(-a);
  // Mason's sum S = sum_n P(N > n) P(M > n), N ~ Poisson(a), M ~ Poisson(b),
  // and eff = S/b.  For b < 1e-10 the first two terms in b suffice:
  // S/b = P(N > 0)(1 - b/2) + P(N > 1) b/2 + O(b^2), relative error < 1e-19.
  if (b < 1e-10) return -std::expm1(-a) - 0.5 * b * a * std::exp(-a);
  // The tails are built from the far end downwards, unnormalised:
  //   tail(n-1) = tail(n) + q(n),  q(n-1) = q(n) * n/x,  q(top) = 1,
  // so every operation adds or multiplies positive numbers and nothing
  // cancels (the upward form 1 - e^-x sum x^m/m! loses all digits in the far
  // tail and underflows e^-x for x > 745).  Dividing by the totals (the tails
  // at n = -1) normalises at the end.  Each stream is rescaled by 2^-400
  // whenever it grows past 2^400 (n/x is at most 4e11 per step for
  // x >= 1e-10), so the products stay below 2^1000.
  const double kBig = std::ldexp(1.0, 400), kShrink = std::ldexp(1.0, -400);
  const double inv_a = 1 / a, inv_b = 1 / b;
  const int top_a = TopIndex(a), top_b = TopIndex(b);
  double qa = 1, ta = 0, qb = 0, tb = 0, sum = 0;
  for (int n = top_a; n >= 0; --n) {
    if (n == top_b) qb = 1;
    sum += ta * tb;
    const double dn = n;
    ta += qa;
    qa *= dn * inv_a;
    tb += qb;
    qb *= dn * inv_b;
    if (ta > kBig || qa > kBig) {
      ta *= kShrink;
      qa *= kShrink;
      sum *= kShrink;
    }
    if (tb > kBig || qb > kBig) {
      tb *= kShrink;
      qb *= kShrink;
      sum *= kShrink;
    }
  }
  // Rounding can put the sum a few ulp above the supremum 1.
  return std::fmin(sum / ta / tb * inv_b, 1.0);
}

double CrossUnmixedApprox(double ntu, double cr) {
  if (cr == 0) return -std::expm1(-ntu);
  // (NTU^0.22/Cr)(e^(-Cr k) - 1) = -NTU^0.22 k phi(Cr k), k = NTU^0.78: no
  // 0/0 as Cr -> 0.
  const double k = std::pow(ntu, 0.78);
  return -std::expm1(-std::pow(ntu, 0.22) * k * Phi(cr * k));
}

double CrossCmaxMixed(double ntu, double cr) {
  const double u = -std::expm1(-ntu);
  // (1/Cr)(1 - e^(-Cr u)) = u phi(Cr u); phi(0) = 1 gives u exactly at Cr = 0.
  return u * Phi(cr * u);
}

double CrossCminMixed(double ntu, double cr) {
  // (1/Cr)(1 - e^(-Cr NTU)) = NTU phi(Cr NTU); exact 1 - e^-NTU at Cr = 0.
  return -std::expm1(-ntu * Phi(cr * ntu));
}

double CrossMixed(double ntu, double cr) {
  if (ntu == 0) return 0;
  const double u = -std::expm1(-ntu);
  if (cr == 0) return u;
  // Cr/(1 - e^(-Cr NTU)) - 1/NTU = (1/phi(Cr NTU) - 1)/NTU >= 0: the two
  // large terms of the textbook form cancel analytically as NTU -> 0.
  return 1 / (1 / u + (1 / Phi(cr * ntu) - 1) / ntu);
}

double MaxParallel(double cr) { return 1 / (1 + cr); }
double MaxCounter(double /*cr*/) { return 1; }
double MaxShell(double cr, double n) {
  if (cr == 0) return 1;
  const double s = std::sqrt(1 + cr * cr);
  return CombineShells(ShellOddsFromTanh(1, 0, cr, s), cr, n);
}
double MaxCrossUnmixed(double /*cr*/) { return 1; }
double MaxCrossCmaxMixed(double cr) { return Phi(cr); }
double MaxCrossCminMixed(double cr) { return cr == 0 ? 1.0 : -std::expm1(-1 / cr); }

double NtuCounter(double eff, double cr) {
  // ln(1 + z)/(1 - Cr) with z = w(1 - Cr), w = eff/(1 - eff): equals
  // w psi(z), which is eff/(1 - eff) at Cr = 1 with no branch.
  const double w = eff / (1 - eff);
  return w * Psi(w * (1 - cr));
}

double NtuParallel(double eff, double cr) { return -std::log1p(-eff * (1 + cr)) / (1 + cr); }

double NtuShell(double eff, double cr, double n) {
  if (cr == 0) return -std::log1p(-eff);
  // Overall odds eff/(1-eff) -> per-shell odds w: X^n = 1 + (1-Cr) w_tot, so
  // w = w_tot (X - 1)/((1-Cr) w_tot), smooth through Cr = 1 (w = w_tot/n).
  const double w_tot = eff / (1 - eff);
  const double delta = (1 - cr) * w_tot;
  double ratio = 1;
  if (n != 1) ratio = delta == 0 ? 1 / n : std::expm1(std::log1p(delta) / n) / delta;
  const double w = ratio * w_tot;
  // tanh(N S/2) = S eff1/(2 - (1+Cr) eff1) = S w/(2 + (1-Cr) w).
  const double s = std::sqrt(1 + cr * cr);
  const double t = s * w / (2 + (1 - cr) * w);
  if (!(t < 1)) return kNaN;
  return n * (2 / s) * std::atanh(t);
}

double NtuCrossCmaxMixed(double eff, double cr) {
  // u = 1 - e^-NTU = -ln(1 - Cr eff)/Cr = eff psi(-Cr eff).
  const double u = eff * Psi(-cr * eff);
  if (!(u < 1)) return kNaN;
  return -std::log1p(-u);
}

double NtuCrossCminMixed(double eff, double cr) {
  // L = -ln(1 - eff) = (1 - e^(-Cr NTU))/Cr, so NTU = L psi(-Cr L).
  const double l = -std::log1p(-eff);
  if (!(cr * l < 1)) return kNaN;
  return l * Psi(-cr * l);
}

double NtuCrossUnmixed(double eff, double cr) {
  if (cr == 0 || eff == 0) return -std::log1p(-eff);
  auto f = [&](double ntu) { return CrossUnmixed(ntu, cr) - eff; };
  // Counterflow needs the least NTU of all arrangements for a given eff, so
  // its NTU brackets the root from below; double upwards for the other end.
  double lo = NtuCounter(eff, cr);
  double f_lo = f(lo);
  if (f_lo >= 0) return lo;
  double hi = 2 * lo;
  double f_hi = f(hi);
  while (f_hi < 0) {
    if (hi >= kMaxSeriesNtu) return kNaN;
    lo = hi;
    f_lo = f_hi;
    hi = std::fmin(2 * hi, kMaxSeriesNtu);
    f_hi = f(hi);
  }
  return BrentRoot(f, lo, hi, f_lo, f_hi, 1e-12);
}

}  // namespace entu

namespace {

namespace dim = units::dim;

constexpr double kNaN = std::numeric_limits<double>::quiet_NaN();

// Error path only (may allocate).
template <typename... Args>
double Fail(Sink& sink, fmt::format_string<Args...> f, Args&&... args) {
  sink.Error(fmt::format(f, std::forward<Args>(args)...));
  return kNaN;
}

// A Cr a few ulp above 1 is the rounding of a balanced exchanger's
// C_min/C_max, not a third regime: read up to 1 + 1e-12 as 1.
double CrArg(double cr) { return cr > 1 && cr <= 1 + 1e-12 ? 1.0 : cr; }

// The conditions are written as !(x >= 0) so that NaN is an error too.
bool NtuCrOk(const char* fn, double ntu, double cr, Sink& sink) {
  if (!(ntu >= 0) || !std::isfinite(ntu)) {
    Fail(sink, "{}: NTU = {:.6g}; NTU = UA/C_min must be a finite number >= 0", fn, ntu);
    return false;
  }
  if (!(cr >= 0 && cr <= 1)) {
    Fail(sink, "{}: Cr = {:.15g} is outside [0, 1]; Cr = C_min/C_max", fn, cr);
    return false;
  }
  return true;
}

bool ShellsOk(const char* fn, double n, Sink& sink) {
  if (n >= 1 && std::isfinite(n) && n == std::floor(n)) return true;
  Fail(sink, "{}: n = {:.6g} is not a whole number of shell passes >= 1", fn, n);
  return false;
}

// What an inverse says when eff is out of reach.
struct Arrangement {
  const char* what;     // "parallel flow"
  const char* max_law;  // "1/(1+Cr)"
};

bool EffOk(const char* fn, double eff, double cr, double max_eff, const Arrangement& arr,
           Sink& sink) {
  if (!(cr >= 0 && cr <= 1)) {
    Fail(sink, "{}: Cr = {:.15g} is outside [0, 1]; Cr = C_min/C_max", fn, cr);
    return false;
  }
  if (!(eff >= 0)) {
    Fail(sink, "{}: eff = {:.6g}; an effectiveness must be >= 0", fn, eff);
    return false;
  }
  if (!(eff < max_eff)) {
    Fail(sink,
         "{}: eff = {:.6g} cannot be reached: {} at Cr = {:.6g} has maximum effectiveness "
         "{} = {:.6g}, approached only as NTU -> infinity",
         fn, eff, arr.what, cr, arr.max_law, max_eff);
    return false;
  }
  return true;
}

constexpr Arrangement kCounterArr{"counterflow", "1"};
constexpr Arrangement kParallelArr{"parallel flow", "1/(1+Cr)"};
constexpr Arrangement kCmaxArr{"crossflow with the C_max fluid mixed", "(1 - exp(-Cr))/Cr"};
constexpr Arrangement kCminArr{"crossflow with the C_min fluid mixed", "1 - exp(-1/Cr)"};
constexpr Arrangement kUnmixedArr{"crossflow with both fluids unmixed", "1"};

double EffParallel(const double* a, Sink& s) {
  const double cr = CrArg(a[1]);
  if (!NtuCrOk("eff_parallel", a[0], cr, s)) return kNaN;
  return entu::Parallel(a[0], cr);
}
double EffCounter(const double* a, Sink& s) {
  const double cr = CrArg(a[1]);
  if (!NtuCrOk("eff_counter", a[0], cr, s)) return kNaN;
  return entu::Counter(a[0], cr);
}
double EffShell(const double* a, Sink& s) {
  const double cr = CrArg(a[1]);
  if (!NtuCrOk("eff_shell", a[0], cr, s) || !ShellsOk("eff_shell", a[2], s)) return kNaN;
  return entu::Shell(a[0], cr, a[2]);
}
double EffCrossUnmixed(const double* a, Sink& s) {
  const double cr = CrArg(a[1]);
  if (!NtuCrOk("eff_cross_unmixed", a[0], cr, s)) return kNaN;
  if (a[0] > entu::kMaxSeriesNtu) {
    return Fail(s,
                "eff_cross_unmixed: NTU = {:.6g} is beyond {:.0e}, the largest NTU the exact "
                "series is summed for (its cost grows with NTU)",
                a[0], entu::kMaxSeriesNtu);
  }
  return entu::CrossUnmixed(a[0], cr);
}
double EffCrossUnmixedApprox(const double* a, Sink& s) {
  const double cr = CrArg(a[1]);
  if (!NtuCrOk("eff_cross_unmixed_approx", a[0], cr, s)) return kNaN;
  return entu::CrossUnmixedApprox(a[0], cr);
}
double EffCrossCmaxMixed(const double* a, Sink& s) {
  const double cr = CrArg(a[1]);
  if (!NtuCrOk("eff_cross_cmax_mixed", a[0], cr, s)) return kNaN;
  return entu::CrossCmaxMixed(a[0], cr);
}
double EffCrossCminMixed(const double* a, Sink& s) {
  const double cr = CrArg(a[1]);
  if (!NtuCrOk("eff_cross_cmin_mixed", a[0], cr, s)) return kNaN;
  return entu::CrossCminMixed(a[0], cr);
}
double EffCrossMixed(const double* a, Sink& s) {
  const double cr = CrArg(a[1]);
  if (!NtuCrOk("eff_cross_mixed", a[0], cr, s)) return kNaN;
  return entu::CrossMixed(a[0], cr);
}

double NtuCounterFn(const double* a, Sink& s) {
  const double cr = CrArg(a[1]);
  if (!EffOk("ntu_counter", a[0], cr, entu::MaxCounter(cr), kCounterArr, s)) return kNaN;
  return entu::NtuCounter(a[0], cr);
}
double NtuParallelFn(const double* a, Sink& s) {
  const double cr = CrArg(a[1]);
  if (!EffOk("ntu_parallel", a[0], cr, entu::MaxParallel(cr), kParallelArr, s)) return kNaN;
  return entu::NtuParallel(a[0], cr);
}
double NtuShellFn(const double* a, Sink& s) {
  const double cr = CrArg(a[1]);
  if (!ShellsOk("ntu_shell", a[2], s)) return kNaN;
  // The maximum is only meaningful once Cr is known to lie in [0, 1].
  const double max_eff = cr >= 0 && cr <= 1 ? entu::MaxShell(cr, a[2]) : kNaN;
  const Arrangement arr{a[2] == 1 ? "one 1-2 shell pass" : "n 1-2 shell passes in series",
                        a[2] == 1 ? "2/(1 + Cr + sqrt(1 + Cr^2))"
                                  : "the series rule applied to 2/(1 + Cr + sqrt(1 + Cr^2))"};
  if (!EffOk("ntu_shell", a[0], cr, max_eff, arr, s)) return kNaN;
  const double ntu = entu::NtuShell(a[0], cr, a[2]);
  // Rounding can put eff a hair under the computed maximum yet past the
  // one-shell limit tanh < 1.
  if (std::isnan(ntu)) {
    return Fail(s, "ntu_shell: eff = {:.6g} is at the maximum {:.6g} of {} shell pass(es)", a[0],
                max_eff, a[2]);
  }
  return ntu;
}
double NtuCrossCmaxMixedFn(const double* a, Sink& s) {
  const double cr = CrArg(a[1]);
  const double max_eff = cr >= 0 && cr <= 1 ? entu::MaxCrossCmaxMixed(cr) : kNaN;
  if (!EffOk("ntu_cross_cmax_mixed", a[0], cr, max_eff, kCmaxArr, s)) return kNaN;
  const double ntu = entu::NtuCrossCmaxMixed(a[0], cr);
  if (std::isnan(ntu)) {
    return Fail(s, "ntu_cross_cmax_mixed: eff = {:.6g} is at the maximum {:.6g}", a[0], max_eff);
  }
  return ntu;
}
double NtuCrossCminMixedFn(const double* a, Sink& s) {
  const double cr = CrArg(a[1]);
  const double max_eff = cr >= 0 && cr <= 1 ? entu::MaxCrossCminMixed(cr) : kNaN;
  if (!EffOk("ntu_cross_cmin_mixed", a[0], cr, max_eff, kCminArr, s)) return kNaN;
  const double ntu = entu::NtuCrossCminMixed(a[0], cr);
  if (std::isnan(ntu)) {
    return Fail(s, "ntu_cross_cmin_mixed: eff = {:.6g} is at the maximum {:.6g}", a[0], max_eff);
  }
  return ntu;
}
double NtuCrossUnmixedFn(const double* a, Sink& s) {
  const double cr = CrArg(a[1]);
  if (!EffOk("ntu_cross_unmixed", a[0], cr, entu::MaxCrossUnmixed(cr), kUnmixedArr, s)) {
    return kNaN;
  }
  const double ntu = entu::NtuCrossUnmixed(a[0], cr);
  if (std::isnan(ntu)) {
    return Fail(s,
                "ntu_cross_unmixed: eff = {:.6g} at Cr = {:.6g} needs NTU > {:.0e}, beyond the "
                "range the exact series is summed for (effectiveness approaches 1 only as "
                "NTU -> infinity)",
                a[0], cr, entu::kMaxSeriesNtu);
  }
  return ntu;
}

constexpr const char* kKaysLondon =
    "Kays & London, Compact Heat Exchangers (3rd ed., 1984); as tabulated in Incropera, "
    "DeWitt, Bergman & Lavine, Fundamentals of Heat and Mass Transfer, Table 11.3";
constexpr const char* kKaysLondonInverse =
    "inverse of the Kays & London relation (Compact Heat Exchangers, 1984); as tabulated in "
    "Incropera et al., Fundamentals of Heat and Mass Transfer, Table 11.4";
constexpr const char* kEffValidity =
    "any NTU >= 0 and 0 <= Cr <= 1 (Cr = 0: 1 - exp(-NTU)); error for NTU < 0 or Cr outside "
    "[0, 1]";

std::vector<ArgSpec> NtuCrArgs() { return {{"NTU", dim::kOne}, {"Cr", dim::kOne}}; }
std::vector<ArgSpec> EffCrArgs() { return {{"eff", dim::kOne}, {"Cr", dim::kOne}}; }

// Spreadsheet forms.  Each uses the cancellation-free building blocks of
// sheet_text.h, so that it holds full precision at small NTU or eff and near
// Cr = 1 (exactly Cr = 1 and Cr = 0 take IF branches).
std::string Ome(const std::string& x) { return SheetOneMinusExpNeg(x); }
std::string L1p(const std::string& z) { return SheetLog1p(z); }

std::string ParallelSheet() { return ExpandSheet("@E/(1+{1})", {{"@E", Ome("{0}*(1+{1})")}}); }

// eff = E/((1 - Cr) + Cr E), E = 1 - e^(-NTU(1-Cr)).
std::string CounterSheet() {
  return ExpandSheet("IF({1}=1,{0}/(1+{0}),@E/((1-{1})+{1}*@E))", {{"@E", Ome("{0}*(1-{1})")}});
}

// eff1 with tanh(N S/2), which is 0 rather than 0/0 at NTU = 0:
// eff1 = 2t/((1+Cr)t + S).  n > 1 shells by the textbook series rule, to
// stay compact; it loses about eps/(NTU (1 - Cr)) relative, e.g. 1e-10 at
// NTU = 1e-3, Cr = 0.999 (the C++ kernel does not).
std::string ShellSheet() {
  const std::string s = "SQRT(1+{1}^2)";
  const std::string t = ExpandSheet("TANH({0}/{2}*@S/2)", {{"@S", s}});
  const std::string e1 = ExpandSheet("2*@T/((1+{1})*@T+@S)", {{"@T", t}, {"@S", s}});
  const std::string xn = ExpandSheet("POWER((1-{1}*@E)/(1-@E),{2})", {{"@E", e1}});
  return ExpandSheet("IF({1}=0,@OME,IF({2}=1,@E,IF({1}=1,{2}*@E/(1+({2}-1)*@E),(@X-1)/(@X-{1}))))",
                     {{"@OME", Ome("{0}")}, {"@E", e1}, {"@X", xn}});
}

// 1 - exp[(NTU^0.22/Cr)(exp(-Cr NTU^0.78) - 1)] = OME(NTU^0.22 OME(Cr NTU^0.78)/Cr).
std::string CrossUnmixedApproxSheet() {
  return ExpandSheet(
      "IF({1}=0,@A,@B)",
      {{"@A", Ome("{0}")},
       {"@B", Ome(ExpandSheet("POWER({0},0.22)*@I/{1}", {{"@I", Ome("{1}*POWER({0},0.78)")}}))}});
}

std::string CrossCmaxMixedSheet() {
  return ExpandSheet(
      "IF({1}=0,@A,@B/{1})",
      {{"@A", Ome("{0}")}, {"@B", Ome(ExpandSheet("{1}*@I", {{"@I", Ome("{0}")}}))}});
}

std::string CrossCminMixedSheet() {
  return ExpandSheet(
      "IF({1}=0,@A,@B)",
      {{"@A", Ome("{0}")}, {"@B", Ome(ExpandSheet("@I/{1}", {{"@I", Ome("{1}*{0}")}}))}});
}

std::string CrossMixedSheet() {
  return ExpandSheet("IF({0}=0,0,IF({1}=0,@A,1/(1/@A+{1}/@B-1/{0})))",
                     {{"@A", Ome("{0}")}, {"@B", Ome("{1}*{0}")}});
}

std::string NtuCounterSheet() {
  return ExpandSheet("IF({1}=1,{0}/(1-{0}),@L/(1-{1}))", {{"@L", L1p("{0}*(1-{1})/(1-{0})")}});
}

std::string NtuParallelSheet() { return ExpandSheet("-@L/(1+{1})", {{"@L", L1p("-{0}*(1+{1})")}}); }

// eff1 by the inverted series rule (textbook form for n > 1, losing about
// eps/(eff (1 - Cr)) relative like ShellSheet), then
// NTU = n (2/S) artanh(t), t = S eff1/(2 - (1+Cr) eff1), which is the
// textbook -n ln[(E-1)/(E+1)]/S; artanh(t) = t(1 + t^2/3) below |t| = 1e-4
// (truncation 2e-17) and ln((1+t)/(1-t))/2 above.
std::string NtuShellSheet() {
  const std::string s = "SQRT(1+{1}^2)";
  const std::string y = "POWER((1-{0}*{1})/(1-{0}),1/{2})";
  const std::string e1 =
      ExpandSheet("IF({2}=1,{0},IF({1}=1,{0}/({2}-({2}-1)*{0}),(@Y-1)/(@Y-{1})))", {{"@Y", y}});
  const std::string t = ExpandSheet("@S*@E/(2-(1+{1})*@E)", {{"@S", s}, {"@E", e1}});
  return ExpandSheet("2*{2}/@S*IF(ABS(@T)<0.0001,@T*(1+@T^2/3),LN((1+@T)/(1-@T))/2)",
                     {{"@S", s}, {"@T", t}});
}

std::string NtuCrossCmaxMixedSheet() {
  return ExpandSheet(
      "IF({1}=0,-@A,-@B)",
      {{"@A", L1p("-{0}")}, {"@B", L1p(ExpandSheet("@I/{1}", {{"@I", L1p("-{1}*{0}")}}))}});
}

std::string NtuCrossCminMixedSheet() {
  return ExpandSheet(
      "IF({1}=0,-@A,-@B/{1})",
      {{"@A", L1p("-{0}")}, {"@B", L1p(ExpandSheet("{1}*@I", {{"@I", L1p("-{0}")}}))}});
}

}  // namespace

void RegisterEntu(std::vector<FunctionInfo>& out) {
  static const std::string kParallelSheet = ParallelSheet();
  static const std::string kCounterSheet = CounterSheet();
  static const std::string kShellSheet = ShellSheet();
  static const std::string kApproxSheet = CrossUnmixedApproxSheet();
  static const std::string kCmaxSheet = CrossCmaxMixedSheet();
  static const std::string kCminSheet = CrossCminMixedSheet();
  static const std::string kMixedSheet = CrossMixedSheet();
  static const std::string kNtuCounterSheet = NtuCounterSheet();
  static const std::string kNtuParallelSheet = NtuParallelSheet();
  static const std::string kNtuShellSheet = NtuShellSheet();
  static const std::string kNtuCmaxSheet = NtuCrossCmaxMixedSheet();
  static const std::string kNtuCminSheet = NtuCrossCminMixedSheet();
  out.push_back({
      .name = "eff_parallel",
      .family = "entu",
      .args = NtuCrArgs(),
      .result = dim::kOne,
      .formula = "eff = [1 - exp(-NTU*(1+Cr))]/(1+Cr)",
      .source = kKaysLondon,
      .validity = kEffValidity,
      .example = "eps_p = eff_parallel(1.6, 0.45)",
      .spreadsheet = kParallelSheet.c_str(),
      .fn = EffParallel,
  });
  out.push_back({
      .name = "eff_counter",
      .family = "entu",
      .args = NtuCrArgs(),
      .result = dim::kOne,
      .formula = "eff = [1 - exp(-NTU*(1-Cr))]/[1 - Cr*exp(-NTU*(1-Cr))]; Cr = 1: NTU/(1+NTU)",
      .source = kKaysLondon,
      .validity = "any NTU >= 0 and 0 <= Cr <= 1, continuous through Cr = 1 (Cr = 0: "
                  "1 - exp(-NTU)); error for NTU < 0 or Cr outside [0, 1]",
      .example = "eps_c = eff_counter(2.4, 0.62)",
      .spreadsheet = kCounterSheet.c_str(),
      .fn = EffCounter,
  });
  out.push_back({
      .name = "eff_shell",
      .family = "entu",
      .args = {{"NTU", dim::kOne}, {"Cr", dim::kOne}, {"n", dim::kOne}},
      .result = dim::kOne,
      .formula = "eff1 = 2/{1 + Cr + S*(1 + exp(-N*S))/(1 - exp(-N*S))}, S = sqrt(1+Cr^2), "
                 "N = NTU/n; n shells: X = (1 - eff1*Cr)/(1 - eff1), eff = (X^n - 1)/(X^n - Cr); "
                 "Cr = 1: n*eff1/(1 + (n-1)*eff1)",
      .source = kKaysLondon,
      .validity = "n shell passes in series, each with 2, 4, ... tube passes and the shell "
                  "fluid mixed; any NTU >= 0, 0 <= Cr <= 1; error for NTU < 0, Cr outside "
                  "[0, 1], or n not a whole number >= 1",
      .example = "eps_s = eff_shell(3.1, 0.8, 2)",
      .spreadsheet = kShellSheet.c_str(),
      .fn = EffShell,
  });
  out.push_back({
      .name = "eff_cross_unmixed",
      .family = "entu",
      .args = NtuCrArgs(),
      .result = dim::kOne,
      .formula = "eff = 1/(Cr*NTU) * sum_{n>=0} [1 - exp(-NTU)*sum_{m<=n} NTU^m/m!] * "
                 "[1 - exp(-Cr*NTU)*sum_{m<=n} (Cr*NTU)^m/m!]",
      .source = "exact series solution for single-pass crossflow, both fluids unmixed: "
                "J. L. Mason, Heat transfer in crossflow, Proc. 2nd U.S. National Congress of "
                "Applied Mechanics (1954)",
      .validity = "single-pass crossflow, both fluids unmixed; 0 <= NTU <= 1e6, 0 <= Cr <= 1, "
                  "converged to about 1e-14 relative; error for NTU < 0, NTU > 1e6 or Cr "
                  "outside [0, 1]",
      .example = "eps_x = eff_cross_unmixed(1.8, 0.7)",
      .spreadsheet = nullptr,  // an infinite series
      .fn = EffCrossUnmixed,
  });
  out.push_back({
      .name = "eff_cross_unmixed_approx",
      .family = "entu",
      .args = NtuCrArgs(),
      .result = dim::kOne,
      .formula = "eff = 1 - exp[(NTU^0.22/Cr)*(exp(-Cr*NTU^0.78) - 1)]",
      .source = "the common one-line approximation to the unmixed crossflow series, as "
                "tabulated in Incropera et al., Fundamentals of Heat and Mass Transfer, "
                "Table 11.3",
      .validity = "single-pass crossflow, both fluids unmixed; an approximation, within 4 % "
                  "(0.02 absolute) of eff_cross_unmixed for NTU <= 10; NTU >= 0, "
                  "0 <= Cr <= 1, error outside",
      .example = "eps_xa = eff_cross_unmixed_approx(1.8, 0.7)",
      .spreadsheet = kApproxSheet.c_str(),
      .fn = EffCrossUnmixedApprox,
  });
  out.push_back({
      .name = "eff_cross_cmax_mixed",
      .family = "entu",
      .args = NtuCrArgs(),
      .result = dim::kOne,
      .formula = "eff = (1/Cr)*(1 - exp(-Cr*(1 - exp(-NTU))))",
      .source = kKaysLondon,
      .validity = "single-pass crossflow, C_max fluid mixed, C_min fluid unmixed; "
                  "NTU >= 0, 0 <= Cr <= 1 (Cr = 0: 1 - exp(-NTU)); error outside",
      .example = "eps_g = eff_cross_cmax_mixed(1.2, 0.35)",
      .spreadsheet = kCmaxSheet.c_str(),
      .fn = EffCrossCmaxMixed,
  });
  out.push_back({
      .name = "eff_cross_cmin_mixed",
      .family = "entu",
      .args = NtuCrArgs(),
      .result = dim::kOne,
      .formula = "eff = 1 - exp(-(1/Cr)*(1 - exp(-Cr*NTU)))",
      .source = kKaysLondon,
      .validity = "single-pass crossflow, C_min fluid mixed, C_max fluid unmixed; "
                  "NTU >= 0, 0 <= Cr <= 1 (Cr = 0: 1 - exp(-NTU)); error outside",
      .example = "eps_m = eff_cross_cmin_mixed(1.2, 0.35)",
      .spreadsheet = kCminSheet.c_str(),
      .fn = EffCrossCminMixed,
  });
  out.push_back({
      .name = "eff_cross_mixed",
      .family = "entu",
      .args = NtuCrArgs(),
      .result = dim::kOne,
      .formula = "eff = [1/(1 - exp(-NTU)) + Cr/(1 - exp(-Cr*NTU)) - 1/NTU]^-1",
      .source = kKaysLondon,
      .validity = "single-pass crossflow, both fluids mixed; NTU >= 0 (0 at NTU = 0), "
                  "0 <= Cr <= 1 (Cr = 0: 1 - exp(-NTU)); error outside",
      .example = "eps_mm = eff_cross_mixed(0.9, 0.5)",
      .spreadsheet = kMixedSheet.c_str(),
      .fn = EffCrossMixed,
  });
  out.push_back({
      .name = "ntu_counter",
      .family = "entu",
      .args = EffCrArgs(),
      .result = dim::kOne,
      .formula = "NTU = ln[(1 - Cr*eff)/(1 - eff)]/(1 - Cr); Cr = 1: eff/(1 - eff)",
      .source = kKaysLondonInverse,
      .validity = "0 <= eff < 1, 0 <= Cr <= 1; error otherwise (eff = 1 needs infinite NTU)",
      .example = "NTU_c = ntu_counter(0.78, 0.55)",
      .spreadsheet = kNtuCounterSheet.c_str(),
      .fn = NtuCounterFn,
  });
  out.push_back({
      .name = "ntu_parallel",
      .family = "entu",
      .args = EffCrArgs(),
      .result = dim::kOne,
      .formula = "NTU = -ln[1 - eff*(1+Cr)]/(1+Cr)",
      .source = kKaysLondonInverse,
      .validity = "0 <= eff < 1/(1+Cr) (the parallel-flow maximum), 0 <= Cr <= 1; error "
                  "otherwise, naming the maximum",
      .example = "NTU_p = ntu_parallel(0.5, 0.6)",
      .spreadsheet = kNtuParallelSheet.c_str(),
      .fn = NtuParallelFn,
  });
  out.push_back({
      .name = "ntu_shell",
      .family = "entu",
      .args = {{"eff", dim::kOne}, {"Cr", dim::kOne}, {"n", dim::kOne}},
      .result = dim::kOne,
      .formula = "per shell: X = ((1 - eff*Cr)/(1 - eff))^(1/n), eff1 = (X - 1)/(X - Cr) "
                 "(Cr = 1: eff1 = eff/(n - (n-1)*eff)); E = (2/eff1 - (1+Cr))/sqrt(1+Cr^2), "
                 "NTU = -n*ln[(E - 1)/(E + 1)]/sqrt(1+Cr^2)",
      .source = kKaysLondonInverse,
      .validity = "n 1-2 shell passes in series; 0 <= eff < maximum of the arrangement (one "
                  "shell: 2/(1 + Cr + sqrt(1+Cr^2))), 0 <= Cr <= 1, n a whole number >= 1; "
                  "error otherwise, naming the maximum",
      .example = "NTU_s = ntu_shell(0.7, 0.8, 2)",
      .spreadsheet = kNtuShellSheet.c_str(),
      .fn = NtuShellFn,
  });
  out.push_back({
      .name = "ntu_cross_cmax_mixed",
      .family = "entu",
      .args = EffCrArgs(),
      .result = dim::kOne,
      .formula = "NTU = -ln[1 + ln(1 - Cr*eff)/Cr]; Cr = 0: -ln(1 - eff)",
      .source = kKaysLondonInverse,
      .validity = "single-pass crossflow, C_max mixed; 0 <= eff < (1 - exp(-Cr))/Cr, "
                  "0 <= Cr <= 1; error otherwise, naming the maximum",
      .example = "NTU_g = ntu_cross_cmax_mixed(0.55, 0.35)",
      .spreadsheet = kNtuCmaxSheet.c_str(),
      .fn = NtuCrossCmaxMixedFn,
  });
  out.push_back({
      .name = "ntu_cross_cmin_mixed",
      .family = "entu",
      .args = EffCrArgs(),
      .result = dim::kOne,
      .formula = "NTU = -ln[1 + Cr*ln(1 - eff)]/Cr; Cr = 0: -ln(1 - eff)",
      .source = kKaysLondonInverse,
      .validity = "single-pass crossflow, C_min mixed; 0 <= eff < 1 - exp(-1/Cr), "
                  "0 <= Cr <= 1; error otherwise, naming the maximum",
      .example = "NTU_m = ntu_cross_cmin_mixed(0.55, 0.35)",
      .spreadsheet = kNtuCminSheet.c_str(),
      .fn = NtuCrossCminMixedFn,
  });
  out.push_back({
      .name = "ntu_cross_unmixed",
      .family = "entu",
      .args = EffCrArgs(),
      .result = dim::kOne,
      .formula = "NTU such that eff_cross_unmixed(NTU, Cr) = eff (Brent's bracketed root, "
                 "1e-12 relative, bracketed below by ntu_counter)",
      .source = "inverse of the exact unmixed crossflow series (Mason 1954); root finding by "
                "Brent, Algorithms for Minimization without Derivatives (1973)",
      .validity = "single-pass crossflow, both fluids unmixed; 0 <= eff < 1, 0 <= Cr <= 1, "
                  "root NTU <= 1e6; error otherwise",
      .example = "NTU_x = ntu_cross_unmixed(0.72, 0.6)",
      .spreadsheet = nullptr,  // a root solve
      .fn = NtuCrossUnmixedFn,
  });
}

}  // namespace heatdeck::library
