// Runtime mesh adaptivity, the remeshing itself (DiffusionProblem::adapt): the error estimate
// means what it says, refinement carries the state without changing its amount, and a step taken
// after a remeshing sees operators rebuilt for the new mesh.
#include "case_runner.h"

#include "numerics/diffusion_problem.h"

#include <deal.II/base/function.h>
#include <deal.II/base/quadrature_lib.h>
#include <deal.II/grid/grid_tools.h>
#include <deal.II/numerics/vector_tools.h>

#include <boost/math/special_functions/erf.hpp>

#include <gtest/gtest.h>

#include <cmath>
#include <cstdio>
#include <numeric>

namespace fickcast::testing
{
  namespace
  {
    /// A steep front: 1 inside a sphere (interval, circle) of radius 0.25 m about @p centre,
    /// falling to 0 over about 2 @p width outside it.
    template <int dim>
    class Front : public dealii::Function<dim>
    {
    public:
      Front(const dealii::Point<dim> &centre, double width)
        : centre_(centre)
        , width_(width)
      {
      }
      double value(const dealii::Point<dim> &p, unsigned int = 0) const override
      {
        return 0.5 * boost::math::erfc((p.distance(centre_) - 0.25) / width_);
      }

    private:
      dealii::Point<dim> centre_;
      double width_;
    };

    template <int dim>
    std::string body_case(const double cell, const std::string &extra = "")
    {
      std::string text = "[case]\ntitle = adapt\ndimension = " + std::to_string(dim) +
                         "\n[geometry]\nlayers = body 1 m\ncell_size = " + std::to_string(cell) + " m\n";
      if (dim > 1)
        text += "width = 1 m\n";
      if (dim > 2)
        text += "length = 1 m\n";
      return text + "[region.body]\ndiffusivity = 1e-6 m2/s\n" + extra +
             "[time]\nend = 1 s\n[numerics]\ndegree = 2\naccuracy = off\n[output]\nfields = false\n";
    }

    template <int dim>
    dealii::Point<dim> centre_of(const DiffusionProblem<dim> &problem)
    {
      const auto box = dealii::GridTools::compute_bounding_box(problem.triangulation());
      return box.center();
    }

    /// The largest difference between @p u and @p f, sampled on a 12-point-per-axis lattice in
    /// every cell.
    template <int dim>
    double largest_difference(const DiffusionProblem<dim> &problem, const typename DiffusionProblem<dim>::Vector &u,
                              const dealii::Function<dim> &f)
    {
      dealii::Vector<float> cellwise(problem.triangulation().n_active_cells());
      const dealii::QIterated<dim> lattice(dealii::QTrapezoid<1>(), 11);
      dealii::VectorTools::integrate_difference(problem.mapping(), problem.dof_handler(), problem.make_ghosted(u), f,
                                                cellwise, lattice, dealii::VectorTools::Linfty_norm);
      return dealii::VectorTools::compute_global_error(problem.triangulation(), cellwise,
                                                       dealii::VectorTools::Linfty_norm);
    }

    double total(const std::vector<double> &amounts)
    {
      return std::accumulate(amounts.begin(), amounts.end(), 0.0);
    }

    /// Refines from a coarse mesh until the estimate is below @p target everywhere (the front
    /// interpolated anew on each mesh); returns the largest true interpolation error and prints
    /// the cell counts.
    template <int dim>
    void check_estimate_means_interpolation_error(const double target, const double width)
    {
      const CaseDescription description = describe(body_case<dim>(0.125), "adapt_estimate_" + std::to_string(dim));
      DiffusionProblem<dim> problem(description, MPI_COMM_WORLD);
      problem.setup();
      const Front<dim> front(centre_of(problem), width);
      auto u = problem.make_vector();
      AdaptLimits limits;
      limits.refine_above = target;
      limits.coarsen_below = target / 64;
      limits.smallest = 1e-4;
      unsigned int rounds = 0;
      for (; rounds < 20; ++rounds)
        {
          dealii::VectorTools::interpolate(problem.mapping(), problem.dof_handler(), front, u);
          const AdaptResult r = problem.adapt(u, limits, {&u});
          if (!r.changed)
            break;
        }
      ASSERT_LT(rounds, 20u) << "the remeshing did not settle";
      dealii::VectorTools::interpolate(problem.mapping(), problem.dof_handler(), front, u);
      const double error = largest_difference(problem, u, front);
      // The same accuracy on a uniform mesh needs the smallest cell everywhere.
      double smallest = 1e9;
      for (const auto &cell : problem.triangulation().active_cell_iterators())
        smallest = std::min(smallest, cell->diameter() / std::sqrt(static_cast<double>(dim)));
      const double uniform_cells = std::pow(1.0 / smallest, dim);
      std::printf("%d-D: target %.1e, %u remeshings, %lu cells (uniform at the smallest: %.0f), largest "
                  "interpolation error %.2e (%.2f of the target)\n",
                  dim, target, rounds, problem.n_cells(), uniform_cells, error, error / target);
      // The estimate is h times the jump of the normal derivative scaled to a nodal interpolation
      // error (Kelly, Gago, Zienkiewicz and Babuska, Int. J. Numer. Meth. Eng. 19 (1983), from
      // memory; interpolation error O(h^(p+1)|u^(p+1)|), Ciarlet, The Finite Element Method for
      // Elliptic Problems, 1978, th. 3.1.6): when every cell's estimate is under the target, the
      // true largest error is within a small factor of it, and not far below (no waste).
      EXPECT_LT(error, 3 * target);
      EXPECT_GT(error, target / 20);
      EXPECT_LT(static_cast<double>(problem.n_cells()), uniform_cells / 3);
    }

