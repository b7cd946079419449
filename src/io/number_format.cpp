#include "shaftwork/io/number_format.hpp"

#include <bit>
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


// Up to sixteen bytes of text held in two words: text byte i is byte i % 8 of `low`
// (i < 8) or of `high`, counting from the least significant byte. Digits are held as
// their values 0-9 and turned into characters only at the end.
struct Text16 {
  std::uint64_t low;
  std::uint64_t high;
};

// Bytes of '0' ^ value turn digit values into characters; kPointMark ^ '0' is '.'.
constexpr std::uint64_t kZeroChars = 0x3030303030303030u;
constexpr std::uint64_t kPointMark = 0x1e;

// The ten digit values of 10^9 <= v < 10^10, the first digit in the lowest byte. The
// last eight are split into halves, pairs and digits, each step in all lanes at once
// (x * 10486 >> 20 is x / 100 for x < 10^4, x * 103 >> 10 is x / 10 for x < 100); the
// halves both come from v, so that the steps wait on one division, not two.
Text16 ten_digit_values(std::uint64_t v) {
  const auto first_two = static_cast<std::uint32_t>(v / 100000000u);
  const std::uint64_t middle = v / 10000u;
  const std::uint64_t halves = (middle - std::uint64_t{first_two} * 10000) | ((v - middle * 10000) << 32);
  const std::uint64_t hundreds = ((halves * 10486) >> 20) & 0x0000007f0000007fu;
  const std::uint64_t pairs = hundreds | ((halves - hundreds * 100) << 16);
  const std::uint64_t tens = ((pairs * 103) >> 10) & 0x000f000f000f000fu;
  const std::uint64_t last_eight = tens | ((pairs - tens * 10) << 8);
  const std::uint32_t first = (first_two * 103) >> 10;
  return {first | (std::uint64_t{first_two - first * 10} << 8) | (last_eight << 16), last_eight >> 48};
}

// The text moved `bytes` (< 8) places toward its end, zeros coming in at the start.
Text16 toward_end(Text16 t, int bytes) {
  const int s = 8 * bytes;
  return {t.low << s, (t.high << s) | ((t.low >> 1) >> (63 - s))};
}

// The text with a point mark put in at byte `at` (< 16), the bytes from there on moved
// one place on (the sixteenth byte is lost).
Text16 with_point_at(Text16 t, int at) {
  if (at < 8) {
    const std::uint64_t before = (std::uint64_t{1} << (8 * at)) - 1;
    return {(t.low & before) | ((t.low & ~before) << 8) | (kPointMark << (8 * at)),
            (t.high << 8) | (t.low >> 56)};
  }
  const std::uint64_t before = (std::uint64_t{1} << (8 * (at - 8))) - 1;
  return {t.low, (t.high & before) | ((t.high & ~before) << 8) | (kPointMark << (8 * (at - 8)))};
}

// The place of the last nonzero byte of ten digit values (the first not zero). Without a
// bit-scan instruction (slow on some processors without flags beyond x86-64): the
// binary exponent of the word as a double. Its bytes are at most 9, so it is below 2^60
// and no rounding of the conversion reaches the next power of two.
int last_nonzero(Text16 ten) {
  if (ten.high != 0) return (ten.high >> 8) != 0 ? 9 : 8;
  const auto bits = std::bit_cast<std::uint64_t>(static_cast<double>(static_cast<std::int64_t>(ten.low)));
  return static_cast<int>((bits >> 52) - 1023) >> 3;
}

// Writes the sixteen bytes of `t` as characters at out[0..16).
void store_chars(char* out, Text16 t) {
  const std::uint64_t words[2] = {t.low ^ kZeroChars, t.high ^ kZeroChars};
  if constexpr (std::endian::native == std::endian::little) {
    std::memcpy(out, words, 16);
  } else {
    for (int i = 0; i < 16; ++i) out[i] = static_cast<char>(words[i / 8] >> (8 * (i % 8)));
  }
}

