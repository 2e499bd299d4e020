// Family 'water' of the heat-transfer library: properties of liquid water and
// the saturation line, in SI units (K, Pa, kg/m^3, J/(kg*K), Pa*s, W/(m*K)).
//
// Registered functions (LIBRARY.md "Fluid properties"):
//   water_rho(T, p)  density 1/v, IAPWS-IF97 region 1
//   water_cp(T, p)   isobaric heat capacity, IAPWS-IF97 region 1
//   water_mu(T, p)   viscosity, IAPWS 2008 (R12-08) at the IF97 density
//   water_k(T, p)    thermal conductivity, IAPWS 2011 (R15-11) at the IF97
//                    density, with its critical-enhancement term (industrial
//                    route)
//   water_pr(T, p)   cp*mu/k from the three above
//     valid 273.15 K <= T <= 623.15 K and p_sat(T) <= p <= 100 MPa; error
//     outside ("water is vapour at ..." when p < p_sat(T)).
//   water_psat(T)    IF97 region 4 saturation-pressure equation; error
//                    outside 273.15 K ... 647.096 K
//   water_tsat(p)    IF97 region 4 backward equation; error outside
//                    p_sat(273.15 K) = 611.213 Pa ... 22.064 MPa
//
// The functions below are the building blocks, exposed for tests and for
// callers that already hold a density.  They do no range checks.
#pragma once

namespace heatdeck::library::water {

// IAPWS-IF97 region 1 (IAPWS R7-97(2012), Eq. 7 with Table 2): the Gibbs free
// energy g(p, T) = R*T*gamma(pi, tau), pi = p/16.53 MPa, tau = 1386 K/T,
// gamma = sum of 34 terms n_i (7.1 - pi)^I_i (tau - 1.222)^J_i, R = 461.526
// J/(kg*K).  Properties from its derivatives (R7-97 Table 3).  Meant for
// 273.15 K <= T <= 623.15 K, p_sat(T) <= p <= 100 MPa.
struct Region1 {
  double v;        // specific volume, m^3/kg
  double h;        // specific enthalpy, J/kg
  double u;        // specific internal energy, J/kg
  double s;        // specific entropy, J/(kg*K)
  double cp;       // isobaric heat capacity, J/(kg*K)
  double cv;       // isochoric heat capacity, J/(kg*K)
  double w;        // speed of sound, m/s
  double drho_dp;  // (d rho / d p) at constant T, kg/(m^3*Pa) = s^2/m^2
};
Region1 If97Region1(double T, double p);

// IAPWS-IF97 region 4 saturation-pressure equation (R7-97 Eq. 30), Pa.
// Meant for 273.15 K <= T <= 647.096 K.
double SaturationPressure(double T);
// IAPWS-IF97 region 4 backward saturation-temperature equation (R7-97
// Eq. 31), K.  Meant for 611.213 Pa <= p <= 22.064 MPa.
double SaturationTemperature(double p);

// IAPWS 2008 viscosity (IAPWS R12-08, Eq. 10) with the critical factor
// mu2 = 1: mu = mu0(T) * mu1(rho, T) * 1e-6 Pa*s, T_c = 647.096 K,
// rho_c = 322 kg/m^3.  R12-08 finds mu2 significantly different from 1 only
// within 645.91 K < T < 650.77 K, 245.8 < rho < 405.3 kg/m^3 (from memory),
// which the liquid range above never reaches.  Pa*s.
double Viscosity(double rho, double T);

// IAPWS 2011 thermal conductivity (IAPWS R15-11, Eq. 10) without the
// critical-enhancement term: lambda0(T) * lambda1(rho, T) * 1e-3 W/(m*K).
double ConductivityBackground(double rho, double T);

// The critical-enhancement term lambda2 of R15-11 (Eqs. 18-25), W/(m*K), for
// a state of density rho, isobaric and isochoric heat capacities cp and cv,
// viscosity mu and (d rho/d p)_T = drho_dp.  zeta at the reference
// temperature 1.5 T_c comes from the R15-11 industrial-use polynomial in
// density (its Eq. 25) rather than from IAPWS-95, which is how
// R15-11 pairs the correlation with IAPWS-IF97.
double ConductivityCriticalEnhancement(double rho, double T, double cp, double cv, double mu,
                                       double drho_dp);

}  // namespace heatdeck::library::water
