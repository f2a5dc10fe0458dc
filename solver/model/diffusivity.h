// The free diffusivity of one region as a function of position, time, temperature and
// concentration: constant, Arrhenius with a temperature schedule, a table against time, or an
// expression.
#pragma once

#include "case/case_description.h"
#include "case/expression.h"

#include <memory>

namespace fickcast
{
  /// Boltzmann constant, J/K, exact (SI Brochure, 9th ed., 2019).
  constexpr double boltzmann_constant = 1.380649e-23;

  /**
   * D(x, y, z, t, c) in m2/s for one region; T is taken from the case's temperature schedule at
   * time t, c is the phase concentration of the region (SI). Arrhenius: D0 exp(-Ea / (k_B T)).
   * The shape of the dependence decides how operators are built: constant, uniform in space but
   * varying in time (a matrix rescaled per step), varying in space (assembled), or depending on c
   * (nonlinear, reassembled every iteration). Not thread-safe (muparser).
   */
  class Diffusivity
  {
  public:
    Diffusivity(const RegionSpec &region, const TemperatureSchedule &temperature);

    /// D at a point, a time and a phase concentration.
    double operator()(double x, double y, double z, double t, double c) const;
    /// dD/dc by a central difference (concentration-dependent regions only).
    double derivative(double x, double y, double z, double t, double c) const;

    bool is_constant() const { return constant_; }
    bool uniform_in_space() const { return !space_; }
    bool depends_on_time() const { return time_; }
    bool depends_on_concentration() const { return concentration_; }

  private:
    const TemperatureSchedule &temperature_;
    double value_ = 0;
    bool arrhenius_ = false;
    double prefactor_ = 0, activation_energy_ = 0;
    TimeTable table_;
    std::shared_ptr<Expression> expression_;
    double scale_ = 1, offset_ = 0;
    bool constant_ = true, space_ = false, time_ = false, concentration_ = false;
  };
} // namespace fickcast
