// Family 'mtd' of the heat-transfer library (LIBRARY.md).
#include "library/mtd.h"

#include <fmt/format.h>

#include <algorithm>
#include <cmath>
#include <limits>
#include <string>
#include <string_view>
#include <utility>
#include <vector>

#include "library/entu.h"
#include "library/registry.h"
#include "library/sheet_text.h"

namespace heatdeck::library {
namespace mtd {
namespace {

constexpr double kNaN = std::numeric_limits<double>::quiet_NaN();

// psi(z) = ln(1 + z)/z with psi(0) = 1; log1p keeps full relative precision
// for small z, where ln((1 + z)) of the rounded sum would lose it.
double Psi(double z) { return z == 0 ? 1.0 : std::log1p(z) / z; }

}  // namespace

double Lmtd(double dt_a, double dt_b) {
  const double sign = dt_a < 0 ? -1.0 : 1.0;
  double hi = std::fabs(dt_a), lo = std::fabs(dt_b);
  if (hi < lo) std::swap(hi, lo);
  // (hi - lo)/ln(hi/lo) = lo * u/ln(1 + u) with u = (hi - lo)/lo: hi - lo is
  // exact when the ends are close, and u >= 0 keeps log1p away from -1.
  const double u = (hi - lo) / lo;
  if (!std::isfinite(u)) return sign * (hi - lo) / (std::log(hi) - std::log(lo));
  return sign * lo / Psi(u);
}

double FcorrShell(double p, double r, double n) {
  if (p == 0 || r == 0) return 1;
  // F(P, R) = F(PR, 1/R): work on the stream with the larger temperature
  // change, so that R <= 1 and the isothermal limits stay finite.
  if (r > 1) {
    p *= r;
    r = 1 / r;
  }
  if (!(p < 1)) return kNaN;
  double p1 = p;
  if (n != 1) {
    // P1 = (Y - 1)/(Y - R) with Y = (1 + delta)^(1/n), delta = (1-R) P/(1-P).
    // Dividing through by 1 - R: P1 = o1/(1 + o1) with the single-shell odds
    // o1 = P/(1-P) * (Y - 1)/delta, which tends to P/(n(1-P)) as R -> 1
    // (the textbook R = 1 branch P/(n - (n-1)P)) with no 0/0.
    const double odds = p / (1 - p);
    const double delta = (1 - r) * odds;
    const double ratio = delta == 0 ? 1 / n : std::expm1(std::log1p(delta) / n) / delta;
    const double o1 = ratio * odds;
    p1 = o1 / (1 + o1);
  }
  const double s = std::sqrt(1 + r * r);
  const double den_arg = 2 - p1 * (r + 1 + s);
  if (!(den_arg > 0)) return kNaN;
  // ln[(1-P)/(1-PR)]/(R-1) = ln(1 + z)/(R-1) with z = P(R-1)/(1-PR)
  // = psi(z) P/(1-PR): the R = 1 limit P/(1-P) needs no branch.
  const double one_minus_pr = 1 - p1 * r;
  const double num = s * Psi(p1 * (r - 1) / one_minus_pr) * p1 / one_minus_pr;
  // [2 - P(R+1-S)]/[2 - P(R+1+S)] = 1 + 2PS/[2 - P(R+1+S)].
  const double den = std::log1p(2 * p1 * s / den_arg);
  return num / den;
}

double MaxPShell(double r, double n) {
  if (r <= 1) return entu::MaxShell(r, n);
  return entu::MaxShell(1 / r, n) / r;
}

double FcorrCross(Cross arrangement, double eff, double cr) {
  if (eff == 0 || cr == 0) return 1;
  double ntu = kNaN;
  switch (arrangement) {
    case Cross::kUnmixed:
      ntu = entu::NtuCrossUnmixed(eff, cr);
      break;
    case Cross::kCminMixed:
      if (eff < entu::MaxCrossCminMixed(cr)) ntu = entu::NtuCrossCminMixed(eff, cr);
      break;
    case Cross::kCmaxMixed:
      if (eff < entu::MaxCrossCmaxMixed(cr)) ntu = entu::NtuCrossCmaxMixed(eff, cr);
      break;
  }
  if (!(ntu > 0)) return kNaN;
  return entu::NtuCounter(eff, cr) / ntu;
}

}  // namespace mtd

namespace {

namespace dim = units::dim;
using units::TempKind;

constexpr double kNaN = std::numeric_limits<double>::quiet_NaN();
// Design rule of thumb (common practice): below this F the exchanger sits on
// the steep part of the F curve, where a small change in duty moves F a lot.
constexpr double kFMin = 0.75;

// Error path only (may allocate).
template <typename... Args>
double Fail(Sink& sink, fmt::format_string<Args...> f, Args&&... args) {
  sink.Error(fmt::format(f, std::forward<Args>(args)...));
  return kNaN;
}

bool EndsOk(const char* fn, double dt_a, double dt_b, const char* how, Sink& sink) {
  if (dt_a * dt_b > 0) return true;  // false for NaN too
  const char* why = (dt_a == 0 || dt_b == 0)
                        ? "one end is zero (a pinch: the log mean tends to 0 only with "
                          "infinite area)"
                        : "the ends differ in sign (a temperature cross)";
  Fail(sink, "{}: dT_a = {:.6g} K and dT_b = {:.6g} K{}: {}", fn, dt_a, dt_b, how, why);
  return false;
}

bool AbsoluteOk(const char* fn, const double* t, Sink& sink) {
  static constexpr const char* kNames[] = {"T_h_in", "T_h_out", "T_c_in", "T_c_out"};
  for (int i = 0; i < 4; ++i) {
    if (!(t[i] > 0) || !std::isfinite(t[i])) {
      Fail(sink, "{}: {} = {:.6g} K is not an absolute temperature above 0 K", fn, kNames[i], t[i]);
      return false;
    }
  }
  return true;
}

double LmtdFn(const double* a, Sink& s) {
  if (!EndsOk("lmtd", a[0], a[1], "", s)) return kNaN;
  return mtd::Lmtd(a[0], a[1]);
}

double LmtdCounterFn(const double* a, Sink& s) {
  if (!AbsoluteOk("lmtd_counter", a, s)) return kNaN;
  const double dt_a = a[0] - a[3], dt_b = a[1] - a[2];
  if (!EndsOk("lmtd_counter", dt_a, dt_b, " (T_h_in - T_c_out and T_h_out - T_c_in)", s)) {
    return kNaN;
  }
  return mtd::Lmtd(dt_a, dt_b);
}

double LmtdParallelFn(const double* a, Sink& s) {
  if (!AbsoluteOk("lmtd_parallel", a, s)) return kNaN;
  const double dt_a = a[0] - a[2], dt_b = a[1] - a[3];
  if (!EndsOk("lmtd_parallel", dt_a, dt_b, " (T_h_in - T_c_in and T_h_out - T_c_out)", s)) {
    return kNaN;
  }
  return mtd::Lmtd(dt_a, dt_b);
}

// The duty of a two-stream exchanger read from its four terminal
// temperatures.
struct Duty {
  double p;          // (T_c_out - T_c_in)/(T_h_in - T_c_in)
  double r;          // (T_h_in - T_h_out)/(T_c_out - T_c_in); +inf when the cold end is isothermal
  double eff;        // effectiveness on the C_min stream
  double cr;         // C_min/C_max
  bool hot_is_cmin;  // the stream called h has the larger temperature change
};

bool ReadDuty(const char* fn, const double* t, Duty* d, Sink& sink) {
  if (!AbsoluteOk(fn, t, sink)) return false;
  double dh = t[0] - t[1], dc = t[3] - t[2], dmax = t[0] - t[2];
  if (dmax == 0) {
    Fail(sink, "{}: T_h_in = T_c_in = {:.6g} K: no temperature difference drives the duty", fn,
         t[0]);
    return false;
  }
  // Labels swapped (the stream called h is the colder one): P, R and F are
  // unchanged when every temperature changes sign.
  if (dmax < 0) {
    dh = -dh;
    dc = -dc;
    dmax = -dmax;
  }
  if (dh < 0 || dc < 0) {
    Fail(sink,
         "{}: T_h_in = {:.6g} K, T_h_out = {:.6g} K, T_c_in = {:.6g} K, T_c_out = {:.6g} K: a "
         "stream changes temperature against the heat flow (the hotter stream must cool and "
         "the colder one warm)",
         fn, t[0], t[1], t[2], t[3]);
    return false;
  }
  d->hot_is_cmin = dh >= dc;
  const double big = std::max(dh, dc), small = std::min(dh, dc);
  d->eff = big / dmax;
  d->cr = big == 0 ? 0 : small / big;
  d->p = dc / dmax;
  d->r = dh == 0 ? 0 : (dc == 0 ? std::numeric_limits<double>::infinity() : dh / dc);
  if (!(d->eff < 1)) {
    Fail(sink,
         "{}: P = {:.6g}, R = {:.6g}: the ends T_h_in - T_c_out = {:.6g} K and T_h_out - T_c_in "
         "= {:.6g} K cross or pinch, so no exchanger reaches this duty (even counterflow needs "
         "infinite UA) and the counterflow LMTD that F corrects does not exist",
         fn, d->p, d->r, t[0] - t[3], t[1] - t[2]);
    return false;
  }
  return true;
}

void WarnLowF(const char* fn, double f, const Duty& d, Sink& sink) {
  if (!(f < kFMin)) return;
  sink.Warning(fmt::format(
      "{}: F = {:.4g} is below 0.75 (P = {:.6g}, R = {:.6g}), the usual design minimum (rule of "
      "thumb, common practice): F falls steeply here with small changes in the duty",
      fn, f, d.p, d.r));
}

double FcorrShellFn(const double* a, Sink& s) {
  const double n = a[4];
  if (!(n >= 1 && std::isfinite(n) && n == std::floor(n))) {
    return Fail(s, "fcorr_shell: n = {:.6g} is not a whole number of shell passes >= 1", n);
  }
  Duty d;
  if (!ReadDuty("fcorr_shell", a, &d, s)) return kNaN;
  const double f = mtd::FcorrShell(d.p, d.r, n);
  if (std::isnan(f)) {
    return Fail(s,
                "fcorr_shell: no F exists for P = {:.6g}, R = {:.6g}, n = {:g}: the duty is "
                "beyond what {:g} 1-2 shell pass(es) in series can deliver at any UA (at this R "
                "they reach at most P = {:.6g})",
                d.p, d.r, n, n, mtd::MaxPShell(d.r, n));
  }
  if (f < kFMin) {
    s.Warning(fmt::format(
        "fcorr_shell: F = {:.4g} is below 0.75 (P = {:.6g}, R = {:.6g}, n = {:g}), the usual "
        "design minimum (rule of thumb, common practice): F falls steeply here with small "
        "changes in the duty; more shell passes in series raise it",
        f, d.p, d.r, n));
  }
  return f;
}

// Which stream is mixed in a one-mixed crossflow exchanger.
enum class Mixed { kNone, kHot, kCold };

double FcorrCrossFn(const char* fn, Mixed mixed, const double* a, Sink& s) {
  Duty d;
  if (!ReadDuty(fn, a, &d, s)) return kNaN;
  mtd::Cross arr = mtd::Cross::kUnmixed;
  double max_eff = entu::MaxCrossUnmixed(d.cr);
  if (mixed != Mixed::kNone) {
    // The mixed stream is C_min when it has the larger temperature change.
    const bool mixed_is_cmin = (mixed == Mixed::kHot) == d.hot_is_cmin;
    arr = mixed_is_cmin ? mtd::Cross::kCminMixed : mtd::Cross::kCmaxMixed;
    max_eff = mixed_is_cmin ? entu::MaxCrossCminMixed(d.cr) : entu::MaxCrossCmaxMixed(d.cr);
  }
  const double f = mtd::FcorrCross(arr, d.eff, d.cr);
  if (std::isnan(f)) {
    const char* which = arr == mtd::Cross::kUnmixed     ? "both fluids unmixed"
                        : arr == mtd::Cross::kCminMixed ? "the C_min fluid mixed"
                                                        : "the C_max fluid mixed";
    if (arr == mtd::Cross::kUnmixed) {
      return Fail(s,
                  "{}: no F found for P = {:.6g}, R = {:.6g}: the duty needs effectiveness "
                  "{:.6g} at Cr = {:.6g}, which single-pass crossflow with {} reaches only "
                  "beyond NTU = {:.0e}",
                  fn, d.p, d.r, d.eff, d.cr, which, entu::kMaxSeriesNtu);
    }
    return Fail(s,
                "{}: no F exists for P = {:.6g}, R = {:.6g}: the duty needs effectiveness {:.6g} "
                "at Cr = {:.6g} (C_min is the {} stream), but single-pass crossflow with {} "
                "reaches at most {:.6g} at any UA",
                fn, d.p, d.r, d.eff, d.cr, d.hot_is_cmin ? "hot" : "cold", which, max_eff);
  }
  WarnLowF(fn, f, d, s);
  return f;
}

// Spreadsheet form of the log mean of a and b: with x = (a-b)/(a+b),
// (a-b)/ln(a/b) = ((a+b)/2) x/artanh(x) = ((a+b)/2)(1 - x^2/3 - 4x^4/45 - ...)
// for |x| < 1e-3 (truncation 5e-20), where LN(a/b) would lose digits; equal
// ends give (a+b)/2 = a.
std::string LogMeanSheet(const std::string& a, const std::string& b) {
  const std::string x = ExpandSheet("(@A-@B)/(@A+@B)", {{"@A", a}, {"@B", b}});
  return ExpandSheet("IF(ABS(@X)<0.001,(@A+@B)/2*(1-@X^2/3-4*@X^4/45),(@A-@B)/LN(@A/@B))",
                     {{"@X", x}, {"@A", a}, {"@B", b}});
}

// Spreadsheet form of fcorr_shell: P and R from the temperatures, P1 by the
// n-shell transformation, then the one-shell formula, with the R = 1 branch.
// The textbook forms, to stay compact: they lose about eps/|R - 1| relative
// very near R = 1 (the C++ kernel does not).
std::string ShellSheet() {
  const std::string p = "({3}-{2})/({0}-{2})";
  const std::string r = "({0}-{1})/({3}-{2})";
  const std::string s = ExpandSheet("SQRT(@R^2+1)", {{"@R", r}});
  const std::string y = ExpandSheet("POWER((1-@P*@R)/(1-@P),1/{4})", {{"@P", p}, {"@R", r}});
  const std::string p1 =
      ExpandSheet("IF({4}=1,@P,(1-@Y)/(@R-@Y))", {{"@P", p}, {"@Y", y}, {"@R", r}});
  const std::string p1_eq = ExpandSheet("@P/({4}-({4}-1)*@P)", {{"@P", p}});
  const std::string f =
      ExpandSheet("@S/(@R-1)*LN((1-@A)/(1-@A*@R))/LN((2-@A*(@R+1-@S))/(2-@A*(@R+1+@S)))",
                  {{"@S", s}, {"@A", p1}, {"@R", r}});
  const std::string f_eq =
      ExpandSheet("SQRT(2)*@A/(1-@A)/LN((2-@A*(2-SQRT(2)))/(2-@A*(2+SQRT(2))))", {{"@A", p1_eq}});
  return ExpandSheet("IF(OR({3}={2},{0}={1}),1,IF(@R=1,@FEQ,@F))",
                     {{"@FEQ", f_eq}, {"@F", f}, {"@R", r}});
}

// Spreadsheet form of fcorr_cross_hot_mixed / _cold_mixed: eff and Cr from
// the temperature changes (C_min has the larger one), F = NTU ratio, each
// NTU in its textbook closed form.
std::string CrossMixedSheet(bool hot_mixed) {
  const std::string dh = "ABS({0}-{1})", dc = "ABS({3}-{2})";
  const std::string e = ExpandSheet("MAX(@H,@C)/ABS({0}-{2})", {{"@H", dh}, {"@C", dc}});
  const std::string c = ExpandSheet("MIN(@H,@C)/MAX(@H,@C)", {{"@H", dh}, {"@C", dc}});
  const std::string ntu_cf =
      ExpandSheet("IF(@C=1,@E/(1-@E),LN((1-@C*@E)/(1-@E))/(1-@C))", {{"@E", e}, {"@C", c}});
  const std::string ntu_cmin = ExpandSheet("-LN(1+@C*LN(1-@E))/@C", {{"@E", e}, {"@C", c}});
  const std::string ntu_cmax = ExpandSheet("-LN(1+LN(1-@C*@E)/@C)", {{"@E", e}, {"@C", c}});
  // The hot stream is C_min when its change is the larger.
  const std::string ntu_arr =
      ExpandSheet(hot_mixed ? "IF(@H>=@D,@MIN,@MAX)" : "IF(@H>=@D,@MAX,@MIN)",
                  {{"@MIN", ntu_cmin}, {"@MAX", ntu_cmax}, {"@H", dh}, {"@D", dc}});
  return ExpandSheet("IF(OR({0}={1},{3}={2}),1,@CF/@ARR)", {{"@CF", ntu_cf}, {"@ARR", ntu_arr}});
}

constexpr const char* kLmtdSource =
    "log-mean temperature difference from integrating dQ = U dA dT along a pure counter- or "
    "parallel-flow exchanger (Kays & London, Compact Heat Exchangers; Incropera et al., "
    "Fundamentals of Heat and Mass Transfer, sec. 11.3)";
constexpr const char* kCrossSource =
    "F = NTU_counter/NTU_arrangement at the same eff and Cr, from the Kays & London "
    "effectiveness-NTU relations (Compact Heat Exchangers, 1984)";

std::vector<ArgSpec> TemperatureArgs() {
  return {{"T_h_in", dim::kTemperature, TempKind::kAbsolute},
          {"T_h_out", dim::kTemperature, TempKind::kAbsolute},
          {"T_c_in", dim::kTemperature, TempKind::kAbsolute},
          {"T_c_out", dim::kTemperature, TempKind::kAbsolute}};
}

}  // namespace

void RegisterMtd(std::vector<FunctionInfo>& out) {
  static const std::string kLmtdSheet = LogMeanSheet("{0}", "{1}");
  static const std::string kCounterSheet = LogMeanSheet("{0}-{3}", "{1}-{2}");
  static const std::string kParallelSheet = LogMeanSheet("{0}-{2}", "{1}-{3}");
  static const std::string kShellSheet = ShellSheet();
  static const std::string kHotMixedSheet = CrossMixedSheet(true);
  static const std::string kColdMixedSheet = CrossMixedSheet(false);
  out.push_back({
      .name = "lmtd",
      .family = "mtd",
      .args = {{"dT_a", dim::kTemperature, TempKind::kInterval},
               {"dT_b", dim::kTemperature, TempKind::kInterval}},
      .result = dim::kTemperature,
      .result_kind = TempKind::kInterval,
      .formula = "dT_lm = (dT_a - dT_b)/ln(dT_a/dT_b); dT_a = dT_b: dT_a",
      .source = kLmtdSource,
      .validity = "ends of the same sign, continuous as they meet; error if they differ in "
                  "sign or one is zero (temperature cross or pinch), naming both",
      .example = "dT_lm = lmtd(38 K, 14 K)",
      .spreadsheet = kLmtdSheet.c_str(),
      .fn = LmtdFn,
  });
  out.push_back({
      .name = "lmtd_counter",
      .family = "mtd",
      .args = TemperatureArgs(),
      .result = dim::kTemperature,
      .result_kind = TempKind::kInterval,
      .formula = "lmtd(T_h_in - T_c_out, T_h_out - T_c_in)",
      .source = kLmtdSource,
      .validity = "pure counterflow; error if the ends T_h_in - T_c_out and T_h_out - T_c_in "
                  "differ in sign or one is zero, naming both",
      .example = "dT_lm = lmtd_counter(135 degC, 80 degC, 30 degC, 90 degC)",
      .spreadsheet = kCounterSheet.c_str(),
      .fn = LmtdCounterFn,
  });
  out.push_back({
      .name = "lmtd_parallel",
      .family = "mtd",
      .args = TemperatureArgs(),
      .result = dim::kTemperature,
      .result_kind = TempKind::kInterval,
      .formula = "lmtd(T_h_in - T_c_in, T_h_out - T_c_out)",
      .source = kLmtdSource,
      .validity = "pure parallel flow; error if the ends T_h_in - T_c_in and T_h_out - T_c_out "
                  "differ in sign or one is zero, naming both",
      .example = "dT_lm = lmtd_parallel(150 degC, 95 degC, 25 degC, 70 degC)",
      .spreadsheet = kParallelSheet.c_str(),
      .fn = LmtdParallelFn,
  });
  std::vector<ArgSpec> shell_args = TemperatureArgs();
  shell_args.push_back({"n", dim::kOne});
  out.push_back({
      .name = "fcorr_shell",
      .family = "mtd",
      .args = std::move(shell_args),
      .result = dim::kOne,
      .formula = "P = (T_c_out - T_c_in)/(T_h_in - T_c_in), R = (T_h_in - T_h_out)/(T_c_out - "
                 "T_c_in); n shells: P1 = (1 - Y)/(R - Y), Y = ((1 - P*R)/(1 - P))^(1/n) "
                 "(R = 1: P1 = P/(n - (n-1)*P)); S = sqrt(R^2 + 1), F = [S/(R - 1)]*"
                 "ln[(1 - P1)/(1 - P1*R)]/ln{[2 - P1*(R + 1 - S)]/[2 - P1*(R + 1 + S)]} "
                 "(R = 1: S*P1/(1 - P1) in place of the first factor and log)",
      .source = "Bowman, Mueller & Nagle, Mean temperature difference in design, Trans. ASME "
                "62 (1940); n shells in series by the P1 transformation (Kays & London, Compact "
                "Heat Exchangers)",
      .validity = "n shell passes in series, each with 2, 4, ... tube passes and the shell "
                  "fluid mixed, constant U and properties; error where no F exists (the duty "
                  "is beyond the arrangement at any UA; the message states P, R and n), for "
                  "equal inlets, for a stream changing temperature the wrong way, and for n "
                  "not a whole number >= 1; warning where F < 0.75 (design rule of thumb, "
                  "common practice)",
      .example = "F_s = fcorr_shell(180 degC, 110 degC, 40 degC, 95 degC, 1)",
      .spreadsheet = kShellSheet.c_str(),
      .fn = FcorrShellFn,
  });
  out.push_back({
      .name = "fcorr_cross",
      .family = "mtd",
      .args = TemperatureArgs(),
      .result = dim::kOne,
      .formula = "eff = max(dT_h, dT_c)/(T_h_in - T_c_in), Cr = min(dT_h, dT_c)/max(dT_h, dT_c); "
                 "F = ntu_counter(eff, Cr)/ntu_cross_unmixed(eff, Cr)",
      .source = kCrossSource,
      .validity = "single-pass crossflow, both fluids unmixed, constant U and properties; "
                  "error where no F exists (temperature cross), for equal inlets or a stream "
                  "changing temperature the wrong way; warning where F < 0.75 (design rule of "
                  "thumb, common practice)",
      .example = "F_x = fcorr_cross(90 degC, 60 degC, 20 degC, 45 degC)",
      .spreadsheet = nullptr,  // needs the root solve of ntu_cross_unmixed
      .fn = [](const double* a,
               Sink& s) { return FcorrCrossFn("fcorr_cross", Mixed::kNone, a, s); },
  });
  out.push_back({
      .name = "fcorr_cross_hot_mixed",
      .family = "mtd",
      .args = TemperatureArgs(),
      .result = dim::kOne,
      .formula = "eff, Cr as for fcorr_cross; F = ntu_counter(eff, Cr)/NTU, NTU = "
                 "ntu_cross_cmin_mixed(eff, Cr) if the hot stream is C_min (larger temperature "
                 "change), else ntu_cross_cmax_mixed(eff, Cr)",
      .source = kCrossSource,
      .validity = "single-pass crossflow, hot fluid mixed, cold unmixed; error where no F "
                  "exists (the arrangement's maximum effectiveness is below the duty's), for "
                  "equal inlets or a stream changing temperature the wrong way; warning where "
                  "F < 0.75 (design rule of thumb, common practice)",
      .example = "F_h = fcorr_cross_hot_mixed(120 degC, 85 degC, 25 degC, 50 degC)",
      .spreadsheet = kHotMixedSheet.c_str(),
      .fn = [](const double* a,
               Sink& s) { return FcorrCrossFn("fcorr_cross_hot_mixed", Mixed::kHot, a, s); },
  });
  out.push_back({
      .name = "fcorr_cross_cold_mixed",
      .family = "mtd",
      .args = TemperatureArgs(),
      .result = dim::kOne,
      .formula = "eff, Cr as for fcorr_cross; F = ntu_counter(eff, Cr)/NTU, NTU = "
                 "ntu_cross_cmin_mixed(eff, Cr) if the cold stream is C_min (larger temperature "
                 "change), else ntu_cross_cmax_mixed(eff, Cr)",
      .source = kCrossSource,
      .validity = "single-pass crossflow, cold fluid mixed, hot unmixed; error where no F "
                  "exists (the arrangement's maximum effectiveness is below the duty's), for "
                  "equal inlets or a stream changing temperature the wrong way; warning where "
                  "F < 0.75 (design rule of thumb, common practice)",
      .example = "F_c = fcorr_cross_cold_mixed(120 degC, 85 degC, 25 degC, 50 degC)",
      .spreadsheet = kColdMixedSheet.c_str(),
      .fn = [](const double* a,
               Sink& s) { return FcorrCrossFn("fcorr_cross_cold_mixed", Mixed::kCold, a, s); },
  });
}

}  // namespace heatdeck::library
