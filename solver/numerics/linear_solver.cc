#include "numerics/linear_solver.h"

#include "case/input_error.h"

#include <deal.II/lac/solver_cg.h>
#include <deal.II/lac/solver_gmres.h>

namespace fickcast
{
  LinearSolver::LinearSolver(const bool direct, const double tolerance, const bool higher_order_elements)
    : direct_(direct)
    , tolerance_(tolerance)
    , higher_order_(higher_order_elements)
    , direct_control_(1, 0)
  {
  }

  void LinearSolver::set_matrix(const dealii::TrilinosWrappers::SparseMatrix &matrix, const double change,
                                const bool symmetric)
  {
    matrix_ = &matrix;
    symmetric_ = symmetric;
    if (!direct_ && multigrid_ && change > 0 && change < 3.0 && change > 1.0 / 3.0)
      return; // keep the hierarchy of a nearby matrix
    ++n_setups_;
    if (direct_)
      {
        direct_solver_ = std::make_unique<dealii::TrilinosWrappers::SolverDirect>(
          direct_control_, dealii::TrilinosWrappers::SolverDirect::AdditionalData(false, "Amesos_Klu"));
        direct_solver_->initialize(matrix);
        return;
      }
    dealii::TrilinosWrappers::PreconditionAMG::AdditionalData data;
    data.elliptic = true;
    data.higher_order_elements = higher_order_;
    data.smoother_sweeps = 2;
    data.aggregation_threshold = 0.02;
    multigrid_ = std::make_unique<dealii::TrilinosWrappers::PreconditionAMG>();
    multigrid_matrix_.copy_from(matrix); // the smoother keeps using the values it was built on
    multigrid_->initialize(multigrid_matrix_, data);
  }

  unsigned int LinearSolver::solve(dealii::TrilinosWrappers::MPI::Vector &x,
                                   const dealii::TrilinosWrappers::MPI::Vector &b)
  {
    if (direct_)
      {
        direct_solver_->solve(x, b);
        return 1;
      }
    const double norm = b.l2_norm();
    if (norm == 0)
      {
        x = 0;
        return 0;
      }
    dealii::SolverControl control(5000, tolerance_ * norm, false, false);
    try
      {
        if (symmetric_)
          {
            dealii::SolverCG<dealii::TrilinosWrappers::MPI::Vector> cg(control);
            cg.solve(*matrix_, x, b, *multigrid_);
          }
        else
          {
            dealii::SolverGMRES<dealii::TrilinosWrappers::MPI::Vector> gmres(
              control, dealii::SolverGMRES<dealii::TrilinosWrappers::MPI::Vector>::AdditionalData(50));
            gmres.solve(*matrix_, x, b, *multigrid_);
          }
      }
    catch (const dealii::SolverControl::NoConvergence &failure)
      {
        throw RunFailure("the linear solver (CG with algebraic multigrid) did not converge: residual " +
                         std::to_string(failure.last_residual) + " after " + std::to_string(failure.last_step) +
                         " iterations (target " + std::to_string(tolerance_ * norm) + ")");
      }
    return control.last_step();
  }

  unsigned int LinearSolver::solve_other(const dealii::TrilinosWrappers::SparseMatrix &matrix,
                                         dealii::TrilinosWrappers::MPI::Vector &x,
                                         const dealii::TrilinosWrappers::MPI::Vector &b)
  {
    if (direct_)
      {
        dealii::SolverControl control(1, 0);
        dealii::TrilinosWrappers::SolverDirect solver(
          control, dealii::TrilinosWrappers::SolverDirect::AdditionalData(false, "Amesos_Klu"));
        solver.solve(matrix, x, b);
        return 1;
      }
    const double norm = b.l2_norm();
    if (norm == 0)
      {
        x = 0;
        return 0;
      }
    dealii::SolverControl control(5000, tolerance_ * norm, false, false);
    dealii::SolverGMRES<dealii::TrilinosWrappers::MPI::Vector> gmres(
      control, dealii::SolverGMRES<dealii::TrilinosWrappers::MPI::Vector>::AdditionalData(50));
    try
      {
        gmres.solve(matrix, x, b, *multigrid_);
      }
    catch (const dealii::SolverControl::NoConvergence &failure)
      {
        throw RunFailure("the linear solver (GMRES with algebraic multigrid) did not converge: residual " +
                         std::to_string(failure.last_residual) + " after " + std::to_string(failure.last_step) +
                         " iterations");
      }
    return control.last_step();
  }
} // namespace fickcast
