// DiffusionProblem: when and how the step operator is applied without a matrix.
#include "numerics/diffusion_problem.h"
#include "numerics/matrix_free_step.h"
#include "numerics/step_multigrid.h"

#include <algorithm>
#include <set>

namespace fickcast
{
  using namespace dealii;

  namespace
  {
    template <int dim>
    using StepCoefficients = typename StepMultigrid<dim>::Coefficients;

    /// The coefficients of the step operator at the points of a mesh's cells and boundary faces
    /// (the regions by the cells' material ids, which coarser meshes keep).
    template <int dim>
    StepCoefficients<dim> step_coefficients(const DiffusionProblem<dim> &problem,
                                            const std::vector<Material> &materials, const std::vector<int> &unit_index,
                                            const std::vector<BoundaryCondition> &boundaries,
                                            const Mapping<dim> &mapping, const unsigned int n_q_1d)
    {
      // Key index of each region's unit part, as build_system orders the key.
      std::vector<int> slot(unit_index.size(), -1);
      int next = 2;
      for (std::size_t r = 0; r < unit_index.size(); ++r)
        if (unit_index[r] >= 0)
          slot[r] = next++;
      using Step = MatrixFreeStep<dim>;
      StepCoefficients<dim> out;
      out.mapping = &mapping;
      out.n_slots = static_cast<unsigned int>(next);
      out.n_q_1d = n_q_1d;
      out.cell = [&problem, &materials, &unit_index, slot](const typename Step::CellIterator &c, const Point<dim> &p) {
        typename Step::Coefficients at;
        const auto region = c->material_id();
        const Material &material = materials[region];
        const double w = problem.coordinate_weight(p);
        at.capacity = material.capacity() * w;
        at.reaction = material.reaction() * w;
        if (unit_index[region] >= 0)
          {
            at.slot = slot[region];
            at.unit_factor = material.conductance_factor() * w;
          }
        else
          at.conductance = problem.conductance(region, p, 0.0) * w;
        return at;
      };
      for (std::size_t b = 0; b < boundaries.size(); ++b)
        {
          out.with_faces = out.with_faces || boundaries[b].kind() == BoundaryKind::transfer;
          if (boundaries[b].is_fixed())
            out.held_boundaries.insert(static_cast<types::boundary_id>(b));
        }
      out.face = [&problem, &materials, &boundaries](const typename Step::CellIterator &c, const unsigned int f,
                                                     const Point<dim> &p) {
        const BoundaryCondition &b = boundaries[c->face(f)->boundary_id()];
        if (b.kind() != BoundaryKind::transfer)
          return 0.0;
        return b.load_factor(materials[c->material_id()].partition()) * problem.coordinate_weight(p);
      };
      return out;
    }
  } // namespace

  template <int dim>
  bool DiffusionProblem<dim>::matrix_free_applies() const
  {
    // Degree 1: a Q1 matrix is cheap to stream (27 entries a row in 3-D), and the product without
    // it costs 4.5 times more on this deal.II (no SIMD): 41 ms against 9 ms at 227k unknowns.
    // Water flow makes the step operator unsymmetric (advection, streamline upwinding).
    if (dim == 1 || fe_.degree < 2 || !description_.numerics.matrix_free || nonlinear_ || dispersed_ || has_flow() ||
        !solver_ || solver_->is_direct() || description_.numerics.linear_solver == LinearSolverKind::multigrid)
      return false;
    if (std::any_of(dynamic_.begin(), dynamic_.end(), [](bool d) { return d; }))
      return false;
    return Utilities::MPI::min(owned_.is_contiguous() ? 1 : 0, communicator_) == 1;
  }

  template <int dim>
  void DiffusionProblem<dim>::make_matrix_free()
  {
    if constexpr (dim == 1)
      return;
    else
      {
        step_multigrid_.reset();
        step_multigrid_failed_ = false;
        if (!matrix_free_applies())
          {
            matrix_free_.reset();
            return;
          }
        const StepCoefficients<dim> coefficients =
          step_coefficients(*this, materials_, unit_index_, boundaries_, mapping_, quadrature_points_per_axis());
        std::vector<unsigned int> held;
        for (const auto &[dof, b] : fixed_dofs_)
          {
            (void)b;
            held.push_back(static_cast<unsigned int>(owned_.index_within_set(dof)));
          }
        if (!matrix_free_)
          matrix_free_ = std::make_unique<MatrixFreeStep<dim>>();
        matrix_free_->reinit(mapping_, dof_handler_, hanging_, held, coefficients.n_slots, coefficients.n_q_1d,
                             coefficients.cell, coefficients.with_faces, coefficients.face);
        part_diagonals_ = matrix_free_->part_diagonals();
        rows_next_to_fixed_valid_ = false;
      }
  }

