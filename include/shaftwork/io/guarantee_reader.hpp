// shaftwork/io/guarantee_reader.hpp — a case file's "guarantee" object, and judging it.
//
// A guarantee stands inside a case (that case alone) or at the top of a case file beside
// "cases" (every case of the file is a test point of one test). Its keys (the contract,
// "Guarantees"; docs/guarantee.md): speed, inlet {pressure, temperature}, fluid,
// mass_flow | volume_flow | standard_volume_flow, outlet {pressure}, head, efficiency,
// power, tolerances, site {barometric_pressure} and note. Values are read to SI here; the
// conversion and verdict are machines::judge().
#pragma once

#include <functional>
#include <map>
#include <optional>
#include <string>
#include <vector>

#include <nlohmann/json.hpp>

#include "shaftwork/io/fluid_factory.hpp"
#include "shaftwork/io/result_writer.hpp"
#include "shaftwork/machines/guarantee.hpp"

namespace shaftwork::io {

// Reads a guarantee for a `machine`. Gauge pressures are read against the guarantee's own
// site.barometric_pressure, else `barometer` [Pa] (the test's). Throws bad_input naming
// the dotted key ("guarantee.tolerances.power.max: ...") for an unknown key, a value of the
// wrong kind or unit, a grade that ISO 9906:2012 does not have.
machines::Guarantee read_guarantee(const nlohmann::json& object, machines::MachineKind machine, FluidFactory& fluids,
                                   double barometer, std::vector<std::string>& warnings);

// The expanded uncertainties (k = 2) of a rating's results, SI, by dotted result key, as
// machines::TestPoint holds them; results without one are left out.
std::map<std::string, double, std::less<>> uncertainty_by_result_key(const UncertaintyResult& u);

// The test point of a rated case (o.ok()), with the expanded uncertainty of each result
// (o.uncertainty, by dotted result key) when the case carries uncertainties.
machines::TestPoint test_point(const CaseOutcome& o);

// Judges a case's own guarantee: sets o.guarantee, or o.guarantee_error with the message.
void judge_case_guarantee(const nlohmann::json& guarantee, FluidFactory& fluids, CaseOutcome& o);

// A file's guarantee (beside "cases") judged on all its cases, which come one at a time:
// add() keeps each rated case's test point (not its outcome), finish() judges. A case that
// could not be rated leaves the test unjudged (an error naming it): a verdict rests on every
// test point of the file.
class FileTest {
 public:
  // Inactive when `document` holds no guarantee beside "cases" (a single case's "guarantee"
  // is the case's own, judged by rate_case). `document` must outlive the FileTest.
  FileTest(const nlohmann::json& document, std::string origin);
  bool active() const { return guarantee_ != nullptr; }
  void add(const CaseOutcome& o);
  TestOutcome finish(FluidFactory& fluids);

 private:
  const nlohmann::json* guarantee_ = nullptr;
  TestOutcome test_;
  std::vector<machines::TestPoint> points_;
};

// The CSV columns of the cases' own guarantees in `document` (added to `columns`, which is
// set once some case holds a guarantee): decided before any case is rated, as the header
// comes first. A guarantee that cannot be read adds no checks (its case says why later).
void add_case_guarantee_columns(const nlohmann::json& document, const std::string& origin, FluidFactory& fluids,
                                std::optional<GuaranteeColumns>& columns);

}  // namespace shaftwork::io
