// Sampling the written fields along the depth reproduces the erfc profile of a semi-infinite
// medium with its surface concentration held, to the tolerance the solver's own points meet.
#include "case_runner.h"

#include "csv_table.h"
#include "field_sampler.h"
#include "field_series.h"
#include "run_summary.h"

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
} // namespace fickcast::post
