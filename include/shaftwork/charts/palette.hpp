// shaftwork/charts/palette.hpp — the colours and marks of every chart.
//
// Colours from the palette of Okabe and Ito ("Color Universal Design", J*FLY, 2008),
// chosen to stay apart for the common forms of colour blindness; every role also has
// its own mark shape or dash, so a chart printed in grey still reads.
#pragma once

#include <cstdint>

namespace shaftwork::charts {

struct Colour {
  std::uint8_t r = 0, g = 0, b = 0;
};

inline constexpr Colour kInk{0x1a, 0x1a, 0x1a};        // text, axes, saturation line
inline constexpr Colour kGrid{0xdd, 0xdd, 0xdd};       // grid lines
inline constexpr Colour kFaint{0x8c, 0x8c, 0x8c};      // isobars, quality lines
inline constexpr Colour kInletColour{0x00, 0x72, 0xb2};      // blue: inlet, first series
inline constexpr Colour kOutletColour{0xd5, 0x5e, 0x00};     // vermillion: actual outlet, second series
inline constexpr Colour kIsentropicColour{0x00, 0x9e, 0x73}; // bluish green: isentropic outlet
inline constexpr Colour kPathColour{0xcc, 0x79, 0xa7};       // reddish purple: polytropic path
inline constexpr Colour kBandColour{0xa6, 0xcf, 0xe8};       // a light blue for bands
// Verdicts, each also with its own mark (verdict_mark in guarantee_chart.hpp) and word.
inline constexpr Colour kPassColour{0x00, 0x9e, 0x73};          // bluish green
inline constexpr Colour kInconclusiveColour{0xe6, 0x9f, 0x00};  // orange
inline constexpr Colour kFailColour{0xd5, 0x5e, 0x00};          // vermillion

// Marks, each a filled shape with a white rim; cross is an X.
enum class Mark { circle, square, diamond, triangle, cross };

}  // namespace shaftwork::charts
