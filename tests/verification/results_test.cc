// The numbers engineers sign off on: released fraction and its half-time, breakthrough time,
// junction depth, flux and uptake through a held face. Each against a published solution.
#include "case_runner.h"
#include "csv_table.h"

#include <boost/math/constants/constants.hpp>
#include <boost/math/special_functions/erf.hpp>
#include <boost/math/tools/roots.hpp>

#include <gtest/gtest.h>

#include <cmath>
#include <cstdio>

namespace fickcast::testing
{
  namespace
  {
    constexpr double pi = boost::math::constants::pi<double>();

    double row_value(const CsvTable &series, const std::string &name, const double t)
    {
      const auto &time = series.column("time");
      const std::size_t row =
        std::find_if(time.begin(), time.end(), [&](double s) { return std::abs(s - t) <= 1e-9 * t; }) - time.begin();
      EXPECT_LT(row, time.size()) << "no row at t = " << t;
      return row < time.size() ? series.column(name)[row] : std::nan("");
    }
  } // namespace

  // Plane sheet of thickness l = 2 L, both faces held at zero (here the half 0 < x < L = 1 m with
  // the centre plane sealed), D = 1 m2/s: Mt/Minf = 1 - sum 8/((2n+1)^2 pi^2) exp(-(2n+1)^2 pi^2 D t / (4 L^2))
  // (Crank 1975 eq. 4.18, p. 48). The half-time from the release event: D t / l^2 = 0.0491826848809
  // (the exact root; Crank's one-term value 0.049).
  TEST(Results, SheetReleasedFractionAndHalfTime)
  {
    const std::vector<double> times{0.005, 0.01, 0.02, 0.05, 0.1, 0.2, 0.3, 0.5, 0.8, 1.2};
    std::string list;
    for (const double t : times)
      list += (list.empty() ? "" : ", ") + std::to_string(t) + " s";
    const std::string text =
      "[case]\ntitle = sheet\n[geometry]\nlayers = sheet 1 m\ncell_size = 0.01 m\n[region.sheet]\n"
      "diffusivity = 1 m2/s\n[initial]\nvalue = 2 mol/m3\n[boundary.top]\ntype = concentration\n"
      "value = 0 mol/m3\n[time]\nend = 1.2 s\ntolerance = 1e-6\n[output]\nfields = false\n"
      "times = " +
      list + "\nrelease.half = 50 %\nrelease.most = 90 %\n";
    const CaseDescription description = describe(text, "sheet_release");
    const RunRecord record = run(description);
    ASSERT_EQ(record.status, "completed");
    const CsvTable series = read_csv(description.output.folder + "/series.csv");
    for (const double t : times)
      {
        double sum = 0;
        for (int n = 0; n < 4000; ++n)
          sum +=
            8 / ((2 * n + 1.0) * (2 * n + 1.0) * pi * pi) * std::exp(-(2 * n + 1.0) * (2 * n + 1.0) * pi * pi * t / 4);
        const double computed = row_value(series, "released_fraction", t);
        std::printf("sheet, D t / L^2 = %g: released %.6f, Crank %.6f\n", t, computed, 1 - sum);
        EXPECT_NEAR(computed, 1 - sum, 6e-5); // measured 1.5e-5
      }
    ASSERT_EQ(record.releases.size(), 2u);
    const double half = record.releases[0].time / 4; // D t / l^2 with l = 2 m
    std::printf("sheet half-time: D t / l^2 = %.8f (exact 0.0491826848809)\n", half);
    EXPECT_NEAR(half / 0.0491826848809, 1.0, 2e-5); // measured 4.6e-6
    // 90 %: D t / L^2 = 0.848085408046 (computed; tests/verification/REFERENCES.md, "Results").
    std::printf("sheet 90 %% time: D t / L^2 = %.8f (exact 0.848085408046)\n", record.releases[1].time);
    EXPECT_NEAR(record.releases[1].time / 0.848085408046, 1.0, 3e-4); // measured 6.1e-5
  }

