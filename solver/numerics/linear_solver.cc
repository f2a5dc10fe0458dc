#include "numerics/linear_solver.h"

#include "case/input_error.h"

#include <deal.II/lac/solver_cg.h>
#include <deal.II/lac/solver_gmres.h>

#include <cstdio>
#include <limits>

namespace fickcast
{
  bool choose_direct_solver(const LinearSolverKind kind, const unsigned int dimension, const unsigned long n_unknowns,
                            const bool serial)
  {
    if (kind == LinearSolverKind::direct)
      return true;
    if (kind != LinearSolverKind::automatic)
      return false;
    return serial &&
           (dimension == 1 || (dimension == 2 && n_unknowns <= 5000) || (dimension == 3 && n_unknowns <= 1000));
  }

  std::string linear_solver_plan(const bool direct, const LinearSolverKind kind, const bool matrix_free)
  {
    if (direct)
      return "direct (sparse LU, KLU), factorised when the step size changes";
    const std::string without_matrix =
      matrix_free && kind != LinearSolverKind::multigrid
        ? "; linear steps of degree 2 or more (no concentration- or position-and-time-dependent diffusivity, no "
          "undissolved content) apply the step operator cell by cell without assembling its matrix, with the "
          "diagonal or, for stiffer steps, geometric multigrid (the run's mesh, the coarser ones it was refined "
          "from, the linear element on the coarse mesh)"
        : "";
    if (kind == LinearSolverKind::diagonal)
      return "CG preconditioned by the diagonal (numerics.linear_solver = diagonal)" + without_matrix;
    if (kind == LinearSolverKind::multigrid)
      return "CG preconditioned by algebraic multigrid (numerics.linear_solver = multigrid)";
    char limit[32];
    std::snprintf(limit, sizeof(limit), "%.3g", LinearSolver::initial_jacobi_limit);
    return std::string("CG, preconditioned by the diagonal while the mass term dominates the step matrix (diffusion "
                       "number up to ") +
           limit + ", no set-up cost), else by algebraic multigrid (kept across steps)" + without_matrix;
  }

  LinearSolver::LinearSolver(const bool direct, const double tolerance, const bool higher_order_elements,
                             const LinearSolverKind kind)
    : direct_(direct)
    , tolerance_(tolerance)
    , higher_order_(higher_order_elements)
    , direct_control_(1, 0)
  {
    if (kind == LinearSolverKind::diagonal || kind == LinearSolverKind::multigrid)
      {
        adapt_limit_ = false;
        jacobi_limit_ = kind == LinearSolverKind::diagonal ? std::numeric_limits<double>::infinity() : -1.0;
      }
  }

  void LinearSolver::build_multigrid(const dealii::TrilinosWrappers::SparseMatrix &matrix)
  {
    ++n_setups_;
    dealii::TrilinosWrappers::PreconditionAMG::AdditionalData data;
    data.elliptic = symmetric_; // unsymmetric (water flow, Newton): ML's non-symmetric defaults
    data.higher_order_elements = higher_order_;
    data.smoother_sweeps = 2;
    data.aggregation_threshold = 0.02;
    multigrid_ = std::make_unique<dealii::TrilinosWrappers::PreconditionAMG>();
    multigrid_matrix_.copy_from(matrix); // the smoother keeps using the values it was built on
    multigrid_->initialize(multigrid_matrix_, data);
  }

  void LinearSolver::set_matrix(const dealii::TrilinosWrappers::SparseMatrix &matrix, const double change,
                                const bool symmetric, const double diffusion_number)
  {
    select(&matrix, nullptr, nullptr, symmetric, diffusion_number);
    if (direct_)
      {
        ++n_setups_;
        direct_solver_ = std::make_unique<dealii::TrilinosWrappers::SolverDirect>(
          direct_control_, dealii::TrilinosWrappers::SolverDirect::AdditionalData(false, "Amesos_Klu"));
        direct_solver_->initialize(matrix);
        return;
      }
    if (diffusion_number >= 0 && diffusion_number <= jacobi_limit_)
      {
        jacobi_ = std::make_unique<dealii::TrilinosWrappers::PreconditionJacobi>();
        jacobi_->initialize(matrix);
        return;
      }
    if (multigrid_ && change > 0 && change < 3.0 && change > 1.0 / 3.0)
      return; // keep the hierarchy of a nearby matrix
    build_multigrid(matrix);
  }

  bool LinearSolver::set_operator(const OperatorWithoutMatrix &op, const double diffusion_number)
  {
    if (direct_ || !(diffusion_number >= 0 && diffusion_number <= jacobi_limit_))
      return false;
    select(nullptr, &op, nullptr, true, diffusion_number);
    return true;
  }

  void LinearSolver::set_operator_multigrid(const OperatorWithoutMatrix &op,
                                            const PreconditionerWithoutMatrix &multigrid, const unsigned int n_meshes,
                                            const double diffusion_number)
  {
    select(nullptr, &op, &multigrid, true, diffusion_number);
    geometric_meshes_ = n_meshes;
  }

