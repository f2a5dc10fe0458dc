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
    double erfc_error(const std::string &tolerance, unsigned int &steps, const std::string &control = "local",
                      double *carried = nullptr)
    {
      std::string points;
      for (std::size_t k = 0; k < std::size(depths); ++k)
        points += "point.p" + std::to_string(k) + " = " + std::to_string(depths[k]) + " m\n";
      const std::string text = "[case]\ntitle = step control on erfc\n[geometry]\nlayers = medium 12 m\n"
                               "cell_size = 0.004 m\n[region.medium]\ndiffusivity = 1 m2/s\n[boundary.top]\n"
                               "type = concentration\nvalue = 1 mol/m3\n[time]\nend = 1 s\ntolerance = " +
                               tolerance + "\nerror_control = " + control + "\n[output]\nfields = false\n" + points;
      const RunRecord record = run(describe(text, "step_control_" + control + tolerance));
      EXPECT_EQ(record.status, "completed") << record.message;
      double worst = 0;
      for (std::size_t k = 0; k < record.points.size(); ++k)
        worst = std::max(worst, std::abs(record.points[k].final_value - boost::math::erfc(depths[k] / 2.0)));
      steps = record.steps_accepted;
      if (carried)
        *carried = record.carried_time_error;
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

  // time.error_control = global: each step's local error is carried by the later steps (one more
  // solve with the step's matrix), and a step is sized so that the carried error stays within the
  // tolerance. The final error must then lie within a factor 2 of the tolerance (the issue's
  // requirement, not a published value), and the carried estimate must be honest: the true error
  // no larger than 1.5 times it. Measured here: 0.76, 0.88, 0.94 x tolerance with 1e-4 .. 1e-6
  // (359, 976, 2693 steps); true error / carried estimate 0.84-0.95. With local control the ratios
  // are 2.0, 5.3, 13 (outside the band: with the carrying disabled on purpose the test failed with
  // 2.03, 5.34, 12.9).
  TEST(StepControl, GlobalControlKeepsItsWord)
  {
    double previous = 1;
    for (const char *tolerance : {"1e-4", "1e-5", "1e-6"})
      {
        unsigned int steps = 0;
        double carried = -1;
        const double error = erfc_error(tolerance, steps, "global", &carried);
        const double ratio = error / std::stod(tolerance);
        std::printf("global step control: tolerance %s, %u steps, largest error %.3e (%.2f x tolerance), carried "
                    "estimate %.3e\n",
                    tolerance, steps, error, ratio, carried);
        EXPECT_LT(error, previous) << "tolerance " << tolerance;
        EXPECT_GE(ratio, 0.5) << "tolerance " << tolerance;
        EXPECT_LE(ratio, 2.0) << "tolerance " << tolerance;
        EXPECT_GT(carried, 0) << "tolerance " << tolerance;
        EXPECT_LE(error, 1.5 * carried) << "tolerance " << tolerance;
        EXPECT_LE(carried, 1.0001 * std::stod(tolerance)) << "tolerance " << tolerance;
        previous = error;
      }
  }
} // namespace fickcast::testing
