// The named results of a finished case, read back in the case's order (sweep.csv columns).
#include "case/case_reader.h"
#include "case/input_error.h"
#include "studies/case_summary.h"
#include "studies/result_names.h"

#include <gtest/gtest.h>

#include <cmath>
#include <filesystem>
#include <fstream>

namespace fickcast
{
  namespace
  {
    const std::string case_text = R"(
[geometry]
layers = clay 0.9 m
cell_size = 5 mm
[region.clay]
diffusivity = 1.9e-9 m2/s
[boundary.top]
type = concentration
value = 1500 mg/L
[time]
end = 60 yr
[output]
point.surface = 0 m
point.base = 0.9 m
threshold.base = 250 mg/L
depth.front = 100 mg/L
)";

    std::vector<std::string> names(const CaseSummary &summary)
    {
      std::vector<std::string> list;
      for (const auto &r : summary.results)
        list.push_back(r.name);
      return list;
    }
  } // namespace

  TEST(CaseSummary, ResultOrderFollowsTheCaseWithThresholdsAfterTheirPoints)
  {
    const CaseDescription c = read_case_text(case_text, "case.ini");
    EXPECT_EQ(result_order(c),
              (std::vector<std::string>{"amount.final_total", "point.surface.final", "point.base.final",
                                        "threshold.base", "uptake_fraction.final", "depth.front"}));
  }

  TEST(CaseSummary, ResultsComeInTheGivenOrderNotTheFileOrder)
  {
    // Keys in alphabetical order, as JsonCpp writes them; two results the order does not know.
    const std::string path = (std::filesystem::temp_directory_path() / "fickcast_case_summary.json").string();
    std::ofstream(path) << R"({"status": "completed", "run": {"wall_time": {"value": 1.5, "unit": "s"}},
      "results": {
        "amount.final_total": {"unit": "kg/m2", "value": 0.25},
        "depth.front": {"final": 0.5, "level": 0.1, "unit": "m", "times": [1, 2], "depths": [0.25, 0.5]},
        "extra.b": {"unit": "1", "value": 2},
        "extra.a": {"unit": "1", "value": 3},
        "moments": {"times": [1, 2], "units": "s; kg/m2; m; m2"},
        "point.base.final": {"unit": "kg/m3", "value": 0.125},
        "point.surface.final": {"unit": "kg/m3", "value": 1.5},
        "threshold.base": {"level": 0.25, "reached": false, "unit": "s", "value": null}}})";
    const CaseSummary summary = read_case_summary(path, result_order(read_case_text(case_text, "case.ini")));
    EXPECT_EQ(names(summary), (std::vector<std::string>{"amount.final_total", "point.surface.final", "point.base.final",
                                                        "threshold.base", "depth.front", "extra.a", "extra.b"}));
    EXPECT_EQ(summary.status, "completed");
    EXPECT_EQ(summary.wall_time, 1.5);
    EXPECT_EQ(summary.find("depth.front")->value, 0.5);
    EXPECT_EQ(summary.find("depth.front")->unit, "m");
    EXPECT_EQ(summary.find("extra.a")->value, 3.0);
    EXPECT_TRUE(std::isnan(summary.find("threshold.base")->value));
    std::filesystem::remove(path);
  }

  TEST(CaseSummary, InputErrorSummaryHasNoResultsAndBadFilesAreIoErrors)
  {
    const std::string path = (std::filesystem::temp_directory_path() / "fickcast_case_summary_bad.json").string();
    std::ofstream(path) << R"({"message": "bad porosity", "program": "fickcast", "status": "input error"})";
    const CaseSummary summary = read_case_summary(path, {});
    EXPECT_EQ(summary.status, "input error");
    EXPECT_EQ(summary.message, "bad porosity");
    EXPECT_EQ(summary.wall_time, 0.0);
    EXPECT_TRUE(summary.results.empty());
    std::ofstream(path) << R"({"status": )";
    EXPECT_THROW(read_case_summary(path, {}), IoError);
    std::ofstream(path) << "[1, 2]";
    EXPECT_THROW(read_case_summary(path, {}), IoError);
    std::filesystem::remove(path);
    EXPECT_THROW(read_case_summary(path, {}), IoError);
  }
} // namespace fickcast
