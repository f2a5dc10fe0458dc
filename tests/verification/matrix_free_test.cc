// The step operator applied cell by cell without its matrix (numerics.matrix_free = auto) gives
// the assembled matrix's solution to solver tolerance, on cases that use every term it carries:
// layers with porosity, tortuosity and partition, decay, a diffusivity changing in time (a part
// rescaled per step), a transfer face (a boundary term), held concentrations, hanging nodes from
// the refinement next to open faces, and the axisymmetric and 3-D geometries. Against an exact
// solution, the line source of linear_solver_choice_test.cc runs matrix-free (CG with the
// diagonal, 2-D) and meets the Gaussian of Carslaw & Jaeger there.
#include "case_runner.h"

#include <gtest/gtest.h>

#include <algorithm>
#include <cmath>
#include <cstdio>
#include <string>
#include <vector>

namespace fickcast::testing
{
  namespace
  {
    /// A two-layer body (invented numbers): a coat whose diffusivity grows in time, with
    /// porosity, tortuosity and a partition, over a core with decay; held at 1 mol/m3 on top, a
    /// transfer face on one side (so the field varies across as well as down). Fixed steps, so
    /// that both runs take the same steps.
    std::string layered_case(const std::string &dimension_lines, const std::string &extent, const std::string &side,
                             const std::string &matrix_free, const std::string &times = "end = 2 s\nstep = 0.02 s\n",
                             const std::string &cell = "0.1 m")
    {
      return "[case]\ntitle = matrix-free against assembled (invented numbers)\n" + dimension_lines +
             "[geometry]\nlayers = coat 0.2 m, core 0.8 m\n" + extent + "cell_size = " + cell +
             "\nopen_face_refinement = on\n"
             "[region.coat]\ndiffusivity = {2e-2*(1+t)} m2/s\nporosity = 0.4\ntortuosity = 0.6\npartition = 2\n"
             "[region.core]\ndiffusivity = 1e-2 m2/s\ndecay_rate = 0.05 1/s\n"
             "[boundary.top]\ntype = concentration\nvalue = 1 mol/m3\n"
             "[boundary." +
             side +
             "]\ntype = transfer\ncoefficient = 0.05 m/s\nambient = 0.3 mol/m3\n"
             "[time]\n" +
             times + "[numerics]\naccuracy = off\nlinear_solver = iterative\nsolver_tolerance = 1e-13\nmatrix_free = " +
             matrix_free + "\n[output]\nfields = false\n";
    }

    /// @p stiff: steps 50 times longer on finer cells, so that the diagonal no longer suffices
    /// and geometric multigrid solves the steps without a matrix.
    void compare(const std::string &head, const std::string &extent, const std::string &side, const std::string &points,
                 const std::string &name, const bool stiff = false)
    {
      if (assembled_steps_forced())
        GTEST_SKIP() << "compares the two paths itself";
      const std::string times = stiff ? "end = 20 s\nstep = 1 s\n" : "end = 2 s\nstep = 0.02 s\n";
      const std::string cell = stiff ? "0.0125 m" : "0.1 m";
      const RunRecord with =
        run(describe(layered_case(head, extent, side, "auto", times, cell) + points, name + "_matrix_free"));
      const RunRecord without =
        run(describe(layered_case(head, extent, side, "off", times, cell) + points, name + "_assembled"));
      ASSERT_EQ(with.status, "completed") << with.message;
      ASSERT_EQ(without.status, "completed") << without.message;
      std::printf("%s: %s\n  against: %s\n", name.c_str(), with.linear_solver.c_str(), without.linear_solver.c_str());
      EXPECT_NE(with.linear_solver.find("without a matrix"), std::string::npos) << with.linear_solver;
      if (stiff)
        EXPECT_NE(with.linear_solver.find("geometric multigrid"), std::string::npos) << with.linear_solver;
      EXPECT_EQ(without.linear_solver.find("without a matrix"), std::string::npos) << without.linear_solver;
      EXPECT_EQ(with.steps_accepted, without.steps_accepted);
      ASSERT_EQ(with.points.size(), without.points.size());
      ASSERT_GE(with.points.size(), 3u);
      for (std::size_t k = 0; k < with.points.size(); ++k)
        {
          const double a = with.points[k].final_value, b = without.points[k].final_value;
          std::printf("  %s: matrix-free %.15g, assembled %.15g (difference %.2e)\n", with.points[k].name.c_str(), a, b,
                      std::abs(a - b));
          // Relative residual 1e-13 per solve over 20 to 100 steps, against a scale of 1 mol/m3; the
          // values themselves lie between 1e-3 and 1 (a dropped term moves them by 1e-4 or more).
          EXPECT_LT(std::abs(a - b), 1e-9) << with.points[k].name;
          EXPECT_GT(b, 1e-3) << with.points[k].name;
        }
    }
  } // namespace

