// Dimensionless groups and flow geometry (LIBRARY.md "Dimensionless groups and
// geometry").  SI doubles in and out.  On physically meaningless input each
// function reports an error to the sink, naming the function and the values,
// and returns NaN; none of them has a validity warning.
#pragma once

#include "library/registry.h"

namespace heatdeck::library {

// Re = rho*V*L/mu (definition).  V is a speed.
// Error unless rho > 0, V >= 0, L > 0, mu > 0.
double Reynolds(double rho, double v, double l, double mu, Sink& sink);

// Re = 4*mdot/(pi*D*mu): the Reynolds number of a full circular tube, from
// continuity V = mdot/(rho*pi*D^2/4) (rho cancels).
// Error unless mdot >= 0, D > 0, mu > 0.
double ReynoldsTube(double mdot, double d, double mu, Sink& sink);

// Pr = cp*mu/k (definition).  Error unless cp, mu, k > 0.
double Prandtl(double cp, double mu, double k, Sink& sink);

// h = Nu*k/L (definition of the Nusselt number on the length L).
// Error unless Nu >= 0, k > 0, L > 0.
double HFromNu(double nu, double k, double l, Sink& sink);

// Hydraulic diameter of a concentric annulus, 4A/P with A = pi*(Ds^2-Dc^2)/4
// and the wetted perimeter P = pi*(Ds + Dc): D_h = D_shell - D_core.
// D_core = 0 is a plain tube.  Error unless D_shell > D_core >= 0.
double DhAnnulus(double d_core, double d_shell, Sink& sink);

// Flow area of a concentric annulus, pi*(D_shell^2 - D_core^2)/4.
// Error unless D_shell > D_core >= 0.
double AreaAnnulus(double d_core, double d_shell, Sink& sink);

}  // namespace heatdeck::library
