// Method of manufactured solutions: observed convergence orders in space and time.
// Procedure: Roache, Verification and Validation in Computational Science and Engineering
// (1998); Salari & Knupp, SAND2000-1444 (2000). Expected rates: L2 error O(h^(p+1)) for
// Lagrange elements of degree p (Thomee, Galerkin FEM for Parabolic Problems, 2006; Ciarlet
// 1978); implicit Euler order 1, Crank-Nicolson and BDF2 order 2 (Hairer & Wanner, vol. II).
#include "case_runner.h"

#include "case/expression.h"
#include "numerics/diffusion_problem.h"
#include "run/simulation.h"

#include <deal.II/base/function.h>
#include <deal.II/base/quadrature_lib.h>
#include <deal.II/numerics/vector_tools.h>

#include <gtest/gtest.h>

#include <cmath>
#include <cstdio>
#include <filesystem>

namespace fickcast::testing
{
  namespace
  {
    using dealii::Point;

    // Designed for this project, f checked against numerical differentiation (tests/verification/REFERENCES.md,
    // "Manufactured solutions"):
    // u = exp(-t/2) [2 + x y^2 + sin(pi x) cos(1.5 pi y)], D = 1 + 0.5 sin(2 pi x) cos(pi y).
    const std::string exact_u = "exp(-t/2)*(2 + x*y^2 + sin(pi*x)*cos(1.5*pi*y))";
    const std::string diffusivity = "1 + 0.5*sin(2*pi*x)*cos(pi*y)";
    const std::string source = "exp(-t/2)*(-(2 + x*y^2 + sin(pi*x)*cos(1.5*pi*y))/2"
                               " - (pi*cos(2*pi*x)*cos(pi*y)*(y^2 + pi*cos(pi*x)*cos(1.5*pi*y))"
                               " - 0.5*pi*sin(2*pi*x)*sin(pi*y)*(2*x*y - 1.5*pi*sin(pi*x)*sin(1.5*pi*y))"
                               " + (1 + 0.5*sin(2*pi*x)*cos(pi*y))*(2*x - 3.25*pi^2*sin(pi*x)*cos(1.5*pi*y))))";

    class ExactSolution : public dealii::Function<2>
    {
    public:
      ExactSolution(const std::string &text, double time)
        : expression_(text, {"x", "y", "t"})
        , time_(time)
      {
      }
      double value(const Point<2> &p, unsigned int = 0) const override { return expression_({p[0], p[1], time_}); }

    private:
      Expression expression_;
      double time_;
    };

    /// The exact solutions here depend on time only through exp(-t...): the initial value is
    /// the same text at t = 0 (initial values may not use t).
    std::string at_time_zero(std::string text)
    {
      for (auto at = text.find("(-t"); at != std::string::npos; at = text.find("(-t"))
        text.replace(at, 3, "(-0");
      return text;
    }

    std::string unit_square_case(const std::string &u, const std::string &d, const std::string &f, const double cell,
                                 const unsigned int degree, const std::string &time_block)
    {
      return "[case]\ntitle = mms\ndimension = 2\n[geometry]\nlayers = square 1 m\nwidth = 1 m\ncell_size = " +
             std::to_string(cell) + " m\n[region.square]\ndiffusivity = {" + d + "} m2/s\nsource = {" + f +
             "} mol/(m3 s)\n[initial]\nvalue = {" + at_time_zero(u) + "} mol/m3\n" +
             "[boundary.left]\ntype = concentration\nvalue = {" + u + "} mol/m3\n" +
             "[boundary.right]\ntype = concentration\nvalue = {" + u + "} mol/m3\n" +
             "[boundary.top]\ntype = concentration\nvalue = {" + u + "} mol/m3\n" +
             "[boundary.bottom]\ntype = concentration\nvalue = {" + u + "} mol/m3\n" + time_block +
             "[numerics]\ndegree = " + std::to_string(degree) + "\n[output]\nfields = false\n";
    }

