#include "run/step_error.h"

#include <deal.II/base/mpi.h>

#include <algorithm>
#include <cmath>

namespace fickcast
{
  double weighted_step_error(const dealii::TrilinosWrappers::MPI::Vector &difference,
                             const dealii::TrilinosWrappers::MPI::Vector &state, const double scale,
                             const double error_floor, const bool root_mean_square, MPI_Comm communicator)
  {
    const double yardstick = std::max(scale, state.linfty_norm());
    const double floor = error_floor > 0 ? std::clamp(error_floor, 1e-3 * yardstick, yardstick) : yardstick;
    double largest = 0, squares = 0;
    for (auto p = difference.begin(), v = state.begin(); p != difference.end(); ++p, ++v)
      {
        const double weighted = std::abs(*p) / std::max(std::abs(*v), floor);
        largest = std::max(largest, weighted);
        squares += weighted * weighted;
      }
    if (root_mean_square)
      return std::sqrt(dealii::Utilities::MPI::sum(squares, communicator) / static_cast<double>(difference.size()));
    return dealii::Utilities::MPI::max(largest, communicator);
  }

  double first_output_time(const double end, const std::vector<double> &outputs)
  {
    for (const double when : outputs)
      if (when > 0)
        return std::min(end, when);
    return end;
  }
} // namespace fickcast
