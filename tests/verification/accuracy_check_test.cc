// The accuracy check (numerics.accuracy): on six cases with published solutions, every named
// result's true error lies within its estimate (effectivity = true error / estimate, printed;
// the test fails if any true error exceeds three times its estimate), and a result the check
// calls met is within the accuracy asked, including results far below the concentration scale.
#include "case_runner.h"

#include "results/headline_values.h"

#include <boost/math/constants/constants.hpp>
#include <boost/math/quadrature/gauss_kronrod.hpp>
#include <boost/math/special_functions/erf.hpp>

#include <gtest/gtest.h>

#include <cmath>
#include <cstdio>
#include <map>
#include <string>
#include <vector>

namespace fickcast::testing
{
  namespace
  {
    const double pi = boost::math::constants::pi<double>();

    /// Checks every named result in @p exact against the run's value and estimate.
    void expect_honest(const RunRecord &record, const std::map<std::string, double> &exact, const double asked,
                       const char *label)
    {
      ASSERT_EQ(record.status, "completed") << record.message;
      const AccuracyRecord &a = record.accuracy;
      ASSERT_TRUE(a.checked) << label << ": " << a.note;
      EXPECT_GE(a.solves.size(), 2u);
      std::map<std::string, double> values;
      for (const auto &[name, value] : headline_values(record))
        values[name] = value;
      for (const auto &[name, reference] : exact)
        {
          ASSERT_TRUE(values.count(name)) << label << ": no result " << name;
          ASSERT_TRUE(a.estimates.count(name)) << label << ": no estimate for " << name;
          const double value = values[name], estimate = a.estimates.at(name);
          const double error = std::abs(value - reference);
          std::printf("%s: %-24s %.10g (exact %.10g) true error %.2e (relative %.2e), estimate %.2e, effectivity "
                      "%.2f, %zu solves, %s\n",
                      label, name.c_str(), value, reference, error, error / std::abs(reference), estimate,
                      estimate > 0 ? error / estimate : 0.0, a.solves.size(), a.met ? "met" : "not met");
          // Honest: the true error is within three times the estimate (the estimate is the change
          // between the last two solves; for second-order schemes the true error is about a third
          // of it). The tiny absolute term only admits round-off where both are zero.
          EXPECT_LE(error, 3 * estimate + 1e-13 * std::abs(reference)) << label << ": " << name;
          if (a.met)
            EXPECT_LE(error, asked * std::abs(reference)) << label << ": " << name << " (the check said met)";
        }
      EXPECT_TRUE(a.met) << label << ": " << a.note;
    }
  } // namespace

  // 1. Semi-infinite medium, surface held at c0 from t = 0: c/c0 = erfc(x / (2 sqrt(D t)))
  // (Crank, The Mathematics of Diffusion, 2nd ed. 1975, sec. 2.3, eq. 2.45; equation number from
  // memory). A point at eta = 1 at the end, the time that point reaches 5 % (eta = erfcinv(0.05)),
  // the depth of the 1 % level at the end (x = 2 sqrt(D t) erfcinv(0.01)). erfc and its inverse
  // from Boost.Math.
  TEST(AccuracyCheck, ErfcPointThresholdAndDepthWithinTheirEstimates)
  {
    const double d = 1e-9, end = 1e6, root = std::sqrt(d * end), x = 2 * root;
    char point[64];
    std::snprintf(point, sizeof point, "%.17g m", x);
    const std::string text = std::string(R"(
[case]
title = erfc, checked
[geometry]
layers = medium 0.5 m
cell_size = 0.02 m
[region.medium]
diffusivity = 1e-9 m2/s
[boundary.top]
type = concentration
value = 1 mol/m3
[time]
end = 1e6 s
[numerics]
accuracy = 1e-3
[output]
fields = false
point.p = )") + point + R"(
threshold.p = 0.05 mol/m3
depth.front = 0.01 mol/m3
)";
    const RunRecord record = run(describe(text, "accuracy_erfc"));
    const double eta5 = boost::math::erfc_inv(0.05);
    expect_honest(record,
                  {{"point.p.final", boost::math::erfc(1.0)},
                   {"threshold.p", x * x / (4 * d * eta5 * eta5)},
                   {"depth.front", 2 * root * boost::math::erfc_inv(0.01)}},
                  1e-3, "erfc");
  }

