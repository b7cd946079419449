// Pieces of the IF97 model shared between its source files (internal).
#pragma once

#include "shaftwork/fluids/iapws_if97_equations.hpp"

namespace shaftwork::fluids::if97::detail {

// Region 3 at (rho, T) with the partial derivatives a Newton step in (rho, T) needs.
struct Region3Point {
  Point point;
  double dp_drho = 0;  // (dp/drho)_T, Pa m3/kg
  double dp_dT = 0;    // (dp/dT)_rho, Pa/K
  double dh_drho = 0;  // (dh/drho)_T, J m3/kg2
  double dh_dT = 0;    // (dh/dT)_rho, J/(kg K)
  // (ds/drho)_T = -(dp/dT)_rho / rho^2 (Maxwell) and (ds/dT)_rho = cv/T follow from these.
  double ds_drho() const { return -dp_dT / (point.rho * point.rho); }
  double ds_dT() const { return point.cv / point.T; }
};

Region3Point region3_with_derivatives(double rho, double T);

}  // namespace shaftwork::fluids::if97::detail
