// DiffusionProblem: refinement and coarsening of the mesh during a run, driven by an estimate of
// the interpolation error of the state, with the states carried to the new mesh.
#include "numerics/diffusion_problem.h"

#include <deal.II/base/mpi.h>
#include <deal.II/base/quadrature_lib.h>
#include <deal.II/distributed/solution_transfer.h>
#include <deal.II/distributed/tria.h>
#include <deal.II/grid/grid_tools.h>
#include <deal.II/numerics/error_estimator.h>
#include <deal.II/numerics/solution_transfer.h>

#include "case/input_error.h"

#include <algorithm>
#include <cmath>
#include <map>
#include <set>

namespace fickcast
{
  using namespace dealii;

  template <int dim>
  dealii::Vector<float> DiffusionProblem<dim>::cell_error_estimates(const Vector &u) const
  {
    dealii::Vector<float> estimate(triangulation_->n_active_cells());
    const Vector ghosted = make_ghosted(u);
    const std::map<types::boundary_id, const Function<dim, double> *> no_flux_data;
    // eta_K^2 = sum over the faces of K of h_K / 24 int_F [du/dn]^2 (deal.II's default weight).
    KellyErrorEstimator<dim>::estimate(mapping_, dof_handler_, QGauss<dim - 1>(fe_.degree + 1), no_flux_data, ghosted,
                                       estimate);
    // A jump J of the normal derivative on the 2 dim faces of a cell of size h gives
    // eta^2 = dim h^dim J^2 / 12, and the nodal interpolation error it signals is about h J / 8
    // (J = h u'' and h^2 u'' / 8 for linear elements; the same order for higher degrees, where
    // J = O(h^p)): the estimate in units of u is h J / 8 with J = eta sqrt(12 / (dim |K|)).
    for (const auto &cell : triangulation_->active_cell_iterators())
      if (cell->is_locally_owned())
        {
          const double h = cell->diameter(), measure = cell->measure();
          float &e = estimate[cell->active_cell_index()];
          e = measure > 0 ? static_cast<float>(e * h * std::sqrt(12.0 / (dim * measure)) / 8.0) : 0.0f;
        }
    return estimate;
  }

  template <int dim>
  void DiffusionProblem<dim>::set_fixed_values(Vector &v, const double t) const
  {
    for (std::size_t k = 0; k < fixed_dofs_.size(); ++k)
      {
        const auto [dof, b] = fixed_dofs_[k];
        const Point<dim> &p = fixed_points_[k];
        if (boundaries_[b].kind() == BoundaryKind::concentration)
          v[dof] = boundaries_[b].fixed_value(p[0], dim > 1 ? p[1] : 0.0, dim > 2 ? p[2] : 0.0, t);
        else
          v[dof] = bath_value_[b];
      }
    v.compress(VectorOperation::insert);
  }