  // Uptake by the same sheet from a constant surface concentration (Crank 1975 eq. 4.18, p. 48:
  // Mt/Minf = 1 - sum 8/((2n+1)^2 pi^2) exp(-(2n+1)^2 pi^2 D t / (4 L^2)), the same series as the
  // release above), here from a non-zero start c0 = 2 to c1 = 10 mol/m3 in a porous sheet with
  // porosity 0.4 and retardation 3, so that the fraction must be (M - M0) / (M_eq - M0) with the
  // capacity theta R (Freeze and Cherry 1979, Groundwater, eq. 9.8: R = 1 + rho_b Kd / theta):
  // D / R = 1 m2/s. The case is an uptake (case/content_fraction.h): the series column and results
  // say "uptake", and the half-time is D t / l^2 = 0.0491826848809 with l = 2 L, as for release.
  TEST(Results, SheetUptakeFractionAndHalfTime)
  {
    const std::vector<double> times{0.005, 0.02, 0.1, 0.3, 0.8};
    std::string list;
    for (const double t : times)
      list += (list.empty() ? "" : ", ") + std::to_string(t) + " s";
    const std::string text =
      "[case]\ntitle = uptake\n[geometry]\nlayers = sheet 1 m\ncell_size = 0.01 m\n[region.sheet]\n"
      "diffusivity = 3 m2/s\nporosity = 0.4\nretardation = 3\n[initial]\nvalue = 2 mol/m3\n"
      "[boundary.top]\ntype = concentration\nvalue = 10 mol/m3\n[time]\nend = 1 s\ntolerance = 1e-6\n"
      "[output]\nfields = false\ntimes = " +
      list + "\nuptake.half = 50 %\n";
    const CaseDescription description = describe(text, "sheet_uptake");
    ASSERT_TRUE(description.output.uptake);
    EXPECT_DOUBLE_EQ(description.output.equilibrium, 10.0);
    const RunRecord record = run(description);
    ASSERT_EQ(record.status, "completed");
    EXPECT_TRUE(record.uptake);
    // M_eq - M0 = theta R (c1 - c0) L = 0.4 x 3 x 8 x 1 mol/m2.
    EXPECT_NEAR(record.released_reference, 9.6, 1e-9);
    const CsvTable series = read_csv(description.output.folder + "/series.csv");
    EXPECT_EQ(series.columns.count("released_fraction"), 0u);
    const auto crank = [](const double t) {
      double sum = 0;
      for (int n = 0; n < 4000; ++n)
        sum +=
          8 / ((2 * n + 1.0) * (2 * n + 1.0) * pi * pi) * std::exp(-(2 * n + 1.0) * (2 * n + 1.0) * pi * pi * t / 4);
      return 1 - sum;
    };
    for (const double t : times)
      {
        const double computed = row_value(series, "uptake_fraction", t);
        std::printf("sheet uptake, D t / R L^2 = %g: taken up %.6f, Crank %.6f\n", t, computed, crank(t));
        EXPECT_NEAR(computed, crank(t), 6e-5);
      }
    ASSERT_EQ(record.releases.size(), 1u);
    const double half = record.releases[0].time / 4;
    std::printf("sheet uptake half-time: D t / R l^2 = %.8f (exact 0.0491826848809)\n", half);
    EXPECT_NEAR(half / 0.0491826848809, 1.0, 2e-5);
    EXPECT_NEAR(record.released_final, crank(1.0), 6e-5);
  }

