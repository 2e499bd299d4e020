// Family 'water' of the heat-transfer library (LIBRARY.md "Fluid properties").
//
// Written by hand because no Debian C++ library provides IAPWS-IF97 together
// with the IAPWS 2008/2011 transport correlations; the formulations are
// short, closed-form and fully specified by their releases.
#include "library/water.h"

#include <array>
#include <cmath>
#include <numbers>
#include <string>

#include <fmt/format.h>

#include "library/registry.h"

namespace heatdeck::library {
namespace water {
namespace {

// IAPWS-IF97 region 1, R7-97(2012) Table 2: exponents I, J and coefficients n.
constexpr int kRegion1Terms = 34;
constexpr std::array<int, kRegion1Terms> kI1 = {0, 0, 0, 0, 0,  0,  0,  0,  1,  1, 1, 1,
                                                1, 1, 2, 2, 2,  2,  2,  3,  3,  3, 4, 4,
                                                4, 5, 8, 8, 21, 23, 29, 30, 31, 32};
constexpr std::array<int, kRegion1Terms> kJ1 = {
    -2, -1, 0,  1, 2, 3,  4,  5,  -9, -7,  -1, 0,   1,   3,   -3,  0,   1,
    3,  17, -4, 0, 6, -5, -2, 10, -8, -11, -6, -29, -31, -38, -39, -40, -41};
constexpr std::array<double, kRegion1Terms> kN1 = {
    0.14632971213167,      -0.84548187169114,    -0.37563603672040e1,   0.33855169168385e1,
    -0.95791963387872,     0.15772038513228,     -0.16616417199501e-1,  0.81214629983568e-3,
    0.28319080123804e-3,   -0.60706301565874e-3, -0.18990068218419e-1,  -0.32529748770505e-1,
    -0.21841717175414e-1,  -0.52838357969930e-4, -0.47184321073267e-3,  -0.30001780793026e-3,
    0.47661393906987e-4,   -0.44141845330846e-5, -0.72694996297594e-15, -0.31679644845054e-4,
    -0.28270797985312e-5,  -0.85205128120103e-9, -0.22425281908000e-5,  -0.65171222895601e-6,
    -0.14341729937924e-12, -0.40516996860117e-6, -0.12734301741641e-8,  -0.17424871230634e-9,
    -0.68762131295531e-18, 0.14478307828521e-19, 0.26335781662795e-22,  -0.11947622640071e-22,
    0.18228094581404e-23,  -0.93537087292458e-25};
constexpr double kR = 461.526;            // J/(kg*K), IF97 specific gas constant
constexpr double kPStar1 = 16.53e6;       // Pa
constexpr double kTStar1 = 1386.0;        // K
constexpr int kMaxI = 32;                 // largest I
constexpr int kMinJ = -41;                // smallest J
constexpr int kMaxJ = 17;                 // largest J
constexpr int kTauOffset = -(kMinJ - 2);  // index of tau-power 0 (J - 2 is the lowest needed)

// IAPWS-IF97 region 4, R7-97(2012) Table 34.
constexpr std::array<double, 11> kN4 = {0.0,
                                        0.11670521452767e4,
                                        -0.72421316703206e6,
                                        -0.17073846940092e2,
                                        0.12020824702470e5,
                                        -0.32325550322333e7,
                                        0.14915108613530e2,
                                        -0.48232657361591e4,
                                        0.40511340542057e6,
                                        -0.23855557567849,
                                        0.65017534844798e3};

// Reference constants of R12-08 and R15-11.
constexpr double kTc = 647.096;   // K
constexpr double kRhoc = 322.0;   // kg/m^3
constexpr double kPc = 22.064e6;  // Pa

// R12-08 Table 1 (mu0) and Table 2 (mu1, rows i = 0..5, columns j = 0..6).
constexpr std::array<double, 4> kH0 = {1.67752, 2.20462, 0.6366564, -0.241605};
constexpr double kH1[6][7] = {
    {5.20094e-1, 2.22531e-1, -2.81378e-1, 1.61913e-1, -3.25372e-2, 0.0, 0.0},
    {8.50895e-2, 9.99115e-1, -9.06851e-1, 2.57399e-1, 0.0, 0.0, 0.0},
    {-1.08374, 1.88797, -7.72479e-1, 0.0, 0.0, 0.0, 0.0},
    {-2.89555e-1, 1.26613, -4.89837e-1, 0.0, 6.98452e-2, 0.0, -4.35673e-3},
    {0.0, 0.0, -2.57040e-1, 0.0, 0.0, 8.72102e-3, 0.0},
    {0.0, 1.20573e-1, 0.0, 0.0, 0.0, 0.0, -5.93264e-4}};

// R15-11 Table 1 (lambda0) and Table 2 (lambda1, rows i = 0..4, columns j = 0..5).
constexpr std::array<double, 5> kL0 = {2.443221e-3, 1.323095e-2, 6.770357e-3, -3.454586e-3,
                                       4.096266e-4};
constexpr double kL1[5][6] = {
    {1.60397357, -0.646013523, 0.111443906, 0.102997357, -0.0504123634, 0.00609859258},
    {2.33771842, -2.78843778, 1.53616167, -0.463045512, 0.0832827019, -0.00719201245},
    {2.19650529, -4.54580785, 3.55777244, -1.40944978, 0.275418278, -0.0205938816},
    {-1.21051378, 1.60812989, -0.621178141, 0.0716373224, 0.0, 0.0},
    {-2.7203370, 4.57586331, -3.18369245, 1.1168348, -0.19268305, 0.012913842}};

// R15-11 critical-region constants.
constexpr double kLambda = 177.8514;
constexpr double kQdInv = 0.40;  // nm
constexpr double kXi0 = 0.13;    // nm
constexpr double kGamma0 = 0.06;
constexpr double kNu = 0.630;
constexpr double kGammaExp = 1.239;
constexpr double kTRef = 1.5;       // reduced reference temperature
constexpr double kR15 = 461.51805;  // J/(kg*K), the specific gas constant R15-11 uses

// R15-11 industrial-use polynomial for zeta at the reference temperature:
// zeta_REF = 1 / sum_i a_ij delta^i, one coefficient row per density interval
// (upper bounds in kDeltaBounds, the last row beyond).
constexpr std::array<double, 4> kDeltaBounds = {0.310559006, 0.776397516, 1.242236025, 1.863354037};
constexpr double kZetaRef[5][6] = {{6.53786807199516, -5.61149954923348, 3.39624167361325,
                                    -2.27492629730878, 10.2631854662709, 1.97815050331519},
                                   {6.52717759281799, -6.30816983387575, 8.08379285492595,
                                    -9.82240510197603, 12.1358413791395, -5.54349664571295},
                                   {5.35500529896124, -3.96415689925446, 8.91990208918795,
                                    -12.0338729505790, 9.19494865194302, -2.16866274479712},
                                   {1.55225959906681, 0.464621290821181, 8.93237374861479,
                                    -11.0321960061126, 6.16780999933360, -0.965458722086812},
                                   {1.11999926419994, 0.595748562571649, 9.88952565078920,
                                    -10.3255051147040, 4.66861294457414, -0.503243546373828}};

}  // namespace

Region1 If97Region1(double T, double p) {
  const double pi = p / kPStar1;
  const double tau = kTStar1 / T;
  const double a = 7.1 - pi;
  const double b = tau - 1.222;

  // Powers by repeated multiplication: the 34 terms need a^0..a^32 and
  // b^-43..b^17, and std::pow per term would dominate the cost of a call.
  std::array<double, kMaxI + 1> ap{};
  ap[0] = 1.0;
  for (int k = 1; k <= kMaxI; ++k) ap[k] = ap[k - 1] * a;
  std::array<double, kTauOffset + kMaxJ + 1> bp{};
  bp[kTauOffset] = 1.0;
  for (int k = 1; k <= kMaxJ; ++k) bp[kTauOffset + k] = bp[kTauOffset + k - 1] * b;
  const double binv = 1.0 / b;
  for (int k = 1; k <= kTauOffset; ++k) bp[kTauOffset - k] = bp[kTauOffset - k + 1] * binv;

  double g = 0, g_p = 0, g_pp = 0, g_t = 0, g_tt = 0, g_pt = 0;
  for (int k = 0; k < kRegion1Terms; ++k) {
    const int i = kI1[k];
    const int j = kJ1[k];
    const double n = kN1[k];
    const double bj = bp[kTauOffset + j];
    const double bj1 = bp[kTauOffset + j - 1];
    const double bj2 = bp[kTauOffset + j - 2];
    g += n * ap[i] * bj;
    g_t += n * ap[i] * j * bj1;
    g_tt += n * ap[i] * j * (j - 1) * bj2;
    if (i >= 1) {
      g_p -= n * i * ap[i - 1] * bj;
      g_pt -= n * i * ap[i - 1] * j * bj1;
    }
    if (i >= 2) g_pp += n * i * (i - 1) * ap[i - 2] * bj;
  }

  Region1 r;
  const double rt = kR * T;
  r.v = pi * g_p * rt / p;
  r.h = tau * g_t * rt;
  r.u = rt * (tau * g_t - pi * g_p);
  r.s = kR * (tau * g_t - g);
  r.cp = -kR * tau * tau * g_tt;
  const double x = g_p - tau * g_pt;
  r.cv = kR * (-tau * tau * g_tt + x * x / g_pp);
  r.w = std::sqrt(rt * g_p * g_p / (x * x / (tau * tau * g_tt) - g_pp));
  // v = (R T / p*) gamma_pi, so (dv/dp)_T = R T gamma_pipi / p*^2.
  const double rho = 1.0 / r.v;
  r.drho_dp = -rho * rho * rt * g_pp / (kPStar1 * kPStar1);
  return r;
}

double SaturationPressure(double T) {
  const double theta = T + kN4[9] / (T - kN4[10]);
  const double a = theta * theta + kN4[1] * theta + kN4[2];
  const double b = kN4[3] * theta * theta + kN4[4] * theta + kN4[5];
  const double c = kN4[6] * theta * theta + kN4[7] * theta + kN4[8];
  const double q = 2.0 * c / (-b + std::sqrt(b * b - 4.0 * a * c));
  const double q2 = q * q;
  return q2 * q2 * 1e6;
}

double SaturationTemperature(double p) {
  const double beta = std::sqrt(std::sqrt(p / 1e6));
  const double e = beta * beta + kN4[3] * beta + kN4[6];
  const double f = kN4[1] * beta * beta + kN4[4] * beta + kN4[7];
  const double g = kN4[2] * beta * beta + kN4[5] * beta + kN4[8];
  const double d = 2.0 * g / (-f - std::sqrt(f * f - 4.0 * e * g));
  const double s = kN4[10] + d;
  return (s - std::sqrt(s * s - 4.0 * (kN4[9] + kN4[10] * d))) / 2.0;
}

double Viscosity(double rho, double T) {
  const double t = T / kTc;
  const double d = rho / kRhoc;
  double sum0 = 0;
  double tinv_i = 1.0;
  for (double h : kH0) {
    sum0 += h * tinv_i;
    tinv_i /= t;
  }
  const double mu0 = 100.0 * std::sqrt(t) / sum0;
  const double x = 1.0 / t - 1.0;
  const double y = d - 1.0;
  double sum1 = 0;
  double xi = 1.0;
  for (const auto& row : kH1) {
    double inner = 0;
    double yj = 1.0;
    for (double h : row) {
      inner += h * yj;
      yj *= y;
    }
    sum1 += xi * inner;
    xi *= x;
  }
  const double mu1 = std::exp(d * sum1);
  return mu0 * mu1 * 1e-6;
}

double ConductivityBackground(double rho, double T) {
  const double t = T / kTc;
  const double d = rho / kRhoc;
  double sum0 = 0;
  double tinv_k = 1.0;
  for (double l : kL0) {
    sum0 += l * tinv_k;
    tinv_k /= t;
  }
  const double lambda0 = std::sqrt(t) / sum0;
  const double x = 1.0 / t - 1.0;
  const double y = d - 1.0;
  double sum1 = 0;
  double xi = 1.0;
  for (const auto& row : kL1) {
    double inner = 0;
    double yj = 1.0;
    for (double l : row) {
      inner += l * yj;
      yj *= y;
    }
    sum1 += xi * inner;
    xi *= x;
  }
  const double lambda1 = std::exp(d * sum1);
  return lambda0 * lambda1 * 1e-3;
}

double ConductivityCriticalEnhancement(double rho, double T, double cp, double cv, double mu,
                                       double drho_dp) {
  const double t = T / kTc;
  const double d = rho / kRhoc;
  int row = 0;
  while (row < static_cast<int>(kDeltaBounds.size()) && d > kDeltaBounds[row]) ++row;
  double poly = 0;
  double dk = 1.0;
  for (double a : kZetaRef[row]) {
    poly += a * dk;
    dk *= d;
  }
  const double zeta_ref = 1.0 / poly;
  const double zeta = kPc / kRhoc * drho_dp;
  const double dchi = d * (zeta - zeta_ref * kTRef / t);
  if (!(dchi > 0)) return 0.0;
  const double xi = kXi0 * std::pow(dchi / kGamma0, kNu / kGammaExp);
  const double y = xi / kQdInv;
  // R15-11 sets Z = 0 below y = 1.2e-7, where the bracket loses all digits.
  if (y < 1.2e-7) return 0.0;
  const double kappa_inv = cv / cp;
  const double z = 2.0 / (std::numbers::pi * y) *
                   ((1.0 - kappa_inv) * std::atan(y) + kappa_inv * y -
                    (1.0 - std::exp(-1.0 / (1.0 / y + y * y / (3.0 * d * d)))));
  const double lambda2 = kLambda * d * (cp / kR15) * t / (mu / 1e-6) * z;
  return lambda2 * 1e-3;
}

}  // namespace water

namespace {

constexpr double kTMin = 273.15;        // K, IF97 lower bound
constexpr double kTMaxLiquid = 623.15;  // K, region 1 upper bound
constexpr double kTCrit = 647.096;      // K
constexpr double kPMax = 100e6;         // Pa
constexpr double kPCrit = 22.064e6;     // Pa

// v as text with the fewest significant digits, at least min_digits, that
// tell it apart from the limit it broke, so that 623.1500001 K does not read
// as the limit 623.15 K itself.
std::string Distinct(double v, double limit, int min_digits) {
  std::string text;
  for (int digits = min_digits; digits <= 17; ++digits) {
    text = fmt::format("{:.{}g}", v, digits);
    if (text != fmt::format("{:.{}g}", limit, digits)) break;
  }
  return text;
}

// A pressure for people: Pa below 10 kPa, then kPa, then MPa; 4 significant
// digits, or more where needed to tell it from limit (pass limit = NaN when
// there is none).
std::string PressureText(double p, double limit) {
  const double a = std::fabs(p);
  const double scale = a >= 1e6 ? 1e6 : (a >= 1e4 ? 1e3 : 1.0);
  const char* unit = a >= 1e6 ? "MPa" : (a >= 1e4 ? "kPa" : "Pa");
  return fmt::format("{} {}", Distinct(p / scale, limit / scale, 4), unit);
}

// Checks the liquid-water range of LIBRARY.md; on failure reports an error
// naming the values and returns false.
bool CheckLiquid(double T, double p, Sink& sink) {
  if (!(T >= kTMin && T <= kTMaxLiquid)) {
    sink.Error(fmt::format(
        "T = {} K is outside the liquid-water range 273.15 K ... 623.15 K (IAPWS-IF97 region 1)",
        Distinct(T, T < kTMin ? kTMin : kTMaxLiquid, 6)));
    return false;
  }
  if (!(p <= kPMax)) {
    sink.Error(
        fmt::format("p = {} is outside the liquid-water range (p <= 100 MPa, IAPWS-IF97 region 1)",
                    PressureText(p, kPMax)));
    return false;
  }
  const double psat = water::SaturationPressure(T);
  if (!(p >= psat)) {
    // p as given, in Pa; when it lies close under p_sat both get the digits
    // that show the difference.
    const std::string p_text = Distinct(p, psat, 6);
    const std::string psat_text = p_text == fmt::format("{:.6g}", p)
                                      ? PressureText(psat, std::nan(""))
                                      : Distinct(psat, p, 6) + " Pa";
    sink.Error(fmt::format("water is vapour at {:g} K, {} Pa (p_sat = {})", T, p_text, psat_text));
    return false;
  }
  return true;
}

struct LiquidState {
  double rho;
  double cp;
  double mu;
  double k;
};

LiquidState Liquid(double T, double p) {
  const water::Region1 r = water::If97Region1(T, p);
  LiquidState s;
  s.rho = 1.0 / r.v;
  s.cp = r.cp;
  s.mu = water::Viscosity(s.rho, T);
  s.k = water::ConductivityBackground(s.rho, T) +
        water::ConductivityCriticalEnhancement(s.rho, T, r.cp, r.cv, s.mu, r.drho_dp);
  return s;
}

double WaterRho(const double* a, Sink& sink) {
  if (!CheckLiquid(a[0], a[1], sink)) return std::nan("");
  return 1.0 / water::If97Region1(a[0], a[1]).v;
}

double WaterCp(const double* a, Sink& sink) {
  if (!CheckLiquid(a[0], a[1], sink)) return std::nan("");
  return water::If97Region1(a[0], a[1]).cp;
}

double WaterMu(const double* a, Sink& sink) {
  if (!CheckLiquid(a[0], a[1], sink)) return std::nan("");
  const double rho = 1.0 / water::If97Region1(a[0], a[1]).v;
  return water::Viscosity(rho, a[0]);
}

double WaterK(const double* a, Sink& sink) {
  if (!CheckLiquid(a[0], a[1], sink)) return std::nan("");
  return Liquid(a[0], a[1]).k;
}

double WaterPr(const double* a, Sink& sink) {
  if (!CheckLiquid(a[0], a[1], sink)) return std::nan("");
  const LiquidState s = Liquid(a[0], a[1]);
  return s.cp * s.mu / s.k;
}

double WaterPsat(const double* a, Sink& sink) {
  const double T = a[0];
  if (!(T >= kTMin && T <= kTCrit)) {
    sink.Error(fmt::format(
        "T = {} K is outside the saturation line 273.15 K ... 647.096 K (IAPWS-IF97 region 4)",
        Distinct(T, T < kTMin ? kTMin : kTCrit, 6)));
    return std::nan("");
  }
  return water::SaturationPressure(T);
}

double WaterTsat(const double* a, Sink& sink) {
  const double p = a[0];
  static const double p_min = water::SaturationPressure(kTMin);
  if (!(p >= p_min && p <= kPCrit)) {
    sink.Error(
        fmt::format("p = {} is outside the saturation line 611.213 Pa ... 22.064 MPa "
                    "(IAPWS-IF97 region 4)",
                    PressureText(p, p < p_min ? p_min : kPCrit)));
    return std::nan("");
  }
  return water::SaturationTemperature(p);
}

constexpr const char* kIf97Source =
    "IAPWS R7-97(2012), Revised Release on the IAPWS Industrial Formulation 1997 for the "
    "Thermodynamic Properties of Water and Steam";
constexpr const char* kLiquidValidity =
    "273.15 K <= T <= 623.15 K and p_sat(T) <= p <= 100 MPa (liquid water, IAPWS-IF97 region 1); "
    "error outside (\"water is vapour at ...\" below p_sat)";

std::vector<ArgSpec> TpArgs() {
  return {{"T", units::dim::kTemperature, units::TempKind::kAbsolute},
          {"p", units::dim::kPressure}};
}

}  // namespace

void RegisterWater(std::vector<FunctionInfo>& out) {
  using units::TempKind;
  namespace dim = units::dim;
  out.push_back({"water_rho", "water", TpArgs(), dim::kDensity, TempKind::kNone,
                 "rho = 1/v, v = (R*T/p)*pi*dgamma/dpi of the IF97 region-1 Gibbs energy "
                 "gamma(pi, tau), pi = p/16.53 MPa, tau = 1386 K/T",
                 kIf97Source, kLiquidValidity, "rho_cw = water_rho(305 K, 4.5 bar)", nullptr,
                 WaterRho});
  out.push_back({"water_cp", "water", TpArgs(), dim::kSpecificHeat, TempKind::kNone,
                 "cp = -R*tau^2*d2gamma/dtau2 of the IF97 region-1 Gibbs energy", kIf97Source,
                 kLiquidValidity, "cp_cw = water_cp(305 K, 4.5 bar)", nullptr, WaterCp});
  out.push_back({"water_mu", "water", TpArgs(), dim::kViscosity, TempKind::kNone,
                 "mu = mu0(T)*mu1(rho, T) (mu2 = 1, no critical enhancement) at the IF97 "
                 "region-1 density",
                 "IAPWS R12-08, Release on the IAPWS Formulation 2008 for the Viscosity of "
                 "Ordinary Water Substance (industrial use, mu2 = 1); density from IAPWS-IF97",
                 kLiquidValidity, "mu_cw = water_mu(305 K, 4.5 bar)", nullptr, WaterMu});
  out.push_back({"water_k", "water", TpArgs(), dim::kConductivity, TempKind::kNone,
                 "k = lambda0(T)*lambda1(rho, T) + lambda2(rho, T, cp, cv, mu, (drho/dp)_T) "
                 "with rho, cp, cv, (drho/dp)_T from IF97 region 1 and zeta at 1.5*T_c from "
                 "the industrial-use polynomial",
                 "IAPWS R15-11, Release on the IAPWS Formulation 2011 for the Thermal "
                 "Conductivity of Ordinary Water Substance (industrial-use route with "
                 "IAPWS-IF97)",
                 kLiquidValidity, "k_cw = water_k(305 K, 4.5 bar)", nullptr, WaterK});
  out.push_back({"water_pr", "water", TpArgs(), dim::kOne, TempKind::kNone,
                 "Pr = cp*mu/k with water_cp, water_mu, water_k",
                 "IAPWS R7-97(2012) (cp), IAPWS R12-08 (mu), IAPWS R15-11 (k)", kLiquidValidity,
                 "Pr_cw = water_pr(305 K, 4.5 bar)", nullptr, WaterPr});
  out.push_back({"water_psat",
                 "water",
                 {{"T", dim::kTemperature, TempKind::kAbsolute}},
                 dim::kPressure,
                 TempKind::kNone,
                 "p_sat = (2C/(-B + sqrt(B^2 - 4AC)))^4 MPa, A, B, C quadratic in "
                 "theta = T + n9/(T - n10)",
                 "IAPWS R7-97(2012), region 4 saturation-pressure equation (Eq. 30)",
                 "273.15 K <= T <= 647.096 K; error outside",
                 "p_drum = water_psat(180 degC)",
                 nullptr,
                 WaterPsat});
  out.push_back({"water_tsat",
                 "water",
                 {{"p", dim::kPressure}},
                 dim::kTemperature,
                 TempKind::kAbsolute,
                 "T_sat = (n10 + D - sqrt((n10 + D)^2 - 4(n9 + n10*D)))/2 K, D from "
                 "E, F, G quadratic in beta = (p/1 MPa)^(1/4)",
                 "IAPWS R7-97(2012), region 4 saturation-temperature equation (Eq. 31)",
                 "611.213 Pa (p_sat at 273.15 K) <= p <= 22.064 MPa; error outside",
                 "T_cond = water_tsat(0.12 bar)",
                 nullptr,
                 WaterTsat});
}

}  // namespace heatdeck::library
