// Layers with partition coefficients at steady state, and membrane permeation (time lag).
#include "case_runner.h"
#include "csv_table.h"

#include <gtest/gtest.h>

#include <cmath>
#include <cstdio>

namespace fickcast::testing
{
  // Two layers in series with a partition jump (common practice: series resistances with
  // R_i = l_i / (D_i K_i), Crank 1975 ch. 4 on composite membranes; values derived and computed
  // in tests/verification/REFERENCES.md, "Partition and membrane"): l1 = 1 m, D1 = 1, K1 = 1;
  // l2 = 2 m, D2 = 0.25, K2 = 3; reference-phase 1 at x = 0, 0 at x = 3: J = 3/11, interface phase
  // concentrations 8/11 (layer 1) and 24/11 (layer 2).
  TEST(Partition, TwoLayersAtSteadyStateMatchSeriesResistances)
  {
    const std::string text = R"(
[case]
title = partition jump
[geometry]
layers = first 1 m, second 2 m
cell_size = 0.1 m
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
end = 2000 s
[output]
fields = false
point.left = 1 m in first
point.right = 1 m in second
)";
    const CaseDescription description = describe(text, "partition_jump");
    const RunRecord record = run(description);
    ASSERT_EQ(record.status, "completed");
    const CsvTable series = read_csv(description.output.folder + "/series.csv");
    const double flux = 3.0 / 11.0;
    std::printf("partition: flux %.12g (expected %.12g), interface %.12g | %.12g (expected %.12g | %.12g)\n",
                series.column("flux_in.top").back(), flux, record.points[0].final_value, record.points[1].final_value,
                8.0 / 11.0, 24.0 / 11.0);
    // Steady state, linear in each layer: exact at the nodes up to round-off (measured: equal to
    // the 12 digits printed); 1e-10 allows for the transient's remainder and the solver tolerance.
    EXPECT_NEAR(series.column("flux_in.top").back() / flux, 1.0, 1e-10);
    EXPECT_NEAR(-series.column("flux_in.bottom").back() / flux, 1.0, 1e-10);
    EXPECT_NEAR(record.points[0].final_value / (8.0 / 11.0), 1.0, 1e-10);
    EXPECT_NEAR(record.points[1].final_value / (24.0 / 11.0), 1.0, 1e-10);
  }

  // Membrane permeation, time-lag method (Crank 1975 ch. 4, eqs 4.24a-c; Daynes 1920, Barrer
  // 1939): a membrane of thickness l, initially empty, upstream face in equilibrium with a fluid
  // at p (membrane phase K p), downstream at zero. Steady flux J = D K p / l; the cumulative amount
  // through the downstream face approaches J (t - l^2 / (6 D)).
  TEST(Membrane, TimeLagAndSteadyFlux)
  {
    const double l = 100e-6, d = 1e-11, k = 2.0, p = 5.0; // m, m2/s, -, mol/m3
    const std::string text = R"(
[case]
title = permeation cell
[geometry]
layers = membrane 100 um
cell_size = 2 um
[region.membrane]
diffusivity = 1e-11 m2/s
partition = 2
[boundary.top]
type = concentration
ambient = 5 mol/m3
[boundary.bottom]
type = concentration
ambient = 0 mol/m3
[time]
end = 3000 s
tolerance = 1e-6
[output]
fields = false
)";
    const CaseDescription description = describe(text, "membrane");
    const RunRecord record = run(description);
    ASSERT_EQ(record.status, "completed");
    const CsvTable series = read_csv(description.output.folder + "/series.csv");
    const double flux = d * k * p / l;
    const double lag = l * l / (6 * d);
    const auto &time = series.column("time");
    const auto &out = series.column("amount_in.bottom"); // negative: leaving
    const auto &rate = series.column("flux_in.bottom");
    // Asymptote from the last two rows (both well past 3 lag times).
    const std::size_t n = time.size();
    const double slope = (out[n - 1] - out[n - 2]) / (time[n - 1] - time[n - 2]);
    const double measured_lag = time[n - 1] - out[n - 1] / slope;
    std::printf("membrane: steady flux %.10e (expected %.10e), lag %.8f s (expected %.8f s)\n", -rate.back(), flux,
                measured_lag, lag);
    EXPECT_NEAR(-rate.back() / flux, 1.0, 1e-9); // measured: equal to 10 digits
    EXPECT_NEAR(measured_lag / lag, 1.0, 1e-8);  // measured 2.5e-9
  }
} // namespace fickcast::testing
