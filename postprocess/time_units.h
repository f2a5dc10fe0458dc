// Times for people: a readable unit for an axis or a label, and times typed on the command line.
#pragma once

#include <string>

namespace fickcast::post
{
  /// A unit of time: its symbol and its length in seconds (yr is the Julian year, 365.25 d).
  struct TimeUnit
  {
    std::string symbol;
    double seconds = 1;
  };

  /// The largest of s, min, h, d, yr in which @p span_seconds is at least about 2 units.
  TimeUnit readable_time_unit(double span_seconds);

  /// @p seconds written with a readable unit, e.g. `2 yr`, `36 h`, `0.5 s` (4 significant digits).
  std::string format_time(double seconds);

  /// A time written as a number and an optional unit (s, min, h, d, yr; `3 h`, `2.5yr`, `100`).
  /// PostInputError naming @p where if it is not one.
  double parse_time(const std::string &text, const std::string &where);

  /// @p value with @p digits significant digits (%g).
  std::string format_number(double value, int digits = 4);
} // namespace fickcast::post
