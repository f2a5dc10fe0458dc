// Instantaneous plane (1-D), line (2-D) and point (3-D) sources against the Gaussian, with the
// second moment of the computed field. Fields are read back from the written VTU/PVD files.
#include "case_runner.h"
#include "vtu_fields.h"

#include <boost/math/constants/constants.hpp>

#include <gtest/gtest.h>

#include <cmath>
#include <cstdio>

namespace fickcast::testing
{
  namespace
  {
    constexpr double pi = boost::math::constants::pi<double>();

    /// Gaussian of an amount M = 1 released at the centre, age a (D = 1), in d dimensions:
    /// C = exp(-r^2 / (4 a)) / (4 pi a)^(d/2). Crank 1975 sec. 2.2 (1-D, eq. 2.6, from memory);
    /// Carslaw & Jaeger 1959 sec. 10.2-10.3 (point and line sources).
    double gaussian(const int d, const double r2, const double age)
    {
      return std::exp(-r2 / (4 * age)) / std::pow(4 * pi * age, 0.5 * d);
    }

    struct Moments
    {
      double mass;
      double second; ///< int r^2 C / int C
    };

    Moments moments(const FieldSnapshot &s, const int d, const double centre)
    {
      const auto &c = s.array("concentration");
      std::vector<double> weighted(c.size());
      for (std::size_t i = 0; i < c.size(); ++i)
        {
          double r2 = 0;
          for (int k = 0; k < d; ++k)
            r2 += (s.points[i][k] - centre) * (s.points[i][k] - centre);
          weighted[i] = r2 * c[i];
        }
      const double mass = s.integrate(c);
      return {mass, s.integrate(weighted) / mass};
    }

    /// Runs a Gaussian released at age 0.25 at the centre of a box of side @p side in @p d
    /// dimensions, outputs at ages 1 and 2 (d < 3) or 0.5 and 1 (d = 3), and checks the fields.
    /// With @p symmetric, only the part x, y, z > 0 of the box is solved (side / 2, the source at
    /// the corner): the sealed faces through the source are planes of symmetry, so the field is
    /// the same Gaussian there (method of images, Carslaw & Jaeger 1959 sec. 10.10).
    void check_gaussian(const int d, const double full_side, const double cell, const double tolerance,
                        const bool symmetric = false)
    {
      const double side = symmetric ? full_side / 2 : full_side;
      const double centre = symmetric ? 0.0 : side / 2;
      const double age0 = 0.25;
      const std::string c = std::to_string(centre);
      std::string r2 = "(x-" + c + ")^2";
      if (d >= 2)
        r2 += "+(y-" + c + ")^2";
      if (d == 3)
        r2 += "+(z-" + c + ")^2";
      const std::string initial = "{exp(-(" + r2 + ")/(4*0.25))/(4*pi*0.25)^(" + std::to_string(d) + "/2)}";
      const double t1 = d == 3 ? 0.25 : 0.75, t2 = d == 3 ? 0.75 : 1.75;
      std::string text = "[case]\ntitle = gaussian\ndimension = " + std::to_string(d) +
                         "\n[geometry]\nlayers = medium " + std::to_string(side) +
                         " m\ncell_size = " + std::to_string(cell) + " m\n";
      if (d >= 2)
        text += "width = " + std::to_string(side) + " m\n";
      if (d == 3)
        text += "length = " + std::to_string(side) + " m\n";
      text += "[region.medium]\ndiffusivity = 1 m2/s\n[initial]\nvalue = " + initial +
              " mol/m3\n[time]\nend = " + std::to_string(t2) +
              " s\ntolerance = 1e-5\n[output]\ntimes = " + std::to_string(t1) + " s\n";
      const CaseDescription description = describe(text, "gaussian_" + std::to_string(d) + "d");
      const RunRecord record = run(description);
      ASSERT_EQ(record.status, "completed");
      const auto snapshots = read_all_fields(description.output.folder + "/fields/fields.pvd");
      ASSERT_EQ(snapshots.size(), 3u);
      const double peak0 = gaussian(d, 0, age0);
      const Moments start = moments(snapshots[0], d, centre);
      for (std::size_t k = 1; k < snapshots.size(); ++k)
        {
          const auto &s = snapshots[k];
          const double age = age0 + s.time;
          const auto &values = s.array("concentration");
          double worst = 0;
          for (std::size_t i = 0; i < values.size(); ++i)
            {
              double rr = 0;
              for (int j = 0; j < d; ++j)
                rr += (s.points[i][j] - centre) * (s.points[i][j] - centre);
              worst = std::max(worst, std::abs(values[i] - gaussian(d, rr, age)));
            }
          std::printf("%d-D Gaussian at t = %g s: largest error %.3e of the initial peak (bound %.1e)\n", d, s.time,
                      worst / peak0, tolerance);
          EXPECT_LT(worst, tolerance * peak0) << d << "-D at t = " << s.time << " s";
          // Mean-square displacement grows as 2 d D t (common practice; Crank 1975 ch. 2-3).
          const Moments now = moments(s, d, centre);
          std::printf("%d-D Gaussian at t = %g s: second-moment growth / (2 d D t) = %.5f\n", d, s.time,
                      (now.second - start.second) / (2 * d * s.time));
          EXPECT_NEAR((now.second - start.second) / (2 * d * s.time), 1.0, 1e-3) << d << "-D at t = " << s.time;
          EXPECT_NEAR(now.mass, start.mass, 1e-6 * start.mass); // sealed box: amount kept
        }
    }
  } // namespace

  TEST(InstantaneousSource, PlaneSourceOneDimension)
  {
    check_gaussian(1, 20.0, 0.05, 1e-4); // measured 4.2e-5
  }

  TEST(InstantaneousSource, LineSourceTwoDimensions)
  {
    check_gaussian(2, 16.0, 0.25, 2e-4); // measured 4.2e-5
  }

  TEST(InstantaneousSource, PointSourceThreeDimensions)
  {
    check_gaussian(3, 12.0, 0.5, 1.5e-3, true); // measured 3.3e-4 (one octant, symmetry planes)
  }
} // namespace fickcast::testing
