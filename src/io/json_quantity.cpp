#include "shaftwork/io/json_quantity.hpp"

#include <cmath>

#include <fmt/format.h>

#include "shaftwork/error.hpp"
#include "shaftwork/text.hpp"

namespace shaftwork::io {

ReadQuantity read_quantity(const nlohmann::json& value, units::Dimension d, const std::string& path,
                           const units::ParseContext& context, units::ParseNotes& notes) {
  if (value.is_number()) {
    const double x = value.get<double>();
    if (!std::isfinite(x)) {
      throw Error(ErrorKind::bad_input, fmt::format("{}: the number is not finite", path));
    }
    // A plain number is SI: the same checks as "<number> <SI unit>".
    if (d == units::Dimension::fraction) return {x, ""};
    if (d == units::Dimension::standard_volume_flow) {
      throw Error(ErrorKind::bad_input,
                  fmt::format("{}: a standard volume flow needs its unit, which fixes the reference conditions: "
                              "Nm3/h, Sm3/h, scfm or MMSCFD",
                              path));
    }
    if (d == units::Dimension::rotational_speed) {
      throw Error(ErrorKind::bad_input,
                  fmt::format("{}: a speed needs its unit: rpm, 1/min, rev/s, Hz or rad/s", path));
    }
    try {
      return {units::to_si(x, si_symbol(d), d, context, notes), ""};
    } catch (const Error& e) {
      throw e.with_context(path);
    }
  }
  if (!value.is_string()) {
    throw Error(ErrorKind::bad_input,
                fmt::format("{}: expected a number or a string such as \"{}\", got {}", path,
                            d == units::Dimension::fraction ? "84.5 %" : "<number> <unit>", value.type_name()));
  }
  const std::string& text = value.get_ref<const std::string&>();
  try {
    const double si = units::parse(text, d, context, notes);
    return {si, std::string(unit_written(text))};
  } catch (const Error& e) {
    throw e.with_context(path);
  }
}

std::string_view si_symbol(units::Dimension d) {
  switch (d) {
    case units::Dimension::pressure: return "Pa";
    case units::Dimension::temperature: return "K";
    case units::Dimension::mass_flow: return "kg/s";
    case units::Dimension::volume_flow: return "m3/s";
    case units::Dimension::power: return "W";
    case units::Dimension::specific_energy: return "J/kg";
    case units::Dimension::length: return "m";
    case units::Dimension::specific_heat:
    case units::Dimension::specific_entropy: return "J/(kg K)";
    case units::Dimension::density: return "kg/m3";
    case units::Dimension::molar_mass: return "kg/mol";
    case units::Dimension::standard_volume_flow: return "mol/s";
    case units::Dimension::velocity: return "m/s";
    case units::Dimension::rotational_speed: return "1/s";
    case units::Dimension::fraction: return "";
  }
  return "";
}

std::string_view unit_written(std::string_view text) {
  text = trim(text);
  std::size_t i = 0;
  while (i < text.size() && !is_space(text[i]) && text[i] != '%') ++i;
  return trim(text.substr(i));
}

}  // namespace shaftwork::io
