#include "shaftwork/io/number_format.hpp"

#include <charconv>
#include <cmath>
#include <cstdint>
#include <cstdlib>
#include <cstring>
#include <string>

#include <fmt/format.h>

namespace shaftwork::io {
namespace {

// 10^k for k = -8..22 (those with k >= 0 exact in a double).
constexpr int kLowestPower = -8;
constexpr double kPowersOfTen[] = {1e-8, 1e-7, 1e-6, 1e-5, 1e-4, 1e-3, 1e-2, 1e-1, 1e0,  1e1,  1e2,
                                   1e3,  1e4,  1e5,  1e6,  1e7,  1e8,  1e9,  1e10, 1e11, 1e12, 1e13,
                                   1e14, 1e15, 1e16, 1e17, 1e18, 1e19, 1e20, 1e21, 1e22};
constexpr double power_of_ten(int k) { return kPowersOfTen[k - kLowestPower]; }

// Bytes moved by each fixed-size copy of digits: more than the 17 digits of a number.
constexpr std::size_t kCopy = 24;

// "00" "01" ... "99": two digits per lookup.
constexpr char kDigitPairs[] =
    "00010203040506070809101112131415161718192021222324252627282930313233343536373839"
    "40414243444546474849505152535455565758596061626364656667686970717273747576777879"
    "8081828384858687888990919293949596979899";

// The decimal exponent e with 10^e <= a < 10^(e+1), for 1e-5 <= a < 1e15: from the
// binary exponent (log10(2) ~ 78913 / 2^18), corrected by one comparison.
int decimal_exponent(double a) {
  std::uint64_t bits = 0;
  std::memcpy(&bits, &a, sizeof bits);
  const int binary = static_cast<int>((bits >> 52) & 0x7ff) - 1023;  // floor(log2 a)
  int e = (binary * 78913) >> 18;                                      // floor(binary log10 2)
  if (a >= power_of_ten(e + 1)) ++e;
  return e;
}

// Writes the eight digits of v < 1e8, leading zeros included, at out[0..8): the four
// pairs come from two independent divisions, so they cost little more than one.
void eight_digits(char* out, std::uint32_t v) {
  const std::uint32_t high = v / 10000;
  const std::uint32_t low = v - high * 10000;
  const std::uint32_t a = high / 100, b = high - a * 100;
  const std::uint32_t c = low / 100, d = low - c * 100;
  std::memcpy(out, kDigitPairs + 2 * a, 2);
  std::memcpy(out + 2, kDigitPairs + 2 * b, 2);
  std::memcpy(out + 4, kDigitPairs + 2 * c, 2);
  std::memcpy(out + 6, kDigitPairs + 2 * d, 2);
}

// Writes the decimal digits of n (no leading zeros) ending at `end`; returns the start.
char* digits_before(char* end, std::uint64_t n) {
  char* first = end;
  while (n >= 100000000u) {
    const std::uint64_t q = n / 100000000u;
    first -= 8;
    eight_digits(first, static_cast<std::uint32_t>(n - q * 100000000u));
    n = q;
  }
  auto v = static_cast<std::uint32_t>(n);
  while (v >= 100) {
    const std::uint32_t q = v / 100;
    first -= 2;
    std::memcpy(first, kDigitPairs + 2 * (v - q * 100), 2);
    v = q;
  }
  if (v >= 10) {
    first -= 2;
    std::memcpy(first, kDigitPairs + 2 * v, 2);
  } else {
    *--first = static_cast<char>('0' + v);
  }
  return first;
}

}  // namespace

char* format_significant(char* out, double value, int digits) {
  if (digits < 1) digits = 1;
  if (digits > 17) digits = 17;
  if (value == 0) {
    *out = '0';
    return out + 1;
  }
  const double a = std::fabs(value);
  if (!(a >= 1e-5 && a < 1e15)) {
    return std::to_chars(out, out + kMaxNumberChars, value, std::chars_format::general, digits).ptr;
  }
  if (value < 0) *out++ = '-';
  const int e = decimal_exponent(a);
  int decimals = digits - 1 - e;  // digits after the decimal point
  int trailing_zeros = 0;         // zeros of the integer part beyond `digits` significant ones
  double scaled = 0;
  if (decimals >= 0) {
    scaled = a * power_of_ten(decimals);  // decimals <= 16 + 5: an exact power
  } else {
    trailing_zeros = -decimals;
    decimals = 0;
    scaled = a / power_of_ten(trailing_zeros);
  }
  const auto n = static_cast<std::uint64_t>(static_cast<std::int64_t>(scaled + 0.5));  // < 2^63

  // The digits end at the middle of the buffer; the copies below move a fixed 24 bytes
  // (a few moves, no call) and then count only the digits that belong.
  char buffer[2 * kCopy];
  char* const digits_end = buffer + kCopy;
  const char* first = digits_before(digits_end, n);
  const int length = static_cast<int>(digits_end - first);

  if (decimals == 0) {
    std::memcpy(out, first, kCopy);
    out += length;
    for (int i = 0; i < trailing_zeros; ++i) *out++ = '0';
    return out;
  }
  // Drop trailing zeros of the fraction.
  const char* last = digits_end;
  while (decimals > 0 && last[-1] == '0') {
    --last;
    --decimals;
  }
  const int kept = static_cast<int>(last - first);
  if (decimals == 0) {
    std::memcpy(out, first, kCopy);
    return out + kept;
  }
  if (kept > decimals) {
    const int whole = kept - decimals;
    std::memcpy(out, first, kCopy);
    out += whole;
    *out++ = '.';
    std::memcpy(out, first + whole, kCopy);
    return out + decimals;
  }
  *out++ = '0';
  *out++ = '.';
  for (int i = kept; i < decimals; ++i) *out++ = '0';
  std::memcpy(out, first, kCopy);
  return out + kept;
}

void append_significant(std::string& text, double value, int digits) {
  char buffer[kMaxNumberChars];
  const char* end = format_significant(buffer, value, digits);
  text.append(buffer, static_cast<std::size_t>(end - buffer));
}

double rounded_for_output(double x, int digits) {
  if (x == 0 || !std::isfinite(x)) return x + 0.0;
  const std::string text = fmt::format("{:.{}g}", x, digits);
  return std::strtod(text.c_str(), nullptr);
}

}  // namespace shaftwork::io
