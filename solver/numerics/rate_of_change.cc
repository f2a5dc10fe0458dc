// DiffusionProblem: the rate of change of a state, M^-1 (F - L u), for the starting step.
#include "numerics/diffusion_problem.h"

#include <deal.II/lac/solver_cg.h>
#include <deal.II/lac/solver_control.h>
#include <deal.II/lac/solver_gmres.h>
#include <deal.II/lac/trilinos_precondition.h>

namespace fickcast
{
  using namespace dealii;

  template <int dim>
  typename DiffusionProblem<dim>::Vector DiffusionProblem<dim>::rate_of_change(const Vector &u, const double t) const
  {
    Vector residual = make_vector(), image = make_vector(), rate = make_vector();
    forcing(t, residual);
    apply_operator(t, u, image);
    residual -= image;
    zero_fixed(residual);
    zero_hanging(residual);
    const double size = residual.l2_norm();
    if (size > 0)
      {
        // The mass matrix is well conditioned under its diagonal (a few tens of iterations).
        SolverControl control(1000, 1e-10 * size);
        SolverCG<Vector> cg(control);
        if (products_without_matrix())
          {
            struct Mass
            {
              const DiffusionProblem &problem;
              std::vector<double> key;
              void vmult(Vector &dst, const Vector &src) const { problem.product_without_matrix(key, src, dst, true); }
            };
            const Mass mass{*this, operator_key(1, 0, t)};
            Vector inverse = make_vector();
            inverse_diagonal_without_matrix(mass.key, inverse);
            cg.solve(mass, rate, residual, InverseDiagonal{inverse});
            zero_fixed(rate);
            distribute(rate);
            return rate;
          }
        TrilinosWrappers::PreconditionJacobi diagonal;
        diagonal.initialize(mass_.constrained);
        if (has_flow())
          {
            // Streamline upwinding weighs the mass too: an unsymmetric matrix.
            SolverGMRES<Vector> gmres(control);
            gmres.solve(mass_.constrained, rate, residual, diagonal);
          }
        else
          cg.solve(mass_.constrained, rate, residual, diagonal);
      }
    zero_fixed(rate);
    distribute(rate);
    return rate;
  }

  template DiffusionProblem<1>::Vector DiffusionProblem<1>::rate_of_change(const DiffusionProblem<1>::Vector &,
                                                                           double) const;
  template DiffusionProblem<2>::Vector DiffusionProblem<2>::rate_of_change(const DiffusionProblem<2>::Vector &,
                                                                           double) const;
  template DiffusionProblem<3>::Vector DiffusionProblem<3>::rate_of_change(const DiffusionProblem<3>::Vector &,
                                                                           double) const;
} // namespace fickcast
