#include "batch_plan.hpp"

#include <algorithm>
#include <cctype>
#include <cmath>
#include <functional>
#include <string_view>

#include <fmt/format.h>

#include "shaftwork/error.hpp"
#include "shaftwork/io/case_reader.hpp"
#include "shaftwork/io/result_writer.hpp"
#include "shaftwork/io/uncertainty_input.hpp"
#include "shaftwork/text.hpp"

namespace shaftwork::io {
namespace {

using machines::Input;
using machines::InputSpec;
using units::Dimension;

[[noreturn]] void refuse(const std::string& message) { throw Error(ErrorKind::bad_input, message); }

// A header cell "outlet.temperature [degC]": the key and the unit in the brackets.
struct HeaderCell {
  std::string_view key;
  std::string_view unit;
  bool brackets_malformed = false;
};

HeaderCell split_header(std::string_view field) {
  HeaderCell cell{field, {}, false};
  const auto open = field.find('[');
  if (open == std::string_view::npos) return cell;
  cell.brackets_malformed = field.back() != ']' || field.find('[', open + 1) != std::string_view::npos;
  cell.key = trim(field.substr(0, open));
  if (!cell.brackets_malformed) cell.unit = trim(field.substr(open + 1, field.size() - open - 2));
  return cell;
}

// A unit to show in "needs its unit" messages.
const char* example_unit(Dimension d) {
  switch (d) {
    case Dimension::pressure: return "kPa";
    case Dimension::temperature: return "degC";
    case Dimension::mass_flow: return "kg/s";
    case Dimension::volume_flow: return "m3/h";
    case Dimension::standard_volume_flow: return "Nm3/h";
    case Dimension::power: return "kW";
    case Dimension::specific_energy: return "kJ/kg";
    case Dimension::length: return "m";
    default: return "%";
  }
}

// The problem the units layer finds with `unit` for dimension `d` ("unknown unit ...",
// "a temperature unit where a pressure belongs"), without the quoted value it puts first.
std::string unit_problem(std::string_view unit, Dimension d) {
  const units::UnitInfo* found = units::find_unit(unit);
  if (found && found->dimension == d) return {};
  try {
    units::ParseNotes notes;
    units::to_si(1.0, unit, d, {}, notes);
  } catch (const Error& e) {
    std::string message = e.what();
    if (!message.empty() && message.front() == '"') {
      const auto close = message.find("\": ", 1);
      if (close != std::string::npos) message.erase(0, close + 3);
    }
    return message;
  }
  return fmt::format("unknown unit \"{}\" for a {}", unit, units::dimension_name(d));
}

// The input column of a case key, or a refusal naming the column.
InputColumn input_column(std::size_t i, const std::string& header, const InputSpec& spec, std::string_view unit,
                         const units::ParseContext& context, const std::function<void(const std::string&)>& fail) {
  InputColumn c;
  c.index = i;
  c.header = header;
  c.input = spec.input;
  c.dimension = spec.dimension;
  c.unit = std::string(unit);
  c.field = spec.field;
  c.plain = plainly_acceptable_range(spec.input);
  if (unit.empty()) {
    if (c.dimension != Dimension::fraction) {
      fail(fmt::format("a {} needs its unit in square brackets, as in \"{} [{}]\"", units::dimension_name(c.dimension),
                       spec.key, example_unit(c.dimension)));
    }
    return c;
  }
  if (spec.input == Input::head) {  // a height ("m", "ft") or an energy per mass
    const units::UnitInfo* u = units::find_unit(unit);
    if (u && u->dimension == Dimension::length) c.dimension = Dimension::length;
  }
  const std::string problem = unit_problem(unit, c.dimension);
  if (!problem.empty()) fail(problem);
  const units::UnitInfo& u = *units::find_unit(unit);
  c.scale = units::effective_scale(u, context);  // a standard volume at the template's site conditions
  c.offset = u.offset;
  c.gauge = u.gauge;
  c.vacuum = u.vacuum();
  // A pump head as a height is held as energy per mass; an impeller's length is a length.
  c.factor = spec.input == Input::head && c.dimension == Dimension::length ? units::kStandardGravity : 1.0;
  if (spec.input == Input::barometric_pressure) {  // a gauge barometer is refused
    const std::string gauge = given_value_problem(spec.input, units::kStandardAtmosphere, unit);
    if (!gauge.empty()) fail(gauge);
  }
  return c;
}

// "the outlet temperature, outlet enthalpy or outlet quality": the forms of what `spec` gives.
std::string forms_of(const InputSpec& spec) {
  std::vector<std::string_view> labels;
  for (const InputSpec& s : machines::kInputs) {
    if (&s == &spec || (spec.gives && s.gives == spec.gives)) labels.push_back(s.label);
  }
  std::string out = "the ";
  for (std::size_t i = 0; i < labels.size(); ++i) {
    if (i) out += i + 1 == labels.size() ? " or " : ", ";
    out += labels[i];
  }
  return out;
}

// The case key nearest to an unknown one, for a notice ("did you mean ...?").
std::string_view nearest_key(std::string_view key) {
  std::vector<std::string_view> keys;
  for (const InputSpec& s : machines::kInputs) keys.push_back(s.key);
  return nearest_of(key, keys);
}

constexpr std::string_view kUncertaintyPrefix = "uncertainty.";

// An uncertainty column "uncertainty.<case key> [unit]" (or "[%]"), or a refusal naming it.
UncertaintyColumn uncertainty_column(std::size_t i, const std::string& header, const HeaderCell& cell,
                                     const units::ParseContext& context,
                                     const std::function<void(const std::string&)>& fail) {
  const std::string_view key = cell.key.substr(kUncertaintyPrefix.size());
  const InputSpec* spec = find_case_input(key);
  if (!spec) fail(fmt::format("\"{}\" names no case value, such as outlet.temperature", key));
  if (cell.brackets_malformed) fail("write the unit in square brackets after the key, as in \"uncertainty.power [%]\"");
  UncertaintyColumn u;
  u.index = i;
  u.header = header;
  u.input = spec->input;
  u.relative = cell.unit == "%";
  if (!u.relative && cell.unit.empty() && spec->dimension != Dimension::fraction) {
    fail(fmt::format("an uncertainty needs its unit in square brackets, as in \"{} [{}]\", or \"[%]\" of the reading",
                     cell.key, example_unit(spec->dimension)));
  }
  if (!u.relative && !cell.unit.empty()) {
    const InputColumn as_value = input_column(i, header, *spec, cell.unit, context, fail);  // the unit's checks
    u.scale = std::fabs(as_value.scale) * as_value.factor;
  }
  return u;
}

// A carried column that holds the rows' times, by its header: timestamp, time, date or
// datetime (also date_time, date/time), in any case.
bool names_a_time(std::string_view header) {
  std::string name(trim(header));
  std::transform(name.begin(), name.end(), name.begin(), [](unsigned char c) { return static_cast<char>(std::tolower(c)); });
  for (const std::string_view n : {"timestamp", "time", "date", "datetime", "date_time", "date/time"}) {
    if (name == n) return true;
  }
  return false;
}

void plan_inputs(Plan& plan, std::size_t header_line, const std::string& points_name,
                 const units::ParseContext& context) {
  const std::vector<std::string>& header = plan.header;
  std::vector<std::pair<const InputSpec*, std::size_t>> seen;  // the case value of each column
  for (std::size_t i = 0; i < header.size(); ++i) {
    const auto fail = [&](const std::string& problem) {
      refuse(fmt::format("{}: line {}, column {} \"{}\": {}", points_name, header_line, i + 1, header[i], problem));
    };
    const std::string_view field = trim(header[i]);
    if (field.empty()) {
      refuse(fmt::format("{}: line {}, column {} has no name; name a case key such as inlet.pressure [kPa], or any "
                         "other name to carry the column through",
                         points_name, header_line, i + 1));
    }
    const HeaderCell cell = split_header(field);
    if (cell.key == kMachineKey || cell.key == kFluidKey) {
      fail("machine and fluid come from the template (--case): they are the same for every row");
    }
    if (cell.key.substr(0, kUncertaintyPrefix.size()) == kUncertaintyPrefix) {
      UncertaintyColumn u = uncertainty_column(i, header[i], cell, context, fail);
      for (const UncertaintyColumn& other : plan.uncertainty_columns) {
        if (other.input != u.input) continue;
        fail(fmt::format("column {} \"{}\" gives it already; keep one", other.index + 1, other.header));
      }
      plan.uncertainty_columns.push_back(std::move(u));
      continue;
    }
    const InputSpec* spec = find_case_input(cell.key);
    if (cell.key == kIdKey || cell.key == kNoteKey) {
      if (!cell.unit.empty()) fail(fmt::format("{} is text and takes no unit", cell.key));
      if (cell.key == kIdKey) plan.id_index = i;
      continue;
    }
    if (!spec) {
      if (!plan.time_index && names_a_time(header[i])) plan.time_index = i;
      const std::string_view near = nearest_key(cell.key);
      plan.notices.push_back(fmt::format("{}: column {} \"{}\" names no case key: carried through unchanged{}",
                                         points_name, i + 1, header[i],
                                         near.empty() ? "" : fmt::format(" (did you mean {}?)", near)));
      continue;
    }
    if (!spec->field && spec->input != Input::barometric_pressure) {
      fail(fmt::format("{} comes from the template (--case): it is the same for every row", spec->key));
    }
    if (cell.brackets_malformed) fail("write the unit in square brackets after the key, as in \"inlet.pressure [barg]\"");
    for (const auto& [other_spec, other] : seen) {
      if (other_spec == spec || (spec->gives && other_spec->gives == spec->gives)) {
        fail(fmt::format("{} is given by column {} \"{}\" already; keep one", forms_of(*spec), other + 1,
                         header[other]));
      }
    }
    seen.emplace_back(spec, i);
    InputColumn c = input_column(i, header[i], *spec, cell.unit, context, fail);
    if (c.input == Input::barometric_pressure) plan.has_barometer_column = true;
    plan.inputs.push_back(std::move(c));
  }
  if (plan.inputs.empty() && !plan.id_index) {
    refuse(fmt::format("{}: line {}: no column names a case key (such as inlet.pressure [barg]) or the id: is this "
                       "a file of test points?",
                       points_name, header_line));
  }
  if (!plan.time_index) plan.time_index = plan.id_index;
  // The barometer first: the gauge cells of its row need it.
  std::stable_partition(plan.inputs.begin(), plan.inputs.end(),
                        [](const InputColumn& c) { return c.input == Input::barometric_pressure; });
}

}  // namespace

namespace {

// Whether the template and the columns give this case value.
bool column_gives(const Plan& plan, std::string_view key) {
  return std::any_of(plan.inputs.begin(), plan.inputs.end(),
                     [key](const InputColumn& c) { return machines::key_of(c.input) == key; });
}

// Whether the template or a column gives this case value.
bool batch_gives(const Plan& plan, const BatchTemplate& templ, Input input) {
  return templ.input.find(input) || column_gives(plan, machines::key_of(input));
}

// The default result columns: those that batches write, apply to this machine and
// fluid, and do not repeat an input column (its key is the same).
std::vector<const ResultKey*> default_outputs(const Plan& plan, const BatchTemplate& templ) {
  const bool two_phase = templ.input.fluid->saturation_temperature(units::kStandardAtmosphere).has_value();
  const bool pump = templ.input.machine == machines::MachineKind::pump;
  const auto given = [&](Input input) { return batch_gives(plan, templ, input); };
  const bool flow = given(Input::mass_flow) || given(Input::volume_flow) || given(Input::standard_volume_flow);
  const bool power = given(Input::power);
  const bool efficiency = given(Input::efficiency_isentropic) || given(Input::efficiency_polytropic);
  std::vector<const ResultKey*> out;
  for (const ResultKey& k : result_keys()) {
    if (!k.in_batch || column_gives(plan, k.key)) continue;
    if ((k.applies == Applies::two_phase && !two_phase) || (k.applies == Applies::pump && !pump)) continue;
    if (k.applies == Applies::speed && !given(Input::speed)) continue;
    if (k.applies == Applies::impeller && !(given(Input::speed) && given(Input::impeller_tip_diameter))) continue;
    if (k.applies == Applies::real_gas && templ.input.fluid->fluid_kind() != fluids::FluidKind::real_gas) continue;
    if (k.key.rfind("power_balance.", 0) == 0 && !(flow && power)) continue;
    if (k.key.rfind("efficiency_check.", 0) == 0 && !efficiency) continue;
    out.push_back(&k);
  }
  return out;
}

// The result columns --columns names, each a result key.
std::vector<const ResultKey*> chosen_outputs(const std::vector<std::string>& keys) {
  std::vector<const ResultKey*> out;
  for (const std::string& key : keys) {
    const ResultKey* k = find_result_key(trim(key));
    if (!k) refuse(fmt::format("--columns: \"{}\" is no result key; the keys are: {}", key, result_key_list()));
    out.push_back(k);
  }
  return out;
}

// Refuses an uncertainty that no value of the rows has (neither a column nor the template
// gives its key); notes whether the batch states any.
void plan_uncertainty(Plan& plan, const BatchTemplate& templ, std::size_t header_line, const std::string& points_name) {
  const auto given = [&](Input input) { return batch_gives(plan, templ, input); };
  for (const UncertaintyColumn& u : plan.uncertainty_columns) {
    if (given(u.input)) continue;
    refuse(fmt::format("{}: line {}, column {} \"{}\": neither a column nor the template gives {}", points_name,
                       header_line, u.index + 1, u.header, machines::key_of(u.input)));
  }
  for (const StatedUncertainty& s : templ.input.uncertainty_by_key) {
    if (given(s.input)) continue;
    refuse(fmt::format("{}: {}.{}: neither the template nor a column of {} gives {}, so there is no reading to state "
                       "an uncertainty for",
                       templ.input.origin, kUncertaintyKey, machines::key_of(s.input), points_name,
                       machines::key_of(s.input)));
  }
  plan.uncertainty = !plan.uncertainty_columns.empty() || !templ.input.uncertainty_by_key.empty() ||
                     has_uncertainty(templ.input);
}

void plan_outputs(Plan& plan, const BatchTemplate& templ, const BatchOptions& options) {
  const std::vector<const ResultKey*> keys =
      options.columns.empty() ? default_outputs(plan, templ) : chosen_outputs(options.columns);
  plan.solved_for_column = options.columns.empty();
  // jsonl writes every result of a row, whatever the columns.
  if (options.format != BatchFormat::jsonl) plan.rating = rating_options_for(keys);
  std::string& line = plan.output_header;
  for (std::size_t i = 0; i < plan.header.size(); ++i) {
    if (i) line += ',';
    line += csv_field(plan.header[i]);
  }
  if (!plan.header.empty()) line += ',';
  line += plan.solved_for_column ? "status,error,solved_for" : "status,error";
  const auto header_of = [&](std::string_view prefix, const ResultKey* k) {
    const std::string_view unit = column_unit(k->dimension, options.units);
    line += ',';
    line += csv_field(unit.empty() ? fmt::format("{}{}", prefix, k->key)
                                   : fmt::format("{}{} [{}]", prefix, k->key, unit));
  };
  for (const ResultKey* k : keys) {
    OutputColumn out{k};
    if (const std::string_view unit = column_unit(k->dimension, options.units); !unit.empty()) {
      const units::UnitInfo& u = *units::find_unit(unit);
      out.scale = u.scale;
      out.offset = u.offset;
    }
    header_of("", k);
    plan.outputs.push_back(out);
  }
  if (plan.uncertainty) {
    for (const ResultKey* k : keys) header_of(kUncertaintyPrefix, k);
  }
  if (templ.guarantee) {
    plan.guarantee = guarantee_columns(*templ.guarantee, templ.input.machine);
    line += plan.guarantee->header(options.units);
  }
  line += ",warnings\r\n";
}

}  // namespace

Plan make_plan(std::vector<std::string> header, std::size_t header_line, const std::string& points_name,
               const BatchTemplate& templ, const BatchOptions& options) {
  Plan plan;
  plan.header = std::move(header);
  plan_inputs(plan, header_line, points_name, templ.input.context());
  plan_uncertainty(plan, templ, header_line, points_name);
  plan_outputs(plan, templ, options);
  return plan;
}

}  // namespace shaftwork::io
