// The step operator applied cell by cell without its matrix (numerics.matrix_free = auto) gives
// the assembled matrix's solution to solver tolerance, on cases that use every term it carries:
// layers with porosity, tortuosity and partition, decay, a diffusivity changing in time (a part
// rescaled per step), a transfer face (a boundary term), held concentrations, hanging nodes from
// the refinement next to open faces, and the axisymmetric and 3-D geometries. Against an exact
// solution, the line source of linear_solver_choice_test.cc runs matrix-free (CG with the
// diagonal, 2-D) and meets the Gaussian of Carslaw & Jaeger there.
#include "case_runner.h"

#include <gtest/gtest.h>

#include <cmath>
#include <cstdio>
#include <string>

namespace fickcast::testing
{
  namespace
  {
    /// A two-layer body (invented numbers): a coat whose diffusivity grows in time, with
    /// porosity, tortuosity and a partition, over a core with decay; held at 1 mol/m3 on top, a
    /// transfer face on one side (so the field varies across as well as down). Fixed steps, so
    /// that both runs take the same steps.
    std::string layered_case(const std::string &dimension_lines, const std::string &extent, const std::string &side,
                             const std::string &matrix_free)
    {
      return "[case]\ntitle = matrix-free against assembled (invented numbers)\n" + dimension_lines +
             "[geometry]\nlayers = coat 0.2 m, core 0.8 m\n" + extent +
             "cell_size = 0.1 m\nopen_face_refinement = on\n"
             "[region.coat]\ndiffusivity = {2e-2*(1+t)} m2/s\nporosity = 0.4\ntortuosity = 0.6\npartition = 2\n"
             "[region.core]\ndiffusivity = 1e-2 m2/s\ndecay_rate = 0.05 1/s\n"
             "[boundary.top]\ntype = concentration\nvalue = 1 mol/m3\n"
             "[boundary." +
             side +
             "]\ntype = transfer\ncoefficient = 0.05 m/s\nambient = 0.3 mol/m3\n"
             "[time]\nend = 2 s\nstep = 0.02 s\n"
             "[numerics]\naccuracy = off\nlinear_solver = iterative\nsolver_tolerance = 1e-13\nmatrix_free = " +
             matrix_free + "\n[output]\nfields = false\n";
    }

    void compare(const std::string &head, const std::string &extent, const std::string &side, const std::string &points,
                 const std::string &name)
    {
      const RunRecord with = run(describe(layered_case(head, extent, side, "auto") + points, name + "_matrix_free"));
      const RunRecord without = run(describe(layered_case(head, extent, side, "off") + points, name + "_assembled"));
      ASSERT_EQ(with.status, "completed") << with.message;
      ASSERT_EQ(without.status, "completed") << without.message;
      std::printf("%s: %s\n  against: %s\n", name.c_str(), with.linear_solver.c_str(), without.linear_solver.c_str());
      EXPECT_NE(with.linear_solver.find("without a matrix"), std::string::npos) << with.linear_solver;
      EXPECT_EQ(without.linear_solver.find("without a matrix"), std::string::npos) << without.linear_solver;
      EXPECT_EQ(with.steps_accepted, without.steps_accepted);
      ASSERT_EQ(with.points.size(), without.points.size());
      ASSERT_GE(with.points.size(), 3u);
      for (std::size_t k = 0; k < with.points.size(); ++k)
        {
          const double a = with.points[k].final_value, b = without.points[k].final_value;
          std::printf("  %s: matrix-free %.15g, assembled %.15g (difference %.2e)\n", with.points[k].name.c_str(), a, b,
                      std::abs(a - b));
          // Relative residual 1e-13 per solve over 100 steps, against a scale of 1 mol/m3; the
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

  TEST(MatrixFree, AgreesWithTheAssembledMatrixIn3D)
  {
    compare("dimension = 3\n", "width = 0.3 m\nlength = 0.2 m\n", "right",
            "point.coat = 0.15 m, 0.1 m, 0.1 m\npoint.core = 0.1 m, 0.05 m, 0.5 m\npoint.base = 0.2 m, 0.1 m, 0.95 m\n",
            "matrix_free_3d");
  }
} // namespace fickcast::testing
