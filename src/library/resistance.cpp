// Family 'resistance' of the heat-transfer library (LIBRARY.md).
#include "library/resistance.h"
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

}  // namespace

// Conditions are written as !(x > 0) so that NaN input is an error as well.
double ResPlane(double l, double k, double a, Sink& sink) {
  if (!(l > 0) || !(k > 0) || !(a > 0)) {
    return Fail(sink,
                "res_plane: L = {:.6g} m, k = {:.6g} W/(m*K), A = {:.6g} m^2; all must be positive",
                l, k, a);
  }
  return l / (k * a);
}

double ResCyl(double d_in, double d_out, double k, double l, Sink& sink) {
  if (!(d_in > 0) || !(d_out > d_in) || !(k > 0) || !(l > 0)) {
    return Fail(sink,
                "res_cyl: D_in = {:.6g} m, D_out = {:.6g} m, k = {:.6g} W/(m*K), L = {:.6g} m; "
                "needs D_out > D_in > 0, k > 0, L > 0",
                d_in, d_out, k, l);
  }
  // log1p of the exact difference keeps full precision for thin walls, where
  // log(D_out/D_in) would lose digits to the rounding of the quotient.
  return std::log1p((d_out - d_in) / d_in) / (2.0 * std::numbers::pi * k * l);
}

double ResSphere(double d_in, double d_out, double k, Sink& sink) {
  if (!(d_in > 0) || !(d_out > d_in) || !(k > 0)) {
    return Fail(sink,
                "res_sphere: D_in = {:.6g} m, D_out = {:.6g} m, k = {:.6g} W/(m*K); needs "
                "D_out > D_in > 0, k > 0",
                d_in, d_out, k);
  }
  // (2/D_in - 2/D_out)/(4*pi*k) rearranged so that a thin shell does not
  // cancel.
  return (d_out - d_in) / (2.0 * std::numbers::pi * k * d_in * d_out);
}

double ResFilm(double h, double a, Sink& sink) {
  if (!(h > 0) || !(a > 0)) {
    return Fail(sink, "res_film: h = {:.6g} W/(m^2*K), A = {:.6g} m^2; both must be positive", h,
                a);
  }
  return 1.0 / (h * a);
}

double ResFouling(double rf, double a, Sink& sink) {
  if (!(rf >= 0) || !(a > 0)) {
    return Fail(sink, "res_fouling: Rf = {:.6g} m^2*K/W, A = {:.6g} m^2; needs Rf >= 0, A > 0", rf,
                a);
  }
  return rf / a;
}

double HRad(double emis, double t_s, double t_sur, Sink& sink) {
  if (!(emis >= 0 && emis <= 1) || !(t_s >= 0) || !(t_sur >= 0)) {
    return Fail(sink,
                "h_rad: emis = {:.6g}, T_s = {:.6g} K, T_sur = {:.6g} K; needs 0 <= emis <= 1 and "
                "absolute temperatures >= 0 K",
                emis, t_s, t_sur);
  }
  // The factored form stays exact as T_s -> T_sur, where the net-exchange
  // quotient (T_s^4 - T_sur^4)/(T_s - T_sur) would be 0/0.
  return emis * kStefanBoltzmann * (t_s + t_sur) * (t_s * t_s + t_sur * t_sur);
}

