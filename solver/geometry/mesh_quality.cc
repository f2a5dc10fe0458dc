#include "geometry/mesh_quality.h"

#include "case/input_error.h"

#include <deal.II/base/mpi.h>
#include <deal.II/base/quadrature_lib.h>
#include <deal.II/fe/mapping_q1.h>

#include <algorithm>
#include <cstdio>
#include <string>
#include <vector>

namespace fickcast
{
  using namespace dealii;

  namespace
  {
    std::string point_text(const Point<3> &p, const int dim)
    {
      char buffer[96];
      if (dim == 1)
        std::snprintf(buffer, sizeof(buffer), "(%.6g)", p[0]);
      else if (dim == 2)
        std::snprintf(buffer, sizeof(buffer), "(%.6g, %.6g)", p[0], p[1]);
      else
        std::snprintf(buffer, sizeof(buffer), "(%.6g, %.6g, %.6g)", p[0], p[1], p[2]);
      return buffer;
    }
  } // namespace

  namespace
  {
    /// Smallest and largest Jacobian determinant of the d-linear map of @p cell.
    template <int dim>
    std::pair<double, double> determinant_range(const typename Triangulation<dim>::cell_iterator &cell)
    {
      // Points in the reference cell: its vertices and the Gauss points of order 2.
      static const std::vector<Point<dim>> unit_points = [] {
        std::vector<Point<dim>> points;
        for (const unsigned int v : GeometryInfo<dim>::vertex_indices())
          points.push_back(GeometryInfo<dim>::unit_cell_vertex(v));
        const QGauss<dim> gauss(2);
        for (const auto &q : gauss.get_points())
          points.push_back(q);
        return points;
      }();
      double smallest = std::numeric_limits<double>::max(), largest = -smallest;
      for (const auto &xi : unit_points)
        {
          // d x / d xi of the d-linear map at xi, from the vertices.
          Tensor<2, dim> jacobian;
          for (const unsigned int v : GeometryInfo<dim>::vertex_indices())
            {
              const Tensor<1, dim> gradient = GeometryInfo<dim>::d_linear_shape_function_gradient(xi, v);
              for (int i = 0; i < dim; ++i)
                for (int j = 0; j < dim; ++j)
                  jacobian[i][j] += cell->vertex(v)[i] * gradient[j];
            }
          const double det = determinant(jacobian);
          smallest = std::min(smallest, det);
          largest = std::max(largest, det);
        }
      return {smallest, largest};
    }
  } // namespace

  template <int dim>
  double jacobian_ratio(const typename Triangulation<dim>::cell_iterator &cell)
  {
    const auto [smallest, largest] = determinant_range<dim>(cell);
    return largest > 0 ? smallest / largest : -1.0;
  }

  template <int dim>
  void check_mesh_quality(const Triangulation<dim> &triangulation, const GeometrySpec &geometry, MPI_Comm communicator,
                          const std::function<std::string(unsigned int)> &where_is)
  {
    std::string fault, place;
    for (const auto &cell : triangulation.active_cell_iterators())
      {
        if (!cell->is_locally_owned() || !fault.empty())
          continue;
        const auto [smallest, largest] = determinant_range<dim>(cell);
        if (smallest > 1e-10 * largest && largest > 0)
          continue;
        std::string vertices;
        for (const unsigned int v : GeometryInfo<dim>::vertex_indices())
          {
            Point<3> p;
            for (int d = 0; d < dim; ++d)
              p[d] = cell->vertex(v)[d];
            vertices += (v ? " " : "") + point_text(p, dim);
          }
        char numbers[96];
        std::snprintf(numbers, sizeof(numbers), "%.3g to %.3g", smallest, largest);
        if (where_is && cell->level() == 0)
          place = where_is(static_cast<unsigned int>(cell->index()));
        fault = "expected cells whose nodes go round them in order, found a cell with vertices " + vertices +
                " (m) whose map from the reference cell has Jacobian determinants " + numbers +
                (largest <= 1e-300 || smallest > 0
                   ? ": it is collapsed to a line or a point (or too small to measure)"
                   : ": it folds over itself (nodes out of order, a bow-tie) or is inverted") +
                "; fix the element's node order or the mesh";
      }

    const unsigned int rank = Utilities::MPI::this_mpi_process(communicator);
    const unsigned int n_ranks = Utilities::MPI::n_mpi_processes(communicator);
    const unsigned int reporter = Utilities::MPI::min(fault.empty() ? n_ranks : rank, communicator);
    if (reporter == n_ranks)
      return;
    const std::string message = Utilities::MPI::broadcast(communicator, fault, reporter);
    place = Utilities::MPI::broadcast(communicator, place, reporter);
    if (!place.empty())
      throw InputError(place, "geometry.mesh", message);
    if (geometry.mesh_file.empty())
      throw InputError("built-in geometry", "geometry.cell_size", message);
    throw InputError(geometry.mesh_file, "geometry.mesh", message);
  }

  template double jacobian_ratio<1>(const Triangulation<1>::cell_iterator &);
  template double jacobian_ratio<2>(const Triangulation<2>::cell_iterator &);
  template double jacobian_ratio<3>(const Triangulation<3>::cell_iterator &);
  template void check_mesh_quality<1>(const Triangulation<1> &, const GeometrySpec &, MPI_Comm,
                                      const std::function<std::string(unsigned int)> &);
  template void check_mesh_quality<2>(const Triangulation<2> &, const GeometrySpec &, MPI_Comm,
                                      const std::function<std::string(unsigned int)> &);
  template void check_mesh_quality<3>(const Triangulation<3> &, const GeometrySpec &, MPI_Comm,
                                      const std::function<std::string(unsigned int)> &);
} // namespace fickcast