    /// The unit square as an axisymmetric body (x = r, y = z; radius 1 m, height 1 m): the axis
    /// takes no condition, top, bottom and side hold @p u.
    std::string axisymmetric_case(const std::string &u, const std::string &f, const double cell,
                                  const unsigned int degree)
    {
      return "[case]\ntitle = mms axisymmetric\ncoordinates = axisymmetric\n[geometry]\nlayers = body 1 m\n"
             "radius = 1 m\ncell_size = " +
             std::to_string(cell) + " m\n[region.body]\ndiffusivity = 1 m2/s\nsource = {" + f +
             "} mol/(m3 s)\n[initial]\nvalue = {" + at_time_zero(u) + "} mol/m3\n" +
             "[boundary.side]\ntype = concentration\nvalue = {" + u + "} mol/m3\n" +
             "[boundary.top]\ntype = concentration\nvalue = {" + u + "} mol/m3\n" +
             "[boundary.bottom]\ntype = concentration\nvalue = {" + u + "} mol/m3\n" +
             "[time]\nend = 0.2 s\ntolerance = 1e-10\n[numerics]\ndegree = " + std::to_string(degree) +
             "\n[output]\nfields = false\n";
    }

    /// L2 error at the end of the run of @p text against @p u.
    double l2_error_at_end(const std::string &text, const std::string &name, const std::string &u)
    {
      const CaseDescription description = describe(text, name);
      std::filesystem::create_directories(description.output.folder);
      double error = -1;
      const StateObserver<2> observer = [&](double t, const DiffusionProblem<2> &problem,
                                            const dealii::TrilinosWrappers::MPI::Vector &state) {
        if (t < description.time.end * (1 - 1e-12))
          return;
        const ExactSolution exact(u, t);
        dealii::Vector<double> cellwise(problem.triangulation().n_active_cells());
        dealii::VectorTools::integrate_difference(problem.mapping(), problem.dof_handler(), state, exact, cellwise,
                                                  dealii::QGauss<2>(problem.degree() + 3),
                                                  dealii::VectorTools::L2_norm);
        error =
          dealii::VectorTools::compute_global_error(problem.triangulation(), cellwise, dealii::VectorTools::L2_norm);
      };
      const RunRecord record = simulate<2>(description, MPI_COMM_WORLD, description.output.folder, {}, observer);
      EXPECT_EQ(record.status, "completed");
      return error;
    }
  } // namespace

  // Source: the manufactured solution and its check values in tests/verification/REFERENCES.md,
  // "Manufactured solutions" (procedure of Roache 1998 and Salari & Knupp, SAND2000-1444).
  TEST(ManufacturedSolution, SourceExpressionMatchesReferenceValues)
  {
    // Check values of f = u_t - div(D grad u), computed in 30 digits (tests/verification/REFERENCES.md,
    // "Manufactured solutions").
    const Expression f(source, {"x", "y", "t"});
    EXPECT_NEAR(f({0.25, 0.5, 0.0}), -20.6277597205, 1e-9);
    EXPECT_NEAR(f({0.5, 0.25, 0.5}), 7.94914884857, 1e-9);
    EXPECT_NEAR(f({0.75, 0.75, 1.0}), -20.5880610977, 1e-9);
    EXPECT_NEAR(f({0.1, 0.9, 0.3}), -4.5238745136, 1e-9);
  }

  class SpatialOrder : public ::testing::TestWithParam<unsigned int>
  {
  };

  // Source: L2 error O(h^(p+1)) for Lagrange elements of degree p (Thomee, Galerkin Finite
  // Element Methods for Parabolic Problems, 2nd ed. 2006), on the solution of tests/verification/REFERENCES.md,
  // "Manufactured solutions".
  TEST_P(SpatialOrder, L2ErrorFallsAsHToThePPlusOne)
  {
    const unsigned int p = GetParam();
    const std::string time_block = "[time]\nend = 0.2 s\ntolerance = 1e-9\n";
    std::vector<double> errors;
    const double coarsest = p == 1 ? 1.0 / 8 : 1.0 / 4;
    for (unsigned int level = 0; level < 4; ++level)
      {
        const double h = coarsest / (1 << level);
        errors.push_back(l2_error_at_end(unit_square_case(exact_u, diffusivity, source, h, p, time_block),
                                         "mms_space_q" + std::to_string(p), exact_u));
      }
    for (std::size_t k = 1; k < errors.size(); ++k)
      {
        const double order = std::log2(errors[k - 1] / errors[k]);
        std::printf("Q%u: L2 error %.3e -> %.3e, observed order %.3f\n", p, errors[k - 1], errors[k], order);
        EXPECT_GE(order, p + 1 - 0.1) << "Q" << p << " between levels " << k - 1 << " and " << k << ": errors "
                                      << errors[k - 1] << ", " << errors[k];
      }
  }

