// DiffusionProblem: one time step. Lifting of fixed unknowns, bath balances by superposition,
// the undissolved reserve as an active set, and Newton or Picard iterations for a
// concentration-dependent diffusivity.
#include "numerics/diffusion_problem.h"

#include "case/input_error.h"

#include <deal.II/base/mpi.h>
#include <deal.II/lac/full_matrix.h>
#include <deal.II/lac/solver_cg.h>
#include <deal.II/lac/trilinos_precondition.h>

#include <Epetra_CrsMatrix.h>
#include <Epetra_Import.h>
#include <Epetra_Vector.h>
#include <deal.II/lac/vector.h>

#include <algorithm>
#include <cmath>

namespace fickcast
{
  using namespace dealii;

  namespace
  {
    /// @p owned in the column numbering of @p matrix (its owned and ghost columns): what a row
    /// of it multiplies, read without a look-up per entry.
    Epetra_Vector in_columns(const TrilinosWrappers::SparseMatrix &matrix, const TrilinosWrappers::MPI::Vector &owned)
    {
      const Epetra_CrsMatrix &m = matrix.trilinos_matrix();
      const Epetra_MultiVector &source = owned.trilinos_vector();
      Epetra_Vector columns(m.ColMap(), false);
      if (m.Importer() != nullptr)
        columns.Import(source, *m.Importer(), Insert);
      else
        for (int k = 0; k < columns.MyLength(); ++k)
          columns[k] = source[0][k];
      return columns;
    }

    /// The stored entries of local row @p local of @p m, read in place.
    struct RowView
    {
      RowView(const Epetra_CrsMatrix &m, const int local) { m.ExtractMyRowView(local, n, values, indices); }
      int n = 0;
      double *values = nullptr;
      int *indices = nullptr; ///< local column indices
    };

    /// Local row of the owned global row @p row of @p m.
    int local_row(const Epetra_CrsMatrix &m, const types::global_dof_index row)
    {
      return m.LRID(static_cast<TrilinosWrappers::types::int_type>(row));
    }

    /// Owned row @p row of @p matrix times @p columns (in_columns of the same matrix).
    double row_product(const TrilinosWrappers::SparseMatrix &matrix, const types::global_dof_index row,
                       const Epetra_Vector &columns)
    {
      const RowView r(matrix.trilinos_matrix(), local_row(matrix.trilinos_matrix(), row));
      double sum = 0;
      for (int k = 0; k < r.n; ++k)
        sum += r.values[k] * columns[r.indices[k]];
      return sum;
    }

    /// sum_j weight_j (A_j x)_row over @p rows, for the matrices and weights of @p terms.
    std::vector<double> rows_of_sum(const std::vector<std::pair<const TrilinosWrappers::SparseMatrix *, double>> &terms,
                                    const std::vector<types::global_dof_index> &rows,
                                    const TrilinosWrappers::MPI::Vector &x)
    {
      std::vector<double> out(rows.size(), 0.0);
      for (const auto &[matrix, weight] : terms)
        {
          const Epetra_Vector columns = in_columns(*matrix, x);
          for (std::size_t i = 0; i < rows.size(); ++i)
            out[i] += weight * row_product(*matrix, rows[i], columns);
        }
      return out;
    }
  } // namespace

  template <int dim>
  std::vector<std::pair<const TrilinosWrappers::SparseMatrix *, double>>
  DiffusionProblem<dim>::operator_terms(const StepPlan &plan, const bool frozen) const
  {
    const bool dynamic = dynamic_matrices_.full.m() != 0;
    const bool dynamic_usable = dynamic && dynamic_valid_ && !dynamic_is_jacobian_;
    if (!frozen && (nonlinear_ || (dynamic && !(dynamic_usable && dynamic_time_ == plan.t1))))
      return {};
    std::vector<std::pair<const TrilinosWrappers::SparseMatrix *, double>> terms{{&mass_.full, plan.a0},
                                                                                 {&static_.full, plan.w1}};
    for (unsigned int r = 0; r < unit_index_.size(); ++r)
      if (unit_index_[r] >= 0)
        terms.emplace_back(&unit_[static_cast<std::size_t>(unit_index_[r])].full,
                           plan.w1 * materials_[r].diffusivity(0, 0, 0, plan.t1, 0));
    if (dynamic_usable)
      terms.emplace_back(&dynamic_matrices_.full, plan.w1);
    return terms;
  }

