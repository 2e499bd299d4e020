// Conduction, film and fouling resistances (K/W) and the linearised radiation
// coefficient (LIBRARY.md "Thermal resistances (K/W) and radiation").  SI
// doubles in and out.  On physically meaningless input each function reports
// an error to the sink, naming the function and the values, and returns NaN;
// within those bounds the formulas are exact (no validity warnings).
#pragma once

#include "library/registry.h"

namespace heatdeck::library {

// Stefan-Boltzmann constant, W/(m^2*K^4): CODATA 2018 (exact in the 2019 SI).
inline constexpr double kStefanBoltzmann = 5.670374419e-8;

// Plane wall: R = L/(k*A) (one-dimensional steady conduction, Fourier's law).
// Error unless L > 0, k > 0, A > 0.
double ResPlane(double l, double k, double a, Sink& sink);

// Cylindrical wall: R = ln(D_out/D_in)/(2*pi*k*L) (one-dimensional radial
// conduction).  Error unless D_out > D_in > 0, k > 0, L > 0.
double ResCyl(double d_in, double d_out, double k, double l, Sink& sink);

// Spherical shell: R = (1/r_in - 1/r_out)/(4*pi*k), r = D/2.
// Error unless D_out > D_in > 0, k > 0.
double ResSphere(double d_in, double d_out, double k, Sink& sink);

// Convective film: R = 1/(h*A) (Newton's law of cooling).
// Error unless h > 0, A > 0.
double ResFilm(double h, double a, Sink& sink);

// Fouling layer: R = Rf/A, Rf the fouling resistance in m^2*K/W (0 for a new,
// clean surface).  Error unless Rf >= 0, A > 0.
double ResFouling(double rf, double a, Sink& sink);

// Linearised radiation coefficient of a small grey surface in large
// surroundings: h_r = eps*sigma*(T_s + T_sur)*(T_s^2 + T_sur^2), so that
// h_r*(T_s - T_sur) = eps*sigma*(T_s^4 - T_sur^4) exactly.  T_s and T_sur are
// absolute temperatures (K).  Error unless 0 <= eps <= 1, T_s >= 0, T_sur >= 0.
double HRad(double emis, double t_s, double t_sur, Sink& sink);

}  // namespace heatdeck::library
