// Temperature against time: constant, or piecewise-linear ramps and holds.
#pragma once

#include <string>
#include <vector>

namespace fickcast
{
  /**
   * A piecewise-linear temperature history: points (time, temperature) in s and K, constant
   * before the first and after the last point.
   */
  struct TemperatureSchedule
  {
    std::vector<double> times;        ///< s, increasing
    std::vector<double> temperatures; ///< K

    bool empty() const { return times.empty(); }
    /// Temperature at @p t (K).
    double at(double t) const;
    /// Times where the slope changes (kinks), for step landing.
    const std::vector<double> &kinks() const { return times; }
    /// Appends @p other shifted by @p offset (used to chain stages).
    void append(const TemperatureSchedule &other, double offset);
    /// Duration from the first to the last point.
    double duration() const { return times.empty() ? 0 : times.back() - times.front(); }
  };

  /**
   * Reads `800 degC, ramp 10 degC/min to 1100 degC, hold 1 h, ramp to 800 degC in 2 h`: a start
   * temperature, then any number of `hold DURATION`, `ramp RATE to TEMPERATURE` and
   * `ramp to TEMPERATURE in DURATION` items. A single temperature is a constant schedule.
   * Temperatures in degC or K (a bare number is K), rates such as degC/min or K/s (the sign
   * follows from the target). Throws UnitError naming the item that is wrong.
   */
  TemperatureSchedule parse_temperature_schedule(const std::string &text);
} // namespace fickcast
