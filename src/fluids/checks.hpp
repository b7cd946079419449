// Argument checks shared by the property models (internal).
#pragma once

#include <cmath>

#include <fmt/format.h>

#include "shaftwork/error.hpp"
#include "shaftwork/fluids/state.hpp"

namespace shaftwork::fluids::detail {

// Throws bad_input when p is not a finite positive pressure.
inline void check_pressure(double p, const char* model) {
  if (!(std::isfinite(p) && p > 0)) {
    throw Error(ErrorKind::bad_input,
                fmt::format("{}: pressure must be finite and above 0 Pa, got {:.6g} Pa", model, p));
  }
}

// Throws out_of_range when T lies outside `range`.
inline void check_temperature(double T, const Range& range, const char* model) {
  if (!(T >= range.low && T <= range.high)) {
    throw Error(ErrorKind::out_of_range,
                fmt::format("{}: temperature {:.6g} K is outside the model's range {:g} to {:g} K",
                            model, T, range.low, range.high));
  }
}

inline void check_finite(double x, const char* what, const char* model) {
  if (!std::isfinite(x)) {
    throw Error(ErrorKind::bad_input, fmt::format("{}: {} must be a finite number", model, what));
  }
}

}  // namespace shaftwork::fluids::detail