  template <int dim>
  const std::vector<types::global_dof_index> &DiffusionProblem<dim>::rows_next_to_fixed()
  {
    if (rows_next_to_fixed_valid_)
      return rows_next_to_fixed_;
    if (!matrices_sized_)
      {
        rows_next_to_fixed_ = rows_next_to_fixed_by_cells();
        rows_next_to_fixed_valid_ = true;
        return rows_next_to_fixed_;
      }
    Vector marks = make_vector();
    for (const auto &[dof, b] : fixed_dofs_)
      {
        (void)b;
        marks[dof] = 1.0;
      }
    marks.compress(VectorOperation::insert);
    // By the pattern (a row whose entries at fixed columns cancel still couples to them).
    const Epetra_Vector columns = in_columns(mass_.full, marks);
    const Epetra_CrsMatrix &m = mass_.full.trilinos_matrix();
    rows_next_to_fixed_.clear();
    for (const auto row : owned_)
      {
        const RowView r(m, local_row(m, row));
        if (std::any_of(r.indices, r.indices + r.n, [&](const int k) { return columns[k] != 0; }))
          rows_next_to_fixed_.push_back(row);
      }
    rows_next_to_fixed_valid_ = true;
    return rows_next_to_fixed_;
  }

  template <int dim>
  void DiffusionProblem<dim>::build_system(const StepPlan &plan, const bool jacobian)
  {
    std::vector<double> key{plan.a0, plan.w1};
    for (unsigned int r = 0; r < unit_index_.size(); ++r)
      if (unit_index_[r] >= 0)
        key.push_back(plan.w1 * materials_[r].diffusivity(0, 0, 0, plan.t1, 0));
    if (dynamic_matrices_.full.m() != 0)
      key.push_back(static_cast<double>(dynamic_version_));
    key.push_back(jacobian ? 1.0 : 0.0);
    if (key == system_key_)
      return;
    PhaseTimer::Scope scope(timer_, "matrix setup");
    if (!jacobian && use_matrix_free(key))
      {
        system_key_ = key;
        return;
      }
    compose_system(key);
    if (dynamic_matrices_.full.m() != 0)
      system_.add(plan.w1, dynamic_matrices_.constrained);

    // Keep the preconditioner while the weights relative to the mass stay within a factor 3 and
    // nothing assembled anew (dynamic parts, Jacobians) entered the matrix.
    double change = 0;
    const bool comparable =
      !hierarchy_key_.empty() && hierarchy_key_.size() == key.size() && dynamic_matrices_.full.m() == 0 && !jacobian;
    if (comparable)
      {
        change = 1;
        for (std::size_t i = 1; i + 1 < key.size(); ++i)
          {
            const double now = key[i] / key[0], then = hierarchy_key_[i] / hierarchy_key_[0];
            if (!(now > 0 && then > 0))
              {
                change = 0;
                break;
              }
            const double ratio = now / then;
            change = std::max(change, std::max(ratio, 1 / ratio));
          }
      }
    const unsigned int before = solver_->n_setups();
    solver_->set_matrix(system_, change, !jacobian && !has_flow(), jacobian ? -1.0 : diffusion_number(key));
    if (solver_->n_setups() != before)
      hierarchy_key_ = key;
    system_key_ = key;
  }

