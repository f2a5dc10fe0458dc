// The material and boundary laws of solver/model against their defining formulas.
#include "model/boundary_condition.h"
#include "model/material.h"

#include <gtest/gtest.h>

#include <cmath>
#include <limits>
#include <string>

namespace fickcast
{
  namespace
  {
    RegionSpec clay()
    {
      RegionSpec region;
      region.name = "clay";
      region.diffusivity = ScalarField::constant(1.9e-9);
      region.porosity = 0.38;
      region.tortuosity = 0.33;
      return region;
    }

    const TemperatureSchedule no_temperature;
    const ScalarField zero = ScalarField::constant(0);
  } // namespace

  TEST(Material, CapacityAndConductanceFactor)
  {
    // The capacity/conductance form (DESIGN.md section 2): C = theta R K, G = theta tau K D.
    RegionSpec region = clay();
    std::string report;
    const Material material(region, no_temperature, zero, 1, &report);
    EXPECT_DOUBLE_EQ(material.capacity(), 0.38);
    EXPECT_DOUBLE_EQ(material.conductance_factor(), 0.38 * 0.33);
    EXPECT_DOUBLE_EQ(material.conductance(0, 0, 0, 0, 0), 0.38 * 0.33 * 1.9e-9);
    EXPECT_DOUBLE_EQ(material.effective_diffusivity(0, 0, 0, 0, 0), 0.33 * 1.9e-9);
    EXPECT_TRUE(report.empty());

    region.partition = 2;
    region.retardation = 3;
    region.decay_rate = 1e-3;
    const Material sorbing(region, no_temperature, zero, 1, &report);
    EXPECT_DOUBLE_EQ(sorbing.capacity(), 0.38 * 3 * 2);
    EXPECT_DOUBLE_EQ(sorbing.reaction(), 1e-3 * 0.38 * 2 * 3); // sorbed amounts decay too
    region.decay_dissolved_only = true;
    const Material dissolved_decay(region, no_temperature, zero, 1, &report);
    EXPECT_DOUBLE_EQ(dissolved_decay.reaction(), 1e-3 * 0.38 * 2);
  }

  TEST(Material, PorosityLaws)
  {
    // Archie (1942): D_eff theta = D theta^m, so tau = theta^(m - 1); m = 2 gives tau = theta.
    RegionSpec region = clay();
    region.tortuosity = 1;
    region.porosity_law = PorosityLaw::archie;
    region.archie_exponent = 2;
    EXPECT_DOUBLE_EQ(tortuosity_factor(region), 0.38);
    region.archie_exponent = 2.5;
    EXPECT_DOUBLE_EQ(tortuosity_factor(region), std::pow(0.38, 1.5));
    // Millington and Quirk (1961), saturated: D_eff theta = D theta^(4/3), tau = theta^(1/3).
    region.porosity_law = PorosityLaw::millington_quirk;
    region.porosity = 0.3;
    EXPECT_NEAR(tortuosity_factor(region), 0.669433, 1e-6);
    std::string report;
    EXPECT_DOUBLE_EQ(Material(region, no_temperature, zero, 1, &report).tortuosity(), std::cbrt(0.3));
  }

  TEST(Material, RetardationFromBulkDensityAndDistributionCoefficient)
  {
    // Linear equilibrium sorption: R = 1 + rho_b Kd / theta (common practice; e.g. Freeze and
    // Cherry, Groundwater, 1979, sec. 9.2, from memory).
    RegionSpec region = clay();
    EXPECT_DOUBLE_EQ(retardation_factor(region), 1.0);
    region.retardation = 4;
    EXPECT_DOUBLE_EQ(retardation_factor(region), 4.0);
    region.retardation = 1;
    region.porosity = 0.4;
    region.bulk_density = 1600;             // kg/m3
    region.distribution_coefficient = 5e-4; // m3/kg
    EXPECT_DOUBLE_EQ(retardation_factor(region), 3.0);
    std::string report;
    EXPECT_DOUBLE_EQ(Material(region, no_temperature, zero, 1, &report).capacity(), 0.4 * 3.0);
  }

  TEST(Material, UndissolvedLoadingAndSaturation)
  {
    // A loading above solubility (common practice, dispersed-drug matrices): the pores hold
    // theta R c_s per bulk volume; the rest is undissolved; the initial phase concentration is
    // the solubility.
    RegionSpec region = clay();
    region.partition = 2;
    region.loading = 40;
    region.solubility = 5;
    std::string report;
    const Material material(region, no_temperature, ScalarField::constant(1), 1, &report);
    EXPECT_TRUE(material.has_dispersed_phase());
    EXPECT_DOUBLE_EQ(material.saturation(), 2.5);
    EXPECT_DOUBLE_EQ(material.undissolved_loading(), 40 - 0.38 * 5);
    EXPECT_DOUBLE_EQ(material.initial_concentration(0, 0, 0), 5);
    region.loading = 1; // below what the pores hold at saturation: all dissolved, c = loading / theta
    const Material dissolved(region, no_temperature, zero, 1, &report);
    EXPECT_DOUBLE_EQ(dissolved.initial_concentration(0, 0, 0), 1 / 0.38);
    EXPECT_LT(dissolved.undissolved_loading(), 0);
  }

