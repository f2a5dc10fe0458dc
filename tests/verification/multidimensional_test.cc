// Named results of 2-D, 3-D and axisymmetric runs against independent values, so that a defect
// shared by one and two ranks (an axis swapped in point lookup, a wrong factor on a 2-D face, a
// radial weight off by a constant) cannot pass:
// (i) the erfc problem (Crank, The Mathematics of Diffusion, 2nd ed. 1975, eq. 2.45) extruded:
//     a column held at C0 on its top face, sealed on every other face, so the exact answer stays
//     1-D: C = C0 erfc(depth / (2 sqrt(D t))), inward flux C0 sqrt(D / (pi t)) and amount
//     2 C0 sqrt(D t / pi) per unit area of the top face (Crank 1975 eqs. 2.46-2.47). Checked:
//     points, a threshold time, a depth along a line, the line's profile, face flux and amount.
// (ii) a genuinely 2-D case: the quarter plane x, y > 0 held at C0 on both faces x = 0 and
//     y = 0: C = C0 [1 - erf(x / 2 sqrt(D t)) erf(y / 2 sqrt(D t))] (product of 1-D solutions,
//     Carslaw & Jaeger, Conduction of Heat in Solids, 2nd ed. 1959, sec. 2.2 and the product rule
//     of sec. 1.15; section numbers from memory), and the inward flux through x = 0 over 0 < y < L,
//     integral of D dC/dx: C0 sqrt(D / (pi t)) [L erf(L / 2 sqrt(D t)) - 2 sqrt(D t / pi)
//     (1 - exp(-L^2 / 4 D t))].
// Boost.Math supplies erf, erfc and the inverse erfc.
#include "case_runner.h"
#include "csv_table.h"

#include <boost/math/constants/constants.hpp>
#include <boost/math/special_functions/erf.hpp>

#include <gtest/gtest.h>

#include <cmath>
#include <cstdio>
#include <string>

namespace fickcast::testing
{
  namespace
  {
    constexpr double pi = boost::math::constants::pi<double>();
    double exact_erfc(const double depth)
    {
      return boost::math::erfc(depth / 2);
    } // D = 1, t = 1, C0 = 1

    struct Shape
    {
      std::string name;
      std::string geometry;       ///< [case] and [geometry] lines beyond the layers
      std::string lateral;        ///< lateral coordinates of points and the line, e.g. "0.15 m, "
      double top_area;            ///< area of the top face (per unit length in 2-D Cartesian)
      unsigned int n_coordinates; ///< columns before the concentration in profiles.csv
    };

    /// Runs the extruded erfc column and checks every named result against the 1-D exact values.
    /// Tolerances: 3-5 times the errors measured with these meshes (the same in 2-D, 3-D and
    /// axisymmetric): points 1.2e-5, threshold 1.5e-7, depth 1.2e-5, line 2.2e-5, flux 4.0e-5,
    /// amount 8e-6 (relative where the check is relative).
    void check_column(const Shape &shape)
    {
      const std::string text = "[case]\ntitle = erfc column " + shape.name + "\n" + shape.geometry +
                               "layers = medium 6 m\ncell_size = 0.05 m\n[region.medium]\ndiffusivity = 1 m2/s\n"
                               "[boundary.top]\ntype = concentration\nvalue = 1 mol/m3\n[time]\nend = 1 s\n"
                               "tolerance = 1e-6\n[output]\nfields = false\npoint.a = " +
                               shape.lateral + "0.5 m\npoint.b = " + shape.lateral +
                               "1 m\nthreshold.b = 0.3 mol/m3\nline.down = " + shape.lateral + "0 m to " +
                               shape.lateral + "6 m\nsamples.down = 61\ndepth.down = 0.1 mol/m3\n";
      const CaseDescription description = describe(text, "column_" + shape.name);
      const RunRecord record = run(description);
      ASSERT_EQ(record.status, "completed") << record.message;

      // Points at depths 0.5 m and 1 m.
      const double a = record.points[0].final_value, b = record.points[1].final_value;
      std::printf("%s: point a %.8f (exact %.8f), b %.8f (exact %.8f)\n", shape.name.c_str(), a, exact_erfc(0.5), b,
                  exact_erfc(1.0));
      EXPECT_NEAR(a, exact_erfc(0.5), 5e-5) << shape.name;
      EXPECT_NEAR(b, exact_erfc(1.0), 5e-5) << shape.name;

      // Threshold: erfc(1 / (2 sqrt(t))) = 0.3 at t = 1 / (4 erfc^-1(0.3)^2).
      const double t_exact = 1 / (4 * std::pow(boost::math::erfc_inv(0.3), 2));
      const double t = record.points[1].threshold_time;
      std::printf("%s: threshold b at %.8f s (exact %.8f s, relative %.2e)\n", shape.name.c_str(), t, t_exact,
                  t / t_exact - 1);
      EXPECT_NEAR(t / t_exact, 1.0, 6e-7) << shape.name;

      // Depth of the 0.1 level along the line: 2 erfc^-1(0.1).
      const double depth_exact = 2 * boost::math::erfc_inv(0.1);
      const double depth = record.depths[0].depths.back();
      std::printf("%s: depth %.8f m (exact %.8f m, relative %.2e)\n", shape.name.c_str(), depth, depth_exact,
                  depth / depth_exact - 1);
      EXPECT_NEAR(depth / depth_exact, 1.0, 5e-5) << shape.name;

      // The line's profile at t = 1 s (profiles.csv: time, line, distance, coordinates, value).
      const CsvTable profiles = read_csv(description.output.folder + "/profiles.csv");
      const auto &time = profiles.column("time");
      const auto &distance = profiles.column("distance");
      const auto &value = profiles.column("concentration");
      double worst = 0;
      std::size_t n_end = 0;
      for (std::size_t r = 0; r < time.size(); ++r)
        if (std::abs(time[r] - 1.0) < 1e-12)
          {
            worst = std::max(worst, std::abs(value[r] - exact_erfc(distance[r])));
            ++n_end;
          }
      std::printf("%s: line profile at 1 s, %zu samples, largest error %.2e\n", shape.name.c_str(), n_end, worst);
      EXPECT_EQ(n_end, 61u) << shape.name;
      EXPECT_LT(worst, 1e-4) << shape.name;

      // Face flux and amount through the top face at t = 1 s.
      const CsvTable series = read_csv(description.output.folder + "/series.csv");
      const double flux = series.column("flux_in.top").back(), amount = series.column("amount_in.top").back();
      const double flux_exact = shape.top_area / std::sqrt(pi), amount_exact = shape.top_area * 2 / std::sqrt(pi);
      std::printf("%s: top flux %.8e (exact %.8e, relative %.2e), amount %.8e (exact %.8e, relative %.2e)\n",
                  shape.name.c_str(), flux, flux_exact, flux / flux_exact - 1, amount, amount_exact,
                  amount / amount_exact - 1);
      EXPECT_NEAR(flux / flux_exact, 1.0, 2e-4) << shape.name;
      EXPECT_NEAR(amount / amount_exact, 1.0, 3e-5) << shape.name;
    }
  } // namespace

