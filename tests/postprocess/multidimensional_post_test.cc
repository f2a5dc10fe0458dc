// fickcast-post's library on 2-D, 3-D and axisymmetric fields against exact values, so that a
// defect in the multi-dimensional paths (coordinates read in the wrong order, a vector component
// taken from the wrong axis, a missing or wrong radial weight) cannot pass the 1-D-only tests:
// (i) the erfc column of tests/verification/multidimensional_test.cc with its fields written: a
//     column held at C0 on its top face, sealed on every other face, so the exact answer stays
//     1-D: C = C0 erfc(depth / (2 sqrt(D t))) (Crank, The Mathematics of Diffusion, 2nd ed. 1975,
//     eq. 2.45), flux D C0 exp(-depth^2 / (4 D t)) / sqrt(pi D t) along the depth and none across
//     it (eq. 2.45 differentiated), and content 2 C0 sqrt(D t / pi) per unit area of the top face
//     (Crank 1975 eq. 2.47). Sampled at points and along a slanted line, integrated over the body.
// (ii) axisymmetric content with the 2 pi r weight: a uniform field c0 in a full and in a hollow
//     cylinder holds c0 pi (R^2 - Ri^2) H (elementary geometry).
// PVTU: a 1-rank run writes fields_NNNN.vtu, never a .pvtu (solver/results/field_writer.cc writes
// a PVTU record only with more than one rank), so a serial test has no PVTU to read; the PVTU of a
// 2-rank run is read by fickcast-post in tests/mpi/mpi_run_test.sh (sample and integrate agree
// with the 1-rank folder to 1e-8).
// erf and erfc from Boost.Math.
#include "case_runner.h"

#include "csv_table.h"
#include "field_sampler.h"
#include "field_series.h"
#include "region_integrator.h"
#include "run_summary.h"

#include <boost/math/constants/constants.hpp>
#include <boost/math/special_functions/erf.hpp>

#include <gtest/gtest.h>

#include <algorithm>
#include <cmath>
#include <cstdio>
#include <string>
#include <vector>

namespace fickcast::post
{
  namespace
  {
    constexpr double pi = boost::math::constants::pi<double>();

    /// D = 1 m2/s, t = 1 s, C0 = 1 mol/m3 below. The sealed bottom at 6 m changes C at depth d by
    /// about erfc((12 m - d) / 2), at most erfc(4) = 1.5e-8 for the depths sampled (<= 4 m), and the
    /// content by far less (exp(-36)): the semi-infinite values below hold to that.
    double exact_concentration(const double depth)
    {
      return boost::math::erfc(depth / 2);
    }
    double exact_flux(const double depth)
    {
      return std::exp(-depth * depth / 4) / std::sqrt(pi);
    }

    /// Tolerances (absolute, C0 = 1 mol/m3):
    /// - values 5e-5: the sampled value is the solver's Q2 function itself (PatchMesh), whose error on
    ///   this mesh (cells 0.05 m, step tolerance 1e-6) tests/verification/multidimensional_test.cc
    ///   measured at 1.2e-5 at points and 2.2e-5 along a line to the sealed bottom at 6 m (where the
    ///   reflection alone adds erfc(3) = 2.2e-5) in 2-D, 3-D and axisymmetric runs, and checks at
    ///   5e-5 and 1e-4; here samples stop at 4 m. The VTU adds float32 rounding of the values (6e-8)
    ///   and of the node positions (3.6e-7 m at 6 m, times a slope of at most 1/sqrt(pi): 2e-7).
    ///   Same tolerance as the solver's own points.
    /// - flux 1e-3 mol/(m2 s): the written flux is the Q2 gradient at the patch nodes; the gradient of
    ///   a quadratic interpolant with node spacing h/2 = 0.025 m is off by about (h/2)^2 max|C'''| / 3
    ///   = 6e-5 (|C'''| <= 0.28 for erfc(d/2)), the FE error adds a similar amount: 1e-3 leaves a
    ///   margin of about 8 (an estimate, not a measurement); the depth flux at the points sampled is
    ///   0.01-0.55, so a component read from the wrong axis fails.
    /// - content 3e-5 relative: the solver closes its mass balance to round-off, so the content
    ///   equals the amount that entered, measured 8e-6 off the exact amount on this mesh (checked at
    ///   3e-5 in the verification test); the post-processor's quadrature is exact for the Q2
    ///   function, float32 values and coordinates add about 1e-7.
    constexpr double value_tolerance = 5e-5, flux_tolerance = 1e-3, content_tolerance = 3e-5;

