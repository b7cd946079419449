// input_acceptable, the solver's check of every rating without words, against
// input_problem, the same checks in words: they must agree on every input, or a refused input
// would come without its message (or a bad one pass unrefused).
#include <cmath>
#include <limits>
#include <string>
#include <vector>

#include <catch2/catch.hpp>

#include "shaftwork/machines/inputs.hpp"

using namespace shaftwork::machines;

namespace {

// Agreement on one input, and on acceptance the bits of the quantities it gives.
void check_agreement(const RatingInput& in) {
  unsigned quantities = 0;
  const bool acceptable = input_acceptable(in, quantities);
  const std::string problem = input_problem(in);
  INFO(problem);
  CHECK(acceptable == problem.empty());
  if (!acceptable) return;
  unsigned expected = 0;
  for (const InputSpec& s : kInputs) {
    if (s.field && s.gives && in.*s.field) expected |= 1u << static_cast<unsigned>(*s.gives);
  }
  CHECK(quantities == expected);
}

}  // namespace

TEST_CASE("input_acceptable agrees with input_problem on every row of the input table") {
  const double inf = std::numeric_limits<double>::infinity();
  const std::vector<double> values = {-1, -0.0, 0, 1e-300, 0.5, 1, 1.0000001, 2, 300, 1e300, inf, -inf, std::nan("")};
  int refused = 0;
  for (const InputSpec& s : kInputs) {
    if (!s.field) continue;
    for (const MachineKind machine : {MachineKind::compressor, MachineKind::turbine, MachineKind::pump}) {
      for (const double v : values) {
        RatingInput in;
        in.machine = machine;
        in.inlet_pressure = 1e5;  // one more quantity beside, given or doubled
        in.*s.field = v;
        INFO(s.key << " = " << v);
        check_agreement(in);
        unsigned quantities = 0;
        refused += !input_acceptable(in, quantities);
      }
    }
  }
  CHECK(refused > 100);  // the values above are refused for most rows
}

TEST_CASE("input_acceptable refuses what input_problem words: two forms, a head, an impeller") {
  RatingInput two_flows;
  two_flows.mass_flow = 1;
  two_flows.volume_flow = 1;
  unsigned quantities = 0;
  CHECK_FALSE(input_acceptable(two_flows, quantities));
  CHECK(input_problem(two_flows) == "mass_flow and volume_flow are both given: they give the same quantity; keep one");
  RatingInput head;
  head.head = 100;
  CHECK_FALSE(input_acceptable(head, quantities));
  CHECK(input_problem(head) == "head stands for the outlet pressure of pumps only");
  head.machine = MachineKind::pump;
  CHECK(input_acceptable(head, quantities));
  CHECK(quantities == 1u << static_cast<unsigned>(Quantity::outlet_pressure));
  RatingInput width;
  width.impeller_exit_width = 0.02;
  CHECK_FALSE(input_acceptable(width, quantities));
  check_agreement(width);
  width.machine = MachineKind::turbine;
  width.impeller_tip_diameter = 0.3;
  CHECK_FALSE(input_acceptable(width, quantities));
  check_agreement(width);
}
