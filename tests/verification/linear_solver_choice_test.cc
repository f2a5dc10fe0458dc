// The preconditioner follows the operator's character: small steps (mass term dominant) are
// solved with CG and the diagonal, large ones with CG and multigrid (geometric on the operator
// without a matrix, algebraic on the assembled matrix), and all give the sparse-LU solution to
// solver tolerance, which is the Gaussian of a line source to the discretisation error.
#include "case_runner.h"

#include <boost/math/constants/constants.hpp>

#include <gtest/gtest.h>

#include <cmath>
#include <cstdio>

namespace fickcast::testing
{
  namespace
  {
    constexpr double pi = boost::math::constants::pi<double>();

    /// A line source of unit amount per length at (1, 1) in a sealed 2 m x 2 m square (D = 1 m2/s),
    /// started from its Gaussian at age 0.05 with the images nearest the faces (line_source; the
    /// next ones are below exp(-9 / 0.2) of the peak), run 0.05 s with fixed steps @p step.
    std::string gaussian_case(const std::string &step, const std::string &cell, const std::string &solver,
                              const std::string &matrix_free = "auto")
    {
      return R"(
[case]
title = solver choice: line source (invented numbers)
dimension = 2
[geometry]
layers = medium 2 m
width = 2 m
cell_size = )" +
             cell + R"(
[region.medium]
diffusivity = 1 m2/s
[initial]
value = {(exp(-(x-1)^2/0.2)+exp(-(x+1)^2/0.2)+exp(-(x-3)^2/0.2))*(exp(-(y-1)^2/0.2)+exp(-(y+1)^2/0.2)+exp(-(y-3)^2/0.2))/(4*pi*0.05)} mol/m3
[time]
end = 0.05 s
step = )" + step +
             R"(
[numerics]
accuracy = off
solver_tolerance = 1e-13
linear_solver = )" +
             solver + "\nmatrix_free = " + matrix_free + R"(
[output]
fields = false
point.centre = 1 m, 1 m
point.off = 1.2 m, 1.1 m
point.far = 1.5 m, 1.4 m
)";
    }

    /// Gaussian of a line source (Carslaw & Jaeger 1959 sec. 10.3; Crank 1975 ch. 3, from memory):
    /// C = exp(-r^2 / (4 D a)) / (4 pi D a) at age a, with the images that make the faces of the
    /// sealed square x, y = 0 and 2 m planes of symmetry (method of images, Carslaw & Jaeger
    /// sec. 10.10): sources at 1 + 4k and -1 + 4k along each axis (the product form of the
    /// two-dimensional Gaussian lets each axis be summed apart).
    double line_source(const double x, const double y, const double age)
    {
      auto along = [&](const double u) {
        double sum = 0;
        for (int k = -3; k <= 3; ++k)
          for (const double image : {1.0 + 4 * k, -1.0 + 4 * k})
            sum += std::exp(-(u - image) * (u - image) / (4 * age));
        return sum;
      };
      return along(x) * along(y) / (4 * pi * age);
    }

    void compare(const std::string &step, const std::string &cell, const std::string &expected_preconditioner,
                 const std::string &name, const double exact_tolerance, const std::string &matrix_free = "auto")
    {
      const RunRecord iterative =
        run(describe(gaussian_case(step, cell, "iterative", matrix_free), name + "_iterative"));
      const RunRecord direct = run(describe(gaussian_case(step, cell, "direct"), name + "_direct"));
      ASSERT_EQ(iterative.status, "completed");
      ASSERT_EQ(direct.status, "completed");
      std::printf("step %s: %s\n", step.c_str(), iterative.linear_solver.c_str());
      EXPECT_EQ(iterative.linear_solver.rfind(expected_preconditioner, 0), 0u) << iterative.linear_solver;
      const double peak = line_source(1, 1, 0.1);
      const double xs[3][2] = {{1, 1}, {1.2, 1.1}, {1.5, 1.4}};
      ASSERT_EQ(iterative.points.size(), 3u);
      for (std::size_t k = 0; k < 3; ++k)
        {
          const double a = iterative.points[k].final_value, b = direct.points[k].final_value;
          const double exact = line_source(xs[k][0], xs[k][1], 0.1);
          std::printf("  %s: iterative %.12g, direct %.12g (difference %.2e of the peak), exact %.8g (%.2e)\n",
                      iterative.points[k].name.c_str(), a, b, std::abs(a - b) / peak, exact,
                      std::abs(b - exact) / peak);
          // Solver tolerance 1e-13 of the right-hand side per step, over at most 50 steps.
          EXPECT_LT(std::abs(a - b), 1e-9 * peak) << iterative.points[k].name;
          // Q2 and BDF2 at these cells and steps (the tolerance given is twice the error measured).
          EXPECT_LT(std::abs(b - exact), exact_tolerance * peak) << iterative.points[k].name;
        }
    }
  } // namespace

  // 50 steps of 1e-3 s on 0.05 m Q2 cells: D dt / h^2 = 0.4 per cell (diffusion number 9.3), the
  // mass term dominates.
  TEST(LinearSolverChoice, SmallStepsUseTheDiagonalAndAgreeWithLU)
  {
    compare("1e-3 s", "0.05 m", "CG with the diagonal", "solver_choice_small", 1e-4);
  }

  // 8 steps of 6.25e-3 s on 0.025 m cells: D dt / h^2 = 10 per cell (diffusion number about 230),
  // stiffness dominates: multigrid, geometric without a matrix (Q2, the default), algebraic on
  // the assembled matrix.
  TEST(LinearSolverChoice, LargeStepsUseMultigridAndAgreeWithLU)
  {
    compare("6.25e-3 s", "0.025 m", "CG with geometric multigrid", "solver_choice_large", 5e-3);
    compare("6.25e-3 s", "0.025 m", "CG with algebraic multigrid", "solver_choice_large_assembled", 5e-3, "off");
  }
} // namespace fickcast::testing
