// Fuzz target: a case file from bytes to every output format, the path `shaftwork rate` takes:
// io::parse_json_strict, io::rate_document, then the JSON, table (SI and US) and CSV writers;
// and the path of `shaftwork check`: each case against its expect block, then JUnit XML,
// which must hold no character that XML 1.0 forbids; and the bytes read as a baseline.
// A refusal (shaftwork::Error) is the expected answer to bad input; anything else that
// escapes, a sanitizer report, or a rated case holding a non-finite number or an efficiency
// outside (0, 1] is a finding.
#include <cmath>
#include <cstddef>
#include <cstdint>
#include <cstdlib>
#include <sstream>
#include <string>
#include <string_view>
#include <vector>

#include "fuzz_check.hpp"
#include "shaftwork/error.hpp"
#include "shaftwork/io/baseline.hpp"
#include "shaftwork/io/case_check.hpp"
#include "shaftwork/io/case_reader.hpp"
#include "shaftwork/io/case_runner.hpp"
#include "shaftwork/io/fluid_factory.hpp"
#include "shaftwork/io/junit_xml.hpp"
#include "shaftwork/io/result_writer.hpp"

namespace {

void require_finite_state(const shaftwork::fluids::State& s) {
  FUZZ_REQUIRE(std::isfinite(s.pressure) && s.pressure > 0);
  FUZZ_REQUIRE(std::isfinite(s.temperature) && s.temperature > 0);
  FUZZ_REQUIRE(std::isfinite(s.enthalpy) && std::isfinite(s.entropy));
  FUZZ_REQUIRE(std::isfinite(s.density) && s.density > 0);
  if (s.quality) FUZZ_REQUIRE(*s.quality >= 0 && *s.quality <= 1);
}

// What a rated case must hold whatever the input was.
void require_sane(const shaftwork::machines::Rating& r) {
  require_finite_state(r.inlet);
  require_finite_state(r.outlet);
  require_finite_state(r.outlet_isentropic);
  // Size: absent together when neither flow nor power was given (rating with four knowns).
  FUZZ_REQUIRE(r.mass_flow.has_value() == r.power.has_value() && r.power.has_value() == r.fluid_power.has_value());
  if (r.mass_flow) FUZZ_REQUIRE(std::isfinite(*r.mass_flow) && *r.mass_flow > 0);
  if (r.power) FUZZ_REQUIRE(std::isfinite(*r.power) && *r.power > 0);
  if (r.fluid_power) FUZZ_REQUIRE(std::isfinite(*r.fluid_power));
  FUZZ_REQUIRE(r.efficiency_isentropic > 0 && r.efficiency_isentropic <= 1 + 1e-9);
  FUZZ_REQUIRE(std::isfinite(r.efficiency_polytropic) && r.efficiency_polytropic > 0);
  FUZZ_REQUIRE(std::isfinite(r.head_isentropic) && std::isfinite(r.head_polytropic));
  FUZZ_REQUIRE(std::isfinite(r.pressure_ratio) && r.pressure_ratio >= 1);
  if (r.head_height) FUZZ_REQUIRE(std::isfinite(*r.head_height));
  if (r.power_balance) FUZZ_REQUIRE(std::isfinite(r.power_balance->difference_percent));
}

// Every propagated uncertainty a finite U >= 0, every share in [0, 100].
void require_sane(const shaftwork::io::UncertaintyResult& u) {
  for (const auto& expanded : u.expanded) {
    if (expanded) FUZZ_REQUIRE(std::isfinite(*expanded) && *expanded >= 0);
  }
  for (const auto& key : u.contributions) {
    for (const auto& share : key.shares) FUZZ_REQUIRE(share.share_percent >= 0 && share.share_percent <= 100 + 1e-9);
  }
}

}  // namespace

extern "C" int LLVMFuzzerTestOneInput(const std::uint8_t* data, std::size_t size) {
  const std::string_view text(reinterpret_cast<const char*>(data), size);
  // The same bytes as a baseline of `check`: read, or refused naming the file.
  try {
    const shaftwork::io::Baseline baseline(text, "fuzz.json");
    for (const auto* r : baseline.untaken()) FUZZ_REQUIRE(r->numbers.size() == shaftwork::io::result_keys().size());
  } catch (const shaftwork::Error& e) {
    FUZZ_REQUIRE(std::string_view(e.what()).rfind("fuzz.json: ", 0) == 0);
  }
  // A fresh factory per input: no state carries over, so every finding replays alone.
  shaftwork::io::FluidFactory fluids;
  std::vector<shaftwork::io::CaseOutcome> outcomes;
  nlohmann::json document;
  try {
    document = shaftwork::io::parse_json_strict(text, "fuzz.json");
    outcomes = shaftwork::io::rate_document(document, "fuzz.json", fluids);
  } catch (const shaftwork::Error& e) {
    FUZZ_REQUIRE(std::string_view(e.what()).rfind("fuzz.json: ", 0) == 0);  // a file-level refusal names the file
    return 0;
  }
  for (const auto& outcome : outcomes) {
    if (outcome.ok()) {
      require_sane(*outcome.rating);
      if (outcome.uncertainty) require_sane(*outcome.uncertainty);
    } else {
      FUZZ_REQUIRE(!outcome.error.empty());
    }
  }
  std::ostringstream json, table_si, table_us, csv;
  shaftwork::io::write_results(json, shaftwork::io::ResultFormat::json, outcomes);
  shaftwork::io::write_results(table_si, shaftwork::io::ResultFormat::table, outcomes);
  shaftwork::io::TableOptions us;
  us.system = shaftwork::io::UnitSystem::us;
  us.system_forced = true;
  shaftwork::io::write_results(table_us, shaftwork::io::ResultFormat::table, outcomes, us);
  shaftwork::io::write_results(csv, shaftwork::io::ResultFormat::csv, outcomes);
  FUZZ_REQUIRE(!json.str().empty());

  const auto cases = shaftwork::io::case_objects(document, "fuzz.json");
  std::vector<shaftwork::io::CaseCheck> checks;
  for (std::size_t i = 0; i < outcomes.size(); ++i) {
    checks.push_back(shaftwork::io::check_case(outcomes[i], *cases[i], nullptr, {}));
    FUZZ_REQUIRE(checks.back().verdict == shaftwork::io::Verdict::passed || !checks.back().details.empty());
  }
  std::ostringstream xml;
  shaftwork::io::write_junit(xml, checks);
  for (const char c : xml.str()) FUZZ_REQUIRE(static_cast<unsigned char>(c) >= 0x20 || c == '\n' || c == '\t');
  return 0;
}
