// Sampling the written fields along the depth reproduces the erfc profile of a semi-infinite
// medium with its surface concentration held, to the tolerance the solver's own points meet.
#include "case_runner.h"

#include "csv_table.h"
#include "field_sampler.h"
#include "field_series.h"
#include "post_error.h"
#include "run_summary.h"
#include "timed_samples.h"

#include <boost/math/special_functions/erf.hpp>

#include <gtest/gtest.h>

#include <cmath>
#include <cstdio>

namespace fickcast::post
{
  namespace
  {
    const char *erfc_case = R"(
[case]
title = erfc check for sampling
[geometry]
layers = medium 12 m
cell_size = 0.05 m
[region.medium]
diffusivity = 1 m2/s
[boundary.top]
type = concentration
value = 1 mol/m3
[time]
end = 1 s
tolerance = 1e-6
[output]
times = 0.1 s, 0.5 s
point.one = 1 m
point.two = 2.5 m
)";
  } // namespace

  // Crank, The Mathematics of Diffusion, 2nd ed. (1975), ch. 2-3 (sec. 2.3-2.4, eq. 2.45; numbers
  // from memory): C/C0 = erfc(x / (2 sqrt(D t))) for C(0, t) = C0, C(x, 0) = 0, here D = 1 m2/s,
  // C0 = 1 mol/m3. erfc from Boost.Math. The solver's own fields and points meet 1e-3 of C0
  // (tests/verification/semi_infinite_test.cc); sampling must meet the same along 0..10 m
  // (the 12 m domain keeps the far-boundary effect near erfc(5)).
  TEST(Sampling, DepthProfileFromFieldsMatchesErfc)
  {
    const CaseDescription description = testing::describe(erfc_case, "post_sampling_erfc");
    ASSERT_EQ(testing::run(description).status, "completed");
    const std::string folder = description.output.folder;
    const RunSummary summary = read_run_summary(folder + "/summary.json");
    const FieldSeries series(folder);
    ASSERT_EQ(series.times().size(), 4u); // 0, 0.1, 0.5, 1 s
    const auto points = line_points({0, 0, 0}, {10, 0, 0}, 401);
    for (std::size_t k = 1; k < series.times().size(); ++k)
      {
        const double t = series.times()[k].time;
        const auto grid = series.load(k);
        const Samples samples =
          sample_fields(grid, points, {"concentration"}, 1, summary.degree, series.times()[k].file);
        ASSERT_EQ(samples.columns.size(), 1u);
        double worst = 0;
        for (std::size_t i = 0; i < points.size(); ++i)
          {
            ASSERT_TRUE(samples.inside[i]) << "x = " << points[i][0];
            const double exact = boost::math::erfc(points[i][0] / (2 * std::sqrt(t)));
            worst = std::max(worst, std::abs(samples.values[0][i] - exact));
          }
        std::printf("sampled erfc profile at t = %g s: largest error %.3e of C0 (401 points, 0..10 m)\n", t, worst);
        EXPECT_LT(worst, 1e-3) << "at t = " << t << " s";
      }
  }

  // Consistency with the solver: sampling at a point's position gives the value the solver
  // recorded for that point in series.csv at the same output time (VTU values are float32,
  // so agreement is to about 1e-6 of C0, not to round-off).
  TEST(Sampling, ValueAtPointEqualsSolverPoint)
  {
    const CaseDescription description = testing::describe(erfc_case, "post_sampling_point");
    ASSERT_EQ(testing::run(description).status, "completed");
    const std::string folder = description.output.folder;
    const RunSummary summary = read_run_summary(folder + "/summary.json");
    const FieldSeries series(folder);
    const CsvTable table = CsvTable::read(folder + "/series.csv");
    const auto times = table.numbers("time");
    const auto one = table.numbers("point.one"), two = table.numbers("point.two");
    std::size_t checked = 0;
    for (std::size_t k = 1; k < series.times().size(); ++k)
      for (std::size_t r = 0; r < times.size(); ++r)
        if (std::abs(times[r] - series.times()[k].time) < 1e-12)
          {
            const auto grid = series.load(k);
            const Samples s = sample_fields(grid, {{1, 0, 0}, {2.5, 0, 0}}, {"concentration"}, 1, summary.degree,
                                            series.times()[k].file);
            EXPECT_NEAR(s.values[0][0], one[r], 1e-6) << "point one at t = " << times[r];
            EXPECT_NEAR(s.values[0][1], two[r], 1e-6) << "point two at t = " << times[r];
            ++checked;
          }
    EXPECT_EQ(checked, 3u);
  }

  // Points outside the mesh are reported as outside, with no value.
  TEST(Sampling, PointsOutsideTheMeshHaveNoValue)
  {
    const CaseDescription description = testing::describe(erfc_case, "post_sampling_outside");
    ASSERT_EQ(testing::run(description).status, "completed");
    const RunSummary summary = read_run_summary(description.output.folder + "/summary.json");
    const FieldSeries series(description.output.folder);
    const auto grid = series.load(3);
    const Samples s = sample_fields(grid, {{-1, 0, 0}, {6, 0, 0}, {13, 0, 0}}, {"concentration"}, 1, summary.degree,
                                    series.times()[3].file);
    EXPECT_FALSE(s.inside[0]);
    EXPECT_TRUE(s.inside[1]);
    EXPECT_FALSE(s.inside[2]);
    EXPECT_TRUE(std::isnan(s.values[0][0]));
    EXPECT_NEAR(s.values[0][1], boost::math::erfc(6 / 2.0), 1e-3); // Crank 1975 eq. 2.45 as above
  }

  // A time between stored states: the values are the linear interpolation in time of the two
  // states around it, and the error estimate (difference to the quadratic through a third state)
  // is of the size of the true interpolation error. Exact solution as above (Crank 1975 eq.
  // 2.45). States at 0.2, 0.3 and 0.4 s, sampled at 0.27 s along 0..6 m: the linear interpolation
  // of the exact solution misses erfc there by about 4e-3 of C0 (computed below). The solver's
  // states at tolerance 1e-6 are within about 1e-5 of C0, so the sampled values must lie within
  // 1e-4 of the interpolated exact states (a weight off by 0.1 misses by 8e-3), within the
  // interpolation error plus 1e-4 of erfc, and the estimate within a factor 3 of the true
  // interpolation error.
  TEST(Sampling, TimeBetweenStatesIsInterpolatedWithAnHonestEstimate)
  {
    std::string text = erfc_case;
    text.replace(text.find("times = 0.1 s, 0.5 s"), 20, "times = 0.2 s, 0.3 s");
    text.replace(text.find("end = 1 s"), 9, "end = 0.4 s");
    const CaseDescription description = testing::describe(text, "post_sampling_between");
    ASSERT_EQ(testing::run(description).status, "completed");
    const std::string folder = description.output.folder;
    const RunSummary summary = read_run_summary(folder + "/summary.json");
    const FieldSeries series(folder);
    ASSERT_EQ(series.times().size(), 4u); // 0, 0.2, 0.3, 0.4 s
    std::vector<std::string> notes;
    const std::vector<double> times = requested_times(series, "0.27 s, 300 ms", notes);
    ASSERT_EQ(times.size(), 2u);
    EXPECT_TRUE(notes.empty());
    const auto points = line_points({0, 0, 0}, {6, 0, 0}, 201);
    TimedSampler sampler(series, points, {"concentration"}, 1, summary.degree);
    const TimedSamples between = sampler.at(times[0]);
    ASSERT_TRUE(between.interpolated);
    EXPECT_DOUBLE_EQ(between.before, 0.2);
    EXPECT_DOUBLE_EQ(between.after, 0.3);
    EXPECT_DOUBLE_EQ(between.third, 0.4);
    EXPECT_FALSE(sampler.at(times[1]).interpolated); // 300 ms is a stored state

    const auto exact = [](const double x, const double t) { return boost::math::erfc(x / (2 * std::sqrt(t))); };
    double from_linear = 0, true_interpolation_error = 0, error = 0;
    for (std::size_t i = 0; i < points.size(); ++i)
      {
        const double x = points[i][0];
        const double linear = 0.3 * exact(x, 0.2) + 0.7 * exact(x, 0.3);
        from_linear = std::max(from_linear, std::abs(between.samples.values[0][i] - linear));
        true_interpolation_error = std::max(true_interpolation_error, std::abs(linear - exact(x, 0.27)));
        error = std::max(error, std::abs(between.samples.values[0][i] - exact(x, 0.27)));
      }
    std::printf("interpolated at 0.27 s: %.3e from the interpolated exact states, %.3e from erfc; true "
                "interpolation error %.3e, estimate %.3e\n",
                from_linear, error, true_interpolation_error, between.difference);
    EXPECT_LT(from_linear, 1e-4);
    EXPECT_LT(error, true_interpolation_error + 1e-4);
    EXPECT_GT(between.difference, true_interpolation_error / 3);
    EXPECT_LT(between.difference, true_interpolation_error * 3);

    // Outside the stored states, or a bare number (read as seconds, said so).
    EXPECT_THROW(requested_times(series, "0.5 s", notes), PostInputError);
    EXPECT_EQ(requested_times(series, "0.25", notes).front(), 0.25);
    ASSERT_EQ(notes.size(), 1u);
    EXPECT_NE(notes[0].find("read as 0.25 s"), std::string::npos) << notes[0];
  }
} // namespace fickcast::post
