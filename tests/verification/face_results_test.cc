// Results through faces (output.flux.*, crossed.*, steady_flux.*, peak_flux.*, flux_limit.*,
// crossed_limit.*) against published series solutions for a sheet, with the accuracy check on:
// each result must lie within 1e-3 of the exact value and within three times its own estimate.
#include "case_runner.h"

#include <boost/math/constants/constants.hpp>

#include <gtest/gtest.h>

#include <cmath>
#include <cstdio>
#include <functional>
#include <map>

namespace fickcast::testing
{
  namespace
  {
    constexpr double pi = boost::math::constants::pi<double>();

    /// First t in (low, high) where f(t) = target for an increasing f (bisection).
    double solve_increasing(const std::function<double(double)> &f, const double target, double low, double high)
    {
      for (int k = 0; k < 200; ++k)
        {
          const double middle = 0.5 * (low + high);
          (f(middle) < target ? low : high) = middle;
        }
      return 0.5 * (low + high);
    }

    /// The named results of @p r through faces (and time lags), with their estimates.
    std::map<std::string, std::pair<double, double>> face_values(const RunRecord &r)
    {
      std::map<std::string, std::pair<double, double>> values;
      const auto estimate = [&](const std::string &name) {
        const auto found = r.accuracy.estimates.find(name);
        return found == r.accuracy.estimates.end() ? std::nan("") : found->second;
      };
      for (const auto &face : r.face_results)
        {
          values[face.full_name()] = {face.value, estimate(face.full_name())};
          if (face.prefix == "peak_flux")
            values[face.full_name() + ".time"] = {face.when, estimate(face.full_name() + ".time")};
        }
      for (const auto &lag : r.time_lags)
        values["time_lag." + lag.name] = {lag.time_lag, estimate("time_lag." + lag.name)};
      return values;
    }

    /// The check every result gets: within 1e-3 of the exact value (the accuracy asked) and
    /// within three times its estimated error (the estimate is honest).
    void expect_exact(const std::map<std::string, std::pair<double, double>> &values, const std::string &name,
                      const double exact)
    {
      ASSERT_EQ(values.count(name), 1u) << name;
      const auto [value, estimate] = values.at(name);
      const double error = std::abs(value - exact);
      std::printf("%-22s %.8g exact %.8g: error %.2e relative, estimate %.2e\n", name.c_str(), value, exact,
                  error / std::abs(exact), estimate / std::abs(exact));
      EXPECT_LE(error, 1e-3 * std::abs(exact)) << name;
      ASSERT_TRUE(std::isfinite(estimate)) << name;
      EXPECT_LE(error, 3 * estimate + 1e-12 * std::abs(exact)) << name << ": the estimate does not cover the error";
    }
  } // namespace

