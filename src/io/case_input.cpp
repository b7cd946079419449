#include "shaftwork/io/case_input.hpp"

#include <array>

#include <fmt/format.h>

#include "shaftwork/error.hpp"

namespace shaftwork::io {

using machines::Input;
using machines::Quantity;

const GivenValue* CaseInput::find(Input input) const {
  for (const GivenValue& g : given) {
    if (g.input == input) return &g;
  }
  return nullptr;
}

double CaseInput::barometer() const {
  const GivenValue* b = find(Input::barometric_pressure);
  return b ? b->si : units::kStandardAtmosphere;
}

units::ParseContext CaseInput::context() const {
  units::ParseContext context;
  if (const GivenValue* b = find(Input::barometric_pressure)) context.barometric_pressure = b->si;
  const GivenValue* p = find(Input::standard_pressure);
  const GivenValue* T = find(Input::standard_temperature);
  if (p && T) context.standard_conditions = units::StandardConditions{p->si, T->si};
  return context;
}

std::string CaseInput::unit_used_for(units::Dimension d) const {
  for (const GivenValue& g : given) {
    if (g.unit.empty() || g.input == Input::barometric_pressure) continue;
    const units::UnitInfo* unit = units::find_unit(g.unit);
    if (unit && unit->dimension == d) return g.unit;
  }
  return {};
}

namespace {

// What echoes need of a case: the unit to write each of the seven in, and the barometer.
struct EchoUnits {
  std::array<std::string, machines::kQuantityCount> unit;
  double barometer = units::kStandardAtmosphere;
};

units::Dimension dimension_of(Quantity q) { return machines::spec(machines::primary_input(q)).dimension; }

std::string echo_with(const EchoUnits& e, Quantity q, double si) {
  const std::string& unit = e.unit[static_cast<std::size_t>(q)];
  if (!unit.empty() && unit != "%") {
    try {
      return fmt::format("{:.6g} {}", units::from_si(si, unit, dimension_of(q), e.barometer), unit);
    } catch (const Error&) {
    }
  }
  switch (dimension_of(q)) {
    case units::Dimension::pressure: return fmt::format("{:.6g} kPa", si / 1000);
    case units::Dimension::temperature: return fmt::format("{:.2f} K", si);
    case units::Dimension::mass_flow: return fmt::format("{:.6g} kg/s", si);
    case units::Dimension::power: return fmt::format("{:.6g} kW", si / 1000);
    default: return fmt::format("{:.4f}", si);
  }
}

// Each quantity in the unit it was given in; else in the unit the case gives its
// dimension in (a solved outlet temperature in the inlet's degF).
EchoUnits echo_units(const CaseInput& c) {
  EchoUnits e;
  e.barometer = c.barometer();
  for (Quantity q : machines::kAllQuantities) {
    const GivenValue* own = c.find(machines::primary_input(q));
    e.unit[static_cast<std::size_t>(q)] = own && !own->unit.empty() ? own->unit : c.unit_used_for(dimension_of(q));
  }
  return e;
}

}  // namespace

std::string echo_value(const CaseInput& c, Quantity q, double si) { return echo_with(echo_units(c), q, si); }

machines::RatingInput to_rating_input(const CaseInput& c) {
  machines::RatingInput r;
  r.machine = c.machine;
  r.fluid = c.fluid;
  for (const GivenValue& g : c.given) {
    if (const auto field = machines::spec(g.input).field) r.*field = g.si;
  }
  r.echo = [units = echo_units(c)](Quantity q, double si) { return echo_with(units, q, si); };
  return r;
}

}  // namespace shaftwork::io
