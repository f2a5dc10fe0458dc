// Source: Crank, The Mathematics of Diffusion, 2nd ed. 1975, eq. 2.45 (published); the band of
// error against tolerance is this project's own requirement (issue 24), not a published value.
// The error-controlled step: the final error of a transient must follow time.tolerance. Checked on
// erfc (Crank, The Mathematics of Diffusion, 2nd ed. 1975, eq. 2.45; Boost.Math erfc) on a mesh
// fine enough that the spatial error lies far below the smallest tolerance used, so what is
// measured is the time error the step controller lets through.
#include "case_runner.h"

#include <boost/math/special_functions/erf.hpp>

#include <gtest/gtest.h>

#include <cmath>
#include <cstdio>
#include <string>

namespace fickcast::testing
{
  namespace
  {
    const double depths[] = {0.1, 0.3, 0.6, 1.0, 1.5, 2.5};

    /// Largest |C - C_exact| / C0 over the points at t = 1 s for a step tolerance.
    double erfc_error(const std::string &tolerance, unsigned int &steps)
    {
      std::string points;
      for (std::size_t k = 0; k < std::size(depths); ++k)
        points += "point.p" + std::to_string(k) + " = " + std::to_string(depths[k]) + " m\n";
      const std::string text = "[case]\ntitle = step control on erfc\n[geometry]\nlayers = medium 12 m\n"
                               "cell_size = 0.004 m\n[region.medium]\ndiffusivity = 1 m2/s\n[boundary.top]\n"
                               "type = concentration\nvalue = 1 mol/m3\n[time]\nend = 1 s\ntolerance = " +
                               tolerance + "\n[output]\nfields = false\n" + points;
      const RunRecord record = run(describe(text, "step_control_" + tolerance));
      EXPECT_EQ(record.status, "completed") << record.message;
      double worst = 0;
      for (std::size_t k = 0; k < record.points.size(); ++k)
        worst = std::max(worst, std::abs(record.points[k].final_value - boost::math::erfc(depths[k] / 2.0)));
      steps = record.steps_accepted;
      return worst;
    }
  } // namespace

  // The error falls as the tolerance is tightened, and stays within a stated band of it. The band
  // is where fickcast's controller stands today (measured: see the printout); it is written as
  // two constants so that a controller that keeps its word can tighten them.
  TEST(StepControl, ErfcErrorFollowsTheTolerance)
  {
    // Measured ratios error / tolerance: 0.35 (1e-3), 2.0 (1e-4), 5.3 (1e-5) with 137, 252 and 509
    // steps; the band is three times wider than what was measured on either side.
    constexpr double band_low = 0.1, band_high = 16;
    double previous = 1;
    for (const char *tolerance : {"1e-3", "1e-4", "1e-5"})
      {
        unsigned int steps = 0;
        const double error = erfc_error(tolerance, steps);
        const double ratio = error / std::stod(tolerance);
        std::printf("step control: tolerance %s, %u steps, largest error %.3e (%.2f x tolerance)\n", tolerance, steps,
                    error, ratio);
        EXPECT_LT(error, previous) << "tolerance " << tolerance;
        EXPECT_GT(ratio, band_low) << "tolerance " << tolerance;
        EXPECT_LT(ratio, band_high) << "tolerance " << tolerance;
        previous = error;
      }
  }
} // namespace fickcast::testing
