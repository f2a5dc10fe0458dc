// Where the named points of a case fall on its mesh, checked before anything is solved.
#pragma once

#include "case/case_description.h"

#include <deal.II/grid/tria.h>

#include <mpi.h>

#include <string>
#include <vector>

namespace fickcast
{
  /**
   * Checks every named point (output.point.*) of @p c against the mesh @p triangulation, whose
   * material id m is the region @p regions[m]: the point must lie in a cell (not in a hole of a
   * mesh, not beyond its boundary), and a point on an interface between regions of different
   * partition coefficients (where the concentration jumps) must say with `in REGION` which side
   * it reads (a region that touches it). Throws InputError at the point's
   * line with its coordinates in full. Collective over @p communicator (each rank sees its own
   * cells and ghosts).
   */
  template <int dim>
  void check_point_placement(const dealii::Triangulation<dim> &triangulation, const CaseDescription &c,
                             const std::vector<std::string> &regions, MPI_Comm communicator);
} // namespace fickcast
