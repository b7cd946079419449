#include "shaftwork/io/guarantee_reader.hpp"

#include <algorithm>
#include <cstddef>
#include <span>
#include <string_view>

#include <fmt/format.h>

#include "shaftwork/error.hpp"
#include "shaftwork/io/case_reader.hpp"
#include "shaftwork/io/json_quantity.hpp"
#include "shaftwork/io/result_keys.hpp"

namespace shaftwork::io {
namespace {

using machines::Checked;
using machines::MachineKind;
using nlohmann::json;
using units::Dimension;

[[noreturn]] void refuse(const std::string& message) { throw Error(ErrorKind::bad_input, message); }

constexpr std::string_view kPath = "guarantee";
constexpr std::string_view kKeys[] = {"speed", "inlet",  "fluid",      "mass_flow", "volume_flow", "standard_volume_flow",
                                      "outlet", "head", "efficiency", "power",     "tolerances",  "site",
                                      "note",   "id"};

// What reading needs: the object, the context of its units, and where to put warnings.
class Reader {
 public:
  Reader(const json& object, double barometer) : object_(object) {
    context_.barometric_pressure = barometer;
    if (const json* site = member(object_, "site", {"barometric_pressure"})) {
      if (const json* b = site->contains("barometric_pressure") ? &(*site)["barometric_pressure"] : nullptr) {
        const ReadQuantity q = read_quantity(*b, Dimension::pressure, "guarantee.site.barometric_pressure", {}, notes_);
        const std::string problem = given_value_problem(machines::Input::barometric_pressure, q.si, q.unit);
        if (!problem.empty()) refuse(fmt::format("guarantee.site.barometric_pressure: {}", problem));
        context_.barometric_pressure = q.si;
      }
    }
  }

  // The object's member `key`, checked to be an object holding only `keys`; nullptr if absent.
  static const json* member(const json& parent, const std::string& key, std::initializer_list<std::string_view> keys) {
    if (!parent.contains(key) || parent[key].is_null()) return nullptr;
    const json& m = parent[key];
    if (!m.is_object()) refuse(fmt::format("guarantee.{}: expected an object, got {}", key, m.type_name()));
    for (const auto& item : m.items()) {
      if (std::find(keys.begin(), keys.end(), item.key()) == keys.end()) {
        refuse(fmt::format("guarantee.{}.{}: not a key of the guarantee's {}", key, item.key(), key));
      }
    }
    return &m;
  }

  // A positive quantity at `path` (a dotted key below guarantee) read in dimension d.
  std::optional<double> positive(const json* value, Dimension d, const std::string& path) {
    if (!value || value->is_null()) return std::nullopt;
    const double si = read_quantity(*value, d, fmt::format("{}.{}", kPath, path), context_, notes_).si;
    if (!(si > 0)) refuse(fmt::format("guarantee.{}: must be above 0", path));
    return si;
  }
  std::optional<double> positive(const std::string& key, Dimension d) {
    return positive(object_.contains(key) ? &object_[key] : nullptr, d, key);
  }

  // An efficiency at `path`: a fraction in (0, 1].
  double efficiency(const json& value, const std::string& path) {
    const ReadQuantity q = read_quantity(value, Dimension::fraction, fmt::format("{}.{}", kPath, path), context_, notes_);
    const std::string problem = given_value_problem(machines::Input::efficiency_isentropic, q.si, q.unit);
    if (!problem.empty()) refuse(fmt::format("guarantee.{}: {}", path, problem));
    return q.si;
  }

  const json& object() const { return object_; }
  double barometer() const { return context_.barometric_pressure.value_or(units::kStandardAtmosphere); }
  bool used_default_barometer() const { return notes_.used_default_barometer; }

