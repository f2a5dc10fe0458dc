// Study plots and report from sweep.csv, read generically. The study tables here are synthetic
// fixtures written by the test (invented numbers), not output of the solver.
#include "case_runner.h"

#include "output_file.h"
#include "post_error.h"
#include "report.h"
#include "study_plots.h"
#include "study_table.h"

#include "case/case_reader.h"
#include "studies/study_plan.h"
#include "studies/study_runner.h"

#include <deal.II/base/mpi.h>

#include <vtkImageData.h>
#include <vtkPNGReader.h>
#include <vtkSmartPointer.h>

#include <gtest/gtest.h>

#include <cmath>
#include <cstdio>
#include <filesystem>
#include <string>

namespace fickcast::post
{
  // Hyndman and Fan, "Sample quantiles in statistical packages", The American Statistician 50(4)
  // (1996), definition 7 (journal details from memory): Q(p) = x[j] + g (x[j+1] - x[j]) with
  // h = (n - 1) p + 1, j = floor(h), g = h - j (1-based order statistics). For 1, 2, ..., 100:
  // P5 = 5.95, P50 = 50.5, P95 = 95.05, worked by hand from that definition.
  TEST(Study, QuantilesFollowHyndmanFanDefinition7)
  {
    std::vector<double> values;
    for (int i = 100; i >= 1; --i) // unsorted on purpose
      values.push_back(i);
    EXPECT_NEAR(sample_quantile(values, 0.05), 5.95, 1e-12);
    EXPECT_NEAR(sample_quantile(values, 0.50), 50.5, 1e-12);
    EXPECT_NEAR(sample_quantile(values, 0.95), 95.05, 1e-12);
    EXPECT_EQ(sample_quantile(values, 0.0), 1.0);
    EXPECT_EQ(sample_quantile(values, 1.0), 100.0);
    std::vector<double> levels, probability;
    exceedance_curve({3, 1, 2}, levels, probability); // Weibull plotting position 1 - i/(n+1)
    ASSERT_EQ(levels.size(), 3u);
    EXPECT_EQ(levels[0], 1.0);
    EXPECT_NEAR(probability[0], 0.75, 1e-15);
    EXPECT_NEAR(probability[2], 0.25, 1e-15);
  }

  TEST(Study, SweepReportPlotsEachResultAgainstTheVariedParameter)
  {
    const std::string folder = testing::scratch_folder("post_study_sweep");
    // Synthetic fixture: a one-parameter sweep; one case failed and must be left out.
    write_file(folder + "/sweep.csv", "case,region.clay.porosity,threshold.mid [s],point.mid.final [kg/m3],status,"
                                      "wall_time [s]\n"
                                      "c1,0.30,7.1e7,0.91,completed,0.4\n"
                                      "c2,0.35,7.6e7,0.97,completed,0.4\n"
                                      "c3,0.40,8.3e7,1.02,completed,0.5\n"
                                      "c4,0.45,,,failed,0.1\n");
    const StudyTable study = read_study(folder);
    ASSERT_EQ(study.parameters.size(), 1u);
    ASSERT_EQ(study.results.size(), 2u);
    EXPECT_EQ(study.n_failed, 1u);
    const ReportOutcome outcome = make_study_report(folder, {});
    ASSERT_TRUE(std::filesystem::is_regular_file(outcome.html));
    ASSERT_EQ(outcome.images.size(), 4u); // 2 results x 1 parameter, PNG and SVG
    auto reader = vtkSmartPointer<vtkPNGReader>::New();
    reader->SetFileName(outcome.images[0].c_str());
    reader->Update();
    int dims[3];
    reader->GetOutput()->GetDimensions(dims);
    EXPECT_EQ(dims[0], 1000);
    EXPECT_EQ(dims[1], 640);
    const std::string html = read_file(outcome.html, "the report");
    EXPECT_NE(html.find("1 not completed"), std::string::npos);
    EXPECT_NE(html.find("do not replace"), std::string::npos);
  }

