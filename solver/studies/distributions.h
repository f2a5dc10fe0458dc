// Probability distributions of uncertain inputs and Latin hypercube sampling.
#pragma once

#include <string>
#include <vector>

namespace fickcast
{
  /// One input distribution, in the unit of its first argument.
  struct Distribution
  {
    enum class Kind
    {
      normal,    ///< normal(mean, standard deviation)
      lognormal, ///< lognormal(median, standard deviation of ln): ln X ~ normal(ln median, sigma)
      uniform,   ///< uniform(low, high)
      triangular ///< triangular(low, mode, high)
    };
    Kind kind = Kind::normal;
    double a = 0, b = 0, c = 0; ///< parameters in `unit` (sigma of ln is a pure number)
    std::string unit;           ///< unit text of the first argument (empty: SI or a pure number)

    /// The value at cumulative probability @p p in (0, 1) (Boost.Math quantiles).
    double quantile(double p) const;
    double mean() const;
    double median() const;
    double standard_deviation() const;

    /// Reads `normal(2e-10 m2/s, 2e-11 m2/s)` and the like; later arguments may use other units
    /// of the same dimension. Throws UnitError with a one-line reason.
    static Distribution parse(const std::string &text);
  };

  /**
   * Latin hypercube sample of @p n points: for each input its range of probability is cut into n
   * equal strata, each stratum gets one point at a uniformly random position within it, and the
   * strata are paired across inputs by independent random permutations (Fisher-Yates with a
   * 64-bit Mersenne twister seeded with @p seed, so the same seed gives the same sample on any
   * platform). Returns values[sample][input] in each distribution's unit.
   */
  std::vector<std::vector<double>> latin_hypercube(const std::vector<Distribution> &inputs, unsigned int n,
                                                   unsigned long seed);
} // namespace fickcast
