// Studies against analytic answers: sizing inverts the membrane time lag, and a Latin hypercube
// sample of a normal input reproduces the analytic mean and percentiles of a linear result.
#include "case_runner.h"

#include "case/case_reader.h"
#include "case/input_error.h"
#include "studies/sizing.h"
#include "studies/study_plan.h"
#include "studies/study_runner.h"

#include <deal.II/base/mpi.h>

#include <gtest/gtest.h>

#include <cmath>
#include <cstdio>
#include <filesystem>

namespace fickcast::testing
{
  namespace
  {
    /// The folder a sizing of the case file @p file writes.
    std::string size_folder(const std::string &file)
    {
      return file.substr(0, file.rfind('/')) + "/sizing";
    }

    SizingOutcome size_file(const std::string &file)
    {
      SizingOptions options;
      options.case_file = file;
      options.folder = size_folder(file);
      options.overwrite = true;
      return run_sizing(read_case(file), options, MPI_COMM_WORLD, {});
    }

    SizingOutcome sizing(const std::string &text, const std::string &name)
    {
      return size_file(write_case(text, name));
    }
    /// A membrane between a fixed top concentration and a sink, sized by sizing for a time lag
    /// of 400 s between @p low and @p high (cell size and run length as given).
    std::string membrane_size_case(const std::string &title, const std::string &cell, const std::string &end,
                                   const std::string &low, const std::string &high, const std::string &extra)
    {
      return "[case]\ntitle = " + title + "\n[geometry]\nlayers = membrane 100 um\ncell_size = " + cell +
             "\n[region.membrane]\ndiffusivity = 1e-11 m2/s\n[boundary.top]\ntype = concentration\nvalue = 5 "
             "mol/m3\n[boundary.bottom]\ntype = concentration\nvalue = 0 mol/m3\n[time]\nend = " +
             end +
             "\n[output]\nfields = false\ntime_lag.cell = bottom\n[size]\nparameter = layer.membrane.thickness\n"
             "from = " +
             low + "\nto = " + high + "\nresult = time_lag.cell\naim = 400 s\n" + extra;
    }
  } // namespace

  // Daynes-Barrer time lag of a membrane, t_L = l^2 / (6 D) (Crank 1975, The Mathematics of
  // Diffusion, ch. 4, eq. 4.24c). Sizing inverts it: the thickness giving t_L = 400 s with
  // D = 1e-11 m2/s is l = sqrt(6 D t_L) = 154.919 um. Required: within 0.2 %.
  TEST(Sizing, MembraneThicknessForATimeLag)
  {
    const std::string text =
      membrane_size_case("membrane sized for a time lag", "2 um", "3 h", "50 um", "300 um", "tolerance = 1e-5\n");
    const SizingOutcome outcome = sizing(text, "size_membrane");
    const double exact = std::sqrt(6 * 1e-11 * 400) * 1e6; // um
    std::printf("sizing: membrane %.9g um (exact %.9g um, error %.2e) after %zu runs; lag there %.9g s\n",
                outcome.value, exact, outcome.value / exact - 1, outcome.evaluations.size(), outcome.result);
    EXPECT_TRUE(outcome.bracketed);
    EXPECT_TRUE(outcome.converged);
    EXPECT_EQ(outcome.parameter_unit, "um");
    EXPECT_NEAR(outcome.value / exact, 1.0, 2e-3);
    EXPECT_NEAR(outcome.result / 400.0, 1.0, 1e-3);
    EXPECT_LE(outcome.evaluations.size(), 20u);
  }

