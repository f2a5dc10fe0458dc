#include "studies/distributions.h"

#include "case/quantity_text.h"
#include "case/units.h"

#include <boost/math/distributions/lognormal.hpp>
#include <boost/math/distributions/normal.hpp>
#include <boost/math/distributions/triangular.hpp>
#include <boost/math/distributions/uniform.hpp>

#include <cmath>
#include <random>

namespace fickcast
{
  double Distribution::quantile(const double p) const
  {
    switch (kind)
      {
        case Kind::normal:
          return boost::math::quantile(boost::math::normal_distribution<double>(a, b), p);
        case Kind::lognormal:
          return boost::math::quantile(boost::math::lognormal_distribution<double>(std::log(a), b), p);
        case Kind::uniform:
          return boost::math::quantile(boost::math::uniform_distribution<double>(a, b), p);
        case Kind::triangular:
          break;
      }
    return boost::math::quantile(boost::math::triangular_distribution<double>(a, b, c), p);
  }

  double Distribution::mean() const
  {
    switch (kind)
      {
        case Kind::normal:
          return a;
        case Kind::lognormal:
          return a * std::exp(0.5 * b * b);
        case Kind::uniform:
          return 0.5 * (a + b);
        case Kind::triangular:
          break;
      }
    return (a + b + c) / 3;
  }

  double Distribution::median() const
  {
    return quantile(0.5);
  }

  double Distribution::standard_deviation() const
  {
    switch (kind)
      {
        case Kind::normal:
          return b;
        case Kind::lognormal:
          return a * std::exp(0.5 * b * b) * std::sqrt(std::exp(b * b) - 1);
        case Kind::uniform:
          return (b - a) / std::sqrt(12.0);
        case Kind::triangular:
          break;
      }
    return std::sqrt((a * a + b * b + c * c - a * b - a * c - b * c) / 18);
  }

  Distribution Distribution::parse(const std::string &text)
  {
    const auto open = text.find('('), close = text.rfind(')');
    if (open == std::string::npos || close == std::string::npos || close < open)
      throw UnitError("expected normal(mean, sd), lognormal(median, sigma), uniform(low, high) or "
                      "triangular(low, mode, high), found '" +
                      text + "'");
    std::string name = text.substr(0, open);
    name.erase(0, name.find_first_not_of(" \t"));
    name.erase(name.find_last_not_of(" \t") + 1);
    const auto arguments = split_list(text.substr(open + 1, close - open - 1));
    Distribution d;
    std::size_t expected = 2;
    if (name == "normal")
      d.kind = Kind::normal;
    else if (name == "lognormal")
      d.kind = Kind::lognormal;
    else if (name == "uniform")
      d.kind = Kind::uniform;
    else if (name == "triangular")
      {
        d.kind = Kind::triangular;
        expected = 3;
      }
    else
      throw UnitError("expected a distribution normal, lognormal, uniform or triangular, found '" + name + "'");
    if (arguments.size() != expected)
      throw UnitError("expected " + std::to_string(expected) + " arguments for " + name + ", found " +
                      std::to_string(arguments.size()) + " in '" + text + "'");
    const QuantityText first = split_quantity(arguments[0], false);
    d.unit = first.unit;
    d.a = first.number;
    // A later argument in the first argument's unit. A spread (standard deviation) converts as a
    // difference, a bound or mode as a value: they differ for units with an offset (degC and K).
    auto in_unit = [&](const std::string &argument, const bool difference) {
      const QuantityText q = split_quantity(argument, false);
      if (q.unit.empty() || q.unit == d.unit)
        return q.number;
      if (d.unit.empty())
        throw UnitError("expected a unit on the first argument too (it sets the unit), found '" + text + "'");
      const UnitSystem &units = UnitSystem::instance();
      const std::string si = units.first_convertible(
        d.unit, {"m", "s",     "m2/s",  "m/s", "1/s", "kg/m3", "mol/m3", "1/m3",      "1",          "K",
                 "J", "J/mol", "m3/kg", "m3",  "m2",  "kg",    "mol",    "kg/(m2 s)", "mol/(m2 s)", "1/(m2 s)"});
      if (si.empty() || !units.convertible(q.unit, si))
        throw UnitError("cannot relate '" + q.unit + "' to '" + d.unit + "' in '" + text + "'");
      const double zero = units.to_si(0.0, d.unit, si), scale = units.to_si(1.0, d.unit, si) - zero;
      const double value = units.to_si(q.number, q.unit, si) - (difference ? units.to_si(0.0, q.unit, si) : zero);
      return value / scale;
    };
    if (d.kind == Kind::lognormal)
      {
        const QuantityText sigma = split_quantity(arguments[1], false);
        if (!sigma.unit.empty())
          throw UnitError("expected the standard deviation of ln as a pure number, found '" + arguments[1] + "'");
        d.b = sigma.number;
      }
    else
      d.b = in_unit(arguments[1], d.kind == Kind::normal);
    if (expected == 3)
      d.c = in_unit(arguments[2], false);
    switch (d.kind)
      {
        case Kind::normal:
          if (!(d.b > 0))
            throw UnitError("expected a standard deviation > 0 in '" + text + "'");
          break;
        case Kind::lognormal:
          if (!(d.a > 0) || !(d.b > 0))
            throw UnitError("expected a median > 0 and a standard deviation of ln > 0 in '" + text + "'");
          break;
        case Kind::uniform:
          if (!(d.b > d.a))
            throw UnitError("expected low < high in '" + text + "'");
          break;
        case Kind::triangular:
          if (!(d.a < d.c) || d.b < d.a || d.b > d.c)
            throw UnitError("expected low <= mode <= high with low < high in '" + text + "'");
          break;
      }
    return d;
  }

  std::vector<std::vector<double>> latin_hypercube(const std::vector<Distribution> &inputs, const unsigned int n,
                                                   const unsigned long seed)
  {
    std::mt19937_64 engine(seed);
    // Uniform in [0, 1) from the engine's 53 high bits (not std::uniform_real_distribution, whose
    // algorithm differs between standard libraries).
    auto uniform = [&engine]() { return static_cast<double>(engine() >> 11) * 0x1.0p-53; };
    std::vector<std::vector<double>> values(n, std::vector<double>(inputs.size()));
    for (std::size_t j = 0; j < inputs.size(); ++j)
      {
        std::vector<unsigned int> stratum(n);
        for (unsigned int i = 0; i < n; ++i)
          stratum[i] = i;
        for (unsigned int i = n - 1; i > 0; --i)
          {
            const auto k = static_cast<unsigned int>(uniform() * (i + 1));
            std::swap(stratum[i], stratum[std::min(k, i)]);
          }
        for (unsigned int i = 0; i < n; ++i)
          {
            double p = (stratum[i] + uniform()) / n;
            p = std::min(std::max(p, 1e-12), 1 - 1e-12);
            values[i][j] = inputs[j].quantile(p);
          }
      }
    return values;
  }
} // namespace fickcast