  template <int dim>
  AdaptResult DiffusionProblem<dim>::adapt(const Vector &u, const AdaptLimits &limits,
                                           const std::vector<Vector *> &states)
  {
    AssertThrow(!dispersed_, ExcMessage("runtime mesh adaptivity does not carry an undissolved reserve"));
    PhaseTimer::Scope scope(timer_, "remeshing");
    AdaptResult result;
    result.cells_before = n_cells();
    dealii::Vector<float> estimate = cell_error_estimates(u);
    if (limits.floor > 0)
      {
        const Vector ghosted = make_ghosted(u);
        dealii::Vector<double> values(fe_.n_dofs_per_cell());
        for (const auto &cell : dof_handler_.active_cell_iterators())
          if (cell->is_locally_owned())
            {
              cell->get_dof_values(ghosted, values);
              estimate[cell->active_cell_index()] /= static_cast<float>(std::max(values.linfty_norm(), limits.floor));
            }
      }
    unsigned long refine = 0, coarsen = 0;
    const auto vertex_cells = GridTools::vertex_to_cell_map(*triangulation_);
    for (const auto &cell : triangulation_->active_cell_iterators())
      {
        if (!cell->is_locally_owned())
          continue;
        const double e = estimate[cell->active_cell_index()];
        const double h = cell->diameter();
        if (e > limits.refine_above && h >= 2 * limits.smallest)
          {
            cell->set_refine_flag();
            ++refine;
          }
        else if (e < limits.coarsen_below && cell->level() > 0 && (!(limits.largest > 0) || 2 * h <= limits.largest))
          {
            // p4est keeps cells that share a vertex within one level of each other: a cell that
            // touches a finer one cannot go up a level yet (flagging it would rebuild the space
            // for nothing).
            bool next_to_finer = false;
            for (const unsigned int v : cell->vertex_indices())
              for (const auto &neighbour : vertex_cells[cell->vertex_index(v)])
                if (neighbour->level() > cell->level())
                  next_to_finer = true;
            if (next_to_finer)
              continue;
            cell->set_coarsen_flag();
            ++coarsen;
          }
      }
    // One layer of cells around each refined one is refined too (unless finer already): a front
    // moves into the cells ahead of it before the next remeshing, and those show no error yet.
    std::vector<typename Triangulation<dim>::active_cell_iterator> ahead;
    for (const auto &cell : triangulation_->active_cell_iterators())
      if (cell->is_locally_owned() && cell->refine_flag_set())
        for (const unsigned int v : cell->vertex_indices())
          for (const auto &neighbour : vertex_cells[cell->vertex_index(v)])
            if (neighbour->is_locally_owned() && !neighbour->refine_flag_set() && neighbour->level() <= cell->level() &&
                neighbour->diameter() >= 2 * limits.smallest)
              ahead.push_back(neighbour);
    for (auto &cell : ahead)
      if (!cell->refine_flag_set())
        {
          cell->clear_coarsen_flag();
          cell->set_refine_flag();
          ++refine;
        }
    result.marked_refine = Utilities::MPI::sum(refine, communicator_);
    result.marked_coarsen = Utilities::MPI::sum(coarsen, communicator_);
    triangulation_->prepare_coarsening_and_refinement();
    // Coarsening needs every sibling flagged: what is left after preparation decides.
    unsigned int flagged = 0;
    for (const auto &cell : triangulation_->active_cell_iterators())
      if (cell->is_locally_owned() && (cell->refine_flag_set() || cell->coarsen_flag_set()))
        flagged = 1;
    if (Utilities::MPI::max(flagged, communicator_) == 0)
      {
        result.cells_after = result.cells_before;
        return result;
      }

    std::vector<Vector> carried;
    for (const Vector *state : states)
      carried.push_back(make_ghosted(*state));
    std::vector<Vector> moved;
    if constexpr (dim == 1)
      {
        // One rank (1-D runs are serial): the serial transfer, on vectors holding every entry.
        SolutionTransfer<dim, Vector> transfer(dof_handler_);
        transfer.prepare_for_coarsening_and_refinement(carried);
        triangulation_->execute_coarsening_and_refinement();
        setup_dofs(false);
        moved.assign(carried.size(), make_vector());
        transfer.interpolate(carried, moved);
      }
    else
      {
        parallel::distributed::SolutionTransfer<dim, Vector> transfer(dof_handler_);
        std::vector<const Vector *> in;
        for (const Vector &v : carried)
          in.push_back(&v);
        transfer.prepare_for_coarsening_and_refinement(in);
        triangulation_->execute_coarsening_and_refinement();
        setup_dofs(false);
        moved.assign(carried.size(), make_vector());
        std::vector<Vector *> out;
        for (Vector &v : moved)
          out.push_back(&v);
        transfer.interpolate(out);
      }
    for (std::size_t k = 0; k < states.size(); ++k)
      {
        moved[k].compress(VectorOperation::insert);
        *states[k] = moved[k];
        distribute(*states[k]);
      }

    remake_operators();
    result.cells_after = n_cells();
    result.changed = true;
    return result;
  }

  template <int dim>
  void DiffusionProblem<dim>::remake_operators()
  {
    // The operators of the current stage on the new mesh; the next step builds its system and
    // preconditioner anew.
    make_operators();
    setup_fixed_unknowns();
    assemble_constant_parts();
    system_key_.clear();
    hierarchy_key_.clear();
    dynamic_valid_ = false;
    depleted_.clear();
  }

