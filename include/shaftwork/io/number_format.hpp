// shaftwork/io/number_format.hpp — numbers to text, fast, for outputs of millions of rows.
#pragma once

#include <string>

namespace shaftwork::io {

// Room that format_significant needs at `out`: the text is at most 32 characters, and
// bytes after the text, up to this bound, may be overwritten (it moves digits in
// fixed-size blocks, which is faster than counting them out).
inline constexpr int kMaxNumberChars = 64;

// Writes `value` rounded to `digits` significant digits (1 to 17) at `out` and returns
// the end of the text. Trailing zeros and a bare decimal point are dropped ("2", "0.25",
// "101325", "-40.5"); 1e-5 <= |value| < 1e15 is written without an exponent, other
// magnitudes as std::to_chars writes them in general form ("1.5e-07"). Zero is "0";
// a value that is not finite is written as std::to_chars writes it ("nan", "inf").
// Integer arithmetic on a scaled value, some five times faster than printf's %.10g.
// The digits are printf's %.*g digits except near a tie: |value| * 10^k (k = digits - 1 - e,
// 10^e <= |value| < 10^(e+1)) is rounded to a double, then half up to an integer, where
// printf rounds the exact value half to even. Up to 15 digits the two differ only where
// the exact product lies within its double's rounding error (2^-53 of it) of a half unit,
// and then by one unit in the last digit (for 10 digits: within about 1e-6 of a unit of
// a tie); for 16 and 17 digits the product's rounding to the double grid (1 to 16 units)
// can move the last digit by up to 1 + 2^-53 n units (n the digits as an integer).
// tests/io/test_number_format.cpp holds it to these bounds and to printf everywhere else.
char* format_significant(char* out, double value, int digits);

// Appends format_significant's text to `text`.
void append_significant(std::string& text, double value, int digits);

// An SI value rounded to 15 significant digits, as results are written: the digits a double
// holds for sure, so that unit conversions leave no noise in the last place (4120800, not
// 4120800.0000000005). Zero and non-finite values are returned as they are (-0 as 0).
// Fewer `digits` for figures known to less (an uncertainty: 6).
double rounded_for_output(double x, int digits = 15);

}  // namespace shaftwork::io
