// One call that turns a results folder (or a study folder) into plots and an HTML report.
#pragma once

#include "plot_writer.h"
#include "post_error.h"

#include <string>
#include <vector>

namespace fickcast::post
{
  /// Choices for make_report and make_study_report.
  struct ReportOptions
  {
    /// Where the report goes; empty means FOLDER/report.
    std::string output_folder;
    /// A verification_report.json to show; empty means look for one in FOLDER and its parent.
    std::string verification_report;
    /// Also plot release and amounts against the square root of time.
    bool sqrt_time = false;
    /// Times of the field maps of a 2-D or 3-D run (see RunPlotOptions::map_times).
    std::string map_times;
    /// Image files to write (the report embeds the PNGs; the SVGs are written beside them).
    PlotFormats formats;
  };

  /// What a report call wrote.
  struct ReportOutcome
  {
    std::string html;                ///< path of index.html
    std::vector<std::string> images; ///< paths of the images written (PNG and SVG)
  };

  /**
   * Reads the results folder @p results_folder (summary.json, series.csv, profiles.csv, fields),
   * writes its plots and a self-contained HTML report (images embedded, print stylesheet,
   * cautions) to OUTPUT/index.html, OUTPUT defaulting to RESULTS/report.
   * Throws PostInputError (a std::runtime_error, one-line message naming the file, expected
   * versus found) on bad input and PostIoError if writing fails. index.html is written last,
   * through a partial file, so it is complete or absent.
   */
  ReportOutcome make_report(const std::string &results_folder, const ReportOptions &options = {});

  /**
   * The same for a study folder (sweep.csv, optional sweep_summary.json): result against each
   * varied parameter and, for uncertainty studies, distributions and exceedance curves.
   */
  ReportOutcome make_study_report(const std::string &study_folder, const ReportOptions &options = {});

  /// True if @p folder holds a study (a sweep.csv).
  bool is_study_folder(const std::string &folder);

  /**
   * The same for a sizing search (size.csv and size_summary.json, as `fickcast size` writes):
   * what was sought, the answer with its final bracket, the result against the parameter at
   * every evaluation with the target marked, and the evaluations table.
   */
  ReportOutcome make_size_report(const std::string &size_folder, const ReportOptions &options = {});

  /// True if @p folder holds a sizing search (size.csv and size_summary.json).
  bool is_size_folder(const std::string &folder);

  /// make_study_report, make_size_report or make_report, after what @p folder holds.
  ReportOutcome make_any_report(const std::string &folder, const ReportOptions &options = {});
} // namespace fickcast::post
