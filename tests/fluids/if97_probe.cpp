// if97_probe: a test-only filter over fluids::IapwsIf97 for the Python cross-check
// (tests/python/test_if97_crosscheck.py), so that thousands of states cost one process.
//
// Reads lines "pt p T", "ph p h", "ps p s" or "px p x" (SI: Pa, K, J/kg, J/(kg K); x is the
// quality) and writes one line per input line:
//   "T h s v x a"   full precision, SI; x is "nan" for a single-phase state, a the isobaric
//                   expansivity (1/v)(dv/dT)_p (0 for a wet state)
//   "error <message>" when the model refuses the state.
#include <cmath>
#include <cstdio>
#include <iostream>
#include <sstream>
#include <string>

#include "shaftwork/error.hpp"
#include "shaftwork/fluids/iapws_if97.hpp"

int main() {
  const shaftwork::fluids::IapwsIf97 water;
  std::string line;
  while (std::getline(std::cin, line)) {
    std::istringstream in(line);
    std::string kind;
    double p = 0;
    double second = 0;
    if (!(in >> kind >> p >> second)) {
      std::printf("error unreadable line: %s\n", line.c_str());
      continue;
    }
    try {
      shaftwork::fluids::State st;
      if (kind == "pt") {
        st = water.from_pt(p, second);
      } else if (kind == "ph") {
        st = water.from_ph(p, second);
      } else if (kind == "ps") {
        st = water.from_ps(p, second);
      } else if (kind == "px") {
        st = water.from_p_quality(p, second);
      } else {
        std::printf("error unknown kind: %s\n", kind.c_str());
        continue;
      }
      std::printf("%.17g %.17g %.17g %.17g %.17g %.17g\n", st.temperature, st.enthalpy, st.entropy,
                  1.0 / st.density, st.quality.value_or(std::nan("")), st.expansivity);
    } catch (const shaftwork::Error& e) {
      std::printf("error %s\n", e.what());
    }
  }
  return 0;
}
