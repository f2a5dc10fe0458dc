// Radial and axisymmetric geometry: release from a sphere, an infinite cylinder and a finite
// cylinder (tablet) into a perfect sink, and steady release from a coated sphere.
#include "case_runner.h"
#include "csv_table.h"

#include <boost/math/constants/constants.hpp>
#include <boost/math/special_functions/bessel.hpp>

#include <gtest/gtest.h>

#include <cmath>
#include <cstdio>

namespace fickcast::testing
{
  namespace
  {
    constexpr double pi = boost::math::constants::pi<double>();

    /// Sphere of radius a, surface held at zero, uniform start: Mt/Minf = 1 - (6/pi^2) sum exp(-n^2 pi^2 T)/n^2,
    /// T = D t / a^2 (Crank 1975 eq. 6.20, p. 91).
    double sphere_fraction(const double T)
    {
      double sum = 0;
      for (int n = 1; n <= 2000; ++n)
        sum += std::exp(-n * n * pi * pi * T) / (n * n);
      return 1 - 6 / (pi * pi) * sum;
    }

    /// Infinite cylinder: Mt/Minf = 1 - sum 4 exp(-alpha_n^2 T) / alpha_n^2, J0(alpha_n) = 0
    /// (Crank 1975 eq. 5.52, sec. 5.3.2; equation number from memory). Zeros from Boost.Math.
    double cylinder_fraction(const double T)
    {
      double sum = 0;
      for (int n = 1; n <= 400; ++n)
        {
          const double alpha = boost::math::cyl_bessel_j_zero(0.0, n);
          sum += 4 * std::exp(-alpha * alpha * T) / (alpha * alpha);
        }
      return 1 - sum;
    }

    /// Plane sheet of half-thickness H, both faces at zero: Crank 1975 eq. 4.18 (p. 48).
    double slab_fraction(const double T)
    {
      double sum = 0;
      for (int n = 0; n <= 2000; ++n)
        {
          const double m = 2 * n + 1;
          sum += 8 / (m * m * pi * pi) * std::exp(-m * m * pi * pi * T / 4);
        }
      return 1 - sum;
    }

    /// Released fractions 1 - amount(t)/amount(0) at the listed times, from series.csv.
    std::vector<double> released(const CaseDescription &description, const std::vector<double> &times)
    {
      const CsvTable series = read_csv(description.output.folder + "/series.csv");
      const auto &time = series.column("time");
      const auto &amount = series.column("amount.total");
      std::vector<double> fractions;
      for (const double t : times)
        {
          const std::size_t row =
            std::find_if(time.begin(), time.end(), [&](double s) { return std::abs(s - t) < 1e-9 * t; }) - time.begin();
          EXPECT_LT(row, time.size()) << "no row at t = " << t;
          fractions.push_back(row < time.size() ? 1 - amount[row] / amount.front() : -1);
        }
      return fractions;
    }

    std::string times_list(const std::vector<double> &times)
    {
      std::string list;
      for (const double t : times)
        list += (list.empty() ? "" : ", ") + std::to_string(t) + " s";
      return list;
    }
  } // namespace

