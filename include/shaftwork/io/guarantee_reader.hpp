// shaftwork/io/guarantee_reader.hpp — a case file's "guarantee" object, and judging it.
//
// A guarantee stands inside a case (that case alone) or at the top of a case file beside
// "cases" (every case of the file is a test point of one test). Its keys (the contract,
// "Guarantees"; docs/guarantee.md): speed, inlet {pressure, temperature}, fluid,
// mass_flow | volume_flow | standard_volume_flow, outlet {pressure}, head, efficiency,
// power, tolerances, site {barometric_pressure} and note. Values are read to SI here; the
// conversion and verdict are machines::judge().
#pragma once

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

// The test point of a rated case (o.ok()). The uncertainty of measurement (issue 13's
// io::propagate_uncertainty, U by result key) is to be copied into TestPoint::uncertainty
// here, the one place every guarantee takes its points from.
machines::TestPoint test_point(const CaseOutcome& o);

// Judges a case's own guarantee: sets o.guarantee, or o.guarantee_error with the message.
void judge_case_guarantee(const nlohmann::json& guarantee, FluidFactory& fluids, CaseOutcome& o);

// Judges a file's guarantee on its rated cases. A case that could not be rated leaves the
// test unjudged (an error naming it): a verdict rests on every test point.
TestOutcome judge_file_guarantee(const nlohmann::json& guarantee, const std::vector<CaseOutcome>& cases,
                                 const std::string& origin, FluidFactory& fluids);

}  // namespace shaftwork::io
