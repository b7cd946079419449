#include "shaftwork/io/display_units.hpp"

#include <algorithm>
#include <cmath>

#include <fmt/format.h>

#include "shaftwork/error.hpp"
#include "shaftwork/io/number_format.hpp"

namespace shaftwork::io {

using units::Dimension;

std::string_view column_unit(Dimension d, UnitSystem system) {
  const bool us = system == UnitSystem::us;
  switch (d) {
    case Dimension::pressure: return us ? "psia" : "kPa";
    case Dimension::temperature: return us ? "degF" : "degC";
    case Dimension::mass_flow: return us ? "lb/h" : "kg/s";
    case Dimension::volume_flow: return us ? "acfm" : "m3/h";
    case Dimension::power: return us ? "hp" : "kW";
    case Dimension::specific_energy: return us ? "Btu/lb" : "kJ/kg";
    case Dimension::length: return us ? "ft" : "m";
    case Dimension::specific_heat:
    case Dimension::specific_entropy: return us ? "Btu/(lb R)" : "kJ/(kg K)";
    case Dimension::density: return us ? "lb/ft3" : "kg/m3";
    case Dimension::molar_mass: return "g/mol";
    case Dimension::rotational_speed: return "rpm";
    case Dimension::velocity: return us ? "ft/s" : "m/s";
    case Dimension::standard_volume_flow:
    case Dimension::fraction: return "";
  }
  return "";
}

namespace {

// The system's unit for a table, by the size of the case's values where the trade
// switches units with size: 10,000 hp (7.5 MW) and 10 MW to MW, 100,000 lb/h to klb/h;
// pumps' volume flows in US gallons per minute (common practice).
std::string_view sized_unit(Dimension d, UnitSystem system, const machines::Rating& r) {
  const bool us = system == UnitSystem::us;
  const double power = r.power.value_or(0);
  switch (d) {
    case Dimension::power:
      if (us) return power >= 10000 * 745.7 ? "MW" : (r.machine == machines::MachineKind::turbine ? "kW" : "hp");
      return power >= 10e6 ? "MW" : "kW";
    case Dimension::mass_flow:
      if (us) return r.mass_flow.value_or(0) >= 1e5 * 0.45359237 / 3600 ? "klb/h" : "lb/h";
      return "kg/s";
    case Dimension::volume_flow:
      if (r.machine == machines::MachineKind::pump) return us ? "gpm" : "m3/h";
      return column_unit(d, system);
    default: return column_unit(d, system);
  }
}

// Units of US customary practice: a case written mostly in them reads in them.
bool is_us_unit(std::string_view symbol) {
  static constexpr std::string_view kUs[] = {
      "psi",     "psia",    "psig",   "inHg",  "inHgV", "inH2O",  "inH2Og", "degF",  "F",      "\u00b0F",
      "degR",    "R",       "lb/s",   "lb/h",  "lb/hr", "lbm/h",  "lbm/hr", "klb/h", "klb/hr", "gpm",
      "GPM",     "acfm",    "ACFM",   "cfm",   "CFM",   "scfm",   "SCFM",   "scfh",  "MSCFD",  "MMSCFD",
      "MMscfd",  "lbmol/h", "hp",     "bhp",   "Btu/h", "Btu/lb", "ft-lbf/lb", "ft", "in",     "Btu/(lb R)",
      "lb/ft3",  "ft/s"};
  return std::find(std::begin(kUs), std::end(kUs), symbol) != std::end(kUs);
}

// The system a case is written in: US when most of its units with a symbol are.
UnitSystem system_of(const CaseInput& input, UnitSystem fallback) {
  int us = 0;
  int other = 0;
  for (const GivenValue& g : input.given) {
    if (g.unit.empty() || g.unit == "%") continue;
    (is_us_unit(g.unit) ? us : other) += 1;
  }
  if (us == other) return fallback;
  return us > other ? UnitSystem::us : UnitSystem::si;
}

}  // namespace

DisplayUnits::DisplayUnits(UnitSystem system, bool forced, const CaseInput* input, const machines::Rating& rating)
    : barometer_(input ? input->barometer() : units::kStandardAtmosphere) {
  if (input && !forced) system = system_of(*input, system);
  for (std::size_t i = 0; i < units_.size(); ++i) {
    const auto d = static_cast<Dimension>(i);
    std::string written = input && !forced ? input->unit_used_for(d) : std::string();
    // A head given as a height is a length; its energy-per-mass results keep the system's unit.
    units_[i] = !written.empty() && written != "%" ? written : std::string(sized_unit(d, system, rating));
  }
}

std::string format_number(double value, Precision precision) {
  if (precision.kind == Precision::Kind::decimals) return fmt::format("{:.{}f}", value + 0.0, precision.digits);
  char buffer[kMaxNumberChars + 8];
  return std::string(buffer, format_significant(buffer, value, precision.digits));
}

double difference_from_si(double si, std::string_view unit) {
  const units::UnitInfo* u = unit.empty() ? nullptr : units::find_unit(unit);
  return u ? si / std::fabs(u->scale) : si;
}

std::string DisplayUnits::text(double si, std::optional<double> u_si, Dimension d, Precision precision) const {
  const std::string_view u = unit(d);
  std::string out = format_number(u.empty() ? si : units::from_si(si, u, d, barometer_), precision);
  if (u_si) {
    const Precision two{Precision::Kind::significant, 2};
    out += fmt::format(" ± {}", format_number(difference_from_si(*u_si, u), two));
  } else {
    out += " ± n/a";
  }
  return u.empty() ? out : fmt::format("{} {}", out, u);
}

std::string DisplayUnits::text(double si, Dimension d, Precision precision) const {
  const std::string_view u = unit(d);
  if (u.empty()) return format_number(si, precision);
  return fmt::format("{} {}", format_number(units::from_si(si, u, d, barometer_), precision), u);
}

}  // namespace shaftwork::io
