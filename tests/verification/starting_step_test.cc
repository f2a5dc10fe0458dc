// Source: Crank, The Mathematics of Diffusion, 2nd ed. 1975, eq. 2.6 (plane source in an infinite
// medium) and eq. 2.45 (erfc; Boost.Math erfc); the starting-step rule is that of Hairer, Norsett
// and Wanner, Solving Ordinary Differential Equations I, 2nd ed., section II.4 (from memory).
// The first step of an adaptive run: a smooth initial field starts with a step near its own time
// scale instead of a hundred-millionth of the run, at no cost in accuracy; a sudden surface value
// keeps the cautious start.
#include "case_runner.h"
#include "csv_table.h"

#include <boost/math/special_functions/erf.hpp>

#include <gtest/gtest.h>

#include <cmath>
#include <cstdio>
#include <string>
#include <vector>

namespace fickcast::testing
{
  namespace
  {
    /// The first step of a run: the dt of the row after t = 0 in its folder's series.csv.
    double first_step(const std::string &folder)
    {
      const CsvTable series = read_csv(folder + "/series.csv");
      EXPECT_GE(series.rows(), 2u);
      return series.column("dt").at(1);
    }

    const double depths[] = {0.0, 0.5, 1.0, 2.0, 3.0};

    struct Outcome
    {
      double error = 0; ///< largest |C - C_exact| over the points at the end, relative to the peak
      double first = 0; ///< first step (s)
      unsigned int steps = 0;
    };

    /// A plane source released at t = -1 s (D = 1 m2/s): the field at t = 0 is Crank's eq. 2.6 at
    /// 1 s, a Gaussian of standard deviation 1.4 m in a 40 m medium (sealed; its ends see 1e-40 of
    /// the peak); run for 4 s. @p initial_step: "" for the starting-step rule.
    Outcome plane_source(const std::string &initial_step, const std::string &name)
    {
      std::string points;
      for (std::size_t k = 0; k < std::size(depths); ++k)
        points += "point.p" + std::to_string(k) + " = " + std::to_string(20 + depths[k]) + " m\n";
      const std::string text =
        "[case]\ntitle = plane source\n[geometry]\nlayers = medium 40 m\ncell_size = 0.01 m\n"
        "[region.medium]\ndiffusivity = 1 m2/s\n[initial]\nvalue = {(4*pi)^(-0.5)*exp(-(x-20)^2/4)}\n"
        "[time]\nend = 4 s\ntolerance = 1e-4\n" +
        (initial_step.empty() ? std::string() : "initial_step = " + initial_step + "\n") +
        "[output]\nfields = false\n" + points;
      const CaseDescription description = describe(text, name);
      const RunRecord record = run(description);
      EXPECT_EQ(record.status, "completed") << record.message;
      Outcome o;
      const double t = 5.0, peak = 1 / std::sqrt(4 * M_PI * t);
      for (std::size_t k = 0; k < record.points.size(); ++k)
        {
          const double exact = peak * std::exp(-depths[k] * depths[k] / (4 * t));
          o.error = std::max(o.error, std::abs(record.points[k].final_value - exact) / peak);
        }
      o.first = first_step(description.output.folder);
      o.steps = record.steps_accepted;
      return o;
    }
  } // namespace

  // Measured: the rule starts at 9.1e-4 s and takes 44 steps (error 3.7e-4 of the peak); started
  // at 4e-8 s (the cautious start, a hundred-millionth of the run, which every run used before)
  // the same run takes 59 steps (error 3.5e-4). Both errors are time errors of local control, 3.5
  // to 3.7 times the tolerance (StepControl.ErfcErrorFollowsTheTolerance measures that band).
  // Without the rule the first step is the cautious start, which the first check refuses.
  TEST(StartingStep, SmoothFieldStartsNearItsOwnTimeScale)
  {
    const Outcome rule = plane_source("", "starting_step_rule");
    const Outcome cautious = plane_source("4e-8 s", "starting_step_cautious");
    std::printf("plane source: rule starts at %.3g s, %u steps, error %.3g; cautious start %.3g s, %u steps, "
                "error %.3g\n",
                rule.first, rule.steps, rule.error, cautious.first, cautious.steps, cautious.error);
    EXPECT_GT(rule.first, 1e3 * cautious.first);
    EXPECT_LE(rule.steps + 10, cautious.steps);
    // No accuracy given up: within a tenth of the cautious run's error, and within five times the
    // tolerance of Crank's solution (local control's band, above).
    EXPECT_LE(rule.error, 1.1 * cautious.error + 1e-5);
    EXPECT_LE(rule.error, 5e-4);
  }

  // A surface held at a value the body does not have (erfc, Crank eq. 2.45): the first step's
  // flux is wrong by its own size whatever its length, so the start stays at a hundred-millionth
  // of the run (with the rule applied here the final error rose to 1.7 and 27 times the
  // tolerance at 1e-4 and 1e-5: StepControl.ErfcErrorFollowsTheTolerance).
  TEST(StartingStep, SuddenSurfaceValueKeepsTheCautiousStart)
  {
    const std::string text = "[case]\ntitle = sudden surface\n[geometry]\nlayers = medium 12 m\ncell_size = 0.01 m\n"
                             "[region.medium]\ndiffusivity = 1 m2/s\n[boundary.top]\ntype = concentration\n"
                             "value = 1 mol/m3\n[time]\nend = 1 s\ntolerance = 1e-4\n[output]\nfields = false\n"
                             "point.p = 1 m\n";
    const CaseDescription description = describe(text, "starting_step_sudden");
    const RunRecord record = run(description);
    ASSERT_EQ(record.status, "completed") << record.message;
    EXPECT_NEAR(first_step(description.output.folder), 1e-8, 1e-14);
    EXPECT_NEAR(record.points[0].final_value, boost::math::erfc(0.5), 1e-3);
  }
} // namespace fickcast::testing
