// Solving the step systems: sparse direct (small, serial), or CG preconditioned by the diagonal
// where the mass term dominates, else by algebraic multigrid.
#pragma once

#include "case/case_description.h"

#include <deal.II/lac/solver_control.h>
#include <deal.II/lac/trilinos_precondition.h>
#include <deal.II/lac/trilinos_solver.h>
#include <deal.II/lac/trilinos_sparse_matrix.h>
#include <deal.II/lac/trilinos_vector.h>

#include <memory>
#include <string>
#include <vector>

namespace fickcast
{
  /**
   * Whether a step system of @p n_unknowns unknowns in @p dimension is solved by sparse LU:
   * @p kind direct or iterative decides; automatic takes LU only on one rank for 1-D, 2-D up to
   * 5000 and 3-D up to 1000 unknowns (fill-in grows fast beyond).
   */
  bool choose_direct_solver(LinearSolverKind kind, unsigned int dimension, unsigned long n_unknowns, bool serial);

  /// What `fickcast check` says of the linear solver a run of that size will use, and why.
  /// @p matrix_free: 2-D or 3-D with numerics.matrix_free not off.
  std::string linear_solver_plan(bool direct, LinearSolverKind kind, bool matrix_free = false);

  /// A step operator applied without a matrix: its products, and 1 / the diagonal of the matrix it
  /// stands for (the diagonal preconditioner).
  class OperatorWithoutMatrix
  {
  public:
    virtual ~OperatorWithoutMatrix() = default;
    virtual void vmult(dealii::TrilinosWrappers::MPI::Vector &dst,
                       const dealii::TrilinosWrappers::MPI::Vector &src) const = 0;
    virtual const dealii::TrilinosWrappers::MPI::Vector &inverse_diagonal() const = 0;
  };

  /// A preconditioner of an OperatorWithoutMatrix (geometric multigrid).
  class PreconditionerWithoutMatrix
  {
  public:
    virtual ~PreconditionerWithoutMatrix() = default;
    virtual void vmult(dealii::TrilinosWrappers::MPI::Vector &dst,
                       const dealii::TrilinosWrappers::MPI::Vector &src) const = 0;
  };

  /// The diagonal preconditioner from the inverse of a diagonal: dst = inverse .* src.
  struct InverseDiagonal
  {
    const dealii::TrilinosWrappers::MPI::Vector &inverse;
    void vmult(dealii::TrilinosWrappers::MPI::Vector &dst, const dealii::TrilinosWrappers::MPI::Vector &src) const
    {
      dst = src;
      dst.scale(inverse);
    }
  };

  /**
   * One linear solver for a symmetric positive definite step matrix that changes only now and
   * then (when the step size changes). set_matrix() factorises (direct: KLU through Trilinos
   * Amesos) or prepares CG's preconditioner; solve() reuses it. The preconditioner follows the
   * operator's character: where the mass term dominates the step matrix (its diffusion number,
   * the largest ratio of the stiffness to the mass part of a diagonal entry, is at most
   * jacobi_limit()), the diagonal (Jacobi), which costs nothing to set up and one pass over the
   * matrix per iteration; otherwise Trilinos ML smoothed-aggregation multigrid, whose set-up costs
   * several solves and whose cycle several matrix products, but whose iteration count does not
   * grow with the diffusion number. If a diagonal solve needs many iterations (more than
   * slow_jacobi_iterations) the limit drops below that diffusion number, so stiffer steps get
   * multigrid from then on; if it fails to converge in its budget, the step is solved again
   * with multigrid.
   */
  class LinearSolver
  {
  public:
    /// @p direct chooses KLU; otherwise CG to the relative residual @p tolerance, its
    /// preconditioner after the step matrix (@p kind iterative or automatic), or always the
    /// diagonal (diagonal) or multigrid (multigrid).
    LinearSolver(bool direct, double tolerance, bool higher_order_elements,
                 LinearSolverKind kind = LinearSolverKind::automatic);

    /**
     * Prepares for @p matrix, which must stay alive until the next call. The direct solver
     * refactorises. The iterative solver keeps its multigrid hierarchy while the matrix is a
     * small change of the one it was built for (@p change: the ratio of the new step size to the
     * one of the hierarchy, 1 for "same"): CG on the new matrix with the multigrid of a nearby
     * one still converges (both are symmetric positive definite), and a set-up costs several
     * solves. The hierarchy is rebuilt when the step changed by more than a factor of 3.
     */
    /// @p diffusion_number: of @p matrix (see above), negative if unknown (multigrid then).
    void set_matrix(const dealii::TrilinosWrappers::SparseMatrix &matrix, double change = 0, bool symmetric = true,
                    double diffusion_number = -1);