  TEST(Material, ReportsTheFirstNonPhysicalValueWithItsKey)
  {
    RegionSpec region = clay();
    region.diffusivity.expression = "1e-9 * (1 - 2 * x)";
    std::string report;
    const Material material(region, no_temperature, zero, 1, &report);
    EXPECT_GT(material.effective_diffusivity(0.25, 0, 0, 0, 0), 0);
    EXPECT_TRUE(report.empty());
    material.effective_diffusivity(0.75, 0, 0, 0, 0);
    EXPECT_EQ(report.rfind("region.clay.diffusivity: expected a diffusivity > 0 everywhere, found -5e-10", 0), 0u)
      << report;
    const std::string first = report;
    material.effective_diffusivity(1.0, 0, 0, 0, 0);
    EXPECT_EQ(report, first);
  }

  TEST(BoundaryCondition, PhasesTransferAndBath)
  {
    BoundarySpec spec;
    spec.kind = BoundaryKind::concentration;
    spec.value = ScalarField::constant(6);
    spec.ambient = ScalarField::constant(4);
    // `value` is the phase concentration inside the face's region: u = value / K.
    EXPECT_DOUBLE_EQ(BoundaryCondition(spec, 3).fixed_value(0, 0, 0, 0), 2);
    spec.value_is_ambient = true; // `ambient` is already the reference phase
    EXPECT_DOUBLE_EQ(BoundaryCondition(spec, 3).fixed_value(0, 0, 0, 0), 4);

    // Transfer: outward flux h (c_face - K c_ambient) = h K (u - u_ambient).
    spec.kind = BoundaryKind::transfer;
    spec.coefficient = 1e-6;
    const BoundaryCondition transfer(spec, 3);
    EXPECT_DOUBLE_EQ(transfer.load_factor(3), 3e-6);
    EXPECT_DOUBLE_EQ(transfer.driving_function().at_time(0), 4);
    spec.kind = BoundaryKind::flux;
    EXPECT_DOUBLE_EQ(BoundaryCondition(spec, 3).load_factor(3), 1);
    EXPECT_DOUBLE_EQ(BoundaryCondition(spec, 3).driving_function().at_time(0), 6);

    // A bath of liquid partition K_b: its concentration is K_b u, its capacity V K_b.
    spec.kind = BoundaryKind::bath;
    spec.volume = 0.01;
    spec.bath_partition = 0.5;
    spec.bath_initial = 2;
    const BoundaryCondition bath(spec, 1);
    EXPECT_TRUE(bath.is_fixed());
    EXPECT_DOUBLE_EQ(bath.bath_initial_value(), 4);
    EXPECT_DOUBLE_EQ(bath.bath_concentration(4), 2);
    EXPECT_DOUBLE_EQ(bath.bath_capacity(), 0.005);
  }
  TEST(Material, NonFiniteSourceIsANumericalFailure)
  {
    // A source that is NaN where it is asked for goes to the numerical-failure report, not to the
    // input-error one; the first is kept, with the key, the point (if it depends on space) and t.
    RegionSpec region = clay();
    region.source.expression = "sqrt(x - 1)";
    std::string report, non_finite;
    const Material material(region, no_temperature, zero, 2, &report, &non_finite);
    EXPECT_DOUBLE_EQ(material.source(2, 0, 0, 5), 1);
    EXPECT_TRUE(non_finite.empty());
    EXPECT_TRUE(std::isnan(material.source(0.5, 0.25, 0, 86400)));
    EXPECT_EQ(non_finite,
              "region.clay.source: expected a finite value, found NaN at (x, y) = (0.5, 0.25) m, t = 86400 s");
    material.source(0, 0, 0, 1);
    EXPECT_EQ(non_finite.rfind("region.clay.source: expected a finite value, found NaN at (x, y) = (0.5, 0.25)", 0),
              0u);
    EXPECT_TRUE(report.empty());
  }

  TEST(BoundaryCondition, NonFiniteValuesAreReportedWithTheirKey)
  {
    BoundarySpec spec;
    spec.name = "top";
    spec.kind = BoundaryKind::concentration;
    spec.value = ScalarField::constant(std::numeric_limits<double>::infinity());
    std::string non_finite;
    const BoundaryCondition wrong(spec, 1, 1, &non_finite);
    EXPECT_FALSE(std::isfinite(wrong.fixed_value(0, 0, 0, 10)));
    EXPECT_EQ(non_finite, "boundary.top.value: expected a finite value, found inf at t = 10 s");

    // In a case with stages the stage is named; a transfer face's key is its ambient.
    non_finite.clear();
    spec.kind = BoundaryKind::transfer;
    spec.ambient.expression = "sqrt(-1 - x)";
    const BoundaryCondition transfer(spec, 1, 1, &non_finite, "drying");
    EXPECT_TRUE(std::isnan(transfer.driving_value(0.5, 0, 0, 2)));
    EXPECT_EQ(non_finite,
              "boundary.top.ambient (stage drying): expected a finite value, found NaN at x = 0.5 m, t = 2 s");
  }
} // namespace fickcast
