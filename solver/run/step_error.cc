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

  double extrapolate(const std::vector<double> &clocks,
                     const std::vector<const dealii::TrilinosWrappers::MPI::Vector *> &states, const double s1,
                     const double ds, const bool bdf2, const unsigned int order,
                     dealii::TrilinosWrappers::MPI::Vector &predicted)
  {
    if (states.size() == 2)
      {
        const double h1 = clocks[0] - clocks[1];
        predicted.equ(1 + ds / h1, *states[0]);
        predicted.add(-ds / h1, *states[1]);
        return ds / (ds + h1) * (order == 2 ? 0.5 : 1.0);
      }
    const double ta = clocks[0], tb = clocks[1], tc = clocks[2];
    const double la = (s1 - tb) * (s1 - tc) / ((ta - tb) * (ta - tc));
    const double lb = (s1 - ta) * (s1 - tc) / ((tb - ta) * (tb - tc));
    const double lc = (s1 - ta) * (s1 - tb) / ((tc - ta) * (tc - tb));
    predicted.equ(la, *states[0]);
    predicted.add(lb, *states[1]);
    predicted.add(lc, *states[2]);
    const double h1 = ta - tb, h2 = tb - tc;
    const double spread = (ds + h1) * (ds + h1 + h2);
    return bdf2 ? (4.0 / 3.0) * ds * ds / spread : 0.5 * ds * ds / spread;
  }

  double first_output_time(const double end, const std::vector<double> &outputs)
  {
    for (const double when : outputs)
      if (when > 0)
        return std::min(end, when);
    return end;
  }
} // namespace fickcast
