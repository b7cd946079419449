// shaftwork/machines/guarantee.hpp — test points carried to a guarantee, and a verdict.
//
// A guarantee names a rated point (speed, inlet state, gas or liquid, flow) and the
// values guaranteed there (discharge pressure, head, efficiency, power), each with a
// tolerance in percent of the guaranteed value, or for pumps an ISO 9906:2012 acceptance
// grade. judge() converts every rated test point to the guarantee's conditions, reads the
// curve of converted points at the guaranteed flow, compares, and reports the similarity
// of test and guarantee. docs/guarantee.md gives the methods with their sources:
//   compressors, fans  fan laws at equal flow coefficient, head coefficient and polytropic
//                      efficiency (ASME PTC 10-1997 sec. 5; ISO 5389:2005):
//                        Q_c = Q_t (N_g/N_t),  H_p,c = H_p,t (N_g/N_t)^2,  eta_p,c = eta_p,t;
//                      discharge pressure and power by rating the guarantee inlet state with
//                      H_p,c and eta_p,c; similarity against PTC 10 Table 3.2 (and Fig. 3.3)
//   pumps              ISO 9906:2012 translation to the rated speed:
//                        Q (n_g/n), H (n_g/n)^2, P (n_g/n)^3 rho_g/rho_t, eta unchanged;
//                      the tolerance cross, the efficiency where H(Q) meets the line through
//                      the origin and (Q_G, H_G), the power at Q_G
//   turbines           the test efficiency carried to the guarantee inlet and outlet
//                      pressures; the flow by the choked-nozzle law m ~ sqrt(p_in rho_in)
//                      unless the guarantee fixes it.
// Reynolds-number corrections are not applied. All values SI.
#pragma once

#include <array>
#include <cstddef>
#include <cstdint>
#include <map>
#include <memory>
#include <optional>
#include <span>
#include <string>
#include <string_view>
#include <vector>

#include "shaftwork/fluids/fluid_model.hpp"
#include "shaftwork/machines/rating.hpp"
#include "shaftwork/units/quantity.hpp"

