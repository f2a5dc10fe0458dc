// The results' narrow view of a DiffusionProblem: the run layer is the one place that knows both.
#pragma once

#include "numerics/diffusion_problem.h"
#include "results/field_view.h"

namespace fickcast
{
  /// A view of @p problem's field for the results writers; @p problem must outlive it.
  template <int dim>
  FieldView<dim> field_view_of(const DiffusionProblem<dim> &problem)
  {
    FieldView<dim> view;
    view.dof_handler = &problem.dof_handler();
    view.mapping = &problem.mapping();
    view.communicator = problem.communicator();
    view.names = &problem.names();
    view.case_file = problem.description().file;
    view.partition = [&problem](const unsigned int region) { return problem.partition(region); };
    view.capacity = [&problem](const unsigned int region) { return problem.capacity(region); };
    view.conductance = [&problem](const unsigned int region, const dealii::Point<dim> &point, const double t,
                                  const double c) { return problem.conductance(region, point, t, c); };
    view.effective_diffusivity = [&problem](const unsigned int region, const dealii::Point<dim> &point,
                                            const double t) { return problem.effective_diffusivity(region, point, t); };
    view.coordinate_weight = [&problem](const dealii::Point<dim> &point) { return problem.coordinate_weight(point); };
    view.check_coefficients = [&problem]() { problem.check_coefficients(); };
    return view;
  }
} // namespace fickcast
