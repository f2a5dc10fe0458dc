// The content an uptake case tends to: the case's equilibrium concentration everywhere.
#pragma once

#include "case/case_description.h"
#include "numerics/diffusion_problem.h"

#include <cmath>

namespace fickcast
{
  /// The content with the reference-phase concentration at the case's equilibrium everywhere
  /// (an uptake case's M_eq; NaN for other cases). Collective.
  template <int dim>
  double equilibrium_amount(const DiffusionProblem<dim> &problem, const CaseDescription &c)
  {
    if (!c.output.uptake)
      return std::nan("");
    auto full = problem.make_vector();
    full = c.output.equilibrium;
    double total = 0;
    for (const double a : problem.region_amounts(full))
      total += a;
    return total;
  }
} // namespace fickcast
