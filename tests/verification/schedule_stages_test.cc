// Temperature schedules (Arrhenius) and stages: the "Dt budget" equivalence, and a
// pre-deposition followed by a drive-in against the limited-source Gaussian.
#include "case_runner.h"
#include "csv_table.h"

#include <boost/math/constants/constants.hpp>
#include <boost/math/quadrature/gauss_kronrod.hpp>
#include <boost/math/special_functions/erf.hpp>

#include <gtest/gtest.h>

#include <cmath>
#include <cstdio>

namespace fickcast::testing
{
  namespace
  {
    constexpr double boltzmann_ev = 8.617333262e-5; // eV/K, CODATA 2018 (exact from k and e)
    // Boron in silicon (intrinsic), D0 = 0.76 cm2/s, Ea = 3.46 eV: values from memory, as listed in
    // tests/verification/REFERENCES.md, "Schedules and stages" (Fair's model as tabulated by Plummer, Deal &
    // Griffin, Silicon VLSI Technology, 2000, ch. 7). They only set the scale here; the checks do not rest on them.
    double boron(const double kelvin)
    {
      return 0.76e-4 * std::exp(-3.46 / (boltzmann_ev * kelvin));
    }
  } // namespace

  // For a diffusivity uniform in space, D(T(t)) only rescales time: the solution at time t equals
  // the constant-D solution at the same integral of D dt (an exact change of time variable; the
  // "Dt budget" of process engineering, e.g. Plummer et al. 2000 ch. 7). Schedule: 800 degC,
  // ramp 10 degC/min to 1100 degC, hold 30 min, ramp 5 degC/min to 900 degC.
  TEST(Schedule, RampHoldRampEqualsConstantDiffusivityAtTheSameDtBudget)
  {
    const std::string common = R"(
[geometry]
layers = silicon 4 um
cell_size = 20 nm
grade_toward = top
grading = 1.03
[boundary.top]
type = concentration
value = 1e20 1/cm3
[output]
fields = false
point.a = 0.05 um
point.b = 0.15 um
point.c = 0.3 um
)";
    const std::string scheduled = "[case]\ntitle = schedule\n" + common +
                                  "[region.silicon]\ndiffusivity_prefactor = 0.76 cm2/s\nactivation_energy = 3.46 eV\n"
                                  "[temperature]\nschedule = 800 degC, ramp 10 degC/min to 1100 degC, hold 30 min, "
                                  "ramp 5 degC/min to 900 degC\n[time]\nend = 150 min\ntolerance = 1e-7\n";
    // Integral of D dt over the schedule, by Gauss-Kronrod quadrature per segment (Boost.Math).
    const double t1 = 30 * 60, t2 = t1 + 30 * 60, t3 = t2 + 40 * 60, t4 = 150 * 60;
    auto kelvin = [&](double t) {
      if (t < t1)
        return 1073.15 + 300.0 * t / t1;
      if (t < t2)
        return 1373.15;
      if (t < t3)
        return 1373.15 - 200.0 * (t - t2) / (t3 - t2);
      return 1173.15;
    };
    using boost::math::quadrature::gauss_kronrod;
    double budget = 0;
    for (const auto &[a, b] : {std::pair<double, double>{0, t1}, {t1, t2}, {t2, t3}, {t3, t4}})
      budget += gauss_kronrod<double, 61>::integrate([&](double t) { return boron(kelvin(t)); }, a, b, 15, 1e-14);
    const double d_hold = boron(1373.15);
    char equivalent[64];
    std::snprintf(equivalent, sizeof(equivalent), "%.17g", budget / d_hold);
    char exact_d[64];
    std::snprintf(exact_d, sizeof(exact_d), "%.17g", d_hold);
    const std::string constant_exact = "[case]\ntitle = constant\n" + common +
                                       "[region.silicon]\ndiffusivity = " + exact_d +
                                       " m2/s\n[time]\nend = " + equivalent + " s\ntolerance = 1e-7\n";
    const RunRecord a = run(describe(scheduled, "schedule_ramp"));
    const RunRecord b = run(describe(constant_exact, "schedule_constant"));
    ASSERT_EQ(a.status, "completed");
    ASSERT_EQ(b.status, "completed");
    for (std::size_t k = 0; k < a.points.size(); ++k)
      {
        std::printf("schedule: point %s %.10e vs constant-D %.10e (relative %.2e)\n", a.points[k].name.c_str(),
                    a.points[k].final_value, b.points[k].final_value,
                    a.points[k].final_value / b.points[k].final_value - 1);
        EXPECT_NEAR(a.points[k].final_value / b.points[k].final_value, 1.0, 2e-9) << a.points[k].name; // 4.2e-10
      }
    // And both against erfc with sqrt(Dt) = sqrt(budget) (Crank 1975 ch. 2-3): discretisation only.
    const double ns = 1e26;
    for (std::size_t k = 0; k < a.points.size(); ++k)
      {
        const double x = std::vector<double>{0.05e-6, 0.15e-6, 0.3e-6}[k];
        const double exact = ns * boost::math::erfc(x / (2 * std::sqrt(budget)));
        std::printf("schedule: point %s against erfc: relative %.2e\n", a.points[k].name.c_str(),
                    a.points[k].final_value / exact - 1);
        EXPECT_NEAR(a.points[k].final_value / exact, 1.0, 1e-3) << a.points[k].name;
      }
  }

  // Two stages: pre-deposition (constant surface concentration Ns for t1: the erfc profile, dose
  // Q = 2 Ns sqrt(D1 t1 / pi)) then drive-in with a sealed surface for t2. The exact drive-in
  // profile is the pre-deposition profile spread by the heat kernel with a mirror image across the
  // sealed surface: N(x) = integral_0^inf Ns erfc(s / (2 sqrt(D1 t1))) [G(x - s) + G(x + s)] ds,
  // G(z) = exp(-z^2 / (4 D2 t2)) / sqrt(4 pi D2 t2) (Carslaw & Jaeger 1959 sec. 2.2, method of
  // images for a non-conducting surface; Crank 1975 eq. 2.15), evaluated here by adaptive
  // Gauss-Kronrod quadrature (Boost.Math). The limited-source Gaussian (Jaeger, Introduction to
  // Microelectronic Fabrication, 2nd ed. 2002, ch. 4) is printed beside it: at this D2 t2 / D1 t1
  // (about 99) it is itself 0.3 % off (tests/verification/REFERENCES.md, "Schedules and stages").
  TEST(Stages, PredepositionThenDriveInMatchesTheExactTwoStepProfile)
  {
    const std::string text = R"(
[case]
title = two-step boron
[geometry]
layers = silicon 10 um
cell_size = 5 nm
grade_toward = top
grading = 1.03
[region.silicon]
diffusivity_prefactor = 0.76 cm2/s
activation_energy = 3.46 eV
[stage.predep]
duration = 1 h
temperature = 1000 degC
boundary.top.type = concentration
boundary.top.value = 1e20 1/cm3
[stage.drive]
duration = 10 h
temperature = 1100 degC
boundary.top.type = sealed
[time]
tolerance = 1e-8
[output]
fields = false
times = 1 h
point.surface = 0 um
depth.junction = 1e16 1/cm3
)";
    const CaseDescription description = describe(text, "two_step");
    ASSERT_EQ(description.stages.size(), 2u);
    const RunRecord record = run(description);
    ASSERT_EQ(record.status, "completed");
    const double pi = boost::math::constants::pi<double>();
    const double dt1 = boron(1273.15) * 3600, dt2 = boron(1373.15) * 36000;
    const double ns = 1e26; // 1e20 cm^-3 in m^-3
    const double dose = 2 * ns * std::sqrt(dt1 / pi);
    const CsvTable series = read_csv(description.output.folder + "/series.csv");
    const auto &time = series.column("time");
    const auto &amount = series.column("amount.total");
    const std::size_t after_predep =
      std::find_if(time.begin(), time.end(), [](double t) { return std::abs(t - 3600) < 1e-6; }) - time.begin();
    ASSERT_LT(after_predep, time.size());
    std::printf("two-step: dose after pre-deposition %.6e m^-2 (erfc dose %.6e), at the end %.6e\n",
                amount[after_predep], dose, amount.back());
    EXPECT_NEAR(amount[after_predep] / dose, 1.0, 4e-5);          // measured 8.6e-6
    EXPECT_NEAR(amount.back() / amount[after_predep], 1.0, 1e-9); // sealed: the dose is kept
    const double q = amount.back();
    // Exact two-step profile by quadrature, and its junction by bisection on a monotone profile.
    auto exact_profile = [&](const double x) {
      auto integrand = [&](const double s) {
        const double g = 1 / std::sqrt(4 * pi * dt2);
        return ns * boost::math::erfc(s / (2 * std::sqrt(dt1))) * g *
               (std::exp(-(x - s) * (x - s) / (4 * dt2)) + std::exp(-(x + s) * (x + s) / (4 * dt2)));
      };
      const double reach = x + 14 * std::sqrt(dt2);
      return boost::math::quadrature::gauss_kronrod<double, 61>::integrate(integrand, 0.0, reach, 15, 1e-13);
    };
    const double nb = 1e22; // 1e16 cm^-3
    double low = 0, high = 20 * std::sqrt(dt2);
    for (int k = 0; k < 200 && high - low > 1e-15; ++k)
      (exact_profile(0.5 * (low + high)) > nb ? low : high) = 0.5 * (low + high);
    const double exact_junction = 0.5 * (low + high), exact_surface = exact_profile(0);
    const double gauss_surface = q / std::sqrt(pi * dt2);
    const double gauss_junction = 2 * std::sqrt(dt2) * std::sqrt(std::log(q / (nb * std::sqrt(pi * dt2))));
    std::printf("two-step: surface %.8e vs exact %.8e (relative %.2e; Gaussian limit %.6e)\n",
                record.points[0].final_value, exact_surface, record.points[0].final_value / exact_surface - 1,
                gauss_surface);
    std::printf("two-step: junction %.8e m vs exact %.8e m (relative %.2e; Gaussian limit %.6e m)\n",
                record.depths[0].depths.back(), exact_junction, record.depths[0].depths.back() / exact_junction - 1,
                gauss_junction);
    // Measured with step tolerance 1e-8: surface 4.7e-6, junction 3.4e-5 (at 1e-6: 9.7e-5 and
    // 1.5e-4; a junction four decades under the surface value needs the tighter steps).
    EXPECT_NEAR(record.points[0].final_value / exact_surface, 1.0, 1e-4);
    EXPECT_NEAR(record.depths[0].depths.back() / exact_junction, 1.0, 1e-4);
  }
} // namespace fickcast::testing
