// What the three conversions (guarantee_compressor.cpp, guarantee_pump.cpp,
// guarantee_turbine.cpp) share: the guarantee's inlet, flow and speed ratio, and the
// making of a check with its tolerance and verdict. Internal to the machines layer.
#pragma once

#include <memory>
#include <optional>
#include <span>
#include <string>
#include <vector>

#include "shaftwork/machines/guarantee.hpp"

namespace shaftwork::machines {

// The guarantee's fluid and inlet state: its own, else the first test point's.
struct GuaranteeInlet {
  std::shared_ptr<const fluids::FluidModel> fluid;
  fluids::State state;
  bool fluid_changed = false;  // the guarantee names a fluid of its own
};
GuaranteeInlet guarantee_inlet(const Guarantee& g, const TestPoint& first);

// The guaranteed mass flow [kg/s] at the guarantee inlet, from whichever form is given.
double guaranteed_mass_flow(const Guarantee& g, const fluids::State& inlet);
// Refuses a guarantee without a flow: "guarantee: no flow: ...".
void require_flow(const Guarantee& g, MachineKind machine);

// N_g / N_t; 1 for a test point without speed (taken at the rated speed). Refuses a test
// point with speed when the guarantee gives none.
double speed_ratio(const Guarantee& g, const TestPoint& p);

// The check of q: converted against guaranteed, its tolerance (given, the grade's, or
// none: zero on the unfavourable side) and verdict. `nearest` gives the uncertainty.
Check make_check(const Guarantee& g, MachineKind machine, Checked q, std::optional<double> measured,
                 std::optional<double> converted, const TestPoint& nearest, std::string note = {});

// The tolerance of q from the grade (pumps), or empty.
std::optional<Tolerance> grade_tolerance(const Guarantee& g, Checked q);

// The value of q in a rating (the test's measured one, or one rated at the guarantee), or empty.
std::optional<double> rating_value(const Rating& r, Checked q);
// A rating's main values by dotted key, for the "converted" object of a result.
std::vector<NamedValue> rating_values(const Rating& r);

// Flows for messages: "4321.5 m3/h", "12.5 kg/s".
std::string show_volume_flow(double m3_per_s);
std::string show_mass_flow(double kg_per_s);

// The similarity check of a ratio (test over guarantee) against the limits of `parameter`.
SimilarityCheck ratio_check(const std::string& parameter, const std::string& point, std::optional<double> test,
                            std::optional<double> guarantee, double ratio);

// `value` moved by `percent` of itself (a tolerance bound as a value); empty for an open bound.
std::optional<double> tolerance_bound(double value, const std::optional<double>& percent);
// The guarantee of a curve reading from the check made on it: the guaranteed value, the
// tolerance as values of the quantity, and the check.
void set_guarantee(CurveReading& reading, const Check& check);

GuaranteeResult judge_compressor(const Guarantee& g, std::span<const TestPoint> points);
GuaranteeResult judge_pump(const Guarantee& g, std::span<const TestPoint> points);
GuaranteeResult judge_turbine(const Guarantee& g, std::span<const TestPoint> points);

}  // namespace shaftwork::machines
