// Whether every cell of a mesh is a valid map of the reference cell (issue 14 item 3).
#pragma once

#include "case/case_description.h"

#include <deal.II/grid/tria.h>

#include <mpi.h>

#include <functional>
#include <string>

namespace fickcast
{
  /**
   * Checks every locally owned cell of @p triangulation (collective over @p communicator): the
   * Jacobian determinant of the bilinear (trilinear) map at the vertices and at the 2^dim Gauss
   * points must be positive, and the smallest of them at least 1e-10 times the largest (a cell
   * collapsed to a line or a point otherwise). A cell whose nodes are out of order (a bow-tie
   * quadrilateral) or collapsed fails. Throws InputError on every rank, key geometry.mesh (or
   * geometry.cell_size for the built-in geometry), naming the first bad cell by its vertices,
   * the smallest and largest determinant and what to fix. @p where_is, if given, names a coarse
   * cell by its index as the user knows it (a Gmsh element's number and file:line); the error
   * then has that as its place.
   */
  /// The distortion of a cell: the smallest over the largest Jacobian determinant of its d-linear
  /// map at the vertices and the 2^dim Gauss points (1 for a parallelogram or box; near 0 for a
  /// cell close to collapse; not positive for an invalid one).
  template <int dim>
  double jacobian_ratio(const typename dealii::Triangulation<dim>::cell_iterator &cell);

  template <int dim>
  void check_mesh_quality(const dealii::Triangulation<dim> &triangulation, const GeometrySpec &geometry,
                          MPI_Comm communicator, const std::function<std::string(unsigned int)> &where_is = {});
} // namespace fickcast