  TEST(Radial, SphereAndCylinderReleaseMatchCrank)
  {
    const std::vector<double> times{0.01, 0.02, 0.05, 0.1, 0.2};
    for (const std::string shape : {"sphere", "cylinder"})
      {
        const std::string text = "[case]\ntitle = radial release\ncoordinates = " + shape +
                                 "\n[geometry]\nlayers = body 1 m\ncell_size = 0.01 m\n[region.body]\ndiffusivity = "
                                 "1 m2/s\n[initial]\nvalue = 1 mol/m3\n[boundary.outer]\ntype = concentration\n"
                                 "value = 0 mol/m3\n[time]\nend = 0.2 s\ntolerance = 1e-6\n[output]\nfields = false\n"
                                 "times = " +
                                 times_list(times) + "\n";
        const CaseDescription description = describe(text, "radial_" + shape);
        const RunRecord record = run(description);
        ASSERT_EQ(record.status, "completed");
        const auto fractions = released(description, times);
        for (std::size_t k = 0; k < times.size(); ++k)
          {
            const double expected = shape == "sphere" ? sphere_fraction(times[k]) : cylinder_fraction(times[k]);
            std::printf("%s, T = %g: released %.6f, Crank %.6f\n", shape.c_str(), times[k], fractions[k], expected);
            EXPECT_NEAR(fractions[k], expected, 5e-5) << shape << " at T = " << times[k];
          }
      }
    // The series as coded against values computed in 30 digits (tests/verification/REFERENCES.md,
    // "Radial and axisymmetric").
    EXPECT_NEAR(sphere_fraction(0.05), 0.606939756679, 1e-9);
    EXPECT_NEAR(cylinder_fraction(0.05), 0.452120997997, 1e-9);
  }

  // A tablet (finite cylinder) of radius a and height 2H releasing through all faces: by the
  // product rule, 1 - F = (1 - F_cylinder(D t / a^2)) (1 - F_slab(D t / H^2)) (Carslaw & Jaeger 1959
  // ch. I; Crank 1975 ch. 5). Axisymmetric run, a = H = 1 m, D = 1 m2/s.
  TEST(Axisymmetric, TabletMatchesTheProductOfSlabAndCylinder)
  {
    const std::vector<double> times{0.01, 0.05, 0.1, 0.2};
    const std::string text = "[case]\ntitle = tablet\ncoordinates = axisymmetric\n[geometry]\nlayers = tablet 2 m\n"
                             "radius = 1 m\ncell_size = 0.025 m\n[region.tablet]\ndiffusivity = 1 m2/s\n[initial]\n"
                             "value = 1 mol/m3\n[boundary.top]\ntype = concentration\nvalue = 0 mol/m3\n"
                             "[boundary.bottom]\ntype = concentration\nvalue = 0 mol/m3\n[boundary.side]\n"
                             "type = concentration\nvalue = 0 mol/m3\n[time]\nend = 0.2 s\ntolerance = 1e-5\n"
                             "[output]\nfields = false\ntimes = " +
                             times_list(times) + "\n";
    const CaseDescription description = describe(text, "tablet_axisymmetric");
    const RunRecord record = run(description);
    ASSERT_EQ(record.status, "completed");
    // The whole amount: pi a^2 2H c0 (full revolution).
    EXPECT_NEAR(record.initial_region_amounts[0], 2 * pi, 1e-6);
    const auto fractions = released(description, times);
    for (std::size_t k = 0; k < times.size(); ++k)
      {
        const double expected = 1 - (1 - cylinder_fraction(times[k])) * (1 - slab_fraction(times[k]));
        std::printf("tablet, D t / a^2 = %g: released %.6f, product rule %.6f\n", times[k], fractions[k], expected);
        EXPECT_NEAR(fractions[k], expected, 1.5e-4); // measured 3.7e-5
      }
    EXPECT_NEAR(1 - (1 - cylinder_fraction(0.05)) * (1 - slab_fraction(0.05)), 0.590358130792, 1e-9);
  }