  INSTANTIATE_TEST_SUITE_P(Degrees, SpatialOrder, ::testing::Values(1u, 2u),
                           [](const ::testing::TestParamInfo<unsigned int> &info) {
                             return "Q" + std::to_string(info.param);
                           });

  struct TimeCase
  {
    std::string scheme;
    double expected_order;
  };

  void PrintTo(const TimeCase &time_case, std::ostream *out)
  {
    *out << time_case.scheme;
  }

  class TemporalOrder : public ::testing::TestWithParam<TimeCase>
  {
  };

  // Source: scheme orders 1 (implicit Euler) and 2 (Crank-Nicolson, BDF2) from Hairer & Wanner,
  // Solving Ordinary Differential Equations II, 1996. Spatially exact MMS (tests/verification/REFERENCES.md,
  // "Manufactured solutions"): u = exp(-t)(1 + x + 2y + xy) lies in the Q1 space, D = 1 + x/2 + y/4,
  // f = -exp(-t)(2 + 1.25x + 2.5y + xy); only the time error remains.
  TEST_P(TemporalOrder, ErrorFallsWithTheSchemeOrder)
  {
    const TimeCase time_case = GetParam();
    const std::string u = "exp(-t)*(1 + x + 2*y + x*y)";
    const std::string d = "1 + x/2 + y/4";
    const std::string f = "-exp(-t)*(2 + 1.25*x + 2.5*y + x*y)";
    std::vector<double> errors;
    for (const int steps : {10, 20, 40, 80})
      {
        const std::string block =
          "[time]\nend = 1 s\nstep = " + std::to_string(1.0 / steps) + " s\nscheme = " + time_case.scheme + "\n";
        errors.push_back(l2_error_at_end(unit_square_case(u, d, f, 0.25, 1, block), "mms_time_" + time_case.scheme, u));
      }
    for (std::size_t k = 1; k < errors.size(); ++k)
      {
        const double order = std::log2(errors[k - 1] / errors[k]);
        std::printf("%s: L2 error %.3e -> %.3e, observed order %.3f\n", time_case.scheme.c_str(), errors[k - 1],
                    errors[k], order);
        EXPECT_GE(order, time_case.expected_order - 0.1)
          << time_case.scheme << ": errors " << errors[k - 1] << ", " << errors[k];
      }
  }

  INSTANTIATE_TEST_SUITE_P(Schemes, TemporalOrder,
                           ::testing::Values(TimeCase{"implicit_euler", 1.0}, TimeCase{"crank_nicolson", 2.0},
                                             TimeCase{"bdf2", 2.0}),
                           [](const ::testing::TestParamInfo<TimeCase> &info) { return info.param.scheme; });

  // Axisymmetric manufactured solution (designed for this project; procedure as above):
  // u = exp(-t) (2 + r^2 z + z^3 + r^4 / 4), D = 1, so u_r = 0 on the axis and
  // (1/r) d/dr(r u_r) + u_zz = exp(-t) (10 z + 4 r^2): f = u_t - that. A weight that is not
  // proportional to r (a missing r, a Cartesian form) leaves a residual that stops the
  // convergence; a constant factor on 2 pi r cancels here (tried: not caught) and is caught by
  // the amounts of MultiDimensional.ErfcColumnAxisymmetric.
  TEST(ManufacturedSolution, AxisymmetricOrders)
  {
    const std::string u = "exp(-t)*(2 + x^2*y + y^3 + x^4/4)";
    const std::string f = "exp(-t)*(-(2 + x^2*y + y^3 + x^4/4) - 10*y - 4*x^2)";
    for (const unsigned int p : {1u, 2u})
      {
        std::vector<double> errors;
        for (const double h : {1.0 / 4, 1.0 / 8, 1.0 / 16})
          errors.push_back(l2_error_at_end(axisymmetric_case(u, f, h, p), "mms_axisymmetric", u));
        for (std::size_t k = 1; k < errors.size(); ++k)
          {
            const double order = std::log2(errors[k - 1] / errors[k]);
            std::printf("axisymmetric Q%u: L2 error %.3e -> %.3e, observed order %.3f\n", p, errors[k - 1], errors[k],
                        order);
            EXPECT_GE(order, p + 1 - 0.1) << "Q" << p;
          }
      }
  }
} // namespace fickcast::testing
