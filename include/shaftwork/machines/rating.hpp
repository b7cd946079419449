// shaftwork/machines/rating.hpp — rate a steady-flow machine from any consistent set of knowns.
//
// Two relations hold between the seven quantities of machines/inputs.hpp (docs/method.md
// gives the sources):
//   efficiency definition, isentropic:  compression  eta_s = (h2s - h1) / (h2 - h1)
//                                       expansion    eta_s = (h1 - h2) / (h1 - h2s)
//     with h2s = h(p2, s1); polytropic (path integral, dh = v dp / eta_p in
//     compression, dh = eta_p v dp in expansion),
//   energy balance:  compressor, pump  P = m (h2 - h1) / eta_m
//                    turbine           P = eta_m m (h1 - h2).
// Any five known: the other two are solved. Six known (all but efficiency): the
// efficiency comes from the fluid side and the power balance is reported. With neither
// flow nor power, four of the five specific quantities (p1, T1, p2, T2, efficiency) fix
// the specific results (efficiencies, heads, the outlet state); the size (flow, power)
// is then absent. A redundant given value is reported beside its computed twin.
// All values SI: Pa, K, J/kg, J/(kg K), kg/s, m3/s, W.
#pragma once

#include <array>
#include <cstddef>
#include <initializer_list>
#include <optional>
#include <string>
#include <vector>

#include "shaftwork/fluids/fluid_model.hpp"
#include "shaftwork/machines/inputs.hpp"
#include "shaftwork/machines/schultz.hpp"

namespace shaftwork::machines {

// The quantities a rating solved, in the order of the seven. A fixed set rather than
// strings, so that rating a million cases allocates nothing for it.
class SolvedFor {
 public:
  constexpr SolvedFor() = default;
  constexpr SolvedFor(std::initializer_list<Quantity> quantities) {
    for (Quantity q : quantities) bits_ |= bit(q);
  }
  void add(Quantity q) { bits_ |= bit(q); }
  void remove(Quantity q) { bits_ &= ~bit(q); }
  bool contains(Quantity q) const { return (bits_ & bit(q)) != 0; }
  std::size_t size() const;
  bool empty() const { return bits_ == 0; }
  bool operator==(const SolvedFor& other) const { return bits_ == other.bits_; }
  // The contract's dotted keys ("outlet.temperature", "mass_flow", "efficiency"), in order.
  std::vector<std::string> keys() const;
  // The same joined by `separator`, e.g. "outlet.temperature power".
  std::string joined(const char* separator) const;

 private:
  static constexpr unsigned bit(Quantity q) { return 1u << static_cast<unsigned>(q); }
  unsigned bits_ = 0;
};
// True when `solved` holds exactly these dotted keys, in this order.
bool operator==(const SolvedFor& solved, const std::vector<std::string>& keys);

// Fluid power against the given shaft power, when flow, power and the fluid side are all known.
struct PowerBalance {
  double fluid_power = 0;         // W, m |h2 - h1|
  double shaft_power = 0;         // W, from the fluid side with eta_m
  double given_power = 0;         // W
  double difference_percent = 0;  // 100 (shaft - given) / given
};

// A given efficiency that the states also determined (p1, T1, p2 and T2 all given):
// both reported.
struct EfficiencyCheck {
  Input input;  // efficiency_isentropic or efficiency_polytropic
  double given = 0;
  double computed = 0;  // from the states
};

// Above these a redundant given value is warned about (common practice for field tests,
// not a code's figure: docs/method.md).
inline constexpr double kPowerBalanceWarningPercent = 5.0;  // |difference_percent|
inline constexpr double kEfficiencyWarningPoints = 0.01;     // |given - computed|

struct Rating {
  MachineKind machine = MachineKind::compressor;
  std::string model;
  fluids::FluidKind fluid_kind = fluids::FluidKind::ideal_gas;
  SolvedFor solved_for;
  fluids::State inlet;
  fluids::State outlet;
  fluids::State outlet_isentropic;
  double efficiency_isentropic = 0;
  double efficiency_polytropic = 0;
  double mechanical_efficiency = 1;
  double head_isentropic = 0;   // J/kg, |h2s - h1|
  double head_polytropic = 0;   // J/kg, integral of v dp along the polytropic path
  double specific_work = 0;     // J/kg, |h2 - h1|
  double pressure_ratio = 0;    // >= 1
  // The size of the machine: absent when neither flow nor power was given.
  std::optional<double> mass_flow;    // kg/s
  std::optional<double> volume_flow;  // m3/s at inlet conditions
  std::optional<double> power;        // W, shaft
  std::optional<double> fluid_power;  // W
  // Pumps.
  std::optional<double> head_height;      // m, (p2 - p1) / (rho1 g)
  std::optional<double> hydraulic_power;  // W, rho g Q H = m (p2 - p1) / rho1
  std::optional<double> pump_efficiency;  // hydraulic over shaft power
  // Speed and impeller (machines/impeller.hpp): given speed echoed; the rest need the
  // speed and the impeller's tip diameter.
  std::optional<double> speed;                // rev/s
  std::optional<double> tip_speed;            // m/s
  std::optional<double> flow_coefficient;     // -, needs the flow
  std::optional<double> machine_mach_number;  // -, needs a single-phase inlet
  // Real gases: the Schultz method (ASME PTC 10) beside the path-integral values.
  std::optional<SchultzResult> schultz;
  // Moist gases: the humidity ratio the fluid was made with, kg water per kg dry gas.
  std::optional<double> humidity_ratio;
  std::optional<PowerBalance> power_balance;
  std::optional<EfficiencyCheck> efficiency_check;
  std::vector<std::string> warnings;
  // False when RatingOptions::polytropic skipped the polytropic path: efficiency_polytropic,
  // head_polytropic and schultz then hold nothing to report.
  bool polytropic = true;
};

// What a rating computes beyond the end states, the isentropic efficiency and the size.
// A caller that reports no polytropic result (a batch whose --columns name none) sets
// polytropic to false and the path is skipped, with the refusals that only it raises
// (an outlet below the isentrope, a pressure change lost in the entropies' rounding). A
// given polytropic efficiency is always used and checked.
struct RatingOptions {
  bool polytropic = true;  // efficiency.polytropic, head.polytropic, the Schultz method
};

// Rates one machine. Throws shaftwork::Error with a message for the user when the set of
// knowns is incomplete, contradictory or has no solution.
Rating rate(const RatingInput& input, const RatingOptions& options = {});

}  // namespace shaftwork::machines
