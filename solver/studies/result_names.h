// The named results a case will report, known before it runs (for studies to check against).
#pragma once

#include "case/case_description.h"

#include <string>
#include <vector>

namespace fickcast
{
  /// A named scalar result and its SI unit.
  struct ResultName
  {
    std::string name; ///< e.g. threshold.base
    std::string unit; ///< e.g. s, m, kg/m3, 1
  };

  /// True for results that are times of events (threshold.NAME, release.NAME, flux_limit.NAME,
  /// crossed_limit.NAME): absent when
  /// the event did not happen within the run, and then later than any time.
  bool is_event_result(const std::string &name);

  /// The named results the case's [output] section asks for (as summary.json names them).
  std::vector<ResultName> expected_results(const CaseDescription &description);

  /**
   * The names of the case's named results in the order fickcast lists them (sweep.csv columns,
   * the sweep's lines per case, the names a sizing message offers): amount.final_total; each
   * point.NAME.final followed by threshold.NAME if the point has a threshold (points in the
   * case's order); released_fraction.final; then release.NAME, time_lag.NAME and depth.NAME in
   * the case's order. Readers take the order from here, not from the `results` object of
   * summary.json: a JSON object has no order, and JsonCpp writes its keys alphabetically.
   */
  std::vector<std::string> result_order(const CaseDescription &description);

  /**
   * Converts @p level_text (e.g. `100 yr`, `80 %`, `250 mg/L`) into the SI unit of the result
   * @p name. Throws InputError naming @p origin and @p key if the case reports no such result
   * (the message lists those it does) or if the unit does not fit.
   */
  double result_level(const CaseDescription &description, const std::string &name, const std::string &level_text,
                      const std::string &origin, const std::string &key);
} // namespace fickcast