  // 2. Surface value rising linearly in time, c(0, t) = k t, into a medium initially empty:
  // c = 4 k t i2erfc(x / (2 sqrt(D t))), i2erfc(z) = ((1 + 2 z^2) erfc z - 2 z exp(-z^2) / sqrt(pi)) / 4
  // (Crank 1975 sec. 2.5, surface concentration k t^(n/2), here n = 2; from memory). A deep point
  // at eta = 2 lies more than three decades under the surface value. Four solves: the first one
  // does not know the point's value, against which the later ones measure their step error.
  TEST(AccuracyCheck, DeepPointUnderALinearlyRisingSurfaceMeetsTheAccuracyAsked)
  {
    const double d = 1e-9, end = 1e6, k = 1e-6, root = std::sqrt(d * end);
    const double z = 2, x = 2 * z * root;
    const double i2erfc = ((1 + 2 * z * z) * boost::math::erfc(z) - 2 * z * std::exp(-z * z) / std::sqrt(pi)) / 4;
    char point[64];
    std::snprintf(point, sizeof point, "%.17g m", x);
    const std::string text = std::string(R"(
[case]
title = rising surface, checked
[geometry]
layers = medium 0.6 m
cell_size = 0.02 m
[region.medium]
diffusivity = 1e-9 m2/s
[boundary.top]
type = concentration
value = {1e-6 * t} mol/m3
[time]
end = 1e6 s
[numerics]
accuracy = 1e-3
accuracy_solves = 4
[output]
fields = false
point.deep = )") + point + "\n";
    const RunRecord record = run(describe(text, "accuracy_rising"));
    const double exact = 4 * k * end * i2erfc;
    std::printf("rising surface: deep point %.3e of the surface value\n", exact / (k * end));
    expect_honest(record, {{"point.deep.final", exact}}, 1e-3, "rising");
  }

