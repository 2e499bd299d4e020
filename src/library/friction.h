// Darcy friction factors and the Darcy-Weisbach pressure drop (LIBRARY.md
// "Friction and pressure drop").  SI doubles in and out.  Outside a method's
// validity range the result is returned with a warning to the sink naming
// the range, the value and the source; physically meaningless input is an
// error (message naming the function and the values, result NaN).
#pragma once

#include "library/registry.h"

namespace heatdeck::library {

// Fully developed laminar flow in a circular tube (Hagen-Poiseuille), Darcy
// friction factor f = 64/Re.  Warning above Re = 2300, the usual end of
// laminar tube flow (common practice).  Error unless Re > 0.
double FLaminar(double re, Sink& sink);

// Colebrook-White (Colebrook 1939) Darcy friction factor of a commercial
// pipe, the root of
//   1/sqrt(f) = -2 log10(rel_rough/3.7 + 2.51/(Re sqrt(f))),
// solved by Newton's method on 1/sqrt(f) from the Swamee-Jain (1976)
// explicit estimate, to 1e-12 relative or better.  Allocation-free, at most
// a few iterations.  Warnings below Re = 4000 (the equation is for turbulent
// flow) and above rel_rough = 0.05 (the roughest pipe of the Moody chart,
// common practice).  Error unless Re > 0, rel_rough >= 0.
double FColebrook(double re, double rel_rough, Sink& sink);

// Darcy-Weisbach pressure drop dp = f*(L/D)*rho*V^2/2, Pa.
// Error unless f >= 0, L >= 0, D > 0, rho > 0, V >= 0 (a speed).
double DpDarcy(double f, double l, double d, double rho, double v, Sink& sink);

}  // namespace heatdeck::library
