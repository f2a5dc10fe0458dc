// Marks on a run's plots: layer interfaces on profiles and depth plots, the levels of depth
// results with their crossings, stage changes on plots against time, the reference-phase
// profile where partitions make the phase concentration jump.
#include "plot_marks.h"
#include "post_error.h"
#include "results_folder.h"
#include "run_plots.h"

#include "case_runner.h"

#include <gtest/gtest.h>

#include <algorithm>
#include <cmath>
#include <filesystem>

namespace fickcast::post
{
  namespace
  {
    // A sorbing membrane over two clay layers of one name (invented numbers).
    const char *membrane_over_clay = R"(
[case]
title = Marks check: membrane over clay (invented numbers)
[geometry]
layers = membrane 2 mm, clay 20 cm, clay 20 cm
cell_size = 2 mm
[region.membrane]
diffusivity = 2e-13 m2/s
partition = 80
[region.clay]
diffusivity = 4e-10 m2/s
porosity = 0.4
[boundary.top]
type = concentration
value = 100 mg/L
[time]
end = 2 yr
[output]
fields_every = 0.5 yr
depth.front = 1 mg/L
)";

    const PlotFile *find(const std::vector<PlotFile> &plots, const std::string &stem)
    {
      const auto it = std::find_if(plots.begin(), plots.end(), [&](const PlotFile &p) { return p.stem == stem; });
      return it == plots.end() ? nullptr : &*it;
    }
  } // namespace

  TEST(PlotMarks, InterfacesProfilesAndDepthPlotsOfALayeredRun)
  {
    const CaseDescription description = testing::describe(membrane_over_clay, "post_plot_marks");
    ASSERT_EQ(testing::run(description).status, "completed");
    const ResultsFolder results = open_results(description.output.folder);

    // One interface: membrane | clay at 2 mm; the two clay layers are one region.
    const auto interfaces = layer_interfaces(results.summary);
    ASSERT_EQ(interfaces.size(), 1u);
    EXPECT_NEAR(interfaces[0].position, 0.002, 1e-12);
    EXPECT_EQ(interfaces[0].between, "membrane | clay");

    RunPlotOptions options;
    options.formats = {true, false};
    const auto plots = make_run_plots(results, description.output.folder + "/plots", options);
    const PlotFile *phase = find(plots, "profile_fields"), *reference = find(plots, "profile_reference"),
                   *depth = find(plots, "depth_front");
    ASSERT_NE(phase, nullptr);
    ASSERT_NE(reference, nullptr) << "a partition of 80 must give the reference-phase profile";
    ASSERT_NE(depth, nullptr);
    EXPECT_NE(phase->caption.find("Grey vertical lines: the layer interfaces."), std::string::npos) << phase->caption;
    EXPECT_NE(phase->caption.find("The dashed level of depth.front"), std::string::npos) << phase->caption;
    EXPECT_NE(phase->caption.find("Logarithmic axis"), std::string::npos) << phase->caption;
    EXPECT_NE(reference->caption.find("divided by its partition coefficient"), std::string::npos);
    EXPECT_NE(depth->caption.find("depth grows downward"), std::string::npos) << depth->caption;
    EXPECT_NE(depth->caption.find("layer interfaces it has reached"), std::string::npos) << depth->caption;
    for (const auto *plot : {phase, reference, depth})
      EXPECT_TRUE(std::filesystem::is_regular_file(description.output.folder + "/plots/" + plot->stem + ".png"));
  }

  TEST(PlotMarks, StageChangesOnPlotsAgainstTime)
  {
    RunSummary summary;
    summary.stages = {{"predep", 0, 3600}, {"drive", 3600, 39600}};
    PlotSpec spec;
    spec.curves.push_back({"point", {0, 5, 11}, {1, 3, 2}});
    ASSERT_TRUE(add_stage_marks(spec, summary, 3600));
    ASSERT_EQ(spec.curves.size(), 2u);
    const PlotCurve &marks = spec.curves.back();
    EXPECT_TRUE(marks.reference);
    EXPECT_EQ(marks.label, "start of drive");
    ASSERT_EQ(marks.x.size(), 2u);
    EXPECT_DOUBLE_EQ(marks.x[0], 1.0); // 3600 s in hours
    EXPECT_DOUBLE_EQ(marks.y[0], 1.0); // spanning the values drawn
    EXPECT_DOUBLE_EQ(marks.y[1], 3.0);

    summary.stages.pop_back();
    EXPECT_FALSE(add_stage_marks(spec, summary, 3600)); // one stage: nothing to mark
    EXPECT_EQ(spec.curves.size(), 2u);
  }

  // A 3-D run: maps of two mid-planes (x-z at the middle of y, and at the last time y-z at the
  // middle of x), at a time asked for that lies between stored states (interpolated, said so).
  TEST(PlotMarks, ThreeDimensionalRunHasMidPlaneMapsAtChosenTimes)
  {
    const char *box = R"(
[case]
title = Marks check: 3-D box (invented numbers)
dimension = 3
[geometry]
width = 0.3 m
length = 0.2 m
layers = soil 0.5 m
cell_size = 0.05 m
[region.soil]
diffusivity = 1e-3 m2/s
[boundary.top]
type = concentration
value = 1 mol/m3
[time]
end = 20 s
[numerics]
linear_solver = direct
[output]
fields_every = 10 s
)";
    const CaseDescription description = testing::describe(box, "post_plot_maps_3d");
    ASSERT_EQ(testing::run(description).status, "completed");
    const ResultsFolder results = open_results(description.output.folder);
    RunPlotOptions options;
    options.formats = {true, false};
    options.map_times = "15 s";
    const auto plots = make_run_plots(results, description.output.folder + "/plots", options);
    const PlotFile *across = find(plots, "field_map_0_y"), *along = find(plots, "field_map_0_x");
    ASSERT_NE(across, nullptr);
    ASSERT_NE(along, nullptr);
    EXPECT_NE(across->title.find("t = 15 s on the plane y = 0.1 m"), std::string::npos) << across->title;
    EXPECT_NE(along->title.find("on the plane x = 0.15 m"), std::string::npos) << along->title;
    EXPECT_NE(across->caption.find("interpolated linearly in time between 10 s and 20 s"), std::string::npos)
      << across->caption;
    EXPECT_NE(across->caption.find("drawn to scale"), std::string::npos) << across->caption;

    // A time outside the stored states is refused before anything is written.
    options.map_times = "30 s";
    EXPECT_THROW(make_run_plots(results, description.output.folder + "/plots_refused", options), PostInputError);
    EXPECT_FALSE(std::filesystem::exists(description.output.folder + "/plots_refused"));
  }
} // namespace fickcast::post
