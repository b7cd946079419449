// shaftwork/io/display_units.hpp — which unit a result is shown in, and its text.
//
// Tables show each dimension of a case in one unit: the unit the user wrote for that
// dimension (a case given in degF and psig reads in degF and psig), unless --units asked
// for a system; otherwise the system's unit, chosen by size where the trade changes unit
// with size (hp or MW, lb/h or klb/h). CSV columns carry one unit each, the system's.
#pragma once

#include <array>
#include <optional>
#include <string>
#include <string_view>

#include "shaftwork/io/case_input.hpp"
#include "shaftwork/io/result_keys.hpp"
#include "shaftwork/machines/rating.hpp"
#include "shaftwork/units/quantity.hpp"

namespace shaftwork::io {

enum class UnitSystem { si, us };

// The system's unit of a dimension for CSV columns ("" for a fraction): kPa, degC, kg/s,
// m3/h, kW, kJ/kg, m, kJ/(kg K), kg/m3 in si; psia, degF, lb/h, acfm, hp, Btu/lb, ft,
// Btu/(lb R), lb/ft3 in us.
std::string_view column_unit(units::Dimension d, UnitSystem system);

class DisplayUnits {
 public:
  // `forced`: the user asked for `system` (--units): it wins over the units of the case.
  DisplayUnits(UnitSystem system, bool forced, const CaseInput* input, const machines::Rating& rating);

  std::string_view unit(units::Dimension d) const { return units_[static_cast<std::size_t>(d)]; }
  double barometer() const { return barometer_; }
  // The same units with gauge pressures read against another barometer [Pa] (a guarantee's
  // site).
  DisplayUnits on_barometer(double barometer) const {
    DisplayUnits other = *this;
    other.barometer_ = barometer;
    return other;
  }

  // "217.43 degC", "0.7779", "1.5077 kg/s": the value in this case's unit for its
  // dimension, at the row's precision.
  std::string text(double si, units::Dimension d, Precision precision) const;
  // "217.43 ± 0.41 degC": the same with an expanded uncertainty `u_si` (a difference) to
  // two significant digits (GUM 7.2.6); "± n/a" when it is not available.
  std::string text(double si, std::optional<double> u_si, units::Dimension d, Precision precision) const;

 private:
  std::array<std::string, 16> units_;
  double barometer_;
};

// A difference (an uncertainty) of `si` in `unit`: over the unit's scale, without its offset
// or barometer (0.3 K is 0.54 degF, 5000 Pa is 0.05 barg). "" is a fraction: unchanged.
double difference_from_si(double si, std::string_view unit);

// `value` at `precision`: significant digits without trailing zeros, or fixed decimals.
std::string format_number(double value, Precision precision);

}  // namespace shaftwork::io
