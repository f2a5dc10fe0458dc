// Cell and unknown counts of a case's mesh, without assembling anything.
#pragma once

#include "case/case_description.h"

#include <mpi.h>

namespace fickcast
{
  struct MeshStatistics
  {
    unsigned long cells = 0;
    unsigned long unknowns = 0;
    double smallest_cell = 0; ///< m, smallest cell diameter
    double largest_cell = 0;  ///< m, largest cell diameter
  };

  /// Builds the mesh and the finite-element space of @p description and counts (collective).
  MeshStatistics count_mesh(const CaseDescription &description, MPI_Comm communicator);
} // namespace fickcast
