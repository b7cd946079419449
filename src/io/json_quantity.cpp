#include "shaftwork/io/json_quantity.hpp"

#include <cctype>
#include <cmath>

#include <fmt/format.h>

#include "shaftwork/error.hpp"

namespace shaftwork::io {

ReadQuantity read_quantity(const nlohmann::json& value, units::Dimension d, const std::string& path,
                           const units::ParseContext& context, units::ParseNotes& notes) {
  if (value.is_number()) {
    const double x = value.get<double>();
    if (!std::isfinite(x)) {
      throw Error(ErrorKind::bad_input, fmt::format("{}: the number is not finite", path));
    }
    // A plain number is SI: the same checks as "<number> <SI unit>".
    try {
      const char* si_unit = nullptr;
      switch (d) {
        case units::Dimension::pressure: si_unit = "Pa"; break;
        case units::Dimension::temperature: si_unit = "K"; break;
        case units::Dimension::mass_flow: si_unit = "kg/s"; break;
        case units::Dimension::volume_flow: si_unit = "m3/s"; break;
        case units::Dimension::power: si_unit = "W"; break;
        case units::Dimension::specific_energy: si_unit = "J/kg"; break;
        case units::Dimension::length: si_unit = "m"; break;
        case units::Dimension::specific_heat:
        case units::Dimension::specific_entropy: si_unit = "J/(kg K)"; break;
        case units::Dimension::density: si_unit = "kg/m3"; break;
        case units::Dimension::molar_mass: si_unit = "kg/mol"; break;
        case units::Dimension::fraction: return {x, ""};
        case units::Dimension::standard_volume_flow:
          throw Error(ErrorKind::bad_input,
                      "a standard volume flow needs its unit, which fixes the reference conditions: "
                      "Nm3/h, Sm3/h, scfm or MMSCFD");
      }
      return {units::to_si(x, si_unit, d, context, notes), ""};
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
    // The unit as written: what follows the number and the spaces.
    size_t i = 0;
    while (i < text.size() && std::isspace(static_cast<unsigned char>(text[i]))) ++i;
    while (i < text.size() && !std::isspace(static_cast<unsigned char>(text[i])) && text[i] != '%') ++i;
    while (i < text.size() && std::isspace(static_cast<unsigned char>(text[i]))) ++i;
    size_t end = text.size();
    while (end > i && std::isspace(static_cast<unsigned char>(text[end - 1]))) --end;
    return {si, text.substr(i, end - i)};
  } catch (const Error& e) {
    throw e.with_context(path);
  }
}

}  // namespace shaftwork::io
