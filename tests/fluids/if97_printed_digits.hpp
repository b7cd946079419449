// A Catch2 matcher for the IAPWS verification tables: a computed value agrees with a
// printed one when it rounds to the same digits, i.e. differs by at most half a unit in
// the last printed digit.
#pragma once

#include <cmath>
#include <sstream>
#include <string>

#include <catch2/catch.hpp>

namespace shaftwork::test {

class PrintedDigits : public Catch::MatcherBase<double> {
 public:
  // `printed` as the table prints it, with `digits` significant digits.
  PrintedDigits(double printed, int digits) : printed_(printed), digits_(digits) {}

  bool match(const double& x) const override { return std::fabs(x - printed_) <= half_unit(); }

  std::string describe() const override {
    std::ostringstream out;
    out.precision(12);
    out << "rounds to " << printed_ << " (" << digits_ << " significant digits, within "
        << half_unit() << ")";
    return out.str();
  }

 private:
  double half_unit() const {
    const double last_digit = std::pow(10.0, std::floor(std::log10(std::fabs(printed_))) - digits_ + 1);
    return 0.5 * last_digit * (1.0 + 1e-9);  // the slack covers the printed value's own rounding to binary
  }

  double printed_;
  int digits_;
};

}  // namespace shaftwork::test