  // Laminate time lag (Ash, Barrer & Palmer 1965; tests/verification/REFERENCES.md, "Studies"):
  // t_L = [(l1^2/D1)(R1/6 + R2/2) + (l2^2/D2)(R2/6 + R1/2)] / (R1 + R2), R_i = l_i / (D_i K_i).
  // With l1 = 1, D1 = 1, K1 = 1, D2 = 0.25, K2 = 3 the lag is 4.5303030303 at l2 = 2 (computed
  // value, same section). Sizing recovers l2 = 2 from that lag, across a partition jump.
  TEST(Sizing, SecondLayerThicknessForALaminateTimeLag)
  {
    const std::string text = R"(
[case]
title = laminate sized for a time lag
[geometry]
layers = first 1 m, second 1 m
cell_size = 0.02 m
[region.first]
diffusivity = 1 m2/s
[region.second]
diffusivity = 0.25 m2/s
partition = 3
[boundary.top]
type = concentration
ambient = 1 mol/m3
[boundary.bottom]
type = concentration
ambient = 0 mol/m3
[time]
end = 200 s
[output]
fields = false
time_lag.stack = bottom
[size]
parameter = layer.second.thickness
from = 1 m
to = 3 m
result = time_lag.stack
aim = 4.5303030303 s
)";
    const SizingOutcome outcome = sizing(text, "size_laminate");
    std::printf("sizing: second layer %.9g m (exact 2, error %.2e) after %zu runs\n", outcome.value,
                outcome.value / 2 - 1, outcome.evaluations.size());
    EXPECT_TRUE(outcome.converged);
    EXPECT_NEAR(outcome.value / 2.0, 1.0, 2e-3);
  }

  // A range that does not bracket the target is bad input (exit 2), and the message gives the
  // result at both ends; nothing is left behind.
  TEST(Sizing, RangeThatDoesNotBracketIsRejectedWithBothEnds)
  {
    const std::string text = membrane_size_case("unreachable lag", "5 um", "1 h", "50 um", "100 um", "");
    const std::string file = write_case(text, "size_no_bracket");
    try
      {
        size_file(file);
        FAIL() << "expected InputError";
      }
    catch (const InputError &error)
      {
        const std::string message = error.what();
        EXPECT_NE(message.find("50 um"), std::string::npos) << message;
        EXPECT_NE(message.find("100 um"), std::string::npos) << message;
        EXPECT_NE(message.find("size.aim"), std::string::npos) << message;
      }
    const std::string parent = file.substr(0, file.rfind('/'));
    EXPECT_FALSE(std::filesystem::exists(size_folder(file)));
    for (const auto &entry : std::filesystem::directory_iterator(parent))
      EXPECT_EQ(entry.path().filename().string().find("partial"), std::string::npos) << entry.path();
  }

  // Latin hypercube, one normal input: the inward flux q ~ normal(mu, sigma) into a sealed slab,
  // so the amount taken up by t is A = q t exactly (conservation), normal(mu t, sigma t). The
  // analytic mean and median are mu t; P5/P95 are mu t -/+ 1.6448536270 sigma t (normal
  // quantile, Abramowitz & Stegun 1964, table 26.5); P(A > (mu + sigma) t) = 1 - Phi(1) =
  // 0.1586552539 (table 26.1). Tolerances from the sampling itself: a Latin hypercube of one
  // input puts exactly one sample in each stratum of probability 1/N (McKay, Beckman & Conover
  // 1979, Technometrics 21), so the sample's distribution function is within 1/N of the true one;
  // a p-quantile then lies within about 1 / (N f(x_p)) of its true value (f the normal density:
  // 2.5066 sigma / N at the median, 9.70 sigma / N at P5 and P95) and a probability within 1/N.
  // The tolerances are twice these bounds. The sample standard deviation is held to the large-
  // sample standard error of a normal sample's deviation, sigma / sqrt(2 (N - 1)) (common
  // practice; Kendall's Advanced Theory of Statistics, from memory), which LHS only lowers.
  TEST(Uncertainty, LatinHypercubeOfALinearResultMatchesTheNormalDistribution)
  {
    const double mu = 1e-6, sigma = 2e-7, t = 1000; // mol/(m2 s), mol/(m2 s), s
    const unsigned int n = 200;
    const std::string text = R"(
[case]
title = uptake under an uncertain flux
[geometry]
layers = slab 1 cm
cell_size = 1 mm
[region.slab]
diffusivity = 1e-9 m2/s
[boundary.top]
type = flux
value = 1e-6 mol/(m2 s)
[time]
end = 1000 s
[output]
fields = false
[sweep]
sample.boundary.top.value = normal(1 umol/(m2 s), 0.2 umol/(m2 s))
samples = 200
seed = 11
exceed.amount.final_total = 1.2 mmol/m2
)";
    const std::string file = write_case(text, "lhs_normal");
    const CaseDescription base = read_case(file);
    StudyOptions options;
    options.case_file = file;
    options.folder = file.substr(0, file.rfind('/')) + "/study";
    const auto cases = plan_study(base);
    ASSERT_EQ(cases.size(), n);
    const StudyTotals totals = run_study(base, cases, options, MPI_COMM_WORLD, {});
    if (dealii::Utilities::MPI::this_mpi_process(MPI_COMM_WORLD) != 0)
      return;
    EXPECT_EQ(totals.table.statuses.at("completed"), n);
    ASSERT_EQ(totals.table.statistics.size(), 1u);
    const ResultStatistics &s = totals.table.statistics[0];
    EXPECT_EQ(s.name, "amount.final_total");
    const double m = mu * t, sd = sigma * t, root_n = std::sqrt(double(n));
    std::printf("LHS normal: mean %.6g (exact %.6g, SE %.2g), P50 %.6g (SE %.2g), P5 %.6g (exact %.6g), P95 %.6g "
                "(exact %.6g), sd %.6g (exact %.6g), P(above) %.4f (exact 0.1587)\n",
                s.mean, m, s.standard_deviation / root_n, s.p50, 1.2533 * s.standard_deviation / root_n, s.p5,
                m - 1.6448536270 * sd, s.p95, m + 1.6448536270 * sd, s.standard_deviation, sd,
                s.limits.at(0).probability);
    EXPECT_NEAR(s.mean, m, 2 * 2.5066 * sd / n);
    EXPECT_NEAR(s.standard_deviation, sd, sd / std::sqrt(2.0 * (n - 1)));
    // Bookkeeping, not accuracy: the standard error printed is the deviation over sqrt(N).
    EXPECT_NEAR(s.standard_error_of_mean, s.standard_deviation / root_n, 1e-15);
    EXPECT_NEAR(s.p50, m, 2 * 2.5066 * sd / n);
    EXPECT_NEAR(s.p5, m - 1.6448536270 * sd, 2 * 9.70 * sd / n);
    EXPECT_NEAR(s.p95, m + 1.6448536270 * sd, 2 * 9.70 * sd / n);
    const double p = 0.1586552539;
    EXPECT_NEAR(s.limits.at(0).probability, p, 2.0 / n);
    EXPECT_NEAR(s.limits.at(0).level, 1.2e-3, 1e-15);
  }
} // namespace fickcast::testing
