// Source: the method of manufactured solutions (Roache 1998, published; the exact answer is built
// below, not taken from a table).
// Manufactured solution across a partition jump, with capacity other than 1 and a transfer face:
// observed spatial orders. Procedure: Roache, Verification and Validation in Computational Science
// and Engineering (1998); Salari & Knupp, SAND2000-1444 (2000). Expected L2 order p + 1 for
// degree-p Lagrange elements (Thomee, Galerkin FEM for Parabolic Problems, 2006).
//
// Designed for this project (the model of DESIGN.md: C du/dt = d/dx(G du/dx) + s, C = theta K,
// G = theta D K, c = K u, u continuous, G du/dx continuous). Two layers:
//   a on [0, 1]: theta 0.5, K 1, D 1 (C 0.5, G 0.5); u = e^-t (1 + x/2 + x^2 + x^3)
//   b on [1, 2]: theta 1,   K 2, D 0.5 (C 2, G 1);   u = e^-t (3.5 + 2.75 s - s^2 + s^3), s = x - 1
// Continuity at x = 1: u = 3.5 e^-t on both sides; G u' = 0.5 x 5.5 = 1 x 2.75. Sources
// s = C u_t - G u_xx per layer. Top face (x = 0): transfer, outward flux G u'(0) = 0.25 e^-t =
// h (c_surface - c_ambient) with h = 1 m/s, c_surface = e^-t, so ambient = 0.75 e^-t. Bottom
// face (x = 2): concentration c = K u = 12.5 e^-t.
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
    const std::string u_a = "(1 + 0.5*x + x^2 + x^3)";
    const std::string u_b = "(3.5 + 2.75*(x-1) - (x-1)^2 + (x-1)^3)";

    class LayeredExact : public dealii::Function<1>
    {
    public:
      explicit LayeredExact(const double time)
        : a_(u_a, {"x"})
        , b_(u_b, {"x"})
        , time_(time)
      {
      }
      double value(const dealii::Point<1> &p, unsigned int = 0) const override
      {
        return std::exp(-time_) * (p[0] < 1 ? a_({p[0]}) : b_({p[0]}));
      }

    private:
      Expression a_, b_;
      double time_;
    };

    std::string layered_case(const double cell, const unsigned int degree)
    {
      return "[case]\ntitle = mms across a partition jump\n[geometry]\nlayers = a 1 m, b 1 m\ncell_size = " +
             std::to_string(cell) +
             " m\n[region.a]\ndiffusivity = 1 m2/s\nporosity = 0.5\n"
             "initial = {" +
             u_a + "} mol/m3\nsource = {exp(-t)*(-0.5*" + u_a +
             " - 0.5*(2 + 6*x))} mol/(m3 s)\n"
             "[region.b]\ndiffusivity = 0.5 m2/s\npartition = 2\ninitial = {2*" +
             u_b + "} mol/m3\nsource = {exp(-t)*(-2*" + u_b +
             " - (-2 + 6*(x-1)))} mol/(m3 s)\n"
             "[boundary.top]\ntype = transfer\ncoefficient = 1 m/s\nambient = {0.75*exp(-t)} mol/m3\n"
             "[boundary.bottom]\ntype = concentration\nvalue = {12.5*exp(-t)} mol/m3\n"
             "[time]\nend = 0.2 s\ntolerance = 1e-10\n[numerics]\ndegree = " +
             std::to_string(degree) + "\n[output]\nfields = false\n";
    }

    /// One layer [0, 1] with a partition K = 2 and D(c) = 1 + c / 8 (c = K u, so D = 1 + u / 4):
    /// C = 2, G = K D = 2 + u / 2, u as in layer a above, s = C u_t - d/dx(G u_x)
    /// = -2 u - (2 + u/2) u_xx - u_x^2 / 2; c = 2 u held on both faces.
    std::string nonlinear_case(const double cell, const unsigned int degree)
    {
      const std::string u = "exp(-t)*" + u_a, ux = "exp(-t)*(0.5 + 2*x + 3*x^2)", uxx = "exp(-t)*(2 + 6*x)";
      return "[case]\ntitle = mms with D(c) and a partition\n[geometry]\nlayers = a 1 m\ncell_size = " +
             std::to_string(cell) + " m\n[region.a]\ndiffusivity = {1 + c/8} m2/s\npartition = 2\ninitial = {2*" + u_a +
             "} mol/m3\nsource = {-2*" + u + " - (2 + " + u + "/2)*" + uxx + " - 0.5*(" + ux +
             ")^2} mol/(m3 s)\n[boundary.top]\ntype = concentration\nvalue = {2*exp(-t)} mol/m3\n"
             "[boundary.bottom]\ntype = concentration\nvalue = {7*exp(-t)} mol/m3\n"
             "[time]\nend = 0.2 s\ntolerance = 1e-10\n[numerics]\nnonlinear_tolerance = 1e-12\ndegree = " +
             std::to_string(degree) + "\n[output]\nfields = false\n";
    }

    double l2_error(const std::string &text)
    {
      const CaseDescription description = describe(text, "mms_interface");
      std::filesystem::create_directories(description.output.folder);
      double error = -1;
      const StateObserver<1> observer = [&](double t, const DiffusionProblem<1> &problem,
                                            const dealii::TrilinosWrappers::MPI::Vector &state) {
        if (t < description.time.end * (1 - 1e-12))
          return;
        const LayeredExact exact(t);
        dealii::Vector<double> cellwise(problem.triangulation().n_active_cells());
        dealii::VectorTools::integrate_difference(problem.mapping(), problem.dof_handler(), state, exact, cellwise,
                                                  dealii::QGauss<1>(problem.degree() + 3),
                                                  dealii::VectorTools::L2_norm);
        error =
          dealii::VectorTools::compute_global_error(problem.triangulation(), cellwise, dealii::VectorTools::L2_norm);
      };
      const RunRecord record = simulate<1>(description, MPI_COMM_WORLD, description.output.folder, {}, observer);
      EXPECT_EQ(record.status, "completed") << record.message;
      return error;
    }
  } // namespace

  TEST(InterfaceManufactured, OrdersAcrossAPartitionJumpWithATransferFace)
  {
    for (const unsigned int p : {1u, 2u})
      {
        std::vector<double> errors;
        for (const double h : {1.0 / 8, 1.0 / 16, 1.0 / 32})
          errors.push_back(l2_error(layered_case(h, p)));
        for (std::size_t k = 1; k < errors.size(); ++k)
          {
            const double order = std::log2(errors[k - 1] / errors[k]);
            std::printf("interface MMS Q%u: L2 error %.3e -> %.3e, observed order %.3f\n", p, errors[k - 1], errors[k],
                        order);
            EXPECT_GE(order, p + 1 - 0.1) << "Q" << p;
          }
      }
  }

  // D(c) with a partition other than 1 (issue 24 item 2): the nonlinear terms of the source use
  // the phase concentration c = K u, so a partition applied to the wrong variable, or D(c)
  // ignored, leaves a residual that stops the convergence.
  TEST(InterfaceManufactured, OrdersWithAConcentrationDependentDiffusivityAndAPartition)
  {
    for (const unsigned int p : {1u, 2u})
      {
        std::vector<double> errors;
        for (const double h : {1.0 / 8, 1.0 / 16, 1.0 / 32})
          errors.push_back(l2_error(nonlinear_case(h, p)));
        for (std::size_t k = 1; k < errors.size(); ++k)
          {
            const double order = std::log2(errors[k - 1] / errors[k]);
            std::printf("D(c) MMS with K = 2, Q%u: L2 error %.3e -> %.3e, observed order %.3f\n", p, errors[k - 1],
                        errors[k], order);
            EXPECT_GE(order, p + 1 - 0.1) << "Q" << p;
          }
      }
  }
} // namespace fickcast::testing
