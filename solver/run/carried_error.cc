#include "run/carried_error.h"

namespace fickcast
{
  template <int dim>
  CarriedError<dim>::CarriedError(DiffusionProblem<dim> &problem, const bool active, const double tolerance,
                                  const double duration)
    : problem_(problem)
    , active_(active)
    , tolerance_(tolerance)
    , duration_(duration)
  {
    if (!active_)
      return;
    current_ = problem.make_vector();
    previous_ = problem.make_vector();
    carried_ = problem.make_vector();
    local_ = problem.make_vector();
  }

  template <int dim>
  unsigned int CarriedError<dim>::carry(const StepPlan &plan, const bool bdf2)
  {
    if (!active_)
      return 0;
    if (!nonzero_)
      {
        carried_ = 0;
        return 0;
      }
    carried_ = current_; // initial guess
    return problem_.propagate_error(plan, current_, bdf2 ? &previous_ : nullptr, carried_);
  }

  template <int dim>
  void CarriedError<dim>::restore(const std::vector<double> &sizes)
  {
    final_ = sizes.size() > 0 ? sizes[0] : 0;
    largest_ = sizes.size() > 1 ? sizes[1] : 0;
    nonzero_ = current_.linfty_norm() > 0 || previous_.linfty_norm() > 0;
  }

  template class CarriedError<1>;
  template class CarriedError<2>;
  template class CarriedError<3>;
} // namespace fickcast
