#include "case/interpolation.h"

#include <algorithm>
#include <cmath>

namespace fickcast
{
  double interpolate(const double t0, const double v0, const double t1, const double v1, const double t)
  {
    // A span beyond the largest double (t1 - t0 = inf): the same fraction from the halves.
    const double span = t1 - t0;
    const double fraction = std::isfinite(span) ? (t - t0) / span : (0.5 * t - 0.5 * t0) / (0.5 * t1 - 0.5 * t0);
    const double value = v0 + fraction * (v1 - v0);
    if (std::isfinite(value))
      return value;
    // v1 - v0 beyond the largest double: the weighted mean of the halves, kept between v0 and v1.
    const double half = (1 - fraction) * (0.5 * v0) + fraction * (0.5 * v1);
    return std::clamp(2 * half, std::min(v0, v1), std::max(v0, v1));
  }
} // namespace fickcast
