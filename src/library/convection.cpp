// Family 'convection' of the heat-transfer library (LIBRARY.md).
#include "library/convection.h"
#include "library/fail.h"

#include <fmt/format.h>

#include <cmath>
#include <limits>
#include <utility>

namespace heatdeck::library {
namespace {

namespace dim = units::dim;

using detail::Fail;
using detail::kNaN;

constexpr const char* kDittusBoelter =
    "Dittus & Boelter 1930; validity as given by Incropera et al.";
constexpr const char* kSiederTate = "Sieder & Tate 1936";
constexpr const char* kPetukhov = "Petukhov 1970";
constexpr const char* kGnielinski = "Gnielinski 1976";
constexpr const char* kHausen = "Hausen 1943";
constexpr const char* kChurchillBernstein = "Churchill & Bernstein 1977";
constexpr const char* kChurchillChu = "Churchill & Chu 1975";

// Laminar and turbulent ends of the nu_tube transition (LIBRARY.md).
constexpr double kReLaminar = 2300.0;
constexpr double kReTurbulent = 10000.0;

template <typename... Args>
void Warn(Sink& sink, fmt::format_string<Args...> f, Args&&... args) {
  sink.Warning(fmt::format(f, std::forward<Args>(args)...));
}

// The bare formulas, shared by the checked entry points and by NuTube, which
// evaluates them at the regime limits where the single-correlation warnings
// would be wrong.
double PetukhovFormula(double re) {
  const double b = 0.790 * std::log(re) - 1.64;
  return 1.0 / (b * b);
}

double GnielinskiNumerator(double re, double pr, double f) { return f / 8.0 * (re - 1000.0) * pr; }

double GnielinskiDenominator(double pr, double f) {
  return 1.0 + 12.7 * std::sqrt(f / 8.0) * (std::pow(pr, 2.0 / 3.0) - 1.0);
}

double HausenFormula(double re, double pr, double d, double l) {
  const double gz = d / l * re * pr;
  return 3.66 + 0.0668 * gz / (1.0 + 0.04 * std::pow(gz, 2.0 / 3.0));
}

void WarnGnielinskiRange(const char* fn, double re, double pr, bool check_low_re, Sink& sink) {
  if (check_low_re && re < 3000.0) {
    Warn(sink, "{}: Re = {:.6g} is below the Gnielinski range 3000 <= Re <= 5e6 ({})", fn, re,
         kGnielinski);
  }
  if (re > 5e6) {
    Warn(sink, "{}: Re = {:.6g} is above the Gnielinski range 3000 <= Re <= 5e6 ({})", fn, re,
         kGnielinski);
  }
  if (pr < 0.5 || pr > 2000.0) {
    Warn(sink, "{}: Pr = {:.6g} is outside the Gnielinski range 0.5 <= Pr <= 2000 ({})", fn, pr,
         kGnielinski);
  }
}

// Shared by nu_gnielinski and nu_gnielinski_f once f is known.
double GnielinskiChecked(const char* fn, double re, double pr, double f, Sink& sink) {
  const double den = GnielinskiDenominator(pr, f);
  if (!(den > 0)) {
    return Fail(sink,
                "{}: Re = {:.6g}, Pr = {:.6g}, f = {:.6g} make the denominator "
                "1 + 12.7*sqrt(f/8)*(Pr^(2/3) - 1) = {:.6g} non-positive; the formula has no value",
                fn, re, pr, f, den);
  }
  WarnGnielinskiRange(fn, re, pr, true, sink);
  return GnielinskiNumerator(re, pr, f) / den;
}

}  // namespace

// Conditions are written as !(x > 0) so that NaN input is an error as well.
double NuDittusBoelter(double re, double pr, double n, Sink& sink) {
  if (!(re > 0) || !(pr > 0) || !std::isfinite(n)) {
    return Fail(sink,
                "nu_dittus_boelter: Re = {:.6g}, Pr = {:.6g}, n = {:.6g}; needs Re > 0, Pr > 0", re,
                pr, n);
  }
  if (re < 1e4) {
    Warn(sink, "nu_dittus_boelter: Re = {:.6g} is below the Dittus-Boelter range Re >= 10000 ({})",
         re, kDittusBoelter);
  }
  if (pr < 0.6 || pr > 160.0) {
    Warn(sink,
         "nu_dittus_boelter: Pr = {:.6g} is outside the Dittus-Boelter range 0.6 <= Pr <= 160 ({})",
         pr, kDittusBoelter);
  }
  if (std::abs(n - 0.4) > 1e-12 && std::abs(n - 0.3) > 1e-12) {
    Warn(sink,
         "nu_dittus_boelter: n = {:.6g} is neither 0.4 (fluid heated) nor 0.3 (fluid cooled), the "
         "exponents of the correlation ({})",
         n, kDittusBoelter);
  }
  return 0.023 * std::pow(re, 0.8) * std::pow(pr, n);
}

double NuSiederTate(double re, double pr, double mu_bulk, double mu_wall, Sink& sink) {
  if (!(re > 0) || !(pr > 0) || !(mu_bulk > 0) || !(mu_wall > 0)) {
    return Fail(sink,
                "nu_sieder_tate: Re = {:.6g}, Pr = {:.6g}, mu_bulk = {:.6g} Pa*s, mu_wall = {:.6g} "
                "Pa*s; all must be positive",
                re, pr, mu_bulk, mu_wall);
  }
  if (re < 1e4) {
    Warn(sink, "nu_sieder_tate: Re = {:.6g} is below the Sieder-Tate range Re >= 10000 ({})", re,
         kSiederTate);
  }
  if (pr < 0.7 || pr > 16700.0) {
    Warn(sink,
         "nu_sieder_tate: Pr = {:.6g} is outside the Sieder-Tate range 0.7 <= Pr <= 16700 ({})", pr,
         kSiederTate);
  }
  return 0.027 * std::pow(re, 0.8) * std::cbrt(pr) * std::pow(mu_bulk / mu_wall, 0.14);
}

double FPetukhov(double re, Sink& sink) {
  if (!(re > 0) || !(0.790 * std::log(re) - 1.64 > 0)) {
    return Fail(sink,
                "f_petukhov: Re = {:.6g} makes 0.790*ln(Re) - 1.64 non-positive (Re <= 7.97); the "
                "formula has no value",
                re);
  }
  if (re < 3000.0 || re > 5e6) {
    Warn(sink, "f_petukhov: Re = {:.6g} is outside the Petukhov range 3000 <= Re <= 5e6 ({})", re,
         kPetukhov);
  }
  return PetukhovFormula(re);
}

double NuGnielinski(double re, double pr, Sink& sink) {
  if (!(re > 1000.0) || !(pr > 0)) {
    return Fail(sink,
                "nu_gnielinski: Re = {:.6g}, Pr = {:.6g}; needs Re > 1000 (the formula is "
                "proportional to Re - 1000) and Pr > 0",
                re, pr);
  }
  return GnielinskiChecked("nu_gnielinski", re, pr, PetukhovFormula(re), sink);
}

double NuGnielinskiF(double re, double pr, double f, Sink& sink) {
  if (!(re > 1000.0) || !(pr > 0) || !(f > 0)) {
    return Fail(sink,
                "nu_gnielinski_f: Re = {:.6g}, Pr = {:.6g}, f = {:.6g}; needs Re > 1000 (the "
                "formula is proportional to Re - 1000), Pr > 0, f > 0",
                re, pr, f);
  }
  return GnielinskiChecked("nu_gnielinski_f", re, pr, f, sink);
}

double NuHausen(double re, double pr, double d, double l, Sink& sink) {
  if (!(re >= 0) || !(pr > 0) || !(d > 0) || !(l > 0)) {
    return Fail(sink,
                "nu_hausen: Re = {:.6g}, Pr = {:.6g}, D = {:.6g} m, L = {:.6g} m; needs Re >= 0, "
                "Pr > 0, D > 0, L > 0",
                re, pr, d, l);
  }
  if (re >= kReLaminar) {
    Warn(sink,
         "nu_hausen: Re = {:.6g} is not laminar; the Hausen correlation holds for Re < 2300 ({})",
         re, kHausen);
  }
  return HausenFormula(re, pr, d, l);
}

double NuTube(double re, double pr, double d, double l, Sink& sink) {
  if (!(re >= 0) || !(pr > 0) || !(d > 0) || !(l > 0)) {
    return Fail(sink,
                "nu_tube: Re = {:.6g}, Pr = {:.6g}, D = {:.6g} m, L = {:.6g} m; needs Re >= 0, "
                "Pr > 0, D > 0, L > 0",
                re, pr, d, l);
  }
  if (re < kReLaminar) {
    sink.Note("laminar (Hausen)");
    return HausenFormula(re, pr, d, l);
  }
  // Gnielinski's correlation takes part from here on; at Re >= 10000 the
  // Petukhov bracket is >= 5.6 and the denominator >= 0.2 for any Pr > 0, so
  // neither can fail.
  WarnGnielinskiRange("nu_tube", re, pr, false, sink);
  if (re >= kReTurbulent) {
    sink.Note("turbulent (Gnielinski)");
    const double f = PetukhovFormula(re);
    return GnielinskiNumerator(re, pr, f) / GnielinskiDenominator(pr, f);
  }
  sink.Note("transition (Gnielinski interpolation between Re = 2300 and 10000)");
  const double gamma = (re - kReLaminar) / (kReTurbulent - kReLaminar);
  const double f = PetukhovFormula(kReTurbulent);
  const double nu_turbulent =
      GnielinskiNumerator(kReTurbulent, pr, f) / GnielinskiDenominator(pr, f);
  return (1.0 - gamma) * HausenFormula(kReLaminar, pr, d, l) + gamma * nu_turbulent;
}

double NuChurchillBernstein(double re, double pr, Sink& sink) {
  if (!(re > 0) || !(pr > 0)) {
    return Fail(sink, "nu_churchill_bernstein: Re = {:.6g}, Pr = {:.6g}; both must be positive", re,
                pr);
  }
  if (re * pr < 0.2) {
    Warn(sink,
         "nu_churchill_bernstein: Re*Pr = {:.6g} (Re = {:.6g}, Pr = {:.6g}) is below the "
         "Churchill-Bernstein range Re*Pr >= 0.2 ({})",
         re * pr, re, pr, kChurchillBernstein);
  }
  const double prandtl_term = std::pow(1.0 + std::pow(0.4 / pr, 2.0 / 3.0), 0.25);
  const double reynolds_term = std::pow(1.0 + std::pow(re / 282000.0, 0.625), 0.8);
  return 0.3 + 0.62 * std::sqrt(re) * std::cbrt(pr) / prandtl_term * reynolds_term;
}

double NuChurchillChuPlate(double ra, double pr, Sink& sink) {
  if (!(ra >= 0) || !(pr > 0)) {
    return Fail(sink, "nu_churchill_chu_plate: Ra = {:.6g}, Pr = {:.6g}; needs Ra >= 0, Pr > 0", ra,
                pr);
  }
  const double root = 0.825 + 0.387 * std::pow(ra, 1.0 / 6.0) /
                                  std::pow(1.0 + std::pow(0.492 / pr, 9.0 / 16.0), 8.0 / 27.0);
  return root * root;
}

double NuChurchillChuCyl(double ra, double pr, Sink& sink) {
  if (!(ra >= 0) || !(pr > 0)) {
    return Fail(sink, "nu_churchill_chu_cyl: Ra = {:.6g}, Pr = {:.6g}; needs Ra >= 0, Pr > 0", ra,
                pr);
  }
  if (ra > 1e12) {
    Warn(sink,
         "nu_churchill_chu_cyl: Ra = {:.6g} is above the Churchill-Chu horizontal-cylinder range "
         "Ra <= 1e12 ({})",
         ra, kChurchillChu);
  }
  const double root = 0.60 + 0.387 * std::pow(ra, 1.0 / 6.0) /
                                 std::pow(1.0 + std::pow(0.559 / pr, 9.0 / 16.0), 8.0 / 27.0);
  return root * root;
}

void RegisterConvection(std::vector<FunctionInfo>& out) {
  out.push_back({
      .name = "nu_dittus_boelter",
      .family = "convection",
      .args = {{"Re", dim::kOne}, {"Pr", dim::kOne}, {"n", dim::kOne}},
      .result = dim::kOne,
      .formula = "Nu = 0.023*Re^0.8*Pr^n, n = 0.4 heating, 0.3 cooling",
      .source = "Dittus & Boelter (1930), fully developed turbulent flow in smooth tubes; validity "
                "as given by Incropera et al., Fundamentals of Heat and Mass Transfer",
      .validity = "Re >= 10000, 0.6 <= Pr <= 160, n = 0.4 or 0.3: warning outside; error unless "
                  "Re > 0, Pr > 0",
      .example = "Nu_i = nu_dittus_boelter(Re_t, 4.3, 0.4)",
      .spreadsheet = "0.023*{0}^0.8*{1}^{2}",
      .fn = [](const double* a, Sink& s) { return NuDittusBoelter(a[0], a[1], a[2], s); },
  });
  out.push_back({
      .name = "nu_sieder_tate",
      .family = "convection",
      .args = {{"Re", dim::kOne},
               {"Pr", dim::kOne},
               {"mu_bulk", dim::kViscosity},
               {"mu_wall", dim::kViscosity}},
      .result = dim::kOne,
      .formula = "Nu = 0.027*Re^0.8*Pr^(1/3)*(mu_bulk/mu_wall)^0.14",
      .source = "Sieder & Tate (1936), turbulent flow in tubes with large property variation",
      .validity = "Re >= 10000, 0.7 <= Pr <= 16700: warning outside; error unless Re, Pr, "
                  "mu_bulk, mu_wall > 0",
      .example = "Nu_oil = nu_sieder_tate(Re_oil, 95, 12.4 cP, 6.1 cP)",
      .spreadsheet = "0.027*{0}^0.8*{1}^(1/3)*({2}/{3})^0.14",
      .fn = [](const double* a, Sink& s) { return NuSiederTate(a[0], a[1], a[2], a[3], s); },
  });
  out.push_back({
      .name = "f_petukhov",
      .family = "convection",
      .args = {{"Re", dim::kOne}},
      .result = dim::kOne,
      .formula = "f = (0.790*ln(Re) - 1.64)^-2 (Darcy)",
      .source = "Petukhov (1970), smooth tubes",
      .validity = "3000 <= Re <= 5e6: warning outside; error for Re <= 7.97, where the bracket is "
                  "not positive",
      .example = "f_s = f_petukhov(Re_t)",
      .spreadsheet = "1/(0.79*LN({0})-1.64)^2",
      .fn = [](const double* a, Sink& s) { return FPetukhov(a[0], s); },
  });
  out.push_back({
      .name = "nu_gnielinski",
      .family = "convection",
      .args = {{"Re", dim::kOne}, {"Pr", dim::kOne}},
      .result = dim::kOne,
      .formula = "Nu = (f/8)*(Re - 1000)*Pr/(1 + 12.7*sqrt(f/8)*(Pr^(2/3) - 1)), "
                 "f = (0.790*ln(Re) - 1.64)^-2",
      .source = "Gnielinski (1976), with the Petukhov (1970) smooth-tube friction factor",
      .validity = "3000 <= Re <= 5e6, 0.5 <= Pr <= 2000: warning outside; error unless Re > 1000 "
                  "and Pr > 0, or where the denominator is not positive",
      .example = "Nu_i = nu_gnielinski(Re_t, 3.1)",
      .spreadsheet = "(1/(0.79*LN({0})-1.64)^2)/8*({0}-1000)*{1}"
                     "/(1+12.7*SQRT((1/(0.79*LN({0})-1.64)^2)/8)*({1}^(2/3)-1))",
      .fn = [](const double* a, Sink& s) { return NuGnielinski(a[0], a[1], s); },
  });
  out.push_back({
      .name = "nu_gnielinski_f",
      .family = "convection",
      .args = {{"Re", dim::kOne}, {"Pr", dim::kOne}, {"f", dim::kOne}},
      .result = dim::kOne,
      .formula = "Nu = (f/8)*(Re - 1000)*Pr/(1 + 12.7*sqrt(f/8)*(Pr^(2/3) - 1))",
      .source = "Gnielinski (1976) with a given Darcy friction factor",
      .validity = "3000 <= Re <= 5e6, 0.5 <= Pr <= 2000: warning outside; error unless Re > 1000, "
                  "Pr > 0, f > 0, or where the denominator is not positive",
      .example = "Nu_i = nu_gnielinski_f(Re_t, 3.1, f_rough)",
      .spreadsheet = "{2}/8*({0}-1000)*{1}/(1+12.7*SQRT({2}/8)*({1}^(2/3)-1))",
      .fn = [](const double* a, Sink& s) { return NuGnielinskiF(a[0], a[1], a[2], s); },
  });
  out.push_back({
      .name = "nu_hausen",
      .family = "convection",
      .args = {{"Re", dim::kOne}, {"Pr", dim::kOne}, {"D", dim::kLength}, {"L", dim::kLength}},
      .result = dim::kOne,
      .formula = "Nu = 3.66 + 0.0668*Gz/(1 + 0.04*Gz^(2/3)), Gz = (D/L)*Re*Pr",
      .source = "Hausen (1943), laminar thermal entry length, constant wall temperature, mean Nu",
      .validity = "Re < 2300: warning at Re >= 2300; error unless Re >= 0, Pr > 0, D > 0, L > 0",
      .example = "Nu_lam = nu_hausen(Re_oil, 180, 15.7 mm, 4.8 m)",
      .spreadsheet = "3.66+0.0668*({2}/{3}*{0}*{1})/(1+0.04*({2}/{3}*{0}*{1})^(2/3))",
      .fn = [](const double* a, Sink& s) { return NuHausen(a[0], a[1], a[2], a[3], s); },
  });
  out.push_back({
      .name = "nu_tube",
      .family = "convection",
      .args = {{"Re", dim::kOne}, {"Pr", dim::kOne}, {"D", dim::kLength}, {"L", dim::kLength}},
      .result = dim::kOne,
      .formula = "Re < 2300: Hausen; Re >= 10000: Gnielinski; between: (1 - g)*Nu_Hausen(2300) + "
                 "g*Nu_Gnielinski(10000), g = (Re - 2300)/(10000 - 2300)",
      .source = "Hausen (1943) laminar, Gnielinski (1976) turbulent, with Gnielinski's transition "
                "interpolation (VDI Heat Atlas)",
      .validity = "any Re; regime recorded as a note; warning for Re > 5e6 and, at Re >= 2300, for "
                  "Pr outside 0.5 ... 2000; error unless Re >= 0, Pr > 0, D > 0, L > 0",
      .example = "Nu_t = nu_tube(Re_t, 5.4, 15.7 mm, 4.8 m)",
      .spreadsheet =
          "IF({0}<2300,3.66+0.0668*({2}/{3}*{0}*{1})/(1+0.04*({2}/{3}*{0}*{1})^(2/3)),"
          "IF({0}>=10000,(1/(0.79*LN({0})-1.64)^2)/8*({0}-1000)*{1}"
          "/(1+12.7*SQRT((1/(0.79*LN({0})-1.64)^2)/8)*({1}^(2/3)-1)),"
          "(1-({0}-2300)/7700)*(3.66+0.0668*({2}/{3}*2300*{1})/(1+0.04*({2}/{3}*2300*{1})^(2/3)))"
          "+({0}-2300)/7700*(1/(0.79*LN(10000)-1.64)^2)/8*9000*{1}"
          "/(1+12.7*SQRT((1/(0.79*LN(10000)-1.64)^2)/8)*({1}^(2/3)-1))))",
      .fn = [](const double* a, Sink& s) { return NuTube(a[0], a[1], a[2], a[3], s); },
  });
  out.push_back({
      .name = "nu_churchill_bernstein",
      .family = "convection",
      .args = {{"Re", dim::kOne}, {"Pr", dim::kOne}},
      .result = dim::kOne,
      .formula = "Nu = 0.3 + 0.62*Re^(1/2)*Pr^(1/3)/[1 + (0.4/Pr)^(2/3)]^(1/4)"
                 "*[1 + (Re/282000)^(5/8)]^(4/5)",
      .source = "Churchill & Bernstein (1977), circular cylinder in crossflow, mean Nu",
      .validity = "Re*Pr >= 0.2: warning below; error unless Re > 0, Pr > 0",
      .example = "Nu_o = nu_churchill_bernstein(Re_air, 0.71)",
      .spreadsheet = "0.3+0.62*{0}^0.5*{1}^(1/3)/(1+(0.4/{1})^(2/3))^0.25"
                     "*(1+({0}/282000)^0.625)^0.8",
      .fn = [](const double* a, Sink& s) { return NuChurchillBernstein(a[0], a[1], s); },
  });
  out.push_back({
      .name = "nu_churchill_chu_plate",
      .family = "convection",
      .args = {{"Ra", dim::kOne}, {"Pr", dim::kOne}},
      .result = dim::kOne,
      .formula = "Nu = {0.825 + 0.387*Ra^(1/6)/[1 + (0.492/Pr)^(9/16)]^(8/27)}^2",
      .source = "Churchill & Chu (1975), natural convection, vertical plate, mean Nu over the "
                "height",
      .validity = "all Ra and Pr (no range warning); error unless Ra >= 0, Pr > 0",
      .example = "Nu_wall = nu_churchill_chu_plate(Ra_L, 0.71)",
      .spreadsheet = "(0.825+0.387*{0}^(1/6)/(1+(0.492/{1})^(9/16))^(8/27))^2",
      .fn = [](const double* a, Sink& s) { return NuChurchillChuPlate(a[0], a[1], s); },
  });
  out.push_back({
      .name = "nu_churchill_chu_cyl",
      .family = "convection",
      .args = {{"Ra", dim::kOne}, {"Pr", dim::kOne}},
      .result = dim::kOne,
      .formula = "Nu = {0.60 + 0.387*Ra^(1/6)/[1 + (0.559/Pr)^(9/16)]^(8/27)}^2",
      .source = "Churchill & Chu (1975), natural convection, long horizontal cylinder, mean Nu",
      .validity = "Ra <= 1e12: warning above; error unless Ra >= 0, Pr > 0",
      .example = "Nu_pipe = nu_churchill_chu_cyl(Ra_D, 0.71)",
      .spreadsheet = "(0.6+0.387*{0}^(1/6)/(1+(0.559/{1})^(9/16))^(8/27))^2",
      .fn = [](const double* a, Sink& s) { return NuChurchillChuCyl(a[0], a[1], s); },
  });
}

}  // namespace heatdeck::library
