// The field maps of a run's plots: the 2-D section, or two mid-planes of a 3-D body, at chosen times.
#pragma once

#include "results_folder.h"
#include "run_plots.h"

#include <string>
#include <vector>

namespace fickcast::post
{
  /**
   * Writes the field maps of @p results into @p folder and appends them to @p written. 2-D: the
   * section; 3-D: the plane through the middle of the second axis (x against z) and, at the last
   * time only, the plane through the middle of the first (y against z). Times: those of
   * @p options.map_times (any time within the stored states; between two of them the fields are
   * interpolated linearly in time, and the caption says so), else the middle and the last stored
   * state. @p log_values colours by decade. Nothing for a 1-D run or one without fields.
   */
  void write_field_maps(const ResultsFolder &results, const std::string &folder, const RunPlotOptions &options,
                        const DisplayUnit &concentration, bool log_values, std::vector<PlotFile> &written);
} // namespace fickcast::post
