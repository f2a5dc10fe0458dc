#include "numerics/mesh_statistics.h"

#include "geometry/mesh_import.h"
#include "geometry/mesh_quality.h"
#include "numerics/diffusion_problem.h"

#include <deal.II/base/mpi.h>
#include <deal.II/distributed/tria.h>
#include <deal.II/dofs/dof_handler.h>
#include <deal.II/fe/fe_q.h>

#include <memory>

namespace fickcast
{
  namespace
  {
    template <int dim>
    MeshStatistics count(const CaseDescription &c, MPI_Comm communicator)
    {
      // The mesh as a run builds it (refined next to open faces), without the operators.
      DiffusionProblem<dim> problem(c, communicator);
      problem.build_mesh();
      const dealii::Triangulation<dim> *triangulation = &problem.triangulation();
      const dealii::FE_Q<dim> fe(c.numerics.degree);
      dealii::DoFHandler<dim> dofs(*triangulation);
      dofs.distribute_dofs(fe);
      MeshStatistics statistics;
      statistics.refinement_note = problem.refinement_note();
      statistics.refinement_warning = problem.refinement_warning();
      const auto flow = problem.flow_numbers();
      statistics.cell_peclet = flow.peclet;
      statistics.cell_peclet_region = flow.peclet_region;
      statistics.crossing_rate = flow.crossing_rate;
      statistics.flow_warning = problem.flow_warning();
      statistics.cells = triangulation->n_global_active_cells();
      statistics.unknowns = dofs.n_dofs();
      double smallest = 1e300, largest = 0, worst = 2;
      dealii::Point<dim> worst_centre;
      for (const auto &cell : triangulation->active_cell_iterators())
        if (cell->is_locally_owned())
          {
            smallest = std::min(smallest, cell->diameter());
            largest = std::max(largest, cell->diameter());
            const double ratio = jacobian_ratio<dim>(cell);
            if (ratio < worst)
              {
                worst = ratio;
                worst_centre = cell->center();
              }
          }
      // The worst cell of all ranks, and where it is (from the rank that has it).
      const double worst_all = dealii::Utilities::MPI::min(worst, communicator);
      const unsigned int n_ranks = dealii::Utilities::MPI::n_mpi_processes(communicator);
      const unsigned int owner = dealii::Utilities::MPI::min(
        worst == worst_all ? dealii::Utilities::MPI::this_mpi_process(communicator) : n_ranks, communicator);
      statistics.worst_jacobian_ratio = std::min(worst_all, 1.0);
      const dealii::Point<dim> centre = dealii::Utilities::MPI::broadcast(communicator, worst_centre, owner);
      for (int d = 0; d < dim; ++d)
        statistics.worst_cell_centre[d] = centre[d];
      statistics.smallest_cell = dealii::Utilities::MPI::min(smallest, communicator);
      statistics.largest_cell = dealii::Utilities::MPI::max(largest, communicator);
      dofs.clear();
      return statistics;
    }
  } // namespace

  MeshStatistics count_mesh(const CaseDescription &description, MPI_Comm communicator)
  {
    switch (description.dimension)
      {
        case 1:
          return count<1>(description, MPI_COMM_SELF);
        case 2:
          return count<2>(description, communicator);
        default:
          return count<3>(description, communicator);
      }
  }
} // namespace fickcast
