// Time lags from the flux history through a boundary.
#pragma once

#include "results/run_record.h"

#include <string>
#include <utility>
#include <vector>

namespace fickcast
{
  /// The flux history of one boundary (its id, and (time, inward flux) after each step).
  using FluxHistory = std::pair<unsigned int, std::vector<std::pair<double, double>>>;

  /**
   * One record per named time lag (@p specs: name, boundary): the intercept on the time axis of
   * the asymptote Q = J (t - t_lag) of the amount through the boundary (the time-lag method,
   * common practice), from the last flux J and the amount @p entered per
   * boundary id at the end time @p t; steady when the flux changed by less than 0.1 % over the
   * last fifth of the run.
   */
  std::vector<TimeLagRecord> time_lag_records(const std::vector<std::pair<std::string, std::string>> &specs,
                                              const std::vector<FluxHistory> &histories,
                                              const std::vector<double> &entered, double t);
} // namespace fickcast