  TEST(MatrixFree, AgreesWithTheAssembledMatrixIn2D)
  {
    compare("dimension = 2\n", "width = 0.5 m\n", "right",
            "point.coat = 0.25 m, 0.1 m\npoint.below = 0.1 m, 0.25 m\npoint.core = 0.3 m, 0.5 m\n"
            "point.near_side = 0.48 m, 0.6 m\npoint.base = 0.25 m, 0.95 m\n",
            "matrix_free_2d");
  }

  TEST(MatrixFree, AgreesWithTheAssembledMatrixAxisymmetric)
  {
    compare(
      "dimension = 2\ncoordinates = axisymmetric\n", "radius = 0.5 m\n", "side",
      "point.axis = 0 m, 0.3 m\npoint.rim = 0.45 m, 0.3 m\npoint.core = 0.2 m, 0.6 m\npoint.base = 0.1 m, 0.95 m\n",
      "matrix_free_axisymmetric");
  }

  // Stiff steps (diffusion number in the thousands): CG with geometric multigrid on the operator
  // without a matrix against CG with algebraic multigrid on the assembled one; hanging nodes
  // (refinement next to the open faces), held, transfer and axisymmetric terms on every mesh.
  TEST(MatrixFree, GeometricMultigridAgreesWithTheAssembledMatrix)
  {
    compare("dimension = 2\n", "width = 0.5 m\n", "right",
            "point.coat = 0.25 m, 0.1 m\npoint.below = 0.1 m, 0.25 m\npoint.core = 0.3 m, 0.5 m\n"
            "point.near_side = 0.48 m, 0.6 m\npoint.base = 0.25 m, 0.95 m\n",
            "geometric_2d", true);
    compare(
      "dimension = 2\ncoordinates = axisymmetric\n", "radius = 0.5 m\n", "side",
      "point.axis = 0 m, 0.3 m\npoint.rim = 0.45 m, 0.3 m\npoint.core = 0.2 m, 0.6 m\npoint.base = 0.1 m, 0.95 m\n",
      "geometric_axisymmetric", true);
  }

  TEST(MatrixFree, AgreesWithTheAssembledMatrixIn3D)
  {
    compare("dimension = 3\n", "width = 0.3 m\nlength = 0.2 m\n", "right",
            "point.coat = 0.15 m, 0.1 m, 0.1 m\npoint.core = 0.1 m, 0.05 m, 0.5 m\npoint.base = 0.2 m, 0.1 m, 0.95 m\n",
            "matrix_free_3d");
  }
} // namespace fickcast::testing

namespace fickcast::testing
{
  namespace
  {
    /// Largest error at three points of a cosine mode decaying in a sealed unit square, D = 1:
    /// u = 1 + exp(-2 pi^2 t) cos(pi x) cos(pi y) (separation of variables with insulated faces:
    /// Crank 1975 ch. 4, Carslaw & Jaeger 1959 sec. 6.3, from memory), to t = 0.02 s in 2000
    /// fixed steps (BDF2 after an implicit-Euler start: time error about 4e-8; with 1000 steps
    /// Q4 on 0.125 m cells stopped at 1.5e-7, the time error's floor).
    double cosine_mode_error(const unsigned int degree, const std::string &cell)
    {
      const std::string text = "[case]\ntitle = cosine mode (test)\ndimension = 2\n[geometry]\nlayers = square 1 m\n"
                               "width = 1 m\ncell_size = " +
                               cell +
                               "\n[region.square]\ndiffusivity = 1 m2/s\n[initial]\n"
                               "value = {1 + cos(pi*x)*cos(pi*y)} mol/m3\n[time]\nend = 0.02 s\nstep = 1e-5 s\n"
                               "[numerics]\naccuracy = off\nlinear_solver = iterative\nsolver_tolerance = 1e-13\n"
                               "degree = " +
                               std::to_string(degree) +
                               "\n[output]\nfields = false\npoint.a = 0.3 m, 0.2 m\npoint.b = 0.71 m, 0.45 m\n"
                               "point.c = 0.13 m, 0.87 m\n";
      const RunRecord r = run(describe(text, "cosine_mode_q" + std::to_string(degree) + "_" + cell.substr(0, 5)));
      EXPECT_EQ(r.status, "completed") << r.message;
      if (!assembled_steps_forced())
        EXPECT_NE(r.linear_solver.find("without a matrix"), std::string::npos) << r.linear_solver;
      const double pi = 3.14159265358979323846, decay = std::exp(-2 * pi * pi * 0.02);
      const double xs[3][2] = {{0.3, 0.2}, {0.71, 0.45}, {0.13, 0.87}};
      double error = 0;
      for (std::size_t k = 0; k < r.points.size() && k < 3; ++k)
        {
          // y is the depth from the top face (y = 0 there): the mode is even in y about 0.5 after
          // the flip 1 - y, so cos(pi (1 - y)) = -cos(pi y).
          const double exact_top = 1 + decay * std::cos(pi * xs[k][0]) * std::cos(pi * xs[k][1]);
          const double exact_flipped = 1 - decay * std::cos(pi * xs[k][0]) * std::cos(pi * xs[k][1]);
          error = std::max(error, std::min(std::abs(r.points[k].final_value - exact_top),
                                           std::abs(r.points[k].final_value - exact_flipped)));
        }
      return error;
    }
  } // namespace

