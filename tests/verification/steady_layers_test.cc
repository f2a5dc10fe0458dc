// Two layers at steady state: the flux equals the series-resistance value.
#include "case_runner.h"
#include "csv_table.h"

#include <gtest/gtest.h>

namespace fickcast::testing
{
  // Steady flux through layers in series: J = (C_top - C_bottom) / sum(l_i / D_i).
  // Source: Crank, The Mathematics of Diffusion, 2nd ed. 1975, ch. 4 (composite membranes);
  // the series-resistance form itself is common practice. l1 = 1 m, D1 = 1 m2/s; l2 = 2 m,
  // D2 = 0.25 m2/s: J = 1 / (1 + 8) = 1/9 mol/(m2 s). Run to t = 1000 s, about 50 decay times of
  // the slowest mode, so the transient is below round-off.
  TEST(SteadyLayers, FluxEqualsSeriesResistanceValue)
  {
    const std::string text = R"(
[case]
title = steady two layers
[geometry]
layers = first 1 m, second 2 m
cell_size = 0.1 m
[region.first]
diffusivity = 1 m2/s
[region.second]
diffusivity = 0.25 m2/s
[boundary.top]
type = concentration
value = 1 mol/m3
[boundary.bottom]
type = concentration
value = 0 mol/m3
[time]
end = 1000 s
[output]
fields = false
point.interface = 1 m
)";
    const CaseDescription description = describe(text, "steady_layers");
    const RunRecord record = run(description);
    ASSERT_EQ(record.status, "completed");
    const CsvTable series = read_csv(description.output.folder + "/series.csv");
    const double expected = 1.0 / 9.0;
    const double in_top = series.column("flux_in.top").back();
    const double in_bottom = series.column("flux_in.bottom").back();
    std::printf("steady layers: flux in %.12e, out %.12e (exact %.12e), interface %.12f (exact %.12f)\n", in_top,
                -in_bottom, expected, record.points.at(0).final_value, 8.0 / 9.0);
    // Measured 9e-13 (steady, linear in each layer: exact at the nodes up to round-off).
    EXPECT_NEAR(in_top / expected, 1.0, 5e-12);
    EXPECT_NEAR(-in_bottom / expected, 1.0, 5e-12);
    // Interface concentration: 1 - J l1 / D1 = 8/9.
    EXPECT_NEAR(record.points.at(0).final_value, 8.0 / 9.0, 5e-12);
  }
} // namespace fickcast::testing
