// What a run says about its water flow: the cell Peclet and Courant figures, the flow's
// warnings, and the advective and dispersive parts of the fluxes through the faces.
#pragma once

#include "numerics/diffusion_problem.h"
#include "results/run_record.h"

#include <vector>

namespace fickcast
{
  /// Puts the largest cell Peclet number and its region into @p record, and the flow's warnings
  /// (run/guards.h) in front of its warnings; returns the largest crossing rate (1/s), which
  /// times a step is its Courant number. Collective.
  template <int dim>
  double note_flow(const DiffusionProblem<dim> &problem, RunRecord &record);

  /// For each boundary with @p active set, in order: the advective part of its inward rate
  /// (-q.n K u over the face) and the dispersive part (the rest of @p rates: the whole minus the
  /// advective part). Collective.
  template <int dim>
  std::vector<double> flow_parts(const DiffusionProblem<dim> &problem, const typename DiffusionProblem<dim>::Vector &u,
                                 const std::vector<double> &rates, const std::vector<bool> &active);
} // namespace fickcast