  // Breakthrough through a slab of thickness L on an impermeable base, surface held at c0: the
  // base concentration is that of the centre of a sheet of thickness 2 L taking up solute,
  // c(L, t)/c0 = 1 - (4/pi) sum (-1)^n/(2n+1) exp(-(2n+1)^2 pi^2 D t / (4 L^2)) (Crank 1975 eq. 4.17,
  // number from memory). The time it reaches 5 % of c0 is found with Boost.Math's TOMS 748.
  TEST(Results, BreakthroughTimeThroughASlab)
  {
    const std::string text = R"(
[case]
title = breakthrough
[geometry]
layers = clay 0.5 m
cell_size = 5 mm
[region.clay]
diffusivity = 2e-9 m2/s
porosity = 0.4
tortuosity = 0.25
[boundary.top]
type = concentration
value = 1500 mg/L
[time]
end = 20 yr
tolerance = 1e-6
[output]
fields = false
point.base = 0.5 m
threshold.base = 75 mg/L
)";
    const CaseDescription description = describe(text, "breakthrough");
    const RunRecord record = run(description);
    ASSERT_EQ(record.status, "completed");
    const double d = 2e-9 * 0.25, l = 0.5;
    auto base = [](double T) {
      double sum = 0;
      for (int n = 0; n < 2000; ++n)
        sum += (n % 2 ? -1.0 : 1.0) / (2 * n + 1) * std::exp(-(2 * n + 1.0) * (2 * n + 1.0) * pi * pi * T / 4);
      return 1 - 4 / pi * sum;
    };
    boost::uintmax_t iterations = 100;
    const auto root = boost::math::tools::toms748_solve([&](double T) { return base(T) - 0.05; }, 1e-3, 1.0,
                                                        boost::math::tools::eps_tolerance<double>(50), iterations);
    const double exact = 0.5 * (root.first + root.second) * l * l / d;
    std::printf("breakthrough: %.6e s, analytic %.6e s\n", record.points[0].threshold_time, exact);
    EXPECT_NEAR(record.points[0].threshold_time / exact, 1.0, 1.5e-4); // measured 3.5e-5
  }

  // Junction depths (Jaeger, Introduction to Microelectronic Fabrication, 2nd ed. 2002, ch. 4; also
  // Sze, VLSI Technology): an erfc profile N = Ns erfc(x / 2 sqrt(Dt)) reaches the background Nb at
  // x_j = 2 sqrt(Dt) erfcinv(Nb/Ns); a Gaussian N = Q/sqrt(pi Dt) exp(-x^2/4Dt) (sealed surface) at
  // x_j = 2 sqrt(Dt) sqrt(ln(Q / (Nb sqrt(pi Dt)))). erfcinv from Boost.Math.
  TEST(Results, JunctionDepthsOfErfcAndGaussianProfiles)
  {
    const double d = 1.5e-17, t = 3600, ns = 1e26, nb = 1e22;
    const std::string erfc_case = "[case]\ntitle = erfc junction\n[geometry]\nlayers = si 3 um\ncell_size = 5 nm\n"
                                  "[region.si]\ndiffusivity = 1.5e-17 m2/s\n[boundary.top]\ntype = concentration\n"
                                  "value = 1e20 1/cm3\n[time]\nend = 1 h\ntolerance = 1e-6\n[output]\nfields = false\n"
                                  "depth.junction = 1e16 1/cm3\n";
    const RunRecord a = run(describe(erfc_case, "junction_erfc"));
    ASSERT_EQ(a.status, "completed");
    const double erfc_depth = 2 * std::sqrt(d * t) * boost::math::erfc_inv(nb / ns);
    std::printf("erfc junction: %.6e m, textbook %.6e m\n", a.depths[0].depths.back(), erfc_depth);
    EXPECT_NEAR(a.depths[0].depths.back() / erfc_depth, 1.0, 1e-3); // measured 2.5e-4

    // Gaussian: start from the exact profile at Dt0 = d * 600 s (dose Q) and diffuse for 1 h more.
    const double q = 1e19, dt0 = d * 600, dt = d * (600 + 3600);
    char initial[256];
    std::snprintf(initial, sizeof(initial), "{%.17g/sqrt(pi*%.17g)*exp(-x^2/(4*%.17g))} 1/m3", q, dt0, dt0);
    const std::string gaussian_case = std::string("[case]\ntitle = gaussian junction\n[geometry]\nlayers = si 3 um\n"
                                                  "cell_size = 5 nm\n[region.si]\ndiffusivity = 1.5e-17 m2/s\n"
                                                  "[initial]\nvalue = ") +
                                      initial +
                                      "\n[time]\nend = 1 h\ntolerance = 1e-6\n[output]\nfields = false\n"
                                      "depth.junction = 1e16 1/cm3\n";
    const RunRecord b = run(describe(gaussian_case, "junction_gaussian"));
    ASSERT_EQ(b.status, "completed");
    const double gaussian_depth = 2 * std::sqrt(dt) * std::sqrt(std::log(q / (nb * std::sqrt(pi * dt))));
    std::printf("Gaussian junction: %.6e m, textbook %.6e m\n", b.depths[0].depths.back(), gaussian_depth);
    EXPECT_NEAR(b.depths[0].depths.back() / gaussian_depth, 1.0, 3e-4); // measured 6e-5
  }

  // Flux into a semi-infinite medium through a face held at c0: F = D c0 / sqrt(pi D t), and the
  // amount taken up M = 2 c0 sqrt(D t / pi) (Crank 1975 sec. 2.3, eqs 2.45-2.47, numbers from memory).
  // The flux is the reaction of the discrete equations at the face (not a differentiated field).
  TEST(Results, FluxAndUptakeThroughAHeldFace)
  {
    const std::string text = R"(
[case]
title = flux into a semi-infinite medium
[geometry]
layers = medium 1 m
cell_size = 2 mm
grade_toward = top
grading = 1.02
[region.medium]
diffusivity = 1e-9 m2/s
[boundary.top]
type = concentration
value = 3 mol/m3
[time]
end = 3 d
tolerance = 1e-7
[output]
fields = false
times = 2 h, 1 d
)";
    const CaseDescription description = describe(text, "surface_flux");
    ASSERT_EQ(run(description).status, "completed");
    const CsvTable series = read_csv(description.output.folder + "/series.csv");
    const double d = 1e-9, c0 = 3;
    for (const double t : {7200.0, 86400.0, 259200.0})
      {
        const double flux = row_value(series, "flux_in.top", t), amount = row_value(series, "amount_in.top", t);
        const double exact_flux = d * c0 / std::sqrt(pi * d * t), exact_amount = 2 * c0 * std::sqrt(d * t / pi);
        std::printf("held face, t = %g s: flux %.6e (exact %.6e), uptake %.6e (exact %.6e)\n", t, flux, exact_flux,
                    amount, exact_amount);
        EXPECT_NEAR(flux / exact_flux, 1.0, 8e-4);     // measured 1.8e-4 (at 2 h)
        EXPECT_NEAR(amount / exact_amount, 1.0, 3e-4); // measured 5.6e-5
      }
  }
} // namespace fickcast::testing