namespace shaftwork::machines {

// The quantities a guarantee may check, each named by its dotted result key.
enum class Checked : std::uint8_t {
  outlet_pressure,
  head_polytropic,
  head_height,
  efficiency_isentropic,
  efficiency_polytropic,
  pump_efficiency,
  power,
  mass_flow,
  volume_flow,
};
inline constexpr std::size_t kCheckedCount = 9;

struct CheckedSpec {
  Checked quantity;
  std::string_view key;  // "outlet.pressure", "pump_efficiency", ...
  units::Dimension dimension;
  std::string_view label;  // for tables: "discharge pressure"
};
const CheckedSpec& checked_spec(Checked quantity);
// The check named by a dotted key, or nullptr.
const CheckedSpec* find_checked(std::string_view key);
inline constexpr std::array<Checked, kCheckedCount> kAllChecked = {
    Checked::outlet_pressure,       Checked::head_polytropic, Checked::head_height,
    Checked::efficiency_isentropic, Checked::efficiency_polytropic, Checked::pump_efficiency,
    Checked::power,                 Checked::mass_flow,       Checked::volume_flow};

// A tolerance in percent of the guaranteed value; an empty bound is unbounded.
struct Tolerance {
  std::optional<double> min_percent;
  std::optional<double> max_percent;
  bool operator==(const Tolerance&) const = default;
};

// An acceptance grade of ISO 9906:2012 (Table 8), as data/acceptance.txt holds it.
struct PumpGrade {
  std::string name;  // "1B"
  Tolerance flow, head, power, efficiency;
  std::string source;  // the source named beside the row
};
// The grades in file order; the data file is checked when first read (a defect there
// throws bad_input naming its line).
const std::vector<PumpGrade>& pump_grades();
const PumpGrade* find_pump_grade(std::string_view name);

// Similarity limits (data/acceptance.txt): a ratio's [low, high] with its source, and the
// machine Mach number's allowed departure M_t - M_sp read off a curve against M_sp.
struct SimilarityLimits {
  double low = 0, high = 0;
  std::string source;
};
const SimilarityLimits& similarity_limits(std::string_view parameter);  // throws for an unknown name
// The allowed [lower, upper] of M_t - M_sp at specified Mach number m_sp (linear between
// the rows read off the figure; beyond the last row, the last row's limits).
SimilarityLimits mach_number_limits(double m_sp);

// The guarantee point. Empty values default to the test's (inlet state, fluid) or are
// not guaranteed.
struct Guarantee {
  std::optional<double> speed;                                 // rev/s
  std::optional<double> inlet_pressure;                        // Pa
  std::optional<double> inlet_temperature;                     // K
  std::shared_ptr<const fluids::FluidModel> fluid;             // empty: the test's
  std::optional<double> mass_flow;                             // kg/s
  std::optional<double> volume_flow;                           // m3/s at the guarantee inlet
  std::optional<double> standard_volume_flow;                  // mol/s
  // By Checked, SI. outlet.pressure is checked for compressors, gives the guaranteed head
  // of pumps that guarantee no head, and is the exhaust pressure of turbines (default: the test's).
  std::array<std::optional<double>, kCheckedCount> guaranteed;
  std::array<std::optional<Tolerance>, kCheckedCount> tolerance;  // by Checked; empty: none given
  std::optional<std::string> grade;                            // pumps: an ISO 9906 grade instead
  double barometer = 101325.0;  // Pa: the site barometer the guarantee's gauge pressures were read against
  bool flow_given() const { return mass_flow || volume_flow || standard_volume_flow; }
  std::optional<double>& value(Checked q) { return guaranteed[static_cast<std::size_t>(q)]; }
  const std::optional<double>& value(Checked q) const { return guaranteed[static_cast<std::size_t>(q)]; }
};

// One rated test point.
struct TestPoint {
  std::string id;
  RatingInput input;  // as rated: fluid, speed, impeller, mechanical efficiency
  Rating rating;
  // Expanded uncertainty (95 %, k = 2) of the test's results, SI, by dotted result key;
  // empty when the test carries none. The uncertainty of a checked quantity is taken as
  // the same fraction of the converted value as of the measured one.
  std::map<std::string, double, std::less<>> uncertainty;
};

enum class Verdict : std::uint8_t { pass, inconclusive, fail };  // in rising severity
const char* verdict_name(Verdict v);

// pass when the deviation lies within the tolerance (bounds included); inconclusive when
// it lies beyond by less than the expanded uncertainty U (percent of the guaranteed value);
// fail otherwise.
Verdict judge_deviation(double deviation_percent, const Tolerance& tolerance,
                        std::optional<double> uncertainty_percent);

enum class ToleranceFrom : std::uint8_t { given, grade, none_given };

struct Check {
  Checked quantity;
  std::optional<double> measured;   // at test conditions (the test point nearest the guarantee flow)
  std::optional<double> converted;  // at guarantee conditions; empty: the curve never reaches it
  double guaranteed = 0;
  std::optional<double> deviation_percent;  // 100 (converted - guaranteed) / guaranteed
  Tolerance tolerance;
  ToleranceFrom tolerance_from = ToleranceFrom::none_given;
  std::optional<double> uncertainty_percent;
  Verdict verdict = Verdict::fail;
  std::string note;  // how the value was read ("tolerance cross", ...), or ""
};

struct SimilarityCheck {
  std::string parameter;  // "specific_volume_ratio", "flow_coefficient", "machine_mach_number", "speed_ratio"
  std::string point;      // the test point's id
  std::optional<double> test, guarantee;  // the two values compared, where they exist alone
  std::optional<double> ratio;            // test over guarantee: the limits apply to it ...
  std::optional<double> difference;       // ... or to test - guarantee (Mach number)
  double low = 0, high = 0;
  bool within = false;
  std::string source;
};

// A value at guarantee conditions, by dotted key, for the writers.
struct NamedValue {
  std::string key;
  units::Dimension dimension;
  double value = 0;
};

struct ConvertedPoint {
  std::string id;
  double speed_ratio = 1;  // N_g / N_t
  std::vector<NamedValue> values;
};

// One quantity of the converted points against flow, as judge() read it: what a chart of
// the guarantee draws (charts/guarantee_chart.hpp) without converting anything again. SI;
// flows are the guarantee's volume flows (a pump's Q, a compressor's inlet volume flow).
struct CurveReading {
  std::string key;  // "head_height", "pump_efficiency", "head.polytropic", "efficiency.polytropic", ...
  units::Dimension dimension = units::Dimension::fraction;
  std::vector<double> flow, value;  // the converted points, flow ascending
  // The curve through them: least squares y = c0 + c1 Q + c2 Q^2 (pumps), or, when empty,
  // straight lines between neighbours, the end lines extended (compressors; one point: flat).
  std::vector<double> coefficients;
  // Where the judge read the curve and what it read there (the value its check compared).
  double read_flow = 0, read_value = 0;
  // The guarantee in this quantity, when it guarantees one: its value at the guaranteed
  // flow, and its tolerance as values of this quantity (an empty bound is open), and the
  // check that decided it. A compressor guaranteeing its discharge pressure (and no head)
  // has that pressure shown here as the polytropic head it asks of the guarantee inlet
  // with the efficiency read at Q_G (check: outlet_pressure), so that the head read at Q_G
  // lies above it exactly when the converted discharge pressure lies above the guaranteed.
  std::optional<double> guaranteed, low, high;
  std::optional<Checked> check;

