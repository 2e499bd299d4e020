// Convection correlations: Nusselt numbers for tube flow, crossflow over a
// cylinder and natural convection, and the Petukhov smooth-tube friction
// factor that Gnielinski's correlation uses (LIBRARY.md "Convection
// correlations").  SI doubles in and out; every argument is dimensionless
// except the viscosities and lengths named below.
//
// Outside a method's validity range the result is still returned and a
// warning goes to the sink; the text names the range, the offending value
// and the source.  Physically meaningless input (a non-positive Pr, a
// negative Re, a formula that has no value) is an error: the sink gets a
// message naming the function and the values and the result is NaN.
#pragma once

#include "library/registry.h"

namespace heatdeck::library {

// Dittus & Boelter (1930), fully developed turbulent flow in smooth tubes:
//   Nu = 0.023 Re^0.8 Pr^n, n = 0.4 when the fluid is heated, 0.3 cooled.
// Validity (as given by Incropera et al.): Re >= 10000, 0.6 <= Pr <= 160;
// warnings outside, and when n is neither 0.3 nor 0.4.
// Error unless Re > 0, Pr > 0.
double NuDittusBoelter(double re, double pr, double n, Sink& sink);

// Sieder & Tate (1936), turbulent flow in tubes with a property correction:
//   Nu = 0.027 Re^0.8 Pr^(1/3) (mu_bulk/mu_wall)^0.14.
// Validity: Re >= 10000, 0.7 <= Pr <= 16700; warnings outside.
// Error unless Re > 0, Pr > 0, mu_bulk > 0, mu_wall > 0 (Pa*s).
double NuSiederTate(double re, double pr, double mu_bulk, double mu_wall, Sink& sink);

// Petukhov (1970) Darcy friction factor of a smooth tube:
//   f = (0.790 ln Re - 1.64)^-2.
// Validity: 3000 <= Re <= 5e6; warnings outside.
// Error where the bracket is not positive (Re <= exp(1.64/0.790) = 7.97).
double FPetukhov(double re, Sink& sink);

// Gnielinski (1976), turbulent and transitional flow in tubes:
//   Nu = (f/8)(Re - 1000) Pr / (1 + 12.7 sqrt(f/8) (Pr^(2/3) - 1)),
// with f from FPetukhov.  Validity: 3000 <= Re <= 5e6, 0.5 <= Pr <= 2000;
// warnings outside.  Error unless Re > 1000 and Pr > 0, or where the
// denominator is not positive.
double NuGnielinski(double re, double pr, Sink& sink);

// Gnielinski (1976) with a given Darcy friction factor f (e.g. Colebrook
// for a rough tube).  Same formula, validity and errors, and f > 0.
double NuGnielinskiF(double re, double pr, double f, Sink& sink);

// Hausen (1943), laminar thermal entry length, constant wall temperature,
// mean Nusselt number over the length L:
//   Nu = 3.66 + 0.0668 Gz / (1 + 0.04 Gz^(2/3)),  Gz = (D/L) Re Pr.
// Validity: Re < 2300 (laminar); warning at Re >= 2300.
// Error unless Re >= 0, Pr > 0, D > 0, L > 0 (D and L in m).
double NuHausen(double re, double pr, double d, double l, Sink& sink);

// Tube flow over all regimes (D, L in m):
//   Re < 2300:          NuHausen(Re, Pr, D, L)          note "laminar (Hausen)"
//   Re >= 10000:        NuGnielinski(Re, Pr)            note "turbulent (Gnielinski)"
//   in between:         (1 - g) NuHausen(2300, Pr, D, L) + g NuGnielinski(10000, Pr),
//                       g = (Re - 2300)/(10000 - 2300)  note "transition (...)"
// the transition interpolation recommended by Gnielinski (VDI Heat Atlas).
// Continuous at Re = 2300 and 10000.  The regime is recorded with
// sink.Note().  Warnings: Re > 5e6, and Pr outside 0.5 ... 2000 when the
// Gnielinski correlation takes part (Re >= 2300).
// Error unless Re >= 0, Pr > 0, D > 0, L > 0.
double NuTube(double re, double pr, double d, double l, Sink& sink);

// Churchill & Bernstein (1977), mean Nu of a circular cylinder in crossflow:
//   Nu = 0.3 + 0.62 Re^(1/2) Pr^(1/3) / [1 + (0.4/Pr)^(2/3)]^(1/4)
//            * [1 + (Re/282000)^(5/8)]^(4/5).
// Validity: Re Pr >= 0.2; warning below.  Error unless Re > 0, Pr > 0.
double NuChurchillBernstein(double re, double pr, Sink& sink);

// Churchill & Chu (1975), natural convection on a vertical plate (mean Nu
// over the height, any Ra):
//   Nu = {0.825 + 0.387 Ra^(1/6) / [1 + (0.492/Pr)^(9/16)]^(8/27)}^2.
// No range warning.  Error unless Ra >= 0, Pr > 0.
double NuChurchillChuPlate(double ra, double pr, Sink& sink);

// Churchill & Chu (1975), natural convection on a long horizontal cylinder:
//   Nu = {0.60 + 0.387 Ra^(1/6) / [1 + (0.559/Pr)^(9/16)]^(8/27)}^2.
// Validity: Ra <= 1e12; warning above.  Error unless Ra >= 0, Pr > 0.
double NuChurchillChuCyl(double ra, double pr, Sink& sink);

}  // namespace heatdeck::library
