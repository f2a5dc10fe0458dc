#include "model/value_text.h"

#include <cmath>
#include <cstdio>

namespace fickcast
{
  std::string describe_point(const double x, const double y, const double z, const unsigned int dimension)
  {
    char buffer[128];
    if (dimension == 1)
      std::snprintf(buffer, sizeof(buffer), "x = %.6g m", x);
    else if (dimension == 2)
      std::snprintf(buffer, sizeof(buffer), "(x, y) = (%.6g, %.6g) m", x, y);
    else
      std::snprintf(buffer, sizeof(buffer), "(x, y, z) = (%.6g, %.6g, %.6g) m", x, y, z);
    return buffer;
  }

  std::string number_text(const double value)
  {
    if (std::isnan(value))
      return "NaN";
    char buffer[32];
    std::snprintf(buffer, sizeof(buffer), "%.6g", value);
    return buffer;
  }

  void report_non_finite(std::string *report_to, const std::string &key, const double value, const bool at_point,
                         const double x, const double y, const double z, const double t, const unsigned int dimension)
  {
    if (report_to == nullptr || !report_to->empty())
      return;
    *report_to = key + ": expected a finite value, found " + number_text(value) + " at " +
                 (at_point ? describe_point(x, y, z, dimension) + ", " : std::string()) + "t = " + number_text(t) +
                 " s";
  }
} // namespace fickcast
