#include "run/guards.h"

#include "case/input_error.h"
#include "model/open_faces.h"
#include "model/value_text.h"

#include <deal.II/base/mpi.h>

#include <cmath>
#include <cstdio>
#include <limits>

namespace fickcast
{
  using namespace dealii;

  namespace
  {
    std::string number(const double value, const char *unit)
    {
      char text[64];
      std::snprintf(text, sizeof text, "%.3g %s", value, unit);
      return text;
    }
  } // namespace

  template <int dim>
  std::vector<std::string> resolution_warnings(const DiffusionProblem<dim> &problem, const CaseDescription &c,
                                               const double first_output)
  {
    const auto &names = problem.names().boundaries;
    const std::size_t n = names.size();
    // Per boundary: the cell on it whose node spacing is the largest against its own region's
    // diffusion length (regions on one face can differ by orders of magnitude).
    std::vector<double> ratio(n, 0.0), spacing(n, 0.0), length(n, 0.0);
    const std::vector<bool> open = open_faces(c, names);
    for (const auto &cell : problem.dof_handler().active_cell_iterators())
      {
        if (!cell->is_locally_owned())
          continue;
        for (const unsigned int f : cell->face_indices())
          {
            if (!cell->at_boundary(f))
              continue;
            const unsigned int b = cell->face(f)->boundary_id();
            if (b >= n || !open[b])
              continue;
            const double h = cell->diameter() / std::sqrt(static_cast<double>(dim)) / problem.degree();
            const double d = problem.effective_diffusivity(cell->material_id(), cell->center(), 0.5 * first_output);
            const double l = std::sqrt(std::max(d, 0.0) * first_output);
            if (l > 0 && h / l > ratio[b])
              {
                ratio[b] = h / l;
                spacing[b] = h;
                length[b] = l;
              }
          }
      }
    const MPI_Comm communicator = problem.communicator();
    std::vector<std::string> warnings;
    for (std::size_t b = 0; b < n; ++b)
      {
        // The worst cell of all ranks (the rank with the largest ratio reports its h and L).
        const double worst = Utilities::MPI::max(ratio[b], communicator);
        const double h = Utilities::MPI::max(ratio[b] == worst ? spacing[b] : 0.0, communicator);
        const double diffusion_length = Utilities::MPI::max(ratio[b] == worst ? length[b] : 0.0, communicator);
        if (!open[b] || worst == 0)
          continue;
        if (worst > 1)
          warnings.push_back("the nodes next to boundary '" + names[b] + "' are up to " + number(h, "m") +
                             " apart, more than the diffusion length sqrt(D t) = " + number(diffusion_length, "m") +
                             " of the first output interval (to " + number(first_output, "s") +
                             "): values near it are poor until the front has crossed several cells; refine the "
                             "mesh there (cell sizes, geometry.refine)" +
                             (c.numerics.accuracy > 0 ? std::string(" to avoid it; the accuracy check's estimates of "
                                                                    "the named results include its effect on them")
                                                      : std::string(" or turn numerics.accuracy on to measure the "
                                                                    "error")));
      }
    return warnings;
  }

  void RangeGuard::observe(const double lowest, const double highest, const double upper, const double t)
  {
    if (!(upper > 0))
      return;
    last_below_ = std::min(0.0, lowest / upper);
    last_above_ = check_upper_ ? std::max(0.0, (highest - upper) / upper) : 0.0;
    if (lowest / upper < worst_below_)
      {
        worst_below_ = lowest / upper;
        below_time_ = t;
      }
    if (check_upper_ && (highest - upper) / upper > worst_above_)
      {
        worst_above_ = (highest - upper) / upper;
        above_time_ = t;
      }
  }

  void RangeGuard::restore(const std::vector<double> &saved)
  {
    if (saved.size() != 6)
      throw IoError("a checkpoint's range guard holds " + std::to_string(saved.size()) + " values, expected 6");
    worst_below_ = saved[0];
    below_time_ = saved[1];
    worst_above_ = saved[2];
    above_time_ = saved[3];
    last_below_ = saved[4];
    last_above_ = saved[5];
  }

  std::vector<std::string> RangeGuard::warnings() const
  {
    std::vector<std::string> warnings;
    const auto at_end = [this](const double last) {
      return last == 0 || std::abs(last) <= tolerance_ ? std::string("back in range by the end")
                                                       : "still " + number(std::abs(last), "") + "at the end";
    };
    // With the accuracy check on, its estimates of the named results include the excursion's
    // effect on them; what stays poor is the field near the front while it lasts.
    const std::string remedy =
      checked_ ? ": the mesh or the steps are too coarse for a front there; the named results' error estimates "
                 "include its effect on them, but field values near the front are poor while it lasts (refine the "
                 "mesh there to avoid it: cell sizes, geometry.refine)"
               : ": the mesh or the steps are too coarse for a front there, and values near it are poor while it "
                 "lasts; refine the mesh (cell sizes, geometry.refine) or turn numerics.accuracy on to measure the "
                 "error";
    if (worst_below_ < -tolerance_)
      warnings.push_back("the concentration went below zero by " + number(-worst_below_, "") +
                         "of the largest initial or boundary value (worst at t = " + number(below_time_, "s") + "; " +
                         at_end(last_below_) + ")" + remedy);
    if (worst_above_ > tolerance_)
      warnings.push_back("the concentration rose above the largest initial or boundary value by " +
                         number(worst_above_, "") + "of it (worst at t = " + number(above_time_, "s") + "; " +
                         at_end(last_above_) + ")" + remedy);
    return warnings;
  }

  std::vector<std::string> flow_warnings(const std::string &sealed_face_warning, const double cell_peclet,
                                         const std::string &peclet_region)
  {
    std::vector<std::string> warnings;
    if (!sealed_face_warning.empty())
      warnings.push_back(sealed_face_warning);
    if (cell_peclet > 50)
      warnings.push_back("cell Peclet number up to " + number_text(cell_peclet) + " in region " + peclet_region +
                         ": the flow carries the species across a cell much faster than dispersion spreads it, and "
                         "fronts there are smeared over a cell or two; give smaller cells along the flow (cell_size) "
                         "to bring it under 50");
    return warnings;
  }

  template std::vector<std::string> resolution_warnings<1>(const DiffusionProblem<1> &, const CaseDescription &,
                                                           double);
  template std::vector<std::string> resolution_warnings<2>(const DiffusionProblem<2> &, const CaseDescription &,
                                                           double);
  template std::vector<std::string> resolution_warnings<3>(const DiffusionProblem<3> &, const CaseDescription &,
                                                           double);
} // namespace fickcast
