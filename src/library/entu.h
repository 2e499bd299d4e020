// Effectiveness–NTU relations (LIBRARY.md "Effectiveness–NTU").  SI doubles
// (all dimensionless) in and out.
//
// NTU = UA/C_min, Cr = C_min/C_max in [0, 1], eff = Q/(C_min*(T_h_in - T_c_in)).
// The relations are those of Kays & London, "Compact Heat Exchangers", as
// tabulated in Incropera, DeWitt, Bergman & Lavine, "Fundamentals of Heat and
// Mass Transfer", ch. 11; the exact unmixed-crossflow series is Mason's (1954).
//
// The functions below are the unchecked kernels: their preconditions are
// stated and not tested.  The registered library functions (RegisterEntu)
// check the arguments first and report an error naming the value for NTU < 0,
// Cr outside [0, 1], n not a positive whole number, NaN, and for an inverse
// whose eff is negative or not below the arrangement's maximum effectiveness
// (the message names that maximum).  None of them has a validity warning.
// A Cr in (1, 1 + 1e-12], the rounding of a balanced exchanger's
// C_min/C_max, is read as 1.
//
// Every eff kernel is exact at Cr = 0: it returns -expm1(-NTU) = 1 - e^-NTU,
// the value for a condensing or boiling stream, and is continuous as Cr -> 0.
// The Cr -> 1 limits are reached without cancellation.  None allocates.
#pragma once

namespace heatdeck::library::entu {

// Precondition of every eff kernel: NTU finite and >= 0, 0 <= Cr <= 1.

// Parallel flow: eff = [1 - e^(-NTU(1+Cr))]/(1+Cr).  Any NTU.
double Parallel(double ntu, double cr);

// Counterflow: eff = [1 - e^(-NTU(1-Cr))]/[1 - Cr e^(-NTU(1-Cr))], evaluated
// as k/(1 + Cr k) with k = (1 - e^(-NTU(1-Cr)))/(1 - Cr) = NTU*phi(NTU(1-Cr)),
// phi(y) = (1 - e^-y)/y, so that Cr = 1 gives NTU/(1+NTU) with no branch.
double Counter(double ntu, double cr);

// n shell passes in series (each one shell pass, 2, 4, ... tube passes,
// shell fluid mixed), the 1-2 relation per shell with N = NTU/n:
//   eff1 = 2 / {1 + Cr + S (1 + e^(-N S))/(1 - e^(-N S))},  S = sqrt(1 + Cr^2)
// combined by the series rule with X = (1 - eff1 Cr)/(1 - eff1):
//   eff = (X^n - 1)/(X^n - Cr),  Cr = 1: n eff1/(1 + (n-1) eff1).
// Precondition: n a whole number >= 1.
double Shell(double ntu, double cr, double n);

// Single-pass crossflow, both fluids unmixed, the exact series (Mason 1954):
//   eff = 1/(Cr NTU) sum_{n>=0} [1 - e^-NTU sum_{m<=n} NTU^m/m!]
//                              * [1 - e^-(Cr NTU) sum_{m<=n} (Cr NTU)^m/m!]
// Each bracket is the upper tail P(N > n) of a Poisson count N of mean NTU
// (resp. Cr NTU); they are summed exactly from the far tail downwards, which
// needs no subtraction, so the result holds to about 1e-14 relative at
// NTU = 50.  Cost: about NTU + 10 sqrt(NTU) + 40 loop steps, no allocation.
// Precondition: NTU <= kMaxSeriesNtu.
double CrossUnmixed(double ntu, double cr);
inline constexpr double kMaxSeriesNtu = 1e6;

// The common one-line approximation to CrossUnmixed:
//   eff = 1 - exp[(NTU^0.22/Cr)(exp(-Cr NTU^0.78) - 1)]
// (Incropera et al., Table 11.3).  Within 4 % relative and 0.02 absolute of
// the exact series for NTU <= 10 at every Cr (largest deviations near
// NTU = 0.3, Cr = 1 and NTU = 10, Cr = 0.8; tests/library/entu_test.cpp).
double CrossUnmixedApprox(double ntu, double cr);

// Single-pass crossflow, C_max fluid mixed, C_min fluid unmixed:
//   eff = (1/Cr)(1 - exp(-Cr(1 - e^-NTU))).
double CrossCmaxMixed(double ntu, double cr);

// Single-pass crossflow, C_min fluid mixed, C_max fluid unmixed:
//   eff = 1 - exp(-(1/Cr)(1 - e^(-Cr NTU))).
double CrossCminMixed(double ntu, double cr);

// Single-pass crossflow, both fluids mixed:
//   eff = [1/(1 - e^-NTU) + Cr/(1 - e^(-Cr NTU)) - 1/NTU]^-1  (0 at NTU = 0).
double CrossMixed(double ntu, double cr);

// Maximum effectiveness of each arrangement at Cr (its limit as NTU -> inf,
// never reached at finite NTU).  Precondition 0 <= Cr <= 1.
double MaxParallel(double cr);         // 1/(1+Cr)
double MaxCounter(double cr);          // 1
double MaxShell(double cr, double n);  // series rule on 2/(1 + Cr + S)
double MaxCrossUnmixed(double cr);     // 1
double MaxCrossCmaxMixed(double cr);   // (1 - e^-Cr)/Cr, 1 at Cr = 0
double MaxCrossCminMixed(double cr);   // 1 - e^(-1/Cr), 1 at Cr = 0

// Inverses: the NTU at which the arrangement reaches eff.  Precondition for
// all: 0 <= eff < Max*(Cr), 0 <= Cr <= 1 (and n as above).
//
// ntu = ln[(1 - Cr eff)/(1 - eff)]/(1 - Cr); Cr = 1: eff/(1 - eff).
double NtuCounter(double eff, double cr);
// ntu = -ln[1 - eff(1+Cr)]/(1+Cr).
double NtuParallel(double eff, double cr);
// Per shell eff1 from the inverted series rule (Cr = 1: eff/(n - (n-1) eff)),
// then NTU = n * (2/S) artanh(S eff1/(2 - (1+Cr) eff1)), which is the 1-2
// inverse -S^-1 ln[(E-1)/(E+1)], E = (2/eff1 - (1+Cr))/S, times n.
double NtuShell(double eff, double cr, double n);
// ntu = -ln(1 + ln(1 - Cr eff)/Cr); Cr = 0: -ln(1 - eff).
double NtuCrossCmaxMixed(double eff, double cr);
// ntu = -ln(1 + Cr ln(1 - eff))/Cr; Cr = 0: -ln(1 - eff).
double NtuCrossCminMixed(double eff, double cr);
// No closed form: Brent's bracketed root of CrossUnmixed(ntu, Cr) = eff,
// bracketed below by NtuCounter (no arrangement beats counterflow), to 1e-12
// relative.  Returns NaN when the root lies above kMaxSeriesNtu.
double NtuCrossUnmixed(double eff, double cr);

}  // namespace heatdeck::library::entu