  template <int dim>
  double DiffusionProblem<dim>::diffusion_number(const std::vector<double> &key)
  {
    const auto diagonal_of = [](const TrilinosWrappers::SparseMatrix &matrix) {
      const Epetra_CrsMatrix &m = matrix.trilinos_matrix();
      Epetra_Vector d(m.RowMap());
      m.ExtractDiagonalCopy(d);
      return std::vector<double>(d.Values(), d.Values() + d.MyLength());
    };
    const double mass_weight = key[0];
    double largest = 0;
    if (mass_weight > 0)
      {
        // The system's diagonal as compose_system sums it (same order), from the parts' diagonals.
        const bool dynamic = dynamic_matrices_.full.m() != 0;
        std::vector<double> system_diagonal;
        if (dynamic)
          system_diagonal = diagonal_of(system_);
        if (part_diagonals_.empty())
          {
            part_diagonals_.push_back(diagonal_of(mass_.constrained));
            part_diagonals_.push_back(diagonal_of(static_.constrained));
            for (unsigned int r = 0; r < unit_index_.size(); ++r)
              if (unit_index_[r] >= 0)
                part_diagonals_.push_back(diagonal_of(unit_[static_cast<std::size_t>(unit_index_[r])].constrained));
          }
        const std::vector<double> &mass = part_diagonals_[0];
        for (std::size_t i = 0; i < mass.size(); ++i)
          {
            if (constraints_.is_constrained(owned_.nth_index_in_set(i)))
              continue;
            double system = 0;
            if (dynamic)
              system = system_diagonal[i];
            else
              {
                system = mass[i] * key[0];
                for (std::size_t p = 1; p < part_diagonals_.size(); ++p)
                  system += key[p] * part_diagonals_[p][i];
              }
            const double m = mass_weight * mass[i];
            if (m > 0)
              largest = std::max(largest, (system - m) / m);
          }
      }
    return Utilities::MPI::max(largest, communicator_);
  }

  template <int dim>
  void DiffusionProblem<dim>::compose_system(const std::vector<double> &key)
  {
    ensure_matrices();
    std::vector<std::pair<const TrilinosWrappers::SparseMatrix *, double>> parts{{&mass_.constrained, key[0]},
                                                                                 {&static_.constrained, key[1]}};
    std::size_t next = 2;
    for (unsigned int r = 0; r < unit_index_.size(); ++r)
      if (unit_index_[r] >= 0)
        parts.emplace_back(&unit_[static_cast<std::size_t>(unit_index_[r])].constrained, key[next++]);

    // Every part is made from one sparsity pattern, so once system_ has it the sum is one pass
    // over the entries (the same arithmetic, in the same order, as copy, scale and add).
    bool same_layout = system_.m() == mass_.constrained.m() && system_.m() != 0;
    if (same_layout)
      {
        const Epetra_CrsMatrix &out = system_.trilinos_matrix();
        for (const auto &part : parts)
          same_layout = same_layout && part.first->trilinos_matrix().NumMyNonzeros() == out.NumMyNonzeros() &&
                        part.first->trilinos_matrix().RowMap().SameAs(out.RowMap()) &&
                        part.first->trilinos_matrix().ColMap().SameAs(out.ColMap());
      }
    if (same_layout)
      {
        // Values are written in place (the wrapper keeps no copy of them).
        auto &out = const_cast<Epetra_CrsMatrix &>(system_.trilinos_matrix());
        std::vector<const Epetra_CrsMatrix *> inputs;
        for (const auto &part : parts)
          inputs.push_back(&part.first->trilinos_matrix());
        for (int row = 0; row < out.NumMyRows() && same_layout; ++row)
          {
            const RowView target(out, row);
            std::vector<const double *> in_values(parts.size());
            for (std::size_t p = 0; p < parts.size() && same_layout; ++p)
              {
                const RowView in(*inputs[p], row);
                in_values[p] = in.values;
                same_layout = in.n == target.n && std::equal(target.indices, target.indices + target.n, in.indices);
              }
            if (!same_layout)
              break;
            for (int k = 0; k < target.n; ++k)
              {
                double v = in_values[0][k] * parts[0].second;
                for (std::size_t p = 1; p < parts.size(); ++p)
                  v += parts[p].second * in_values[p][k];
                target.values[k] = v;
              }
          }
        if (same_layout)
          return;
      }
    system_.copy_from(mass_.constrained);
    system_ *= key[0];
    for (std::size_t p = 1; p < parts.size(); ++p)
      system_.add(parts[p].second, *parts[p].first);
  }

  template <int dim>
  void DiffusionProblem<dim>::apply_frozen(const double t, const Vector &x, Vector &out) const
  {
    // The operator with coefficients as last assembled (linear in x).
    if (products_without_matrix())
      {
        product_without_matrix(operator_key(0, 1, t), x, out, false);
        return;
      }
    static_.full.vmult(out, x);
    Vector tmp = make_vector();
    for (unsigned int r = 0; r < unit_index_.size(); ++r)
      if (unit_index_[r] >= 0)
        {
          unit_[static_cast<std::size_t>(unit_index_[r])].full.vmult(tmp, x);
          out.add(materials_[r].diffusivity(0, 0, 0, t, 0), tmp);
        }
    if (dynamic_matrices_.full.m() != 0 && dynamic_valid_ && !dynamic_is_jacobian_)
      {
        dynamic_matrices_.full.vmult(tmp, x);
        out += tmp;
      }
  }

