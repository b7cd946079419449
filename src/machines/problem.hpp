// The knowns of one rating, checked, with the pieces every pattern of knowns is built
// from: the inlet and outlet states as given, the energy balance and the efficiency
// definition. Read-only: a Problem holds no search state. Internal to the machines layer.
#pragma once

#include <optional>
#include <string>

#include "shaftwork/fluids/fluid_model.hpp"
#include "shaftwork/machines/inputs.hpp"

namespace shaftwork::machines {

[[noreturn]] void refuse(const std::string& message);

class Problem {
 public:
  // Checks the input: a fluid, one form per quantity, each value in its range.
  explicit Problem(const RatingInput& input);

  const RatingInput& in;
  const fluids::FluidModel& fluid;
  const bool compression;  // the machine raises the pressure

  bool known(Quantity q) const { return (known_ & (1u << static_cast<unsigned>(q))) != 0; }
  // A value the way the user wrote it, for messages.
  std::string show(Quantity q, double si) const;

  // The inlet at p1 from the given temperature, enthalpy or quality.
  fluids::State inlet_at(double p1) const;
  // The inlet at (p1, T1): the temperature is being solved.
  fluids::State inlet_at(double p1, double T1) const;
  // The outlet pressure: given, or from the pump head and the inlet density.
  double outlet_pressure_for(const fluids::State& inlet) const;
  // The outlet at p2 from the given temperature, enthalpy or quality.
  fluids::State outlet_given(double p2) const;

  // Mass flow [kg/s] from the given flow in whichever form, at this inlet.
  double mass_flow_for(const fluids::State& inlet) const;
  // h2 - h1 [J/kg], signed, from the energy balance with mass flow m and shaft power P.
  double enthalpy_rise(double m, double P) const;
  // h2 [J/kg] from the energy balance (flow and power given) for this inlet.
  double outlet_enthalpy_by_balance(const fluids::State& inlet) const;
  // h2 [J/kg] from the given efficiency; `isentropic`, when not null, receives (p2, s1).
  double outlet_enthalpy_by_efficiency(const fluids::State& inlet, double p2,
                                       fluids::State* isentropic = nullptr) const;

  // Refuses a pressure change the machine cannot make (or one too small to rate).
  void check_pressure_direction(double p1, double p2) const;

 private:
  unsigned known_ = 0;  // a bit per Quantity given in some form
  void refuse_wet_outlet_temperature(double p2, double T2) const;
};

}  // namespace shaftwork::machines
