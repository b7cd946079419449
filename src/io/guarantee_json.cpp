// A guarantee's verdict as JSON (the contract, "Guarantees"): SI numbers, placed by dotted
// keys like the results.
#include <cmath>

#include "json_numbers.hpp"
#include "shaftwork/io/number_format.hpp"
#include "shaftwork/io/result_writer.hpp"

namespace shaftwork::io {
namespace {

using machines::Check;
using machines::SimilarityCheck;
using nlohmann::ordered_json;

ordered_json number_or_null(const std::optional<double>& x) {
  return x && std::isfinite(*x) ? ordered_json(rounded_for_output(*x)) : ordered_json(nullptr);
}

std::string tolerance_from(const Check& c, const machines::GuaranteeResult& g) {
  switch (c.tolerance_from) {
    case machines::ToleranceFrom::given: return "given";
    case machines::ToleranceFrom::grade: return "ISO 9906:2012 grade " + g.grade.value_or("?");
    case machines::ToleranceFrom::none_given: return "none given: zero tolerance";
  }
  return "";
}

ordered_json check_json(const Check& c, const machines::GuaranteeResult& g) {
  ordered_json j;
  j["quantity"] = machines::checked_spec(c.quantity).key;
  j["measured"] = number_or_null(c.measured);
  j["converted"] = number_or_null(c.converted);
  j["guaranteed"] = rounded_for_output(c.guaranteed);
  j["deviation_percent"] = number_or_null(c.deviation_percent);
  j["tolerance_percent"] = ordered_json::array({number_or_null(c.tolerance.min_percent), number_or_null(c.tolerance.max_percent)});
  j["tolerance_from"] = tolerance_from(c, g);
  if (c.uncertainty_percent) j["uncertainty_percent"] = rounded_for_output(*c.uncertainty_percent);
  j["verdict"] = machines::verdict_name(c.verdict);
  if (!c.note.empty()) j["note"] = c.note;
  return j;
}

ordered_json similarity_json(const SimilarityCheck& s) {
  ordered_json j;
  j["parameter"] = s.parameter;
  j["point"] = s.point;
  if (s.test) j["test"] = rounded_for_output(*s.test);
  if (s.guarantee) j["guarantee"] = rounded_for_output(*s.guarantee);
  if (s.ratio) j["ratio"] = rounded_for_output(*s.ratio);
  if (s.difference) j["difference"] = rounded_for_output(*s.difference);
  j["limits"] = ordered_json::array({rounded_for_output(s.low), rounded_for_output(s.high)});
  j["within"] = s.within;
  j["source"] = s.source;
  return j;
}

ordered_json values_json(const std::vector<machines::NamedValue>& values) {
  ordered_json j = ordered_json::object();
  for (const machines::NamedValue& v : values) json_place(j, v.key, v.value);
  return j;
}

}  // namespace

ordered_json guarantee_json(const machines::GuaranteeResult& g) {
  ordered_json j;
  j["verdict"] = machines::verdict_name(g.verdict);
  j["machine"] = machines::machine_name(g.machine);
  j["method"] = g.method;
  j["checks"] = ordered_json::array();
  for (const Check& c : g.checks) j["checks"].push_back(check_json(c, g));
  j["similarity"] = ordered_json::array();
  for (const SimilarityCheck& s : g.similarity) j["similarity"].push_back(similarity_json(s));
  j["converted"] = values_json(g.converted);
  j["points"] = ordered_json::array();
  for (const machines::ConvertedPoint& p : g.points) {
    j["points"].push_back({{"id", p.id}, {"speed_ratio", rounded_for_output(p.speed_ratio)}, {"converted", values_json(p.values)}});
  }
  j["measured_at"] = g.nearest_point;
  j["warnings"] = g.warnings;
  return j;
}

ordered_json test_json(const TestOutcome& t) {
  ordered_json j;
  j["file"] = t.origin;
  j["points"] = t.points;
  if (t.result) {
    j["guarantee"] = guarantee_json(*t.result);
  } else {
    j["guarantee"] = ordered_json{{"status", "error"}, {"error", t.error}};
  }
  j["warnings"] = t.warnings;
  return j;
}

}  // namespace shaftwork::io
