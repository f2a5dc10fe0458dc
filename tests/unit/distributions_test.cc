// Input distributions and Latin hypercube sampling.
#include "case/units.h"
#include "studies/distributions.h"

#include <gtest/gtest.h>

#include <algorithm>
#include <cmath>
#include <set>

namespace fickcast
{
  // Standard normal quantiles z(0.95) = 1.644853627, z(0.975) = 1.959963985 (Abramowitz & Stegun
  // 1964, Handbook of Mathematical Functions, table 26.5).
  TEST(Distribution, NormalQuantilesMatchTheHandbook)
  {
    const Distribution d = Distribution::parse("normal(2e-10 m2/s, 2e-11 m2/s)");
    EXPECT_EQ(d.unit, "m2/s");
    EXPECT_NEAR((d.quantile(0.95) - 2e-10) / 2e-11, 1.644853627, 1e-9);
    EXPECT_NEAR((d.quantile(0.975) - 2e-10) / 2e-11, 1.959963985, 1e-9);
    EXPECT_NEAR(d.median(), 2e-10, 1e-24);
  }

  // A later argument in another unit of the same dimension is converted to the first's unit; a
  // standard deviation in K on a degC mean converts as a difference (common practice).
  TEST(Distribution, ArgumentsInOtherUnits)
  {
    const Distribution d = Distribution::parse("normal(1 cm, 2 mm)");
    EXPECT_EQ(d.unit, "cm");
    EXPECT_NEAR(d.b, 0.2, 1e-12);
    const Distribution t = Distribution::parse("normal(1050 degC, 5 K)");
    EXPECT_NEAR(t.b, 5, 1e-9);
    const Distribution u = Distribution::parse("uniform(1000 degC, 1400 K)");
    EXPECT_NEAR(u.b, 1400 - 273.15, 1e-9);
  }

  // Lognormal(median m, sigma of ln): median m, quantile at Phi(1) = 0.8413447461 is m e^sigma,
  // mean m exp(sigma^2 / 2) (Johnson, Kotz & Balakrishnan, Continuous Univariate Distributions
  // vol. 1, ch. 14, from memory).
  TEST(Distribution, LognormalByMedianAndSigmaOfLn)
  {
    const Distribution d = Distribution::parse("lognormal(1e-9 m2/s, 0.5)");
    EXPECT_NEAR(d.median() / 1e-9, 1.0, 1e-12);
    EXPECT_NEAR(d.quantile(0.8413447461) / (1e-9 * std::exp(0.5)), 1.0, 1e-9);
    EXPECT_NEAR(d.mean() / (1e-9 * std::exp(0.125)), 1.0, 1e-12);
  }

  // Triangular(a, m, b): F^-1(p) = a + sqrt(p (b - a)(m - a)) below the mode, b - sqrt((1 - p)(b -
  // a)(b - m)) above; mean (a + m + b) / 3 (closed forms, common practice).
  TEST(Distribution, TriangularAndUniformClosedForms)
  {
    const Distribution t = Distribution::parse("triangular(0.2, 0.3, 0.5)");
    EXPECT_NEAR(t.quantile(0.1), 0.2 + std::sqrt(0.1 * 0.3 * 0.1), 1e-12);
    EXPECT_NEAR(t.quantile(0.9), 0.5 - std::sqrt(0.1 * 0.3 * 0.2), 1e-12);
    EXPECT_NEAR(t.mean(), 1.0 / 3, 1e-12);
    const Distribution u = Distribution::parse("uniform(2 mm, 6 mm)");
    EXPECT_NEAR(u.quantile(0.25), 3, 1e-12);
    EXPECT_NEAR(u.standard_deviation(), 4 / std::sqrt(12.0), 1e-12);
  }

  TEST(Distribution, BadTextIsRejectedWithAReason)
  {
    for (const char *bad :
         {"normal(1 m)", "gauss(1, 2)", "normal(1 m, -1 m)", "uniform(3, 1)", "triangular(0, 2, 1)",
          "lognormal(-1, 0.5)", "lognormal(1 m, 0.5 m)", "normal(1, 2 m)", "normal(1 m, 2 s)", "normal 1, 2"})
      EXPECT_THROW(Distribution::parse(bad), UnitError) << bad;
  }

  // Latin hypercube (McKay, Beckman & Conover 1979, Technometrics 21: 239-245): for each input,
  // exactly one of the n points falls in each of the n equal-probability strata.
  TEST(LatinHypercube, OnePointPerStratumAndReproducible)
  {
    const std::vector<Distribution> inputs = {Distribution::parse("uniform(0, 1)"),
                                              Distribution::parse("uniform(0, 1)")};
    const unsigned int n = 50;
    const auto values = latin_hypercube(inputs, n, 42);
    ASSERT_EQ(values.size(), n);
    for (std::size_t j = 0; j < inputs.size(); ++j)
      {
        std::set<unsigned int> strata;
        for (const auto &point : values)
          strata.insert(static_cast<unsigned int>(std::floor(point[j] * n)));
        EXPECT_EQ(strata.size(), n) << "input " << j;
      }
    // The two inputs are paired by different permutations.
    unsigned int same = 0;
    for (const auto &point : values)
      same += std::floor(point[0] * n) == std::floor(point[1] * n) ? 1 : 0;
    EXPECT_LT(same, n / 5);
    EXPECT_EQ(latin_hypercube(inputs, n, 42), values);
    EXPECT_NE(latin_hypercube(inputs, n, 43), values);
  }
} // namespace fickcast