  void LinearSolver::select(const dealii::TrilinosWrappers::SparseMatrix *matrix, const OperatorWithoutMatrix *op,
                            const PreconditionerWithoutMatrix *geometric, const bool symmetric,
                            const double diffusion_number)
  {
    matrix_ = matrix;
    operator_ = op;
    geometric_ = geometric;
    needs_matrix_ = false;
    symmetric_ = symmetric;
    diffusion_number_ = diffusion_number;
    jacobi_.reset();
  }

  unsigned int LinearSolver::solve_with_geometric(dealii::TrilinosWrappers::MPI::Vector &x,
                                                  const dealii::TrilinosWrappers::MPI::Vector &b, const double norm)
  {
    dealii::SolverControl control(500, tolerance_ * norm, false, false);
    try
      {
        dealii::SolverCG<dealii::TrilinosWrappers::MPI::Vector> cg(control);
        cg.solve(*operator_, x, b, *geometric_);
      }
    catch (const dealii::SolverControl::NoConvergence &)
      {
        // Not seen in the tests; algebraic multigrid on the assembled matrix takes over.
        geometric_usable_ = false;
        operator_ = nullptr;
        geometric_ = nullptr;
        needs_matrix_ = true;
        return control.last_step();
      }
    ++geometric_solves_;
    geometric_iterations_ += control.last_step();
    if (diffusion_number_ >= 0 && (smallest_multigrid_number_ < 0 || diffusion_number_ < smallest_multigrid_number_))
      smallest_multigrid_number_ = diffusion_number_;
    return control.last_step();
  }