  template <int dim>
  void DiffusionProblem<dim>::solve_linear(const TrilinosWrappers::SparseMatrix *modified, Vector &x, const Vector &b,
                                           StepResult &result)
  {
    PhaseTimer::Scope scope(timer_, "linear solve");
    result.linear_iterations += modified ? solver_->solve_other(*modified, x, b) : solver_->solve(x, b);
    // A solve without a matrix that did not converge (the diagonal, or geometric multigrid) goes
    // on from where CG got: with geometric multigrid if it has not failed, else with the
    // assembled matrix and algebraic multigrid (which throws rather than hand back).
    while (!modified && solver_->needs_matrix())
      {
        if (!use_matrix_free(system_key_))
          {
            compose_system(system_key_);
            solver_->set_matrix(system_, 0, !has_flow(), diffusion_number(system_key_));
            hierarchy_key_ = system_key_;
          }
        result.linear_iterations += solver_->solve(x, b);
      }
  }

  template <int dim>
  void DiffusionProblem<dim>::solve_fixed(const StepPlan &plan, const Vector &rhs, Vector &u1, Vector &rhs_used,
                                          StepResult &result)
  {
    auto apply_system = [&](const Vector &x, Vector &out) {
      if (products_without_matrix())
        {
          product_without_matrix(operator_key(plan.a0, plan.w1, plan.t1), x, out, false);
          return;
        }
      mass_.full.vmult(out, x);
      out *= plan.a0;
      Vector tmp = make_vector();
      apply_frozen(plan.t1, x, tmp);
      out.add(plan.w1, tmp);
    };
    auto zero_rows = [&](Vector &v, const std::vector<types::global_dof_index> &rows) {
      for (const auto row : rows)
        v[row] = 0;
      v.compress(VectorOperation::insert);
    };

    // Unknowns held fixed in the solve: boundary dofs (known values, or baths by superposition)
    // and saturated nodes of the undissolved reserve (the active set).
    std::vector<bool> is_fixed(owned_.n_elements(), false);
    for (const auto &[dof, b] : fixed_dofs_)
      {
        (void)b;
        is_fixed[owned_.index_within_set(dof)] = true;
      }
    std::vector<types::global_dof_index> active;
    if (dispersed_)
      for (const auto dof : owned_)
        {
          const auto local = owned_.index_within_set(dof);
          if (dispersed_node_[local] && !is_fixed[local] && reserve_[dof] > 0)
            active.push_back(dof);
        }

    for (unsigned int pass = 0;; ++pass)
      {
        if (pass > 200)
          throw RunFailure("the saturated zone of the undissolved content did not settle within a step at t = " +
                           std::to_string(plan.t1) + " s");
        // Right-hand side: reserve of nodes that are not saturated dissolves completely.
        rhs_used = rhs;
        if (dispersed_)
          {
            for (const auto dof : owned_)
              if (reserve_[dof] > 0 && std::find(active.begin(), active.end(), dof) == active.end())
                rhs_used[dof] += reserve_[dof];
            rhs_used.compress(VectorOperation::insert);
          }
        std::vector<types::global_dof_index> held = active;
        for (const auto &[dof, b] : fixed_dofs_)
          {
            (void)b;
            held.push_back(dof);
          }

        // Lifting of the known values.
        WorkVector lifted_work(*this), b_work(*this), w_work(*this);
        Vector &lifted = *lifted_work;
        for (std::size_t k = 0; k < fixed_dofs_.size(); ++k)
          {
            const unsigned int b = fixed_dofs_[k].second;
            if (boundaries_[b].kind() != BoundaryKind::concentration)
              continue;
            const Point<dim> &p = fixed_points_[k];
            lifted[fixed_dofs_[k].first] =
              boundaries_[b].fixed_value(p[0], dim > 1 ? p[1] : 0.0, dim > 2 ? p[2] : 0.0, plan.t1);
          }
        for (const auto dof : active)
          lifted[dof] = saturation_[dof];
        lifted.compress(VectorOperation::insert);

        const TrilinosWrappers::SparseMatrix *matrix = nullptr;
        if (Utilities::MPI::sum(active.size(), communicator_) > 0)
          {
            modified_.copy_from(system_);
            modified_.clear_rows(active, 1.0);
            matrix = &modified_;
          }

        Vector &b = *b_work;
        b = rhs_used;
        const auto n_active = Utilities::MPI::sum(active.size(), communicator_);
        if (n_active == 0 && Utilities::MPI::sum(fixed_dofs_.size(), communicator_) > 0)
          {
            // The known values sit on the fixed unknowns only: their image lies on the rows next to
            // them (the pattern of every operator matrix is the mass matrix's).
            const auto &rows = rows_next_to_fixed();
            const std::vector<double> image = products_without_matrix()
                                                ? rows_of_product(operator_key(plan.a0, plan.w1, plan.t1), rows, lifted)
                                                : rows_of_sum(operator_terms(plan, true), rows, lifted);
            for (std::size_t i = 0; i < rows.size(); ++i)
              b[rows[i]] -= image[i];
            b.compress(VectorOperation::insert);
          }
        else if (n_active > 0)
          {
            Vector lifted_image = make_vector();
            apply_system(lifted, lifted_image);
            b -= lifted_image;
          }
        zero_rows(b, held);
        Vector &w = *w_work;
        w = u1;
        w -= lifted;
        zero_rows(w, held);
        solve_linear(matrix, w, b, result);
        zero_rows(w, held);
        u1 = w;
        u1 += lifted;

        // Baths: u1 = x0 + sum_j psi_j y_j with y_j the response to a unit value on bath j.
        if (!baths_.empty())
          {
            const std::size_t n = baths_.size();
            std::vector<Vector> responses;
            FullMatrix<double> system(n, n);
            dealii::Vector<double> right(n), psi(n);
            Vector residual = make_vector();
            apply_system(u1, residual);
            residual -= rhs_used;
            auto bath_sum = [&](const Vector &v, const unsigned int bath) {
              double sum = 0;
              for (const auto &[dof, owner] : fixed_dofs_)
                if (owner == bath)
                  sum += v[dof];
              return Utilities::MPI::sum(sum, communicator_);
            };
            for (std::size_t j = 0; j < n; ++j)
              {
                Vector unit = make_vector();
                for (const auto &[dof, owner] : fixed_dofs_)
                  if (owner == baths_[j])
                    unit[dof] = 1.0;
                unit.compress(VectorOperation::insert);
                Vector image = make_vector(), response = make_vector(), right_side = make_vector();
                apply_system(unit, image);
                right_side.equ(-1.0, image);
                zero_rows(right_side, held);
                solve_linear(matrix, response, right_side, result);
                zero_rows(response, held);
                response += unit;
                apply_system(response, image);
                for (std::size_t k = 0; k < n; ++k)
                  system(k, j) = bath_sum(image, baths_[k]);
                responses.push_back(response);
              }
            for (std::size_t k = 0; k < n; ++k)
              {
                const double capacity = boundaries_[baths_[k]].bath_capacity();
                system(k, k) += capacity * plan.a0;
                right(k) = -capacity * (plan.a1 * bath_value_[baths_[k]] + plan.a2 * bath_value_prev_[baths_[k]]) -
                           bath_sum(residual, baths_[k]);
              }
            system.gauss_jordan();
            system.vmult(psi, right);
            for (std::size_t j = 0; j < n; ++j)
              {
                u1.add(psi(j), responses[j]);
                bath_trial_[baths_[j]] = psi(j);
              }
          }

        if (!dispersed_)
          return;

        // Active set: saturated nodes keep their reserve while it lasts; others dissolve it all.
        Vector residual = make_vector();
        apply_system(u1, residual);
        residual -= rhs_used;
        reserve_trial_ = 0;
        // The saturated set only shrinks within a step: a node whose reserve would be overdrawn
        // dissolves it completely and is solved for freely in the next pass.
        std::vector<types::global_dof_index> next;
        for (const auto dof : active)
          {
            const double left = reserve_[dof] - residual[dof];
            if (left > 0)
              {
                next.push_back(dof);
                reserve_trial_[dof] = left;
              }
          }
        reserve_trial_.compress(VectorOperation::insert);
        const bool changed = Utilities::MPI::max(next == active ? 0 : 1, communicator_) != 0;
        ++result.active_set_iterations;
        if (!changed)
          {
            depleted_.clear();
            for (const auto dof : owned_)
              if (reserve_[dof] > 0 && reserve_trial_[dof] <= 0)
                depleted_.push_back(dof);
            return;
          }
        active = next;
      }
  }

