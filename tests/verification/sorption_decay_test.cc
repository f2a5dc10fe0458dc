// Semi-infinite porous medium with linear sorption and first-order decay, constant surface
// concentration (pore water), against the closed form.
#include "case_runner.h"
#include "csv_table.h"
#include "model/material.h"

#include <boost/math/special_functions/erf.hpp>

#include <gtest/gtest.h>

#include <cmath>
#include <cstdio>

namespace fickcast::testing
{
  namespace
  {
    /// R dc/dt = D* c_xx - k R c (decay of dissolved and sorbed) with c(0, t) = c0, c(x, 0) = 0:
    /// c/c0 = 1/2 exp(-x sqrt(k / D_R)) erfc(x / (2 sqrt(D_R t)) - sqrt(k t))
    ///      + 1/2 exp(+x sqrt(k / D_R)) erfc(x / (2 sqrt(D_R t)) + sqrt(k t)),  D_R = D* / R.
    /// Crank 1975 ch. 14 (first-order reaction, Danckwerts' result); van Genuchten & Alves,
    /// USDA Technical Bulletin 1661 (1982), at zero velocity. Section numbers from memory.
    double closed_form(const double x, const double t, const double d_r, const double k)
    {
      const double eta = x / (2 * std::sqrt(d_r * t)), root = std::sqrt(k * t), m = std::sqrt(k / d_r);
      return 0.5 * std::exp(-x * m) * boost::math::erfc(eta - root) +
             0.5 * std::exp(x * m) * boost::math::erfc(eta + root);
    }
  } // namespace

  // Inputs chosen as typical magnitudes (tests/verification/REFERENCES.md, "Sorption and decay"): D* = 5e-10 m2/s,
  // porosity 0.4, dry density 1.6 g/cm3, Kd = 0.5 mL/g (R = 3), half-life 10 yr.
  class SorptionDecay : public ::testing::TestWithParam<bool>
  {
  };

  TEST_P(SorptionDecay, ProbesMatchTheClosedForm)
  {
    const bool dissolved_only = GetParam();
    const std::string text = std::string(R"(
[case]
title = sorbing decaying liner
[geometry]
layers = clay 8 m
cell_size = 1 cm
grade_toward = top
grading = 1.02
[region.clay]
diffusivity = 5e-10 m2/s
porosity = 0.4
bulk_density = 1.6 g/cm3
distribution_coefficient = 0.5 mL/g
half_life = 10 yr
decay_applies_to = )") + (dissolved_only ? "dissolved" : "total") +
                             R"(
[boundary.top]
type = concentration
value = 1 mg/L
[time]
end = 100 yr
tolerance = 1e-6
[output]
fields = false
times = 10 yr, 30 yr
point.a = 0.3 m
point.b = 0.6 m
point.c = 0.9 m
)";
    const CaseDescription description = describe(text, dissolved_only ? "sorption_dissolved" : "sorption_total");
    ASSERT_NEAR(retardation_factor(description.regions[0]), 3.0, 1e-12); // 1 + 1.6 * 0.5 / 0.4
    const RunRecord record = run(description);
    ASSERT_EQ(record.status, "completed");
    const CsvTable series = read_csv(description.output.folder + "/series.csv");
    const double year = 365.25 * 86400, r = 3.0, d_r = 5e-10 / r, lambda = std::log(2.0) / (10 * year);
    const double k = dissolved_only ? lambda / r : lambda;
    const auto &time = series.column("time");
    const double c0 = 1e-3; // kg/m3
    // Reference check of the formula as coded (tests/verification/REFERENCES.md, "Sorption and decay"):
    // R = 3, decay in both phases, t = 30 yr, x = 0.6 m: 0.1028171173.
    EXPECT_NEAR(closed_form(0.6, 30 * year, d_r, lambda), 0.1028171173, 1e-9);
    for (const double years : {10.0, 30.0, 100.0})
      {
        const std::size_t row =
          std::find_if(time.begin(), time.end(), [&](double t) { return std::abs(t - years * year) < 1.0; }) -
          time.begin();
        ASSERT_LT(row, time.size());
        for (const auto &[name, x] : {std::pair<std::string, double>{"a", 0.3}, {"b", 0.6}, {"c", 0.9}})
          {
            const double computed = series.column("point." + name)[row] / c0;
            const double expected = closed_form(x, years * year, d_r, k);
            std::printf("sorption/decay (%s) t = %g yr, x = %.1f m: %.8f vs %.8f\n",
                        dissolved_only ? "dissolved" : "total", years, x, computed, expected);
            EXPECT_NEAR(computed, expected, 5e-5) << "x = " << x << " m, t = " << years << " yr";
          }
      }
  }

  INSTANTIATE_TEST_SUITE_P(DecayPhase, SorptionDecay, ::testing::Values(false, true),
                           [](const ::testing::TestParamInfo<bool> &info) {
                             return info.param ? std::string("DissolvedOnly") : std::string("DissolvedAndSorbed");
                           });
} // namespace fickcast::testing
