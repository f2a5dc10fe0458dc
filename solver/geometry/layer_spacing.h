// Cell sizes along the stacking axis of the built-in layered geometry (no deal.II).
#pragma once

#include "case/case_description.h"

#include <vector>

namespace fickcast
{
  /// Cell sizes along one axis, and the index of the layer each cell belongs to.
  struct AxisSpacing
  {
    std::vector<double> sizes;
    std::vector<unsigned int> layer_of_cell;
  };

  /**
   * Cell sizes through the layers, top face first. Without grading each layer gets cells of its
   * own size (region cell_size, else geometry cell_size), rounded so they fill it exactly. With
   * grading g toward a face, the target size at distance s from that face is h0 + (g - 1) s
   * (the continuous form of cells growing by the factor g), capped by a layer's own cell_size;
   * cells are spaced evenly in the stretched coordinate int ds / h(s).
   * Every layer gets at least one cell.
   */
  AxisSpacing stack_spacing(const GeometrySpec &geometry);

  /// Without making them: how many cells stack_spacing() gives and the largest of them (m).
  struct StackEstimate
  {
    double cells = 0;
    double largest = 0;
  };
  StackEstimate estimate_stack(const GeometrySpec &geometry);

  /// Uniform cells of about @p cell_size over @p extent (at least one).
  std::vector<double> uniform_spacing(double extent, double cell_size);

  /**
   * Merges groups of 2^levels consecutive cells that lie in the same layer, after rounding each
   * layer's count up to a multiple of 2^levels, so that refining the merged (coarse) cells
   * @p levels times gives back about the requested spacing.
   */
  AxisSpacing coarsen(const AxisSpacing &fine, unsigned int levels);
} // namespace fickcast
