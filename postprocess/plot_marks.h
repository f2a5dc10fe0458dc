// What a reader needs marked on a run's plots: layer interfaces, stage changes and levels.
#pragma once

#include "plot_writer.h"
#include "run_summary.h"

#include <string>
#include <vector>

namespace fickcast::post
{
  /// An interface between two differently named layers of a 1-D built-in geometry.
  struct LayerInterface
  {
    double position = 0; ///< m from the top face (radial: the radius)
    std::string between; ///< `silt | sand`
  };

  /// The interfaces of the layers of @p summary (geometry.layers as echoed in SI; radial layers
  /// from geometry.inner_radius outward); empty for a mesh or a single region.
  std::vector<LayerInterface> layer_interfaces(const RunSummary &summary);

  /// The range of the finite values of the curves of @p spec that are not reference lines
  /// (positive ones only on a logarithmic axis); false if there are none.
  bool value_extent(const PlotSpec &spec, double &low, double &high);

  /// Appends one grey reference curve @p label of vertical lines at @p positions (in the plot's x
  /// units), spanning the values drawn; nothing if @p positions is empty or nothing is drawn.
  void add_vertical_marks(PlotSpec &spec, const std::vector<double> &positions, const std::string &label);

  /// The stage changes of @p summary (the starts of all stages but the first), in units of
  /// @p time_unit_seconds, as vertical marks on a plot against time; true if any was added.
  bool add_stage_marks(PlotSpec &spec, const RunSummary &summary, double time_unit_seconds);
} // namespace fickcast::post
