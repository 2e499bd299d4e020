// Family 'groups' of the heat-transfer library (LIBRARY.md).
#include "library/groups.h"
#include "library/fail.h"

#include <fmt/format.h>

#include <limits>
#include <numbers>
#include <utility>

namespace heatdeck::library {
namespace {

namespace dim = units::dim;

using detail::Fail;
using detail::kNaN;

// The conditions below are written as !(x > 0) so that NaN input is an error
// too, instead of flowing silently into the result.
bool AnnulusOk(const char* fn, double d_core, double d_shell, Sink& sink) {
  if (d_core >= 0 && d_shell > d_core) return true;
  Fail(sink, "{}: D_core = {:.6g} m, D_shell = {:.6g} m; an annulus needs D_shell > D_core >= 0",
       fn, d_core, d_shell);
  return false;
}

}  // namespace

double Reynolds(double rho, double v, double l, double mu, Sink& sink) {
  if (!(rho > 0) || !(v >= 0) || !(l > 0) || !(mu > 0)) {
    return Fail(sink,
                "reynolds: rho = {:.6g} kg/m^3, V = {:.6g} m/s, L = {:.6g} m, mu = {:.6g} Pa*s; "
                "needs rho > 0, V >= 0 (a speed), L > 0, mu > 0",
                rho, v, l, mu);
  }
  return rho * v * l / mu;
}

double ReynoldsTube(double mdot, double d, double mu, Sink& sink) {
  if (!(mdot >= 0) || !(d > 0) || !(mu > 0)) {
    return Fail(sink,
                "reynolds_tube: mdot = {:.6g} kg/s, D = {:.6g} m, mu = {:.6g} Pa*s; needs "
                "mdot >= 0, D > 0, mu > 0",
                mdot, d, mu);
  }
  return 4.0 * mdot / (std::numbers::pi * d * mu);
}

double Prandtl(double cp, double mu, double k, Sink& sink) {
  if (!(cp > 0) || !(mu > 0) || !(k > 0)) {
    return Fail(sink,
                "prandtl: cp = {:.6g} J/(kg*K), mu = {:.6g} Pa*s, k = {:.6g} W/(m*K); all must be "
                "positive",
                cp, mu, k);
  }
  return cp * mu / k;
}

double HFromNu(double nu, double k, double l, Sink& sink) {
  if (!(nu >= 0) || !(k > 0) || !(l > 0)) {
    return Fail(sink,
                "h_from_nu: Nu = {:.6g}, k = {:.6g} W/(m*K), L = {:.6g} m; needs Nu >= 0, k > 0, "
                "L > 0",
                nu, k, l);
  }
  return nu * k / l;
}

double DhAnnulus(double d_core, double d_shell, Sink& sink) {
  if (!AnnulusOk("dh_annulus", d_core, d_shell, sink)) return kNaN;
  return d_shell - d_core;
}

double AreaAnnulus(double d_core, double d_shell, Sink& sink) {
  if (!AnnulusOk("area_annulus", d_core, d_shell, sink)) return kNaN;
  // (Ds - Dc)(Ds + Dc) keeps the relative precision of a narrow gap, where
  // Ds^2 - Dc^2 would cancel.
  return std::numbers::pi * (d_shell - d_core) * (d_shell + d_core) / 4.0;
}

void RegisterGroups(std::vector<FunctionInfo>& out) {
  out.push_back({
      .name = "reynolds",
      .family = "groups",
      .args = {{"rho", dim::kDensity},
               {"V", dim::kVelocity},
               {"L", dim::kLength},
               {"mu", dim::kViscosity}},
      .result = dim::kOne,
      .formula = "Re = rho*V*L/mu",
      .source = "definition of the Reynolds number",
      .validity = "any flow; error unless rho > 0, V >= 0 (a speed), L > 0, mu > 0",
      .example = "Re_s = reynolds(998 kg/m^3, 1.2 m/s, 19 mm, 0.89 cP)",
      .spreadsheet = "{0}*{1}*{2}/{3}",
      .fn = [](const double* a, Sink& s) { return Reynolds(a[0], a[1], a[2], a[3], s); },
  });
  out.push_back({
      .name = "reynolds_tube",
      .family = "groups",
      .args = {{"mdot", dim::kMassFlow}, {"D", dim::kLength}, {"mu", dim::kViscosity}},
      .result = dim::kOne,
      .formula = "Re = 4*mdot/(pi*D*mu)",
      .source = "definition of the Reynolds number with continuity V = mdot/(rho*pi*D^2/4)",
      .validity = "a full circular tube; error unless mdot >= 0, D > 0, mu > 0",
      .example = "Re_t = reynolds_tube(0.35 kg/s, 15.7 mm, 0.55 cP)",
      .spreadsheet = "4*{0}/(PI()*{1}*{2})",
      .fn = [](const double* a, Sink& s) { return ReynoldsTube(a[0], a[1], a[2], s); },
  });
  out.push_back({
      .name = "prandtl",
      .family = "groups",
      .args = {{"cp", dim::kSpecificHeat}, {"mu", dim::kViscosity}, {"k", dim::kConductivity}},
      .result = dim::kOne,
      .formula = "Pr = cp*mu/k",
      .source = "definition of the Prandtl number",
      .validity = "any fluid; error unless cp, mu, k > 0",
      .example = "Pr_oil = prandtl(2.05 kJ/(kg*K), 38 cP, 0.135 W/(m*K))",
      .spreadsheet = "{0}*{1}/{2}",
      .fn = [](const double* a, Sink& s) { return Prandtl(a[0], a[1], a[2], s); },
  });
  out.push_back({
      .name = "h_from_nu",
      .family = "groups",
      .args = {{"Nu", dim::kOne}, {"k", dim::kConductivity}, {"L", dim::kLength}},
      .result = dim::kHeatTransferCoeff,
      .formula = "h = Nu*k/L",
      .source = "definition of the Nusselt number",
      .validity = "L is the length Nu is based on; error unless Nu >= 0, k > 0, L > 0",
      .example = "h_i = h_from_nu(Nu_i, 0.62 W/(m*K), 22 mm)",
      .spreadsheet = "{0}*{1}/{2}",
      .fn = [](const double* a, Sink& s) { return HFromNu(a[0], a[1], a[2], s); },
  });
  out.push_back({
      .name = "dh_annulus",
      .family = "groups",
      .args = {{"D_core", dim::kLength}, {"D_shell", dim::kLength}},
      .result = dim::kLength,
      .formula = "D_h = 4A/P = D_shell - D_core",
      .source = "hydraulic diameter 4A/P of a concentric annulus (wetted perimeter "
                "pi*(D_shell + D_core))",
      .validity = "concentric annulus; error unless D_shell > D_core >= 0",
      .example = "D_h = dh_annulus(25.4 mm, 52.5 mm)",
      .spreadsheet = "{1}-{0}",
      .fn = [](const double* a, Sink& s) { return DhAnnulus(a[0], a[1], s); },
  });
  out.push_back({
      .name = "area_annulus",
      .family = "groups",
      .args = {{"D_core", dim::kLength}, {"D_shell", dim::kLength}},
      .result = dim::kArea,
      .formula = "A = pi*(D_shell^2 - D_core^2)/4",
      .source = "flow area of a concentric annulus (geometry)",
      .validity = "concentric annulus; error unless D_shell > D_core >= 0",
      .example = "A_ann = area_annulus(25.4 mm, 52.5 mm)",
      .spreadsheet = "PI()*({1}^2-{0}^2)/4",
      .fn = [](const double* a, Sink& s) { return AreaAnnulus(a[0], a[1], s); },
  });
}

}  // namespace heatdeck::library
