// Concentrations at fixed points of a (possibly distributed) finite-element field.
#pragma once

#include "results/field_view.h"

#include <deal.II/base/point.h>

#include <vector>

namespace fickcast
{
  /**
   * Locates fixed points once (cell and reference coordinates, on the rank that owns the cell)
   * and evaluates the phase concentration c = K u there, exactly as the finite-element function
   * gives it. Collective: every rank calls concentrations() and gets every value. A point on a
   * face between cells reads the cell the mesh search returns; at an interface with a partition
   * jump that is one side or the other, so points belong inside regions.
   */
  template <int dim>
  class PointEvaluator
  {
  public:
    using Vector = FieldVector;

    /// Throws InputError naming @p what if a point lies outside the mesh (or outside the region
    /// named for it in @p regions, where one is: the side to read at an interface); with
    /// @p names and @p origins (one per point), the key is `what.NAME` and the place its file:line.
    PointEvaluator(const FieldView<dim> &field, const std::vector<dealii::Point<dim>> &points, const std::string &what,
                   const std::vector<std::string> &regions = {}, const std::vector<std::string> &names = {},
                   const std::vector<std::string> &origins = {});

    /// Phase concentrations at the points for the ghosted state @p u.
    std::vector<double> concentrations(const Vector &u) const;
    /// Region (material id) of each point; valid on every rank.
    const std::vector<unsigned int> &regions() const { return regions_; }
    std::size_t size() const { return n_points_; }

  private:
    MPI_Comm communicator_;
    std::size_t n_points_ = 0;
    std::vector<unsigned int> mine_; ///< indices of points owned here
    std::vector<std::vector<dealii::types::global_dof_index>> dofs_;
    std::vector<std::vector<double>> weights_; ///< K times shape values at the point
    std::vector<unsigned int> regions_;
  };
} // namespace fickcast