  TEST(Study, UncertaintyReportHasDistributionsAndExceedance)
  {
    const std::string folder = testing::scratch_folder("post_study_uncertainty");
    // Synthetic fixture: 40 cases of two sampled parameters with a made-up result.
    std::string csv = "case,region.clay.diffusivity [m2/s],region.clay.porosity,depth.front.final [m],status,"
                      "wall_time [s]\n";
    for (int i = 0; i < 40; ++i)
      {
        const double d = 1e-9 * (1 + 0.05 * ((i * 7) % 40)), porosity = 0.3 + 0.005 * ((i * 13) % 40);
        char row[160];
        std::snprintf(row, sizeof(row), "case%d,%.4g,%.4g,%.6g,completed,0.3\n", i, d, porosity,
                      1.2 + 0.02 * ((i * 7) % 40) - 0.5 * (porosity - 0.3));
        csv += row;
      }
    write_file(folder + "/sweep.csv", csv);
    write_file(folder + "/sweep_summary.json", R"({"kind": "uncertainty", "title": "synthetic liner",
      "results": {"depth.front.final": {"mean": 1.58, "p5": 1.25, "p50": 1.58, "p95": 1.93,
      "probability_above 1.5 m": {"level": 1.5, "n": 40, "probability": 0.6, "standard_error": 0.0775}}}})");
    const ReportOutcome outcome = make_study_report(folder, ReportOptions{});
    // distribution + exceedance + drivers + 2 scatter plots, PNG and SVG each
    EXPECT_EQ(outcome.images.size(), 10u);
    const std::string html = read_file(outcome.html, "the report");
    EXPECT_NE(html.find("Uncertainty study"), std::string::npos);
    EXPECT_NE(html.find("<h1>synthetic liner</h1>"), std::string::npos);
    EXPECT_NE(html.find("<td>P(above 1.5 m) = 60 % (+- 7.8 %, n = 40)</td>"), std::string::npos);
    EXPECT_NE(html.find("exceedance_depth_front_final.svg"), std::string::npos);
    EXPECT_NE(html.find("drivers_depth_front_final.svg"), std::string::npos);
    // Spearman's rank correlation itself (postprocess/study_plots.h).
    EXPECT_NEAR(rank_correlation({1, 2, 3, 4}, {10, 20, 30, 40}), 1.0, 1e-15);
    EXPECT_NEAR(rank_correlation({1, 2, 3, 4}, {4, 3, 2, 1}), -1.0, 1e-15);
    // Ties get their mean rank (Spearman 1904): ranks (1.5, 1.5, 3) and (1, 2, 3) correlate by
    // 0.866 (sqrt(3)/2, computed by hand).
    EXPECT_NEAR(rank_correlation({5, 5, 7}, {1, 2, 3}), std::sqrt(3.0) / 2, 1e-12);
  }

  // The sweep.csv the solver itself writes (an invented liner scenario): parameters with units
  // (one of them a layer thickness), a message column, and a threshold that some samples do
  // not reach within the run. The report's percentiles must be those of the solver's
  // sweep_summary.json (both by Hyndman and Fan 1996, definition 7, with an event not reached
  // counted as later than any time).
  TEST(Study, ReadsTheSolversStudyTableAndAgreesOnItsPercentiles)
  {
    const std::string text = R"(
[case]
title = liner under uncertain properties (invented numbers)
[geometry]
layers = clay 0.9 m, sand 0.3 m
cell_size = 2 cm
[region.clay]
diffusivity = 1.9e-9 m2/s
porosity = 0.38
tortuosity = 0.33
[region.sand]
diffusivity = 1.9e-9 m2/s
[boundary.top]
type = concentration
value = 1500 mg/L
[time]
end = 25 yr
[output]
fields = false
point.base = end of clay
threshold.base = 250 mg/L
[sweep]
sample.region.clay.tortuosity = lognormal(0.33, 0.4)
sample.layer.clay.thickness = uniform(70 cm, 110 cm)
samples = 24
seed = 3
)";
    const std::string file = testing::write_case(text, "post_real_study");
    const CaseDescription base = read_case(file);
    StudyOptions options;
    options.case_file = file;
    options.folder = file.substr(0, file.rfind('/')) + "/study";
    options.overwrite = true;
    const StudyTotals totals = run_study(base, plan_study(base), options, MPI_COMM_SELF, {});
    ASSERT_EQ(totals.table.statistics.size(), 4u); // amount, point final value, threshold, uptake fraction

    const StudyTable study = read_study(options.folder);
    ASSERT_EQ(study.parameters.size(), 2u); // the message column is not a result
    ASSERT_EQ(study.results.size(), 4u);
    EXPECT_EQ(study.parameter_unit(study.parameters[1]), "cm");
    for (const double v : study.parameter_values(study.parameters[1]))
      EXPECT_TRUE(v >= 70 && v <= 110) << v;

    bool some_not_reached = false;
    for (const auto &solver : totals.table.statistics)
      {
        const std::size_t column = study.table.find(solver.name);
        ASSERT_NE(column, CsvTable::npos) << solver.name;
        const auto values = study.result_values(column);
        const auto agree = [](const double post, const double mine) {
          return std::isinf(mine) ? std::isinf(post) : std::abs(post - mine) <= 1e-9 * std::abs(mine);
        };
        EXPECT_TRUE(agree(sample_quantile(values, 0.05), solver.p5)) << solver.name;
        EXPECT_TRUE(agree(sample_quantile(values, 0.50), solver.p50)) << solver.name;
        EXPECT_TRUE(agree(sample_quantile(values, 0.95), solver.p95)) << solver.name;
        some_not_reached = some_not_reached || solver.not_reached > 0;
      }
    EXPECT_TRUE(some_not_reached) << "the fixture should leave some samples short of the threshold";

    const ReportOutcome outcome = make_study_report(options.folder, {});
    EXPECT_GE(outcome.images.size(), 2 * (4u + 4u + 4u * 2u)); // distribution, exceedance, 2 scatters
    const std::string html = read_file(outcome.html, "the report");
    EXPECT_NE(html.find("not reached"), std::string::npos);
  }

  TEST(Study, EventsNotReachedCountAsLaterThanAnyTime)
  {
    // Hyndman and Fan (1996), definition 7 on {1, 2, 3, inf}: h = 3p; P50 = 2.5, P95 = inf.
    const double inf = std::numeric_limits<double>::infinity();
    EXPECT_NEAR(sample_quantile({3, inf, 1, 2}, 0.5), 2.5, 1e-15);
    EXPECT_TRUE(std::isinf(sample_quantile({3, inf, 1, 2}, 0.95)));
    EXPECT_TRUE(std::isnan(finite_mean({1, inf})));
    std::vector<double> levels, probability;
    exceedance_curve({3, inf, 1, 2}, levels, probability); // n = 4: 1 - i/5 at the finite levels
    ASSERT_EQ(levels.size(), 3u);
    EXPECT_NEAR(probability[2], 0.4, 1e-15);
  }

  TEST(Study, MalformedStudyTableIsAnInputError)
  {
    const std::string folder = testing::scratch_folder("post_study_bad");
    write_file(folder + "/sweep.csv", "case,region.clay.porosity,threshold.mid [s],status\nc1,0.3,soon,completed\n");
    try
      {
        make_study_report(folder, {});
        FAIL() << "no error for a text result";
      }
    catch (const PostInputError &error)
      {
        EXPECT_NE(std::string(error.what()).find("sweep.csv:2"), std::string::npos) << error.what();
      }
  }
} // namespace fickcast::post
