// The named scalar results of a run (the numbers an accuracy check compares between solves).
#pragma once

#include "results/run_record.h"

#include <string>
#include <utility>
#include <vector>

namespace fickcast
{
  /**
   * The named results of @p record, in SI, under the names summary.json gives them:
   * amount.final_total, point.NAME.final, threshold.NAME, released_fraction.final, release.NAME,
   * time_lag.NAME, bath.FACE.final (a bath's concentration at the end), the results through faces (flux.NAME,
   * crossed.NAME, peak_flux.NAME and peak_flux.NAME.time, flux_limit.NAME, crossed_limit.NAME, steady_flux.NAME) and
   * depth.NAME (its value at the end). An event that did not happen, or a depth below the whole domain, is NaN.
   */
  std::vector<std::pair<std::string, double>> headline_values(const RunRecord &record);

  /// The total final amount: dissolved and sorbed in every region plus undissolved content.
  double final_total_amount(const RunRecord &record);
} // namespace fickcast
