#include "run/carried_error.h"

#include "case/input_error.h"

#include <deal.II/base/mpi.h>

#include <cmath>
#include <cstdio>
#include <limits>

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
  void CarriedError<dim>::report(RunRecord &record) const
  {
    record.carried_time_error = last();
    record.carried_time_error_largest = largest();
    record.carried_time_error_largest_at = largest_time_;
    record.steps_at_floor = at_floor_;
    if (!active_ || !(final_ > tolerance_))
      return;
    char text[400];
    std::snprintf(text, sizeof text,
                  "the time error carried to the end, %.2g of the concentration scale, is above time.tolerance "
                  "(%.2g): %u early steps were kept at a tenth of the time diffusion takes to cross the smallest "
                  "cell, and the body damps their error slowly; refine the mesh where the species enters, or keep "
                  "numerics.accuracy on",
                  final_, tolerance_, at_floor_);
    record.warnings.push_back(text);
  }

  template <int dim>
  void CarriedError<dim>::save(StateArchive &archive) const
  {
    for (const Vector *v : {&current_, &previous_})
      archive.put(active_ ? std::vector<double>(v->begin(), v->end()) : std::vector<double>());
    archive.put(std::vector<double>{final_, largest_, largest_time_, static_cast<double>(at_floor_)});
  }

  template <int dim>
  void CarriedError<dim>::load(StateArchive &archive, const std::string &folder)
  {
    for (Vector *v : {&current_, &previous_})
      {
        const std::vector<double> values = archive.get_values();
        if (active_ != !values.empty() || (active_ && values.size() != static_cast<std::size_t>(v->end() - v->begin())))
          throw IoError("the checkpoint in " + folder + " does not fit this case (time error control)");
        if (active_)
          std::copy(values.begin(), values.end(), v->begin());
      }
    const std::vector<double> sizes = archive.get_values();
    if (sizes.size() != 4)
      throw IoError("the checkpoint in " + folder + " is damaged (time error control)");
    final_ = sizes[0];
    largest_ = sizes[1];
    largest_time_ = sizes[2];
    at_floor_ = static_cast<unsigned int>(sizes[3]);
    nonzero_ = active_ && (current_.linfty_norm() > 0 || previous_.linfty_norm() > 0);
  }

  template <int dim>
  double fastest_cell_time(const DiffusionProblem<dim> &problem, const double t)
  {
    double fastest = std::numeric_limits<double>::max();
    for (const auto &cell : problem.dof_handler().active_cell_iterators())
      {
        if (!cell->is_locally_owned())
          continue;
        const double d = problem.effective_diffusivity(cell->material_id(), cell->center(), t);
        if (!(d > 0) || !std::isfinite(d))
          continue;
        const double h = cell->diameter() / std::sqrt(static_cast<double>(dim)) / problem.degree();
        fastest = std::min(fastest, h * h / d);
      }
    fastest = dealii::Utilities::MPI::min(fastest, problem.communicator());
    return fastest < std::numeric_limits<double>::max() ? fastest : 0.0;
  }

  template double fastest_cell_time<1>(const DiffusionProblem<1> &, double);
  template double fastest_cell_time<2>(const DiffusionProblem<2> &, double);
  template double fastest_cell_time<3>(const DiffusionProblem<3> &, double);

  template class CarriedError<1>;
  template class CarriedError<2>;
  template class CarriedError<3>;
} // namespace fickcast
