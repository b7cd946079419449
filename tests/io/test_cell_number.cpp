// A batch cell as a number: the fast path for plain decimals (Clinger's) against
// std::from_chars, the C++ library's correctly rounded reader, and the plain range of each
// input against the full check it stands in for.
#include <charconv>
#include <cstdint>
#include <cstring>
#include <limits>
#include <random>
#include <string>

#include <catch2/catch.hpp>

#include "io/cell_number.hpp"
#include "shaftwork/io/case_reader.hpp"

namespace {

using shaftwork::io::parse_plain_decimal;

// The value std::from_chars reads from `cell` (a leading '+' dropped, which it does not take).
double library_value(const std::string& cell) {
  const char* first = cell.data();
  if (*first == '+') ++first;
  double x = 0;
  const auto [end, ec] = std::from_chars(first, cell.data() + cell.size(), x);
  REQUIRE(ec == std::errc());
  REQUIRE(end == cell.data() + cell.size());
  return x;
}

std::uint64_t bits_of(double x) {
  std::uint64_t b = 0;
  std::memcpy(&b, &x, sizeof b);
  return b;
}

}  // namespace

TEST_CASE("plain decimals of up to 15 digits read as std::from_chars reads them, bit for bit") {
  std::mt19937_64 random(20261202);
  std::uniform_int_distribution<int> digit(0, 9), sign(0, 2), whole_digits(0, 15), point(0, 3);
  std::size_t read = 0;
  for (int n = 0; n < 400000; ++n) {
    std::string cell = sign(random) == 0 ? "-" : sign(random) == 0 ? "+" : "";
    const int whole = whole_digits(random);
    for (int i = 0; i < whole; ++i) cell += static_cast<char>('0' + digit(random));
    int fraction = 0;
    if (point(random) != 0) {
      cell += '.';
      fraction = std::uniform_int_distribution<int>(0, 15 - whole)(random);
      for (int i = 0; i < fraction; ++i) cell += static_cast<char>('0' + digit(random));
    }
    double x = -1;
    const bool plain = parse_plain_decimal(cell, x);
    if (whole + fraction == 0) {
      CHECK_FALSE(plain);  // "", "-", ".", "+."
      continue;
    }
    REQUIRE(plain);
    INFO(cell);
    REQUIRE(bits_of(x) == bits_of(library_value(cell)));
    ++read;
  }
  CHECK(read > 300000);
}

TEST_CASE("anything but a plain decimal of at most 15 digits is left to the full reader") {
  double x = 0;
  for (const char* cell : {"", "-", "+", ".", "-.", "1.2.3", "1e5", "1E5", " 1", "1 ", "1,5", "--1", "+-1", "-+1",
                           "0x10", "inf", "nan", "1234567890123456", "0.1234567890123456", "12345678.90123456",
                           "1\r", "\t2"}) {
    INFO(cell);
    CHECK_FALSE(parse_plain_decimal(cell, x));
  }
  REQUIRE(parse_plain_decimal("123456789012345", x));
  CHECK(x == 123456789012345.0);
  REQUIRE(parse_plain_decimal("-0.00000000000001", x));  // 15 digits, the leading zero one of them
  CHECK(x == -1e-14);
  REQUIRE(parse_plain_decimal("5.", x));
  CHECK(x == 5.0);
  REQUIRE(parse_plain_decimal(".25", x));
  CHECK(x == 0.25);
}

TEST_CASE("a value in its input's plain range is one the full check passes in any unit") {
  using shaftwork::machines::Input;
  using shaftwork::machines::kInputCount;
  const double values[] = {-1.0, -0.0, 0.0, 0.005, 0.00999999, 0.01, 0.5, 1.0, 1.0000001, 100.0, 101325.0, 1e300,
                           std::numeric_limits<double>::max(), std::numeric_limits<double>::infinity(),
                           std::numeric_limits<double>::quiet_NaN()};
  for (std::size_t i = 0; i < kInputCount; ++i) {
    const auto input = static_cast<Input>(i);
    for (double v : values) {
      INFO(shaftwork::machines::key_of(input) << " = " << v);
      const bool plain = shaftwork::io::plainly_acceptable_range(input).contains(v);
      bool passes_all = true;
      for (const char* unit : {"", "%", "kPa", "barg", "degC"}) {
        passes_all = passes_all && shaftwork::io::given_value_problem(input, v, unit).empty();
      }
      // The plain range is the full check's passes less the values below 0.01 and the barometer.
      CHECK(plain == (passes_all && v >= 0.01 && input != Input::barometric_pressure));
    }
  }
}
