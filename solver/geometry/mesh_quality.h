// Whether every cell of a mesh is a valid map of the reference cell (issue 14 item 3).
#pragma once

#include "case/case_description.h"

#include <deal.II/grid/tria.h>

#include <mpi.h>

namespace fickcast
{
  /**
   * Checks every locally owned cell of @p triangulation (collective over @p communicator): the
   * Jacobian determinant of the bilinear (trilinear) map at the vertices and at the 2^dim Gauss
   * points must be positive, and the smallest of them at least 1e-10 times the largest (a cell
   * collapsed to a line or a point otherwise). A cell whose nodes are out of order (a bow-tie
   * quadrilateral) or collapsed fails. Throws InputError on every rank, key geometry.mesh (or
   * geometry.cell_size for the built-in geometry), naming the first bad cell by its vertices,
   * the smallest and largest determinant and what to fix.
   */
  template <int dim>
  void check_mesh_quality(const dealii::Triangulation<dim> &triangulation, const GeometrySpec &geometry,
                          MPI_Comm communicator);
} // namespace fickcast
