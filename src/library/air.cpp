// Family 'air' of the heat-transfer library (LIBRARY.md "Fluid properties").
//
// The properties take T only, so they are the zero-density forms of the
// published air correlations; their density-dependent parts change the 1 atm
// values by less than the 1 % the library promises (see air.h).  Written by
// hand: the formulas are a few closed-form lines.
#include "library/air.h"

#include <array>
#include <cmath>
#include <string>

#include <fmt/format.h>

#include "library/registry.h"

namespace heatdeck::library {
namespace air {
namespace {

constexpr double kMolarMass = 28.9586e-3;  // kg/mol, Lemmon et al. 2000

// Lemmon et al. 2000, ideal-gas Helmholtz energy of air:
// N1..N13, with their molar gas constant and reducing temperature.
constexpr double kN1 = 0.6057194e-7;
constexpr double kN2 = -0.210274769e-4;
constexpr double kN3 = -0.158860716e-3;
constexpr double kN6 = -0.195363420e-3;
constexpr double kN7 = 2.490888032;
constexpr double kN8 = 0.791309509;
constexpr double kN9 = 0.212236768;
constexpr double kN10 = -0.197938904;
constexpr double kN11 = 25.36365;
constexpr double kN12 = 16.90741;
constexpr double kN13 = 87.31279;
constexpr double kTj = 132.6312;      // K
constexpr double kRLemmon = 8.31451;  // J/(mol*K), as used by Lemmon et al. 2000

// Lemmon & Jacobsen 2004, air: Lennard-Jones parameters and collision-
// integral coefficients b0..b4, and the dilute-gas conductivity terms.
constexpr double kEpsK = 103.3;   // K
constexpr double kSigma = 0.360;  // nm
constexpr std::array<double, 5> kB = {0.431, -0.4623, 0.08406, 0.005341, -0.00331};
constexpr double kLn1 = 1.308;
constexpr double kLn2 = 1.405;
constexpr double kLt2 = -1.1;
constexpr double kLn3 = -1.036;
constexpr double kLt3 = -0.3;

// u^2 e^-u / (1 - e^-u)^2, the Planck-Einstein heat-capacity term.
double Einstein(double u) {
  const double e = std::exp(-u);
  const double d = 1.0 - e;
  return u * u * e / (d * d);
}

// Dilute-gas viscosity in uPa*s, the unit of the Lemmon & Jacobsen formulas.
double Eta0Micro(double T) {
  const double ln_t = std::log(T / kEpsK);
  double ln_omega = 0;
  double pow_i = 1.0;
  for (double b : kB) {
    ln_omega += b * pow_i;
    pow_i *= ln_t;
  }
  return 0.0266958 * std::sqrt(kMolarMass * 1e3 * T) / (kSigma * kSigma * std::exp(ln_omega));
}

}  // namespace

double IdealGasCp(double T) {
  const double r = T / kTj;
  double cp_r = 1.0 + kN7 - 12.0 * kN1 * r * r * r - 6.0 * kN2 * r * r - 2.0 * kN3 * r -
                0.75 * kN6 * std::pow(1.0 / r, 1.5) + kN8 * Einstein(kN11 / r) +
                kN9 * Einstein(kN12 / r);
  const double u = kN13 / r;
  const double e = std::exp(-u);
  const double d = (2.0 / 3.0) * e + 1.0;
  cp_r -= kN10 * u * u * (2.0 / 3.0) * e / (d * d);
  return cp_r * kRLemmon / kMolarMass;
}

double DiluteViscosity(double T) { return Eta0Micro(T) * 1e-6; }

double DiluteConductivity(double T) {
  const double tau = kTj / T;
  const double lambda0 =
      kLn1 * Eta0Micro(T) + kLn2 * std::pow(tau, kLt2) + kLn3 * std::pow(tau, kLt3);
  return lambda0 * 1e-3;
}

}  // namespace air

namespace {

constexpr double kTMin = 200.0;
constexpr double kTMax = 1000.0;
constexpr double kRu = 8.314462618;  // J/(mol*K), 2019 SI value to 10 digits
constexpr double kM = 28.9586e-3;    // kg/mol

bool CheckT(double T, Sink& sink) {
  if (T >= kTMin && T <= kTMax) return true;
  sink.Error(fmt::format("T = {:g} K is outside the air-property range 200 K ... 1000 K", T));
  return false;
}

double AirRho(const double* a, Sink& sink) {
  if (!CheckT(a[0], sink)) return std::nan("");
  if (!(a[1] > 0)) {
    sink.Error(fmt::format("p = {:g} Pa: air density needs a positive absolute pressure", a[1]));
    return std::nan("");
  }
  return a[1] * kM / (kRu * a[0]);
}

double AirCp(const double* a, Sink& sink) {
  if (!CheckT(a[0], sink)) return std::nan("");
  return air::IdealGasCp(a[0]);
}

double AirMu(const double* a, Sink& sink) {
  if (!CheckT(a[0], sink)) return std::nan("");
  return air::DiluteViscosity(a[0]);
}

double AirK(const double* a, Sink& sink) {
  if (!CheckT(a[0], sink)) return std::nan("");
  return air::DiluteConductivity(a[0]);
}

double AirPr(const double* a, Sink& sink) {
  if (!CheckT(a[0], sink)) return std::nan("");
  const double T = a[0];
  return air::IdealGasCp(T) * air::DiluteViscosity(T) / air::DiluteConductivity(T);
}

// Spreadsheet forms of the same closed formulas, {0} standing for T in K.
// The collision integral's polynomial in ln(T/103.3) is written out.
#define HD_AIR_ETA0_MICRO                                              \
  "0.0266958*SQRT(28.9586*{0})/(0.36^2*EXP(0.431-0.4623*LN({0}/103.3)" \
  "+0.08406*LN({0}/103.3)^2+0.005341*LN({0}/103.3)^3-0.00331*LN({0}/103.3)^4))"
constexpr const char* kSheetMu = "1E-6*" HD_AIR_ETA0_MICRO;
constexpr const char* kSheetK =
    "1E-3*(1.308*" HD_AIR_ETA0_MICRO "+1.405*({0}/132.6312)^1.1-1.036*({0}/132.6312)^0.3)";
#define HD_AIR_CP                                                            \
  "8.31451/0.0289586*(1+2.490888032-12*0.6057194E-7*({0}/132.6312)^3"        \
  "+6*0.210274769E-4*({0}/132.6312)^2+2*0.158860716E-3*({0}/132.6312)"       \
  "+0.75*0.19536342E-3*(132.6312/{0})^1.5"                                   \
  "+0.791309509*(25.36365*132.6312/{0})^2*EXP(-25.36365*132.6312/{0})"       \
  "/(1-EXP(-25.36365*132.6312/{0}))^2"                                       \
  "+0.212236768*(16.90741*132.6312/{0})^2*EXP(-16.90741*132.6312/{0})"       \
  "/(1-EXP(-16.90741*132.6312/{0}))^2"                                       \
  "+0.197938904*(87.31279*132.6312/{0})^2*(2/3)*EXP(-87.31279*132.6312/{0})" \
  "/((2/3)*EXP(-87.31279*132.6312/{0})+1)^2)"
constexpr const char* kSheetCp = HD_AIR_CP;
constexpr const char* kSheetPr =
    "(" HD_AIR_CP ")*(1E-6*" HD_AIR_ETA0_MICRO ")/(1E-3*(1.308*" HD_AIR_ETA0_MICRO
    "+1.405*({0}/132.6312)^1.1-1.036*({0}/132.6312)^0.3))";
#undef HD_AIR_CP
#undef HD_AIR_ETA0_MICRO

constexpr const char* kValidity = "200 K <= T <= 1000 K; error outside";
constexpr const char* kLemmon2000 =
    "Lemmon, Jacobsen, Penoncello & Friend (2000), J. Phys. Chem. Ref. Data 29(3) 331, "
    "ideal-gas heat capacity of air";
constexpr const char* kLemmonJacobsen =
    "Lemmon & Jacobsen (2004), Int. J. Thermophys. 25(1) 21, air";

std::vector<ArgSpec> TArgs() {
  return {{"T", units::dim::kTemperature, units::TempKind::kAbsolute}};
}

}  // namespace

void RegisterAir(std::vector<FunctionInfo>& out) {
  using units::TempKind;
  namespace dim = units::dim;
  out.push_back({"air_rho",
                 "air",
                 {{"T", dim::kTemperature, TempKind::kAbsolute}, {"p", dim::kPressure}},
                 dim::kDensity,
                 TempKind::kNone,
                 "p*M/(R_u*T), M = 28.9586 g/mol, R_u = 8.314462618 J/(mol*K)",
                 "ideal-gas law; molar mass of dry air from Lemmon et al. (2000)",
                 "200 K <= T <= 1000 K and p > 0; error outside",
                 "rho_in = air_rho(35 degC, 101.3 kPa)",
                 "{1}*0.0289586/(8.314462618*{0})",
                 AirRho});
  out.push_back({"air_cp", "air", TArgs(), dim::kSpecificHeat, TempKind::kNone,
                 "cp0 = R*(1 + N7 - 12 N1 (T/Tj)^3 - 6 N2 (T/Tj)^2 - 2 N3 (T/Tj) - 0.75 N6 "
                 "(Tj/T)^1.5 + Planck-Einstein terms), Tj = 132.6312 K (ideal gas; within "
                 "0.5 % of the 1 atm real-gas value)",
                 kLemmon2000, kValidity, "cp_in = air_cp(35 degC)", kSheetCp, AirCp});
  out.push_back({"air_mu", "air", TArgs(), dim::kViscosity, TempKind::kNone,
                 "eta0 = 0.0266958*sqrt(M*T)/(sigma^2*Omega(T/103.3 K)) uPa*s, sigma = 0.360 "
                 "nm, ln Omega = sum b_i (ln T*)^i (dilute gas; within 0.2 % at 1 atm)",
                 kLemmonJacobsen, kValidity, "mu_in = air_mu(35 degC)", kSheetMu, AirMu});
  out.push_back({"air_k", "air", TArgs(), dim::kConductivity, TempKind::kNone,
                 "lambda0 = 1.308*eta0 + 1.405*tau^-1.1 - 1.036*tau^-0.3 mW/(m*K), tau = "
                 "132.6312 K/T (dilute gas; within 0.3 % at 1 atm)",
                 kLemmonJacobsen, kValidity, "k_in = air_k(35 degC)", kSheetK, AirK});
  out.push_back({"air_pr", "air", TArgs(), dim::kOne, TempKind::kNone,
                 "Pr = cp*mu/k with air_cp, air_mu, air_k",
                 "Lemmon et al. (2000) cp0; Lemmon & Jacobsen (2004) eta0, lambda0", kValidity,
                 "Pr_in = air_pr(35 degC)", kSheetPr, AirPr});
}

}  // namespace heatdeck::library
