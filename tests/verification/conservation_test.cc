// Conservation: a sealed domain with sources holds exactly what it started with plus what the
// sources added, and the mass-balance column stays at round-off.
#include "case_runner.h"
#include "csv_table.h"

#include <gtest/gtest.h>

#include <cmath>
#include <fstream>

namespace fickcast::testing
{
  // Exact by construction of the model (common practice): with sealed faces,
  // amount(t) = sum_r theta_r R_r c0 l_r + sum_r s_r l_r t, per unit area.
  TEST(Conservation, SealedDomainWithSourcesKeepsEveryGram)
  {
    const std::string text = R"(
[case]
title = sealed sources
[geometry]
layers = clay 0.3 m, sand 0.7 m
cell_size = 1 cm
[region.clay]
diffusivity = 2e-9 m2/s
porosity = 0.4
retardation = 2.5
source = 2e-3 mol/(m3 h)
[region.sand]
diffusivity = 1e-9 m2/s
porosity = 0.3
source = 5e-3 mol/(m3 h)
[initial]
value = 1 mol/m3
[time]
end = 200 d
[output]
fields = false
)";
    const CaseDescription description = describe(text, "conservation");
    const RunRecord record = run(description);
    ASSERT_EQ(record.status, "completed");
    const CsvTable series = read_csv(description.output.folder + "/series.csv");
    const double initial = 0.4 * 2.5 * 1.0 * 0.3 + 0.3 * 1.0 * 0.7;
    const double rate = (2e-3 * 0.3 + 5e-3 * 0.7) / 3600.0;
    const auto &time = series.column("time");
    const auto &amount = series.column("amount.total");
    const auto &balance = series.column("balance_error");
    ASSERT_GT(time.size(), 5u);
    for (std::size_t i = 0; i < time.size(); ++i)
      {
        const double expected = initial + rate * time[i];
        EXPECT_NEAR(amount[i] / expected, 1.0, 1e-10) << "at t = " << time[i] << " s";
        EXPECT_LT(std::abs(balance[i]), 1e-12 * expected) << "at t = " << time[i] << " s";
      }
    EXPECT_NEAR(series.column("source.total").back(), rate * time.back(), 1e-10 * rate * time.back());
  }
  // A step in the initial values at a layer interface, on quadratic elements with different cell
  // sizes on the two sides. A continuous field cannot jump: fickcast ramps it across the cells at
  // the interface, with the interface value weighted by the cells' sizes so that the ramp adds
  // to one side what it takes from the other. Exact by construction (common practice for a
  // piecewise-linear ramp): the initial amount equals sum_r c_r l_r, and the field stays within
  // [0, c] (quadratic interpolation of the step would over- and undershoot by about 10 %).
  TEST(Conservation, InitialStepAtAnInterfaceIsMonotoneAndKeepsTheAmount)
  {
    const std::string text = R"(
[case]
title = initial step
[geometry]
layers = core 0.4 m, shell 0.6 m
[region.core]
diffusivity = 1e-9 m2/s
initial = 2 mol/m3
cell_size = 1 cm
[region.shell]
diffusivity = 1e-9 m2/s
initial = 0 mol/m3
cell_size = 2.5 cm
[time]
end = 1 d
[numerics]
degree = 2
[output]
fields = false
line.depth = 0 m to 1 m
samples.depth = 1001
)";
    const CaseDescription description = describe(text, "initial_step");
    const RunRecord record = run(description);
    ASSERT_EQ(record.status, "completed");
    const CsvTable series = read_csv(description.output.folder + "/series.csv");
    ASSERT_EQ(series.column("time").front(), 0.0);
    EXPECT_NEAR(series.column("amount.total").front(), 2.0 * 0.4, 1e-12);
    const CsvTable profiles = read_csv(description.output.folder + "/profiles.csv");
    const auto &time = profiles.column("time");
    const auto &c = profiles.column("concentration");
    std::size_t at_start = 0;
    for (std::size_t i = 0; i < time.size(); ++i)
      if (time[i] == 0.0)
        {
          ++at_start;
          EXPECT_GE(c[i], -1e-12) << "undershoot at sample " << i;
          EXPECT_LE(c[i], 2.0 + 1e-12) << "overshoot at sample " << i;
        }
    EXPECT_EQ(at_start, 1001u);
  }

  // A flux boundary whose value comes from a table against time (units in the CSV header): the
  // amount that entered equals the integral of the tabulated flux, here a ramp from 0 to
  // 1 mmol/(m2 s) over 10 h, then constant. Crank-Nicolson without start steps integrates a
  // piecewise-linear flux exactly when steps land on the kink (the output time at 10 h).
  TEST(Conservation, FluxFromATableEntersExactly)
  {
    const std::string table = scratch_folder("table_flux") + "/inflow.csv";
    std::ofstream(table) << "time [h], value [mmol/(m2 s)]\n0, 0\n10, 1\n";
    const std::string text =
      "[case]\ntitle = tabulated flux\n[geometry]\nlayers = slab 1 m\ncell_size = 2 cm\n"
      "[region.slab]\ndiffusivity = 1e-8 m2/s\n[boundary.top]\ntype = flux\nvalue = file:" +
      table +
      "\n[time]\nend = 20 h\nscheme = crank_nicolson\nstart_steps = 0\n[output]\nfields = false\ntimes = 10 h\n";
    const CaseDescription description = describe(text, "table_flux_run");
    const RunRecord record = run(description);
    ASSERT_EQ(record.status, "completed");
    const CsvTable series = read_csv(description.output.folder + "/series.csv");
    const auto &time = series.column("time");
    const auto &amount = series.column("amount.total");
    for (std::size_t i = 0; i < time.size(); ++i)
      {
        const double t = time[i], ramp = 36000.0;
        const double expected = t <= ramp ? 0.5 * 1e-3 * t * t / ramp : 0.5 * 1e-3 * ramp + 1e-3 * (t - ramp);
        EXPECT_NEAR(amount[i], expected, 1e-10 * 1e-3 * 72000) << "at t = " << t << " s";
      }
  }
} // namespace fickcast::testing