  // The same tablet as a 3-D hexahedral Gmsh mesh (meshes/tablet_3d.msh, radius 1 m, height 2 m)
  // against the axisymmetric run: the released fractions agree within 5e-3 (the 3-D mesh is
  // coarser, Q1, and its circle is a 48-sided polygon).
  TEST(Axisymmetric, ThreeDimensionalTabletMeshAgreesWithTheAxisymmetricRun)
  {
    const std::vector<double> times{0.01, 0.05, 0.1, 0.2};
    const std::string common = "[region.tablet]\ndiffusivity = 1 m2/s\n[initial]\nvalue = 1 mol/m3\n"
                               "[boundary.top]\ntype = concentration\nvalue = 0 mol/m3\n[boundary.bottom]\n"
                               "type = concentration\nvalue = 0 mol/m3\n[boundary.side]\ntype = concentration\n"
                               "value = 0 mol/m3\n[time]\nend = 0.2 s\ntolerance = 1e-4\n[output]\nfields = false\n"
                               "times = " +
                               times_list(times) + "\n";
    const std::string axisymmetric = "[case]\ntitle = tablet rz\ncoordinates = axisymmetric\n[geometry]\nlayers = "
                                     "tablet 2 m\nradius = 1 m\ncell_size = 0.05 m\n" +
                                     common;
    const std::string three_d =
      "[case]\ntitle = tablet 3d\ndimension = 3\n[geometry]\nmesh = " + source_path("meshes/tablet_3d.msh") +
      "\n[numerics]\ndegree = 1\n" + common;
    const CaseDescription a = describe(axisymmetric, "tablet_rz_for_3d");
    const CaseDescription b = describe(three_d, "tablet_3d_mesh");
    ASSERT_EQ(run(a).status, "completed");
    ASSERT_EQ(run(b).status, "completed");
    const auto fa = released(a, times), fb = released(b, times);
    for (std::size_t k = 0; k < times.size(); ++k)
      {
        std::printf("tablet at D t / a^2 = %g: axisymmetric %.6f, 3-D mesh %.6f\n", times[k], fa[k], fb[k]);
        EXPECT_NEAR(fb[k], fa[k], 5e-3); // two discretisations (the 3-D mesh coarse): measured 2.2e-3
      }
  }

  // Steady state in a coated sphere: a core of radius a with a uniform source s (per volume)
  // inside a shell a < r < b held at zero outside. The shell carries Q = s 4/3 pi a^3 with the
  // spherical-shell resistance (1/a - 1/b) / (4 pi D2), so c(a) = Q (1/a - 1/b) / (4 pi D2), and
  // in the core c(0) = c(a) + s a^2 / (6 D1) (common practice: conduction through spherical shells
  // in series; derived here from the steady radial equation).
  TEST(Radial, CoatedSphereAtSteadyStateMatchesShellResistances)
  {
    const std::string text = R"(
[case]
title = coated sphere
coordinates = sphere
[geometry]
layers = core 1 mm, coating 0.2 mm
cell_size = 10 um
[region.core]
diffusivity = 1e-9 m2/s
source = 1 mol/(m3 s)
[region.coating]
diffusivity = 1e-11 m2/s
[boundary.outer]
type = concentration
value = 0 mol/m3
[time]
end = 1e5 s
[output]
fields = false
point.centre = 0 mm
point.interface = 1 mm in core
)";
    const CaseDescription description = describe(text, "coated_sphere");
    const RunRecord record = run(description);
    ASSERT_EQ(record.status, "completed");
    const double a = 1e-3, b = 1.2e-3, d1 = 1e-9, d2 = 1e-11, s = 1.0;
    const double q = s * 4.0 / 3.0 * pi * a * a * a;
    const double interface = q * (1 / a - 1 / b) / (4 * pi * d2);
    const double centre = interface + s * a * a / (6 * d1);
    const CsvTable series = read_csv(description.output.folder + "/series.csv");
    std::printf("coated sphere: outflow %.8e (expected %.8e), c(a) %.8f (%.8f), c(0) %.8f (%.8f)\n",
                -series.column("flux_in.outer").back(), q, record.points[1].final_value, interface,
                record.points[0].final_value, centre);
    EXPECT_NEAR(-series.column("flux_in.outer").back() / q, 1.0, 1.5e-6);
    EXPECT_NEAR(record.points[1].final_value / interface, 1.0, 1.5e-6);
    EXPECT_NEAR(record.points[0].final_value / centre, 1.0, 1.5e-6);
  }
} // namespace fickcast::testing
