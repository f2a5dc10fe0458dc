// Comparing results folders: a folder against itself gives zero; a run with a changed
// diffusivity gives the difference the two erfc solutions predict.
#include "case_runner.h"

#include "results_comparison.h"

#include <boost/math/special_functions/erf.hpp>

#include <gtest/gtest.h>

#include <cmath>
#include <cstdio>
#include <string>

namespace fickcast::post
{
  namespace
  {
    std::string erfc_case(const std::string &diffusivity)
    {
      return R"(
[case]
title = erfc for comparison
[geometry]
layers = medium 12 m
cell_size = 0.05 m
[region.medium]
diffusivity = )" +
             diffusivity +
             R"(
[boundary.top]
type = concentration
value = 1 mol/m3
[time]
end = 1 s
tolerance = 1e-6
[output]
times = 0.25 s
)";
    }

    /// max over x of |erfc(x / 2 sqrt(D1 t)) - erfc(x / 2 sqrt(D2 t))| (fine scan, 0..12 m).
    double erfc_difference(const double d1, const double d2, const double t)
    {
      double largest = 0;
      for (int i = 0; i <= 120000; ++i)
        {
          const double x = 1e-4 * i;
          largest = std::max(largest, std::abs(boost::math::erfc(x / (2 * std::sqrt(d1 * t))) -
                                               boost::math::erfc(x / (2 * std::sqrt(d2 * t)))));
        }
      return largest;
    }
  } // namespace

  TEST(Comparison, FolderAgainstItselfIsZero)
  {
    const CaseDescription description = testing::describe(erfc_case("1 m2/s"), "post_compare_self");
    ASSERT_EQ(testing::run(description).status, "completed");
    const std::string folder = description.output.folder;
    const Comparison comparison = compare_results(folder, folder, {});
    EXPECT_EQ(comparison.method, "same points");
    ASSERT_EQ(comparison.rows.size(), 3u * 6u); // 3 output times x 6 fields
    for (const auto &row : comparison.rows)
      {
        EXPECT_EQ(row.largest, 0.0) << row.field << " at t = " << row.time;
        EXPECT_GT(row.compared, 0u);
      }
  }

  // Crank, The Mathematics of Diffusion, 2nd ed. (1975), ch. 2-3 (eq. 2.45, number from
  // memory): each run follows C/C0 = erfc(x / 2 sqrt(D t)) to 1e-3 of C0 (the solver's
  // verification tolerance), so the reported largest difference must equal the difference of
  // the two erfc profiles to within 2e-3. With D = 1 and 1.1 m2/s that difference is about
  // 0.023 at every time (it depends on D2/D1 only), well above the 2e-3 band.
  TEST(Comparison, ChangedDiffusivityGivesTheErfcDifference)
  {
    const CaseDescription a = testing::describe(erfc_case("1 m2/s"), "post_compare_a");
    const CaseDescription b = testing::describe(erfc_case("1.1 m2/s"), "post_compare_b");
    ASSERT_EQ(testing::run(a).status, "completed");
    ASSERT_EQ(testing::run(b).status, "completed");
    const Comparison comparison = compare_results(a.output.folder, b.output.folder, {"concentration"});
    ASSERT_EQ(comparison.rows.size(), 3u);
    EXPECT_EQ(comparison.rows[0].largest, 0.0); // t = 0: the same initial state
    for (std::size_t k = 1; k < comparison.rows.size(); ++k)
      {
        const auto &row = comparison.rows[k];
        const double expected = erfc_difference(1.0, 1.1, row.time);
        std::printf("t = %g s: largest concentration difference %.5f, erfc profiles differ by %.5f, at x = %.3f m\n",
                    row.time, row.largest, expected, row.where[0]);
        EXPECT_NEAR(row.largest, expected, 2e-3) << "at t = " << row.time;
        EXPECT_GT(row.largest, 0.01);
        EXPECT_EQ(row.unit, "mol/m3");
        // The largest difference sits near eta = x / 2 sqrt(D t) = 1/sqrt(2) (where d erfc/dD peaks).
        EXPECT_NEAR(row.where[0] / (2 * std::sqrt(row.time)), 1 / std::sqrt(2.0), 0.15);
      }
  }
} // namespace fickcast::post
