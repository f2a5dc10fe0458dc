// Tables written again in the units of the case (fickcast-post table, sample --units case):
// the columns a person reads come out in the units the case was written in, with the values
// the SI files hold.
#include "case_runner.h"

#include "case_unit_table.h"
#include "csv_table.h"
#include "results_folder.h"

#include <gtest/gtest.h>

#include <cmath>
#include <cstdio>

namespace fickcast::post
{
  namespace
  {
    // A slab 10 cm deep held at 50 mg/L on its top face for a day (invented numbers), written in
    // cm, d and mg/L.
    const char *case_in_cm_days = R"(
[case]
title = Table in the case's units
[geometry]
layers = medium 10 cm
cell_size = 0.5 mm
[region.medium]
diffusivity = 1e-5 cm2/s
[boundary.top]
type = concentration
value = 50 mg/L
[time]
end = 1 d
tolerance = 1e-5
[output]
point.mid = 1 cm
)";

    std::vector<double> column(const CsvTable &table, const std::string &name, const std::string &unit)
    {
      const std::size_t index = table.require(name);
      EXPECT_EQ(table.units()[index], unit) << name;
      return table.numbers(index);
    }
  } // namespace

  // The amount taken up through the top face of a semi-infinite medium held at C0 is the integral
  // of the erfc profile (Crank, The Mathematics of Diffusion, 2nd ed., 1975, eq. 2.45) over depth:
  // M = 2 C0 sqrt(D t / pi) = 2 x 50 mg/L x sqrt(1e-9 m2/s x 86400 s / pi) = 524.4 mg/m2 after a
  // day (the 10 cm slab is 5 diffusion lengths deep: its base changes this by far less than
  // 1e-4). Unit factors (1 d = 86400 s, 1 mg/L = 1e-3 kg/m3, 1 mg/m2 = 1e-6 kg/m2): common
  // practice. The converted columns must carry these units and equal SI / factor to 1e-9; the
  // amount in mg/m2 must meet the published value to 2e-4 (it does to 4e-5 with the
  // tolerance and cells below; mg/m2 taken as g/m2 would miss by a factor 1000).
  TEST(CaseUnits, SeriesInTheUnitsTheCaseWasWrittenIn)
  {
    const CaseDescription description = testing::describe(case_in_cm_days, "post_case_units");
    ASSERT_EQ(testing::run(description).status, "completed");
    const ResultsFolder results = open_results(description.output.folder);
    const std::string text = table_in_case_units(results.series, case_units(results.summary));
    const CsvTable shown = CsvTable::parse(text, "case units");
    const CsvTable &si = results.series;

    const auto time = column(shown, "time", "d"), time_si = column(si, "time", "s");
    const auto amount = column(shown, "amount_in.top", "mg/m2"), amount_si = column(si, "amount_in.top", "kg/m2");
    const auto flux = column(shown, "flux_in.top", "mg/m2/d"), flux_si = column(si, "flux_in.top", "kg/m2/s");
    const auto point = column(shown, "point.mid", "mg/L"), point_si = column(si, "point.mid", "kg/m3");
    const auto fraction = column(shown, "uptake_fraction", "%"), fraction_si = column(si, "uptake_fraction", "");
    const std::size_t last = si.n_rows() - 1;
    for (std::size_t r = 1; r <= last; r += std::max<std::size_t>(1, last / 7))
      {
        EXPECT_NEAR(time[r], time_si[r] / 86400, 1e-9 * time[r]) << "row " << r;
        EXPECT_NEAR(amount[r], amount_si[r] * 1e6, 1e-9 * amount[r]) << "row " << r;
        EXPECT_NEAR(flux[r], flux_si[r] * 1e6 * 86400, 1e-9 * std::abs(flux[r])) << "row " << r;
        EXPECT_NEAR(point[r], point_si[r] * 1e3, 1e-9 * std::abs(point[r]) + 1e-300) << "row " << r;
        EXPECT_NEAR(fraction[r], fraction_si[r] * 100, 1e-9 * std::abs(fraction[r])) << "row " << r;
      }
    const double published = 2 * 50 * std::sqrt(1e-9 * 86400 / M_PI); // mg/m2 (mg/L x m = mg/m2 x 1e3)
    std::printf("amount taken up after 1 d: %.6g mg/m2, published %.6g mg/m2 (relative %.2e)\n", amount[last],
                published * 1e3, std::abs(amount[last] / (published * 1e3) - 1));
    EXPECT_DOUBLE_EQ(time[last], 1.0);
    EXPECT_NEAR(amount[last], published * 1e3, 2e-4 * published * 1e3);
  }

  // A study table: results converted, parameters written with units copied as written, an event
  // left empty in a completed case named `not reached` (in a failed case it stays empty), the
  // wall time in seconds.
  TEST(CaseUnits, StudyTableNamesEventsNotReached)
  {
    CaseDescription description;
    description.settings.push_back({"time.end", "30 yr", "946728000 s", "case.ini:9"});
    description.settings.push_back({"geometry.layers", "clay 90 cm", "clay 0.9 m", "case.ini:4"});
    description.units.concentration = "kg/m3";
    description.units.as_written = "mg/L";
    description.units.amount = "kg/m2";
    const DisplayUnits units(description);
    const CsvTable table = CsvTable::parse("case,layer.clay.thickness,threshold.base [s],depth.front [m],status,"
                                           "wall_time [s]\n"
                                           "case_0001,72 cm,,0.45,completed,0.5\n"
                                           "case_0002,90 cm,315576000,0.6,completed,0.5\n"
                                           "case_0003,1 m,,,failed,0.1\n",
                                           "sweep.csv");
    const CsvTable shown = CsvTable::parse(table_in_case_units(table, units, true), "shown");
    EXPECT_EQ(shown.units()[shown.require("threshold.base")], "yr");
    EXPECT_EQ(shown.units()[shown.require("depth.front")], "cm");
    EXPECT_EQ(shown.units()[shown.require("wall_time")], "s");
    const std::size_t threshold = shown.require("threshold.base");
    EXPECT_EQ(shown.rows()[0][threshold], "not reached");
    EXPECT_EQ(shown.rows()[1][threshold], "10");
    EXPECT_EQ(shown.rows()[2][threshold], "");
    EXPECT_EQ(shown.rows()[0][shown.require("depth.front")], "45");
    EXPECT_EQ(shown.rows()[0][shown.require("layer.clay.thickness")], "72 cm");
    EXPECT_EQ(shown.rows()[0][shown.require("wall_time")], "0.5");
  }
} // namespace fickcast::post
