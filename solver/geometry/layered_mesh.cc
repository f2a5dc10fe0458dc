#include "geometry/layered_mesh.h"

#include "geometry/layer_spacing.h"

#include <deal.II/base/table.h>
#include <deal.II/grid/grid_generator.h>

#include <cmath>

namespace fickcast
{
  MeshNames layered_mesh_names(const GeometrySpec &geometry, const unsigned int dimension)
  {
    MeshNames names;
    for (const auto &layer : geometry.layers)
      names.regions.push_back(layer.name);
    names.boundaries = builtin_face_names(dimension);
    return names;
  }

  template <int dim>
  void build_layered_mesh(dealii::Triangulation<dim> &triangulation, const GeometrySpec &geometry)
  {
    const AxisSpacing fine_stack = stack_spacing(geometry);
    double lateral_size = 0;
    for (const double h : fine_stack.sizes)
      lateral_size = std::max(lateral_size, h);
    lateral_size = std::max(lateral_size, geometry.cell_size);

    std::vector<AxisSpacing> fine(dim);
    fine[dim - 1] = fine_stack;
    const double extents[2] = {geometry.width, geometry.length};
    for (int d = 0; d + 1 < dim; ++d)
      {
        fine[d].sizes = uniform_spacing(extents[d], lateral_size);
        fine[d].layer_of_cell.assign(fine[d].sizes.size(), 0);
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
        material(index) = static_cast<dealii::types::material_id>(coarse[dim - 1].layer_of_cell[index[dim - 1]]);
      }

    dealii::GridGenerator::subdivided_hyper_rectangle(triangulation, spacing, dealii::Point<dim>(), material);

    // Boundary ids in the order of builtin_face_names(dim).
    const double total = geometry.total_thickness();
    const double tolerance = 1e-10 * std::max({total, geometry.width, geometry.length});
    for (const auto &cell : triangulation.active_cell_iterators())
      for (const unsigned int f : cell->face_indices())
        if (cell->face(f)->at_boundary())
          {
            const auto centre = cell->face(f)->center();
            dealii::types::boundary_id id = 0;
            if (dim == 1)
              id = centre[0] < tolerance ? 0 : 1;
            else
              {
                for (int d = 0; d < dim; ++d)
                  {
                    const double upper = d == dim - 1 ? total : extents[d];
                    if (std::abs(centre[d]) < tolerance)
                      id = static_cast<dealii::types::boundary_id>(2 * d);
                    else if (std::abs(centre[d] - upper) < tolerance)
                      id = static_cast<dealii::types::boundary_id>(2 * d + 1);
                  }
              }
            cell->face(f)->set_boundary_id(id);
          }
    if (levels > 0)
      triangulation.refine_global(levels);
  }

  template void build_layered_mesh<1>(dealii::Triangulation<1> &, const GeometrySpec &);
  template void build_layered_mesh<2>(dealii::Triangulation<2> &, const GeometrySpec &);
  template void build_layered_mesh<3>(dealii::Triangulation<3> &, const GeometrySpec &);
} // namespace fickcast