  template <int dim>
  bool DiffusionProblem<dim>::use_matrix_free(const std::vector<double> &key)
  {
    if (!products_without_matrix())
      return false;
    const double number = diffusion_number(key);
    if (solver_->set_operator(*matrix_free_, number))
      {
        matrix_free_->set_weights(key);
        return true;
      }
    // Stiffer steps: geometric multigrid on the same operator, built on first need.
    if constexpr (dim > 1)
      {
        if (step_multigrid_failed_ || !solver_->geometric_usable() || solver_->is_direct())
          return false;
        if (!step_multigrid_)
          {
            PhaseTimer::Scope scope(timer_, "multigrid setup");
            auto multigrid = std::make_unique<StepMultigrid<dim>>();
            if (!multigrid->build(*matrix_free_, dof_handler_,
                                  step_coefficients(*this, materials_, unit_index_, boundaries_, mapping_,
                                                    quadrature_points_per_axis())))
              {
                step_multigrid_failed_ = true;
                return false;
              }
            step_multigrid_ = std::move(multigrid);
          }
        matrix_free_->set_weights(key);
        step_multigrid_->set_weights(key);
        solver_->set_operator_multigrid(*matrix_free_, *step_multigrid_, step_multigrid_->n_meshes(), number);
        return true;
      }
    return false;
  }

  template <int dim>
  bool DiffusionProblem<dim>::products_without_matrix() const
  {
    return matrix_free_ && matrix_free_->is_set_up();
  }

  template <int dim>
  std::vector<double> DiffusionProblem<dim>::operator_key(const double a, const double w, const double t) const
  {
    std::vector<double> key{a, w};
    for (unsigned int r = 0; r < unit_index_.size(); ++r)
      if (unit_index_[r] >= 0)
        key.push_back(w * materials_[r].diffusivity(0, 0, 0, t, 0));
    return key;
  }

  template <int dim>
  void DiffusionProblem<dim>::product_without_matrix(const std::vector<double> &key, const Vector &x, Vector &out,
                                                     const bool constrained) const
  {
    matrix_free_->apply(key, x, out, constrained);
  }

  template <int dim>
  void DiffusionProblem<dim>::inverse_diagonal_without_matrix(const std::vector<double> &key, Vector &out) const
  {
    matrix_free_->inverse_diagonal(key, out);
  }

  template <int dim>
  void DiffusionProblem<dim>::mass_product(const Vector &x, Vector &out) const
  {
    if (products_without_matrix())
      matrix_free_->apply(operator_key(1, 0, 0), x, out, false);
    else
      mass_.full.vmult(out, x);
  }

  template <int dim>
  std::vector<double> DiffusionProblem<dim>::rows_of_product(const std::vector<double> &key,
                                                             const std::vector<types::global_dof_index> &rows,
                                                             const Vector &x) const
  {
    Vector out = make_vector();
    matrix_free_->apply(key, x, out, false);
    std::vector<double> values;
    values.reserve(rows.size());
    for (const auto row : rows)
      values.push_back(out[row]);
    return values;
  }

  template <int dim>
  std::vector<types::global_dof_index> DiffusionProblem<dim>::rows_next_to_fixed_by_cells() const
  {
    // A row couples to a held unknown where a cell holds both, a hanging node standing for its
    // parents (as in the condensed matrices' pattern).
    auto held = [&](const types::global_dof_index dof) {
      return constraints_.is_constrained(dof) && !hanging_.is_constrained(dof);
    };
    std::vector<types::global_dof_index> dofs(fe_.n_dofs_per_cell()), expanded;
    std::set<types::global_dof_index> rows;
    for (const auto &cell : dof_handler_.active_cell_iterators())
      {
        if (!cell->is_locally_owned() && !cell->is_ghost())
          continue;
        cell->get_dof_indices(dofs);
        expanded.clear();
        for (const auto dof : dofs)
          if (const auto *entries = hanging_.get_constraint_entries(dof))
            for (const auto &entry : *entries)
              expanded.push_back(entry.first);
          else
            expanded.push_back(dof);
        if (!std::any_of(expanded.begin(), expanded.end(), held))
          continue;
        for (const auto dof : expanded)
          if (owned_.is_element(dof))
            rows.insert(dof);
      }
    return {rows.begin(), rows.end()};
  }

