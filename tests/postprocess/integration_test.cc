// Region integrals of the written fields equal the amounts the solver wrote to series.csv.
#include "case_runner.h"

#include "csv_table.h"
#include "field_series.h"
#include "region_integrator.h"
#include "run_summary.h"

#include <gtest/gtest.h>

#include <cmath>
#include <cstdio>
#include <string>

namespace fickcast::post
{
  namespace
  {
    /// Two regions with different capacities (amount = porosity x retardation x partition x u).
    /// Node coordinates are multiples of 1/256 m, exact in the VTU's float32 coordinates, so the
    /// comparison is limited only by the float32 field values (relative 6e-8 each, averaging out
    /// over the cells: with 1/64 m cells the rounding alone reached 1.2e-8 relative at one output
    /// time, hence the finer mesh for the 1e-8 check).
    std::string two_region_case(const unsigned int degree)
    {
      return R"(
[case]
title = two regions for integrals
[geometry]
layers = upper 0.5 m, lower 0.5 m
cell_size = 0.00390625 m
[region.upper]
diffusivity = 1e-2 m2/s
porosity = 0.5
retardation = 2
initial = 0 mol/m3
[region.lower]
diffusivity = 4e-3 m2/s
porosity = 0.25
partition = 1.5
initial = 1.5 mol/m3
[boundary.top]
type = concentration
value = 2 mol/m3
[time]
end = 4 s
tolerance = 1e-5
[numerics]
degree = )" + std::to_string(degree) +
             R"(
[output]
times = 1 s, 2 s
)";
    }

    /// Largest relative difference between the region integrals of amount_per_volume and the
    /// series.csv amounts at every output time; also checks the region lengths.
    void expect_integrals_match_series(const std::string &folder, const double tolerance)
    {
      const RunSummary summary = read_run_summary(folder + "/summary.json");
      const FieldSeries series(folder);
      const CsvTable table = CsvTable::read(folder + "/series.csv");
      const auto times = table.numbers("time");
      ASSERT_EQ(series.times().size(), 4u);
      double worst = 0;
      std::string method;
      for (const auto &output : series.times())
        {
          std::size_t row = times.size();
          for (std::size_t r = 0; r < times.size(); ++r)
            if (std::abs(times[r] - output.time) < 1e-12)
              row = r;
          ASSERT_LT(row, times.size()) << "no series row at output time " << output.time;
          const auto grid = read_grid(output.file);
          const RegionIntegrals integrals = integrate_regions(grid, summary, {"amount_per_volume"}, output.file);
          method = integrals.method;
          ASSERT_EQ(integrals.regions.size(), 2u);
          double total = 0;
          // Relative to the amount in the domain: a region holding a tiny part of it (the upper
          // one at t = 0 holds only the ramp across the interface) cannot be matched to 1e-8 of
          // its own content by float32 values.
          const double amount = table.numbers("amount.total")[row];
          for (std::size_t region = 0; region < 2; ++region)
            {
              const double expected = table.numbers("amount." + integrals.regions[region])[row];
              const double found = integrals.values[0][region];
              total += found;
              worst = std::max(worst, std::abs(found - expected) / std::abs(amount));
              EXPECT_NEAR(found, expected, tolerance * std::abs(amount))
                << integrals.regions[region] << " at t = " << output.time;
              EXPECT_NEAR(integrals.measure[region], 0.5, 1e-12); // exact in float32 coordinates
            }
          EXPECT_NEAR(total, table.numbers("amount.total")[row], tolerance * table.numbers("amount.total")[row]);
        }
      std::printf("degree %u: region integrals against series.csv amounts, largest difference %.3e of the amount in "
                  "the domain (%s)\n",
                  summary.degree, worst, method.c_str());
    }
  } // namespace

  // Degree 1: the written sub-cells are the finite-element cells; the field is linear on each.
  TEST(Integration, RegionIntegralsEqualSeriesAmountsDegree1)
  {
    const CaseDescription description = testing::describe(two_region_case(1), "post_integrals_q1");
    ASSERT_EQ(testing::run(description).status, "completed");
    expect_integrals_match_series(description.output.folder, 1e-8);
  }

  // Degree 2: each cell is a patch of two linear sub-cells; integrated as the quadratic on the
  // patch (a trapezoid on the sub-cells would miss by O(h^2) and fail 1e-8).
  TEST(Integration, RegionIntegralsEqualSeriesAmountsDegree2)
  {
    const CaseDescription description = testing::describe(two_region_case(2), "post_integrals_q2");
    ASSERT_EQ(testing::run(description).status, "completed");
    expect_integrals_match_series(description.output.folder, 1e-8);
  }

  // Radial weight: a full sphere of radius 1 m, uniform concentration 1 mol/m3, sealed: its
  // content is the volume 4/3 pi R^3 (elementary geometry) and series.csv says the same.
  TEST(Integration, SphereContentIsItsVolumeTimesConcentration)
  {
    const std::string text = R"(
[case]
title = sphere volume
dimension = 1
coordinates = sphere
[geometry]
layers = ball 1 m
cell_size = 0.0625 m
[region.ball]
diffusivity = 1 m2/s
initial = 1 mol/m3
[boundary.outer]
type = sealed
[time]
end = 0.01 s
)";
    const CaseDescription description = testing::describe(text, "post_integrals_sphere");
    ASSERT_EQ(testing::run(description).status, "completed");
    const std::string folder = description.output.folder;
    const RunSummary summary = read_run_summary(folder + "/summary.json");
    ASSERT_EQ(summary.coordinates, "sphere");
    const FieldSeries series(folder);
    const auto grid = series.load(series.times().size() - 1);
    const RegionIntegrals integrals =
      integrate_regions(grid, summary, {"amount_per_volume"}, series.times().back().file);
    const double volume = 4.0 / 3.0 * M_PI;
    EXPECT_NEAR(integrals.measure[0], volume, 1e-12 * volume);
    EXPECT_NEAR(integrals.values[0][0], volume, 1e-6 * volume); // float32 values of 1 +- round-off
    const CsvTable table = CsvTable::read(folder + "/series.csv");
    EXPECT_NEAR(integrals.values[0][0], table.numbers("amount.ball").back(), 1e-6 * volume);
  }
} // namespace fickcast::post
