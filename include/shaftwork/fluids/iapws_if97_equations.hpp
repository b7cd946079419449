// shaftwork/fluids/iapws_if97_equations.hpp — the published equations of IAPWS-IF97, one
// function each, in SI units (Pa, K, kg/m3, J/kg, J/(kg K)).
//
// These are the building blocks of fluids::IapwsIf97 (iapws_if97.hpp), exposed so that the
// tests can check each against the verification table printed with it. They do not check
// their arguments against the region's range: callers (the model) do.
//
// Sources:
//   IF97    IAPWS R7-97(2012), Revised Release on the IAPWS Industrial Formulation 1997 for
//           the Thermodynamic Properties of Water and Steam.
//   SR3-03  IAPWS SR3-03(2014), Revised Supplementary Release on Backward Equations for the
//           Functions T(p,h), v(p,h) and T(p,s), v(p,s) for Region 3 of IF97.
//   SR5-05  IAPWS SR5-05(2016), Revised Supplementary Release on Backward Equations for
//           Specific Volume as a Function of Pressure and Temperature v(p,T) for Region 3.
#pragma once

namespace shaftwork::fluids::if97 {

// IF97 Sec. 3 reference constants.
inline constexpr double kR = 461.526;             // J/(kg K), specific gas constant of IF97
inline constexpr double kMolarMass = 0.018015268;  // kg/mol, molar mass used with IF97
inline constexpr double kTc = 647.096;            // K, critical temperature
inline constexpr double kPc = 22.064e6;           // Pa, critical pressure
inline constexpr double kRhoc = 322.0;            // kg/m3, critical density

// Region limits (IF97 Sec. 2, Fig. 1).
inline constexpr double kTmin = 273.15;     // K
inline constexpr double kT13 = 623.15;      // K, boundary of regions 1 and 3
inline constexpr double kT25 = 1073.15;     // K, boundary of regions 2 and 5
inline constexpr double kTmax = 2273.15;    // K
inline constexpr double kPmax = 100e6;      // Pa, regions 1 to 3
inline constexpr double kPmax5 = 50e6;      // Pa, region 5
inline constexpr double kPsatTmin = 611.212677;  // Pa, psat(273.15 K) (IF97 Eq. 30)
inline constexpr double kPsat623 = 16.5291642526e6;  // Pa, psat(623.15 K) (IF97 Eq. 30)
inline constexpr double kScritical = 4412.02148223476;  // J/(kg K), s at the critical point,
                                                       // the 3a/3b split of SR3-03 T(p,s), v(p,s)

// One state as a basic equation gives it.
struct Point {
  double p = 0;    // Pa
  double T = 0;    // K
  double rho = 0;  // kg/m3
  double h = 0;    // J/kg
  double s = 0;    // J/(kg K)
  double cp = 0;   // J/(kg K)
  double cv = 0;   // J/(kg K)
  double w = 0;    // m/s, speed of sound
  double alpha_v = 0;  // 1/K, isobaric expansivity (1/v)(dv/dT)_p (IF97 Tables 3, 31, 39)
  int region = 0;  // the IF97 region whose basic equation gave the point: 1, 2, 3 or 5
  double u() const { return h - p / rho; }  // J/kg, specific internal energy
};

// --- Basic equations --------------------------------------------------------------------

// Region 1, compressed liquid: g(p,T)/(RT) = gamma(pi, tau) = sum n_i (7.1 - pi)^I_i (tau - 1.222)^J_i,
// pi = p/16.53 MPa, tau = 1386 K/T (IF97 Eq. 7, Table 2).
Point region1(double p, double T);

// Region 2, superheated vapour: gamma = ln(pi) + sum n0_i tau^J0_i + sum n_i pi^I_i (tau - 0.5)^J_i,
// pi = p/1 MPa, tau = 540 K/T (IF97 Eqs. 15-17, Tables 10 and 11). Not the metastable-vapour
// equation (IF97 Sec. 6.2), which this model does not use.
Point region2(double p, double T);

// Region 3, near-critical: f(rho,T)/(RT) = phi(delta, tau) = n1 ln(delta) + sum n_i delta^I_i tau^J_i,
// delta = rho/322 kg/m3, tau = 647.096 K/T (IF97 Eq. 28, Table 30). The pressure is an output.
Point region3(double rho, double T);

// Region 5, high temperature: gamma = ln(pi) + sum n0_i tau^J0_i + sum n_i pi^I_i tau^J_i,
// pi = p/1 MPa, tau = 1000 K/T (IF97 Eqs. 32-34, Tables 37 and 38).
Point region5(double p, double T);

// Region 4, saturation line (IF97 Eqs. 30 and 31, Table 34), 273.15 K to 647.096 K.
double saturation_pressure(double T);     // Pa
double saturation_temperature(double p);  // K

// --- Region boundaries --------------------------------------------------------------------

// B23: p = n1 + n2 T + n3 T^2 and its inverse (IF97 Eqs. 5 and 6, Table 1), 623.15 to 863.15 K.
double b23_pressure(double T);     // Pa
double b23_temperature(double p);  // K
// B2bc: the 2b/2c boundary of the backward equations (IF97 Eqs. 20 and 21, Table 19).
double b2bc_pressure(double h);  // Pa
double b2bc_enthalpy(double p);  // J/kg
// B3ab: the 3a/3b boundary of SR3-03's backward equations (SR3-03 Eq. 1, Table 2).
double b3ab_enthalpy(double p);  // J/kg

// --- Backward equations (starting values; the model refines them) -----------------------

double region1_T_ph(double p, double h);  // IF97 Eq. 11, Table 6
double region1_T_ps(double p, double s);  // IF97 Eq. 13, Table 8

// Subregions of region 2 for the backward equations: 2a for p <= 4 MPa; above that, 2b/2c
// split by B2bc for (p,h) and by s = 5.85 kJ/(kg K) for (p,s) (IF97 Sec. 6.3).
enum class Subregion2 { a, b, c };
Subregion2 region2_subregion_ph(double p, double h);
Subregion2 region2_subregion_ps(double p, double s);
double region2_T_ph(double p, double h);  // IF97 Eqs. 22-24, Tables 20-22
double region2_T_ps(double p, double s);  // IF97 Eqs. 25-27, Tables 25-27

// Region 3, split into 3a/3b by B3ab for (p,h) and by the critical entropy for (p,s).
double region3_T_ph(double p, double h);  // SR3-03 Eqs. 2, 3
double region3_v_ph(double p, double h);  // SR3-03 Eqs. 4, 5; m3/kg
double region3_T_ps(double p, double s);  // SR3-03 Eqs. 6, 7
double region3_v_ps(double p, double s);  // SR3-03 Eqs. 8, 9; m3/kg

// SR5-05: v(p,T) in region 3 from 26 subregions 'a'..'z' (3u-3z are the auxiliary equations
// near the critical point). The subregion follows SR5-05 Tables 2 and 10; where the choice
// depends on the side of the saturation line (p < 22.064 MPa), `side` says which phase is
// meant, so that saturated liquid and vapour at T = Tsat(p) can both be asked for.
enum class Side { by_temperature, liquid, vapour };
char region3_subregion_pt(double p, double T, Side side = Side::by_temperature);
double region3_v_pt(double p, double T, Side side = Side::by_temperature);  // m3/kg
double region3_v_pt_in(char subregion, double p, double T);  // m3/kg; bad_input unless a..z

// SR5-05 boundary equations T3xy(p) [K] between the subregions (SR5-05 Eqs. 2 and 3,
// Table 1; 3uv and 3wx from its auxiliary equations); p in Pa.
enum class Boundary3 { ab, cd, ef, gh, ij, jk, mn, op, qu, rx, uv, wx };
double region3_boundary_temperature(Boundary3 boundary, double p);

}  // namespace shaftwork::fluids::if97