    struct Column
    {
      std::string name;
      std::string shape;          ///< [case] lines after the title, then [geometry] lines
      unsigned int dimension = 1; ///< as summary.json gives it
      std::string coordinates;    ///< as summary.json gives it
      double top_area = 0;        ///< area of the top face (per unit length in 2-D Cartesian)
      std::vector<Point> points;  ///< inside the body; depth on the last axis
      std::vector<Point> outside; ///< outside the body, but inside if two axes were swapped
      Point line_from, line_to;   ///< a slanted line through the body
      std::string numerics = "";  ///< a [numerics] section, if any
    };

    std::string column_case(const Column &column)
    {
      return "[case]\ntitle = post-processing erfc column " + column.name + "\n" + column.shape +
             "layers = medium 6 m\ncell_size = 0.05 m\n[region.medium]\ndiffusivity = 1 m2/s\n"
             "[boundary.top]\ntype = concentration\nvalue = 1 mol/m3\n[time]\nend = 1 s\ntolerance = 1e-6\n" +
             column.numerics;
    }

    void check_column(const Column &column)
    {
      const CaseDescription description = testing::describe(column_case(column), "post_multidim_" + column.name);
      const RunRecord record = testing::run(description);
      ASSERT_EQ(record.status, "completed") << record.message;
      const std::string folder = description.output.folder;
      const RunSummary summary = read_run_summary(folder + "/summary.json");
      ASSERT_EQ(summary.dimension, column.dimension);
      ASSERT_EQ(summary.coordinates, column.coordinates);
      const FieldSeries series(folder);
      const std::size_t end = series.find(1.0);
      ASSERT_NE(end, FieldSeries::npos) << "no output at t = 1 s in " << series.pvd_path();
      const std::string &file = series.times()[end].file;
      ASSERT_EQ(file.substr(file.size() - 4), ".vtu"); // one rank: VTU, no PVTU (see the top)
      const auto grid = series.load(end);
      const unsigned int dim = column.dimension, depth_axis = dim - 1;
      const char *axis_names[3] = {"x", "y", "z"};

      // Points: concentration and flux (components named by axis, the last one along the depth).
      std::vector<Point> points = column.points;
      points.insert(points.end(), column.outside.begin(), column.outside.end());
      const Samples at = sample_fields(grid, points, {"concentration", "flux"}, dim, summary.degree, file);
      ASSERT_EQ(at.columns.size(), 1u + dim);
      EXPECT_EQ(at.columns[0], "concentration");
      for (unsigned int d = 0; d < dim; ++d)
        EXPECT_EQ(at.columns[1 + d], std::string("flux.") + axis_names[d]);
      double worst_value = 0, worst_flux = 0;
      for (std::size_t i = 0; i < column.points.size(); ++i)
        {
          const Point &p = points[i];
          const std::string where = column.name + " at (" + std::to_string(p[0]) + ", " + std::to_string(p[1]) + ", " +
                                    std::to_string(p[2]) + ")";
          ASSERT_TRUE(at.inside[i]) << where;
          const double depth = p[depth_axis];
          worst_value = std::max(worst_value, std::abs(at.values[0][i] - exact_concentration(depth)));
          EXPECT_NEAR(at.values[0][i], exact_concentration(depth), value_tolerance) << where;
          for (unsigned int d = 0; d < dim; ++d)
            {
              const double exact = d == depth_axis ? exact_flux(depth) : 0.0;
              worst_flux = std::max(worst_flux, std::abs(at.values[1 + d][i] - exact));
              EXPECT_NEAR(at.values[1 + d][i], exact, flux_tolerance) << where << ", flux." << axis_names[d];
            }
        }
      for (std::size_t i = column.points.size(); i < points.size(); ++i)
        {
          EXPECT_FALSE(at.inside[i]) << column.name << ": point " << i << " lies outside the body";
          EXPECT_TRUE(std::isnan(at.values[0][i])) << column.name << ": point " << i;
        }
      std::printf("%s: %zu points, largest error %.2e of C0 (concentration), %.2e (flux, mol/m2/s)\n",
                  column.name.c_str(), column.points.size(), worst_value, worst_flux);

      // A slanted line: every sample inside, distances along the line, values after the depth.
      const auto line = line_points(column.line_from, column.line_to, 161);
      const Samples along = sample_fields(grid, line, {"concentration"}, dim, summary.degree, file);
      ASSERT_EQ(along.columns.size(), 1u);
      double length = 0;
      for (int d = 0; d < 3; ++d)
        length += std::pow(column.line_to[d] - column.line_from[d], 2);
      EXPECT_NEAR(along.distance.back(), std::sqrt(length), 1e-12);
      double worst_line = 0;
      for (std::size_t i = 0; i < line.size(); ++i)
        {
          ASSERT_TRUE(along.inside[i]) << column.name << ": line sample " << i;
          const double exact = exact_concentration(line[i][depth_axis]);
          worst_line = std::max(worst_line, std::abs(along.values[0][i] - exact));
        }
      std::printf("%s: line of %zu samples to depth %g m, largest error %.2e of C0\n", column.name.c_str(), line.size(),
                  column.line_to[depth_axis], worst_line);
      EXPECT_LT(worst_line, value_tolerance) << column.name;

      // Content: the integral of the concentration (= amount per volume, porosity 1) over the body.
      const RegionIntegrals integrals = integrate_regions(grid, summary, {"concentration", "amount_per_volume"}, file);
      ASSERT_EQ(integrals.regions.size(), 1u);
      ASSERT_EQ(integrals.values.size(), 2u);
      const double exact_content = column.top_area * 2 / std::sqrt(pi); // Crank 1975 eq. 2.47
      const double body = column.top_area * 6;                          // top face x 6 m
      const double content = integrals.values[0][0];
      std::printf("%s: content %.8e (exact %.8e, relative %.2e), measure %.8e (exact %.8e); %s\n", column.name.c_str(),
                  content, exact_content, content / exact_content - 1, integrals.measure[0], body,
                  integrals.method.c_str());
      EXPECT_NEAR(content / exact_content, 1.0, content_tolerance) << column.name;
      EXPECT_NEAR(integrals.values[1][0] / exact_content, 1.0, content_tolerance) << column.name;
      EXPECT_NEAR(integrals.measure[0] / body, 1.0, 1e-6) << column.name; // float32 coordinates

      // And the amount the solver wrote for t = 1 s (same units: per unit length in 2-D Cartesian,
      // whole in 3-D and axisymmetric), to float32 rounding of values and coordinates.
      const CsvTable table = CsvTable::read(folder + "/series.csv");
      const auto times = table.numbers("time"), amounts = table.numbers("amount.total");
      std::size_t row = times.size();
      for (std::size_t r = 0; r < times.size(); ++r)
        if (std::abs(times[r] - 1.0) < 1e-12)
          row = r;
      ASSERT_LT(row, times.size()) << column.name << ": no series.csv row at t = 1 s";
      EXPECT_NEAR(content / amounts[row], 1.0, 1e-6) << column.name;
    }
  } // namespace

