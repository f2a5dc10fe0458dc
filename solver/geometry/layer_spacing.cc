#include "geometry/layer_spacing.h"

#include <algorithm>
#include <cmath>

namespace fickcast
{
  namespace
  {
    /// Cells of one layer between depths a and b (a < b) under the size law h(s).
    template <typename SizeLaw>
    std::vector<double> fill(const double a, const double b, const SizeLaw &size_at)
    {
      // Stretched coordinate xi(s) = int_a^s dz / h(z) by the midpoint rule on a fine grid.
      const unsigned int n_fine = 2000;
      std::vector<double> xi(n_fine + 1, 0.0);
      const double dz = (b - a) / n_fine;
      for (unsigned int k = 0; k < n_fine; ++k)
        xi[k + 1] = xi[k] + dz / size_at(a + (k + 0.5) * dz);
      const unsigned int n_cells = std::max(1u, static_cast<unsigned int>(std::ceil(xi.back() - 1e-6)));
      std::vector<double> edges{a};
      for (unsigned int c = 1; c < n_cells; ++c)
        {
          const double target = xi.back() * c / n_cells;
          const auto it = std::lower_bound(xi.begin(), xi.end(), target);
          const std::size_t k = static_cast<std::size_t>(it - xi.begin());
          const double fraction = (target - xi[k - 1]) / (xi[k] - xi[k - 1]);
          edges.push_back(a + (k - 1 + fraction) * dz);
        }
      edges.push_back(b);
      std::vector<double> sizes;
      for (std::size_t i = 0; i + 1 < edges.size(); ++i)
        sizes.push_back(edges[i + 1] - edges[i]);
      return sizes;
    }
  } // namespace

  StackEstimate estimate_stack(const GeometrySpec &geometry)
  {
    // The same size law and stretched coordinate as stack_spacing(), counted instead of filled
    // (filled only for layers of at most a million cells, to find the largest exactly).
    StackEstimate estimate;
    const double total = geometry.total_thickness();
    const bool graded = geometry.grade_toward != Face::none && geometry.grading != 1.0;
    double depth = 0;
    for (const LayerSpec &layer : geometry.layers)
      {
        const double cap = layer.cell_size > 0 ? layer.cell_size : geometry.cell_size;
        const double own_cap = layer.cell_size > 0 ? layer.cell_size : 1e300;
        const auto size_at = [&](const double z) {
          if (!graded)
            return cap;
          const double s = geometry.grade_toward == Face::top ? z : total - z;
          return std::min(own_cap, geometry.cell_size + (geometry.grading - 1.0) * s);
        };
        const unsigned int n_fine = 2000;
        const double dz = layer.thickness / n_fine;
        double xi = 0, largest = 0;
        for (unsigned int k = 0; k < n_fine; ++k)
          {
            const double h = size_at(depth + (k + 0.5) * dz);
            xi += dz / h;
            largest = std::max(largest, std::min(h, layer.thickness));
          }
        const double cells = std::max(1.0, std::ceil(xi - 1e-6));
        if (cells <= 1e6) // few enough to make: the exact largest cell
          {
            const std::vector<double> sizes = fill(depth, depth + layer.thickness, size_at);
            largest = *std::max_element(sizes.begin(), sizes.end());
          }
        estimate.largest = std::max(estimate.largest, largest);
        estimate.cells += cells;
        depth += layer.thickness;
      }
    return estimate;
  }

  AxisSpacing stack_spacing(const GeometrySpec &geometry)
  {
    AxisSpacing spacing;
    const double total = geometry.total_thickness();
    double depth = 0;
    for (unsigned int i = 0; i < geometry.layers.size(); ++i)
      {
        const LayerSpec &layer = geometry.layers[i];
        const double cap = layer.cell_size > 0 ? layer.cell_size : geometry.cell_size;
        std::vector<double> sizes;
        if (geometry.grade_toward == Face::none || geometry.grading == 1.0)
          sizes = fill(depth, depth + layer.thickness, [&](double) { return cap; });
        else
          {
            const double growth = geometry.grading - 1.0;
            const double h0 = geometry.cell_size;
            const bool from_top = geometry.grade_toward == Face::top;
            const double own_cap = layer.cell_size > 0 ? layer.cell_size : 1e300;
            sizes = fill(depth, depth + layer.thickness, [&](double z) {
              const double s = from_top ? z : total - z;
              return std::min(own_cap, h0 + growth * s);
            });
          }
        for (const double h : sizes)
          {
            spacing.sizes.push_back(h);
            spacing.layer_of_cell.push_back(i);
          }
        depth += layer.thickness;
      }
    return spacing;
  }

  std::vector<double> uniform_spacing(const double extent, const double cell_size)
  {
    const unsigned int n = std::max(1u, static_cast<unsigned int>(std::ceil(extent / cell_size - 1e-9)));
    return std::vector<double>(n, extent / n);
  }

  AxisSpacing coarsen(const AxisSpacing &fine, const unsigned int levels)
  {
    if (levels == 0)
      return fine;
    const unsigned int group = 1u << levels;
    AxisSpacing coarse;
    std::size_t begin = 0;
    while (begin < fine.sizes.size())
      {
        const unsigned int layer = fine.layer_of_cell[begin];
        std::size_t end = begin;
        double thickness = 0;
        while (end < fine.sizes.size() && fine.layer_of_cell[end] == layer)
          thickness += fine.sizes[end++];
        const std::size_t n_fine = end - begin;
        const std::size_t n_coarse = (n_fine + group - 1) / group;
        // Keep the fine grading: coarse cell k spans fine cells [k*n_fine/n_coarse, (k+1)*n_fine/n_coarse).
        for (std::size_t k = 0; k < n_coarse; ++k)
          {
            const std::size_t from = begin + k * n_fine / n_coarse;
            const std::size_t to = begin + (k + 1) * n_fine / n_coarse;
            double h = 0;
            for (std::size_t j = from; j < to; ++j)
              h += fine.sizes[j];
            coarse.sizes.push_back(h);
            coarse.layer_of_cell.push_back(layer);
          }
        (void)thickness;
        begin = end;
      }
    return coarse;
  }
} // namespace fickcast
