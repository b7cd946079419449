// The fast significant-digit formatter of the batch output, against printf's %.*g
// (the C library's correctly rounded conversion) as the reference.
#include <cmath>
#include <cstdio>
#include <cstdlib>
#include <string>

#include <catch2/catch.hpp>

#include "shaftwork/io/number_format.hpp"

using shaftwork::io::append_significant;

namespace {

std::string formatted(double v, int digits) {
  std::string s;
  append_significant(s, v, digits);
  return s;
}

std::string printf_g(double v, int digits) {
  char buffer[64];
  std::snprintf(buffer, sizeof buffer, "%.*g", digits, v);
  return buffer;
}

}  // namespace

TEST_CASE("typical values: no exponent, no trailing zeros") {
  CHECK(formatted(0.0, 10) == "0");
  CHECK(formatted(-0.0, 10) == "0");
  CHECK(formatted(2.0, 10) == "2");
  CHECK(formatted(0.25, 10) == "0.25");
  CHECK(formatted(101325.0, 10) == "101325");
  CHECK(formatted(-40.5, 10) == "-40.5");
  CHECK(formatted(172.5, 10) == "172.5");
  CHECK(formatted(0.7555630541234, 10) == "0.7555630541");
  CHECK(formatted(0.00012345678912, 10) == "0.0001234567891");
  CHECK(formatted(0.000015, 10) == "0.000015");           // %g would write 1.5e-05
  CHECK(formatted(12345678901234.0, 10) == "12345678900000");  // rounded to ten digits
  CHECK(formatted(9.99999999999, 10) == "10");            // rounding carries into a new digit
  CHECK(formatted(999.99999999996, 10) == "1000");
  CHECK(formatted(1.0 / 3.0, 4) == "0.3333");
  CHECK(formatted(2.0 / 3.0, 1) == "0.7");
}

TEST_CASE("magnitudes outside 1e-5 to 1e15 take the exponent form of to_chars") {
  CHECK(formatted(1.5e-7, 10) == "1.5e-07");
  CHECK(formatted(-2.5e20, 10) == "-2.5e+20");
  CHECK(formatted(1e15, 10) == "1e+15");
}

TEST_CASE("every digit agrees with printf's rounding but for ties, over a million values") {
  // Values spread over twenty decades, both signs; a fixed seed so failures repeat.
  std::srand(12345);
  int checked = 0;
  for (int i = 0; i < 1000000; ++i) {
    const double mantissa = 1.0 + 9.0 * std::rand() / static_cast<double>(RAND_MAX);
    const int exponent = -5 + std::rand() % 20;
    const double v = (i % 2 ? -1 : 1) * mantissa * std::pow(10.0, exponent);
    // The batch writes 10 digits; beyond about 12 the scaled value keeps no fraction bits.
    for (int digits : {6, 10}) {
      const std::string ours = formatted(v, digits);
      const double back = std::strtod(ours.c_str(), nullptr);
      const double reference = std::strtod(printf_g(v, digits).c_str(), nullptr);
      // The same rounded value, or its neighbour in the last digit when v sits
      // within a rounding error of a tie (scaling by 10^k rounds once more).
      const double unit_in_last_digit =
          std::pow(10.0, std::floor(std::log10(std::fabs(reference))) - digits + 1);
      if (back != reference) {
        INFO("value " << printf_g(v, 17) << ", digits " << digits << ": " << ours << " vs " << printf_g(v, digits));
        REQUIRE(std::fabs(back - reference) <= 1.0001 * unit_in_last_digit);
        const double tie = std::fabs(v) * std::pow(10.0, digits - 1 - std::floor(std::log10(std::fabs(v))));
        REQUIRE(std::fabs(tie - std::floor(tie) - 0.5) < 1e-5);
      }
      ++checked;
    }
  }
  CHECK(checked == 2000000);
}