 private:
  const json& object_;
  units::ParseContext context_;
  units::ParseNotes notes_;
};

void read_head(Reader& r, MachineKind machine, machines::Guarantee& g) {
  const json& o = r.object();
  if (!o.contains("head") || o["head"].is_null()) return;
  if (machine == MachineKind::pump) {
    g.value(Checked::head_height) = r.positive("head", Dimension::length);
  } else if (machine == MachineKind::compressor) {
    if (!o["head"].is_object()) refuse("guarantee.head: a compressor's head is { \"polytropic\": ... }, in kJ/kg");
    const json* head = Reader::member(o, "head", {"polytropic"});
    g.value(Checked::head_polytropic) = r.positive(head->contains("polytropic") ? &(*head)["polytropic"] : nullptr,
                                                   Dimension::specific_energy, "head.polytropic");
  } else {
    refuse("guarantee.head: a turbine's guarantee has no head; guarantee its efficiency or power");
  }
}

void read_efficiency(Reader& r, MachineKind machine, machines::Guarantee& g) {
  const json& o = r.object();
  if (!o.contains("efficiency") || o["efficiency"].is_null()) return;
  const json& e = o["efficiency"];
  if (machine == MachineKind::pump) {
    if (e.is_object()) refuse("guarantee.efficiency: a pump's efficiency is a bare number (hydraulic over shaft power)");
    g.value(Checked::pump_efficiency) = r.efficiency(e, "efficiency");
    return;
  }
  if (!e.is_object()) {
    g.value(Checked::efficiency_isentropic) = r.efficiency(e, "efficiency");
    return;
  }
  const json* basis = Reader::member(o, "efficiency", {"isentropic", "polytropic"});
  if (basis->size() != 1) refuse("guarantee.efficiency: give one of isentropic and polytropic");
  const bool isentropic = basis->contains("isentropic");
  g.value(isentropic ? Checked::efficiency_isentropic : Checked::efficiency_polytropic) =
      r.efficiency(isentropic ? (*basis)["isentropic"] : (*basis)["polytropic"],
                   isentropic ? "efficiency.isentropic" : "efficiency.polytropic");
}

// "-2 %" as -2 (percent); a bound must carry its percent sign.
double percent(const json& value, const std::string& path) {
  if (!value.is_string() || unit_written(value.get<std::string>()) != "%") {
    refuse(fmt::format("{}: write the tolerance in percent of the guaranteed value, as \"-2 %\" or \"+4 %\"", path));
  }
  units::ParseNotes notes;
  return 100 * read_quantity(value, Dimension::fraction, path, {}, notes).si;
}

machines::Tolerance read_tolerance(const json& t, const std::string& path) {
  if (!t.is_object()) refuse(fmt::format("{}: expected {{ \"min\": \"-2 %\", \"max\": \"+4 %\" }}", path));
  machines::Tolerance out;
  for (const auto& item : t.items()) {
    if (item.key() == "min") {
      out.min_percent = percent(item.value(), path + ".min");
    } else if (item.key() == "max") {
      out.max_percent = percent(item.value(), path + ".max");
    } else {
      refuse(fmt::format("{}.{}: a tolerance has min and max only", path, item.key()));
    }
  }
  return out;
}

std::string grade_list() {
  std::string out;
  for (const machines::PumpGrade& g : machines::pump_grades()) out += (out.empty() ? "" : ", ") + g.name;
  return out;
}

std::string checked_list() {
  std::string out;
  for (Checked q : machines::kAllChecked) out += (out.empty() ? "" : ", ") + std::string(machines::checked_spec(q).key);
  return out;
}

void read_tolerances(const json& o, MachineKind machine, machines::Guarantee& g) {
  if (!o.contains("tolerances") || o["tolerances"].is_null()) return;
  const json& t = o["tolerances"];
  if (!t.is_object()) refuse(fmt::format("guarantee.tolerances: expected an object, got {}", t.type_name()));
  for (const auto& item : t.items()) {
    const std::string path = "guarantee.tolerances." + item.key();
    if (item.key() == "grade") {
      if (!item.value().is_string() || !machines::find_pump_grade(item.value().get<std::string>())) {
        refuse(fmt::format("{}: {} is no acceptance grade of ISO 9906:2012; the grades are {}", path,
                           item.value().dump(), grade_list()));
      }
      g.grade = item.value().get<std::string>();
      continue;
    }
    const bool pump_efficiency = machine == MachineKind::pump && item.key() == "efficiency";
    const machines::CheckedSpec* spec = pump_efficiency ? &machines::checked_spec(Checked::pump_efficiency)
                                                        : machines::find_checked(item.key());
    if (!spec) refuse(fmt::format("{}: not a checked quantity; the keys are {} (and grade)", path, checked_list()));
    g.tolerance[static_cast<std::size_t>(spec->quantity)] = read_tolerance(item.value(), path);
  }
  const bool percentages = std::any_of(g.tolerance.begin(), g.tolerance.end(), [](const auto& x) { return x.has_value(); });
  if (g.grade && percentages) {
    refuse("guarantee.tolerances: give a grade or percentages, not both: the grade fixes every tolerance of a pump");
  }
}

void read_flow(Reader& r, machines::Guarantee& g) {
  g.mass_flow = r.positive("mass_flow", Dimension::mass_flow);
  g.volume_flow = r.positive("volume_flow", Dimension::volume_flow);
  g.standard_volume_flow = r.positive("standard_volume_flow", Dimension::standard_volume_flow);
  if ((g.mass_flow ? 1 : 0) + (g.volume_flow ? 1 : 0) + (g.standard_volume_flow ? 1 : 0) > 1) {
    refuse("guarantee: mass_flow, volume_flow and standard_volume_flow give the same flow; keep one");
  }
}

}  // namespace

machines::Guarantee read_guarantee(const json& object, MachineKind machine, FluidFactory& fluids, double barometer,
                                   std::vector<std::string>& warnings) {
  if (!object.is_object()) refuse(fmt::format("guarantee: expected an object, got {}", object.type_name()));
  for (const auto& item : object.items()) {
    if (std::find(std::begin(kKeys), std::end(kKeys), item.key()) == std::end(kKeys)) {
      refuse(fmt::format("guarantee.{}: not a key of a guarantee; the keys are speed, inlet, fluid, mass_flow, "
                         "volume_flow, standard_volume_flow, outlet, head, efficiency, power, tolerances, site, note",
                         item.key()));
    }
  }
  Reader r(object, barometer);
  machines::Guarantee g;
  g.barometer = r.barometer();
  g.speed = r.positive("speed", Dimension::rotational_speed);
  if (const json* inlet = Reader::member(object, "inlet", {"pressure", "temperature"})) {
    g.inlet_pressure = r.positive(inlet->contains("pressure") ? &(*inlet)["pressure"] : nullptr, Dimension::pressure,
                                  "inlet.pressure");
    g.inlet_temperature = r.positive(inlet->contains("temperature") ? &(*inlet)["temperature"] : nullptr,
                                     Dimension::temperature, "inlet.temperature");
  }
  if (object.contains("fluid")) g.fluid = fluids.make(object["fluid"], "guarantee.fluid", warnings);
  read_flow(r, g);
  if (const json* outlet = Reader::member(object, "outlet", {"pressure"})) {
    g.value(Checked::outlet_pressure) = r.positive(outlet->contains("pressure") ? &(*outlet)["pressure"] : nullptr,
                                                   Dimension::pressure, "outlet.pressure");
  }
  read_head(r, machine, g);
  read_efficiency(r, machine, g);
  g.value(Checked::power) = r.positive("power", Dimension::power);
  read_tolerances(object, machine, g);
  if (r.used_default_barometer()) {
    warnings.emplace_back("the guarantee gives a gauge pressure and neither it nor the test gives "
                          "site.barometric_pressure: 101.325 kPa assumed");
  }
  return g;
}

std::map<std::string, double, std::less<>> uncertainty_by_result_key(const UncertaintyResult& u) {
  std::map<std::string, double, std::less<>> out;
  const auto& keys = result_keys();
  for (std::size_t k = 0; k < keys.size() && k < u.expanded.size(); ++k) {
    if (const auto expanded = u.expanded[k]) out.emplace(std::string(keys[k].key), *expanded);
  }
  return out;
}

machines::TestPoint test_point(const CaseOutcome& o) {
  machines::TestPoint p;
  p.id = o.id;
  p.input = to_rating_input(*o.input);
  p.rating = *o.rating;
  if (o.uncertainty) p.uncertainty = uncertainty_by_result_key(*o.uncertainty);
  return p;
}

namespace {

// A judging error as the user reads it: "guarantee..." first.
std::string guarantee_message(const Error& e) {
  const std::string message = e.what();
  return message.rfind("guarantee", 0) == 0 ? message : "guarantee: " + message;
}

}  // namespace

void judge_case_guarantee(const json& guarantee, FluidFactory& fluids, CaseOutcome& o) {
  try {
    const machines::Guarantee g = read_guarantee(guarantee, o.rating->machine, fluids, o.input->barometer(), o.warnings);
    const machines::TestPoint point = test_point(o);
    o.guarantee = machines::judge(g, std::span(&point, 1));
  } catch (const Error& e) {
    o.guarantee_error = guarantee_message(e);
  }
}

FileTest::FileTest(const json& document, std::string origin) {
  const std::string key(kGuaranteeKey);
  if (document.is_object() && document.contains("cases") && document.contains(key)) guarantee_ = &document[key];
  test_.origin = std::move(origin);
}

void FileTest::add(const CaseOutcome& o) {
  if (!active()) return;
  test_.points.push_back(o.id);
  if (!o.ok()) {
    if (test_.error.empty()) {
      test_.error = fmt::format("guarantee: not judged: the test point \"{}\" could not be rated; the verdict rests "
                                "on every test point of the file",
                                o.id);
    }
    return;
  }
  if (!test_.units_from) test_.units_from = o.input;
  if (test_.error.empty()) points_.push_back(test_point(o));
}

TestOutcome FileTest::finish(FluidFactory& fluids) {
  TestOutcome t = std::move(test_);
  std::vector<machines::TestPoint> points = std::move(points_);
  if (!t.error.empty() || points.empty()) return t;
  try {
    const machines::Guarantee g =
        read_guarantee(*guarantee_, points.front().rating.machine, fluids, t.units_from->barometer(), t.warnings);
    t.result = machines::judge(g, points);
  } catch (const Error& e) {
    t.error = guarantee_message(e);
  }
  return t;
}

void add_case_guarantee_columns(const json& document, const std::string& origin, FluidFactory& fluids,
                                std::optional<GuaranteeColumns>& columns) {
  const std::string key(kGuaranteeKey);
  const auto cases = case_objects(document, origin);
  for (std::size_t i = 0; i < cases.size(); ++i) {
    const json& c = *cases[i];
    if (!c.is_object() || !c.contains(key)) continue;
    if (!columns) columns.emplace();
    try {
      const CaseInput input = read_case(c, i, fluids, origin);
      std::vector<std::string> ignored;
      const machines::Guarantee g = read_guarantee(c[key], input.machine, fluids, input.barometer(), ignored);
      columns->add(guarantee_columns(g, input.machine));
    } catch (const Error&) {
    } catch (const json::exception&) {
    }
  }
}

}  // namespace shaftwork::io
