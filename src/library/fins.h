// Fin parameter and fin efficiencies by one-dimensional thin-fin theory
// (LIBRARY.md "Fins").  Assumptions common to all: steady one-dimensional
// conduction along the fin (Biot number across the thickness small), constant
// k, uniform h, base at the base temperature.  The forms are those of
// Incropera, DeWitt, Bergman & Lavine, "Fundamentals of Heat and Mass
// Transfer", chapter 3 (fin equation, corrected length L_c, annular fin in
// modified Bessel functions after Gardner 1945).  SI doubles in and out.
// On physically meaningless input each function reports an error to the sink,
// naming the function and the values, and returns NaN.  Efficiencies tend to
// exactly 1 as m*L -> 0 (h = 0 gives 1, never 0/0).
#pragma once

#include "library/registry.h"

namespace heatdeck::library {

// Fin parameter m = sqrt(h*P/(k*A_c)), 1/m.
// Error unless h >= 0, P > 0, k > 0, A_c > 0.
double FinM(double h, double p, double k, double a_c, Sink& sink);

// m of a thin plate fin, P = 2w and A_c = w*t with the edges neglected:
// m = sqrt(2*h/(k*t)), for t much smaller than the fin width.
// Error unless h >= 0, k > 0, t > 0.
double FinMThin(double h, double k, double t, Sink& sink);

// Efficiency of a uniform fin with an adiabatic tip: eta = tanh(m*L)/(m*L).
// Error unless m >= 0, L > 0.
double FinEffAdiabatic(double m, double l, Sink& sink);

// Straight rectangular fin with a convecting tip, through the corrected
// length L_c = L + t/2: eta = tanh(m*L_c)/(m*L_c), m = sqrt(2h/(k*t)).
// Error unless h >= 0, k > 0, t > 0, L > 0.
double FinEffRect(double h, double k, double t, double l, Sink& sink);

// Pin fin of diameter D with a convecting tip, L_c = L + D/4:
// eta = tanh(m*L_c)/(m*L_c), m = sqrt(4h/(k*D)).
// Error unless h >= 0, k > 0, D > 0, L > 0.
double FinEffPin(double h, double k, double d, double l, Sink& sink);

// Annular fin of constant thickness t between radii r_1 (base) and r_2,
// exact solution of the radial fin equation with the corrected tip radius
// r_2c = r_2 + t/2 and m = sqrt(2h/(k*t)):
//   eta = 2*r_1/(m*(r_2c^2 - r_1^2))
//         * [K1(m r_1) I1(m r_2c) - I1(m r_1) K1(m r_2c)]
//         / [I0(m r_1) K1(m r_2c) + K0(m r_1) I1(m r_2c)].
// Tends to FinEffRect(h, k, t, r_2 - r_1) as r_2/r_1 -> 1.  Accurate for any
// m*r_2c (no overflow of I, no underflow of K).
// Error unless h >= 0, k > 0, t > 0, r_2 > r_1 > 0.
double FinEffAnnular(double h, double k, double t, double r_1, double r_2, Sink& sink);

// Overall surface efficiency of a finned surface:
// eta_o = 1 - (A_fins/A_total)*(1 - eta_f), from the heat balance
// (A_total - A_fins + eta_f*A_fins)/A_total.
// Error unless 0 <= eta_f <= 1, A_total > 0, 0 <= A_fins <= A_total.
double FinEffArray(double eta_f, double a_fins, double a_total, Sink& sink);

}  // namespace heatdeck::library
