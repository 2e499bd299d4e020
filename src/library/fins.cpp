// Family 'fins' of the heat-transfer library (LIBRARY.md).
#include "library/fins.h"
#include "library/fail.h"

#include <fmt/format.h>

#include <cmath>
#include <limits>
#include <numbers>
#include <utility>

namespace heatdeck::library {
namespace {

namespace dim = units::dim;

using detail::Fail;
using detail::kNaN;

// tanh(x)/x for x >= 0.  Below 1e-4 the Taylor series 1 - x^2/3 + 2x^4/15
// (next term 17x^6/315 < 1e-25) gives the limit 1 at x = 0 without 0/0.
double TanhRatio(double x) {
  if (x < 1e-4) {
    const double x2 = x * x;
    return 1.0 - x2 / 3.0 + 2.0 * x2 * x2 / 15.0;
  }
  return std::tanh(x) / x;
}

// Exponentially scaled modified Bessel functions e^-x I_nu(x) and
// e^x K_nu(x), nu = 0 or 1, x > 0.  <cmath> has std::cyl_bessel_i/k but no
// scaled forms, and beyond x ~ 710 I overflows and K underflows; above
// kAsymptotic we therefore sum Hankel's large-argument expansions
// (Abramowitz & Stegun 9.7.1 and 9.7.2), whose terms shrink roughly like
// k/(2x): at x > 500 a dozen terms reach double precision.
constexpr double kAsymptotic = 500.0;

// sum_k c_k (sign)^k prod_{j<=k} (mu - (2j-1)^2) / (j * 8x), mu = 4 nu^2.
double HankelSeries(int nu, double x, double sign) {
  const double mu = 4.0 * nu * nu;
  double term = 1.0;
  double sum = 1.0;
  for (int j = 1; j <= 40; ++j) {
    const double odd = 2.0 * j - 1.0;
    term *= sign * (mu - odd * odd) / (j * 8.0 * x);
    sum += term;
    if (std::abs(term) < 1e-17 * std::abs(sum)) break;
  }
  return sum;
}

double ScaledI(int nu, double x) {
  if (x > kAsymptotic) return HankelSeries(nu, x, -1.0) / std::sqrt(2.0 * std::numbers::pi * x);
  return std::cyl_bessel_i(static_cast<double>(nu), x) * std::exp(-x);
}

double ScaledK(int nu, double x) {
  if (x > kAsymptotic) return HankelSeries(nu, x, 1.0) * std::sqrt(std::numbers::pi / (2.0 * x));
  return std::cyl_bessel_k(static_cast<double>(nu), x) * std::exp(x);
}

}  // namespace

// Conditions are written as !(x > 0) so that NaN input is an error as well.
double FinM(double h, double p, double k, double a_c, Sink& sink) {
  if (!(h >= 0) || !(p > 0) || !(k > 0) || !(a_c > 0)) {
    return Fail(sink,
                "fin_m: h = {:.6g} W/(m^2*K), P = {:.6g} m, k = {:.6g} W/(m*K), A_c = {:.6g} m^2; "
                "needs h >= 0, P > 0, k > 0, A_c > 0",
                h, p, k, a_c);
  }
  return std::sqrt(h * p / (k * a_c));
}

double FinMThin(double h, double k, double t, Sink& sink) {
  if (!(h >= 0) || !(k > 0) || !(t > 0)) {
    return Fail(sink,
                "fin_m_thin: h = {:.6g} W/(m^2*K), k = {:.6g} W/(m*K), t = {:.6g} m; needs h >= 0, "
                "k > 0, t > 0",
                h, k, t);
  }
  return std::sqrt(2.0 * h / (k * t));
}

double FinEffAdiabatic(double m, double l, Sink& sink) {
  if (!(m >= 0) || !(l > 0)) {
    return Fail(sink, "fin_eff_adiabatic: m = {:.6g} 1/m, L = {:.6g} m; needs m >= 0, L > 0", m, l);
  }
  return TanhRatio(m * l);
}

double FinEffRect(double h, double k, double t, double l, Sink& sink) {
  if (!(h >= 0) || !(k > 0) || !(t > 0) || !(l > 0)) {
    return Fail(sink,
                "fin_eff_rect: h = {:.6g} W/(m^2*K), k = {:.6g} W/(m*K), t = {:.6g} m, L = {:.6g} "
                "m; needs h >= 0, k > 0, t > 0, L > 0",
                h, k, t, l);
  }
  return TanhRatio(std::sqrt(2.0 * h / (k * t)) * (l + t / 2.0));
}

double FinEffPin(double h, double k, double d, double l, Sink& sink) {
  if (!(h >= 0) || !(k > 0) || !(d > 0) || !(l > 0)) {
    return Fail(sink,
                "fin_eff_pin: h = {:.6g} W/(m^2*K), k = {:.6g} W/(m*K), D = {:.6g} m, L = {:.6g} "
                "m; needs h >= 0, k > 0, D > 0, L > 0",
                h, k, d, l);
  }
  return TanhRatio(std::sqrt(4.0 * h / (k * d)) * (l + d / 4.0));
}

double FinEffAnnular(double h, double k, double t, double r_1, double r_2, Sink& sink) {
  if (!(h >= 0) || !(k > 0) || !(t > 0) || !(r_1 > 0) || !(r_2 > r_1)) {
    return Fail(sink,
                "fin_eff_annular: h = {:.6g} W/(m^2*K), k = {:.6g} W/(m*K), t = {:.6g} m, "
                "r_1 = {:.6g} m, r_2 = {:.6g} m; needs h >= 0, k > 0, t > 0, r_2 > r_1 > 0",
                h, k, t, r_1, r_2);
  }
  const double m = std::sqrt(2.0 * h / (k * t));
  const double r_2c = r_2 + t / 2.0;
  const double a = m * r_1;
  const double b = m * r_2c;
  // 1 - eta is of order b^2 * ln(r_2c/r_1) for small b: below 1e-150 it is
  // far below double resolution, and K1(a) ~ 1/a would overflow as a -> 0.
  if (b < 1e-150) return 1.0;
  // Numerator and denominator of the Bessel quotient both carry the factor
  // e^(b-a) once written with scaled functions; it cancels, and what is left
  // is e^(-2(b-a)) <= 1, so no term overflows for any m*r_2c.
  const double e = std::exp(-2.0 * (b - a));
  const double i0a = ScaledI(0, a);
  const double i1a = ScaledI(1, a);
  const double k0a = ScaledK(0, a);
  const double k1a = ScaledK(1, a);
  const double i1b = ScaledI(1, b);
  const double k1b = ScaledK(1, b);
  const double num = k1a * i1b - i1a * k1b * e;
  const double den = i0a * k1b * e + k0a * i1b;
  return 2.0 * r_1 / (m * (r_2c - r_1) * (r_2c + r_1)) * num / den;
}

double FinEffArray(double eta_f, double a_fins, double a_total, Sink& sink) {
  if (!(eta_f >= 0 && eta_f <= 1) || !(a_total > 0) || !(a_fins >= 0 && a_fins <= a_total)) {
    return Fail(sink,
                "fin_eff_array: eta_f = {:.6g}, A_fins = {:.6g} m^2, A_total = {:.6g} m^2; needs "
                "0 <= eta_f <= 1, A_total > 0, 0 <= A_fins <= A_total",
                eta_f, a_fins, a_total);
  }
  return 1.0 - a_fins / a_total * (1.0 - eta_f);
}

void RegisterFins(std::vector<FunctionInfo>& out) {
  constexpr const char* kSource =
      "thin-fin theory as in Incropera, DeWitt, Bergman & Lavine, Fundamentals of Heat and Mass "
      "Transfer, ch. 3";
  out.push_back({
      .name = "fin_m",
      .family = "fins",
      .args = {{"h", dim::kHeatTransferCoeff},
               {"P", dim::kLength},
               {"k", dim::kConductivity},
               {"A_c", dim::kArea}},
      .result = dim::kPerLength,
      .formula = "m = sqrt(h*P/(k*A_c))",
      .source = kSource,
      .validity = "uniform cross-section, one-dimensional conduction along the fin; error unless "
                  "h >= 0, P > 0, k > 0, A_c > 0",
      .example = "m_pin = fin_m(45 W/(m^2*K), 9.4 mm, 205 W/(m*K), 7.07 mm^2)",
      .spreadsheet = "SQRT({0}*{1}/({2}*{3}))",
      .fn = [](const double* a, Sink& s) { return FinM(a[0], a[1], a[2], a[3], s); },
  });
  out.push_back({
      .name = "fin_m_thin",
      .family = "fins",
      .args = {{"h", dim::kHeatTransferCoeff}, {"k", dim::kConductivity}, {"t", dim::kLength}},
      .result = dim::kPerLength,
      .formula = "m = sqrt(2*h/(k*t))",
      .source = kSource,
      .validity = "thin plate fin, t much smaller than the fin width (edges neglected); error "
                  "unless h >= 0, k > 0, t > 0",
      .example = "m_f = fin_m_thin(55 W/(m^2*K), 205 W/(m*K), 0.2 mm)",
      .spreadsheet = "SQRT(2*{0}/({1}*{2}))",
      .fn = [](const double* a, Sink& s) { return FinMThin(a[0], a[1], a[2], s); },
  });
  out.push_back({
      .name = "fin_eff_adiabatic",
      .family = "fins",
      .args = {{"m", dim::kPerLength}, {"L", dim::kLength}},
      .result = dim::kOne,
      .formula = "eta = tanh(m*L)/(m*L)",
      .source = kSource,
      .validity = "uniform fin, adiabatic tip; eta -> 1 as m*L -> 0; error unless m >= 0, L > 0",
      .example = "eta_f = fin_eff_adiabatic(m_f, 12 mm)",
      .spreadsheet = "IF({0}*{1}=0,1,TANH({0}*{1})/({0}*{1}))",
      .fn = [](const double* a, Sink& s) { return FinEffAdiabatic(a[0], a[1], s); },
  });
  out.push_back({
      .name = "fin_eff_rect",
      .family = "fins",
      .args = {{"h", dim::kHeatTransferCoeff},
               {"k", dim::kConductivity},
               {"t", dim::kLength},
               {"L", dim::kLength}},
      .result = dim::kOne,
      .formula = "eta = tanh(m*L_c)/(m*L_c), m = sqrt(2*h/(k*t)), L_c = L + t/2",
      .source = kSource,
      .validity = "straight rectangular fin, t much smaller than the width, convecting tip via the "
                  "corrected length; error unless h >= 0, k > 0, t > 0, L > 0",
      .example = "eta_f = fin_eff_rect(55 W/(m^2*K), 205 W/(m*K), 0.2 mm, 9 mm)",
      .spreadsheet = "IF({0}=0,1,TANH(SQRT(2*{0}/({1}*{2}))*({3}+{2}/2))"
                     "/(SQRT(2*{0}/({1}*{2}))*({3}+{2}/2)))",
      .fn = [](const double* a, Sink& s) { return FinEffRect(a[0], a[1], a[2], a[3], s); },
  });
  out.push_back({
      .name = "fin_eff_pin",
      .family = "fins",
      .args = {{"h", dim::kHeatTransferCoeff},
               {"k", dim::kConductivity},
               {"D", dim::kLength},
               {"L", dim::kLength}},
      .result = dim::kOne,
      .formula = "eta = tanh(m*L_c)/(m*L_c), m = sqrt(4*h/(k*D)), L_c = L + D/4",
      .source = kSource,
      .validity = "pin fin, convecting tip via the corrected length; error unless h >= 0, k > 0, "
                  "D > 0, L > 0",
      .example = "eta_pin = fin_eff_pin(80 W/(m^2*K), 180 W/(m*K), 3 mm, 25 mm)",
      .spreadsheet = "IF({0}=0,1,TANH(SQRT(4*{0}/({1}*{2}))*({3}+{2}/4))"
                     "/(SQRT(4*{0}/({1}*{2}))*({3}+{2}/4)))",
      .fn = [](const double* a, Sink& s) { return FinEffPin(a[0], a[1], a[2], a[3], s); },
  });
  out.push_back({
      .name = "fin_eff_annular",
      .family = "fins",
      .args = {{"h", dim::kHeatTransferCoeff},
               {"k", dim::kConductivity},
               {"t", dim::kLength},
               {"r_1", dim::kLength},
               {"r_2", dim::kLength}},
      .result = dim::kOne,
      .formula = "eta = 2*r_1/(m*(r_2c^2 - r_1^2)) * [K1(m*r_1)*I1(m*r_2c) - "
                 "I1(m*r_1)*K1(m*r_2c)] / [I0(m*r_1)*K1(m*r_2c) + K0(m*r_1)*I1(m*r_2c)], "
                 "m = sqrt(2*h/(k*t)), r_2c = r_2 + t/2",
      .source = "exact annular-fin solution in modified Bessel functions (Gardner 1945), as in "
                "Incropera, DeWitt, Bergman & Lavine, Fundamentals of Heat and Mass Transfer, "
                "table 3.5",
      .validity = "annular fin of constant thickness, t much smaller than r_2 - r_1, convecting "
                  "tip via r_2c; error unless h >= 0, k > 0, t > 0, r_2 > r_1 > 0",
      .example = "eta_f = fin_eff_annular(60 W/(m^2*K), 205 W/(m*K), 0.4 mm, 12.7 mm, 28 mm)",
      .spreadsheet =
          "IF({0}=0,1,2*{3}/(SQRT(2*{0}/({1}*{2}))*(({4}+{2}/2)^2-{3}^2))"
          "*(BESSELK(SQRT(2*{0}/({1}*{2}))*{3},1)*BESSELI(SQRT(2*{0}/({1}*{2}))*({4}+{2}/2),1)"
          "-BESSELI(SQRT(2*{0}/({1}*{2}))*{3},1)*BESSELK(SQRT(2*{0}/({1}*{2}))*({4}+{2}/2),1))"
          "/(BESSELI(SQRT(2*{0}/({1}*{2}))*{3},0)*BESSELK(SQRT(2*{0}/({1}*{2}))*({4}+{2}/2),1)"
          "+BESSELK(SQRT(2*{0}/({1}*{2}))*{3},0)*BESSELI(SQRT(2*{0}/({1}*{2}))*({4}+{2}/2),1)))",
      .fn = [](const double* a, Sink& s) { return FinEffAnnular(a[0], a[1], a[2], a[3], a[4], s); },
  });
  out.push_back({
      .name = "fin_eff_array",
      .family = "fins",
      .args = {{"eta_f", dim::kOne}, {"A_fins", dim::kArea}, {"A_total", dim::kArea}},
      .result = dim::kOne,
      .formula = "eta_o = 1 - (A_fins/A_total)*(1 - eta_f)",
      .source = "heat balance of a finned surface (overall surface efficiency), as in Incropera, "
                "DeWitt, Bergman & Lavine, Fundamentals of Heat and Mass Transfer, ch. 3",
      .validity = "fins and prime surface at one h; error unless 0 <= eta_f <= 1, A_total > 0, "
                  "0 <= A_fins <= A_total",
      .example = "eta_o = fin_eff_array(eta_f, 11.6 m^2, 12.9 m^2)",
      .spreadsheet = "1-{1}/{2}*(1-{0})",
      .fn = [](const double* a, Sink& s) { return FinEffArray(a[0], a[1], a[2], s); },
  });
}

}  // namespace heatdeck::library