    template <int dim>
    void check_refinement_keeps_amount_and_step_conserves()
    {
      // A sealed body with a uniform source s: after any remeshing, a step of dt must add exactly
      // s V dt (the source is integrated exactly by the quadrature; nothing leaves a sealed body).
      const CaseDescription description =
        describe(body_case<dim>(0.125, "source = 2 mol/(m3 s)\n"), "adapt_sealed_" + std::to_string(dim));
      DiffusionProblem<dim> problem(description, MPI_COMM_WORLD);
      problem.setup();
      const Front<dim> front(centre_of(problem), 0.02);
      auto u = problem.make_vector();
      problem.initial_state(u);
      dealii::VectorTools::interpolate(problem.mapping(), problem.dof_handler(), front, u);
      AdaptLimits refine_only;
      refine_only.refine_above = 1e-3;
      refine_only.smallest = dim == 3 ? 0.05 : 1e-3; // 3-D: two levels at most (a 2-core machine)
      unsigned int changes = 0;
      for (unsigned int round = 0; round < 3; ++round)
        {
          const double before = total(problem.region_amounts(u));
          const AdaptResult result = problem.adapt(u, refine_only, {&u});
          if (!result.changed)
            break;
          ++changes;
          EXPECT_GT(result.cells_after, result.cells_before);
          EXPECT_EQ(result.marked_coarsen, 0u);
          // Refinement nests the spaces: the state is the same function, its amount the same.
          const double after = total(problem.region_amounts(u));
          EXPECT_NEAR(after, before, 1e-12 * before) << "round " << round;
        }
      ASSERT_GT(changes, 0u);
      // Coarsening: what the coarser space cannot hold is lost; the amount moves, but stays close.
      AdaptLimits coarsen_all;
      coarsen_all.refine_above = 1e300;
      coarsen_all.coarsen_below = 1e300;
      const double before = total(problem.region_amounts(u));
      const AdaptResult coarsened = problem.adapt(u, coarsen_all, {&u});
      EXPECT_LT(coarsened.cells_after, coarsened.cells_before);
      const double after = total(problem.region_amounts(u));
      std::printf("%d-D: coarsening %lu -> %lu cells changed the amount by %.2e relative\n", dim,
                  coarsened.cells_before, coarsened.cells_after, (after - before) / before);
      EXPECT_LT(std::abs(after - before), 0.05 * before);

      // One implicit Euler step on the new mesh.
      problem.adapt(u, refine_only, {&u});
      const double start = total(problem.region_amounts(u));
      StepPlan plan;
      plan.t0 = 0;
      plan.t1 = 0.5;
      plan.w1 = 0.5;
      auto u1 = u;
      const StepResult step = problem.advance(plan, u, nullptr, u1);
      ASSERT_TRUE(step.converged);
      problem.accept_step();
      const double end = total(problem.region_amounts(u1));
      const double volume = 1.0; // the unit body (length, square, cube)
      EXPECT_NEAR(end - start, 2.0 * volume * 0.5, 1e-10 * end);
    }
  } // namespace

  // Source: the face-jump estimate of Kelly, Gago, Zienkiewicz and Babuska, Int. J. Numer. Meth.
  // Eng. 19 (1983) (from memory), against the interpolation error bound O(h^(p+1)|u^(p+1)|) of
  // Ciarlet, The Finite Element Method for Elliptic Problems (1978), th. 3.1.6 (from memory).
  TEST(MeshAdaptation, EstimateMeansInterpolationError1d)
  {
    check_estimate_means_interpolation_error<1>(1e-4, 0.01);
  }
  TEST(MeshAdaptation, EstimateMeansInterpolationError2d)
  {
    check_estimate_means_interpolation_error<2>(1e-3, 0.02);
  }
  // Source: conservation of a sealed body with a uniform source, content(t) = content(0) + s V t
  // (common practice), and the nesting of Lagrange spaces under refinement (Ciarlet 1978, from
  // memory), which keeps the amount of a refined state exactly.
  TEST(MeshAdaptation, RefinementKeepsTheAmountAndStepsConserve1d)
  {
    check_refinement_keeps_amount_and_step_conserves<1>();
  }
  TEST(MeshAdaptation, RefinementKeepsTheAmountAndStepsConserve2d)
  {
    check_refinement_keeps_amount_and_step_conserves<2>();
  }
  TEST(MeshAdaptation, RefinementKeepsTheAmountAndStepsConserve3d)
  {
    check_refinement_keeps_amount_and_step_conserves<3>();
  }
} // namespace fickcast::testing
