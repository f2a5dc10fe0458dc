// The plots engineers draw from a run by hand: profiles, point histories, release, amounts, depths.
#pragma once

#include "plot_writer.h"
#include "results_folder.h"

#include <string>
#include <vector>

namespace fickcast::post
{
  /// One plot written to disk: STEM.png and/or STEM.svg in a folder, and what it shows.
  struct PlotFile
  {
    std::string stem;    ///< file name without extension
    std::string title;   ///< heading
    std::string caption; ///< one sentence: what is drawn, units, where the data came from
  };

  /// Choices for the run plots.
  struct RunPlotOptions
  {
    PlotFormats formats;
    bool sqrt_time = false;       ///< release and amounts against the square root of time
    unsigned int max_times = 8;   ///< at most this many output times per profile plot
    unsigned int n_samples = 241; ///< points per sampled line when there is no profiles.csv
    /// Times of the 2-D and 3-D field maps (`5 yr, 10 yr`, `last`, `all`); empty: middle and last state.
    std::string map_times;
  };

  /**
   * Writes the plots of @p results into @p folder (created if missing) and returns them in
   * reading order. Concentration profiles come from profiles.csv when the run has sampling
   * lines, else from the fields sampled along the stacking axis (the last axis; in
   * axisymmetric cases along the axis). Plots without data are left out.
   */
  std::vector<PlotFile> make_run_plots(const ResultsFolder &results, const std::string &folder,
                                       const RunPlotOptions &options);

  /// Indices of at most @p n of @p count items, evenly spread, first and last included.
  std::vector<std::size_t> spread_indices(std::size_t count, std::size_t n);
} // namespace fickcast::post