  template <int dim>
  void DiffusionProblem<dim>::ensure_matrices()
  {
    if (matrices_ready_)
      return;
    if (!matrices_sized_)
      size_matrices();
    assemble_parts();
  }

  template bool DiffusionProblem<1>::matrix_free_applies() const;
  template bool DiffusionProblem<2>::matrix_free_applies() const;
  template bool DiffusionProblem<3>::matrix_free_applies() const;
  template void DiffusionProblem<1>::make_matrix_free();
  template void DiffusionProblem<2>::make_matrix_free();
  template void DiffusionProblem<3>::make_matrix_free();
  template bool DiffusionProblem<1>::products_without_matrix() const;
  template bool DiffusionProblem<2>::products_without_matrix() const;
  template bool DiffusionProblem<3>::products_without_matrix() const;
  template std::vector<double> DiffusionProblem<1>::operator_key(double, double, double) const;
  template std::vector<double> DiffusionProblem<2>::operator_key(double, double, double) const;
  template std::vector<double> DiffusionProblem<3>::operator_key(double, double, double) const;
  template void DiffusionProblem<1>::mass_product(const DiffusionProblem<1>::Vector &,
                                                  DiffusionProblem<1>::Vector &) const;
  template void DiffusionProblem<2>::mass_product(const DiffusionProblem<2>::Vector &,
                                                  DiffusionProblem<2>::Vector &) const;
  template void DiffusionProblem<3>::mass_product(const DiffusionProblem<3>::Vector &,
                                                  DiffusionProblem<3>::Vector &) const;
  template std::vector<double> DiffusionProblem<1>::rows_of_product(const std::vector<double> &,
                                                                    const std::vector<types::global_dof_index> &,
                                                                    const DiffusionProblem<1>::Vector &) const;
  template std::vector<double> DiffusionProblem<2>::rows_of_product(const std::vector<double> &,
                                                                    const std::vector<types::global_dof_index> &,
                                                                    const DiffusionProblem<2>::Vector &) const;
  template std::vector<double> DiffusionProblem<3>::rows_of_product(const std::vector<double> &,
                                                                    const std::vector<types::global_dof_index> &,
                                                                    const DiffusionProblem<3>::Vector &) const;
  template std::vector<types::global_dof_index> DiffusionProblem<1>::rows_next_to_fixed_by_cells() const;
  template std::vector<types::global_dof_index> DiffusionProblem<2>::rows_next_to_fixed_by_cells() const;
  template std::vector<types::global_dof_index> DiffusionProblem<3>::rows_next_to_fixed_by_cells() const;
  template void DiffusionProblem<1>::ensure_matrices();
  template void DiffusionProblem<1>::product_without_matrix(const std::vector<double> &,
                                                            const DiffusionProblem<1>::Vector &,
                                                            DiffusionProblem<1>::Vector &, bool) const;
  template void DiffusionProblem<1>::inverse_diagonal_without_matrix(const std::vector<double> &,
                                                                     DiffusionProblem<1>::Vector &) const;
  template void DiffusionProblem<2>::ensure_matrices();
  template void DiffusionProblem<2>::product_without_matrix(const std::vector<double> &,
                                                            const DiffusionProblem<2>::Vector &,
                                                            DiffusionProblem<2>::Vector &, bool) const;
  template void DiffusionProblem<2>::inverse_diagonal_without_matrix(const std::vector<double> &,
                                                                     DiffusionProblem<2>::Vector &) const;
  template void DiffusionProblem<3>::ensure_matrices();
  template void DiffusionProblem<3>::product_without_matrix(const std::vector<double> &,
                                                            const DiffusionProblem<3>::Vector &,
                                                            DiffusionProblem<3>::Vector &, bool) const;
  template void DiffusionProblem<3>::inverse_diagonal_without_matrix(const std::vector<double> &,
                                                                     DiffusionProblem<3>::Vector &) const;
  template bool DiffusionProblem<1>::use_matrix_free(const std::vector<double> &);
  template bool DiffusionProblem<2>::use_matrix_free(const std::vector<double> &);
  template bool DiffusionProblem<3>::use_matrix_free(const std::vector<double> &);
} // namespace fickcast