  unsigned int LinearSolver::solve_with_multigrid(dealii::TrilinosWrappers::MPI::Vector &x,
                                                  const dealii::TrilinosWrappers::MPI::Vector &b, const double norm)
  {
    if (!multigrid_)
      {
        if (matrix_ == nullptr)
          throw RunFailure("internal: a modified step matrix was solved without the step matrix's multigrid");
        build_multigrid(*matrix_);
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
    ++multigrid_solves_;
    multigrid_iterations_ += control.last_step();
    if (diffusion_number_ >= 0 && (smallest_multigrid_number_ < 0 || diffusion_number_ < smallest_multigrid_number_))
      smallest_multigrid_number_ = diffusion_number_;
    return control.last_step();
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
    if (!jacobi_ && !operator_)
      return solve_with_multigrid(x, b, norm);

    unsigned int iterations = 0;
    if (operator_ && geometric_)
      return solve_with_geometric(x, b, norm);
    if (operator_)
      {
        // Without a matrix, multigrid needs the caller to assemble one (needs_matrix()).
        if (!solve_with_diagonal(*operator_, InverseDiagonal{operator_->inverse_diagonal()}, x, b, norm, iterations))
          {
            operator_ = nullptr;
            needs_matrix_ = true;
          }
        else
          ++operator_solves_;
        return iterations;
      }
    if (!solve_with_diagonal(*matrix_, *jacobi_, x, b, norm, iterations))
      {
        jacobi_.reset();
        return iterations + solve_with_multigrid(x, b, norm); // from where the diagonal got
      }
    return iterations;
  }

  template <typename Operator, typename Preconditioner>
  bool LinearSolver::solve_with_diagonal(const Operator &op, const Preconditioner &diagonal,
                                         dealii::TrilinosWrappers::MPI::Vector &x,
                                         const dealii::TrilinosWrappers::MPI::Vector &b, const double norm,
                                         unsigned int &iterations)
  {
    // A budget of four times the slow count (a case that asked for the diagonal alone gets a
    // budget like multigrid's).
    dealii::SolverControl control(adapt_limit_ ? 4 * slow_jacobi_iterations : 20000, tolerance_ * norm, false, false);
    try
      {
        if (symmetric_)
          {
            dealii::SolverCG<dealii::TrilinosWrappers::MPI::Vector> cg(control);
            cg.solve(op, x, b, diagonal);
          }
        else
          {
            dealii::SolverGMRES<dealii::TrilinosWrappers::MPI::Vector> gmres(
              control, dealii::SolverGMRES<dealii::TrilinosWrappers::MPI::Vector>::AdditionalData(50));
            gmres.solve(op, x, b, diagonal);
          }
      }
    catch (const dealii::SolverControl::NoConvergence &failure)
      {
        if (!adapt_limit_)
          throw RunFailure("the linear solver (CG with the diagonal, numerics.linear_solver = diagonal) did not "
                           "converge: residual " +
                           std::to_string(failure.last_residual) + " after " + std::to_string(failure.last_step) +
                           " iterations (use iterative or multigrid)");
        ++jacobi_fallbacks_;
        jacobi_limit_ = 0.5 * diffusion_number_;
        iterations = control.last_step();
        return false;
      }
    ++jacobi_solves_;
    jacobi_iterations_ += control.last_step();
    largest_jacobi_number_ = std::max(largest_jacobi_number_, diffusion_number_);
    if (adapt_limit_ && control.last_step() > slow_jacobi_iterations)
      jacobi_limit_ = std::min(jacobi_limit_, 0.7 * diffusion_number_); // stiffer steps: multigrid
    iterations = control.last_step();
    return true;
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
    if (!multigrid_)
      {
        if (matrix_ == nullptr)
          throw RunFailure("internal: a modified step matrix was solved without the step matrix's multigrid");
        build_multigrid(*matrix_);
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

  std::vector<double> LinearSolver::statistics() const
  {
    return {jacobi_limit_,
            largest_jacobi_number_,
            smallest_multigrid_number_,
            static_cast<double>(jacobi_solves_),
            static_cast<double>(jacobi_iterations_),
            static_cast<double>(multigrid_solves_),
            static_cast<double>(multigrid_iterations_),
            static_cast<double>(jacobi_fallbacks_),
            static_cast<double>(operator_solves_),
            static_cast<double>(geometric_solves_),
            static_cast<double>(geometric_iterations_),
            static_cast<double>(geometric_meshes_),
            geometric_usable_ ? 1.0 : 0.0};
  }

  void LinearSolver::restore_statistics(const std::vector<double> &values)
  {
    if (values.empty())
      return;
    if (values.size() != 8 && values.size() != 9 && values.size() != 13)
      throw IoError("the checkpoint's linear-solver state does not fit this version of fickcast");
    jacobi_limit_ = values[0];
    largest_jacobi_number_ = values[1];
    smallest_multigrid_number_ = values[2];
    jacobi_solves_ = static_cast<unsigned long>(values[3]);
    jacobi_iterations_ = static_cast<unsigned long>(values[4]);
    multigrid_solves_ = static_cast<unsigned long>(values[5]);
    multigrid_iterations_ = static_cast<unsigned long>(values[6]);
    jacobi_fallbacks_ = static_cast<unsigned int>(values[7]);
    operator_solves_ = values.size() > 8 ? static_cast<unsigned long>(values[8]) : 0;
    if (values.size() > 12)
      {
        geometric_solves_ = static_cast<unsigned long>(values[9]);
        geometric_iterations_ = static_cast<unsigned long>(values[10]);
        geometric_meshes_ = static_cast<unsigned int>(values[11]);
        geometric_usable_ = values[12] != 0;
      }
  }

  std::string LinearSolver::description() const
  {
    if (direct_)
      return "direct (KLU)";
    auto number = [](const double v) {
      char buffer[32];
      std::snprintf(buffer, sizeof(buffer), "%.3g", v);
      return std::string(buffer);
    };
    // Water flow makes the step matrix unsymmetric: GMRES (restarted every 50) instead of CG.
    const std::string krylov = symmetric_ ? "CG" : "GMRES";
    std::string text;
    if (jacobi_solves_ > 0)
      text +=
        krylov + " with the diagonal for " + std::to_string(jacobi_solves_) + " solves (" +
        (adapt_limit_ ? "the mass term dominates" : "as the case asks") + ": diffusion number up to " +
        number(largest_jacobi_number_) + ", " +
        number(static_cast<double>(jacobi_iterations_) / static_cast<double>(jacobi_solves_)) + " iterations each" +
        (operator_solves_ == 0                ? std::string()
         : operator_solves_ == jacobi_solves_ ? std::string(", the step operator applied without a matrix")
                                              : "; " + std::to_string(operator_solves_) + " of them without a matrix") +
        ")";
    std::string why;
    if (!adapt_limit_)
      why = " (as the case asks)";
    else if (smallest_multigrid_number_ >= 0)
      why = " (diffusion number from " + number(smallest_multigrid_number_) + ", above the diagonal's limit " +
            number(jacobi_limit_) + ")";
    if (geometric_solves_ > 0)
      text += std::string(text.empty() ? "" : "; ") + "CG with geometric multigrid for " +
              std::to_string(geometric_solves_) + " solves (" +
              number(static_cast<double>(geometric_iterations_) / static_cast<double>(geometric_solves_)) +
              " iterations each; the step operator without a matrix on " + std::to_string(geometric_meshes_) +
              (geometric_meshes_ > 2 ? " levels: the run's mesh, coarser meshes down to its coarse mesh, the linear "
                                       "element there)"
                                     : " levels: the run's mesh, and the linear element on it)") +
              why;
    if (multigrid_solves_ > 0 || (jacobi_solves_ == 0 && geometric_solves_ == 0))
      text += std::string(text.empty() ? "" : "; ") + krylov + " with algebraic multigrid" +
              (multigrid_solves_ > 0 ? " for " + std::to_string(multigrid_solves_) + " solves" : std::string()) + why;
    if (jacobi_fallbacks_ > 0)
      text += "; " + std::to_string(jacobi_fallbacks_) + " diagonal solves fell back to multigrid";
    return text;
  }
} // namespace fickcast