    /**
     * Prepares CG with the diagonal on @p op (which must stay alive until the next call), where
     * the solver is iterative and @p diffusion_number lies within the diagonal's range; returns
     * false otherwise, and the caller assembles the step matrix and calls set_matrix(). Multigrid
     * needs the matrix, so a diagonal solve that does not converge leaves needs_matrix() set.
     */
    bool set_operator(const OperatorWithoutMatrix &op, double diffusion_number);
    /// Whether set_operator() would take the diagonal for @p diffusion_number.
    bool diagonal_suffices(double diffusion_number) const
    {
      return !direct_ && diffusion_number >= 0 && diffusion_number <= jacobi_limit_;
    }
    /// Whether geometric multigrid on an operator without matrix may be used (not after it failed).
    bool geometric_usable() const { return !direct_ && geometric_usable_; }
    /**
     * Prepares CG with @p multigrid (geometric, on meshes coarsened from the run's) on @p op, for
     * steps beyond the diagonal's range; both must stay alive until the next call. If CG does not
     * converge in its budget, needs_matrix() is set and geometric multigrid is not offered again.
     */
    void set_operator_multigrid(const OperatorWithoutMatrix &op, const PreconditionerWithoutMatrix &multigrid,
                                unsigned int n_meshes, double diffusion_number);
    /// After solve(): the operator's diagonal solve failed; set_matrix() and solve again from x.
    bool needs_matrix() const { return needs_matrix_; }
    /// Whether the current step operator is applied without a matrix.
    bool uses_operator() const { return operator_ != nullptr; }

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
    /// Whether the current matrix is solved with the diagonal preconditioner.
    bool uses_jacobi() const { return jacobi_ != nullptr || (operator_ != nullptr && geometric_ == nullptr); }
    double jacobi_limit() const { return jacobi_limit_; }

    /// Which solver and preconditioners the solves used and why, for people (summary.json).
    std::string description() const;

    /// The counts and limits behind description() and the choice, for a checkpoint.
    std::vector<double> statistics() const;
    /// Continues from statistics() of an interrupted run (empty: nothing to restore; IoError if
    /// malformed).
    void restore_statistics(const std::vector<double> &values);
    /// Builds the multigrid hierarchy on @p matrix (a resumed run: the matrix it was built on).
    void rebuild_multigrid(const dealii::TrilinosWrappers::SparseMatrix &matrix) { build_multigrid(matrix); }

    /// The diffusion number up to which the diagonal preconditioner is chosen at first.
    static constexpr double initial_jacobi_limit = 100.0;
    /// A diagonal-preconditioned solve with more iterations than this lowers the limit.
    static constexpr unsigned int slow_jacobi_iterations = 120;

  private:
    bool direct_;
    bool symmetric_ = true;
    double tolerance_;
    bool higher_order_;
    const dealii::TrilinosWrappers::SparseMatrix *matrix_ = nullptr;
    const OperatorWithoutMatrix *operator_ = nullptr;
    const PreconditionerWithoutMatrix *geometric_ = nullptr; ///< with operator_: geometric multigrid
    bool geometric_usable_ = true;
    unsigned int geometric_meshes_ = 0;
    unsigned long geometric_solves_ = 0, geometric_iterations_ = 0;
    bool needs_matrix_ = false;
    unsigned long operator_solves_ = 0; ///< diagonal solves without a matrix
    dealii::SolverControl direct_control_;
    std::unique_ptr<dealii::TrilinosWrappers::SolverDirect> direct_solver_;
    std::unique_ptr<dealii::TrilinosWrappers::PreconditionAMG> multigrid_;
    dealii::TrilinosWrappers::SparseMatrix multigrid_matrix_; ///< the matrix the hierarchy was built on
    unsigned int n_setups_ = 0;
    std::unique_ptr<dealii::TrilinosWrappers::PreconditionJacobi> jacobi_;
    double jacobi_limit_ = initial_jacobi_limit;
    bool adapt_limit_ = true; ///< false when the case fixed the preconditioner
    double diffusion_number_ = -1;
    double largest_jacobi_number_ = -1;     ///< largest diffusion number solved with the diagonal
    double smallest_multigrid_number_ = -1; ///< smallest known diffusion number solved with multigrid
    unsigned long jacobi_solves_ = 0, jacobi_iterations_ = 0, multigrid_solves_ = 0, multigrid_iterations_ = 0;
    unsigned int jacobi_fallbacks_ = 0;

    /// CG with a diagonal preconditioner on @p op (the matrix or the operator without one), with
    /// the diagonal's budget and bookkeeping; false (iterations in @p iterations) if it did not
    /// converge and the case lets multigrid take over (the limit is then lowered).
    template <typename Operator, typename Preconditioner>
    bool solve_with_diagonal(const Operator &op, const Preconditioner &diagonal,
                             dealii::TrilinosWrappers::MPI::Vector &x, const dealii::TrilinosWrappers::MPI::Vector &b,
                             double norm, unsigned int &iterations);
    /// The step operator of the next solves (a matrix, or an operator with or without geometric
    /// multigrid); forgets the previous one's preconditioner.
    void select(const dealii::TrilinosWrappers::SparseMatrix *matrix, const OperatorWithoutMatrix *op,
                const PreconditionerWithoutMatrix *geometric, bool symmetric, double diffusion_number);
    unsigned int solve_with_geometric(dealii::TrilinosWrappers::MPI::Vector &x,
                                      const dealii::TrilinosWrappers::MPI::Vector &b, double norm);
    unsigned int solve_with_multigrid(dealii::TrilinosWrappers::MPI::Vector &x,
                                      const dealii::TrilinosWrappers::MPI::Vector &b, double norm);
    void build_multigrid(const dealii::TrilinosWrappers::SparseMatrix &matrix);
  };
} // namespace fickcast
