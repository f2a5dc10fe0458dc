// The columns of series.csv and which optional groups a case has.
#pragma once

#include "case/case_description.h"
#include "results/csv_writer.h"

#include <string>
#include <vector>

namespace fickcast
{
  /// Which boundaries, terms and columns the series of a case holds.
  struct SeriesLayout
  {
    std::vector<bool> active_boundary; ///< per boundary: not sealed in some stage (flux columns)
    std::vector<bool> bath_boundary;   ///< per boundary: a bath in some stage (bath column)
    bool has_source = false;           ///< some region has a nonzero source
    bool has_decay = false;            ///< some region decays
    std::vector<Column> columns;       ///< in the order of a row
  };

  /// The layout for @p c with the mesh's @p regions and @p boundaries (names in the problem's
  /// order); @p dispersed adds the undissolved column, @p nonlinear the nonlinear iterations.
  SeriesLayout series_layout(const CaseDescription &c, const std::vector<std::string> &regions,
                             const std::vector<std::string> &boundaries, bool dispersed, bool nonlinear);
} // namespace fickcast
