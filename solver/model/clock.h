// The integration clock: tau = int phi dt, with phi the relative diffusivity of a region whose
// diffusivity changes in time only (temperature schedules). Stepping in tau makes such runs match
// the constant-diffusivity run with the same integral of D dt.
#pragma once

#include <functional>
#include <vector>

namespace fickcast
{
  /**
   * tau(t) = int_0^t phi(s) ds with phi > 0, and its inverse. phi = 1 gives tau = t. The integral
   * is evaluated by adaptive Gauss-Kronrod quadrature (Boost.Math) between breakpoints where phi
   * may have kinks (schedule points, stage starts), and cached at them.
   */
  class Clock
  {
  public:
    /// The identity clock (tau = t).
    Clock();
    /// A clock with rate @p phi (> 0 on [0, end]) and kinks at @p breakpoints.
    Clock(std::function<double(double)> phi, std::vector<double> breakpoints, double end);

    bool is_identity() const { return !phi_; }
    double rate(double t) const { return phi_ ? phi_(t) : 1.0; }
    double tau(double t) const;
    double time(double tau) const;

  private:
    double integral(double a, double b) const;

    std::function<double(double)> phi_;
    std::vector<double> breaks_;     ///< 0, kinks..., end
    std::vector<double> tau_breaks_; ///< tau at each break
  };
} // namespace fickcast