// 10^k for k = 0..10 as integers.
constexpr std::uint64_t kIntegerPowers[] = {1,         10,         100,        1000,
                                            10000,     100000,     1000000,    10000000,
                                            100000000, 1000000000, 10000000000};

// format_significant's text of n, 10^(digits-1) <= n < 10^digits (digits <= 10), with
// `decimals` of its digits after the point (trailing zeros of those dropped) and, where
// decimals is 0, `trailing_zeros` zeros after it; at most 16 characters, at most 4
// zeros between the point and n's digits. Built in two words and stored at once:
// sixteen bytes are written at `out`.
char* write_short(char* out, std::uint64_t n, int digits, int decimals, int trailing_zeros) {
  // n's digits, then zeros, ten in all: the first always at byte 0.
  const Text16 ten = ten_digit_values(n * kIntegerPowers[10 - digits]);
  if (decimals == 0) {
    store_chars(out, ten);  // the trailing zeros come in as zeros
    return out + digits + trailing_zeros;
  }
  const int last = last_nonzero(ten);
  const int point = digits - decimals;  // digits before the point
  if (point > 0) {
    store_chars(out, with_point_at(ten, point));
    return out + (last < point ? point : last + 2);  // no bare point
  }
  // "0.", then -point zeros, then the digits.
  Text16 text = toward_end(ten, 2 - point);
  text.low |= kPointMark << 8;
  store_chars(out, text);
  return out + (2 - point + last + 1);
}

// format_significant's text of n (any size) with `decimals` digits after the point and
// `trailing_zeros` zeros after n where decimals is 0: the general case, digits counted out.
[[gnu::noinline]] char* write_long(char* out, std::uint64_t n, int decimals, int trailing_zeros) {
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

// n: `a` (1e-5 <= a < 1e15, decimal exponent e) rounded to `digits` significant digits,
// as an integer with `decimals` of them after the point, or, where the digits end before
// the point, `trailing_zeros` zeros after them (decimals 0). The product (or quotient) by
// the power of ten is rounded to a double, then rounded half up to an integer.
std::uint64_t scaled_digits(double a, int digits, int& decimals, int& trailing_zeros) {
  const int e = decimal_exponent(a);
  decimals = digits - 1 - e;
  trailing_zeros = 0;
  double scaled = 0;
  if (decimals >= 0) {
    scaled = a * power_of_ten(decimals);  // decimals <= 16 + 5: an exact power
  } else {
    trailing_zeros = -decimals;
    decimals = 0;
    scaled = a / power_of_ten(trailing_zeros);
  }
  return static_cast<std::uint64_t>(static_cast<std::int64_t>(scaled + 0.5));  // < 2^63
}

// format_significant for what its short path leaves: digits outside 1..10, zero, other
// magnitudes (std::to_chars) and values that are not finite. Out of line, so that the
// short path keeps its registers.
[[gnu::noinline]] char* format_other(char* out, double value, int digits) {
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
  int decimals = 0;
  int trailing_zeros = 0;
  const std::uint64_t n = scaled_digits(a, digits, decimals, trailing_zeros);
  return write_long(out, n, decimals, trailing_zeros);
}

}  // namespace

char* format_significant(char* out, double value, int digits) {
  const double a = std::fabs(value);
  if (!(a >= 1e-5 && a < 1e15) || static_cast<unsigned>(digits - 1) >= 10) {
    return format_other(out, value, digits);
  }
  *out = '-';  // overwritten by the digits where value > 0
  out += value < 0;
  int decimals = 0;
  int trailing_zeros = 0;
  const std::uint64_t n = scaled_digits(a, digits, decimals, trailing_zeros);
  // `digits` digits, built in registers; n == 10^digits, where rounding carried into a
  // new decade, counted out. 1e-5 <= a < 1e15 keeps write_short's bounds: decimals
  // <= 9 + 5, and digits + trailing_zeros = e + 1 <= 15.
  const std::uint64_t lowest = kIntegerPowers[digits - 1];
  if (n - lowest >= 9 * lowest) return write_long(out, n, decimals, trailing_zeros);
  return write_short(out, n, digits, decimals, trailing_zeros);
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
