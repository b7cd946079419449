// shaftwork/io/timestamp.hpp — a logger's timestamp cell as a number of seconds, and back.
//
// The forms read are ISO 8601's calendar date with an optional time of day:
// "2026-03-02", "2026-03-02 00:05", "2026-03-02T00:05:30", "2026-03-02 00:05:30.25", with
// an optional trailing "Z". There is no time zone: the seconds count from 1970-01-01 00:00
// of the same clock, so differences and the text written back are right whatever zone the
// logger kept. The C library does the calendar (timegm, gmtime_r: no zone, no daylight saving).
#pragma once

#include <optional>
#include <string>
#include <string_view>

namespace shaftwork::io {

// Seconds since 1970-01-01 00:00, or nothing when `cell` is not a timestamp of those forms
// (a month 13, a day 31 in April, a minute 60 and the like are not).
std::optional<double> parse_timestamp(std::string_view cell);

// "2026-03-02 00:05" (seconds dropped) for a number parse_timestamp gave.
std::string timestamp_text(double seconds);

}  // namespace shaftwork::io
