#include "results/point_evaluator.h"

#include "case/input_error.h"

#include <deal.II/base/mpi.h>
#include <deal.II/grid/grid_tools.h>

#include <algorithm>
#include <cstdio>
#include <limits>

namespace fickcast
{
  using namespace dealii;

  template <int dim>
  PointEvaluator<dim>::PointEvaluator(const FieldView<dim> &field, const std::vector<Point<dim>> &points,
                                      const std::string &what, const std::vector<std::string> &regions,
                                      const std::vector<std::string> &point_names,
                                      const std::vector<std::string> &origins)
    : communicator_(field.communicator)
    , n_points_(points.size())
  {
    const unsigned int rank = Utilities::MPI::this_mpi_process(communicator_);
    const unsigned int n_ranks = Utilities::MPI::n_mpi_processes(communicator_);
    std::vector<unsigned int> claim(points.size(), n_ranks);
    std::vector<typename DoFHandler<dim>::active_cell_iterator> cells(points.size());
    std::vector<Point<dim>> unit(points.size());
    for (std::size_t i = 0; i < points.size(); ++i)
      {
        try
          {
            const auto found = GridTools::find_active_cell_around_point(*field.mapping, *field.dof_handler, points[i]);
            if (found.first.state() != IteratorState::valid)
              continue;
            auto chosen = found;
            if (i < regions.size() && !regions[i].empty())
              {
                // At an interface: the cell on the side of the region asked for.
                const auto &names = field.names->regions;
                const auto wanted =
                  static_cast<types::material_id>(std::find(names.begin(), names.end(), regions[i]) - names.begin());
                bool matched = found.first->material_id() == wanted;
                if (!matched)
                  for (const auto &candidate : GridTools::find_all_active_cells_around_point(
                         *field.mapping, *field.dof_handler, points[i], 1e-10, found))
                    if (candidate.first->material_id() == wanted)
                      {
                        chosen = candidate;
                        matched = true;
                        break;
                      }
                if (!matched)
                  continue;
              }
            if (chosen.first->is_locally_owned())
              {
                claim[i] = rank;
                cells[i] = chosen.first;
                unit[i] = GeometryInfo<dim>::project_to_unit_cell(chosen.second);
              }
          }
        catch (...)
          {
            // Not in this rank's part of the mesh.
          }
      }
    std::vector<unsigned int> owner(claim.size());
    MPI_Allreduce(claim.data(), owner.data(), static_cast<int>(claim.size()), MPI_UNSIGNED, MPI_MIN, communicator_);
    std::vector<unsigned int> region(points.size(), 0);
    const auto &fe = field.dof_handler->get_fe();
    for (std::size_t i = 0; i < points.size(); ++i)
      {
        if (owner[i] == n_ranks)
          {
            std::string coordinates;
            for (int d = 0; d < dim; ++d)
              {
                char buffer[32];
                std::snprintf(buffer, sizeof(buffer), "%.6g", points[i][d]);
                coordinates += (d ? ", " : "") + std::string(buffer);
              }
            const bool in_region = i < regions.size() && !regions[i].empty();
            const std::string where = i < origins.size() && !origins[i].empty() ? origins[i] : field.case_file;
            const std::string key = i < point_names.size() ? what + "." + point_names[i] : what;
            throw InputError(where, key,
                             "expected a point inside the mesh" +
                               (in_region ? " and on the side of region " + regions[i] : std::string()) + ", found (" +
                               coordinates + ") m outside it");
          }
        if (owner[i] != rank)
          continue;
        mine_.push_back(static_cast<unsigned int>(i));
        std::vector<types::global_dof_index> dofs(fe.n_dofs_per_cell());
        cells[i]->get_dof_indices(dofs);
        const double k = field.partition(cells[i]->material_id());
        std::vector<double> weights(dofs.size());
        for (unsigned int j = 0; j < dofs.size(); ++j)
          weights[j] = k * fe.shape_value(j, unit[i]);
        dofs_.push_back(dofs);
        weights_.push_back(weights);
        region[i] = cells[i]->material_id();
      }
    regions_.resize(region.size());
    MPI_Allreduce(region.data(), regions_.data(), static_cast<int>(region.size()), MPI_UNSIGNED, MPI_MAX,
                  communicator_);
  }

  template <int dim>
  std::vector<double> PointEvaluator<dim>::concentrations(const Vector &u) const
  {
    std::vector<double> values(n_points_, 0.0);
    for (std::size_t k = 0; k < mine_.size(); ++k)
      {
        double value = 0;
        for (std::size_t j = 0; j < dofs_[k].size(); ++j)
          value += weights_[k][j] * u[dofs_[k][j]];
        values[mine_[k]] = value;
      }
    if (Utilities::MPI::n_mpi_processes(communicator_) > 1)
      Utilities::MPI::sum(values, communicator_, values);
    return values;
  }

  template class PointEvaluator<1>;
  template class PointEvaluator<2>;
  template class PointEvaluator<3>;
} // namespace fickcast