  template <int dim>
  void DiffusionProblem<dim>::newton(const StepPlan &plan, const Vector &rhs, Vector &u1, StepResult &result)
  {
    // Fixed unknowns at their values at t1, then increments that keep them.
    for (std::size_t k = 0; k < fixed_dofs_.size(); ++k)
      {
        const unsigned int b = fixed_dofs_[k].second;
        const Point<dim> &p = fixed_points_[k];
        u1[fixed_dofs_[k].first] =
          boundaries_[b].fixed_value(p[0], dim > 1 ? p[1] : 0.0, dim > 2 ? p[2] : 0.0, plan.t1);
      }
    u1.compress(VectorOperation::insert);
    const double scale = std::max(concentration_scale(), 1e-300);
    result.converged = false;
    for (unsigned int iteration = 0; iteration < description_.numerics.max_nonlinear_iterations; ++iteration)
      {
        ++result.nonlinear_iterations;
        const Vector ghosted = make_ghosted(u1);
        assemble_dynamic(plan.t1, &ghosted, true);
        build_system(plan, true);
        Vector residual = make_vector(), tmp = make_vector();
        mass_product(u1, residual);
        residual *= plan.a0;
        apply_operator(plan.t1, u1, tmp);
        residual.add(plan.w1, tmp);
        residual -= rhs;
        zero_fixed(residual);
        zero_hanging(residual);
        residual *= -1.0;
        Vector increment = make_vector();
        solve_linear(nullptr, increment, residual, result);
        zero_fixed(increment);
        zero_hanging(increment);
        u1 += increment;
        distribute(u1);
        if (increment.linfty_norm() <= description_.numerics.nonlinear_tolerance * scale)
          {
            result.converged = true;
            return;
          }
      }
  }

