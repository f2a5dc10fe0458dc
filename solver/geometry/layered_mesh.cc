#include "geometry/layered_mesh.h"

#include "geometry/layer_spacing.h"

#include <deal.II/base/table.h>
#include <deal.II/grid/grid_generator.h>

#include <algorithm>
#include <cmath>

namespace fickcast
{
  MeshNames mesh_names(const GeometrySpec &geometry, const unsigned int dimension)
  {
    MeshNames names;
    names.regions = geometry.region_names();
    names.boundaries = geometry.face_names(dimension);
    return names;
  }

  template <int dim>
  void build_layered_mesh(dealii::Triangulation<dim> &triangulation, const GeometrySpec &geometry)
  {
    const std::vector<std::string> regions = geometry.region_names();
    auto region_of = [&](const std::string &name) {
      return static_cast<dealii::types::material_id>(std::find(regions.begin(), regions.end(), name) - regions.begin());
    };
    const AxisSpacing fine_stack = stack_spacing(geometry);
    double lateral_size = 0;
    for (const double h : fine_stack.sizes)
      lateral_size = std::max(lateral_size, h);
    lateral_size = std::max(lateral_size, geometry.cell_size);

    // Axes: lateral ones first, the stacking axis last. In axisymmetric cases the lateral axis
    // is r from the inner radius, with the side coating as a second band.
    const bool axisymmetric = geometry.coordinates == Coordinates::axisymmetric;
    std::vector<AxisSpacing> fine(dim);
    fine[dim - 1] = fine_stack;
    const double extents[2] = {axisymmetric ? geometry.radius - geometry.inner_radius : geometry.width,
                               geometry.length};
    for (int d = 0; d + 1 < dim; ++d)
      {
        fine[d].sizes = uniform_spacing(extents[d], lateral_size);
        fine[d].layer_of_cell.assign(fine[d].sizes.size(), 0);
        if (axisymmetric && d == 0 && geometry.side_coating.thickness > 0)
          {
            const double t = geometry.side_coating.thickness;
            for (const double h : uniform_spacing(t, std::min(lateral_size, t / 2)))
              {
                fine[d].sizes.push_back(h);
                fine[d].layer_of_cell.push_back(1);
              }
          }
      }

    // Refinement levels: keep the coarse mesh small (p4est trees) in 2-D and 3-D.
    unsigned int levels = 0;
    auto coarse_cells = [&](unsigned int l) {
      double count = 1;
      for (int d = 0; d < dim; ++d)
        count *= static_cast<double>(coarsen(fine[d], l).sizes.size());
      return count;
    };
    if (dim > 1)
      while (levels < 8 && coarse_cells(levels) > 2000)
        ++levels;

    std::vector<std::vector<double>> spacing(dim);
    std::vector<AxisSpacing> coarse(dim);
    for (int d = 0; d < dim; ++d)
      {
        coarse[d] = coarsen(fine[d], levels);
        spacing[d] = coarse[d].sizes;
      }

    dealii::TableIndices<dim> extent;
    for (int d = 0; d < dim; ++d)
      extent[d] = spacing[d].size();
    dealii::Table<dim, dealii::types::material_id> material;
    material.reinit(extent);
    const std::size_t n_total = material.n_elements();
    for (std::size_t linear = 0; linear < n_total; ++linear)
      {
        dealii::TableIndices<dim> index;
        std::size_t rest = linear;
        for (int d = dim - 1; d >= 0; --d)
          {
            index[d] = rest % extent[d];
            rest /= extent[d];
          }
        const bool in_coating = axisymmetric && dim > 1 && coarse[0].layer_of_cell[index[0]] == 1;
        const std::string &name =
          in_coating ? geometry.side_coating.name : geometry.layers[coarse[dim - 1].layer_of_cell[index[dim - 1]]].name;
        material(index) = region_of(name);
      }

    dealii::Point<dim> origin;
    if (geometry.radial() || axisymmetric)
      origin[0] = geometry.inner_radius;
    dealii::GridGenerator::subdivided_hyper_rectangle(triangulation, spacing, origin, material);

    // Boundary ids: 2 d for the low end of axis d, 2 d + 1 for the high end (face_names order).
    double upper[3] = {0, 0, 0};
    for (int d = 0; d < dim; ++d)
      {
        upper[d] = origin[d];
        for (const double h : spacing[d])
          upper[d] += h;
      }
    double scale = 0;
    for (int d = 0; d < dim; ++d)
      scale = std::max(scale, upper[d]);
    const double tolerance = 1e-10 * scale;
    for (const auto &cell : triangulation.active_cell_iterators())
      for (const unsigned int f : cell->face_indices())
        if (cell->face(f)->at_boundary())
          {
            const auto centre = cell->face(f)->center();
            dealii::types::boundary_id id = 0;
            for (int d = 0; d < dim; ++d)
              {
                if (std::abs(centre[d] - origin[d]) < tolerance)
                  id = static_cast<dealii::types::boundary_id>(2 * d);
                else if (std::abs(centre[d] - upper[d]) < tolerance)
                  id = static_cast<dealii::types::boundary_id>(2 * d + 1);
              }
            cell->face(f)->set_boundary_id(id);
          }
    if (levels + geometry.refine > 0)
      triangulation.refine_global(levels + geometry.refine);
  }

  template void build_layered_mesh<1>(dealii::Triangulation<1> &, const GeometrySpec &);
  template void build_layered_mesh<2>(dealii::Triangulation<2> &, const GeometrySpec &);
  template void build_layered_mesh<3>(dealii::Triangulation<3> &, const GeometrySpec &);
} // namespace fickcast