  // A membrane 0 < x < l, initially empty, held at C1 on its upper face and at zero on its lower
  // face from t = 0 (Crank, The Mathematics of Diffusion, 2nd ed., 1975, sec. 4.3, eqs. 4.22-4.24;
  // equation numbers from memory). The amount out through x = l by time t (eq. 4.24a):
  //   Q(t) = D C1 t / l - l C1 / 6 - (2 l C1 / pi^2) sum_n (-1)^n / n^2 exp(-D n^2 pi^2 t / l^2),
  // its rate J_out = dQ/dt = (D C1 / l) (1 + 2 sum_n (-1)^n exp(-D n^2 pi^2 t / l^2)), the steady
  // rate D C1 / l and the time lag l^2 / (6 D) (eq. 4.24b); the rate in through x = 0, from the
  // gradient of the series solution (eq. 4.22): J_in = (D C1 / l) (1 + 2 sum_n exp(-D n^2 pi^2 t / l^2)).
  TEST(FaceResults, MembraneRatesAndAmountsMatchCrankSheet)
  {
    const double D = 1e-10, l = 1e-3, C1 = 1e-3; // m2/s, m, kg/m3 (1 mg/L)
    const auto series = [&](const double t, const bool alternating) {
      double sum = 0;
      for (int n = 1; n <= 400; ++n)
        sum += (alternating && n % 2 == 1 ? -1.0 : 1.0) * std::exp(-D * n * n * pi * pi * t / (l * l));
      return sum;
    };
    const auto amount_out = [&](const double t) {
      double sum = 0;
      for (int n = 1; n <= 400; ++n)
        sum += (n % 2 == 1 ? -1.0 : 1.0) / (n * n) * std::exp(-D * n * n * pi * pi * t / (l * l));
      return D * C1 * t / l - l * C1 / 6 - 2 * l * C1 / (pi * pi) * sum;
    };
    const auto rate_out = [&](const double t) { return D * C1 / l * (1 + 2 * series(t, true)); };
    const auto rate_in = [&](const double t) { return D * C1 / l * (1 + 2 * series(t, false)); };

    const CaseDescription description = describe(R"(
[case]
title = membrane results through faces
[geometry]
layers = membrane 1 mm
cell_size = 0.1 mm
[region.membrane]
diffusivity = 1e-10 m2/s
[boundary.top]
type = concentration
value = 1 mg/L
[boundary.bottom]
type = concentration
value = 0 mg/L
[time]
end = 10 h
[numerics]
accuracy = 1e-3
[output]
time_lag.lag = bottom
steady_flux.base = out through bottom
flux.base_early = out through bottom at 15 min
flux.top_early = in through top at 15 min
crossed.base_1h = out through bottom by 1 h
crossed_limit.base = out through bottom reaches 0.5 mg/m2
)",
                                                 "face_results_membrane");
    const RunRecord r = run(description);
    ASSERT_EQ(r.status, "completed");
    EXPECT_TRUE(r.accuracy.met);
    const auto values = face_values(r);
    expect_exact(values, "steady_flux.base", D * C1 / l);
    expect_exact(values, "time_lag.lag", l * l / (6 * D));
    expect_exact(values, "flux.base_early", rate_out(900));
    expect_exact(values, "flux.top_early", rate_in(900));
    expect_exact(values, "crossed.base_1h", amount_out(3600));
    expect_exact(values, "crossed_limit.base", solve_increasing(amount_out, 0.5e-6, 1, 36000));
    for (const auto &face : r.face_results)
      if (face.prefix == "steady_flux")
        EXPECT_TRUE(face.steady);
  }

  // A pulse through a sheet 0 < x < l: C = c0 in 0 < x < a at t = 0, zero elsewhere, no flux at
  // x = 0 and C = 0 at x = l. By separation of variables (Crank 1975 sec. 4.3; Carslaw & Jaeger,
  // Conduction of Heat in Solids, 1959, sec. 3.3; from memory) C = sum_n A_n cos(k_n x)
  // exp(-D k_n^2 t), k_n = (n + 1/2) pi / l, A_n = 2 c0 sin(k_n a) / (l k_n); the rate out through
  // x = l is J = D sum_n A_n k_n (-1)^n exp(-D k_n^2 t), the amount out by t is
  // sum_n A_n (-1)^n (1 - exp(-D k_n^2 t)) / k_n. The rate rises, peaks and falls: its peak and
  // when it comes are found from the series by golden-section search.
  TEST(FaceResults, PulsePeakRateAndItsTimeMatchSeries)
  {
    const double D = 1e-10, l = 1e-3, a = 1e-4, c0 = 1e-3;
    const auto term = [&](const int n, double &k) {
      k = (n + 0.5) * pi / l;
      return 2 * c0 * std::sin(k * a) / (l * k) * (n % 2 == 0 ? 1.0 : -1.0);
    };
    const auto rate = [&](const double t) {
      double sum = 0, k = 0;
      for (int n = 0; n < 3000; ++n)
        {
          const double A = term(n, k);
          sum += A * k * std::exp(-D * k * k * t);
        }
      return D * sum;
    };
    const auto amount = [&](const double t) {
      double sum = 0, k = 0;
      for (int n = 0; n < 3000; ++n)
        {
          const double A = term(n, k);
          sum += A * (1 - std::exp(-D * k * k * t)) / k;
        }
      return sum;
    };
    double low = 100, high = 36000;
    const double g = (std::sqrt(5.0) - 1) / 2;
    for (int k = 0; k < 200; ++k)
      {
        const double t1 = high - g * (high - low), t2 = low + g * (high - low);
        (rate(t1) > rate(t2) ? high : low) = rate(t1) > rate(t2) ? t2 : t1;
      }
    const double peak_time = 0.5 * (low + high);

    const CaseDescription description = describe(R"(
[case]
title = pulse through a sheet
[geometry]
layers = source 0.1 mm, body 0.9 mm
cell_size = 0.05 mm
[region.source]
diffusivity = 1e-10 m2/s
initial = 1 mg/L
[region.body]
diffusivity = 1e-10 m2/s
[boundary.bottom]
type = concentration
value = 0 mg/L
[time]
end = 10 h
[numerics]
accuracy = 1e-3
accuracy_solves = 4
[output]
peak_flux.base = out through bottom
crossed.base = out through bottom by 2 h
flux_limit.base = out through bottom reaches 0.01 mg/m2/h
)",
                                                 "face_results_pulse");
    const RunRecord r = run(description);
    ASSERT_EQ(r.status, "completed");
    const auto values = face_values(r);
    expect_exact(values, "peak_flux.base", rate(peak_time));
    expect_exact(values, "peak_flux.base.time", peak_time);
    expect_exact(values, "crossed.base", amount(7200));
    expect_exact(values, "flux_limit.base", solve_increasing(rate, 0.01e-6 / 3600, 1, peak_time));
    for (const auto &face : r.face_results)
      EXPECT_TRUE(face.note.empty()) << face.full_name() << ": " << face.note;
  }
} // namespace fickcast::testing
