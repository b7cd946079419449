// shaftwork/machines/rating.hpp — rate a steady-flow machine from any consistent set of knowns.
//
// Seven quantities tie an adiabatic steady-flow machine together: inlet pressure p1,
// inlet temperature T1 (or enthalpy h1), outlet pressure p2, outlet temperature T2
// (or enthalpy h2, or quality), flow, shaft power P and efficiency. Two relations
// hold between them (docs/method.md gives the sources):
//   efficiency definition, isentropic:  compression  eta_s = (h2s - h1) / (h2 - h1)
//                                       expansion    eta_s = (h1 - h2) / (h1 - h2s)
//     with h2s = h(p2, s1); polytropic (path integral, dh = v dp / eta_p in
//     compression, dh = eta_p v dp in expansion),
//   energy balance:  compressor, pump  P = m (h2 - h1) / eta_m
//                    turbine           P = eta_m m (h1 - h2).
// Any five known: the other two are solved. Six known (all but efficiency): the
// efficiency comes from the fluid side and the power balance is reported.
// All values SI: Pa, K, J/kg, J/(kg K), kg/s, m3/s, mol/s, W.
#pragma once

#include <array>
#include <cstddef>
#include <functional>
#include <map>
#include <memory>
#include <optional>
#include <string>
#include <string_view>
#include <vector>

#include "shaftwork/fluids/fluid_model.hpp"

namespace shaftwork::machines {

enum class MachineKind { compressor, turbine, pump };
const char* machine_name(MachineKind kind);

enum class EfficiencyBasis { isentropic, polytropic };

// How the flow was given: it becomes a mass flow once the inlet state is known.
struct Flow {
  enum class Kind { mass, actual_volume, molar };
  Kind kind = Kind::mass;
  double value = 0;  // kg/s, m3/s at inlet, or mol/s (from a standard volume flow)
};

struct Efficiency {
  EfficiencyBasis basis = EfficiencyBasis::isentropic;
  double value = 0;  // in (0, 1]
};

// The quantities a case may give, by the dotted key users write. Used to name the
// quantity to add or drop, and to echo values in the units the user wrote them in.
enum class Quantity {
  inlet_pressure,
  inlet_temperature,
  outlet_pressure,
  outlet_temperature,
  flow,
  power,
  efficiency,
};
const char* quantity_key(Quantity q);  // "outlet.pressure", "mass_flow", ...

// Writes an SI value the way the user wrote that quantity (their unit) for messages.
using ValueEcho = std::function<std::string(Quantity, double si_value)>;

struct RatingInput {
  MachineKind machine = MachineKind::compressor;
  std::shared_ptr<const fluids::FluidModel> fluid;

  std::optional<double> inlet_pressure;     // Pa
  std::optional<double> inlet_temperature;  // K
  std::optional<double> inlet_enthalpy;     // J/kg, instead of the temperature
  std::optional<double> outlet_pressure;    // Pa
  std::optional<double> outlet_temperature; // K
  std::optional<double> outlet_enthalpy;    // J/kg, instead of the temperature
  std::optional<double> outlet_quality;     // vapour fraction of a wet outlet
  std::optional<double> pump_head;          // J/kg; outlet pressure = p1 + rho1 * head
  std::optional<Flow> flow;
  std::optional<double> power;              // shaft power at the coupling, W, > 0
  std::optional<Efficiency> efficiency;
  double mechanical_efficiency = 1.0;       // in (0, 1]

  ValueEcho echo;  // optional; SI text when empty
};

struct PowerBalance {
  double fluid_power = 0;         // W, m |h2 - h1|
  double shaft_power = 0;         // W, from the fluid side with eta_m
  double given_power = 0;         // W
  double difference_percent = 0;  // 100 (shaft - given) / given
};

// A given quantity that the fluid side also determined: both values reported.
struct RedundantCheck {
  std::string key;       // dotted key, e.g. "efficiency.isentropic"
  double given = 0;
  double computed = 0;
};

// The solved quantities (at most two), in the order of the seven. A fixed list of
// enums rather than strings, so that rating a million cases allocates nothing for
// it; keys() gives the contract's dotted keys for output.
class SolvedFor {
 public:
  void push_back(Quantity q) { items_[size_++] = q; }
  std::size_t size() const { return size_; }
  bool empty() const { return size_ == 0; }
  const Quantity* begin() const { return items_.data(); }
  const Quantity* end() const { return items_.data() + size_; }
  bool contains(Quantity q) const;
  bool contains(std::string_view key) const;  // a dotted key: "outlet.temperature"
  std::vector<std::string> keys() const;

 private:
  std::array<Quantity, 7> items_{};
  std::size_t size_ = 0;
};
// True when `solved` holds exactly these dotted keys, in this order.
bool operator==(const SolvedFor& solved, const std::vector<std::string>& keys);

struct Rating {
  MachineKind machine = MachineKind::compressor;
  std::string model;
  SolvedFor solved_for;  // dotted keys per the contract (SolvedFor::keys())
  fluids::State inlet;
  fluids::State outlet;
  fluids::State outlet_isentropic;
  double mass_flow = 0;           // kg/s
  double volume_flow = 0;         // m3/s at inlet conditions
  double power = 0;               // W, shaft
  double fluid_power = 0;         // W
  double efficiency_isentropic = 0;
  double efficiency_polytropic = 0;
  double mechanical_efficiency = 1;
  double head_isentropic = 0;     // J/kg
  double head_polytropic = 0;     // J/kg
  double pressure_ratio = 0;      // >= 1
  std::optional<double> head_height;  // m, pumps
  std::optional<PowerBalance> power_balance;
  std::vector<RedundantCheck> checks;
  std::vector<std::string> warnings;
};

// Rates one machine. Throws shaftwork::Error with a message for the user when the
// set of knowns is incomplete, contradictory or has no solution.
Rating rate(const RatingInput& input);

// Outlet enthalpy [J/kg] reached from `inlet` at outlet pressure p2 with the given
// efficiency, and the isentropic outlet state. Exposed for tests and benchmarks.
struct OutletFromEfficiency {
  double enthalpy = 0;
  fluids::State isentropic;
};
OutletFromEfficiency outlet_from_efficiency(const fluids::FluidModel& fluid, MachineKind machine,
                                            const fluids::State& inlet, double p2,
                                            const Efficiency& efficiency);

// Isentropic and polytropic efficiencies of the process inlet -> outlet.
struct ProcessEfficiencies {
  double isentropic = 0;
  double polytropic = 0;
  fluids::State isentropic_outlet;
};
ProcessEfficiencies efficiencies_of(const fluids::FluidModel& fluid, MachineKind machine,
                                    const fluids::State& inlet, const fluids::State& outlet);

}  // namespace shaftwork::machines
