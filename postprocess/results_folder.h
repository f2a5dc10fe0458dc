// A results folder opened for post-processing: summary, series, profiles and the field index.
#pragma once

#include "csv_table.h"
#include "field_series.h"
#include "run_summary.h"

#include "case/display_units.h"

#include <optional>
#include <string>

namespace fickcast::post
{
  /**
   * What `fickcast run` wrote into one folder, checked on opening: summary.json (required),
   * series.csv (required, every cell a number or empty), profiles.csv (if present) and
   * fields/fields.pvd (if present). Each problem is a PostInputError naming the file.
   */
  struct ResultsFolder
  {
    std::string path;
    RunSummary summary;
    CsvTable series;
    std::optional<CsvTable> profiles;
    std::optional<FieldSeries> fields;
  };

  /// Opens and checks @p folder.
  ResultsFolder open_results(const std::string &folder);

  /// PostInputError unless @p folder is an existing folder (what: `a results folder ...`).
  void require_folder(const std::string &folder, const std::string &what);

  /// A concentration unit for people (the unit the case was written in) and its size in SI.
  struct DisplayUnit
  {
    std::string symbol;
    double si_per_unit = 1; ///< display value = SI value / si_per_unit
  };

  /// The concentration unit the case was written in (e.g. mg/L), or the SI unit if unknown.
  DisplayUnit concentration_display(const RunSummary &summary);

  /// The units the case of @p summary was written in, as `fickcast run` printed its results: time
  /// of time.end, length of the layers, the first concentration unit, amounts derived from it.
  DisplayUnits case_units(const RunSummary &summary);

  /// A length unit (m, mm, µm, nm) in which @p span_metres reads well.
  DisplayUnit length_display(double span_metres);
} // namespace fickcast::post
