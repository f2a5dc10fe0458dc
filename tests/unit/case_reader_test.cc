#include "case/case_reader.h"
#include "case/input_error.h"
#include "model/material.h"

#include <gtest/gtest.h>

namespace fickcast
{
  namespace
  {
    const std::string minimal = R"(
[geometry]
layers = clay 0.9 m, sand 300 mm
cell_size = 5 mm
[region.clay]
diffusivity = 1.9e-9 m2/s
porosity = 0.38
tortuosity = 0.33
[region.sand]
diffusivity = 1.9e-5 cm2/s
[boundary.top]
type = concentration
value = 1500 mg/L
[time]
end = 60 yr
[output]
point.base = 0.9 m
threshold.base = 250 mg/L
)";

    std::string error_of(const std::string &text, const std::vector<std::string> &overrides = {})
    {
      try
        {
          read_case_text(text, "case.ini", overrides);
        }
      catch (const InputError &error)
        {
          return error.what();
        }
      return "";
    }
  } // namespace

  TEST(CaseReader, ConvertsEverythingToSI)
  {
    const CaseDescription c = read_case_text(minimal, "case.ini");
    ASSERT_EQ(c.geometry.layers.size(), 2u);
    EXPECT_DOUBLE_EQ(c.geometry.layers[1].thickness, 0.3);
    EXPECT_DOUBLE_EQ(c.geometry.cell_size, 0.005);
    EXPECT_DOUBLE_EQ(c.regions[1].diffusivity.value, 1.9e-9);
    EXPECT_DOUBLE_EQ(c.regions[0].porosity, 0.38);
    EXPECT_DOUBLE_EQ(c.regions[0].tortuosity, 0.33);
    EXPECT_DOUBLE_EQ(c.time.end, 60 * 31557600.0);
    EXPECT_EQ(c.units.concentration, "kg/m3");
    EXPECT_EQ(c.units.amount, "kg/m2");
    EXPECT_EQ(c.units.as_written, "mg/L");
    EXPECT_DOUBLE_EQ(c.boundaries[0].value.value, 1.5);
    EXPECT_EQ(c.boundaries[1].kind, BoundaryKind::sealed); // bottom, not given
    ASSERT_EQ(c.output.thresholds.size(), 1u);
    EXPECT_DOUBLE_EQ(c.output.thresholds[0].level, 0.25);
    EXPECT_EQ(c.output.folder, "results/case");
  }

  TEST(CaseReader, RecordsWhereEverySettingCameFrom)
  {
    const CaseDescription c = read_case_text(minimal, "case.ini", {"time.end=10 yr"});
    bool saw_end = false, saw_default = false;
    for (const auto &record : c.settings)
      {
        if (record.key == "time.end")
          {
            saw_end = true;
            EXPECT_EQ(record.origin, "--set");
            EXPECT_EQ(record.written, "10 yr");
            EXPECT_EQ(record.si, "315576000 s");
          }
        if (record.key == "region.sand.porosity")
          {
            saw_default = true;
            EXPECT_EQ(record.origin, "default");
          }
        if (record.key == "region.clay.porosity")
          EXPECT_EQ(record.origin, "case.ini:7");
      }
    EXPECT_TRUE(saw_end);
    EXPECT_TRUE(saw_default);
    EXPECT_DOUBLE_EQ(c.time.end, 10 * 31557600.0);
  }

  TEST(CaseReader, OverridesNamedSections)
  {
    const CaseDescription c = read_case_text(minimal, "case.ini", {"region.clay.porosity=0.45"});
    EXPECT_DOUBLE_EQ(c.regions[0].porosity, 0.45);
  }

  TEST(CaseReader, MistakesNameFileLineAndKey)
  {
    EXPECT_NE(error_of(minimal + "[region.silt]\ndiffusivity = 1e-9 m2/s\n").find("region.silt"), std::string::npos);
    const std::string typo = error_of(minimal, {"region.clay.porsity=0.3"});
    EXPECT_NE(typo.find("did you mean 'porosity'"), std::string::npos) << typo;
    const std::string unit = error_of(minimal, {"region.clay.diffusivity=1.9e-9 m"});
    EXPECT_NE(unit.find("--set: region.clay.diffusivity"), std::string::npos) << unit;
    EXPECT_NE(unit.find("a length"), std::string::npos) << unit;
    const std::string negative = error_of(minimal, {"region.sand.diffusivity=-1e-9 m2/s"});
    EXPECT_NE(negative.find("expected a value > 0"), std::string::npos) << negative;
    EXPECT_NE(error_of(minimal, {"region.clay.porosity=1.2"}).find("(0, 1]"), std::string::npos);
    EXPECT_NE(error_of(minimal, {"region.clay.retardation=0.5"}).find(">= 1"), std::string::npos);
    EXPECT_NE(error_of(minimal, {"time.end=0 s"}).find("time.end"), std::string::npos);
    EXPECT_NE(error_of(minimal, {"output.point.base=2 m"}).find("outside"), std::string::npos);
    EXPECT_NE(error_of(minimal, {"boundary.side.type=sealed"}).find("boundary.side"), std::string::npos);
    EXPECT_NE(error_of(minimal, {"output.threshold.nowhere=1 mg/L"}).find("point"), std::string::npos);
    // The first concentration written decides the family; a later one in another family names it.
    const std::string family = error_of(minimal, {"boundary.top.value=2 mol/m3"});
    EXPECT_NE(family.find("output.threshold.base"), std::string::npos) << family;
    EXPECT_NE(family.find("boundary.top.value"), std::string::npos) << family;
    EXPECT_NE(error_of(minimal, {"geometry.layers=clay 0 m, sand 1 m"}).find("zero-thickness"), std::string::npos);
  }

  TEST(CaseReader, ExpressionsAreCheckedWhenRead)
  {
    const CaseDescription c = read_case_text(minimal, "case.ini", {"boundary.top.value={1500*exp(-t/(2*h))} mg/L"});
    EXPECT_EQ(c.boundaries[0].value.expression, "1500*exp(-t/(2*h))");
    EXPECT_DOUBLE_EQ(c.boundaries[0].value.scale, 1e-3);
    EXPECT_NE(error_of(minimal, {"initial.value={t*2} mg/L"}).find("variables allowed here: x, y, z"),
              std::string::npos);
  }

  // The elementary charge and the Avogadro constant are exact (SI Brochure, 9th ed., 2019): 1 eV per
  // particle is e N_A = 96.48533212... kJ/mol.
  TEST(CaseReader, ActivationEnergyPerParticleOrPerMole)
  {
    std::string text = minimal;
    text.replace(text.find("diffusivity = 1.9e-9 m2/s"), 25, "diffusivity_prefactor = 0.76 cm2/s");
    const CaseDescription a =
      read_case_text(text, "case.ini", {"region.clay.activation_energy=3.46 eV", "temperature.schedule=1000 degC"});
    EXPECT_TRUE(a.regions[0].arrhenius);
    EXPECT_DOUBLE_EQ(a.regions[0].activation_energy, 3.46 * 1.602176634e-19);
    EXPECT_DOUBLE_EQ(a.regions[0].prefactor, 0.76e-4);
    const CaseDescription b = read_case_text(
      text, "case.ini", {"region.clay.activation_energy=96.48533212 kJ/mol", "temperature.schedule=1000 degC"});
    EXPECT_NEAR(b.regions[0].activation_energy / 1.602176634e-19, 1.0, 1e-9);
  }

  TEST(CaseReader, PorousMediaRelations)
  {
    std::string text = minimal;
    text.replace(text.find("tortuosity = 0.33\n"), 18, "");
    const CaseDescription c =
      read_case_text(text, "case.ini",
                     {"region.clay.porosity_law=archie", "region.clay.archie_exponent=2", "region.sand.porosity=0.4",
                      "region.sand.bulk_density=1.6 g/cm3", "region.sand.distribution_coefficient=0.5 mL/g"});
    EXPECT_EQ(c.regions[0].porosity_law, PorosityLaw::archie);
    EXPECT_DOUBLE_EQ(tortuosity_factor(c.regions[0]), 0.38); // theta^(m-1)
    EXPECT_DOUBLE_EQ(retardation_factor(c.regions[1]), 3.0); // 1 + 1.6e3 * 0.5e-3 / 0.4
  }

  TEST(CaseReader, StagesChainTemperaturesAndBoundaries)
  {
    const std::string staged = minimal + R"(
[stage.soak]
duration = 2 h
temperature = 900 degC
[stage.cool]
duration = 1 h
temperature = 900 degC, ramp to 700 degC in 30 min
boundary.top.type = sealed
)";
    std::string text = staged;
    text.replace(text.find("end = 60 yr\n"), 12, "");
    const CaseDescription c = read_case_text(text, "case.ini");
    ASSERT_EQ(c.stages.size(), 2u);
    EXPECT_DOUBLE_EQ(c.time.end, 3 * 3600.0);
    EXPECT_DOUBLE_EQ(c.stages[1].start, 7200.0);
    EXPECT_EQ(c.stages[0].find_boundary("top")->kind, BoundaryKind::concentration);
    EXPECT_EQ(c.stages[1].find_boundary("top")->kind, BoundaryKind::sealed);
    EXPECT_DOUBLE_EQ(c.temperature.at(3600.0), 1173.15);
    EXPECT_DOUBLE_EQ(c.temperature.at(7200.0 + 900.0), 1073.15);
    EXPECT_DOUBLE_EQ(c.temperature.at(7200.0 + 3000.0), 973.15); // held after the ramp
  }

  TEST(CaseReader, LayersWithoutCommas)
  {
    const CaseDescription c = read_case_text(minimal, "case.ini", {"geometry.layers=clay 0.6 m sand 0.3 m"});
    ASSERT_EQ(c.geometry.layers.size(), 2u);
    EXPECT_DOUBLE_EQ(c.geometry.layers[0].thickness, 0.6);
    EXPECT_EQ(c.geometry.layers[1].name, "sand");
  }

  // Found by tests/fuzz: values finite as written but not in SI, and stage durations whose sum
  // overflows, were accepted as inf.
  TEST(CaseReader, NumbersBeyondTheRangeOfDoublesAreInputErrors)
  {
    const std::string value = error_of(minimal, {"region.clay.diffusivity=1e308 km2/s"});
    EXPECT_NE(value.find("region.clay.diffusivity"), std::string::npos) << value;
    EXPECT_NE(value.find("range of numbers"), std::string::npos) << value;
    std::string staged = minimal + "[stage.first]\nduration = 1.5e308 s\n[stage.second]\nduration = 1.5e308 s\n";
    staged.replace(staged.find("end = 60 yr\n"), 12, "");
    const std::string stages = error_of(staged);
    EXPECT_NE(stages.find("case.ini:21: stage.second.duration"), std::string::npos) << stages;
    EXPECT_NE(stages.find("range of numbers"), std::string::npos) << stages;
    // Layers each finite whose sum is not: `end of sand` would be a point at inf.
    const std::string layers = error_of(minimal, {"geometry.layers=clay 1e308 m, sand 1e308 m"});
    EXPECT_NE(layers.find("--set: geometry.layers"), std::string::npos) << layers;
    EXPECT_NE(layers.find("range of numbers"), std::string::npos) << layers;
  }
} // namespace fickcast