void RegisterResistance(std::vector<FunctionInfo>& out) {
  using units::TempKind;
  out.push_back({
      .name = "res_plane",
      .family = "resistance",
      .args = {{"L", dim::kLength}, {"k", dim::kConductivity}, {"A", dim::kArea}},
      .result = dim::kThermalResistance,
      .formula = "R = L/(k*A)",
      .source = "Fourier's law, one-dimensional steady conduction through a plane wall",
      .validity = "exact for a plane wall; error unless L > 0, k > 0, A > 0",
      .example = "R_plate = res_plane(0.6 mm, 16 W/(m*K), 4.2 m^2)",
      .spreadsheet = "{0}/({1}*{2})",
      .fn = [](const double* a, Sink& s) { return ResPlane(a[0], a[1], a[2], s); },
  });
  out.push_back({
      .name = "res_cyl",
      .family = "resistance",
      .args = {{"D_in", dim::kLength},
               {"D_out", dim::kLength},
               {"k", dim::kConductivity},
               {"L", dim::kLength}},
      .result = dim::kThermalResistance,
      .formula = "R = ln(D_out/D_in)/(2*pi*k*L)",
      .source = "Fourier's law, one-dimensional steady radial conduction through a tube wall",
      .validity = "exact for a cylindrical wall; error unless D_out > D_in > 0, k > 0, L > 0",
      .example = "R_w = res_cyl(15.7 mm, 19.05 mm, 16 W/(m*K), 4.8 m)",
      .spreadsheet = "LN({1}/{0})/(2*PI()*{2}*{3})",
      .fn = [](const double* a, Sink& s) { return ResCyl(a[0], a[1], a[2], a[3], s); },
  });
  out.push_back({
      .name = "res_sphere",
      .family = "resistance",
      .args = {{"D_in", dim::kLength}, {"D_out", dim::kLength}, {"k", dim::kConductivity}},
      .result = dim::kThermalResistance,
      .formula = "R = (1/r_in - 1/r_out)/(4*pi*k), r = D/2",
      .source = "Fourier's law, one-dimensional steady radial conduction through a spherical shell",
      .validity = "exact for a spherical shell; error unless D_out > D_in > 0, k > 0",
      .example = "R_ins = res_sphere(1.2 m, 1.3 m, 0.045 W/(m*K))",
      .spreadsheet = "(2/{0}-2/{1})/(4*PI()*{2})",
      .fn = [](const double* a, Sink& s) { return ResSphere(a[0], a[1], a[2], s); },
  });
  out.push_back({
      .name = "res_film",
      .family = "resistance",
      .args = {{"h", dim::kHeatTransferCoeff}, {"A", dim::kArea}},
      .result = dim::kThermalResistance,
      .formula = "R = 1/(h*A)",
      .source = "Newton's law of cooling",
      .validity = "any film coefficient; error unless h > 0, A > 0",
      .example = "R_i = res_film(2350 W/(m^2*K), 1.9 m^2)",
      .spreadsheet = "1/({0}*{1})",
      .fn = [](const double* a, Sink& s) { return ResFilm(a[0], a[1], s); },
  });
  out.push_back({
      .name = "res_fouling",
      .family = "resistance",
      .args = {{"Rf", dim::kFoulingResistance}, {"A", dim::kArea}},
      .result = dim::kThermalResistance,
      .formula = "R = Rf/A",
      .source = "definition of the fouling resistance per unit area",
      .validity = "Rf = 0 for a new, clean surface; error unless Rf >= 0, A > 0",
      .example = "R_fi = res_fouling(0.00018 m^2*K/W, 1.9 m^2)",
      .spreadsheet = "{0}/{1}",
      .fn = [](const double* a, Sink& s) { return ResFouling(a[0], a[1], s); },
  });
  out.push_back({
      .name = "h_rad",
      .family = "resistance",
      .args = {{"emis", dim::kOne},
               {"T_s", dim::kTemperature, TempKind::kAbsolute},
               {"T_sur", dim::kTemperature, TempKind::kAbsolute}},
      .result = dim::kHeatTransferCoeff,
      .formula = "h_r = eps*sigma*(T_s + T_sur)*(T_s^2 + T_sur^2), sigma = 5.670374419e-8 "
                 "W/(m^2*K^4)",
      .source = "Stefan-Boltzmann law, grey surface in large isothermal surroundings, linearised; "
                "sigma from CODATA 2018",
      .validity = "small grey surface seen by large surroundings; error unless 0 <= emis <= 1 and "
                  "T_s, T_sur >= 0 K",
      .example = "h_r = h_rad(0.85, 180 degC, 25 degC)",
      .spreadsheet = "{0}*5.670374419E-8*({1}+{2})*({1}^2+{2}^2)",
      .fn = [](const double* a, Sink& s) { return HRad(a[0], a[1], a[2], s); },
  });
}

}  // namespace heatdeck::library
