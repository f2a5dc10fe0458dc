// How model values and points appear in messages: one place for the coefficient checks of
// Material and BoundaryCondition.
#pragma once

#include <string>

namespace fickcast
{
  /// A point in a message, in m: `x = 0.5 m`, `(x, y) = (0.1, 0.2) m`, ... by @p dimension.
  std::string describe_point(double x, double y, double z, unsigned int dimension);

  /// A value in a message: six significant digits, any magnitude (-1e-09, not -0.000000); NaN
  /// as `NaN`, infinities as `inf` and `-inf`.
  std::string number_text(double value);

  /**
   * Remembers in @p report_to (if it is not null and still empty) that the expression or table
   * of case key @p key gave the non-finite @p value at a point and time:
   * "KEY: expected a finite value, found NaN at x = 0 m, t = 86400 s" (without the point if the
   * value does not depend on it, @p at_point false).
   */
  void report_non_finite(std::string *report_to, const std::string &key, double value, bool at_point, double x,
                         double y, double z, double t, unsigned int dimension);
} // namespace fickcast
