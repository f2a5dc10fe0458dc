// The size of a step's local error estimate, measured the way the accuracy asked for says.
#pragma once

#include <deal.II/lac/trilinos_vector.h>

#include <mpi.h>

#include <vector>

namespace fickcast
{
  /**
   * The size of @p difference (the estimate's extrapolation minus the new state @p state), each
   * node's relative to max(|its value|, floor) (collective). floor: @p error_floor bounded to
   * [1e-3, 1] times the yardstick max(@p scale, largest |state|) (deeper, the steps would shrink
   * for every node of a front's foot); without a floor (0), the yardstick itself, one absolute
   * measure for every node. The largest over the nodes, or with @p root_mean_square the root
   * mean square (an undissolved reserve: every node a dissolution front passes has a kink in its
   * history).
   */
  double weighted_step_error(const dealii::TrilinosWrappers::MPI::Vector &difference,
                             const dealii::TrilinosWrappers::MPI::Vector &state, double scale, double error_floor,
                             bool root_mean_square, MPI_Comm communicator);

  /**
   * The extrapolation to clock @p s1 (a step @p ds from the newest) of the last states (@p states at @p clocks, newest
   * first; two or three) into @p predicted, and the factor that turns (extrapolation - new state) into the step's local
   * error estimate: the leading error term of the scheme (BDF2 or, with @p order 1, implicit Euler; @p bdf2 tells BDF2
   * from the trapezoidal rule at order 2) against that of the extrapolation, for variable steps.
   */
  double extrapolate(const std::vector<double> &clocks,
                     const std::vector<const dealii::TrilinosWrappers::MPI::Vector *> &states, double s1, double ds,
                     bool bdf2, unsigned int order, dealii::TrilinosWrappers::MPI::Vector &predicted);

  /// The first output time after 0 in @p outputs, or @p end.
  double first_output_time(double end, const std::vector<double> &outputs);
} // namespace fickcast
