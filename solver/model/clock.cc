#include "model/clock.h"

#include <boost/math/quadrature/gauss_kronrod.hpp>

#include <algorithm>
#include <cmath>
#include <stdexcept>

namespace fickcast
{
  Clock::Clock() = default;

  Clock::Clock(std::function<double(double)> phi, std::vector<double> breakpoints, const double end)
    : phi_(std::move(phi))
  {
    breaks_.push_back(0.0);
    std::sort(breakpoints.begin(), breakpoints.end());
    for (const double b : breakpoints)
      if (b > breaks_.back() && b < end)
        breaks_.push_back(b);
    breaks_.push_back(end);
    tau_breaks_.push_back(0.0);
    for (std::size_t k = 1; k < breaks_.size(); ++k)
      tau_breaks_.push_back(tau_breaks_.back() + integral(breaks_[k - 1], breaks_[k]));
  }

  double Clock::integral(const double a, const double b) const
  {
    if (b <= a)
      return 0;
    double error = 0;
    const double value = boost::math::quadrature::gauss_kronrod<double, 31>::integrate(
      [this](double s) { return phi_(s); }, a, b, 15, 1e-13, &error);
    return value;
  }

  double Clock::tau(const double t) const
  {
    if (!phi_)
      return t;
    if (t >= breaks_.back())
      return tau_breaks_.back() + (t - breaks_.back()) * phi_(breaks_.back());
    const auto upper = std::upper_bound(breaks_.begin(), breaks_.end(), t);
    const std::size_t k = static_cast<std::size_t>(upper - breaks_.begin()) - 1;
    return tau_breaks_[k] + integral(breaks_[k], t);
  }

  double Clock::time(const double tau_value) const
  {
    if (!phi_)
      return tau_value;
    if (tau_value >= tau_breaks_.back())
      return breaks_.back() + (tau_value - tau_breaks_.back()) / phi_(breaks_.back());
    const auto upper = std::upper_bound(tau_breaks_.begin(), tau_breaks_.end(), tau_value);
    const std::size_t k = static_cast<std::size_t>(upper - tau_breaks_.begin()) - 1;
    // Solve int_{b_k}^t phi = tau - tau_k by bisection safeguarded Newton on [b_k, b_{k+1}].
    double lo = breaks_[k], hi = breaks_[k + 1];
    const double target = tau_value - tau_breaks_[k];
    double t = lo + (hi - lo) * std::clamp(target / std::max(tau_breaks_[k + 1] - tau_breaks_[k], 1e-300), 0.0, 1.0);
    for (int iteration = 0; iteration < 100; ++iteration)
      {
        const double f = integral(breaks_[k], t) - target;
        if (std::abs(f) <= 1e-14 * std::max(tau_breaks_.back(), 1e-300))
          break;
        if (f > 0)
          hi = t;
        else
          lo = t;
        const double newton = t - f / phi_(t);
        t = (newton > lo && newton < hi) ? newton : 0.5 * (lo + hi);
        if (hi - lo < 1e-15 * std::max(1.0, std::abs(hi)))
          break;
      }
    return t;
  }
} // namespace fickcast
