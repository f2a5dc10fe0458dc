// A concentration-dependent diffusivity, D = D0 exp(2 c / c0): no published solution is used
// here (Crank 1975 ch. 7 tabulates such cases, not at hand), so the checks are (i) the Boltzmann
// similarity of the semi-infinite problem (Crank 1975 ch. 7: c depends on x / sqrt(t) only, so
// the uptake grows as sqrt(t)), (ii) observed grid convergence, (iii) Newton and Picard agreeing.
#include "case_runner.h"
#include "csv_table.h"

#include <gtest/gtest.h>

#include <cmath>
#include <cstdio>

namespace fickcast::testing
{
  namespace
  {
    struct Uptake
    {
      double at_quarter, at_end;        ///< amount in at t = 0.25 s and 1 s
      std::vector<double> quarter, end; ///< points at 0.2, 0.4, 0.8, 1.6 m at those times
      unsigned long nonlinear_iterations;
    };

    Uptake run_uptake(const double cell, const std::string &solver, const unsigned int degree)
    {
      const std::string text =
        std::string("[case]\ntitle = exponential diffusivity\n[geometry]\nlayers = medium 30 m\n"
                    "cell_size = ") +
        std::to_string(cell) +
        " m\ngrade_toward = top\ngrading = 1.02\n[region.medium]\ndiffusivity = {exp(2*c)} m2/s\n"
        "[boundary.top]\ntype = concentration\nvalue = 1 mol/m3\n[time]\nend = 1 s\n"
        "tolerance = 1e-7\n[numerics]\ndegree = " +
        std::to_string(degree) + "\nnonlinear_solver = " + solver +
        "\nnonlinear_tolerance = 1e-11\n[output]\nfields = false\ntimes = 0.25 s\n"
        "point.a = 0.2 m\npoint.b = 0.4 m\npoint.c = 0.8 m\npoint.d = 1.6 m\n";
      const CaseDescription description =
        describe(text, "nonlinear_" + solver + "_" + std::to_string(static_cast<int>(1000 * cell)));
      const RunRecord record = run(description);
      EXPECT_EQ(record.status, "completed") << record.message;
      const CsvTable series = read_csv(description.output.folder + "/series.csv");
      const auto &time = series.column("time");
      const std::size_t quarter =
        std::find_if(time.begin(), time.end(), [](double t) { return std::abs(t - 0.25) < 1e-12; }) - time.begin();
      Uptake uptake;
      uptake.at_quarter = series.column("amount_in.top")[quarter];
      uptake.at_end = series.column("amount_in.top").back();
      for (const char *name : {"a", "b", "c", "d"})
        {
          uptake.quarter.push_back(series.column(std::string("point.") + name)[quarter]);
          uptake.end.push_back(series.column(std::string("point.") + name).back());
        }
      uptake.nonlinear_iterations = record.nonlinear_iterations;
      return uptake;
    }
  } // namespace

  // Source: Crank, The Mathematics of Diffusion, 2nd ed. 1975, ch. 7 (Boltzmann transformation:
  // c depends on x / sqrt(t) alone for a constant surface value and any D(c)); grid order 2 for
  // Q1 elements from Thomee 2006.
  TEST(ConcentrationDependent, BoltzmannSimilarityAndGridConvergence)
  {
    const Uptake fine = run_uptake(0.01, "newton", 2);
    // (i) M(t) / sqrt(t) constant; c(x, 1/4) = c(2x, 1).
    const double ratio = (fine.at_end / 1.0) / (fine.at_quarter / 0.5);
    std::printf("D(c): uptake / sqrt(t) at 1 s over that at 0.25 s = %.8f\n", ratio);
    EXPECT_NEAR(ratio, 1.0, 1e-7); // measured 2e-8
    for (std::size_t k = 0; k + 1 < fine.quarter.size(); ++k)
      {
        std::printf("D(c): c(x, 0.25 s) = %.10f, c(2x, 1 s) = %.10f\n", fine.quarter[k], fine.end[k + 1]);
        EXPECT_NEAR(fine.quarter[k], fine.end[k + 1], 2e-3);
      }
    // (ii) grid convergence of the uptake with Q1 elements (expected order 2, Thomee 2006).
    const Uptake h1 = run_uptake(0.08, "newton", 1), h2 = run_uptake(0.04, "newton", 1),
                 h3 = run_uptake(0.02, "newton", 1);
    const double order = std::log2(std::abs(h1.at_end - h2.at_end) / std::abs(h2.at_end - h3.at_end));
    std::printf("D(c): uptake at 1 s on h = 0.08, 0.04, 0.02 m: %.8f %.8f %.8f, observed order %.2f\n", h1.at_end,
                h2.at_end, h3.at_end, order);
    EXPECT_GE(order, 1.5);
    // (iii) Picard reaches the same answer.
    const Uptake picard = run_uptake(0.04, "picard", 1);
    std::printf("D(c): Newton %lu iterations, Picard %lu iterations\n", h2.nonlinear_iterations,
                picard.nonlinear_iterations);
    EXPECT_NEAR(picard.at_end / h2.at_end, 1.0, 1e-6);
  }
} // namespace fickcast::testing
