// Cell and unknown counts of a case's mesh, without assembling anything.
#pragma once

#include "case/case_description.h"

#include <mpi.h>

#include <array>
#include <string>
#include <vector>

namespace fickcast
{
  struct MeshStatistics
  {
    unsigned long cells = 0;
    unsigned long unknowns = 0;
    double smallest_cell = 0; ///< m, smallest cell diameter
    double largest_cell = 0;  ///< m, largest cell diameter
    /// The most distorted cell: its Jacobian ratio (geometry/mesh_quality.h; 1 for a box) and centre.
    double worst_jacobian_ratio = 1;
    std::array<double, 3> worst_cell_centre{{0, 0, 0}};
    std::string refinement_note;    ///< what the refinement next to open faces did ("" if none)
    std::string refinement_warning; ///< it stopped at the size limit ("" if not)
    /// Water flow: largest cell Peclet number and its region, largest seepage velocity over
    /// retardation per cell length (1/s), and a sealed face that water crosses ("" if none).
    double cell_peclet = 0;
    std::string cell_peclet_region;
    double crossing_rate = 0;
    std::string flow_warning;
  };

  /// Builds the mesh (as a run would) and the finite-element space of @p description and counts
  /// (collective).
  MeshStatistics count_mesh(const CaseDescription &description, MPI_Comm communicator);
} // namespace fickcast