  // 2-D: x across (width 0.2 m), y the depth. 480 cells, 2169 unknowns.
  TEST(MultiDimensionalPost, ErfcColumnInTwoDimensions)
  {
    Column column;
    column.name = "2d";
    column.shape = "dimension = 2\n[geometry]\nwidth = 0.2 m\n";
    column.dimension = 2;
    column.coordinates = "cartesian";
    column.top_area = 0.2;
    column.points = {{0.03, 0.25, 0}, {0.15, 0.5, 0}, {0.1, 1, 0}, {0.19, 1.7, 0},
                     {0.05, 2.5, 0},  {0.2, 4, 0},    {0, 0.75, 0}}; // the last two on the sides
    column.outside = {{0.5, 0.15, 0}};
    column.line_from = {0.02, 0, 0};
    column.line_to = {0.18, 4, 0};
    check_column(column);
  }

  // 3-D: x across the width (0.04 m), y along the length (0.02 m), z the depth: one cell across
  // (the lateral size is that of the depth cells, 0.05 m), 120 cells, 2169 unknowns. The exact
  // field is constant across, which Q2 holds exactly, so the discrete solution is that of the
  // verification test's wider box, and so are its errors. The sparse direct solver, which the 2-D
  // case gets by default: above 1000 unknowns in 3-D fickcast picks CG with multigrid
  // (solver/numerics/diffusion_problem.cc), to a residual of 1e-12 at each of several hundred steps
  // (the verification test's 3-D box of 15183 unknowns took 75 s so); the solution is the same to
  // round-off.
  // Different lateral extents, so a swap of x and y (or of x and z) puts the outside points inside.
  TEST(MultiDimensionalPost, ErfcColumnInThreeDimensions)
  {
    Column column;
    column.name = "3d";
    column.shape = "dimension = 3\n[geometry]\nwidth = 0.04 m\nlength = 0.02 m\n";
    column.numerics = "[numerics]\nlinear_solver = direct\n";
    column.dimension = 3;
    column.coordinates = "cartesian";
    column.top_area = 0.04 * 0.02;
    column.points = {{0.01, 0.005, 0.25}, {0.03, 0.015, 0.5},  {0.02, 0.01, 1},
                     {0.04, 0.02, 1.7},   {0.005, 0.018, 2.5}, {0.035, 0.004, 4}}; // the fourth on an edge
    column.outside = {{0.01, 0.03, 1}, {1, 0.01, 0.03}};
    column.line_from = {0.005, 0.018, 0};
    column.line_to = {0.035, 0.002, 4};
    check_column(column);
  }

