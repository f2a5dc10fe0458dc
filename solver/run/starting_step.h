// The first step of an adaptive run: as large as the initial state allows.
#pragma once

#include "numerics/diffusion_problem.h"

#include <functional>

namespace fickcast
{
  /**
   * A first step for the controller from the initial state @p u0 at time @p t0 (clock rate
   * @p clock_rate there), with the starting-step rule of Hairer, Norsett and Wanner ("Solving
   * Ordinary Differential Equations I", 2nd ed., section II.4, "Starting step size"; from
   * memory): d0 = |u0|, d1 = |u'(t0)|, h0 = d0 / (100 d1), an explicit Euler step of h0 gives
   * d2 = |u'(t0 + h0) - u'(t0)| / h0, and the step is min(100 h0, (0.01 / max(d1, d2))^(1/2))
   * for the first-order first step: its error h^2 |u''| / 2 is then about a two-hundredth of the
   * tolerance. @p measure gives a vector's size the way the controller measures a step's error,
   * which it holds to @p tolerance. A smooth field (a Gaussian, a settled profile) starts with a
   * step near its own time scale; a field that changes fast at the start (u'' large) starts
   * small. A held value (surface concentration, bath) that differs from the state where it is
   * held is a sudden start: the first step's flux is wrong by its own size, and that amount stays
   * in the body, so such a start keeps @p smallest (the controller's cautious start).
   * The result lies in [@p smallest, @p largest] (clock units). Two solves with the mass matrix;
   * not with an undissolved reserve (returns @p smallest). Collective.
   */
  template <int dim>
  double starting_step(const DiffusionProblem<dim> &problem, const typename DiffusionProblem<dim>::Vector &u0,
                       double t0, double clock_rate, double smallest, double largest, double tolerance,
                       const std::function<double(const typename DiffusionProblem<dim>::Vector &)> &measure);
} // namespace fickcast