  TEST(MultiDimensional, ErfcColumnInTwoDimensions)
  {
    check_column({"2d", "dimension = 2\n[geometry]\nwidth = 0.2 m\n", "0.15 m, ", 0.2, 2});
  }

  TEST(MultiDimensional, ErfcColumnInThreeDimensions)
  {
    check_column(
      {"3d", "dimension = 3\n[geometry]\nwidth = 0.2 m\nlength = 0.15 m\n", "0.15 m, 0.05 m, ", 0.2 * 0.15, 3});
  }

  TEST(MultiDimensional, ErfcColumnAxisymmetric)
  {
    // The full revolution: the top face is a disc of radius 0.2 m.
    check_column(
      {"axisymmetric", "coordinates = axisymmetric\n[geometry]\nradius = 0.2 m\n", "0.1 m, ", pi * 0.2 * 0.2, 2});
  }

  // Measured: points 6.2e-6 and 8.3e-6, flux 3.7e-5 relative.
  // Quarter plane (a 6 m square, far faces sealed: at t = 1 s, erfc(3) = 2e-5 of C0 reaches them,
  // which the flux integral below accounts for by its finite L only to that order).
  TEST(MultiDimensional, QuarterPlaneProductSolution)
  {
    const std::string text = R"(
[case]
title = quarter plane held on two faces
dimension = 2
[geometry]
layers = medium 6 m
width = 6 m
cell_size = 0.1 m
[region.medium]
diffusivity = 1 m2/s
[boundary.top]
type = concentration
value = 1 mol/m3
[boundary.left]
type = concentration
value = 1 mol/m3
[time]
end = 1 s
tolerance = 1e-6
[output]
fields = false
point.corner = 0.5 m, 0.5 m
point.off = 1.2 m, 0.4 m
)";
    const CaseDescription description = describe(text, "quarter_plane");
    const RunRecord record = run(description);
    ASSERT_EQ(record.status, "completed") << record.message;
    auto exact = [](const double x, const double y) { return 1 - boost::math::erf(x / 2) * boost::math::erf(y / 2); };
    const double corner = record.points[0].final_value, off = record.points[1].final_value;
    std::printf("quarter plane: C(0.5, 0.5) = %.8f (exact %.8f), C(1.2, 0.4) = %.8f (exact %.8f)\n", corner,
                exact(0.5, 0.5), off, exact(1.2, 0.4));
    EXPECT_NEAR(corner, exact(0.5, 0.5), 4e-5);
    EXPECT_NEAR(off, exact(1.2, 0.4), 4e-5);
    const double l = 6;
    const double flux_exact =
      (l * boost::math::erf(l / 2) - 2 / std::sqrt(pi) * (1 - std::exp(-l * l / 4))) / std::sqrt(pi);
    const CsvTable series = read_csv(description.output.folder + "/series.csv");
    const double flux = series.column("flux_in.left").back();
    std::printf("quarter plane: flux through x = 0 %.8f (exact %.8f, relative %.2e)\n", flux, flux_exact,
                flux / flux_exact - 1);
    EXPECT_NEAR(flux / flux_exact, 1.0, 1.5e-4);
  }
} // namespace fickcast::testing
