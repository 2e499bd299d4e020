// Family 'friction' of the heat-transfer library (LIBRARY.md).
#include "library/friction.h"
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

template <typename... Args>
void Warn(Sink& sink, fmt::format_string<Args...> f, Args&&... args) {
  sink.Warning(fmt::format(f, std::forward<Args>(args)...));
}

}  // namespace

double FLaminar(double re, Sink& sink) {
  if (!(re > 0)) return Fail(sink, "f_laminar: Re = {:.6g} must be positive", re);
  if (re > 2300.0) {
    Warn(sink,
         "f_laminar: Re = {:.6g} is above 2300, the usual end of laminar tube flow "
         "(Hagen-Poiseuille; limit common practice)",
         re);
  }
  return 64.0 / re;
}

double FColebrook(double re, double rel_rough, Sink& sink) {
  if (!(re > 0) || !(rel_rough >= 0) || std::isinf(re) || std::isinf(rel_rough)) {
    return Fail(sink, "f_colebrook: Re = {:.6g}, rel_rough = {:.6g}; needs Re > 0, rel_rough >= 0",
                re, rel_rough);
  }
  if (re < 4000.0) {
    Warn(sink,
         "f_colebrook: Re = {:.6g} is below the turbulent range Re >= 4000 of the Colebrook-White "
         "equation (Colebrook 1939)",
         re);
  }
  if (rel_rough > 0.05) {
    Warn(sink,
         "f_colebrook: rel_rough = {:.6g} is above 0.05, the roughest pipe of the Moody chart "
         "(Colebrook 1939; limit common practice)",
         rel_rough);
  }
  // Unknown x = 1/sqrt(f); g(x) = x + 2 log10(e + c x) is increasing and
  // concave, so Newton's iterates that land left of the root climb to it
  // monotonically.  Swamee-Jain starts within a few per cent in the
  // turbulent range; its estimate is useless only at Re < 7 or absurd
  // roughness, where x = 1 serves.
  const double e = rel_rough / 3.7;
  const double c = 2.51 / re;
  const double two_over_ln10 = 2.0 / std::numbers::ln10;
  double x = -2.0 * std::log10(e + 5.74 / std::pow(re, 0.9));
  if (!(x > 1.0)) x = 1.0;
  for (int it = 0; it < 100; ++it) {
    const double arg = e + c * x;
    const double g = x + 2.0 * std::log10(arg);
    const double dg = 1.0 + two_over_ln10 * c / arg;
    double next = x - g / dg;
    // A step from right of the root can overshoot below zero (log domain);
    // falling back towards zero keeps the iterate positive and left of the
    // root, from where convergence is monotone.
    if (!(next > 0)) next = x / 4.0;
    const double step = next - x;
    x = next;
    // Quadratic convergence: the error after a step of 1e-13*x is far below
    // 1e-13, so f = 1/x^2 is within 1e-12 relative.
    if (std::abs(step) <= 1e-13 * x) return 1.0 / (x * x);
  }
  return Fail(sink,
              "f_colebrook: Re = {:.6g}, rel_rough = {:.6g}: Newton's method did not converge", re,
              rel_rough);
}

double DpDarcy(double f, double l, double d, double rho, double v, Sink& sink) {
  if (!(f >= 0) || !(l >= 0) || !(d > 0) || !(rho > 0) || !(v >= 0)) {
    return Fail(sink,
                "dp_darcy: f = {:.6g}, L = {:.6g} m, D = {:.6g} m, rho = {:.6g} kg/m^3, "
                "V = {:.6g} m/s; needs f >= 0, L >= 0, D > 0, rho > 0, V >= 0 (a speed)",
                f, l, d, rho, v);
  }
  return f * (l / d) * rho * v * v / 2.0;
}

void RegisterFriction(std::vector<FunctionInfo>& out) {
  out.push_back({
      .name = "f_laminar",
      .family = "friction",
      .args = {{"Re", dim::kOne}},
      .result = dim::kOne,
      .formula = "f = 64/Re (Darcy)",
      .source = "Hagen-Poiseuille flow, fully developed laminar flow in a circular tube",
      .validity = "laminar flow: warning above Re = 2300 (common practice); error unless Re > 0",
      .example = "f_lam = f_laminar(Re_oil)",
      .spreadsheet = "64/{0}",
      .fn = [](const double* a, Sink& s) { return FLaminar(a[0], s); },
  });
  out.push_back({
      .name = "f_colebrook",
      .family = "friction",
      .args = {{"Re", dim::kOne}, {"rel_rough", dim::kOne}},
      .result = dim::kOne,
      .formula = "1/sqrt(f) = -2*log10(rel_rough/3.7 + 2.51/(Re*sqrt(f))) (Darcy), solved to "
                 "1e-12 relative",
      .source = "Colebrook (1939), Colebrook-White equation; Newton's method from the Swamee & "
                "Jain (1976) estimate",
      .validity = "turbulent flow in commercial pipes: warning below Re = 4000 and above "
                  "rel_rough = 0.05 (common practice); error unless Re > 0, rel_rough >= 0",
      .example = "f_t = f_colebrook(Re_t, 0.045 mm / 52.5 mm)",
      .spreadsheet = nullptr,
      .fn = [](const double* a, Sink& s) { return FColebrook(a[0], a[1], s); },
  });
  out.push_back({
      .name = "dp_darcy",
      .family = "friction",
      .args = {{"f", dim::kOne},
               {"L", dim::kLength},
               {"D", dim::kLength},
               {"rho", dim::kDensity},
               {"V", dim::kVelocity}},
      .result = dim::kPressure,
      .formula = "dp = f*(L/D)*rho*V^2/2",
      .source = "Darcy-Weisbach equation",
      .validity = "straight pipe, Darcy friction factor; error unless f >= 0, L >= 0, D > 0, "
                  "rho > 0, V >= 0 (a speed)",
      .example = "dp_t = dp_darcy(f_t, 4.8 m, 15.7 mm, 985 kg/m^3, 1.4 m/s)",
      .spreadsheet = "{0}*{1}/{2}*{3}*{4}^2/2",
      .fn = [](const double* a, Sink& s) { return DpDarcy(a[0], a[1], a[2], a[3], a[4], s); },
  });
}

}  // namespace heatdeck::library
