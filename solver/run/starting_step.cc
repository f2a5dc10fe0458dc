#include "run/starting_step.h"

#include <algorithm>
#include <cmath>

namespace fickcast
{
  template <int dim>
  double starting_step(const DiffusionProblem<dim> &problem, const typename DiffusionProblem<dim>::Vector &u0,
                       const double t0, const double clock_rate, const double smallest, const double largest,
                       const double tolerance,
                       const std::function<double(const typename DiffusionProblem<dim>::Vector &)> &size)
  {
    const auto measure = [&](const typename DiffusionProblem<dim>::Vector &v) { return size(v) / tolerance; };
    using Vector = typename DiffusionProblem<dim>::Vector;
    if (problem.has_dispersed_phase() || !(clock_rate > 0))
      return smallest;
    // A held value that differs from the state where it is held (a sudden surface or bath value):
    // the first step's boundary flux is then wrong by its own size whatever the local error says,
    // and the amount it books stays in the body for the rest of the run. Such a start stays small.
    Vector start = u0;
    problem.set_fixed_values(start, t0);
    Vector jump = start;
    jump -= u0;
    if (jump.linfty_norm() > 1e-12 * std::max(problem.concentration_scale(t0), u0.linfty_norm()))
      return smallest;
    // Rates in the clock variable: du/ds = (du/dt) / rate.
    const Vector f0 = problem.rate_of_change(u0, t0);
    const double d0 = measure(u0), d1 = measure(f0) / clock_rate;
    if (!std::isfinite(d0) || !std::isfinite(d1))
      return smallest;
    // Nothing moves at the start (a forcing may still switch on later): the cautious start.
    if (!(d1 > 0))
      return smallest;
    const double h0 = std::clamp(d0 > 0 ? 0.01 * d0 / d1 : smallest, smallest, largest);

    Vector u1 = u0;
    u1.add(h0 / clock_rate, f0); // the clock step h0 is h0 / rate in time
    problem.set_fixed_values(u1, t0 + h0 / clock_rate);
    Vector change = problem.rate_of_change(u1, t0 + h0 / clock_rate);
    change -= f0;
    const double d2 = measure(change) / clock_rate / h0;
    if (!std::isfinite(d2))
      return smallest;
    const double curvature = std::max(d1, d2);
    const double h1 = curvature > 0 ? std::sqrt(0.01 / curvature) : smallest;
    return std::clamp(std::min(100 * h0, h1), smallest, largest);
  }

#define FICKCAST_STARTING_STEP(DIM)                                                                                    \
  template double starting_step<DIM>(const DiffusionProblem<DIM> &, const DiffusionProblem<DIM>::Vector &, double,     \
                                     double, double, double, double,                                                   \
                                     const std::function<double(const DiffusionProblem<DIM>::Vector &)> &);
  FICKCAST_STARTING_STEP(1)
  FICKCAST_STARTING_STEP(2)
  FICKCAST_STARTING_STEP(3)
#undef FICKCAST_STARTING_STEP
} // namespace fickcast
