// Linear interpolation between two points of a table (time tables, temperature schedules).
#pragma once

namespace fickcast
{
  /// The value at @p t of the line through (@p t0, @p v0) and (@p t1, @p v1), t0 <= t < t1 and
  /// all finite: finite too, also when t1 - t0 or v1 - v0 lies beyond the largest double (a table
  /// from -1e308 to 1e308 must not give inf or NaN between its rows).
  double interpolate(double t0, double v0, double t1, double v1, double t);
} // namespace fickcast
