// Mean temperature difference (LIBRARY.md "Mean temperature difference").
// SI doubles in and out: temperatures and differences in K.
//
// The registered library functions (RegisterMtd) check their arguments and
// report to the sink, naming the values:
//   lmtd, lmtd_counter, lmtd_parallel: error when the two end differences
//     differ in sign or one is zero (a temperature cross or pinch), or an
//     absolute temperature is not above 0 K.
//   fcorr_*: error when the inlets are equal, a stream changes temperature
//     the wrong way, or no F exists (the duty is beyond what the arrangement
//     can deliver at any UA; the message states P, R and, for shells, n);
//     warning when F < 0.75, the usual design minimum (rule of thumb, common
//     practice).
// The kernels below state their own preconditions and do not check them.
// None allocates.
#pragma once

namespace heatdeck::library::mtd {

// Log-mean temperature difference of the two end differences:
//   (dT_a - dT_b)/ln(dT_a/dT_b),  dT_a = dT_b -> dT_a.
// Evaluated as dT_lo/psi(u), u = (dT_hi - dT_lo)/dT_lo >= 0 on the
// magnitudes, psi(u) = ln(1+u)/u, so it is continuous (and exact to rounding)
// as the ends meet.  Precondition: dT_a, dT_b non-zero and of the same sign
// (both negative gives a negative result).
// Source: the log mean follows from integrating dQ = U dA dT along a pure
// counter- or parallel-flow exchanger; e.g. Incropera et al., Fundamentals of
// Heat and Mass Transfer, sec. 11.3.
double Lmtd(double dt_a, double dt_b);

// LMTD correction factor for n shell passes in series, each one shell pass
// with an even number of tube passes and the shell fluid mixed (Bowman,
// Mueller & Nagle, Trans. ASME 62, 1940), in terms of
//   P = (t_out - t_in)/(T_in - t_in),  R = (T_in - T_out)/(t_out - t_in)
// (either stream may be t: F(P, R) = F(P R, 1/R)).  One shell:
//   F = [S/(R-1)] ln[(1-P)/(1-PR)] / ln{[2 - P(R+1-S)]/[2 - P(R+1+S)]},
//   S = sqrt(R^2 + 1),  R = 1: F = [S P/(1-P)] / ln{...};
// n shells: the same F at P1, the single-shell P with the same R,
//   P1 = (1 - Y)/(R - Y),  Y = ((1 - PR)/(1 - P))^(1/n);  R = 1: P/(n - (n-1)P).
// Evaluated with R <= 1 (swapping the streams when R > 1) in forms that
// need no branch at R = 1 and do not lose digits near it.  F = 1 when P = 0
// or R = 0 (an isothermal stream).
// Returns NaN when no F exists: P >= 1, or P1 >= 2/(1 + R + S).
// Precondition: P >= 0, R >= 0 (R may be +inf only with P = 0), n a whole
// number >= 1.
double FcorrShell(double p, double r, double n);

// The largest P (as defined for FcorrShell) that n 1-2 shells in series
// reach at ratio R, approached as UA -> infinity.
double MaxPShell(double r, double n);

// Single-pass crossflow arrangements, named by which stream is mixed.
enum class Cross { kUnmixed, kCminMixed, kCmaxMixed };

// LMTD correction factor from the effectiveness–NTU relations (Kays &
// London, Compact Heat Exchangers): for the same eff and Cr, F is the ratio
// of the UA that counterflow needs to the UA the arrangement needs,
//   F = NTU_counter(eff, Cr)/NTU_arrangement(eff, Cr),
// since Q = UA F dT_lm,counter = eff C_min dT_max for both.  F = 1 when
// eff = 0 or Cr = 0.  Returns NaN where the arrangement cannot reach eff.
// Precondition: 0 <= eff < 1, 0 <= Cr <= 1.
double FcorrCross(Cross arrangement, double eff, double cr);

}  // namespace heatdeck::library::mtd