  // 3. Two-step boron process: pre-deposition 1 h at 1000 degC with the surface at 1e20 1/cm3,
  // then drive-in 1 h at 1100 degC with a sealed surface; junction where N = 1e16 1/cm3, four
  // decades under the surface value. Exact: the erfc profile of the first step convolved with the
  // Green's function of a reflecting surface (by Gauss-Kronrod quadrature); REFERENCES.md
  // section 8 lists x_j = 1.3315322 um. D = 0.76 cm2/s exp(-3.46 eV / kT) (parameters from memory).
  TEST(AccuracyCheck, TwoStepJunctionDepthMeetsTheAccuracyAsked)
  {
    const std::string text = R"(
[case]
title = two-step boron, checked
[geometry]
layers = silicon 8 um
cell_size = 40 nm
grade_toward = top
grading = 1.05
[region.silicon]
diffusivity_prefactor = 0.76 cm2/s
activation_energy = 3.46 eV
[stage.predep]
duration = 1 h
temperature = 1000 degC
boundary.top.type = concentration
boundary.top.value = 1e20 1/cm3
[stage.drive]
duration = 1 h
temperature = 1100 degC
boundary.top.type = sealed
[numerics]
accuracy = 1e-3
[output]
fields = false
depth.junction = 1e16 1/cm3
)";
    const RunRecord record = run(describe(text, "accuracy_two_step"));
    const double k = 8.617333262e-5; // eV/K (CODATA 2018)
    auto boron = [&](double kelvin) { return 0.76e-4 * std::exp(-3.46 / (k * kelvin)); };
    const double dt1 = boron(1273.15) * 3600, dt2 = boron(1373.15) * 3600, ns = 1e26, nb = 1e22;
    auto profile = [&](const double x) {
      auto integrand = [&](const double s) {
        const double g = 1 / std::sqrt(4 * pi * dt2);
        return ns * boost::math::erfc(s / (2 * std::sqrt(dt1))) * g *
               (std::exp(-(x - s) * (x - s) / (4 * dt2)) + std::exp(-(x + s) * (x + s) / (4 * dt2)));
      };
      return boost::math::quadrature::gauss_kronrod<double, 61>::integrate(integrand, 0.0, x + 14 * std::sqrt(dt2), 15,
                                                                           1e-13);
    };
    double low = 0, high = 20 * std::sqrt(dt2);
    for (int i = 0; i < 200 && high - low > 1e-16; ++i)
      (profile(0.5 * (low + high)) > nb ? low : high) = 0.5 * (low + high);
    const double junction = 0.5 * (low + high);
    EXPECT_NEAR(junction, 1.3315322e-6, 1e-12); // REFERENCES.md section 8
    expect_honest(record, {{"depth.junction", junction}}, 1e-3, "two-step");
  }

  // 4. Plane sheet releasing through one face (the half 0 < x < L of a sheet of thickness 2 L):
  // Mt/Minf = 1 - sum 8/((2n+1)^2 pi^2) exp(-(2n+1)^2 pi^2 T / 4), T = D t / L^2 (Crank 1975
  // eq. 4.18, p. 48); half released at T = 0.196730739524, 90 % at T = 0.848085408046
  // (REFERENCES.md section 3, computed roots of 4.18); at T = 1: 0.931259678463.
  TEST(AccuracyCheck, SheetReleaseTimesWithinTheirEstimates)
  {
    const std::string text = R"(
[case]
title = sheet release, checked
[geometry]
layers = sheet 1 m
cell_size = 0.1 m
[region.sheet]
diffusivity = 1 m2/s
[initial]
value = 2 mol/m3
[boundary.top]
type = concentration
value = 0 mol/m3
[time]
end = 1 s
[numerics]
accuracy = 1e-3
[output]
fields = false
release.half = 50 %
release.most = 90 %
)";
    const RunRecord record = run(describe(text, "accuracy_sheet"));
    expect_honest(
      record,
      {{"release.half", 0.196730739524}, {"release.most", 0.848085408046}, {"released_fraction.final", 0.931259678463}},
      1e-3, "sheet");
  }

  // 5. Membrane 0 < x < l, initially empty, upstream face held, downstream face at zero: the
  // amount through the downstream face tends to D c1 / l (t - l^2 / (6 D)), time lag l^2 / (6 D)
  // (Crank 1975 eqs. 4.24a-c; Daynes 1920, Barrer 1939). l = 100 um, D = 1e-11 m2/s: 166.6666667 s.
  TEST(AccuracyCheck, MembraneTimeLagWithinItsEstimate)
  {
    const std::string text = R"(
[case]
title = membrane, checked
[geometry]
layers = membrane 100 um
cell_size = 20 um
[region.membrane]
diffusivity = 1e-11 m2/s
[boundary.top]
type = concentration
value = 1 mol/m3
[boundary.bottom]
type = concentration
value = 0 mol/m3
[time]
end = 3000 s
[numerics]
accuracy = 1e-3
[output]
fields = false
time_lag.through = bottom
)";
    const RunRecord record = run(describe(text, "accuracy_membrane"));
    expect_honest(record, {{"time_lag.through", 1e-8 / (6 * 1e-11)}}, 1e-3, "membrane");
  }

  // 6. Semi-infinite medium with surface mass transfer, -D dc/dx = k (cs - c) at x = 0, D = 1,
  // k = 1 (H = 1): c/cs = erfc(eta) - exp(H x + H^2 D t) erfc(eta + H sqrt(D t)) (Carslaw & Jaeger,
  // Conduction of Heat in Solids, 2nd ed. 1959, sec. 2.7; Crank 1975 ch. 3). At t = 1:
  // c(0) = 0.5724164238, c(1) = 0.2290491480 (REFERENCES.md section 2).
  TEST(AccuracyCheck, SurfaceTransferPointsWithinTheirEstimates)
  {
    const std::string text = R"(
[case]
title = transfer, checked
[geometry]
layers = medium 25 m
cell_size = 0.25 m
[region.medium]
diffusivity = 1 m2/s
[boundary.top]
type = transfer
coefficient = 1 m/s
ambient = 1 mol/m3
[time]
end = 1 s
[numerics]
accuracy = 1e-3
[output]
fields = false
point.surface = 0 m
point.inside = 1 m
)";
    const RunRecord record = run(describe(text, "accuracy_transfer"));
    expect_honest(record, {{"point.surface.final", 0.5724164238}, {"point.inside.final", 0.2290491480}}, 1e-3,
                  "transfer");
  }

  // accuracy = off: one solve, no estimates (the numbers are said to be unchecked).
  TEST(AccuracyCheck, OffGivesOneUncheckedSolve)
  {
    const std::string text = R"(
[case]
title = unchecked
[geometry]
layers = medium 1 m
cell_size = 0.1 m
[region.medium]
diffusivity = 1e-3 m2/s
[boundary.top]
type = concentration
value = 1 mol/m3
[time]
end = 10 s
[numerics]
accuracy = off
[output]
fields = false
point.p = 0.05 m
)";
    const RunRecord record = run(describe(text, "accuracy_off"));
    ASSERT_EQ(record.status, "completed");
    EXPECT_EQ(record.accuracy.requested, 0.0);
    EXPECT_FALSE(record.accuracy.checked);
    EXPECT_EQ(record.accuracy.solves.size(), 1u);
    EXPECT_TRUE(record.accuracy.estimates.empty());
  }
} // namespace fickcast::testing