  template <int dim>
  StepResult DiffusionProblem<dim>::advance(const StepPlan &plan, const Vector &u0, const Vector *u_prev, Vector &u1)
  {
    StepResult result;
    // Right-hand side without reactions: -M (a1 u0 + a2 u_prev) + w1 F1 - w0 (L0 u0 - F0).
    WorkVector rhs_work(*this), tmp_work(*this), f_work(*this), rhs_used_work(*this);
    Vector &rhs = *rhs_work, &tmp = *tmp_work, &f = *f_work;
    tmp.equ(plan.a1, u0);
    if (plan.a2 != 0)
      {
        Assert(u_prev != nullptr, ExcMessage("BDF2 needs the previous state"));
        tmp.add(plan.a2, *u_prev);
      }
    mass_product(tmp, rhs);
    rhs *= -1.0;
    forcing(plan.t1, f);
    rhs.add(plan.w1, f);
    if (plan.w0 != 0)
      {
        if (dynamic_matrices_.full.m() != 0 && !nonlinear_)
          assemble_dynamic(plan.t0, nullptr, false);
        apply_operator(plan.t0, u0, tmp);
        rhs.add(-plan.w0, tmp);
        forcing(plan.t0, f);
        rhs.add(plan.w0, f);
      }

    Vector &rhs_used = *rhs_used_work;
    rhs_used = rhs;
    const bool use_newton = nonlinear_ && description_.numerics.newton && baths_.empty() && !dispersed_;
    if (use_newton)
      newton(plan, rhs, u1, result);
    else
      {
        if (dynamic_matrices_.full.m() != 0 && !nonlinear_ && (!dynamic_valid_ || dynamic_time_ != plan.t1))
          assemble_dynamic(plan.t1, nullptr, false);
        const double scale = std::max(concentration_scale(), 1e-300);
        result.converged = !nonlinear_;
        const unsigned int passes = nonlinear_ ? description_.numerics.max_nonlinear_iterations : 1;
        for (unsigned int iteration = 0; iteration < passes; ++iteration)
          {
            WorkVector previous_work(*this);
            Vector &previous = *previous_work;
            previous = u1;
            if (nonlinear_)
              {
                ++result.nonlinear_iterations;
                const Vector ghosted = make_ghosted(u1);
                assemble_dynamic(plan.t1, &ghosted, false);
              }
            build_system(plan, false);
            solve_fixed(plan, rhs, u1, rhs_used, result);
            distribute(u1);
            if (!nonlinear_)
              break;
            previous -= u1;
            zero_fixed(previous);
            if (previous.linfty_norm() <= description_.numerics.nonlinear_tolerance * scale)
              {
                result.converged = true;
                break;
              }
          }
      }

    // Reactions: residual of the unconstrained equations at the fixed unknowns (none: a sealed body).
    result.reactions.assign(boundaries_.size(), 0.0);
    if (Utilities::MPI::sum(fixed_dofs_.size(), communicator_) == 0)
      return result;
    // Where the operator is a sum of assembled matrices, only the rows of the fixed unknowns are
    // needed (a few hundred rows instead of two or three products with every row).
    const auto terms = products_without_matrix()
                         ? std::vector<std::pair<const TrilinosWrappers::SparseMatrix *, double>>()
                         : operator_terms(plan, false);
    if (products_without_matrix())
      {
        std::vector<types::global_dof_index> rows;
        for (const auto &[dof, boundary] : fixed_dofs_)
          rows.push_back(dof);
        const std::vector<double> products = rows_of_product(operator_key(plan.a0, plan.w1, plan.t1), rows, u1);
        for (std::size_t i = 0; i < rows.size(); ++i)
          result.reactions[fixed_dofs_[i].second] += products[i] - rhs_used[rows[i]];
      }
    else if (!terms.empty())
      {
        std::vector<types::global_dof_index> rows;
        for (const auto &[dof, boundary] : fixed_dofs_)
          rows.push_back(dof);
        const std::vector<double> products = rows_of_sum(terms, rows, u1);
        for (std::size_t i = 0; i < rows.size(); ++i)
          result.reactions[fixed_dofs_[i].second] += products[i] - rhs_used[rows[i]];
      }
    else
      {
        WorkVector residual_work(*this);
        Vector &residual = *residual_work;
        mass_product(u1, residual);
        residual *= plan.a0;
        apply_operator(plan.t1, u1, tmp);
        residual.add(plan.w1, tmp);
        residual -= rhs_used;
        for (const auto &[dof, boundary] : fixed_dofs_)
          result.reactions[boundary] += residual[dof];
      }
    Utilities::MPI::sum(result.reactions, communicator_, result.reactions);
    return result;
  }

