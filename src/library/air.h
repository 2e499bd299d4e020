// Family 'air' of the heat-transfer library: dry air, SI units (K, Pa,
// kg/m^3, J/(kg*K), Pa*s, W/(m*K)).
//
// Registered functions (LIBRARY.md "Fluid properties"), each an error outside
// 200 K <= T <= 1000 K:
//   air_rho(T, p)  ideal gas p*M/(R_u*T), M = 28.9586 g/mol (Lemmon et al.
//                  2000), R_u = 8.314462618 J/(mol*K); error unless p > 0
//   air_cp(T)      ideal-gas heat capacity of Lemmon et al. 2000
//   air_mu(T)      dilute-gas viscosity eta0 of Lemmon & Jacobsen 2004
//   air_k(T)       dilute-gas thermal conductivity lambda0 of Lemmon &
//                  Jacobsen 2004
//   air_pr(T)      cp*mu/k from the three above
// The three property functions are zero-density limits: at 1 atm they lie
// within 0.5 % of the full equations of state and transport correlations
// over 200-1000 K (largest at 200 K: cp -0.4 %, mu -0.13 %, k -0.27 %,
// against iapws 1.5.2).
//
// The building blocks, exposed for tests; no range checks:
#pragma once

namespace heatdeck::library::air {

// Lemmon, Jacobsen, Penoncello & Friend (2000), J. Phys. Chem. Ref. Data
// 29(3) 331, ideal-gas part of the air equation of state:
//   cp0/R = 1 + N7 - 12 N1 (T/Tj)^3 - 6 N2 (T/Tj)^2 - 2 N3 (T/Tj)
//           - 0.75 N6 (Tj/T)^1.5 + sum_{k=8,9} N_k u_k^2 e^u_k/(e^u_k - 1)^2
//           - N10 u_10^2 (2/3) e^u_10/((2/3) + e^u_10)^2,
//   u_k = N_{k+3} Tj/T, Tj = 132.6312 K, R = 8.31451 J/(mol*K) / M.
// J/(kg*K).
double IdealGasCp(double T);

// Lemmon & Jacobsen (2004), Int. J. Thermophys. 25(1) 21, dilute-gas
// viscosity: eta0 = 0.0266958 sqrt(M T)/(sigma^2 Omega(T*)) uPa*s, T* =
// T/(103.3 K), sigma = 0.360 nm, ln Omega = sum_{i=0..4} b_i (ln T*)^i.
// Pa*s.
double DiluteViscosity(double T);

// Lemmon & Jacobsen (2004), dilute-gas thermal conductivity:
// lambda0 = 1.308 eta0/(uPa*s) + 1.405 tau^-1.1 - 1.036 tau^-0.3 mW/(m*K),
// tau = 132.6312 K/T.  W/(m*K).
double DiluteConductivity(double T);

}  // namespace heatdeck::library::air