  // The curve at flow q [m3/s].
  double at(double q) const;
};

struct CurveReadings {
  double guaranteed_flow = 0;  // Q_G, m3/s
  // Pumps with a guaranteed head: the tolerance cross's flow bar at H_G, Q_G (1 + t_Q)
  // (an empty bound is open); the head reading carries the head bar at Q_G.
  std::optional<double> flow_low, flow_high;
  bool cross = false;
  std::vector<CurveReading> quantities;  // the head first, then the efficiency
};

struct GuaranteeResult {
  MachineKind machine = MachineKind::compressor;
  Verdict verdict = Verdict::pass;
  std::string method;  // one line: how the points were converted and read
  std::optional<std::string> grade;  // the ISO 9906 grade the tolerances came from
  double barometer = 101325.0;  // Pa: the guarantee's site barometer, for its values shown as gauge pressures
  std::vector<Check> checks;
  std::vector<SimilarityCheck> similarity;
  std::vector<NamedValue> converted;  // the guarantee point as read off the converted curve
  std::vector<ConvertedPoint> points;
  std::string nearest_point;  // the id whose measured values the checks show
  std::vector<std::string> warnings;
  // The curves the checks were read on (pumps and compressors; turbines: none).
  std::optional<CurveReadings> readings;
};

// The check of q among r's, or nullptr.
const Check* find_check(const GuaranteeResult& r, Checked q);

// Converts `points` (rated, all of one machine kind) to `guarantee` and judges it.
// Throws bad_input with a message for the user when the guarantee cannot be judged: no
// flow (compressors, pumps), a pump grade on another machine, a guaranteed flow beyond the
// converted test flows by more than kExtrapolationLimit, a test point without the
// flow, speed or power the conversion needs, nothing to check.
GuaranteeResult judge(const Guarantee& guarantee, std::span<const TestPoint> points);

// How far beyond the converted test flows a curve is read: 5 % of the nearest end's flow.
inline constexpr double kExtrapolationLimit = 0.05;

}  // namespace shaftwork::machines
