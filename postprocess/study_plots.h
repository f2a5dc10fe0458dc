// Plots of a study: each result against each varied parameter; distributions and exceedance.
#pragma once

#include "run_plots.h"
#include "study_table.h"

#include <string>
#include <vector>

namespace fickcast::post
{
  /// A limit whose probability an uncertainty study reports (sweep.below.* or sweep.exceed.*).
  struct StudyLimitMark
  {
    std::string result; ///< the named result
    double level = 0;   ///< SI, as in sweep.csv
    std::string label;  ///< e.g. "P(below 15 yr) = 41 %"
  };

  /**
   * Spearman's rank correlation of @p x and @p y over the pairs where both are numbers (an
   * infinity, an event not reached, ranks above every finite value); ties get their mean rank
   * (Spearman 1904; the Pearson correlation of the ranks). NaN with fewer than three pairs or a
   * constant column.
   */
  double rank_correlation(const std::vector<double> &x, const std::vector<double> &y);

  /**
   * Writes the plots of @p study into @p folder. A what-if grid (not @p uncertainty): each result
   * against each varied parameter, one line per combination of the other varied parameters, cases
   * whose event was not reached drawn as their own marks above the others. An uncertainty study:
   * each result against each sampled parameter (scattered), and per result a histogram, an
   * exceedance curve with P5, P50, P95 and the @p limits of that result, and a rank-correlation
   * chart of the inputs (which drive it). Results in seconds are shown in a readable time unit.
   * At most @p max_plots plots.
   */
  std::vector<PlotFile> make_study_plots(const StudyTable &study, const std::string &folder, bool uncertainty,
                                         const PlotFormats &formats, std::size_t max_plots = 24,
                                         const std::string &subject = {},
                                         const std::vector<StudyLimitMark> &limits = {});
} // namespace fickcast::post
