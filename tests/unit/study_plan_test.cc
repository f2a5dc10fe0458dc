// The cases a study plans: grids, zipped lists, layer thicknesses, samples.
#include "case/case_reader.h"
#include "case/input_error.h"
#include "studies/study_plan.h"

#include <gtest/gtest.h>

namespace fickcast
{
  namespace
  {
    const std::string base = R"(
[geometry]
layers = clay 0.9 m, sand 300 mm
cell_size = 5 mm
[region.clay]
diffusivity = 1.9e-9 m2/s
porosity = 0.38
[region.sand]
diffusivity = 1.9e-9 m2/s
[boundary.top]
type = concentration
value = 1500 mg/L
[time]
end = 60 yr
[output]
point.base = 0.9 m
threshold.base = 250 mg/L
[sweep]
)";

    std::vector<StudyCase> plan(const std::string &study)
    {
      return plan_study(read_case_text(base + study, "case.ini"));
    }
  } // namespace

  TEST(StudyPlan, GridIsEveryCombinationFirstKeySlowest)
  {
    const auto cases = plan("vary.region.clay.porosity = 0.30, 0.38, 0.45\n"
                            "vary.time.end = 30 yr, 60 yr\n");
    ASSERT_EQ(cases.size(), 6u);
    EXPECT_EQ(cases[0].id, "case_0001");
    EXPECT_EQ(cases[5].id, "case_0006");
    EXPECT_EQ(cases[0].overrides, (std::vector<std::string>{"region.clay.porosity=0.30", "time.end=30 yr"}));
    EXPECT_EQ(cases[1].overrides, (std::vector<std::string>{"region.clay.porosity=0.30", "time.end=60 yr"}));
    EXPECT_EQ(cases[5].overrides, (std::vector<std::string>{"region.clay.porosity=0.45", "time.end=60 yr"}));
  }

  TEST(StudyPlan, ZipPairsElementByElement)
  {
    const auto cases = plan("combine = zip\nvary.region.clay.porosity = 0.30, 0.38\nvary.time.end = 30 yr, 60 yr\n");
    ASSERT_EQ(cases.size(), 2u);
    EXPECT_EQ(cases[1].overrides, (std::vector<std::string>{"region.clay.porosity=0.38", "time.end=60 yr"}));
  }

  TEST(StudyPlan, ZipNeedsListsOfEqualLength)
  {
    EXPECT_THROW(plan("combine = zip\nvary.region.clay.porosity = 0.30, 0.38\nvary.time.end = 30 yr\n"), InputError);
  }

  TEST(StudyPlan, WholeStringsAndLayerThickness)
  {
    const auto lists = plan("vary.geometry.layers = clay 0.6 m, sand 0.3 m | clay 0.9 m, sand 0.3 m\n");
    ASSERT_EQ(lists.size(), 2u);
    EXPECT_EQ(lists[0].overrides, (std::vector<std::string>{"geometry.layers=clay 0.6 m, sand 0.3 m"}));
    const auto thickness = plan("vary.layer.clay.thickness = 60 cm, 1.2 m\n");
    ASSERT_EQ(thickness.size(), 2u);
    EXPECT_EQ(thickness[0].overrides, (std::vector<std::string>{"geometry.layers=clay 60 cm, sand 0.3 m"}));
    EXPECT_EQ(thickness[1].parameters[0], (std::pair<std::string, std::string>{"layer.clay.thickness", "1.2 m"}));
    EXPECT_THROW(plan("vary.layer.gravel.thickness = 1 m\n"), InputError);
  }

  TEST(StudyPlan, SeveralLayerThicknessesGoIntoOneLayerList)
  {
    const auto cases = plan("vary.layer.clay.thickness = 60 cm, 1.2 m\nvary.layer.sand.thickness = 10 cm\n"
                            "vary.time.end = 30 yr\n");
    ASSERT_EQ(cases.size(), 2u);
    EXPECT_EQ(cases[1].overrides,
              (std::vector<std::string>{"time.end=30 yr", "geometry.layers=clay 1.2 m, sand 10 cm"}));
    // A layer list and a thickness edit in one case would undo each other: rejected.
    EXPECT_THROW(plan("vary.geometry.layers = clay 0.6 m, sand 0.3 m\nvary.layer.clay.thickness = 1 m\n"), InputError);
  }

  TEST(StudyPlan, SamplesCarryTheFirstArgumentsUnit)
  {
    const auto cases = plan("sample.region.clay.diffusivity = lognormal(1.9e-9 m2/s, 0.3)\nsamples = 8\nseed = 5\n");
    ASSERT_EQ(cases.size(), 8u);
    for (const auto &c : cases)
      {
        ASSERT_EQ(c.overrides.size(), 1u);
        EXPECT_EQ(c.overrides[0].rfind("region.clay.diffusivity=", 0), 0u);
        EXPECT_NE(c.overrides[0].find(" m2/s"), std::string::npos);
      }
    EXPECT_NE(plan_fingerprint(cases, {}), plan_fingerprint(cases, {"time.end=1 yr"}));
  }

  TEST(StudyPlan, SweepAndSamplesTogetherAreRejected)
  {
    EXPECT_THROW(plan("vary.time.end = 30 yr\nsample.region.clay.porosity = uniform(0.3, 0.4)\n"), InputError);
  }
} // namespace fickcast