  template <int dim>
  std::vector<std::string> DiffusionProblem<dim>::active_cells() const
  {
    std::vector<std::string> mine;
    for (const auto &cell : triangulation_->active_cell_iterators())
      if (cell->is_locally_owned())
        mine.push_back(cell->id().to_string());
    std::vector<std::string> all;
    for (auto &part : Utilities::MPI::all_gather(communicator_, mine))
      all.insert(all.end(), part.begin(), part.end());
    std::sort(all.begin(), all.end());
    return all;
  }

  template <int dim>
  void DiffusionProblem<dim>::rebuild(const std::vector<std::string> &cells)
  {
    std::set<CellId> leaves, ancestors;
    try
      {
        for (const std::string &text : cells)
          {
            const CellId id(text);
            leaves.insert(id);
            std::vector<std::uint8_t> path(id.get_child_indices().begin(), id.get_child_indices().end());
            while (!path.empty())
              {
                path.pop_back();
                ancestors.insert(CellId(id.get_coarse_cell_id(), path));
              }
          }
      }
    catch (const std::exception &)
      {
        throw IoError("the checkpoint's mesh is damaged (a cell that is not one)");
      }
    // Each round refines the cells above a leaf and coarsens those below one; p4est's balance
    // may add cells on the way, which later rounds take back. A mesh grown from this one by
    // refinement and coarsening is reached in as many rounds as it has levels, about.
    for (unsigned int round = 0; round < 64; ++round)
      {
        unsigned int flagged = 0, foreign = 0;
        for (const auto &cell : triangulation_->active_cell_iterators())
          {
            if (!cell->is_locally_owned())
              continue;
            const CellId id = cell->id();
            if (leaves.count(id))
              continue;
            if (ancestors.count(id))
              cell->set_refine_flag();
            else if (cell->level() > 0)
              cell->set_coarsen_flag();
            else
              foreign = 1;
            flagged = 1;
          }
        if (Utilities::MPI::max(foreign, communicator_) != 0)
          throw IoError("the checkpoint's mesh was not grown from this case's mesh");
        if (Utilities::MPI::max(flagged, communicator_) == 0)
          {
            if (triangulation_->n_global_active_cells() != cells.size())
              throw IoError("the checkpoint's mesh does not fit this case's mesh");
            setup_dofs(false);
            remake_operators();
            return;
          }
        triangulation_->prepare_coarsening_and_refinement();
        triangulation_->execute_coarsening_and_refinement();
      }
    throw IoError("the checkpoint's mesh could not be made again from this case's mesh");
  }

  template void DiffusionProblem<1>::set_fixed_values(Vector &, double) const;
  template void DiffusionProblem<2>::set_fixed_values(Vector &, double) const;
  template void DiffusionProblem<3>::set_fixed_values(Vector &, double) const;
  template dealii::Vector<float> DiffusionProblem<1>::cell_error_estimates(const Vector &) const;
  template dealii::Vector<float> DiffusionProblem<2>::cell_error_estimates(const Vector &) const;
  template dealii::Vector<float> DiffusionProblem<3>::cell_error_estimates(const Vector &) const;
  template AdaptResult DiffusionProblem<1>::adapt(const Vector &, const AdaptLimits &, const std::vector<Vector *> &);
  template AdaptResult DiffusionProblem<2>::adapt(const Vector &, const AdaptLimits &, const std::vector<Vector *> &);
  template AdaptResult DiffusionProblem<3>::adapt(const Vector &, const AdaptLimits &, const std::vector<Vector *> &);
  template std::vector<std::string> DiffusionProblem<1>::active_cells() const;
  template std::vector<std::string> DiffusionProblem<2>::active_cells() const;
  template std::vector<std::string> DiffusionProblem<3>::active_cells() const;
  template void DiffusionProblem<1>::rebuild(const std::vector<std::string> &);
  template void DiffusionProblem<2>::rebuild(const std::vector<std::string> &);
  template void DiffusionProblem<3>::rebuild(const std::vector<std::string> &);
  template void DiffusionProblem<1>::remake_operators();
  template void DiffusionProblem<2>::remake_operators();
  template void DiffusionProblem<3>::remake_operators();
} // namespace fickcast
