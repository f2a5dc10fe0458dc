// The time loop: steps, error control, mass balance, points, events and output.
#pragma once

#include "case/case_description.h"
#include "results/run_record.h"

#include <mpi.h>

#include <functional>
#include <string>

namespace dealii::TrilinosWrappers::MPI
{
  class Vector;
}

namespace fickcast
{
  template <int dim>
  class DiffusionProblem;

  /// What a run tells its progress display: once before the first step (starting, with the
  /// mesh), then after every accepted step (time reached, end time, step count).
  struct ProgressReport
  {
    double t = 0, end = 0;
    unsigned int step = 0;
    unsigned long cells = 0, unknowns = 0; ///< set when starting
    bool starting = false;
  };
  using ProgressCallback = std::function<void(const ProgressReport &)>;

  /// Called at t = 0 and at every output time with the problem and the ghosted state u
  /// (verification tests compare it with exact solutions in-process).
  template <int dim>
  using StateObserver =
    std::function<void(double, const DiffusionProblem<dim> &, const dealii::TrilinosWrappers::MPI::Vector &)>;

  /// Checkpoints of a run (run/checkpoint.h): whether to write them, and whether to continue
  /// from the newest one in the folder.
  struct CheckpointPolicy
  {
    bool write = false;
    double every = 600; ///< s of wall-clock time; 0: after every step
    bool resume = false;
  };

  /**
   * Runs one case of dimension @p dim on @p communicator, writing series.csv and fields/ into
   * @p folder (which exists and is shared by all ranks). Returns what was found; a numerical
   * failure returns status "failed" with the last good state written. Throws InputError for
   * input that only shows during the run (a diffusivity expression going negative, a point
   * outside a mesh). A stop request (request_stop, on every rank or any) ends the run after the
   * step under way with status "interrupted", a checkpoint written if @p checkpoints asks for
   * them; with checkpoints.resume the run continues from the newest checkpoint in @p folder and
   * repeats the uninterrupted run's arithmetic (same ranks), so it ends with the same numbers.
   * A finished or failed run removes its checkpoints.
   */
  template <int dim>
  RunRecord simulate(const CaseDescription &description, MPI_Comm communicator, const std::string &folder,
                     const ProgressCallback &progress, const StateObserver<dim> &observer = {},
                     const CheckpointPolicy &checkpoints = {});

  /// Set by a SIGINT/SIGTERM handler: the time loop stops after the step under way.
  void request_stop();
  bool stop_requested();
} // namespace fickcast