  template <int dim>
  unsigned int DiffusionProblem<dim>::propagate_error(const StepPlan &plan, const Vector &e0, const Vector *e_prev,
                                                      Vector &e1)
  {
    // Right-hand side of the homogeneous step: -M (a1 e0 + a2 e_prev) - w0 L e0.
    WorkVector rhs_work(*this), tmp_work(*this);
    Vector &rhs = *rhs_work, &tmp = *tmp_work;
    tmp.equ(plan.a1, e0);
    if (plan.a2 != 0 && e_prev != nullptr)
      tmp.add(plan.a2, *e_prev);
    mass_product(tmp, rhs);
    rhs *= -1.0;
    if (plan.w0 != 0)
      {
        apply_frozen(plan.t1, e0, tmp);
        rhs.add(-plan.w0, tmp);
      }
    std::vector<types::global_dof_index> held;
    for (const auto &[dof, b] : fixed_dofs_)
      {
        (void)b;
        held.push_back(dof);
      }
    std::size_t active = 0;
    if (dispersed_)
      for (const auto dof : owned_)
        if (dispersed_node_[owned_.index_within_set(dof)] && reserve_[dof] > 0)
          {
            held.push_back(dof);
            ++active;
          }
    const bool modified = Utilities::MPI::sum(active, communicator_) > 0 && modified_.m() != 0;
    for (const auto row : held)
      {
        rhs[row] = 0;
        e1[row] = 0;
      }
    rhs.compress(VectorOperation::insert);
    e1.compress(VectorOperation::insert);
    StepResult result;
    solve_linear(modified ? &modified_ : nullptr, e1, rhs, result);
    for (const auto row : held)
      e1[row] = 0;
    e1.compress(VectorOperation::insert);
    distribute(e1);
    return result.linear_iterations;
  }

