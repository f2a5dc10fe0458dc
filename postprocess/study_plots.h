// Plots of a study: each result against each varied parameter; distributions and exceedance.
#pragma once

#include "run_plots.h"
#include "study_table.h"

#include <string>
#include <vector>

namespace fickcast::post
{
  /**
   * Writes the plots of @p study into @p folder: each result against each varied parameter
   * (a line through the cases of a one-parameter sweep, scattered points otherwise) and, when
   * @p uncertainty, per result a histogram and an exceedance curve with P5, P50 and P95.
   * Results in seconds are shown in a readable time unit. At most @p max_plots plots.
   */
  std::vector<PlotFile> make_study_plots(const StudyTable &study, const std::string &folder, bool uncertainty,
                                         const PlotFormats &formats, std::size_t max_plots = 24,
                                         const std::string &subject = {});
} // namespace fickcast::post