  // Axisymmetric: x = r (radius 0.2 m), y = z the depth; the content is the full revolution,
  // pi R^2 x 2 C0 sqrt(D t / pi), so the 2 pi r weight is checked against an exact value.
  TEST(MultiDimensionalPost, ErfcColumnAxisymmetric)
  {
    Column column;
    column.name = "axisymmetric";
    column.shape = "coordinates = axisymmetric\n[geometry]\nradius = 0.2 m\n";
    column.dimension = 2;
    column.coordinates = "axisymmetric";
    column.top_area = pi * 0.2 * 0.2;
    column.points = {{0, 0.25, 0},  {0.15, 0.5, 0}, {0.1, 1, 0},
                     {0.2, 1.7, 0}, {0.05, 2.5, 0}, {0.12, 4, 0}}; // on the axis, on the side
    column.outside = {{0.5, 0.15, 0}};
    column.line_from = {0, 0, 0};
    column.line_to = {0.2, 4, 0};
    check_column(column);
  }

  // A uniform field c0 in a sealed cylinder of radius R and height H holds c0 pi (R^2 - Ri^2) H
  // (elementary geometry; Ri = 0 for the full cylinder). Without the weight the integral would be
  // c0 (R - Ri) H (the r-z section), with r instead of 2 pi r it would be 2 pi times too small, and
  // with r measured from the inner radius too small for the hollow one: each misses by far more
  // than the tolerances.
  // Dimensions are multiples of 1/64 m and c0 = 2.5 mol/m3, all exact in float32, so at t = 0 the
  // quadrature (exact for r times a constant) leaves only double round-off: 1e-12 relative. At the
  // end the sealed body has stayed uniform up to the linear solver's tolerance, and float32
  // rounds values near 2.5 to within 1.2e-7 relative: 1e-6.
  TEST(MultiDimensionalPost, AxisymmetricUniformContentHasTheRadialWeight)
  {
    const double c0 = 2.5, radius = 0.25, height = 0.5;
    for (const double inner : {0.0, 0.0625})
      {
        const std::string name = inner > 0 ? "hollow" : "full";
        const std::string text =
          "[case]\ntitle = uniform " + name +
          " cylinder for integrals\ncoordinates = axisymmetric\n[geometry]\nlayers = body 0.5 m\nradius = 0.25 m\n" +
          (inner > 0 ? "inner_radius = 0.0625 m\n" : "") +
          "cell_size = 0.03125 m\n[region.body]\ndiffusivity = 1e-3 m2/s\n[initial]\nvalue = 2.5 mol/m3\n"
          "[time]\nend = 0.01 s\n";
        const CaseDescription description = testing::describe(text, "post_multidim_uniform_" + name);
        const RunRecord record = testing::run(description);
        ASSERT_EQ(record.status, "completed") << record.message;
        const std::string folder = description.output.folder;
        const RunSummary summary = read_run_summary(folder + "/summary.json");
        ASSERT_EQ(summary.coordinates, "axisymmetric");
        const FieldSeries series(folder);
        ASSERT_GE(series.times().size(), 2u);
        const double volume = pi * (radius * radius - inner * inner) * height;
        for (const std::size_t k : {std::size_t(0), series.times().size() - 1})
          {
            const auto grid = series.load(k);
            const RegionIntegrals integrals =
              integrate_regions(grid, summary, {"concentration"}, series.times()[k].file);
            ASSERT_EQ(integrals.regions.size(), 1u);
            const double tolerance = k == 0 ? 1e-12 : 1e-6;
            std::printf("%s cylinder at t = %g s: content %.12e (exact c0 pi (R^2 - Ri^2) H = %.12e), volume %.12e\n",
                        name.c_str(), series.times()[k].time, integrals.values[0][0], c0 * volume,
                        integrals.measure[0]);
            EXPECT_NEAR(integrals.measure[0] / volume, 1.0, 1e-12) << name;
            EXPECT_NEAR(integrals.values[0][0] / (c0 * volume), 1.0, tolerance) << name << " at output " << k;
          }
      }
  }
} // namespace fickcast::post