  // Degrees 2 to 4 without matrices converge at least at order p + 1 in the values at points
  // (common practice for Lagrange elements of degree p on a smooth solution): halving the cells
  // divides the error by at least 0.8 * 2^(p+1). Q4 is compared on 0.5 and 0.25 m cells, where its
  // error stays well above the time error.
  TEST(MatrixFree, HigherDegreesConvergeAtTheirOrder)
  {
    for (const unsigned int degree : {2u, 3u, 4u})
      {
        const std::string coarse_cell = degree == 4 ? "0.5 m" : "0.25 m",
                          fine_cell = degree == 4 ? "0.25 m" : "0.125 m";
        const double coarse = cosine_mode_error(degree, coarse_cell), fine = cosine_mode_error(degree, fine_cell);
        std::printf("Q%u: error %.3e (%s cells) -> %.3e (%s), ratio %.1f\n", degree, coarse, coarse_cell.c_str(), fine,
                    fine_cell.c_str(), coarse / fine);
        EXPECT_GT(coarse / fine, 0.8 * std::pow(2.0, degree + 1)) << "degree " << degree;
        EXPECT_LT(fine, 1e-3) << "degree " << degree;
      }
  }
} // namespace fickcast::testing

namespace fickcast::testing
{
  // Geometric multigrid keeps its iteration count as the mesh is refined (the property that makes
  // it scale; common practice for multigrid on elliptic operators): a square held at 1 mol/m3 on
  // top, steps with diffusion numbers from about 1e3 to 1e5, cells from 1/64 to 1/256 m (17k to
  // 263k unknowns, two to four meshes in the V-cycle). CG with the diagonal would need more than
  // ten times the iterations at the finest (its count grows with the square root of the
  // diffusion number), and a V-cycle that lost a mesh's coarse correction grows with the cells.
  TEST(MatrixFree, GeometricMultigridIterationsStayFlat)
  {
    if (assembled_steps_forced())
      GTEST_SKIP() << "geometric multigrid works without matrices only";
    std::vector<double> per_solve;
    for (const std::string cell : {"0.015625 m", "0.0078125 m", "0.00390625 m"})
      {
        const std::string text = "[case]\ntitle = multigrid iterations (test)\ndimension = 2\n[geometry]\n"
                                 "layers = square 1 m\nwidth = 1 m\ncell_size = " +
                                 cell +
                                 "\n[region.square]\ndiffusivity = 1e-3 m2/s\n[boundary.top]\ntype = concentration\n"
                                 "value = 1 mol/m3\n[time]\nend = 40 s\nstep = 10 s\n[numerics]\naccuracy = off\n"
                                 "linear_solver = iterative\nsolver_tolerance = 1e-10\n[output]\nfields = false\n"
                                 "point.a = 0.5 m, 0.02 m\n";
        const RunRecord r = run(describe(text, "multigrid_flat_" + cell.substr(0, 6)));
        ASSERT_EQ(r.status, "completed") << r.message;
        EXPECT_NE(r.linear_solver.find("geometric multigrid"), std::string::npos) << r.linear_solver;
        per_solve.push_back(static_cast<double>(r.linear_iterations) / r.steps_accepted);
        std::printf("cells %s: %lu unknowns, %.2f iterations per step: %s\n", cell.c_str(), r.unknowns,
                    per_solve.back(), r.linear_solver.c_str());
      }
    const auto [low, high] = std::minmax_element(per_solve.begin(), per_solve.end());
    EXPECT_LE(*high - *low, 2.0);
    EXPECT_LE(*high, 10.0);
  }
} // namespace fickcast::testing
