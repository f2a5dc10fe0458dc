// Solving the step systems: sparse direct (small, serial) or CG with algebraic multigrid.
#pragma once

#include <deal.II/lac/solver_control.h>
#include <deal.II/lac/trilinos_precondition.h>
#include <deal.II/lac/trilinos_solver.h>
#include <deal.II/lac/trilinos_sparse_matrix.h>
#include <deal.II/lac/trilinos_vector.h>

#include <memory>

namespace fickcast
{
  /**
   * One linear solver for a symmetric positive definite step matrix that changes only now and
   * then (when the step size changes). set_matrix() factorises (direct: KLU through Trilinos
   * Amesos) or builds the multigrid hierarchy (iterative: Trilinos ML smoothed aggregation
   * preconditioning deal.II's CG); solve() reuses it.
   */
  class LinearSolver
  {
  public:
    /// @p direct chooses KLU; otherwise CG to the relative residual @p tolerance.
    LinearSolver(bool direct, double tolerance, bool higher_order_elements);

    /**
     * Prepares for @p matrix, which must stay alive until the next call. The direct solver
     * refactorises. The iterative solver keeps its multigrid hierarchy while the matrix is a
     * small change of the one it was built for (@p change: the ratio of the new step size to the
     * one of the hierarchy, 1 for "same"): CG on the new matrix with the multigrid of a nearby
     * one still converges (both are symmetric positive definite), and a set-up costs several
     * solves. The hierarchy is rebuilt when the step changed by more than a factor of 3.
     */
    void set_matrix(const dealii::TrilinosWrappers::SparseMatrix &matrix, double change = 0, bool symmetric = true);

    /// Solves matrix x = b; @p x is the initial guess on entry. Returns the iteration count
    /// (1 for the direct solver). Throws RunFailure if CG does not converge.
    unsigned int solve(dealii::TrilinosWrappers::MPI::Vector &x, const dealii::TrilinosWrappers::MPI::Vector &b);

    /// Solves with another matrix close to the current one (rows replaced, a Jacobian): a fresh
    /// factorisation (direct), or GMRES preconditioned with the current multigrid (iterative).
    unsigned int solve_other(const dealii::TrilinosWrappers::SparseMatrix &matrix,
                             dealii::TrilinosWrappers::MPI::Vector &x, const dealii::TrilinosWrappers::MPI::Vector &b);

    bool is_direct() const { return direct_; }
    /// Number of factorisations or multigrid set-ups so far.
    unsigned int n_setups() const { return n_setups_; }

  private:
    bool direct_;
    bool symmetric_ = true;
    double tolerance_;
    bool higher_order_;
    const dealii::TrilinosWrappers::SparseMatrix *matrix_ = nullptr;
    dealii::SolverControl direct_control_;
    std::unique_ptr<dealii::TrilinosWrappers::SolverDirect> direct_solver_;
    std::unique_ptr<dealii::TrilinosWrappers::PreconditionAMG> multigrid_;
    dealii::TrilinosWrappers::SparseMatrix multigrid_matrix_; ///< the matrix the hierarchy was built on
    unsigned int n_setups_ = 0;
  };
} // namespace fickcast
