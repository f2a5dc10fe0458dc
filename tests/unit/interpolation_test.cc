// Linear interpolation between two rows, exact in ordinary ranges and finite at the extremes.
#include "case/interpolation.h"

#include <gtest/gtest.h>

#include <cmath>
#include <limits>

namespace fickcast
{
  TEST(Interpolation, OrdinaryRowsGiveTheLine)
  {
    EXPECT_DOUBLE_EQ(interpolate(0, 1, 2, 3, 0), 1.0);
    EXPECT_DOUBLE_EQ(interpolate(0, 1, 2, 3, 1), 2.0);
    EXPECT_DOUBLE_EQ(interpolate(3600, 0.1, 7200, 0.3, 5400), 0.2);
    EXPECT_DOUBLE_EQ(interpolate(-1, 5, 1, 5, 0.3), 5.0); // a plateau stays exact
  }

  // The rows a table of doubles may hold: spans and differences beyond the largest double.
  TEST(Interpolation, ExtremeRowsGiveFiniteValuesBetweenThem)
  {
    const double most = std::numeric_limits<double>::max();
    EXPECT_DOUBLE_EQ(interpolate(-most, 0, most, 2, 0), 1.0);                    // span overflows
    EXPECT_DOUBLE_EQ(interpolate(0, -most, 1, most, 0.5), 0.0);                  // difference overflows
    EXPECT_DOUBLE_EQ(interpolate(-most, -most, most, most, most / 2), most / 2); // both
    for (const double t : {0.0, 1e-300, 0.25, 0.999999999999})
      {
        const double v = interpolate(0, most, 1, most, t);
        EXPECT_TRUE(std::isfinite(v)) << t;
        EXPECT_DOUBLE_EQ(v, most);
      }
  }
} // namespace fickcast