  template unsigned int DiffusionProblem<1>::propagate_error(const StepPlan &, const DiffusionProblem<1>::Vector &,
                                                             const DiffusionProblem<1>::Vector *,
                                                             DiffusionProblem<1>::Vector &);
  template unsigned int DiffusionProblem<2>::propagate_error(const StepPlan &, const DiffusionProblem<2>::Vector &,
                                                             const DiffusionProblem<2>::Vector *,
                                                             DiffusionProblem<2>::Vector &);
  template unsigned int DiffusionProblem<3>::propagate_error(const StepPlan &, const DiffusionProblem<3>::Vector &,
                                                             const DiffusionProblem<3>::Vector *,
                                                             DiffusionProblem<3>::Vector &);

  template void DiffusionProblem<1>::build_system(const StepPlan &, bool);
  template void DiffusionProblem<2>::build_system(const StepPlan &, bool);
  template void DiffusionProblem<3>::build_system(const StepPlan &, bool);
  template void DiffusionProblem<1>::apply_frozen(double, const DiffusionProblem<1>::Vector &,
                                                  DiffusionProblem<1>::Vector &) const;
  template void DiffusionProblem<2>::apply_frozen(double, const DiffusionProblem<2>::Vector &,
                                                  DiffusionProblem<2>::Vector &) const;
  template void DiffusionProblem<3>::apply_frozen(double, const DiffusionProblem<3>::Vector &,
                                                  DiffusionProblem<3>::Vector &) const;
  template void DiffusionProblem<1>::solve_linear(const TrilinosWrappers::SparseMatrix *, DiffusionProblem<1>::Vector &,
                                                  const DiffusionProblem<1>::Vector &, StepResult &);
  template void DiffusionProblem<2>::solve_linear(const TrilinosWrappers::SparseMatrix *, DiffusionProblem<2>::Vector &,
                                                  const DiffusionProblem<2>::Vector &, StepResult &);
  template void DiffusionProblem<3>::solve_linear(const TrilinosWrappers::SparseMatrix *, DiffusionProblem<3>::Vector &,
                                                  const DiffusionProblem<3>::Vector &, StepResult &);
  template void DiffusionProblem<1>::solve_fixed(const StepPlan &, const DiffusionProblem<1>::Vector &,
                                                 DiffusionProblem<1>::Vector &, DiffusionProblem<1>::Vector &,
                                                 StepResult &);
  template void DiffusionProblem<2>::solve_fixed(const StepPlan &, const DiffusionProblem<2>::Vector &,
                                                 DiffusionProblem<2>::Vector &, DiffusionProblem<2>::Vector &,
                                                 StepResult &);
  template void DiffusionProblem<3>::solve_fixed(const StepPlan &, const DiffusionProblem<3>::Vector &,
                                                 DiffusionProblem<3>::Vector &, DiffusionProblem<3>::Vector &,
                                                 StepResult &);
  template void DiffusionProblem<1>::newton(const StepPlan &, const DiffusionProblem<1>::Vector &,
                                            DiffusionProblem<1>::Vector &, StepResult &);
  template void DiffusionProblem<2>::newton(const StepPlan &, const DiffusionProblem<2>::Vector &,
                                            DiffusionProblem<2>::Vector &, StepResult &);
  template void DiffusionProblem<3>::newton(const StepPlan &, const DiffusionProblem<3>::Vector &,
                                            DiffusionProblem<3>::Vector &, StepResult &);
  template StepResult DiffusionProblem<1>::advance(const StepPlan &, const DiffusionProblem<1>::Vector &,
                                                   const DiffusionProblem<1>::Vector *, DiffusionProblem<1>::Vector &);
  template StepResult DiffusionProblem<2>::advance(const StepPlan &, const DiffusionProblem<2>::Vector &,
                                                   const DiffusionProblem<2>::Vector *, DiffusionProblem<2>::Vector &);
  template StepResult DiffusionProblem<3>::advance(const StepPlan &, const DiffusionProblem<3>::Vector &,
                                                   const DiffusionProblem<3>::Vector *, DiffusionProblem<3>::Vector &);
  template void DiffusionProblem<1>::compose_system(const std::vector<double> &);
  template void DiffusionProblem<2>::compose_system(const std::vector<double> &);
  template void DiffusionProblem<3>::compose_system(const std::vector<double> &);
} // namespace fickcast
